/**
 * A planar four-bar as a MechanismGraph (mechanism graphs are plain data, so any layout can be
 * handed to the solver), with its closed-form position solution for reference.
 *
 * Ground pivots O2 = (0, 0, 0) and O4 = (d, 0, 0), both about z; crank of length a on O2,
 * rocker of length c on O4, coupler of length b between their tips (a link with a ball joint
 * at each end). Given the crank angle theta, the rocker angle phi solves |A(theta) - B(phi)| = b:
 * the intersection of two circles, phi = atan2(A - O4) + s * acos((c^2 + e^2 - b^2) / (2 c e))
 * with e = |A - O4| and s = +1 or -1 the assembly branch. It exists while |b - c| <= e <= b + c;
 * at e = b + c or |b - c| the rocker and coupler are in line (the rocker's toggle) and the two
 * branches meet. This is the geometry behind Freudenstein's relation (F. Freudenstein,
 * "Approximate synthesis of four-bar linkages", Trans. ASME 77, 1955), solved here directly.
 * The same formula with the roles swapped gives the crank for a driven rocker.
 */
import type { MechanismGraph } from '../../../core/mechanism/MechanismGraph';

const DEG = Math.PI / 180;

export interface FourBar {
  a: number;
  b: number;
  c: number;
  d: number;
}

export const wrapRad = (x: number) => x - 2 * Math.PI * Math.round(x / (2 * Math.PI));

/** Rocker angle for crank angle theta on branch s, or null where the loop cannot close. */
export function rockerAngle(f: FourBar, theta: number, s: 1 | -1): number | null {
  const ax = f.a * Math.cos(theta) - f.d;
  const ay = f.a * Math.sin(theta);
  const e = Math.hypot(ax, ay);
  const cos = (f.c * f.c + e * e - f.b * f.b) / (2 * f.c * e);
  if (!(Math.abs(cos) <= 1)) return null;
  return Math.atan2(ay, ax) + s * Math.acos(cos);
}

/** Crank angle for rocker angle phi on branch s, or null where the loop cannot close. */
export function crankAngle(f: FourBar, phi: number, s: 1 | -1): number | null {
  const bx = f.d + f.c * Math.cos(phi);
  const by = f.c * Math.sin(phi);
  const e = Math.hypot(bx, by);
  const cos = (f.a * f.a + e * e - f.b * f.b) / (2 * f.a * e);
  if (!(Math.abs(cos) <= 1)) return null;
  return Math.atan2(by, bx) + s * Math.acos(cos);
}

/**
 * The four-bar at design angles theta0 (crank) and phi0 (rocker, on the branch given), with
 * either the crank or the rocker driven by the handlebar input (1 degree per degree).
 * Body 0 is the driven link, body 1 the solved one.
 */
export function fourBarGraph(f: FourBar, theta0: number, phi0: number, driven: 'crank' | 'rocker'): MechanismGraph {
  const A: [number, number, number] = [f.a * Math.cos(theta0), f.a * Math.sin(theta0), 0];
  const B: [number, number, number] = [f.d + f.c * Math.cos(phi0), f.c * Math.sin(phi0), 0];
  const crank = { origin: [0, 0, 0] as [number, number, number], tip: A, label: 'crank' };
  const rocker = { origin: [f.d, 0, 0] as [number, number, number], tip: B, label: 'rocker' };
  const [first, second] = driven === 'crank' ? [crank, rocker] : [rocker, crank];
  return {
    name: `four-bar ${f.a}/${f.b}/${f.c}/${f.d}, ${driven} driven`,
    bodies: [
      { id: first.label, label: first.label },
      { id: second.label, label: second.label },
    ],
    joints: [
      { id: `${first.label}.joint`, label: `${first.label} pivot`, kind: 'revolute', parent: -1, child: 0, origin: first.origin, axis: [0, 0, 1], driver: { input: 'handlebarDeg', gain: DEG } },
      { id: `${second.label}.joint`, label: `${second.label} pivot`, kind: 'revolute', parent: -1, child: 1, origin: second.origin, axis: [0, 0, 1] },
    ],
    constraints: [{ kind: 'distance', id: 'coupler', label: 'coupler', bodyA: 0, pointA: first.tip, bodyB: 1, pointB: second.tip, length: Math.hypot(A[0] - B[0], A[1] - B[1]) }],
    points: [
      { id: `${first.label}.tip`, label: `${first.label} tip`, body: 0, design: first.tip },
      { id: `${second.label}.tip`, label: `${second.label} tip`, body: 1, design: second.tip },
    ],
    wheels: [],
    links: [],
    frameBody: 0,
  };
}
