// Consistency checks of the sweep machinery (no outside source): each cell of a warm sweep
// must equal an independent cold solve of the same pose; outside references for the measures
// themselves are in the other test files of this folder.
import { describe, it, expect } from 'vitest';
import { runSweep, envelopeAxes, SweepInputError, type SweepCell } from '../../../core/analysis/sweep';
import { envelopeMap } from '../../../core/analysis/envelopeMap';
import { checkDesign } from '../../../core/analysis/designCheck';
import { steerLimits } from '../../../core/analysis/limits';
import { curve, CURVE_KINDS } from '../../../core/analysis/curves';
import { cellRow, poseColumns } from '../../../core/analysis/poseColumns';
import { demo, demoDoc, nonFinitePaths, resolveDoc, solveAnalyse, unexplainedNulls } from './helpers';

describe('sweep', () => {
  it('visits every cell once, in rows, with every measure and no NaN; nulls always carry a reason', () => {
    const design = demo('heron-tilting-velomobile');
    const axes = { leanDeg: [-10, 0, 10], handlebarDeg: [-10, -5, 0, 5, 10], travelMm: [-10, 0, 20] };
    const seen = new Set<string>();
    const cells: SweepCell[] = [];
    const s = runSweep(design, axes, {}, (c) => {
      const key = `${c.travelIndex}.${c.leanIndex}.${c.handlebarIndex}`;
      expect(seen.has(key)).toBe(false);
      seen.add(key);
      cells.push(c);
    });
    expect(seen.size).toBe(45);
    expect(s.poses).toBe(45);
    expect(s.solved).toBe(45);
    expect(s.solves).toBe(45 + 5); // the grid and one reference pass along the handlebar, one solver
    for (const c of cells) {
      if (!c.ok) throw new Error('expected every pose to solve');
      expect(nonFinitePaths(c.analysis)).toEqual([]);
      expect(unexplainedNulls(c.analysis)).toEqual([]);
      expect(JSON.stringify(c.analysis)).not.toMatch(/NaN|Infinity/);
      // The sweep fills the neighbour measures.
      if (c.handlebarDeg !== 0) expect(c.analysis.steering.localRatio).not.toBeNull();
      expect(c.analysis.suspension.frontLiftMm).not.toBeNull();
      expect(c.analysis.selfSteer.leftDeg).not.toBeNull();
      expect(c.analysis.steering.ratioChangePct).not.toBeNull();
      // Ground contact: travel t lowers the frame by t.
      expect(c.analysis.frameHeaveMm).toBeCloseTo(-c.travelMm, 9);
    }
    const centre = cells.find((c) => c.leanDeg === 0 && c.travelMm === 0 && c.handlebarDeg === 5)!;
    if (!centre.ok) throw new Error('unreachable');
    expect(centre.analysis.selfSteer.leftDeg).toBe(0); // upright: its own reference
    expect(centre.analysis.steering.ratioChangePct).toBe(0);
    // Self-steer depends on lean and travel only: every cell of a row carries the straight cell's
    // road-wheel angle minus the upright straight cell's.
    const at = (lean: number, bar: number, travel: number) => {
      const c = cells.find((x) => x.leanDeg === lean && x.handlebarDeg === bar && x.travelMm === travel)!;
      if (!c.ok) throw new Error('unreachable');
      return c.analysis;
    };
    const expected = at(10, 0, 20).wheels.left.steerDeg - at(0, 0, 0).wheels.left.steerDeg;
    expect(Math.abs(expected)).toBeGreaterThan(1e-4); // a real number to compare, not 0 = 0
    for (const bar of axes.handlebarDeg) expect(at(10, bar, 20).selfSteer.leftDeg).toBeCloseTo(expected, 12);
  });

  it('agrees with a single cold solve at every cell (same branch, same numbers)', () => {
    const design = demo('swift-parallelogram-trike');
    const axes = { leanDeg: [-20, 0, 20], handlebarDeg: [-15, 0, 15], travelMm: [0] };
    runSweep(design, axes, {}, (c) => {
      if (!c.ok) throw new Error('expected every pose to solve');
      const single = solveAnalyse(design, { leanDeg: c.leanDeg, handlebarDeg: c.handlebarDeg }).analysis;
      expect(c.analysis.wheels.left.toeDeg).toBeCloseTo(single.wheels.left.toeDeg, 7);
      expect(c.analysis.joints[3].articulationDeg).toBeCloseTo(single.joints[3].articulationDeg, 6);
    });
  });

  it('marks cells that cannot be assembled with their status and no numbers, and carries on past them', () => {
    const design = demo('heron-tilting-velomobile');
    const axes = { leanDeg: [0], handlebarDeg: [0], travelMm: [-20, 0, 20, 300, 20, 0] };
    const cells: SweepCell[] = [];
    const s = runSweep(design, axes, { contact: 'travel' }, (c) => cells.push(c));
    const bad = cells.filter((c) => !c.ok);
    expect(bad.length).toBe(1);
    expect(bad[0].travelMm).toBe(300);
    if (bad[0].ok) throw new Error('unreachable');
    expect(bad[0].failure.status).toBe('broken');
    expect(bad[0].failure.solver.status).not.toBe('converged');
    expect(bad[0].failure.solver.message).toBeTruthy();
    expect(JSON.stringify(bad[0])).not.toMatch(/toeDeg|NaN/);
    expect(s.failed).toBe(1);
    expect(s.byStatus.broken).toBe(1);
    // The poses after the failure are solved, and match the same poses before it.
    const after = cells.filter((c) => c.ok && c.travelIndex > 3);
    expect(after.length).toBe(2);
    for (const c of after) {
      const before = cells.find((b) => b.ok && b.travelMm === c.travelMm && b.travelIndex < 3)!;
      if (!c.ok || !before.ok) throw new Error('unreachable');
      expect(c.analysis.wheels.right.toeDeg).toBeCloseTo(before.analysis.wheels.right.toeDeg, 8);
    }
  });

  it('refuses travel on the ground for a centre-pivot front end and lean for a non-tilting design', () => {
    expect(() => runSweep(demo('swift-parallelogram-trike'), { leanDeg: [0], handlebarDeg: [0], travelMm: [10] }, {}, () => {})).toThrow(SweepInputError);
    expect(() => runSweep(demo('wren-rack-trike'), { leanDeg: [5], handlebarDeg: [0], travelMm: [0] }, {}, () => {})).toThrow(/does not tilt/);
    expect(() => runSweep(demo('wren-rack-trike'), { leanDeg: [], handlebarDeg: [0], travelMm: [0] }, {}, () => {})).toThrow(/no values/);
  });

  it('envelope axes cover the envelope, include 0 and respect the step', () => {
    const a = envelopeAxes(demo('heron-tilting-velomobile'), { leanDeg: 2, handlebarDeg: 5, travelMm: 15 });
    expect(a.leanDeg[0]).toBe(-25);
    expect(a.leanDeg[a.leanDeg.length - 1]).toBe(25);
    expect(a.leanDeg).toContain(0);
    expect(a.handlebarDeg.length).toBe(11);
    expect(a.travelMm[0]).toBe(-30);
    expect(a.travelMm[a.travelMm.length - 1]).toBe(40);
    expect(a.travelMm).toContain(0);
    for (let i = 1; i < a.leanDeg.length; i++) expect(a.leanDeg[i] - a.leanDeg[i - 1]).toBeLessThanOrEqual(2 + 1e-9);
    expect(envelopeAxes(demo('swift-parallelogram-trike')).travelMm).toEqual([0]);
    expect(envelopeAxes(demo('wren-rack-trike')).leanDeg).toEqual([0]);
  });

  it('rows flatten to the column list, with empty measures for a failed pose', () => {
    const design = demo('heron-tilting-velomobile');
    const cols = poseColumns(design);
    expect(new Set(cols.map((c) => c.name)).size).toBe(cols.length);
    runSweep(design, { leanDeg: [0], handlebarDeg: [10], travelMm: [0, 400] }, { contact: 'travel' }, (c) => {
      const row = cellRow(cols, c);
      expect(row.length).toBe(cols.length);
      const toe = row[cols.findIndex((x) => x.name === 'left.toeDeg')];
      if (c.ok) expect(typeof toe).toBe('number');
      else {
        expect(toe).toBeNull();
        expect(row[cols.findIndex((x) => x.name === 'status')]).toBe('broken');
        expect(String(row[cols.length - 1])).toMatch(/cannot|gap|converge/);
      }
    });
  });
});

