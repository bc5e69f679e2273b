/**
 * Judging measures against the design's tolerances. Every warning anywhere goes through
 * here, so the pose report, the sweep, the envelope map and `tiltbench check` agree.
 *
 *   slip            |slip angle| <= tolerances.slipDeg
 *   toe error       |lean steer + bump steer| <= tolerances.toeErrorDeg
 *   joint           articulation <= rated - tolerances.jointMarginDeg (over rating: > rated)
 *   clearance       distance >= tolerances.clearanceMm
 *   dead centre     transmission angle > 0
 *
 * Warning band (a choice, documented in docs/conventions.md): a measure that has used
 * WARNING_FRACTION (80 %) or more of what its tolerance allows. For slip and toe error that
 * is |value| >= 0.8 tolerance; for a joint, articulation >= 0.8 (rated - required margin);
 * for a clearance, distance < required / 0.8.
 */

import type { Tolerances } from '../design/types';
import { POSE_STATUS_ORDER, type PoseStatus } from './analysisTypes';

export const WARNING_FRACTION = 0.8;

export type Verdict = 'pass' | 'warning' | 'fail';

export function worse(a: PoseStatus, b: PoseStatus): PoseStatus {
  return POSE_STATUS_ORDER.indexOf(a) >= POSE_STATUS_ORDER.indexOf(b) ? a : b;
}

export function judgeAbs(value: number, limit: number): Verdict {
  const a = Math.abs(value);
  if (a > limit) return 'fail';
  return a >= WARNING_FRACTION * limit ? 'warning' : 'pass';
}

/** A joint: fail below the required margin, warning once 80 % of the allowed articulation is used. */
export function judgeJoint(articulationDeg: number, ratedDeg: number, tol: Tolerances): Verdict {
  const allowed = ratedDeg - tol.jointMarginDeg;
  if (articulationDeg > allowed) return 'fail';
  return articulationDeg >= WARNING_FRACTION * allowed ? 'warning' : 'pass';
}

export function judgeClearance(distanceMm: number, tol: Tolerances): Verdict {
  if (distanceMm < tol.clearanceMm) return 'fail';
  return distanceMm < tol.clearanceMm / WARNING_FRACTION ? 'warning' : 'pass';
}

export function judgeTransmission(deg: number): Verdict {
  return deg > 0 ? 'pass' : 'fail';
}

/** Status a single verdict gives, by the kind of measure. */
export function statusOf(kind: 'slip' | 'toe' | 'joint' | 'clearance' | 'deadCentre', verdict: Verdict, overRating = false): PoseStatus {
  if (verdict === 'pass') return 'within';
  if (verdict === 'warning') return 'warning';
  if (kind === 'joint') return overRating ? 'joint-over-rating' : 'over';
  if (kind === 'clearance') return 'clearance-violated';
  return 'over';
}
