/**
 * The bell crank's pivot axis at any angle, and what that angle does to the tie rods' inner
 * ends as the crank turns (the source of steer-with-lean coupling: an inner end that rises or
 * falls with steer is no longer on the line that keeps toe constant as the wheel travels).
 *
 * The Heron demo (a bell crank turned 1:1 by the handlebar) is solved with its crank axis
 * vertical, inclined 45 deg in the side view, and horizontal along x, at lean 0 with the
 * tyres on the ground (the frame then stays put, so world = frame coordinates). At three
 * handlebar angles each side's inner tie-rod joint, as the solver places it, must lie where the
 * closed-form circle of a point turned about an axis puts it: Rodrigues' rotation formula,
 * here through three.js (Quaternion.setFromAxisAngle, Vector3.applyQuaternion) as the outside
 * reference. Then the vertical motion itself, in closed form for the two extreme axes:
 * - vertical axis: the arm end turns in a horizontal plane, so dz = 0;
 * - axis along x: z' = y sin(t) + z cos(t) about the pivot, so dz = vy sin(t) + vz (cos t - 1)
 *   with v the arm from the pivot (the rotation about x, any kinematics text).
 * The tie rods keep their length and both wheels steer in every case (a negative control: the
 * horizontal axis really moves the inner ends by tens of mm, so a check that ignored the
 * axis would fail).
 *
 * Then what that does: the lean steer (road-wheel angle change from lean 0 to 15 deg, tyres on
 * the ground) at 20 deg of handlebar either way, against the lean steer at zero handlebar. The
 * trade's rule of thumb (a crank axis near vertical keeps the inner ends at constant height and
 * so the toe change with lean nearly independent of steer; near horizontal couples them; from
 * memory, no source) is checked as a direction only: the coupling grows from the vertical to
 * the inclined to the horizontal axis, the horizontal one by more than ten times the vertical.
 */
import { describe, it, expect } from 'vitest';
import { Quaternion, Vector3 } from 'three';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { ResolvedDesign, Side, Vec3Mm } from '../../../core/design/types';
import { demo } from '../reliability/demoDesigns';

const DEG = Math.PI / 180;
const SIDE_LIST: Side[] = ['right', 'left'];
const HANDLEBAR_DEG = [-25, 10, 30];

const AXES: { name: string; axis: Vec3Mm }[] = [
  { name: 'vertical', axis: { x: 0, y: 0, z: 1 } },
  { name: 'inclined 45 deg (side view)', axis: { x: 1, y: 0, z: 1 } },
  { name: 'horizontal along x', axis: { x: 1, y: 0, z: 0 } },
];

function heronWithAxis(axis: Vec3Mm): ResolvedDesign {
  const d = resolveDesign(demo('heron').design);
  if (d.steering.kind !== 'bellCrank' || d.steering.input.kind !== 'ratio') throw new Error('the Heron demo is expected to have a bell crank turned at a ratio');
  return { ...d, steering: { ...d.steering, axis: { ...axis }, input: { kind: 'ratio', crankDegPerHandlebarDeg: 1 } } };
}

type V = [number, number, number];
const pt = (p: Vec3Mm): V => [p.x, p.y, p.z];