describe('envelope map', () => {
  it('gives each cell its worst slip, joint margin, clearance and self-steer, each check\'s verdict and the pose verdict', () => {
    const design = demo('heron-tilting-velomobile');
    const axes = { leanDeg: [-25, 0, 25], handlebarDeg: [-25, 0, 25], travelMm: [0] };
    const map = envelopeMap(design, axes);
    expect(map.cells.length).toBe(9);
    const centre = map.cells[4];
    expect(centre.leanDeg).toBe(0);
    expect(centre.handlebarDeg).toBe(0);
    expect(centre.status).toBe('within');
    expect(centre.worstJointMarginDeg).toBeCloseTo(25, 6);
    const corner = map.cells[8];
    expect(corner.leanDeg).toBe(25);
    expect(corner.handlebarDeg).toBe(25);
    expect(corner.status).toBe('over');
    expect(corner.checks.joint).toBe('over');
    expect(corner.worstJointMarginDeg!).toBeLessThan(0);
    expect(map.summary.byStatus.within).toBeGreaterThan(0);
  });
});

describe('design check', () => {
  it('finds each worst value and where, and fails the Heron demo on its joints', () => {
    const c = checkDesign(demo('heron-tilting-velomobile'), { steps: { leanDeg: 12.5, handlebarDeg: 12.5, travelMm: 35 } });
    expect(c.passed).toBe(false);
    const inner = c.items.find((i) => i.id === 'joint.tieRodInner.right')!;
    expect(inner.verdict).toBe('over');
    expect(inner.where).not.toBeNull();
    expect(Math.abs(inner.where!.handlebarDeg)).toBe(25);
    const assembly = c.items.find((i) => i.id === 'assembly')!;
    expect(assembly.worst).toBe(0);
    expect(assembly.verdict).toBe('within');
    expect(c.info.some((i) => i.includes('turning circle'))).toBe(true);
    // Steering limits at five leans; at zero lean the demo's first limit is a tie-rod inner end.
    expect(c.limits.map((l) => l.leanDeg)).toEqual([-25, -12.5, 0, 12.5, 25]);
    const zero = c.limits[2];
    expect(zero.left.kinds).toContain('joint-rating');
    expect(zero.left.detail).toMatch(/tie rod, inner end/);
    expect(zero.right.handlebarDeg!).toBeCloseTo(-zero.left.handlebarDeg!, 1);
  });

  it('passes a design whose tolerances and ratings cover its (small) envelope', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    doc.envelope = { leanDeg: 5, handlebarDeg: 5, bumpMm: 5, reboundMm: 5 };
    doc.tolerances = { selfSteerDeg: 2, ratioChangePct: 50, slipDeg: 2, jointMarginDeg: 3, clearanceMm: 10 };
    const c = checkDesign(resolveDoc(doc), { steps: { leanDeg: 2.5, handlebarDeg: 2.5, travelMm: 5 } });
    expect(c.items.filter((i) => i.verdict === 'over' || i.verdict === 'broken').map((i) => i.id)).toEqual([]);
    expect(c.passed).toBe(true);
  });
});

