/**
 * Steer rotation about an inclined steering axis. With the wishbones held still (their joints
 * made driven with gain 0) and the wheel-travel constraints removed, each upright can only
 * turn about the fixed line through its two ball joints, and the tie rod sets the angle.
 *
 * (a) The upright's rotation must be a rotation about that line: compared with three.js
 *     (Quaternion.setFromAxisAngle about the ball-joint axis), at the angle found by
 *     projecting the solver's rotation onto the axis.
 * (b) The wheel's spin axis, and so its camber, must follow the exact spherical relation
 *     (Rodrigues' rotation formula) s(d) = s0 cos d + (k x s0) sin d + k (k.s0)(1 - cos d)
 *     with k rebuilt from caster and KPI measured on the hardpoints with atan formulas
 *     (definitions: W. F. and D. L. Milliken, Race Car Vehicle Dynamics, SAE 1995, steering
 *     geometry chapter; J. Reimpell et al., The Automotive Chassis, 2001). Its small-angle
 *     form, camber change = -/+ caster * d + KPI * d^2 / 2 (right/left wheel), holds within its
 *     leading neglected term.
 */
import { describe, it, expect } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { buildMechanism, bodyIndex } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs, type MechanismGraph } from '../../../core/mechanism/MechanismGraph';
import type { Side } from '../../../core/design/types';
import { splitDesign, rack, P } from './designs';
import { report } from './report';

const DEG = Math.PI / 180;
const STATIC_CAMBER_DEG = 1;

// Invented split-wishbone front end (right side; left mirrors): upper ball joint 25 mm behind
// and 38 mm inboard of the lower one over 180 mm of height.
const design = splitDesign({
  name: 'inclined steering axis test',
  upperFront: P(100, -120, 310),
  upperRear: P(-100, -120, 310),
  upperOuter: P(-15, -312, 320),
  lowerFront: P(120, -100, 140),
  lowerRear: P(-120, -100, 140),
  lowerOuter: P(10, -350, 140),
  steeringArm: P(-75, -318, 200),
  wheelCentre: P(0, -400, 245),
  staticCamberDeg: STATIC_CAMBER_DEG,
  steering: rack(P(-75, -150, 205)),
  rollingRadiusMm: 245,
});

function lockedWishboneGraph(): MechanismGraph {
  const g = buildMechanism(design, { contact: 'travel', steerBy: 'handlebar' });
  return {
    ...g,
    joints: g.joints.map((j) => (/^(right|left)\.(upper|lower)Wishbone\./.test(j.id) ? { ...j, driver: { input: 'heaveMm', gain: 0 } } : j)),
    // The wheel-centre travel rows would over-constrain the upright (steering about an
    // inclined axis raises and lowers the wheel centre): drop them.
    constraints: g.constraints.filter((c) => c.kind !== 'pointHeight'),
  };
}

type V = [number, number, number];
const sub = (a: V, b: V): V => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: V, b: V) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: V): V => {
  const n = Math.hypot(...a);
  return [a[0] / n, a[1] / n, a[2] / n];
};
const pt = (p: { x: number; y: number; z: number }): V => [p.x, p.y, p.z];

/** Caster and KPI (radians) from the ball joints with the usual atan formulas. */
function casterKpi(side: Side) {
  const lo = pt(design.frontEnd.lower.outerJoint[side]);
  const up = pt(design.frontEnd.upper.outerJoint[side]);
  const h = up[2] - lo[2];
  // caster: top of the axis rearward is positive (side view)
  const caster = Math.atan((lo[0] - up[0]) / h);
  // KPI: top of the axis inboard is positive (front view); inboard is +y on the right, -y on the left
  const inboard = side === 'right' ? 1 : -1;
  const kpi = Math.atan((inboard * (up[1] - lo[1])) / h);
  return { caster, kpi, inboard, lo, up };
}

/** Spin axis (pointing left) at design from the ISO 8855 camber definition, zero toe. */
function designSpinAxis(side: Side): V {
  const g = STATIC_CAMBER_DEG * DEG;
  // Right wheel: top outward (-y) => in-plane up vector (0, -sin g, cos g); normal (0, cos g, sin g).
  return side === 'right' ? [0, Math.cos(g), Math.sin(g)] : [0, Math.cos(g), -Math.sin(g)];
}

/** Camber, top outward positive, of a wheel whose left-pointing spin axis is s. */
const camberOf = (side: Side, s: V) => (side === 'right' ? Math.asin(s[2]) : -Math.asin(s[2]));

