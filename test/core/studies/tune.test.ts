// The tune study and the geometric proposals, checked against things outside the optimiser:
// - a tie rod deliberately mislocated is tuned back to near-zero self-steer and lands near the
//   drawing-board construction (the tie rod's inner joint at the centre of curvature of its
//   outer joint's front-view path, on the line through the instant centre; common practice,
//   no source), which is computed by a different route (a planar four-bar, no 3D solve);
// - the instant-centre property of a planar four-bar: a coupler point's velocity is
//   perpendicular to the line from the instant centre, so the centre of curvature lies on
//   that line (J. J. Uicker, G. R. Pennock, J. E. Shigley, Theory of Machines and Mechanisms,
//   instant centres of velocity: from memory);
// - a parallelogram linkage's coupler translates, so every coupler point moves on a circle of
//   the arm's radius about the point moved back by the arm (same text: from memory);
// - the Ackermann rule of thumb: each steering arm's line passes through the middle of the
//   rear axle line (common practice, no source), checked by plan-view collinearity.
import { describe, it, expect } from 'vitest';
import { demoDoc, resolveDoc } from '../analysis/helpers';
import { readTunePlan, TunePlanError } from '../../../core/studies/tunePlan';
import { runTune } from '../../../core/studies/tune';
import { applyTuneOffsets, boundedOffset, unboundedOf } from '../../../core/studies/tuneVariables';
import { ackermannArmPoint, frontViewInstantCentre, geometricProposals, tieRodLinePoint } from '../../../core/studies/geometricSuggestion';
import { resolveDesign, resolveSidedVec } from '../../../core/design/resolveDesign';
import type { DesignFile } from '../../../core/design/types';
import type { StudyPose } from '../../../core/studies/studyPoses';

/** Lean poses at the straight-ahead handlebar: where a tilting front end's tie rods steer it by themselves. */
const LEAN_POSES: StudyPose[] = [-25, -15, -5, 5, 15, 25].map((leanDeg) => ({ leanDeg, handlebarDeg: 0, travelMm: 0 }));

/** The steering of a design with tie rods (every demo used here has them). */
function tieRodSteering<S extends { kind: string }>(s: S): Exclude<S, { kind: 'trackRod' }> {
  if (s.kind === 'trackRod') throw new Error('a design with tie rods expected');
  return s as Exclude<S, { kind: 'trackRod' }>;
}

function mislocated(): DesignFile {
  const file = demoDoc('heron-tilting-velomobile') as DesignFile;
  const steering = tieRodSteering(file.steering);
  const inner = resolveSidedVec(steering.tieRodJoint).right;
  steering.tieRodJoint = { x: inner.x, y: inner.y - 8, z: inner.z + 12 };
  return file;
}

function tieRodPlan(file: DesignFile, extra: Record<string, unknown> = {}) {
  return readTunePlan(
    {
      variables: [
        { id: 'steering.tieRodJoint:y', rangeMm: [-30, 30] },
        { id: 'steering.tieRodJoint:z', rangeMm: [-30, 30] },
      ],
      objectives: [{ measure: 'selfSteer' }],
      constraints: { jointMargin: false, clearance: false, transmissionFloorDeg: 0 },
      poses: LEAN_POSES,
      starts: 1,
      maxIterations: 30,
      ...extra,
    },
    file,
  );
}

describe('tune recovers a known answer', () => {
  const file = mislocated();
  const { plan, variables } = tieRodPlan(file);
  const secant = runTune(file, plan, variables, { jacobian: 'secant' });
  const difference = runTune(file, plan, variables, { jacobian: 'finite-difference' });

  it('drives the self-steer of a mislocated tie rod to near zero', () => {
    const s = secant.summary.find((x) => x.id === 'selfSteer')!;
    expect(s.before!).toBeGreaterThan(3);
    expect(s.after!).toBeLessThan(0.05);
    expect(secant.costAfter).toBeLessThan(secant.costBefore * 1e-3);
  });

  it('lands within 1 mm of the drawing-board construction', () => {
    const construction = geometricProposals(file, false)[0].moves.find((m) => m.side === 'right')!.toMm;
    const tuned = resolveSidedVec(tieRodSteering(secant.tuned.steering).tieRodJoint).right;
    expect(Math.hypot(tuned.y - construction.y, tuned.z - construction.z)).toBeLessThan(1);
  });

  it('the secant (Broyden) and difference Jacobians reach the same design, the secant with fewer solves', () => {
    const a = resolveSidedVec(tieRodSteering(secant.tuned.steering).tieRodJoint).right;
    const b = resolveSidedVec(tieRodSteering(difference.tuned.steering).tieRodJoint).right;
    expect(Math.hypot(a.y - b.y, a.z - b.z)).toBeLessThan(0.05);
    expect(secant.evaluations).toBeLessThan(difference.evaluations);
  });

  it('reports the variables moved and leaves the input design as it was', () => {
    expect(secant.variables.map((v) => v.id)).toEqual(['steering.tieRodJoint:y', 'steering.tieRodJoint:z']);
    expect(Math.abs(secant.variables[1].movedMm)).toBeGreaterThan(5);
    expect(mislocated()).toEqual(file);
    expect(secant.tuned.notes).toMatch(/Tuned by tiltbench tune/);
  });
});

