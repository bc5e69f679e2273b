/**
 * Steering with the suspension held at design (pose mode `hold: 'suspension'`, the CLI's
 * `--hold suspension`): the wishbones or members stay where the design puts them, so each
 * upright can only turn about the fixed line through its two outer joints (its kingpin axis,
 * ball joints or kingpin alike), and the tie rod sets how far.
 *
 * Independent construction, per wheel and handlebar angle: turn the design upright about that
 * fixed axis by the angle d that gives the tie rod back its design length, with the steering
 * body's inner joint moved by the handlebar as the file format defines it (rack: along its
 * axis; crank or lever: right-handed about its axis). d is found by bisection on the one-unknown
 * closure; the rotation is three.js's Quaternion.setFromAxisAngle. The road-wheel angle is then
 * the ISO 8855 heading of the rotated spin axis (SAE J670 / ISO 8855: yaw of the wheel's
 * rolling direction, positive left), and the wheel centre the rotated design centre.
 *
 * Outer-joint articulation in the held pose: with a kingpin the yoke does not move, so none;
 * with ball joints a stud s turned by d about the unit axis k leaves its design direction at
 * 2 asin(|sin(d/2)| |k x s|) (the chord of Rodrigues' rotation: |R s - s| = 2 |sin(d/2)| |k x s|).
 */
import { describe, expect, it } from 'vitest';
import { Quaternion, Vector3 } from 'three';
import { solveSinglePose, type PoseRequest } from '../../../core/analysis/solveSinglePose';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import type { ResolvedDesign, Side } from '../../../core/design/types';
import { demoDesign } from '../solver/designs';

const DEG = Math.PI / 180;
const SIDES: Side[] = ['right', 'left'];
const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike'] as const;
const HANDLEBAR = [-25, -15, -6, -1, 0, 2, 8, 15, 25];

type Axis = ResolvedDesign['upright']['steeringAxis'];
const withAxis = (d: ResolvedDesign, steeringAxis: Axis): ResolvedDesign => ({ ...d, upright: { ...d.upright, steeringAxis } });
const vec = (p: { x: number; y: number; z: number } | number[]) => (Array.isArray(p) ? new Vector3(p[0], p[1], p[2]) : new Vector3(p.x, p.y, p.z));

function heldRequest(handlebarDeg: number): PoseRequest {
  return { contact: 'travel', steerBy: 'handlebar', hold: 'suspension', leanDeg: 0, handlebarDeg, heaveMm: 0, travelRightMm: 0, travelLeftMm: 0, wheelAngleDeg: 0 };
}

/** Rotation of p about the line through `o` along unit `k` by `angle` (three.js quaternion). */
function turnAbout(p: Vector3, o: Vector3, k: Vector3, angle: number): Vector3 {
  return p.clone().sub(o).applyQuaternion(new Quaternion().setFromAxisAngle(k, angle)).add(o);
}

/** The inner tie-rod joint at a handlebar angle, by the file format's definition of each steering kind. */
function innerJoint(design: ResolvedDesign, side: Side, handlebarDeg: number): Vector3 {
  const st = design.steering;
  if (st.kind === 'trackRod') throw new Error('track rod not covered here');
  const p = vec(st.tieRodJoint[side]);
  if (st.kind === 'rack') return p.add(vec(st.axis).normalize().multiplyScalar(st.mmPerHandlebarDeg * handlebarDeg));
  if (st.kind === 'bellCrank' && st.input.kind !== 'ratio') throw new Error('drag-link input not covered here');
  const perDeg = st.kind === 'bellCrank' && st.input.kind === 'ratio' ? st.input.crankDegPerHandlebarDeg : 1;
  return turnAbout(p, vec(st.pivot), vec(st.axis).normalize(), perDeg * handlebarDeg * DEG);
}

/** The turn about the fixed kingpin axis that closes the tie rod, by bisection from near `from`. */
function closingTurn(design: ResolvedDesign, side: Side, handlebarDeg: number, from: number, axis?: { o: Vector3; k: Vector3 }): number {
  const L = vec(design.frontEnd.lower.outerJoint[side]);
  const U = vec(design.frontEnd.upper.outerJoint[side]);
  const o = axis?.o ?? L;
  const k = axis?.k ?? U.clone().sub(L).normalize();
  const arm = vec(design.upright.steeringArmJoint[side]);
  const st = design.steering;
  if (st.kind === 'trackRod') throw new Error('track rod not covered here');
  const length = arm.distanceTo(vec(st.tieRodJoint[side]));
  const inner = innerJoint(design, side, handlebarDeg);
  const gap = (d: number) => turnAbout(arm, o, k, d).distanceTo(inner) - length;
  const g0 = gap(from);
  if (g0 === 0) return from;
  // Step outward both ways to the nearest sign change (the assembly next to the last one).
  const step = 0.1 * DEG;
  for (let n = 1; n < 1200; n++) {
    for (const dir of [1, -1]) {
      const a = from + dir * (n - 1) * step;
      const b = from + dir * n * step;
      if (Math.sign(gap(b)) !== Math.sign(g0)) {
        let lo = a;
        let hi = b;
        for (let i = 0; i < 200 && Math.abs(hi - lo) > 1e-16; i++) {
          const m = (lo + hi) / 2;
          if (Math.sign(gap(m)) === Math.sign(gap(lo))) lo = m;
          else hi = m;
        }
        return (lo + hi) / 2;
      }
    }
  }
  throw new Error(`${side} tie rod does not close at handlebar ${handlebarDeg}`);
}