function rodrigues(k: V, s0: V, d: number): V {
  const kxs = cross(k, s0);
  const ks = dot(k, s0);
  return [0, 1, 2].map((i) => s0[i] * Math.cos(d) + kxs[i] * Math.sin(d) + k[i] * ks * (1 - Math.cos(d))) as V;
}

const HANDLEBAR = [-40, -30, -20, -12, -6, -2, -0.5, 0.5, 2, 6, 12, 20, 30, 40];

describe('upright steering about the inclined ball-joint axis', () => {
  const graph = lockedWishboneGraph();
  const solver = new PoseSolver(graph);
  const rows = HANDLEBAR.map((hb) => {
    const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
    return { hb, res, snap: takeSnapshot(solver.mechanism) };
  });

  it('solves every handlebar angle', () => {
    for (const { hb, res } of rows) {
      expect(res.status, `handlebar ${hb}: ${res.message}`).toBe('converged');
      expect(res.residualMm!).toBeLessThan(1e-9);
    }
  });

  for (const side of ['right', 'left'] as Side[]) {
    it(`${side}: the upright's rotation is three.js's rotation about the ball-joint axis`, () => {
      const { lo, up } = casterKpi(side);
      const k = unit(sub(up, lo));
      const ui = bodyIndex(graph, `${side}.upright`);
      let worstRot = 0;
      let worstPos = 0;
      let largest = 0;
      for (const { hb, snap } of rows) {
        const R = snap.bodies[ui].rotation; // column-major, design -> world
        // angle about k by projection: a unit vector u normal to k and its image R u
        const u = unit(cross(k, [0, 0, 1]));
        const Ru: V = [R[0] * u[0] + R[3] * u[1] + R[6] * u[2], R[1] * u[0] + R[4] * u[1] + R[7] * u[2], R[2] * u[0] + R[5] * u[1] + R[8] * u[2]];
        const delta = Math.atan2(dot(k, cross(u, Ru)), dot(u, Ru));
        largest = Math.max(largest, Math.abs(delta));
        const q = new Quaternion().setFromAxisAngle(new Vector3(...k), delta);
        const e = new Matrix4().makeRotationFromQuaternion(q).elements;
        const ref = [e[0], e[1], e[2], e[4], e[5], e[6], e[8], e[9], e[10]];
        const dRot = Math.max(...ref.map((x, i) => Math.abs(x - R[i])));
        worstRot = Math.max(worstRot, dRot);
        expect(dRot, `handlebar ${hb}`).toBeLessThan(1e-10);
        // every upright hardpoint turns about the axis line through the lower ball joint
        for (const [id, p] of [
          [`upright.wheelCentre.${side}`, design.upright.wheelCentre[side]],
          [`upright.steeringArmJoint.${side}`, design.upright.steeringArmJoint[side]],
          [`frontEnd.upper.outerJoint.${side}`, design.frontEnd.upper.outerJoint[side]],
          [`frontEnd.lower.outerJoint.${side}`, design.frontEnd.lower.outerJoint[side]],
        ] as const) {
          const r = new Vector3(...sub(pt(p), lo)).applyQuaternion(q);
          const want: V = [lo[0] + r.x, lo[1] + r.y, lo[2] + r.z];
          const got = snap.points[id];
          const dPos = Math.max(...want.map((x, i) => Math.abs(x - got[i])));
          worstPos = Math.max(worstPos, dPos);
          expect(dPos, `${id} at handlebar ${hb}`).toBeLessThan(1e-8);
        }
        // the tie rod keeps its design length (what sets the angle)
        const arm = snap.points[`upright.steeringArmJoint.${side}`];
        const inner = snap.points[`steering.tieRodJoint.${side}`];
        const len0 = Math.hypot(...sub(pt(design.upright.steeringArmJoint[side]), pt((design.steering as Extract<typeof design.steering, { kind: 'rack' }>).tieRodJoint[side])));
        expect(Math.abs(Math.hypot(...sub(arm, inner)) - len0)).toBeLessThan(1e-9);
      }
      report(`steer axis ${side}: largest steer about the axis (deg)`, largest / DEG);
      report(`steer axis ${side}: max rotation-matrix diff vs three.js`, worstRot);
      report(`steer axis ${side}: max upright point diff (mm)`, worstPos);
      expect(largest).toBeGreaterThan(25 * DEG); // the sweep really steered
      expect(worstRot).toBeLessThan(1e-10);
      expect(worstPos).toBeLessThan(1e-8);
    });

    it(`${side}: camber with steer follows the exact spherical relation, and roughly its small-angle form`, () => {
      const { caster, kpi, inboard } = casterKpi(side);
      // k from caster and KPI: top rearward by tan(caster), inboard by tan(KPI), per unit height
      const k = unit([-Math.tan(caster), inboard * Math.tan(kpi), 1]);
      const s0 = designSpinAxis(side);
      const ui = bodyIndex(graph, `${side}.upright`);
      let worstExact = 0;
      let worstSmallRatio = 0;
      for (const { hb, snap } of rows) {
        const R = snap.bodies[ui].rotation;
        const u = unit(cross(k, [0, 0, 1]));
        const Ru: V = [R[0] * u[0] + R[3] * u[1] + R[6] * u[2], R[1] * u[0] + R[4] * u[1] + R[7] * u[2], R[2] * u[0] + R[5] * u[1] + R[8] * u[2]];
        const d = Math.atan2(dot(k, cross(u, Ru)), dot(u, Ru));
        const s = rodrigues(k, s0, d);
        const w = snap.wheels[side];
        const dAxis = Math.max(...s.map((x, i) => Math.abs(x - w.spinAxis[i])));
        expect(dAxis, `spin axis at handlebar ${hb}`).toBeLessThan(1e-10);
        const exact = camberOf(side, s);
        const err = Math.abs(exact / DEG - w.camberDeg);
        worstExact = Math.max(worstExact, err);
        expect(err, `camber at handlebar ${hb}`).toBeLessThan(1e-8);
        // frame does not lean here: camber to frame = camber to ground
        expect(Math.abs(w.camberToFrameDeg - w.camberDeg)).toBeLessThan(1e-12);

        // Small-angle form: right wheel -caster*d + KPI*d^2/2, left wheel +caster*d + KPI*d^2/2
        // (positive d steers left, so the right wheel is then the outer one and caster gives it
        // negative camber, Milliken & Milliken). Its leading neglected term, from a series
        // expansion of the exact relation above, is caster*d^3/6 + (caster^3/6 + caster*KPI^2/2)*d;
        // allow twice that for the fifth-order terms (|d| up to about 38 deg here).
        const sign = side === 'right' ? -1 : 1;
        const approx = STATIC_CAMBER_DEG * DEG + sign * caster * d + (kpi * d * d) / 2;
        const leading = Math.abs(caster * d ** 3 / 6) + Math.abs((caster ** 3 / 6 + (caster * kpi * kpi) / 2) * d);
        const solverCamber = w.camberDeg * DEG;
        worstSmallRatio = Math.max(worstSmallRatio, Math.abs(solverCamber - approx) / (leading + 1e-300));
        expect(Math.abs(solverCamber - approx), `small-angle camber at handlebar ${hb} (d = ${(d / DEG).toFixed(2)} deg)`).toBeLessThanOrEqual(2 * leading + 1e-9);
      }
      report(`steer axis ${side}: max camber diff vs exact relation (deg)`, worstExact);
      report(`steer axis ${side}: max |small-angle error| / leading neglected term`, worstSmallRatio);
      expect(worstExact).toBeLessThan(1e-8);
    });
  }

  it('the small-angle check can fail: a wrong caster sign breaks it', () => {
    // Negative control for the tolerance above: with the caster term's sign flipped the
    // small-angle form misses the solver's camber by far more than its allowance.
    const { caster, kpi } = casterKpi('right');
    const ui = bodyIndex(graph, 'right.upright');
    const { snap } = rows.find((r) => r.hb === 20)!;
    const k = unit(sub(casterKpi('right').up, casterKpi('right').lo));
    const R = snap.bodies[ui].rotation;
    const u = unit(cross(k, [0, 0, 1]));
    const Ru: V = [R[0] * u[0] + R[3] * u[1] + R[6] * u[2], R[1] * u[0] + R[4] * u[1] + R[7] * u[2], R[2] * u[0] + R[5] * u[1] + R[8] * u[2]];
    const d = Math.atan2(dot(k, cross(u, Ru)), dot(u, Ru));
    const wrong = STATIC_CAMBER_DEG * DEG + caster * d + (kpi * d * d) / 2;
    const leading = Math.abs(caster * d ** 3 / 6) + Math.abs((caster ** 3 / 6 + (caster * kpi * kpi) / 2) * d);
    expect(Math.abs(snap.wheels.right.camberDeg * DEG - wrong)).toBeGreaterThan(10 * leading);
  });
});
