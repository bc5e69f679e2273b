/**
 * The reference design drawn as a ghost: line segments of its parts (tubes, axis lines) and
 * a circle for each front wheel's rim, at a solved pose. Written into a preallocated position
 * array; returns how many segments it wrote.
 */
import { Vector3 } from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { bodyIndexOf, place } from './scenePlacement';

/** Segments each wheel's rim circle is drawn with. */
export const RIM_SEGMENTS = 36;

const a = new Vector3();
const b = new Vector3();
const u = new Vector3();
const v = new Vector3();
const c = new Vector3();
const axis = new Vector3();

export function ghostSegments(layout: DrawingLayout, snap: PoseSnapshot, rollingRadiusMm: number, out: Float32Array): number {
  const capacity = Math.floor(out.length / 6);
  let n = 0;
  const put = (p: Vector3, q: Vector3) => {
    if (n >= capacity) return;
    out.set([p.x, p.y, p.z, q.x, q.y, q.z], 6 * n);
    n++;
  };
  const bodies = bodyIndexOf(snap);
  for (const t of [...layout.tubes, ...layout.axisLines]) {
    if (place(t.a, snap, bodies, a) && place(t.b, snap, bodies, b)) put(a, b);
  }
  for (const w of [snap.wheels.right, snap.wheels.left]) {
    if (!w) continue;
    c.fromArray(w.centre);
    axis.fromArray(w.spinAxis).normalize();
    // Two unit vectors across the spin axis span the rim's plane.
    u.set(0, 0, 1).cross(axis);
    if (u.lengthSq() < 1e-12) u.set(1, 0, 0).cross(axis);
    u.normalize();
    v.crossVectors(axis, u);
    for (let k = 0; k < RIM_SEGMENTS; k++) {
      const t0 = (2 * Math.PI * k) / RIM_SEGMENTS;
      const t1 = (2 * Math.PI * (k + 1)) / RIM_SEGMENTS;
      a.copy(c).addScaledVector(u, rollingRadiusMm * Math.cos(t0)).addScaledVector(v, rollingRadiusMm * Math.sin(t0));
      b.copy(c).addScaledVector(u, rollingRadiusMm * Math.cos(t1)).addScaledVector(v, rollingRadiusMm * Math.sin(t1));
      put(a, b);
    }
  }
  return n;
}