/** ISO 8855 heading (deg, positive left) of a wheel whose spin axis points left: rolling direction s x z. */
const headingDeg = (s: Vector3) => Math.atan2(-s.x, s.y) / DEG;

/** Turns at each handlebar angle, found walking out from straight ahead (continuation by hand). */
function closingTurns(design: ResolvedDesign, side: Side, axis?: { o: Vector3; k: Vector3 }): Map<number, number> {
  const out = new Map<number, number>();
  for (const dir of [1, -1]) {
    let last = 0;
    for (const h of HANDLEBAR.filter((x) => dir * x >= 0).sort((a, b) => dir * (a - b))) {
      last = closingTurn(design, side, h, last, axis);
      out.set(h, last);
    }
  }
  return out;
}

for (const name of DEMOS) {
  for (const axis of ['ballJoints', 'kingpin'] as const) {
    describe(`${name}, ${axis}, suspension held: steering only`, () => {
      const design = withAxis(demoDesign(name), axis);
      const poses = HANDLEBAR.map((h) => ({ h, out: solveSinglePose(design, heldRequest(h)) }));
      // The design's spin axis as the design states it (static toe and camber), not solved.
      const graph = buildMechanism(design, { contact: 'travel', steerBy: 'handlebar', hold: 'suspension' });
      const spin0 = (side: Side) => vec(graph.wheels.find((w) => w.side === side)!.spinAxis);

      it('solves every handlebar angle with the outer joints where the design puts them', () => {
        for (const { h, out } of poses) {
          expect(out.result.status, `handlebar ${h}: ${out.result.message}`).toBe('converged');
          expect(out.report.mode.hold).toBe('suspension');
          for (const side of SIDES) {
            for (const level of ['upper', 'lower'] as const) {
              const p = out.report.points![`frontEnd.${level}.outerJoint.${side}`];
              expect(vec(p).distanceTo(vec(design.frontEnd[level].outerJoint[side])), `${level} ${side} at ${h}`).toBeLessThan(1e-8);
            }
          }
        }
      });

      for (const side of SIDES) {
        it(`${side}: road-wheel angle and wheel centre match the turn about the fixed axis that closes the tie rod`, () => {
          const turns = closingTurns(design, side);
          const L = vec(design.frontEnd.lower.outerJoint[side]);
          const k = vec(design.frontEnd.upper.outerJoint[side]).sub(L).normalize();
          for (const { h, out } of poses) {
            const d = turns.get(h)!;
            const q = new Quaternion().setFromAxisAngle(k, d);
            const want = headingDeg(spin0(side).applyQuaternion(q));
            const w = out.report.wheels![side];
            expect(Math.abs(w.steerDeg - want), `handlebar ${h}`).toBeLessThan(1e-7);
            const centre = turnAbout(vec(design.upright.wheelCentre[side]), L, k, d);
            expect(centre.distanceTo(vec(w.centreMm)), `handlebar ${h}`).toBeLessThan(1e-6);
          }
        });

        it(`${side}: outer-joint articulation is the yoke's (none) or the stud turned about the axis (ball joints)`, () => {
          const turns = closingTurns(design, side);
          const k = vec(design.frontEnd.upper.outerJoint[side]).sub(vec(design.frontEnd.lower.outerJoint[side])).normalize();
          for (const { h, out } of poses) {
            const d = turns.get(h)!;
            for (const joint of ['upperOuter', 'lowerOuter'] as const) {
              const got = out.report.analysis!.joints.find((j) => j.joint === joint && j.side === side)!.articulationDeg;
              const s = vec(design.joints[joint].studAxis[side]).normalize();
              const want = axis === 'kingpin' ? 0 : (2 * Math.asin(Math.abs(Math.sin(d / 2)) * k.clone().cross(s).length())) / DEG;
              expect(Math.abs(got - want), `${joint} at handlebar ${h}`).toBeLessThan(1e-7);
              if (axis === 'kingpin') expect(got, `${joint} at handlebar ${h}`).toBeLessThan(1e-9);
            }
          }
        });
      }
    });
  }
}

describe('negative controls: the held-suspension checks can fail', () => {
  const design = demoDesign('heron-tilting-velomobile');
  const out = solveSinglePose(design, heldRequest(15));
  const side: Side = 'right';
  const L = vec(design.frontEnd.lower.outerJoint[side]);
  const spin0 = vec(buildMechanism(design, { contact: 'travel', steerBy: 'handlebar', hold: 'suspension' }).wheels.find((w) => w.side === side)!.spinAxis);

  it('turning about a vertical axis through the lower joint instead of the kingpin axis misses by far more than the tolerance', () => {
    const k = new Vector3(0, 0, 1);
    const d = closingTurns(design, side, { o: L, k }).get(15)!;
    const wrong = headingDeg(spin0.clone().applyQuaternion(new Quaternion().setFromAxisAngle(k, d)));
    expect(Math.abs(out.report.wheels![side].steerDeg - wrong)).toBeGreaterThan(1e-2);
  });

  it('the suspension left free on the ground puts the steered wheel centre elsewhere than held', () => {
    const free = solveSinglePose(design, { ...heldRequest(15), contact: 'ground', hold: undefined });
    expect(vec(free.report.wheels![side].centreMm).distanceTo(vec(out.report.wheels![side].centreMm))).toBeGreaterThan(1e-2);
  });
});
