/**
 * Suspension geometry of a posed front end: front-view instant centres, roll centre,
 * swing-arm lengths and the spring's motion ratio.
 *
 * Front view (the classic construction): in the transverse plane through each wheel's
 * contact patch, each wishbone (or member) is the line from where its pivot axis pierces
 * that plane to its outer joint; the two lines meet at the instant centre. The roll centre is
 * where the lines from each contact patch through its instant centre meet. Homogeneous
 * coordinates carry parallel lines (an instant centre at infinity) through to the roll
 * centre, which is then still found when the other side's line is not parallel too.
 *
 * Motion ratio: velocity analysis of the linkage relative to the frame with the steering
 * held (the tie rods' inner joints fixed): the lower wishbone turns at unit rate, and the
 * upper wishbone's rate and the upright's angular velocity follow from the upper joint and
 * the tie rod (4 equations, 4 unknowns per side; a centre-pivot pair couples both sides and
 * is solved by least squares, its parallelogram constraint being redundant). Reported as
 * -(spring length rate) / (wheel-centre rate along the frame's z): positive when the spring
 * shortens as the wheel rises.
 */

import type { Vec3 } from '../mechanism/MechanismGraph';
import type { SideSuspension, SuspensionGeometry, YzMm } from './analysisTypes';
import type { PoseGeometry, SideGeometry } from './poseGeometry';
import { add, cross, dot, normalize, scale, sub } from './vec3';

type H2 = [number, number, number];

/**
 * Two construction lines closer than this to parallel are called parallel: their meeting point
 * is not given (an instant centre or roll centre that far away moves by metres for a tenth of
 * a millimetre of input, so no figure would be trustworthy). A choice: 1 degree.
 */
export const NEAR_PARALLEL_DEG = 1;
const SIN_NEAR_PARALLEL = Math.sin((NEAR_PARALLEL_DEG * Math.PI) / 180);

const hcross = (a: H2, b: H2): H2 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];

/** Whether two homogeneous front-view lines cross at more than NEAR_PARALLEL_DEG. */
function crossClearly(l1: H2, l2: H2): boolean {
  const n1 = Math.hypot(l1[0], l1[1]);
  const n2 = Math.hypot(l2[0], l2[1]);
  if (!(n1 > 0 && n2 > 0)) return false;
  return Math.abs(l1[0] * l2[1] - l1[1] * l2[0]) / (n1 * n2) > SIN_NEAR_PARALLEL;
}

/** Front-view (y, z) point where the line through p along unit u pierces the plane x = x0; null if parallel to it. */
function pierce(p: Vec3, u: Vec3, x0: number): H2 | null {
  if (Math.abs(u[0]) < 1e-9) return null;
  const t = (x0 - p[0]) / u[0];
  return [p[1] + u[1] * t, p[2] + u[2] * t, 1];
}

interface FrontView {
  /** The two wishbone lines' meeting point, homogeneous (at infinity when they are parallel). */
  ic: H2 | null;
  /** Whether the wishbone lines cross clearly (the instant centre is given as a point). */
  clear: boolean;
  contact: H2;
  reason?: string;
}

function frontView(g: SideGeometry, contact: Vec3): FrontView {
  const x0 = contact[0];
  const c: H2 = [contact[1], contact[2], 1];
  const pu = pierce(g.upperPivot, g.upperPivotAxis, x0);
  const pl = pierce(g.lowerPivot, g.lowerPivotAxis, x0);
  if (!pu || !pl) return { ic: null, clear: false, contact: c, reason: 'a pivot axis lies across the vehicle: no front-view instant centre' };
  const lu = hcross(pu, [g.upperJoint[1], g.upperJoint[2], 1]);
  const ll = hcross(pl, [g.lowerJoint[1], g.lowerJoint[2], 1]);
  return { ic: hcross(lu, ll), clear: crossClearly(lu, ll), contact: c };
}

const toYz = (p: H2): YzMm => ({ y: p[0] / p[2], z: p[1] / p[2] });

// ---------------------------------------------------------------------------------------------
// Velocity analysis (motion ratio)
// ---------------------------------------------------------------------------------------------

/**
 * Least squares for an augmented system [M | b] of m rows and n unknowns (m >= n, stored
 * row-major with n + 1 columns) through the normal equations and Gaussian elimination with
 * partial pivoting. Writes x; false when (nearly) singular. Sizes here are at most 8 x 7.
 */
