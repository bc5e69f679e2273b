/**
 * A planar steering trapezoid (zero caster, zero KPI) is a planar four-bar: the ground link
 * between the two kingpins, the two steering arms (input crank and output rocker) and the tie
 * rod (coupler). Its input-output relation is Freudenstein's equation
 *   K1 cos(t4) - K2 cos(t2) + K3 = cos(t2 - t4),
 *   K1 = d/a, K2 = d/c, K3 = (a^2 - b^2 + c^2 + d^2) / (2 a c)
 * (F. Freudenstein, "Approximate synthesis of four-bar linkages", Trans. ASME 77, 1955),
 * solved in closed form with the tangent half-angle substitution
 *   t4 = 2 atan((-B +- sqrt(B^2 - 4AC)) / (2A)),
 *   A = cos t2 - K1 - K2 cos t2 + K3, B = -2 sin t2, C = K1 - (K2 + 1) cos t2 + K3
 * (R. L. Norton, Design of Machinery, eq. 4.10a). Angles are measured from the ground link
 * (kingpin O2 -> kingpin O4), counter-clockwise seen from above.
 *
 * The pose solver knows nothing of this: it sees two revolute joints on the ground and one
 * distance constraint.
 */
import { describe, it, expect } from 'vitest';
import type { MechanismGraph } from '../../../core/mechanism/MechanismGraph';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { report } from './report';

const DEG = Math.PI / 180;

interface Trapezoid {
  /** Track between kingpins, mm (ground link d). */
  track: number;
  /** Steering-arm length, mm (a = c). */
  arm: number;
  /** Ackermann angle: arms point rearward and inward by this angle, degrees. */
  ackermannDeg: number;
  /** Kingpin height above the ground, mm (the plane of the linkage). */
  z: number;
}

function trapezoidGraph(p: Trapezoid): { graph: MechanismGraph; tieRod: number } {
  const h = p.track / 2;
  const b = p.ackermannDeg * DEG;
  // Right kingpin O2 at y = -h, left kingpin O4 at y = +h; rearward arms (-x), inward.
  const armR: [number, number, number] = [-p.arm * Math.cos(b), -h + p.arm * Math.sin(b), p.z];
  const armL: [number, number, number] = [-p.arm * Math.cos(b), h - p.arm * Math.sin(b), p.z];
  const tieRod = Math.hypot(armR[0] - armL[0], armR[1] - armL[1], armR[2] - armL[2]);
  const graph: MechanismGraph = {
    name: 'planar steering trapezoid',
    bodies: [
      { id: 'rightKnuckle', label: 'right knuckle' },
      { id: 'leftKnuckle', label: 'left knuckle' },
    ],
    joints: [
      {
        id: 'rightKingpin',
        label: 'right kingpin',
        kind: 'revolute',
        parent: -1,
        child: 0,
        origin: [0, -h, p.z],
        axis: [0, 0, 1],
        driver: { input: 'handlebarDeg', gain: DEG },
      },
      { id: 'leftKingpin', label: 'left kingpin', kind: 'revolute', parent: -1, child: 1, origin: [0, h, p.z], axis: [0, 0, 1] },
    ],
    constraints: [{ kind: 'distance', id: 'tieRod', label: 'tie rod', bodyA: 0, pointA: armR, bodyB: 1, pointB: armL, length: tieRod }],
    points: [],
    wheels: [],
    links: [],
    frameBody: -1,
  };
  return { graph, tieRod };
}

/** Freudenstein constants for crank a, coupler b, rocker c, ground d. */
function freudensteinK(a: number, b: number, c: number, d: number) {
  return { K1: d / a, K2: d / c, K3: (a * a - b * b + c * c + d * d) / (2 * a * c) };
}

/** Both closed-form output angles (Norton eq. 4.10a), radians; null past a toggle position. */
function outputAngles(a: number, b: number, c: number, d: number, t2: number): [number, number] | null {
  const { K1, K2, K3 } = freudensteinK(a, b, c, d);
  const A = Math.cos(t2) - K1 - K2 * Math.cos(t2) + K3;
  const B = -2 * Math.sin(t2);
  const C = K1 - (K2 + 1) * Math.cos(t2) + K3;
  const disc = B * B - 4 * A * C;
  if (disc < 0) return null;
  return [2 * Math.atan((-B - Math.sqrt(disc)) / (2 * A)), 2 * Math.atan((-B + Math.sqrt(disc)) / (2 * A))];
}

function freudensteinResidual(a: number, b: number, c: number, d: number, t2: number, t4: number): number {
  const { K1, K2, K3 } = freudensteinK(a, b, c, d);
  return K1 * Math.cos(t4) - K2 * Math.cos(t2) + K3 - Math.cos(t2 - t4);
}

/** Difference of two angles, wrapped to (-pi, pi]. */
function angleDiff(x: number, y: number): number {
  return Math.atan2(Math.sin(x - y), Math.cos(x - y));
}

const CASES: Trapezoid[] = [
  { track: 760, arm: 90, ackermannDeg: 16, z: 200 }, // velomobile-like
  { track: 1400, arm: 140, ackermannDeg: 11, z: 0 }, // car-like
  { track: 600, arm: 120, ackermannDeg: 25, z: 150 }, // strong Ackermann, short track
];

