/**
 * Ackermann geometry of a posed front axle, in the ground plane.
 *
 * For slip-free low-speed turning every wheel's axis line passes through one turn centre,
 * which (rear wheel unsteered) lies on the rear axle line x = rearAxleX. The ideal outer
 * angle for a given inner angle is the one whose axis line, drawn through the outer wheel's
 * contact centre, meets the inner wheel's axis line on the rear axle line. With both contact
 * centres on x = 0, a track t apart, and the rear axle a wheelbase L behind, this is
 * Gillespie's cot(outer) - cot(inner) = t / L (Fundamentals of Vehicle Dynamics, 1992); the
 * actual contact centres are used here, so lean, steer and scrub radius are accounted for.
 *
 * Ackermann percentage, adopted definition: 100 (inner - outer) / (inner - ideal outer) at
 * the same inner angle (100 % ideal, 0 % parallel steer). Shown beside it, the cotangent
 * (effective-wheelbase) form 100 (cot outer - cot inner) / (cot ideal outer - cot inner),
 * which with Gillespie's geometry is 100 L (cot outer - cot inner) / t.
 */

import type { Side } from '../design/types';
import type { AckermannMeasures, XyMm } from './analysisTypes';
import { DEG, RAD } from './vec3';

/** Below this inner angle the turn is called straight ahead: no turn centre to speak of. */
/**
 * Below this inner road-wheel angle (in the direction of the turn) the vehicle is called
 * straight ahead: no Ackermann figures, turn centre or turning circle. A choice: 1 degree, or
 * twice the larger static toe when that is more, so that static toe alone (the wheels
 * pointing in or out with the handlebar centred) never reads as a turn.
 */
export const STRAIGHT_AHEAD_DEG = 1;

export function straightAheadDeg(staticToeDeg: { left: number; right: number }): number {
  return Math.max(STRAIGHT_AHEAD_DEG, 2 * Math.max(Math.abs(staticToeDeg.left), Math.abs(staticToeDeg.right)));
}

/** The inner road-wheel angle in the direction of the turn the mean angle makes, degrees. */
export function innerWheelDeg(left: PlanWheel, right: PlanWheel): number {
  const mean = (left.heading + right.heading) / 2;
  return mean >= 0 ? left.heading * RAD : -right.heading * RAD;
}

export interface PlanWheel {
  /** Contact centre in the ground plane, mm. */
  x: number;
  y: number;
  /** Heading (road-wheel angle), radians, positive left. */
  heading: number;
}

/**
 * Where the axis line of a wheel (through its contact centre, perpendicular to its
 * heading) meets the line x = lineX; null when the wheel points straight ahead.
 */
export function axisLineMeetsX(w: PlanWheel, lineX: number): XyMm | null {
  const s = Math.sin(w.heading);
  if (Math.abs(s) < 1e-12) return null;
  // axis direction n = (-sin h, cos h): x + t (-sin h) = lineX
  const t = (w.x - lineX) / s;
  return { x: lineX, y: w.y + t * Math.cos(w.heading) };
}

/**
 * Heading (radians, positive left) a wheel at (x, y) needs for its axis line to pass
 * through the point c: perpendicular to c - wheel, pointing forward.
 */
export function headingThrough(x: number, y: number, c: XyMm): number {
  const vx = c.x - x;
  const vy = c.y - y;
  // (-sin h, cos h) parallel to (vx, vy): h = atan(-vx / vy), in (-90, 90) degrees
  return Math.atan2(-vx * Math.sign(vy || 1), Math.abs(vy));
}

function none(reason: string): AckermannMeasures {
  return {
    turn: 'straight',
    innerSide: null,
    innerDeg: null,
    outerDeg: null,
    idealOuterDeg: null,
    errorDeg: null,
    percent: null,
    percentCot: null,
    referenceCentreMm: null,
    reason,
  };
}

export const straightAheadReason = (straightDeg: number) => `straight ahead (inner road wheel under ${straightDeg} deg)`;

const cot = (d: number): number => 1 / Math.tan(d * DEG);

export function ackermann(left: PlanWheel, right: PlanWheel, rearAxleX: number, straightDeg = STRAIGHT_AHEAD_DEG): AckermannMeasures {
  const mean = (left.heading + right.heading) / 2;
  const turn: 'left' | 'right' = mean >= 0 ? 'left' : 'right';
  const dir = turn === 'left' ? 1 : -1;
  const innerSide: Side = turn;
  const inner = turn === 'left' ? left : right;
  const outer = turn === 'left' ? right : left;
  const innerDeg = dir * inner.heading * RAD;
  const outerDeg = dir * outer.heading * RAD;
  if (!(innerDeg >= straightDeg)) return none(straightAheadReason(straightDeg));
  const centre = axisLineMeetsX(inner, rearAxleX);
  if (!centre) return none('straight ahead: no turn centre');
  const ideal = dir * headingThrough(outer.x, outer.y, centre) * RAD;
  const errorDeg = outerDeg - ideal;
  const idealDiff = innerDeg - ideal;
  const percent = Math.abs(idealDiff) > 1e-9 ? (100 * (innerDeg - outerDeg)) / idealDiff : null;
  let percentCot: number | null = null;
  let reason: string | undefined;
  if (outerDeg > 1e-9 && ideal > 1e-9) {
    const idealCot = cot(ideal) - cot(innerDeg);
    percentCot = Math.abs(idealCot) > 1e-12 ? (100 * (cot(outerDeg) - cot(innerDeg))) / idealCot : null;
  } else {
    reason = 'the outer wheel does not steer into the turn: the cotangent form is undefined';
  }
  if (percent === null) reason = 'ideal and inner angles coincide: percentage undefined';
  const out: AckermannMeasures = {
    turn,
    innerSide,
    innerDeg,
    outerDeg,
    idealOuterDeg: ideal,
    errorDeg,
    percent,
    percentCot,
    referenceCentreMm: centre,
  };
  if (reason) out.reason = reason;
  return out;
}