export function solveLeastSquares(rows: Float64Array, m: number, n: number, x: Float64Array): boolean {
  const w = n + 1;
  const A = NORMAL;
  A.fill(0, 0, n * w);
  for (let r = 0; r < m; r++) {
    const o = r * w;
    for (let i = 0; i < n; i++) {
      const ri = rows[o + i];
      if (ri === 0) continue;
      for (let j = 0; j <= n; j++) A[i * w + j] += ri * rows[o + j];
    }
  }
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(A[i * w + i]));
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(A[r * w + col]) > Math.abs(A[piv * w + col])) piv = r;
    if (!(Math.abs(A[piv * w + col]) > 1e-12 * scale)) return false;
    if (piv !== col) {
      for (let k = 0; k <= n; k++) {
        const t = A[col * w + k];
        A[col * w + k] = A[piv * w + k];
        A[piv * w + k] = t;
      }
    }
    for (let r = col + 1; r < n; r++) {
      const f = A[r * w + col] / A[col * w + col];
      if (f === 0) continue;
      for (let k = col; k <= n; k++) A[r * w + k] -= f * A[col * w + k];
    }
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = A[i * w + n];
    for (let k = i + 1; k < n; k++) s -= A[i * w + k] * x[k];
    x[i] = s / A[i * w + i];
  }
  return true;
}

const MAX_ROWS = 8;
const MAX_COLS = 7;
const ROWS = new Float64Array(MAX_ROWS * (MAX_COLS + 1));
const NORMAL = new Float64Array(MAX_COLS * (MAX_COLS + 1));
const X = new Float64Array(MAX_COLS);

/**
 * Rows for one side, written at row `row0` of ROWS (n unknowns, n + 1 columns): the upper
 * joint's closure (3 rows) and the tie rod (1 row). Unknowns: [wu, Omega of each side...],
 * this side's Omega starting at column `omegaCol`.
 */
function sideRows(g: SideGeometry, row0: number, omegaCol: number, n: number): void {
  const w = n + 1;
  ROWS.fill(0, row0 * w, (row0 + 4) * w);
  const vL = cross(g.lowerPivotAxis, sub(g.lowerJoint, g.lowerPivot));
  const r = sub(g.upperJoint, g.lowerJoint);
  const wuU = cross(g.upperPivotAxis, sub(g.upperJoint, g.upperPivot));
  // v_L + Omega x r - wu (au x (U - Pu)) = 0, with Omega x r = -[r]x Omega
  const o0 = row0 * w;
  const o1 = o0 + w;
  const o2 = o1 + w;
  const c = omegaCol;
  ROWS[o0] = -wuU[0];
  ROWS[o0 + c + 1] = r[2];
  ROWS[o0 + c + 2] = -r[1];
  ROWS[o0 + n] = -vL[0];
  ROWS[o1] = -wuU[1];
  ROWS[o1 + c] = -r[2];
  ROWS[o1 + c + 2] = r[0];
  ROWS[o1 + n] = -vL[1];
  ROWS[o2] = -wuU[2];
  ROWS[o2 + c] = r[1];
  ROWS[o2 + c + 1] = -r[0];
  ROWS[o2 + n] = -vL[2];
  // (A - I) . (v_L + Omega x rA) = 0 -> Omega . (rA x (A - I)) = -(A - I) . v_L
  const d = sub(g.armJoint, g.innerJoint);
  const t = cross(sub(g.armJoint, g.lowerJoint), d);
  const o3 = o2 + w;
  ROWS[o3 + c] = t[0];
  ROWS[o3 + c + 1] = t[1];
  ROWS[o3 + c + 2] = t[2];
  ROWS[o3 + n] = -dot(d, vL);
}

interface SideRates {
  wu: number;
  omega: Vec3;
}

function splitSide(g: SideGeometry): SideRates | null {
  sideRows(g, 0, 1, 4);
  if (!solveLeastSquares(ROWS, 4, 4, X)) return null;
  return { wu: X[0], omega: [X[1], X[2], X[3]] };
}

function sideMotion(pose: PoseGeometry, split: boolean): { left: SideRates | null; right: SideRates | null } {
  if (split) return { left: splitSide(pose.left), right: splitSide(pose.right) };
  sideRows(pose.right, 0, 1, 7);
  sideRows(pose.left, 4, 4, 7);
  if (!solveLeastSquares(ROWS, 8, 7, X)) return { left: null, right: null };
  return { right: { wu: X[0], omega: [X[1], X[2], X[3]] }, left: { wu: X[0], omega: [X[4], X[5], X[6]] } };
}

