/**
 * Knuckle-mounted steering (a one-piece track rod with drive.kind "knuckle"): the Finch demo, a
 * leaning parallelogram with the handlebar fixed to its left upright.
 * - Its lean x handlebar grid closes below 1e-9 mm with every measure finite or explained.
 * - The handlebar angle is the left upright's own turn about its kingpin: the upright's
 *   rotation relative to its yoke, projected on the kingpin axis, equals the handlebar to
 *   solver precision, and is three.js's rotation about that axis (Quaternion.setFromAxisAngle).
 * - The parallelogram with arms on the outer joints' line keeps the track rod's span, so
 *   leaning does not steer: self-steer at zero handlebar below 1e-6 deg over the lean range.
 * - The mirrored design (handlebar on the right upright, y -> -y) at mirrored inputs matches
 *   with sides swapped; a negative control shows the check would see unmirrored inputs.
 * (The other wheel following the trapezoid is checked against the four-bar closed form in
 * test/core/mechanism/trackRod.test.ts.)
 */
import { describe, expect, it } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { mirrorY, resolveSidedVec } from '../../../core/design/resolveDesign';
import { buildMechanism, bodyIndex } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { runSweep, type SweepCell } from '../../../core/analysis/sweep';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';
import { nonFinitePaths, resolveDoc, solveAnalyse, unexplainedNulls, type Doc } from './helpers';
import { clone, demo } from '../reliability/demoDesigns';

const DEG = Math.PI / 180;
const finchDoc = (): Doc => clone(demo('finch').design);

/** Column-major 3x3: R^T S. */
function relative(R: number[], S: number[]): number[] {
  const out: number[] = [];
  for (let c = 0; c < 3; c++) for (let r = 0; r < 3; r++) out.push(R[3 * r] * S[3 * c] + R[3 * r + 1] * S[3 * c + 1] + R[3 * r + 2] * S[3 * c + 2]);
  return out;
}

describe('the Finch (handlebar on the left upright, one-piece track rod)', () => {
  const design = resolveDoc(finchDoc());

  it('its lean x handlebar grid: every pose closed below 1e-9 mm, measures finite or explained', () => {
    const env = design.envelope;
    const steps = (max: number) => Array.from({ length: 2 * Math.round(max / 5) + 1 }, (_, i) => -max + 5 * i);
    const cells: SweepCell[] = [];
    runSweep(design, { leanDeg: steps(env.leanDeg), handlebarDeg: steps(env.handlebarDeg), travelMm: [0] }, {}, (c) => cells.push(c));
    expect(cells).toHaveLength(15 * 11);
    let worst = 0;
    for (const c of cells) {
      if (!c.ok) throw new Error(`lean ${c.leanDeg}, handlebar ${c.handlebarDeg}: did not solve`);
      expect(c.analysis.solver.status, `lean ${c.leanDeg}, handlebar ${c.handlebarDeg}`).toBe('converged');
      worst = Math.max(worst, c.analysis.solver.residualMm!);
      expect(nonFinitePaths(c.analysis)).toEqual([]);
      expect(unexplainedNulls(c.analysis)).toEqual([]);
      if (c.handlebarDeg === 0) expect(Math.abs(c.analysis.selfSteer.leftDeg!) + Math.abs(c.analysis.selfSteer.rightDeg!)).toBeLessThan(1e-6);
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it("the handlebar angle is the left upright's turn in its yoke about the kingpin (three.js rotation about that axis)", () => {
    const graph = buildMechanism(design);
    const solver = new PoseSolver(graph);
    const upright = bodyIndex(graph, 'left.upright');
    const yoke = bodyIndex(graph, 'left.yoke');
    const lo = design.frontEnd.lower.outerJoint.left;
    const up = design.frontEnd.upper.outerJoint.left;
    const k = new Vector3(up.x - lo.x, up.y - lo.y, up.z - lo.z).normalize();
    for (const [lean, hb] of [
      [0, 20],
      [25, -15],
      [-35, 8],
    ]) {
      const res = solver.solve({ ...zeroInputs(), leanDeg: lean, handlebarDeg: hb }, false);
      expect(res.status).toBe('converged');
      const snap = takeSnapshot(solver.mechanism);
      const rel = relative(snap.bodies[yoke].rotation, snap.bodies[upright].rotation);
      const e = new Matrix4().makeRotationFromQuaternion(new Quaternion().setFromAxisAngle(k, hb * DEG)).elements;
      const ref = [e[0], e[1], e[2], e[4], e[5], e[6], e[8], e[9], e[10]];
      expect(Math.max(...ref.map((x, i) => Math.abs(x - rel[i]))), `lean ${lean}, handlebar ${hb}`).toBeLessThan(1e-12);
    }
  });

  it('the mirrored design at mirrored inputs: the same measures, sides swapped', () => {
    const m = finchDoc();
    for (const [obj, key] of [
      [m.frontEnd.upper, 'outerJoint'],
      [m.frontEnd.lower, 'outerJoint'],
      [m.upright, 'steeringArmJoint'],
      [m.upright, 'wheelCentre'],
    ] as const) {
      const r = resolveSidedVec(obj[key]);
      obj[key] = { right: mirrorY(r.left), left: mirrorY(r.right) };
    }
    m.steering.drive.upright = 'right';
    const mirrored = resolveDoc(m);
    for (const [lean, bar] of [
      [10, 15],
      [-30, 5],
      [0, -20],
    ]) {
      const a: PoseAnalysis = solveAnalyse(design, { leanDeg: lean, handlebarDeg: bar }).analysis;
      const b: PoseAnalysis = solveAnalyse(mirrored, { leanDeg: -lean, handlebarDeg: -bar }).analysis;
      for (const [s, o] of [
        ['left', 'right'],
        ['right', 'left'],
      ] as const) {
        for (const key of ['toeDeg', 'camberDeg', 'casterDeg', 'kpiDeg', 'trailMm'] as const) expect(b.wheels[o][key]!).toBeCloseTo(a.wheels[s][key]!, 7);
        expect(b.wheels[o].steerDeg).toBeCloseTo(-a.wheels[s].steerDeg, 7);
        expect(b.slip[o].slipDeg).toBeCloseTo(-a.slip[s].slipDeg, 7);
        for (const j of a.joints.filter((x) => x.side === s)) {
          expect(b.joints.find((x) => x.side === o && x.joint === j.joint)!.articulationDeg).toBeCloseTo(j.articulationDeg, 6);
        }
      }
    }
    // Negative control: the mirrored design at the same (unmirrored) inputs does not match.
    const a = solveAnalyse(design, { leanDeg: 10, handlebarDeg: 15 }).analysis;
    const c = solveAnalyse(mirrored, { leanDeg: 10, handlebarDeg: 15 }).analysis;
    expect(Math.abs(c.wheels.right.steerDeg + a.wheels.left.steerDeg)).toBeGreaterThan(1);
  });
});
