// Undo and redo keep deltas of the design only; the solved pose is recomputed, never stored.
import { describe, expect, it } from 'vitest';
import { setCoordinate, setField, unlinkPoint } from '../../renderer/model/designActions';
import { applyDelta } from '../../renderer/model/history';
import { designToText } from '../../renderer/model/designText';
import { demoWorkbench } from './helpers';

describe('design history', () => {
  it('records one delta per edit, holding only design values', () => {
    const wb = demoWorkbench();
    wb.actions.perform(setCoordinate, { rowId: 'upright.steeringArmJoint.right', axis: 'x', value: -80 });
    const delta = wb.document.getState().history.past[0];
    expect(delta.changes).toEqual([{ path: ['upright', 'steeringArmJoint', 'x'], before: -75, after: -80 }]);
    expect(delta.label).toMatch(/edit x of right upright steering arm joint/);
    expect(JSON.stringify(delta)).not.toMatch(/toeDeg|snapshot|analysis/);
  });

  it('an edit changes toe; undo restores the design and the toe, redo repeats both', () => {
    const wb = demoWorkbench();
    wb.actions.setPose({ handlebarDeg: 10 });
    const toe0 = wb.pose.getState().outcome.analysis!.wheels.right.toeDeg;
    const text0 = wb.document.getState().designText;
    wb.actions.perform(setCoordinate, { rowId: 'upright.steeringArmJoint.right', axis: 'x', value: -90 });
    const toe1 = wb.pose.getState().outcome.analysis!.wheels.right.toeDeg;
    expect(Math.abs(toe1 - toe0)).toBeGreaterThan(0.05);
    expect(wb.actions.undo()).toBe(true);
    expect(wb.document.getState().designText).toBe(text0);
    expect(wb.pose.getState().outcome.analysis!.wheels.right.toeDeg).toBeCloseTo(toe0, 9);
    expect(wb.document.getState().dirty).toBe(false);
    expect(wb.actions.redo()).toBe(true);
    expect(wb.pose.getState().outcome.analysis!.wheels.right.toeDeg).toBeCloseTo(toe1, 9);
    expect(wb.actions.redo()).toBe(false);
  });

  it('a new edit after undo drops the redo branch', () => {
    const wb = demoWorkbench();
    wb.actions.perform(setField, { path: 'envelope.leanDeg', value: 30 });
    wb.actions.undo();
    wb.actions.perform(unlinkPoint, { key: 'upright.wheelCentre' });
    expect(wb.document.getState().history.future).toHaveLength(0);
    expect(wb.document.getState().history.past).toHaveLength(1);
  });

  it('deltas apply both ways on plain documents, adding and removing optional keys', () => {
    const wb = demoWorkbench('wren-rack-trike');
    const d0 = wb.document.getState().design;
    wb.actions.perform(setField, { path: 'tolerances.slipDeg', value: 2 });
    const d1 = wb.document.getState().design;
    expect(d1.tolerances).toEqual({ slipDeg: 2 });
    const delta = wb.document.getState().history.past[0];
    expect(designToText(applyDelta(d1, delta, 'undo'))).toBe(designToText(d0));
    expect(applyDelta(d0, delta, 'redo').tolerances).toEqual({ slipDeg: 2 });
  });

  it('a gizmo drag is one undo step however many moves it made', () => {
    const wb = demoWorkbench();
    wb.actions.select('upright.steeringArmJoint.left');
    wb.actions.beginDrag();
    for (let k = 1; k <= 5; k++) wb.actions.dragPoint('upright.steeringArmJoint.left', { x: -75 - k, y: 341.4, z: 200 });
    wb.actions.endDrag();
    const h = wb.document.getState().history;
    expect(h.past).toHaveLength(1);
    expect(h.past[0].changes[0]).toMatchObject({ path: ['upright', 'steeringArmJoint'], before: { x: -75, y: -341.4, z: 200 }, after: { x: -80, y: -341.4, z: 200 } });
    wb.actions.undo();
    expect(wb.document.getState().design.upright.steeringArmJoint).toEqual({ x: -75, y: -341.4, z: 200 });
  });
});