describe('steering limits', () => {
  it('finds the handlebar angle each way where the first limit is met, bisected, with its kind', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    doc.joints.tieRodInner.ratedDeg = 15;
    const design = resolveDoc(doc);
    const [lim] = steerLimits(design, [0], { stepDeg: 2, maxHandlebarDeg: 60, toleranceDeg: 0.01 });
    expect(lim.left.kinds).toContain('joint-rating');
    expect(lim.left.handlebarDeg!).toBeGreaterThan(0);
    // Just inside the limit the joint is within its rating; just outside it is not.
    const inner = (bar: number) =>
      Math.max(...solveAnalyse(design, { handlebarDeg: bar }).analysis.joints.filter((j) => j.joint === 'tieRodInner').map((j) => j.articulationDeg));
    expect(inner(lim.left.handlebarDeg!)).toBeLessThanOrEqual(15);
    expect(inner(lim.left.handlebarDeg! + 0.02)).toBeGreaterThan(15);
    expect(lim.right.handlebarDeg!).toBeLessThan(0);
    expect(lim.right.leftWheelDeg!).toBeLessThan(0);
  });

  it('says so when no limit is met within the search range, and reports failure to close', () => {
    const design = demo('heron-tilting-velomobile');
    const [none] = steerLimits(design, [0], { stepDeg: 1, maxHandlebarDeg: 3 });
    expect(none.left.handlebarDeg).toBeNull();
    expect(none.left.reason).toMatch(/no limit/);
    const [far] = steerLimits(design, [0], { stepDeg: 5, maxHandlebarDeg: 175, travelMm: 0 });
    expect(far.left.kinds.length).toBeGreaterThan(0);
  });
});

describe('1-D curves', () => {
  it('every kind gives aligned series with null (never NaN) where a pose failed', () => {
    const design = demo('heron-tilting-velomobile');
    for (const kind of CURVE_KINDS) {
      const c = curve(design, kind, kind === 'bumpSteer' || kind === 'camberTravel' ? { values: [-20, 0, 20, 400] } : undefined);
      expect(c.series.length).toBeGreaterThan(0);
      for (const s of c.series) expect(s.values.length).toBe(c.input.values.length);
      expect(nonFinitePaths(c)).toEqual([]);
      if (kind === 'bumpSteer') {
        expect(c.failures.length).toBe(1);
        expect(c.series.every((s) => s.values[3] === null)).toBe(true);
      }
    }
  });

  it('lean steer of the Heron demo is small at zero handlebar (its tie rods lie on the instant-centre lines)', () => {
    const c = curve(demo('heron-tilting-velomobile'), 'leanSteer', { values: [-20, -10, 0, 10, 20] });
    const err = c.series.find((s) => s.id === 'selfSteer.left')!;
    for (const v of err.values) expect(Math.abs(v!)).toBeLessThan(0.25);
    expect(err.values[2]).toBeCloseTo(0, 9);
  });

  it('the Ackermann curve plots outer against inner with the ideal beside it', () => {
    const c = curve(demo('heron-tilting-velomobile'), 'ackermann', { values: [5, 10, 20] });
    expect(c.x.label).toMatch(/inner/);
    const ideal = c.series.find((s) => s.id === 'idealOuter')!;
    const outer = c.series.find((s) => s.id === 'outer')!;
    for (let i = 0; i < 3; i++) {
      expect(ideal.values[i]!).toBeLessThan(c.x.values[i]!); // the ideal outer is below the inner
      expect(outer.values[i]).not.toBeNull();
    }
  });
});
