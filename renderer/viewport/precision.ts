/**
 * Gizmo precision: the snap steps offered, snapping a dragged point, and the arrow-key nudge.
 * Pure functions (no three.js, no React): the gizmo, the key handler and the tests share them.
 *
 * Keys (design axes of the point's carrier, ISO 8855: x forward, y left, z up):
 *   ArrowUp / ArrowDown      +x / -x (forward / back)
 *   ArrowLeft / ArrowRight   +y / -y (left / right)
 *   PageUp / PageDown        +z / -z (up / down)
 * A plain key moves 1 mm, with Shift 0.1 mm. Each key press is one undoable edit.
 */
import type { Vec3Mm } from '../../core/design/types';

/** Snap steps offered in the gizmo bar, mm (0: off). */
export const SNAP_STEPS_MM: readonly number[] = [0, 0.1, 1, 5];

/** Nudge steps, mm. */
export const NUDGE_MM = 1;
export const FINE_NUDGE_MM = 0.1;

/** Values are kept to this many decimals (mm) so 0.1 mm steps do not collect binary dust. */
const DECIMALS = 6;
const clean = (v: number) => {
  const f = 10 ** DECIMALS;
  const r = Math.round(v * f) / f;
  return r === 0 ? 0 : r; // no -0 in a design file
};

/** `v` rounded to the nearest multiple of `step` (step <= 0: unchanged). */
export function snapValue(v: number, step: number): number {
  if (!(step > 0) || !Number.isFinite(v)) return v;
  return clean(Math.round(v / step) * step);
}

type Axis = 'x' | 'y' | 'z';
const AXES: readonly Axis[] = ['x', 'y', 'z'];

/**
 * A point dragged from `start` to `proposed`: each coordinate the drag moved is snapped to the
 * grid of `step`; a coordinate the drag did not move keeps its exact value (an axis not being
 * dragged never jumps to the grid). Without a step, values are only cleaned to 1e-6 mm.
 */
export function snapDrag(start: Vec3Mm, proposed: Vec3Mm, step: number): Vec3Mm {
  const out = { ...start };
  for (const a of AXES) {
    if (Math.abs(proposed[a] - start[a]) < 1e-9) continue;
    out[a] = step > 0 ? snapValue(proposed[a], step) : clean(proposed[a]);
  }
  return out;
}

export interface Nudge {
  axis: Axis;
  /** Signed move, mm. */
  deltaMm: number;
}

/** The nudge a key press asks for, or null when the key is not a nudge key. */
export function nudgeForKey(key: string, shift: boolean): Nudge | null {
  const step = shift ? FINE_NUDGE_MM : NUDGE_MM;
  switch (key) {
    case 'ArrowUp':
      return { axis: 'x', deltaMm: step };
    case 'ArrowDown':
      return { axis: 'x', deltaMm: -step };
    case 'ArrowLeft':
      return { axis: 'y', deltaMm: step };
    case 'ArrowRight':
      return { axis: 'y', deltaMm: -step };
    case 'PageUp':
      return { axis: 'z', deltaMm: step };
    case 'PageDown':
      return { axis: 'z', deltaMm: -step };
    default:
      return null;
  }
}

/** The point after a nudge (the other coordinates untouched). */
export function nudged(value: Vec3Mm, n: Nudge): Vec3Mm {
  return { ...value, [n.axis]: clean(value[n.axis] + n.deltaMm) };
}