function motionRatio(g: SideGeometry, rates: SideRates, springOn: 'upper' | 'lower', frameUp: Vec3): number | null {
  if (!g.springFrame || !g.springArm) return null;
  const vL = cross(g.lowerPivotAxis, sub(g.lowerJoint, g.lowerPivot));
  const vC = add(vL, cross(rates.omega, sub(g.wheelCentre, g.lowerJoint)));
  const zRate = dot(vC, frameUp);
  const vA =
    springOn === 'lower'
      ? cross(g.lowerPivotAxis, sub(g.springArm, g.lowerPivot))
      : scale(cross(g.upperPivotAxis, sub(g.springArm, g.upperPivot)), rates.wu);
  const e = normalize(sub(g.springArm, g.springFrame));
  const lRate = dot(e, vA);
  if (!(Math.abs(zRate) > 1e-9)) return null;
  return -lRate / zRate;
}

export interface SuspensionOptions {
  split: boolean;
  springOn: 'upper' | 'lower' | null;
  /** Design height (frame z) of each lower outer joint. */
  lowerJointZ: { left: number; right: number };
}

/** Wheel-centre rate over lower-joint rate along the frame's z, steering held; null when the joint does not rise. */
function wheelPerJoint(g: SideGeometry, rates: SideRates, frameUp: Vec3): number | null {
  const vL = cross(g.lowerPivotAxis, sub(g.lowerJoint, g.lowerPivot));
  const jz = dot(vL, frameUp);
  if (!(Math.abs(jz) > 1e-9)) return null;
  const vC = add(vL, cross(rates.omega, sub(g.wheelCentre, g.lowerJoint)));
  return dot(vC, frameUp) / jz;
}

function sideSuspension(fv: FrontView, g: SideGeometry, r: SideRates | null, opts: SuspensionOptions, pose: PoseGeometry): SideSuspension {
  const frameUp = pose.frameUp;
  const reasons: string[] = [];
  let ic: YzMm | null = null;
  let swing: number | null = null;
  if (!fv.ic) reasons.push(fv.reason ?? 'no instant centre');
  else if (!fv.clear) reasons.push(`wishbone lines near parallel in front view (within ${NEAR_PARALLEL_DEG} deg): instant centre too far to give`);
  else {
    ic = toYz(fv.ic);
    const sy = ic.y - fv.contact[0];
    const sz = ic.z - fv.contact[1];
    swing = Math.sqrt(sy * sy + sz * sz);
  }
  let mr: number | null = null;
  if (!opts.springOn) reasons.push('no spring in the design: no motion ratio');
  else if (!r) reasons.push('the linkage is at a dead centre here: no motion ratio');
  else {
    mr = motionRatio(g, r, opts.springOn, frameUp);
    if (mr === null) reasons.push('the wheel does not move vertically with the suspension here: no motion ratio');
  }
  const jointTravel = dot(sub(g.lowerJoint, pose.frameOrigin), frameUp) - opts.lowerJointZ[g.side];
  const ratio = r ? wheelPerJoint(g, r, frameUp) : null;
  const out: SideSuspension = { instantCentreMm: ic, swingArmMm: swing, motionRatio: mr, jointTravelMm: jointTravel, wheelPerJointTravel: ratio };
  if (reasons.length) out.reason = reasons.join('; ');
  return out;
}

export function suspensionGeometry(pose: PoseGeometry, contacts: { left: Vec3; right: Vec3 }, opts: SuspensionOptions): Omit<SuspensionGeometry, 'frontLiftMm' | 'frontLiftReason'> {
  const fvL = frontView(pose.left, contacts.left);
  const fvR = frontView(pose.right, contacts.right);
  const rates = sideMotion(pose, opts.split);
  const left = sideSuspension(fvL, pose.left, rates.left, opts, pose);
  const right = sideSuspension(fvR, pose.right, rates.right, opts, pose);
  let rollCentreMm: YzMm | null = null;
  let reason: string | undefined;
  if (fvL.ic && fvR.ic) {
    // An instant centre at (or near) infinity still gives its contact-patch line a direction.
    const lineL = hcross(fvL.contact, fvL.ic);
    const lineR = hcross(fvR.contact, fvR.ic);
    if (crossClearly(lineL, lineR)) rollCentreMm = toYz(hcross(lineL, lineR));
    else reason = `the two contact-patch lines are near parallel (within ${NEAR_PARALLEL_DEG} deg): roll centre too far to give`;
  } else {
    reason = 'no front-view instant centre: no roll centre';
  }
  return { left, right, rollCentreMm, reason };
}
