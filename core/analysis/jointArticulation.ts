/**
 * Ball-joint and rod-end articulation: the angle between the housing's axis (fixed in one
 * body) and the stud or bolt axis (fixed in the other). At design position both lie along
 * the joint's `studAxis`, so articulation is zero there.
 *
 *   upper / lower outer joint: stud in the upright, housing in the wishbone or member; with a
 *                              kingpin (upright.steeringAxis "kingpin") the stud is in the yoke
 *                              the upright turns in, so these see the suspension's motion and
 *                              never the steering;
 *   tie rod outer:             stud in the steering arm (upright), housing in the tie rod;
 *   tie rod inner:             stud in the crank, lever or rack, housing in the tie rod.
 *
 * Tie-rod spin. A tie rod with a ball joint or rod end at each end is free to spin about its
 * own axis, so its orientation is not fixed by the linkage. Treatment adopted (continuous
 * minimax): the rod's frame is its design frame carried by the shortest rotation that takes
 * its design axis to its present axis (its un-spun position), then spun about that axis to the
 * nearest position where the larger of its two end articulations is least: starting from the
 * un-spun position the rod turns the way that eases its worse end until no turn eases it
 * further (a local optimum, the one a rod nudged by its joints settles in). The rod cannot take
 * the other local optimum without first passing through a worse position, so unlike the global
 * optimum this one does not jump between neighbouring poses: the articulations reported are
 * those of a rod moving continuously. The spin used is reported (relative to the un-spun
 * position). Each end's cosine is a + p cos(s) + q sin(s) in the spin s, so the local optima
 * are found in closed form among a few candidates.
 */

import type { Vec3 } from '../mechanism/MechanismGraph';
import { clamp, cross, dot, norm, normalize, scale, sub, add } from './vec3';

/** Articulation (radians) between a stud direction and a housing direction. */
export function articulation(stud: Vec3, housing: Vec3): number {
  return Math.atan2(norm(cross(stud, housing)), dot(stud, housing));
}

/** Shortest rotation taking unit a to unit b, applied to v. */
export function rotateShortest(a: Vec3, b: Vec3, v: Vec3): Vec3 {
  const c = dot(a, b);
  const w = cross(a, b);
  const s = norm(w);
  if (s < 1e-12) {
    if (c > 0) return [v[0], v[1], v[2]];
    // Half turn: about any axis perpendicular to a (a and b exactly opposite).
    const p = normalize(Math.abs(a[0]) < 0.9 ? cross(a, [1, 0, 0]) : cross(a, [0, 1, 0]));
    return sub(scale(p, 2 * dot(p, v)), v);
  }
  // Rodrigues about the unit axis k = w / |w| by the angle atan2(|w|, c): stable for any angle.
  const k = scale(w, 1 / s);
  const t = Math.atan2(s, c);
  const ct = Math.cos(t);
  return add(add(scale(v, ct), scale(cross(k, v), Math.sin(t))), scale(k, dot(k, v) * (1 - ct)));
}

export interface TieRodEnds {
  /** Rod axis at design (unit, inner joint to outer joint) and now. */
  axisDesign: Vec3;
  axisNow: Vec3;
  /** Design stud directions of the outer and inner joints (the housings' directions in the rod at design). */
  outerStudDesign: Vec3;
  innerStudDesign: Vec3;
  /** Stud directions now (fixed in the upright and in the crank, rack or lever). */
  outerStudNow: Vec3;
  innerStudNow: Vec3;
}

export interface TieRodArticulation {
  outerRad: number;
  innerRad: number;
  /** Spin about the rod axis chosen, radians, relative to the shortest rotation. */
  spinRad: number;
}

/** cos(angle between u and v rotated by s about unit e) = a + p cos s + q sin s, into out[0..2]. */
function spinCosine(u: Vec3, v: Vec3, e: Vec3, out: Float64Array): void {
  const along = v[0] * e[0] + v[1] * e[1] + v[2] * e[2];
  const px = v[0] - e[0] * along, py = v[1] - e[1] * along, pz = v[2] - e[2] * along;
  // e x vPerp
  const cx = e[1] * pz - e[2] * py, cy = e[2] * px - e[0] * pz, cz = e[0] * py - e[1] * px;
  out[0] = (u[0] * e[0] + u[1] * e[1] + u[2] * e[2]) * along;
  out[1] = u[0] * px + u[1] * py + u[2] * pz;
  out[2] = u[0] * cx + u[1] * cy + u[2] * cz;
}