describe('tune keeps its bounds and its stop', () => {
  it('a range too narrow to reach the optimum ends at its bound, said so', () => {
    const file = mislocated();
    const { plan, variables } = readTunePlan(
      { variables: [{ id: 'steering.tieRodJoint:z', rangeMm: [-2, 2] }], objectives: [{ measure: 'selfSteer' }], constraints: { jointMargin: false, clearance: false, transmissionFloorDeg: 0 }, poses: LEAN_POSES, starts: 1 },
      file,
    );
    const r = runTune(file, plan, variables);
    expect(r.variables[0].movedMm).toBeGreaterThanOrEqual(-2);
    expect(r.variables[0].movedMm).toBeLessThanOrEqual(2);
    expect(r.variables[0].atBound).toBe('low');
  });

  it('a stopped run returns the best design reached so far, no worse than the start', () => {
    const file = mislocated();
    const { plan, variables } = tieRodPlan(file);
    let asked = 0;
    const r = runTune(file, plan, variables, { shouldStop: () => ++asked > 6 });
    expect(r.cancelled).toBe(true);
    expect(r.costAfter).toBeLessThanOrEqual(r.costBefore);
  });

  it('the bounds transform maps every u into the range and back', () => {
    for (const x of [-3, -1, 0, 2.5, 4]) expect(boundedOffset(unboundedOf(x, -3, 4), -3, 4)).toBeCloseTo(x, 12);
    for (const u of [-100, -1, 0, 7, 1e6]) {
      const x = boundedOffset(u, -3, 4);
      expect(x).toBeGreaterThanOrEqual(-3);
      expect(x).toBeLessThanOrEqual(4);
    }
  });

  it('a tie-rod length variable lengthens each rod by exactly its offset along its own line', () => {
    const file = demoDoc('heron-tilting-velomobile') as DesignFile;
    const { variables } = readTunePlan({ variables: [{ id: 'tieRod.length.left', rangeMm: [-10, 10] }], objectives: [{ measure: 'selfSteer' }] }, file);
    const moved = resolveDesign(applyTuneOffsets(file, variables, [3]));
    const before = resolveDesign(file);
    const len = (d: typeof before, s: 'left' | 'right') => {
      const a = d.upright.steeringArmJoint[s];
      const b = tieRodSteering(d.steering).tieRodJoint[s];
      return Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);
    };
    expect(len(moved, 'left') - len(before, 'left')).toBeCloseTo(3, 9);
    expect(len(moved, 'right')).toBeCloseTo(len(before, 'right'), 12);
  });
});