describe('bell crank axis angle: the tie rods\' inner ends follow the crank arm\'s circle', () => {
  for (const { name, axis } of AXES) {
    const design = heronWithAxis(axis);
    if (design.steering.kind !== 'bellCrank') throw new Error('unreachable');
    const crank = design.steering;
    const solver = new PoseSolver(buildMechanism(design));
    const k = new Vector3(axis.x, axis.y, axis.z).normalize();

    it(`${name} axis: inner joints on the circle about the axis (three.js), tie rods whole, wheels steered`, () => {
      let worst = 0;
      let largestRise = 0;
      for (const hb of HANDLEBAR_DEG) {
        const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
        expect(res.status, `${name}, handlebar ${hb}: ${res.message}`).toBe('converged');
        expect(res.residualMm!).toBeLessThan(1e-9);
        const snap = takeSnapshot(solver.mechanism);
        const q = new Quaternion().setFromAxisAngle(k, hb * DEG);
        for (const side of SIDE_LIST) {
          const p0 = crank.tieRodJoint[side];
          const r = new Vector3(p0.x - crank.pivot.x, p0.y - crank.pivot.y, p0.z - crank.pivot.z).applyQuaternion(q);
          const want: V = [crank.pivot.x + r.x, crank.pivot.y + r.y, crank.pivot.z + r.z];
          const got = snap.points[`steering.tieRodJoint.${side}`];
          const d = Math.max(...want.map((x, i) => Math.abs(x - got[i])));
          worst = Math.max(worst, d);
          expect(d, `${side} inner joint at handlebar ${hb}`).toBeLessThan(1e-9);
          largestRise = Math.max(largestRise, Math.abs(got[2] - p0.z));
          // the tie rod keeps its design length
          const arm = snap.points[`upright.steeringArmJoint.${side}`];
          const len0 = Math.hypot(...pt(design.upright.steeringArmJoint[side]).map((x, i) => x - pt(p0)[i]));
          expect(Math.abs(Math.hypot(...arm.map((x, i) => x - got[i])) - len0)).toBeLessThan(1e-9);
          // and the wheel steered (the crank drives it in every orientation)
          expect(Math.abs(snap.wheels[side].steerDeg), `${side} wheel at handlebar ${hb}`).toBeGreaterThan(0.3);
        }
      }
      expect(worst).toBeLessThan(1e-9);
      // The Heron's arms reach 60 mm across and 80 mm up from the pivot: about the x axis the
      // inner ends move tens of mm up or down over the sweep, about a vertical axis not at all.
      if (name === 'vertical') expect(largestRise).toBeLessThan(1e-9);
      else if (name.startsWith('horizontal')) expect(largestRise).toBeGreaterThan(20);
      else expect(largestRise).toBeGreaterThan(1);
    });
  }

  it('vertical axis: the inner ends keep their height; horizontal axis: they rise and fall as z\' = y sin t + z cos t', () => {
    const vertical = heronWithAxis({ x: 0, y: 0, z: 1 });
    const horizontal = heronWithAxis({ x: 1, y: 0, z: 0 });
    for (const [design, closedForm] of [
      [vertical, () => 0],
      [horizontal, (v: V, t: number) => v[1] * Math.sin(t) + v[2] * (Math.cos(t) - 1)],
    ] as const) {
      if (design.steering.kind !== 'bellCrank') throw new Error('unreachable');
      const crank = design.steering;
      const solver = new PoseSolver(buildMechanism(design));
      for (const hb of HANDLEBAR_DEG) {
        const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
        expect(res.status).toBe('converged');
        const snap = takeSnapshot(solver.mechanism);
        for (const side of SIDE_LIST) {
          const p0 = pt(crank.tieRodJoint[side]);
          const v: V = [p0[0] - crank.pivot.x, p0[1] - crank.pivot.y, p0[2] - crank.pivot.z];
          const dz = snap.points[`steering.tieRodJoint.${side}`][2] - p0[2];
          expect(Math.abs(dz - closedForm(v, hb * DEG)), `${side} at handlebar ${hb}`).toBeLessThan(1e-9);
        }
      }
    }
  });

  it('steer x lean coupling: the lean steer moves with the handlebar least for the vertical axis, most for the horizontal one', () => {
    const coupling = (axis: Vec3Mm): number => {
      const solver = new PoseSolver(buildMechanism(heronWithAxis(axis)));
      const steer = (leanDeg: number, handlebarDeg: number) => {
        const res = solver.solve({ ...zeroInputs(), leanDeg, handlebarDeg }, false);
        expect(res.status, `lean ${leanDeg}, handlebar ${handlebarDeg}: ${res.message}`).toBe('converged');
        const w = takeSnapshot(solver.mechanism).wheels;
        return { left: w.left.steerDeg, right: w.right.steerDeg };
      };
      const leanSteer = (hb: number) => {
        const a = steer(0, hb);
        const b = steer(15, hb);
        return { left: b.left - a.left, right: b.right - a.right };
      };
      const atZero = leanSteer(0);
      let worst = 0;
      for (const hb of [-20, 20]) {
        const here = leanSteer(hb);
        for (const side of SIDE_LIST) worst = Math.max(worst, Math.abs(here[side] - atZero[side]));
      }
      return worst;
    };
    const vertical = coupling({ x: 0, y: 0, z: 1 });
    const inclined = coupling({ x: 1, y: 0, z: 1 });
    const horizontal = coupling({ x: 1, y: 0, z: 0 });
    // measured on the Heron: about 0.37, 6.6 and 10.0 deg
    expect(vertical).toBeLessThan(inclined);
    expect(inclined).toBeLessThan(horizontal);
    expect(horizontal).toBeGreaterThan(10 * vertical);
  });
});
