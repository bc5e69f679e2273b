/**
 * The one judge: every verdict anywhere (pose readouts, part colours, sweeps, the envelope
 * map, `tiltbench check`) is made here, against the design's tolerances, in one vocabulary.
 *
 *   within  inside the tolerance, with room to spare
 *   close   inside, but the measure has used WARNING_FRACTION (80 %) or more of what it allows
 *   over    outside the tolerance
 *   broken  the linkage cannot be assembled in the pose (no measures at all)
 *
 * What each check compares (docs/conventions.md says the same at length):
 *   slip         |front slip angle| <= tolerances.slipDeg (toe mismatch: the wheels disagree on a turn centre)
 *   self-steer   |road-wheel angle change at zero handlebar from upright| <= tolerances.selfSteerDeg
 *   ratio change |steering-ratio change with lean and travel| <= tolerances.ratioChangePct
 *   joint        articulation <= rated - tolerances.jointMarginDeg
 *   clearance    distance >= tolerances.clearanceMm (close: below required / 0.8)
 *   dead centre  transmission angle > 0 (no warning band: it is a yes-or-no fact)
 */

import type { Tolerances } from '../design/types';

export const WARNING_FRACTION = 0.8;

/** One word for how a measure, a pose or a part stands; ordered from best to worst. */
export type Verdict = 'within' | 'close' | 'over' | 'broken';

export const VERDICT_ORDER: readonly Verdict[] = ['within', 'close', 'over', 'broken'];

/** The checks a pose is judged by. */
export type CheckKind = 'slip' | 'selfSteer' | 'ratioChange' | 'joint' | 'clearance' | 'deadCentre';

export const CHECK_KINDS: readonly CheckKind[] = ['slip', 'selfSteer', 'ratioChange', 'joint', 'clearance', 'deadCentre'];

export function worse(a: Verdict, b: Verdict): Verdict {
  return VERDICT_ORDER.indexOf(a) >= VERDICT_ORDER.indexOf(b) ? a : b;
}

/** The worse of two verdicts where either may be absent (not measured). */
export function worseOf(a: Verdict | null, b: Verdict | null): Verdict | null {
  if (a === null) return b;
  if (b === null) return a;
  return worse(a, b);
}

/** |value| against a symmetric limit. */
export function judgeAbs(value: number, limit: number): Verdict {
  const a = Math.abs(value);
  if (a > limit) return 'over';
  return a >= WARNING_FRACTION * limit ? 'close' : 'within';
}

export const judgeSlip = (slipDeg: number, tol: Tolerances): Verdict => judgeAbs(slipDeg, tol.slipDeg);
export const judgeSelfSteer = (deg: number, tol: Tolerances): Verdict => judgeAbs(deg, tol.selfSteerDeg);
export const judgeRatioChange = (pct: number, tol: Tolerances): Verdict => judgeAbs(pct, tol.ratioChangePct);

/** A joint: over below the required margin, close once 80 % of the allowed articulation is used. */
export function judgeJoint(articulationDeg: number, ratedDeg: number, tol: Tolerances): Verdict {
  const allowed = ratedDeg - tol.jointMarginDeg;
  if (articulationDeg > allowed) return 'over';
  return articulationDeg >= WARNING_FRACTION * allowed ? 'close' : 'within';
}

export function judgeClearance(distanceMm: number, tol: Tolerances): Verdict {
  if (distanceMm < tol.clearanceMm) return 'over';
  return distanceMm < tol.clearanceMm / WARNING_FRACTION ? 'close' : 'within';
}

export function judgeTransmission(deg: number): Verdict {
  return deg > 0 ? 'within' : 'over';
}

/**
 * A lean linkage's rocker angle (magnitude) against its stop: over past it, close from
 * WARNING_FRACTION of it (as every measure; no margin is asked of a stop).
 */
export function judgeLeanStop(rockerDeg: number, stopDeg: number): Verdict {
  return rockerDeg > stopDeg ? 'over' : rockerDeg >= WARNING_FRACTION * stopDeg ? 'close' : 'within';
}
