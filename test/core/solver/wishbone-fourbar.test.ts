/**
 * Front view of one side's wishbones: a planar four-bar in the y-z plane. Ground link = the
 * frame between the inner pivots, crank = lower wishbone (driven), coupler = upright (lower
 * to upper ball joint), rocker = upper wishbone (output). All rotation axes along x.
 *
 * Reference: the closed-form position solution of the four-bar, R. L. Norton, Design of
 * Machinery, ch. 4 (eq. 4.10: Freudenstein's K1..K3 and the tangent half-angle quadratic),
 * with its two roots being the open and the crossed circuit. Angles are measured from the
 * ground link O2 -> O4, counter-clockwise in the (y, z) plane (right-handed about +x).
 *
 * Modelled as the brief says: the upright is a revolute on the lower wishbone (axis x) at the
 * lower ball joint, and a 'coincident' constraint closes the loop at the upper ball joint.
 */
import { describe, it, expect } from 'vitest';
import type { MechanismGraph, Vec3 } from '../../../core/mechanism/MechanismGraph';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { report } from './report';

const DEG = Math.PI / 180;
type P2 = [number, number]; // (y, z)

const O2: P2 = [-90, 150]; // lower inner pivot (frame)
const O4: P2 = [-120, 330]; // upper inner pivot (frame)
const A0: P2 = [-350, 140]; // lower ball joint at design
const B_OPEN: P2 = [-318, 335]; // upper ball joint at design, open assembly
const X = 25; // every point sits at x = 25 mm: the x offset must not matter

const len = (p: P2, q: P2) => Math.hypot(p[0] - q[0], p[1] - q[1]);
const ang = (p: P2, q: P2) => Math.atan2(q[1] - p[1], q[0] - p[0]);
const wrap = (x: number) => Math.atan2(Math.sin(x), Math.cos(x));

const a = len(O2, A0); // crank: lower wishbone
const b = len(A0, B_OPEN); // coupler: upright
const c = len(O4, B_OPEN); // rocker: upper wishbone
const d = len(O2, O4); // ground
const th1 = ang(O2, O4); // ground link direction

/** Norton, Design of Machinery, eq. 4.10: the two roots for theta4 (relative to the ground link). */
function nortonTheta4(t2: number): { open: number; crossed: number } | null {
  const K1 = d / a;
  const K2 = d / c;
  const K3 = (a * a - b * b + c * c + d * d) / (2 * a * c);
  const A = Math.cos(t2) - K1 - K2 * Math.cos(t2) + K3;
  const B = -2 * Math.sin(t2);
  const C = K1 - (K2 + 1) * Math.cos(t2) + K3;
  const disc = B * B - 4 * A * C;
  if (disc < 0) return null;
  // Norton: the minus sign gives the open circuit, the plus sign the crossed one
  // (from memory; the test also checks it geometrically below).
  return {
    open: 2 * Math.atan2(-B - Math.sqrt(disc), 2 * A),
    crossed: 2 * Math.atan2(-B + Math.sqrt(disc), 2 * A),
  };
}

/** Whether the polygon O2-A-B-O4 crosses itself (segments O2A and BO4 intersect, or AB and O4O2). */
function selfIntersecting(A: P2, B: P2): boolean {
  const cross = (o: P2, p: P2, q: P2) => (p[0] - o[0]) * (q[1] - o[1]) - (p[1] - o[1]) * (q[0] - o[0]);
  const segs = (p1: P2, p2: P2, q1: P2, q2: P2) =>
    cross(p1, p2, q1) * cross(p1, p2, q2) < 0 && cross(q1, q2, p1) * cross(q1, q2, p2) < 0;
  return segs(O2, A, B, O4) || segs(A, B, O4, O2);
}

const at = (o: P2, r: number, t: number): P2 => [o[0] + r * Math.cos(t), o[1] + r * Math.sin(t)];
const v3 = (p: P2): Vec3 => [X, p[0], p[1]];

