// Gizmo precision: snapping a dragged point to 0.1 / 1 / 5 mm, the arrow-key nudge as one
// undoable edit through the same action as the gizmo, and the lean-with-steer playback
// leaning into the turn (README's sign table: positive handlebar turns left, positive lean
// lowers the right side).
import { describe, expect, it } from 'vitest';
import { FINE_NUDGE_MM, NUDGE_MM, SNAP_STEPS_MM, nudgeForKey, nudged, snapDrag, snapValue } from '../../renderer/viewport/precision';
import { handleNudgeKey, nudgeSelection } from '../../renderer/viewport/nudgeKeys';
import { playbackInputs } from '../../renderer/panels/playback';
import { hardpointRows } from '../../renderer/model/hardpoints';
import { demoWorkbench } from './helpers';

describe('snapping', () => {
  it('offers 0.1, 1 and 5 mm (and off)', () => {
    expect([...SNAP_STEPS_MM].sort((a, b) => a - b)).toEqual([0, 0.1, 1, 5]);
  });

  it('rounds to the nearest multiple of the step, without binary dust', () => {
    for (const step of [0.1, 1, 5]) {
      for (const v of [-137.26, -0.04, 0, 0.049, 2.5, 12.3456, 401.95, 999.999]) {
        const s = snapValue(v, step);
        // On the grid: an integer number of steps (to 1e-9 mm).
        expect(Math.abs(s / step - Math.round(s / step))).toBeLessThan(1e-9);
        // The nearest grid value: at most half a step away.
        expect(Math.abs(s - v)).toBeLessThanOrEqual(step / 2 + 1e-9);
        // Printed as a person would write it (no 0.30000000000000004).
        expect(String(s).replace('-', '').length).toBeLessThanOrEqual(String(Math.abs(Math.round(s / step) * 10) / 10).length + 6);
      }
    }
    expect(snapValue(12.3456, 0.1)).toBe(12.3);
    expect(snapValue(0.3, 0.1)).toBe(0.3);
    expect(snapValue(0.1 + 0.2, 0.1)).toBe(0.3);
    // Math.round(-0.5) is -0; a design file gets 0.
    expect(Object.is(snapValue(-2.5, 5), 0)).toBe(true);
    expect(Object.is(snapValue(-0.04, 1), 0)).toBe(true);
    expect(snapValue(7.49, 5)).toBe(5);
    expect(snapValue(7.51, 5)).toBe(10);
    expect(snapValue(12.3456, 0)).toBe(12.3456);
  });

  it('snaps only the coordinates the drag moved; the others keep their exact value', () => {
    const start = { x: 101.37, y: -212.04, z: 333.333 };
    expect(snapDrag(start, { x: 104.9, y: -212.04, z: 333.333 }, 1)).toEqual({ x: 105, y: -212.04, z: 333.333 });
    expect(snapDrag(start, { x: 101.37, y: -208.7, z: 336.2 }, 5)).toEqual({ x: 101.37, y: -210, z: 335 });
    expect(snapDrag(start, { x: 101.4449, y: -212.04, z: 333.333 }, 0.1)).toEqual({ x: 101.4, y: -212.04, z: 333.333 });
    // Off: the dragged value itself, cleaned to 1e-6 mm.
    expect(snapDrag(start, { x: 101.3712345678, y: -212.04, z: 333.333 }, 0)).toEqual({ x: 101.371235, y: -212.04, z: 333.333 });
  });
});