describe('planar steering trapezoid against Freudenstein closed form', () => {
  for (const p of CASES) {
    it(`track ${p.track}, arm ${p.arm}, Ackermann angle ${p.ackermannDeg} deg`, () => {
      const { graph, tieRod } = trapezoidGraph(p);
      const a = p.arm;
      const c = p.arm;
      const d = p.track;
      const bAck = p.ackermannDeg * DEG;
      // Ground-link direction is +y; angle from it CCW seen from above: a direction (dx, dy)
      // has angle atan2(-dx, dy). Right arm (-cos b, +sin b): 90 deg - b; left arm (-cos b, -sin b): 90 deg + b.
      const t2Design = Math.PI / 2 - bAck;
      const t4Design = Math.PI / 2 + bAck;
      // Pick the closed-form root that is the design assembly, and keep that sign.
      const roots0 = outputAngles(a, tieRod, c, d, t2Design)!;
      const branch = Math.abs(angleDiff(roots0[0], t4Design)) < Math.abs(angleDiff(roots0[1], t4Design)) ? 0 : 1;
      expect(Math.abs(angleDiff(roots0[branch], t4Design))).toBeLessThan(1e-12);
      // the other root is a genuinely different assembly (so picking the branch matters)
      expect(Math.abs(angleDiff(roots0[1 - branch], t4Design))).toBeGreaterThan(10 * DEG);

      const solver = new PoseSolver(graph);
      let worstDeg = 0;
      let worstResidual = 0;
      let checked = 0;
      // Sweep the input knuckle (right) both ways from straight ahead, warm, as a user would.
      for (const dir of [1, -1]) {
        solver.reset();
        for (let k = 0; k <= 45; k++) {
          const delta = dir * k; // degrees of right-knuckle steer
          const t2 = t2Design + delta * DEG;
          const roots = outputAngles(a, tieRod, c, d, t2);
          if (!roots) break; // past the toggle of this non-Grashof four-bar
          const res = solver.solve({ ...zeroInputs(), handlebarDeg: delta });
          expect(res.status).toBe('converged');
          expect(res.residualMm!).toBeLessThan(1e-9);
          const t4 = t4Design + solver.mechanism.coord[1];
          const errDeg = Math.abs(angleDiff(t4, roots[branch])) / DEG;
          worstDeg = Math.max(worstDeg, errDeg);
          // The solver stops once the tie-rod length is right to 1e-9 mm; a length error e moves
          // the output arm by e / (c sin(mu)), mu = transmission angle (coupler to rocker).
          const A: [number, number] = [a * Math.cos(t2), a * Math.sin(t2)];
          const B: [number, number] = [d + c * Math.cos(roots[branch]), c * Math.sin(roots[branch])];
          const sinMu = Math.abs(((B[0] - A[0]) * Math.sin(roots[branch]) - (B[1] - A[1]) * Math.cos(roots[branch])) / tieRod);
          const allowedDeg = Math.max(1e-9, (2 * solver.options.toleranceMm) / (c * sinMu) / DEG);
          expect(errDeg, `at ${delta} deg`).toBeLessThan(allowedDeg);
          // Freudenstein's equation itself at the solver's answer. It is the loop closure
          // b^2 = |...|^2 divided by 2ac, so a tie-rod length error e (the solver stops at
          // |e| < 1e-9 mm) leaves a residual of about b e / (a c); plus rounding.
          const fr = Math.abs(freudensteinResidual(a, tieRod, c, d, t2, t4));
          const allowed = (tieRod * 1e-9) / (a * c) + 1e-13;
          worstResidual = Math.max(worstResidual, fr / allowed);
          expect(fr).toBeLessThan(allowed);
          checked++;
        }
      }
      report(`Freudenstein ${p.track}/${p.arm}/${p.ackermannDeg}: ${checked} poses, max output-angle error (deg)`, worstDeg);
      report(`Freudenstein ${p.track}/${p.arm}/${p.ackermannDeg}: max equation residual / allowance`, worstResidual);
      expect(checked).toBeGreaterThan(60);
      expect(worstResidual).toBeLessThan(1);
    });
  }

  it('steers with Ackermann sense: the inner (left, in a left turn) wheel turns more', () => {
    // Gillespie, Fundamentals of Vehicle Dynamics, 1992, low-speed turning: a trapezoid with
    // rearward arms angled inward steers the inner wheel more than the outer one.
    const p = CASES[0];
    const { graph, tieRod } = trapezoidGraph(p);
    const solver = new PoseSolver(graph);
    const res = solver.solve({ ...zeroInputs(), handlebarDeg: 20 }); // right knuckle +20 deg: left turn, right is outer
    expect(res.status).toBe('converged');
    const inner = solver.mechanism.coord[1] / DEG;
    expect(inner).toBeGreaterThan(20.5);
    // and equal to the closed form
    const t2 = Math.PI / 2 - p.ackermannDeg * DEG + 20 * DEG;
    const roots = outputAngles(p.arm, tieRod, p.arm, p.track, t2)!;
    const closed = roots.map((t4) => (t4 - (Math.PI / 2 + p.ackermannDeg * DEG)) / DEG);
    expect(Math.min(...closed.map((x) => Math.abs(x - inner)))).toBeLessThan(1e-9);
  });
});
