/**
 * The measures of a pose that need other poses, filled in one way for every caller (the pose
 * engine's extra solves, a sweep's neighbouring cells):
 *
 *   local steering ratio   the handlebar a little either side, same lean and travel
 *   self-steer             road-wheel angles at zero handlebar, same lean and travel, minus
 *                          those at zero handlebar, lean and travel (the base pose)
 *   steering-ratio change  local ratio upright (zero lean and travel, same handlebar) against
 *                          the local ratio here
 *   front lift             against straight ahead at the same lean and travel
 *
 * Each is null with its reason when a pose it needs is missing. The pose is judged again
 * afterwards (poseVerdict.ts) so its verdict covers the new numbers.
 */

import type { Tolerances } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { frontLift } from './PoseAnalyser';
import { applyJudgement } from './poseVerdict';
import { localSteeringRatio } from './steeringLinkage';

/** Road-wheel angles of the base pose (zero lean, travel and handlebar), degrees, positive left. */
export interface BaseSteer {
  leftDeg: number;
  rightDeg: number;
}

/** A pose a measure needs, or why it is missing. */
export type Relative<T> = { value: T } | { reason: string };

export interface PoseRelatives {
  /** Poses a little below and above in handlebar, same lean and travel. */
  neighbours: Relative<{ lower: PoseAnalysis; upper: PoseAnalysis }>;
  /** Handlebar 0, same lean and travel. */
  straight: Relative<PoseAnalysis>;
  base: Relative<BaseSteer>;
  /** Local steering ratio at zero lean and travel, same handlebar. */
  uprightLocalRatio: Relative<number>;
}

const NOT_TURNING = 'the road wheels did not turn between the neighbouring poses';

/** The local ratio from two poses either side, or why there is none. */
export function ratioBetween(lower: PoseAnalysis, upper: PoseAnalysis): Relative<number> {
  const r = localSteeringRatio(lower.steering.handlebarDeg, lower.steering.meanWheelDeg, upper.steering.handlebarDeg, upper.steering.meanWheelDeg);
  return r === null ? { reason: NOT_TURNING } : { value: r };
}

/** Whether the pose has zero lean and travel: it is then its own upright reference. */
function isUpright(a: PoseAnalysis): boolean {
  const i = a.inputs;
  return i.leanDeg === 0 && i.heaveMm === 0 && i.travelLeftMm === 0 && i.travelRightMm === 0;
}

/** Fill the relative measures of `a` in place, judge it again, and return it. */
export function completeMeasures(a: PoseAnalysis, rel: PoseRelatives, tol: Tolerances, words: boolean): PoseAnalysis {
  const st = a.steering;
  if ('value' in rel.neighbours) {
    const r = ratioBetween(rel.neighbours.value.lower, rel.neighbours.value.upper);
    st.localRatio = 'value' in r ? r.value : null;
    st.localRatioReason = 'reason' in r ? r.reason : undefined;
  } else {
    st.localRatio = null;
    st.localRatioReason = rel.neighbours.reason;
  }

  const upright = isUpright(a);
  if (upright && st.localRatio !== null) {
    st.ratioChangePct = 0;
    st.ratioChangeReason = undefined;
  } else if (st.localRatio === null) {
    st.ratioChangePct = null;
    st.ratioChangeReason = `no local ratio here (${st.localRatioReason})`;
  } else if ('reason' in rel.uprightLocalRatio) {
    st.ratioChangePct = null;
    st.ratioChangeReason = `no upright local ratio (${rel.uprightLocalRatio.reason})`;
  } else {
    st.ratioChangePct = 100 * (rel.uprightLocalRatio.value / st.localRatio - 1);
    st.ratioChangeReason = undefined;
  }
  a.worst.ratioChangePct = st.ratioChangePct;

  const su = a.suspension;
  if ('value' in rel.straight) {
    su.frontLiftMm = frontLift(a, rel.straight.value);
    su.frontLiftReason = undefined;
  } else {
    su.frontLiftMm = null;
    su.frontLiftReason = rel.straight.reason;
  }

  if ('reason' in rel.straight) {
    a.selfSteer = { leftDeg: null, rightDeg: null, reason: rel.straight.reason };
  } else if ('reason' in rel.base) {
    a.selfSteer = { leftDeg: null, rightDeg: null, reason: rel.base.reason };
  } else {
    const w = rel.straight.value.wheels;
    a.selfSteer = upright ? { leftDeg: 0, rightDeg: 0 } : { leftDeg: w.left.steerDeg - rel.base.value.leftDeg, rightDeg: w.right.steerDeg - rel.base.value.rightDeg };
  }
  const ss = a.selfSteer;
  a.worst.selfSteerDeg = ss.leftDeg === null || ss.rightDeg === null ? null : Math.max(Math.abs(ss.leftDeg), Math.abs(ss.rightDeg));
  return applyJudgement(a, tol, words);
}