describe('arrow-key nudge', () => {
  it('maps keys to design axes: up/down x, left/right y, PageUp/PageDown z; Shift for 0.1 mm', () => {
    expect(nudgeForKey('ArrowUp', false)).toEqual({ axis: 'x', deltaMm: NUDGE_MM });
    expect(nudgeForKey('ArrowDown', true)).toEqual({ axis: 'x', deltaMm: -FINE_NUDGE_MM });
    // ISO 8855: y points left, so the left arrow is +y.
    expect(nudgeForKey('ArrowLeft', false)).toEqual({ axis: 'y', deltaMm: NUDGE_MM });
    expect(nudgeForKey('ArrowRight', false)).toEqual({ axis: 'y', deltaMm: -NUDGE_MM });
    expect(nudgeForKey('PageUp', true)).toEqual({ axis: 'z', deltaMm: FINE_NUDGE_MM });
    expect(nudgeForKey('PageDown', false)).toEqual({ axis: 'z', deltaMm: -NUDGE_MM });
    expect(nudgeForKey('a', false)).toBeNull();
    expect(NUDGE_MM).toBe(1);
    expect(FINE_NUDGE_MM).toBe(0.1);
    expect(nudged({ x: 0.2, y: 5, z: 7 }, { axis: 'x', deltaMm: 0.1 })).toEqual({ x: 0.3, y: 5, z: 7 });
  });

  it('moves the selected hardpoint by exactly the step, one undo step per press, undone exactly', () => {
    const wb = demoWorkbench();
    const row = hardpointRows(wb.document.getState().design).find((r) => r.id === 'upright.steeringArmJoint.right')!;
    wb.actions.select(row.id);
    const before = structuredClone(wb.document.getState().design);
    const solvedBefore = wb.pose.getState().outcome.snapshot!.points[row.id];
    expect(nudgeSelection(wb, { axis: 'x', deltaMm: 1 })).toBe(true);
    expect(nudgeSelection(wb, { axis: 'z', deltaMm: -0.1 })).toBe(true);
    const after = hardpointRows(wb.document.getState().design).find((r) => r.id === row.id)!.value;
    expect(after.x - row.value.x).toBeCloseTo(1, 9);
    expect(after.y).toBe(row.value.y);
    expect(after.z - row.value.z).toBeCloseTo(-0.1, 9);
    expect(wb.document.getState().history.past).toHaveLength(2);
    expect(wb.document.getState().history.past[1].label).toMatch(/^move /);
    // The linkage was solved again for the moved point (the same path as the gizmo and typed entry).
    const solvedAfter = wb.pose.getState().outcome.snapshot!.points[row.id];
    expect(solvedAfter[0] - solvedBefore[0]).toBeCloseTo(1, 3);
    expect(solvedAfter[2] - solvedBefore[2]).toBeCloseTo(-0.1, 3);
    wb.actions.undo();
    wb.actions.undo();
    expect(wb.document.getState().design).toEqual(before);
  });

  it('does nothing without a selection, or when the key belongs to a field', () => {
    const wb = demoWorkbench();
    const before = wb.document.getState().design;
    const key = (init: KeyboardEventInit, target?: EventTarget) => {
      const e = new KeyboardEvent('keydown', { ...init, cancelable: true });
      if (target) Object.defineProperty(e, 'target', { value: target });
      return e;
    };
    expect(handleNudgeKey(wb, key({ key: 'ArrowUp' }))).toBe(false);
    expect(wb.document.getState().design).toBe(before);
    const row = hardpointRows(before)[0];
    wb.actions.select(row.id);
    expect(handleNudgeKey(wb, key({ key: 'ArrowUp' }, document.createElement('input')))).toBe(false);
    expect(handleNudgeKey(wb, key({ key: 'ArrowUp', ctrlKey: true }))).toBe(false);
    expect(wb.document.getState().design).toBe(before);
    // Negative control: the same key on the page moves the point.
    const e = key({ key: 'ArrowUp', shiftKey: true }, document.body);
    expect(handleNudgeKey(wb, e)).toBe(true);
    expect(e.defaultPrevented).toBe(true);
    const moved = hardpointRows(wb.document.getState().design).find((r) => r.id === row.id)!.value;
    expect(moved.x - row.value.x).toBeCloseTo(0.1, 9);
  });
});

describe('lean and steer playback', () => {
  it('leans into the turn: positive handlebar (left) with negative lean (left side down)', () => {
    const a = { lean: 30, steer: 20 };
    for (const x of [-1, -0.5, 0.25, 1]) {
      const p = playbackInputs(x, a);
      expect(Math.sign(p.handlebarDeg!)).toBe(Math.sign(x));
      // README: positive lean lowers the right side (a right turn); positive handlebar turns left.
      expect(Math.sign(p.leanDeg!)).toBe(-Math.sign(p.handlebarDeg!));
      expect(Math.abs(p.leanDeg!)).toBeCloseTo(Math.abs(x) * 30, 2);
    }
    // Lean alone and steer alone sweep as before.
    expect(playbackInputs(0.5, { lean: 30, steer: 0 })).toEqual({ leanDeg: 15 });
    expect(playbackInputs(0.5, { lean: 0, steer: 20 })).toEqual({ handlebarDeg: 10 });
  });

  it('into the turn agrees with the solved balanced turn of ride mode', () => {
    // Ride mode's lean is core's balanced lean tan(lean) = v^2/(gR) (Cossalter, Motorcycle
    // Dynamics, 2006): its sign for a left handlebar is the sign playback must use.
    const wb = demoWorkbench();
    wb.actions.setRide({ on: true, speedKmh: 20 });
    wb.actions.setPose({ handlebarDeg: 8 });
    const lean = wb.pose.getState().pose.leanDeg;
    expect(Math.abs(lean)).toBeGreaterThan(0.5);
    expect(Math.sign(playbackInputs(1, { lean: 30, steer: 20 }).leanDeg!)).toBe(Math.sign(lean));
  });
});