function fourBarGraph(B: P2): MechanismGraph {
  return {
    name: 'front-view wishbone four-bar',
    bodies: [
      { id: 'lower', label: 'lower wishbone' },
      { id: 'upright', label: 'upright' },
      { id: 'upper', label: 'upper wishbone' },
    ],
    joints: [
      // lower wishbone driven by the "lean" input (degrees -> radians), about +x
      { id: 'lowerPivot', label: 'lower inner pivot', kind: 'revolute', parent: -1, child: 0, origin: v3(O2), axis: [1, 0, 0], driver: { input: 'leanDeg', gain: DEG } },
      { id: 'lowerBall', label: 'lower ball joint', kind: 'revolute', parent: 0, child: 1, origin: v3(A0), axis: [1, 0, 0] },
      { id: 'upperPivot', label: 'upper inner pivot', kind: 'revolute', parent: -1, child: 2, origin: v3(O4), axis: [1, 0, 0] },
    ],
    constraints: [{ kind: 'coincident', id: 'upperBall', label: 'upper ball joint', bodyA: 1, pointA: v3(B), bodyB: 2, pointB: v3(B) }],
    points: [],
    wheels: [],
    links: [],
    frameBody: -1,
  };
}

describe('front-view wishbone four-bar against the closed-form position solution', () => {
  const t2Design = wrap(ang(O2, A0) - th1);
  const roots0 = nortonTheta4(t2Design)!;

  it('the design geometry is the open circuit, and the crossed root is a different assembly', () => {
    const t4Open = wrap(ang(O4, B_OPEN) - th1);
    expect(Math.abs(wrap(roots0.open - t4Open))).toBeLessThan(1e-12);
    expect(selfIntersecting(A0, B_OPEN)).toBe(false);
    const Bx = at(O4, c, th1 + roots0.crossed);
    expect(selfIntersecting(A0, Bx)).toBe(true);
    expect(Math.abs(wrap(roots0.crossed - roots0.open))).toBeGreaterThan(20 * DEG);
  });

  for (const circuit of ['open', 'crossed'] as const) {
    it(`assembled ${circuit}, a sweep of the lower wishbone stays on the ${circuit} circuit`, () => {
      const B = circuit === 'open' ? B_OPEN : at(O4, c, th1 + roots0.crossed);
      // the crossed assembly has the same link lengths
      expect(Math.abs(len(A0, B) - b)).toBeLessThan(1e-9);
      expect(Math.abs(len(O4, B) - c)).toBeLessThan(1e-9);
      const t4Design = wrap(ang(O4, B) - th1);
      const solver = new PoseSolver(fourBarGraph(B));
      let worstDeg = 0;
      let minSeparationDeg = Infinity;
      let steps = 0;
      // 0 -> +30 deg (bump) then back through 0 to -30 deg (rebound), 0.5 deg steps, warm
      const path: number[] = [];
      for (let k = 0; k <= 60; k++) path.push(k * 0.5);
      for (let k = 59; k >= -60; k--) path.push(k * 0.5);
      for (const phiDeg of path) {
        const roots = nortonTheta4(t2Design + phiDeg * DEG);
        if (!roots) continue;
        const res = solver.solve({ ...zeroInputs(), leanDeg: phiDeg });
        expect(res.status, `${circuit} at ${phiDeg}: ${res.message}`).toBe('converged');
        expect(res.residualMm!).toBeLessThan(1e-9);
        const t4 = t4Design + solver.mechanism.coord[2];
        const err = Math.abs(wrap(t4 - roots[circuit])) / DEG;
        worstDeg = Math.max(worstDeg, err);
        expect(err, `${circuit} at ${phiDeg} deg`).toBeLessThan(1e-9);
        // far from the other circuit (a flip would show as a match with it)
        const other = circuit === 'open' ? roots.crossed : roots.open;
        minSeparationDeg = Math.min(minSeparationDeg, Math.abs(wrap(t4 - other)) / DEG);
        // and the upright angle (coupler) satisfies the loop: A + b e^{i t3} = B
        const A = at(O2, a, th1 + t2Design + phiDeg * DEG);
        const Bs = at(O4, c, th1 + t4);
        expect(Math.abs(len(A, Bs) - b)).toBeLessThan(1e-8);
        steps++;
      }
      report(`four-bar ${circuit}: ${steps} poses, max upper-wishbone angle error (deg)`, worstDeg);
      report(`four-bar ${circuit}: min distance to the other circuit (deg)`, minSeparationDeg);
      expect(steps).toBeGreaterThan(100);
      expect(minSeparationDeg).toBeGreaterThan(5);
      expect(worstDeg).toBeLessThan(1e-9);
    });
  }
});
