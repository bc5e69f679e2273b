/**
 * Turning circle in the SAE J695 sense (Turning Ability and Off Tracking, Motor Vehicles):
 * the turning diameter is twice the distance from the turn centre to the centre of tyre
 * contact of the wheel describing the largest circle (the outer front wheel), and the
 * wall-to-wall diameter is that of the smallest circle about the same centre enclosing the
 * vehicle's outermost points.
 *
 * The turn centre is where the outer front wheel's axis line meets the rear axle line, so
 * the outer wheel rolls without slip (J695's "correct wheelbase" case). With a leaning rear
 * pair the rear axle line runs through the rear tyres' solved contact centres (their mean x),
 * and those tyres, as solved, enter the wall-to-wall figure. With the steering
 * axis's ground point on the front axle line and zero trail, this gives J695's
 * TD = 2 (WB / sin(outer) + offset at ground).
 *
 * Kerb to kerb adds the outer tyre's tread half-width on the radius (the tread's outer edge).
 * Wall to wall encloses the body outline (plan view, as given in the design's frame; lean is
 * not applied to it) and each tyre's plan-view rectangle (rolling diameter x tread width).
 */

import type { Side, Vec2Mm } from '../design/types';
import type { TurningCircle, XyMm } from './analysisTypes';
import { axisLineMeetsX, innerWheelDeg, STRAIGHT_AHEAD_DEG, straightAheadReason, type PlanWheel } from './ackermann';

export interface PlanTyre extends PlanWheel {
  rollingRadiusMm: number;
  widthMm: number;
}

export interface TurningCircleInputs {
  left: PlanTyre;
  right: PlanTyre;
  /** Rear tyres (unsteered, heading 0). */
  rear: PlanTyre[];
  rearAxleX: number;
  bodyOutline?: Vec2Mm[];
  /** Straight-ahead threshold on the inner road-wheel angle (ackermann.ts), degrees. */
  straightAheadDeg?: number;
}

/** Farthest squared distance from c to a tyre's plan-view rectangle (its four corners). */
function farthestTyreCorner2(t: PlanTyre, c: XyMm): number {
  const ch = Math.cos(t.heading);
  const sh = Math.sin(t.heading);
  const ax = t.rollingRadiusMm * ch, ay = t.rollingRadiusMm * sh; // half length along the heading
  const bx = (-t.widthMm / 2) * sh, by = (t.widthMm / 2) * ch; // half width across it
  const dx = t.x - c.x, dy = t.y - c.y;
  let best = 0;
  for (let i = 0; i < 4; i++) {
    const sa = i & 1 ? 1 : -1;
    const sb = i & 2 ? 1 : -1;
    const x = dx + sa * ax + sb * bx;
    const y = dy + sa * ay + sb * by;
    const d2 = x * x + y * y;
    if (d2 > best) best = d2;
  }
  return best;
}

const NO_OUTLINE: Vec2Mm[] = [];

function none(reason: string): TurningCircle {
  return { outerSide: null, turningDiameterMm: null, kerbToKerbMm: null, wallToWallMm: null, wallToWallFrom: null, centreMm: null, reason };
}

export function turningCircle(p: TurningCircleInputs): TurningCircle {
  const mean = (p.left.heading + p.right.heading) / 2;
  const outerSide: Side = mean >= 0 ? 'right' : 'left';
  const outer = outerSide === 'right' ? p.right : p.left;
  const straightDeg = p.straightAheadDeg ?? STRAIGHT_AHEAD_DEG;
  if (!(innerWheelDeg(p.left, p.right) >= straightDeg)) return none(straightAheadReason(straightDeg));
  if (Math.sign(outer.heading) !== Math.sign(mean)) {
    return none('the outer wheel is not steered into the turn: no turning circle');
  }
  const centre = axisLineMeetsX(outer, p.rearAxleX);
  if (!centre) return none('straight ahead: no turning circle');
  const ox = outer.x - centre.x;
  const oy = outer.y - centre.y;
  const radius = Math.sqrt(ox * ox + oy * oy);
  let far2 = Math.max(farthestTyreCorner2(p.left, centre), farthestTyreCorner2(p.right, centre));
  for (const t of p.rear) far2 = Math.max(far2, farthestTyreCorner2(t, centre));
  const outline = p.bodyOutline ?? NO_OUTLINE;
  for (const q of outline) {
    const x = q.x - centre.x;
    const y = q.y - centre.y;
    far2 = Math.max(far2, x * x + y * y);
  }
  const far = Math.sqrt(far2);
  return {
    outerSide,
    turningDiameterMm: 2 * radius,
    kerbToKerbMm: 2 * radius + outer.widthMm,
    wallToWallMm: 2 * far,
    wallToWallFrom: outline.length > 0 ? 'body outline and wheels' : 'wheels only (the design has no body outline)',
    centreMm: centre,
  };
}

/**
 * The turning circle as shown beside the slip: absent, with the reason, when the front wheels
 * disagree about the turn centre by more than the slip tolerance (each wheel's axis line meets
 * the rear axle at another place; the vehicle scrubs round some circle between them, and the
 * outer wheel's circle alone would be a figure that only looks precise).
 */
export function turningCircleWithinSlip(tc: TurningCircle, worstSlipDeg: number, slipToleranceDeg: number): TurningCircle {
  if (tc.turningDiameterMm === null || !(Math.abs(worstSlipDeg) > slipToleranceDeg)) return tc;
  return none(`the front wheels disagree on the turn centre (slip ${Math.abs(worstSlipDeg).toFixed(1)} deg, over the ${slipToleranceDeg} deg tolerance): no single turning circle`);
}

/**
 * With a leaning rear pair, the same rule over all four wheels: absent, with the reason, when
 * the four wheels' slip to their least-squares turn centre (rearPair.ts) exceeds the slip
 * tolerance.
 */
export function turningCircleWithinFourWheelSlip(tc: TurningCircle, worstSlipDeg: number | null, slipToleranceDeg: number): TurningCircle {
  if (tc.turningDiameterMm === null || worstSlipDeg === null || !(Math.abs(worstSlipDeg) > slipToleranceDeg)) return tc;
  return none(`the four wheels disagree on the turn centre (slip ${Math.abs(worstSlipDeg).toFixed(1)} deg, over the ${slipToleranceDeg} deg tolerance): no single turning circle`);
}
