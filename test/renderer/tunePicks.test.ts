// The hardpoint table's "vary" ticks become core's tune variable ids, and a whole-design edit is
// recorded as the few values it changed. The outside check for the ids is core's own list of the
// ids a plan may name (tuneVariableIds, which the CLI's plan reader uses).
import { describe, expect, it } from 'vitest';
import { tuneVariableIds } from '../../core/studies/tunePlan';
import { adoptDesign, unlinkPoint } from '../../renderer/model/designActions';
import { applyDelta, differingPaths } from '../../renderer/model/history';
import { hardpointRows } from '../../renderer/model/hardpoints';
import { pickedAxes, togglePoint, variableIdOf } from '../../renderer/model/tunePicks';
import { demoDesign } from './helpers';

describe('tune picks from table rows', () => {
  it("names a coordinate core's tune accepts for every row and axis, linked or not", () => {
    for (const name of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike']) {
      let design = demoDesign(name);
      const check = () => {
        const ids = new Set(tuneVariableIds(design));
        for (const row of hardpointRows(design)) for (const a of ['x', 'y', 'z'] as const) expect(ids.has(variableIdOf(row, a)), `${name} ${row.id} ${a}`).toBe(true);
      };
      check();
      // Unlinked, each side is its own variable.
      const sided = hardpointRows(design).find((r) => r.side === 'right' && r.linked)!;
      design = unlinkPoint.perform(design, { key: sided.key }).design;
      check();
      expect(variableIdOf({ ...sided, linked: false }, 'z')).toBe(`${sided.key}.right:z`);
    }
  });

  it('toggles all three axes of a point on and off', () => {
    const row = hardpointRows(demoDesign('wren-rack-trike')).find((r) => r.side === 'right')!;
    const on = togglePoint([], row);
    expect(on.map((p) => p.axis)).toEqual(['x', 'y', 'z']);
    expect(pickedAxes(on, row)).toEqual(['x', 'y', 'z']);
    expect(togglePoint(on, row)).toEqual([]);
    // Partly picked: the tick completes it.
    expect(pickedAxes(togglePoint(on.slice(1), row), row)).toEqual(['x', 'y', 'z']);
  });
});

describe('a whole-design edit as one undo step', () => {
  it('records only the values that differ, and undo restores the design exactly', () => {
    const before = demoDesign('heron-tilting-velomobile');
    const after = JSON.parse(JSON.stringify(before)) as typeof before;
    (after as unknown as { steering: { pivot: { z: number } } }).steering.pivot.z += 2.5;
    after.name = 'moved';
    expect(differingPaths(before, after).map((p) => p.join('.')).sort()).toEqual(['name', 'steering.pivot.z']);
    const r = adoptDesign.perform(before, { design: after, label: 'test' });
    expect(r.delta!.changes).toHaveLength(2);
    expect(applyDelta(r.design, r.delta!, 'undo')).toEqual(before);
    expect(adoptDesign.perform(before, { design: before, label: 'none' }).delta).toBeNull();
    // A mirrored point that became two sides is one change, and undo gives back its text exactly.
    const split = JSON.parse(JSON.stringify(before)) as { steering: { tieRodJoint: unknown } };
    const p = split.steering.tieRodJoint as { x: number; y: number; z: number };
    split.steering.tieRodJoint = { right: { ...p }, left: { ...p, y: -p.y } };
    const s = adoptDesign.perform(before, { design: split as unknown as typeof before, label: 'split' });
    expect(s.delta!.changes.map((c) => c.path.join('.'))).toEqual(['steering.tieRodJoint']);
    expect(JSON.stringify(applyDelta(s.design, s.delta!, 'undo'))).toBe(JSON.stringify(before));
  });
});

describe('fit coordinates from picks', () => {
  it('splits a mirrored pair into its two sides when each side is fitted on its own', async () => {
    const { fitIdsOf } = await import('../../renderer/model/tunePicks');
    const picks = [
      { id: 'steering.tieRodJoint:y', rowId: 'steering.tieRodJoint.right', axis: 'y' as const, rangeMm: [-1, 1] as [number, number] },
      { id: 'upright.wheelCentre.left:z', rowId: 'upright.wheelCentre.left', axis: 'z' as const, rangeMm: [-1, 1] as [number, number] },
      { id: 'steering.pivot:x', rowId: 'steering.pivot', axis: 'x' as const, rangeMm: [-1, 1] as [number, number] },
    ];
    expect(fitIdsOf(picks, true)).toEqual(['steering.tieRodJoint.right:y', 'steering.tieRodJoint.left:y', 'upright.wheelCentre.left:z', 'steering.pivot:x']);
    expect(fitIdsOf(picks, false)).toEqual(picks.map((p) => p.id));
    // Every id names a coordinate core's fit accepts on a design with those points.
    const ids = new Set(tuneVariableIds(demoDesign('heron-tilting-velomobile')));
    for (const id of fitIdsOf(picks, true)) expect(ids.has(id), id).toBe(true);
  });
});