describe('a tune plan with errors is refused naming its field', () => {
  const file = demoDoc('heron-tilting-velomobile') as DesignFile;
  const refuse = (plan: unknown) => {
    try {
      readTunePlan(plan, file);
    } catch (e) {
      expect(e).toBeInstanceOf(TunePlanError);
      return (e as Error).message;
    }
    throw new Error('accepted');
  };
  const ok = { variables: [{ id: 'steering.tieRodJoint:z', rangeMm: [-5, 5] }], objectives: [{ measure: 'selfSteer' }] };

  it('names the field of each fault', () => {
    expect(refuse({ ...ok, variables: [{ id: 'steering.nowhere:z', rangeMm: [-5, 5] }] })).toMatch(/^variables\[0\]\.id: .*not a hardpoint coordinate/);
    expect(refuse({ ...ok, variables: [{ id: 'steering.tieRodJoint:z', rangeMm: [1, 5] }] })).toMatch(/^variables\[0\]\.rangeMm\[0\]: 1 mm is outside/);
    expect(refuse({ ...ok, objectives: [{ measure: 'toe' }] })).toMatch(/^objectives\[0\]\.measure: expected one of/);
    expect(refuse({ ...ok, objectives: [{ measure: 'steeringRatio' }] })).toMatch(/^objectives\[0\]\.target: .*needs a target/);
    expect(refuse({ ...ok, extra: 1 })).toMatch(/unknown field "extra"/);
    expect(refuse({ ...ok, poses: [{ leanDeg: 'x' }] })).toMatch(/^poses\[0\]\.leanDeg: expected a number/);
  });

  it('refuses two variables that move the same coordinate', () => {
    const both = { ...ok, variables: [{ id: 'steering.tieRodJoint:z', rangeMm: [-5, 5] }, { id: 'steering.tieRodJoint.left:z', rangeMm: [-5, 5] }] };
    expect(refuse(both)).toMatch(/^variables\[1\]\.id: .* moves what variables\[0\]/);
  });
});

describe('geometric proposals agree with planar kinematics', () => {
  it('the tie-rod point lies on the line from the outer joint through the instant centre (split wishbones)', () => {
    const d = resolveDoc(demoDoc('heron-tilting-velomobile'));
    const t = d.upright.steeringArmJoint.right;
    const x = tieRodSteering(d.steering).tieRodJoint.right.x;
    const r = tieRodLinePoint(d, 'right', t, x);
    if (!('point' in r)) throw new Error(r.reason);
    const ic = frontViewInstantCentre(d, 'right', x)!;
    const a = [r.point.y - t.y, r.point.z - t.z];
    const b = [ic[0] - t.y, ic[1] - t.z];
    // Collinear: the cross product is zero relative to the lengths.
    expect(Math.abs(a[0] * b[1] - a[1] * b[0]) / (Math.hypot(a[0], a[1]) * Math.hypot(b[0], b[1]))).toBeLessThan(1e-6);
  });

  it('for a parallelogram the tie-rod point is the outer joint moved back by the arm', () => {
    const d = resolveDoc(demoDoc('swift-parallelogram-trike'));
    expect(d.frontEnd.kind).toBe('centrePivot');
    if (d.frontEnd.kind !== 'centrePivot') return;
    const t = d.upright.steeringArmJoint.right;
    const arm = { y: d.frontEnd.upper.outerJoint.right.y - d.frontEnd.upper.pivot.y, z: d.frontEnd.upper.outerJoint.right.z - d.frontEnd.upper.pivot.z };
    const r = tieRodLinePoint(d, 'right', t, t.x);
    if (!('point' in r)) throw new Error(r.reason);
    // Exact only for an exact front-view parallelogram; the demo's is, to the validator's tolerance.
    expect(r.point.y).toBeCloseTo(t.y - arm.y, 1);
    expect(r.point.z).toBeCloseTo(t.z - arm.z, 1);
  });

  it('the Ackermann proposal aims each arm at the middle of the rear axle and keeps its plan length', () => {
    const d = resolveDoc(demoDoc('wren-rack-trike'));
    for (const side of ['left', 'right'] as const) {
      const p = ackermannArmPoint(d, side);
      const u = d.frontEnd.upper.outerJoint[side];
      const l = d.frontEnd.lower.outerJoint[side];
      const t = (p.z - l.z) / (u.z - l.z);
      const k = { x: l.x + t * (u.x - l.x), y: l.y + t * (u.y - l.y) };
      const r = { x: -d.vehicle.wheelbaseMm, y: 0 };
      const cross = (p.x - k.x) * (r.y - k.y) - (p.y - k.y) * (r.x - k.x);
      expect(Math.abs(cross) / (Math.hypot(p.x - k.x, p.y - k.y) * Math.hypot(r.x - k.x, r.y - k.y))).toBeLessThan(1e-9);
      const a = d.upright.steeringArmJoint[side];
      expect(Math.hypot(p.x - k.x, p.y - k.y)).toBeCloseTo(Math.hypot(a.x - k.x, a.y - k.y), 9);
    }
  });

  it('the tie-rod proposal lowers the self-steer of a mislocated tie rod before it is applied', () => {
    const p = geometricProposals(mislocated(), true)[0];
    const s = p.effect!.find((e) => e.id === 'selfSteer')!;
    expect(s.after!).toBeLessThan(s.before! / 5);
  });
});