const sinusoid = (a: number, p: number, q: number, s: number): number => a + p * Math.cos(s) + q * Math.sin(s);
const CO = new Float64Array(3);
const CI = new Float64Array(3);
const CANDIDATES = new Float64Array(5);
const IS_OPTIMUM = new Uint8Array(5);
/** The two ends' cosine coefficients (a, p, q outer; a, p, q inner) of the rod being measured. */
const COEF = new Float64Array(6);

/** The worse end's cosine at spin s: min of the two ends' a + p cos s + q sin s. */
function worseCosine(s: number): number {
  const c = Math.cos(s);
  const n = Math.sin(s);
  return Math.min(COEF[0] + COEF[1] * c + COEF[2] * n, COEF[3] + COEF[4] * c + COEF[5] * n);
}

/** The local optimum (of the first n candidates) met first going round from 0 in direction dir. */
function nearestOptimum(n: number, dir: 1 | -1): number {
  let nearest = Infinity;
  let at = 0;
  for (let i = 0; i < n; i++) {
    if (!IS_OPTIMUM[i]) continue;
    // Angle travelled from 0 in the climbing direction, in (0, 2 pi].
    let travel = (((dir * CANDIDATES[i]) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
    if (travel <= 1e-12) travel += 2 * Math.PI;
    if (travel < nearest) {
      nearest = travel;
      at = dir * travel;
    }
  }
  return at;
}

export function tieRodArticulation(t: TieRodEnds): TieRodArticulation {
  const e = t.axisNow;
  spinCosine(t.outerStudNow, rotateShortest(t.axisDesign, e, t.outerStudDesign), e, CO);
  spinCosine(t.innerStudNow, rotateShortest(t.axisDesign, e, t.innerStudDesign), e, CI);
  const ao = CO[0], po = CO[1], qo = CO[2];
  const ai = CI[0], pi = CI[1], qi = CI[2];
  let n = 0;
  CANDIDATES[n++] = 0;
  CANDIDATES[n++] = Math.atan2(qo, po);
  CANDIDATES[n++] = Math.atan2(qi, pi);
  // Where the two cosines are equal: (ao - ai) + P cos s + Q sin s = 0.
  const P = po - pi;
  const Q = qo - qi;
  const A = ao - ai;
  const rho = Math.sqrt(P * P + Q * Q);
  if (rho > 1e-15 && Math.abs(A) <= rho) {
    const phi = Math.atan2(Q, P);
    const d = Math.acos(clamp(-A / rho, -1, 1));
    CANDIDATES[n++] = phi + d;
    CANDIDATES[n++] = phi - d;
  }
  // (Module-level coefficients and no closures: this runs twice per pose of every sweep.)
  COEF[0] = ao;
  COEF[1] = po;
  COEF[2] = qo;
  COEF[3] = ai;
  COEF[4] = pi;
  COEF[5] = qi;
  // Climb from the un-spun position (s = 0) to the first local optimum of f met on the way up;
  // where f rises both ways (s = 0 sits in a valley) the climb takes the way to the better one.
  const f0 = worseCosine(0);
  // A probe wide enough to see the rise out of a smooth valley (quadratic there), narrow
  // enough not to step over a nearby optimum.
  const h = 1e-4;
  const upPlus = worseCosine(h) > f0;
  const upMinus = worseCosine(-h) > f0;
  // Which candidates are local optima, found once for both directions.
  for (let i = 0; i < n; i++) {
    const c = CANDIDATES[i];
    const fc = worseCosine(c);
    IS_OPTIMUM[i] = fc >= worseCosine(c - 1e-6) - 1e-12 && fc >= worseCosine(c + 1e-6) - 1e-12 ? 1 : 0;
  }
  let spin = 0;
  if (upPlus && upMinus) {
    const p = nearestOptimum(n, 1);
    const m = nearestOptimum(n, -1);
    spin = worseCosine(m) > worseCosine(p) + 1e-15 ? m : p;
  } else if (upPlus) spin = nearestOptimum(n, 1);
  else if (upMinus) spin = nearestOptimum(n, -1);
  // A climb never ends lower than it started (a guard against rounding at flat tops).
  if (worseCosine(spin) < f0) spin = 0;
  spin = Math.atan2(Math.sin(spin), Math.cos(spin));
  return {
    outerRad: Math.acos(clamp(sinusoid(ao, po, qo, spin), -1, 1)),
    innerRad: Math.acos(clamp(sinusoid(ai, pi, qi, spin), -1, 1)),
    spinRad: spin,
  };
}

export const TIE_ROD_SPIN_TREATMENT =
  'tie-rod spin (free about its own axis with a ball joint or rod end at each end): from its un-spun position (the shortest ' +
  'rotation from its design axis) the rod turns to the nearest spin where the larger of its two end articulations is least ' +
  '(continuous minimax: a rod moving continuously, no jump to another optimum between neighbouring poses)';

