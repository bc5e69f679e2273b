/**
 * Shortest distances between the primitive shapes clearance checks use: segment to segment
 * (capsule cores) and segment to circle (the tyre's crown circle, the core of its torus).
 */

import type { Vec3 } from '../mechanism/MechanismGraph';

const clamp01 = (t: number) => (t < 0 ? 0 : t > 1 ? 1 : t);

/**
 * Shortest distance between segments p0-p1 and q0-q1 (C. Ericson, Real-Time Collision
 * Detection, 2005, section 5.1.9: closest points of two segments).
 */
export function segmentSegmentDistance(p0: Vec3, p1: Vec3, q0: Vec3, q1: Vec3): number {
  const d1x = p1[0] - p0[0], d1y = p1[1] - p0[1], d1z = p1[2] - p0[2];
  const d2x = q1[0] - q0[0], d2y = q1[1] - q0[1], d2z = q1[2] - q0[2];
  const rx = p0[0] - q0[0], ry = p0[1] - q0[1], rz = p0[2] - q0[2];
  const a = d1x * d1x + d1y * d1y + d1z * d1z;
  const e = d2x * d2x + d2y * d2y + d2z * d2z;
  const f = d2x * rx + d2y * ry + d2z * rz;
  const EPS = 1e-12;
  let s: number;
  let t: number;
  if (a <= EPS && e <= EPS) {
    s = 0;
    t = 0;
  } else if (a <= EPS) {
    s = 0;
    t = clamp01(f / e);
  } else {
    const c = d1x * rx + d1y * ry + d1z * rz;
    if (e <= EPS) {
      t = 0;
      s = clamp01(-c / a);
    } else {
      const b = d1x * d2x + d1y * d2y + d1z * d2z;
      const denom = a * e - b * b;
      s = denom > EPS * a * e ? clamp01((b * f - c * e) / denom) : 0; // parallel: any s, take 0
      t = (b * s + f) / e;
      if (t < 0) {
        t = 0;
        s = clamp01(-c / a);
      } else if (t > 1) {
        t = 1;
        s = clamp01((b - c) / a);
      }
    }
  }
  const dx = rx + d1x * s - d2x * t;
  const dy = ry + d1y * s - d2y * t;
  const dz = rz + d1z * s - d2z * t;
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/**
 * Shortest distance between segment p0-p1 and a circle (centre c, unit normal n, radius r).
 *
 * Along the segment P(t) = p0 + t d (t in [0, 1]), with h = (P - c).n the height over the
 * circle's plane and q = |P - c|^2 - h^2 the squared distance from its axis (a quadratic in t),
 * the squared distance to the circle is f = (sqrt(q) - r)^2 + h^2. Where sqrt(q) > 0 its
 * stationary points satisfy sqrt(q) (q' + 2 h h') = r q'; squaring gives the quartic
 * q (q' + 2 h h')^2 - r^2 q'^2 = 0, whose real roots in [0, 1] (found exactly, by isolating
 * them between the roots of its derivatives) contain every stationary point. The minimum of f
 * over those roots, the ends, the point nearest the axis and the point in the circle's plane
 * (the answer for a segment along the axis, where sqrt(q) is 0 throughout) is the exact
 * answer: no sampling, so a narrow dip is never missed.
 */
export function segmentCircleDistance(p0: Vec3, p1: Vec3, c: Vec3, n: Vec3, r: number): number {
  const dx = p1[0] - p0[0], dy = p1[1] - p0[1], dz = p1[2] - p0[2];
  const wx = p0[0] - c[0], wy = p0[1] - c[1], wz = p0[2] - c[2];
  const h0 = wx * n[0] + wy * n[1] + wz * n[2];
  const hd = dx * n[0] + dy * n[1] + dz * n[2];
  // q(t) = A t^2 + B t + C0
  const A = dx * dx + dy * dy + dz * dz - hd * hd;
  const B = 2 * (wx * dx + wy * dy + wz * dz - h0 * hd);
  const C0 = wx * wx + wy * wy + wz * wz - h0 * h0;
  let best = Math.min(sqDist(0, A, B, C0, h0, hd, r), sqDist(1, A, B, C0, h0, hd, r));
  if (A > 0) {
    // nearest the axis, where f has a cusp
    const tc = -B / (2 * A);
    if (tc > 0 && tc < 1) best = Math.min(best, sqDist(tc, A, B, C0, h0, hd, r));
  }
  if (hd !== 0) {
    // through the circle's plane: the minimum when the segment runs along the axis (q = 0 throughout)
    const th = -h0 / hd;
    if (th > 0 && th < 1) best = Math.min(best, sqDist(th, A, B, C0, h0, hd, r));
  }
  // Quartic P(t) = q u^2 - r^2 q'^2, with q' = 2A t + B and u = q' + 2 h hd = u1 t + u0.
  const u1 = 2 * A + 2 * hd * hd;
  const u0 = B + 2 * hd * h0;
  const r2 = r * r;
  const P = QUARTIC;
  // q u^2 = (A t^2 + B t + C0)(u1^2 t^2 + 2 u1 u0 t + u0^2)
  const s2 = u1 * u1, s1 = 2 * u1 * u0, s0 = u0 * u0;
  const g1 = 2 * A, g0 = B; // q'
  P[4] = A * s2;
  P[3] = A * s1 + B * s2;
  P[2] = A * s0 + B * s1 + C0 * s2 - r2 * g1 * g1;
  P[1] = B * s0 + C0 * s1 - r2 * 2 * g1 * g0;
  P[0] = C0 * s0 - r2 * g0 * g0;
  const nRoots = rootsInUnit(P, 4, ROOTS, 0);
  for (let i = 0; i < nRoots; i++) best = Math.min(best, sqDist(ROOTS[i], A, B, C0, h0, hd, r));
  return Math.sqrt(best);
}

const QUARTIC = new Float64Array(5);
const ROOTS = new Float64Array(16);
/** Scratch for the derivative chain: one polynomial of each degree below 4 and its roots. */
const DERIV = [new Float64Array(5), new Float64Array(5), new Float64Array(5), new Float64Array(5)];
const DERIV_ROOTS = [new Float64Array(8), new Float64Array(8), new Float64Array(8), new Float64Array(8)];

function evalPoly(p: Float64Array, deg: number, t: number): number {
  let v = p[deg];
  for (let i = deg - 1; i >= 0; i--) v = v * t + p[i];
  return v;
}

/**
 * Real roots of the polynomial p (coefficients p[0..deg], constant first) in (0, 1), written
 * to out; returns how many. Roots are isolated between the roots of the derivative (where p
 * is monotonic; quadratics in closed form) and each is found by the Illinois method to 1e-11.
 */
function rootsInUnit(p: Float64Array, deg: number, out: Float64Array, level: number): number {
  let scale = 0;
  for (let i = 0; i <= deg; i++) scale = Math.max(scale, Math.abs(p[i]));
  if (!(scale > 0)) return 0;
  // Drop negligible leading coefficients.
  while (deg > 0 && Math.abs(p[deg]) <= 1e-14 * scale) deg--;
  if (deg === 0) return 0;
  if (deg === 1) {
    const t = -p[0] / p[1];
    if (t > 0 && t < 1) {
      out[0] = t;
      return 1;
    }
    return 0;
  }
  if (deg === 2) {
    // Closed form, the stable way round (no cancellation between -b and the root).
    const disc = p[1] * p[1] - 4 * p[2] * p[0];
    if (disc < 0) return 0;
    const qq = -0.5 * (p[1] + (p[1] >= 0 ? 1 : -1) * Math.sqrt(disc));
    let t1 = qq / p[2];
    let t2 = qq !== 0 ? p[0] / qq : t1;
    if (t1 > t2) {
      const x = t1;
      t1 = t2;
      t2 = x;
    }
    let count = 0;
    if (t1 > 0 && t1 < 1) out[count++] = t1;
    if (t2 > 0 && t2 < 1 && t2 !== t1) out[count++] = t2;
    return count;
  }
  const dp = DERIV[level];
  for (let i = 1; i <= deg; i++) dp[i - 1] = i * p[i];
  const crit = DERIV_ROOTS[level];
  const nc = rootsInUnit(dp, deg - 1, crit, level + 1);
  let count = 0;
  let a = 0;
  let fa = evalPoly(p, deg, 0);
  for (let k = 0; k <= nc; k++) {
    const b = k < nc ? crit[k] : 1;
    const fb = evalPoly(p, deg, b);
    if (fa === 0 && a > 0) out[count++] = a;
    else if (fa * fb < 0) out[count++] = illinois(p, deg, a, b, fa, fb);
    a = b;
    fa = fb;
  }
  return count;
}

/** Root of p in [a, b], where p(a) and p(b) have opposite signs: regula falsi, Illinois variant, to 1e-11. */
function illinois(p: Float64Array, deg: number, a: number, b: number, fa: number, fb: number): number {
  let side = 0;
  let t = a;
  for (let i = 0; i < 100; i++) {
    t = (a * fb - b * fa) / (fb - fa);
    const ft = evalPoly(p, deg, t);
    if (ft * fb > 0) {
      b = t;
      fb = ft;
      if (side === -1) fa /= 2;
      side = -1;
    } else if (fa * ft > 0) {
      a = t;
      fa = ft;
      if (side === 1) fb /= 2;
      side = 1;
    } else {
      break; // ft is 0
    }
    if (b - a < 1e-11) break;
  }
  return t;
}

function sqDist(t: number, A: number, B: number, C0: number, h0: number, hd: number, r: number): number {
  const rho = Math.sqrt(Math.max(0, A * t * t + B * t + C0));
  const h = h0 + hd * t;
  const e = rho - r;
  return e * e + h * h;
}
