/**
 * Measures of a leaning rear pair (`vehicle.rear.kind: "leaningPair"`): each rear wheel's
 * alignment in the solved pose (road-wheel angle, toe, camber to the ground and to the frame,
 * centre and contact point), and the turn centre all four wheels give.
 *
 * The four-wheel turn centre: each wheel's axis line in the ground plane (through its contact
 * centre, perpendicular to its heading); the point with the least sum of squared distances to
 * the four lines (the normal equations of that least-squares problem, a 2 x 2 solve); and each
 * wheel's slip angle to it (ISO 8855: from the wheel's heading to the velocity of its contact
 * centre in a rigid turn about that point, anticlockwise seen from above positive, as scrub.ts).
 * When the four lines meet in one point (Ackermann geometry) it is that point and every slip is
 * 0. Straight ahead (the inner front road wheel under the straight-ahead threshold) there is no
 * centre, as for the front-only measures.
 */

import type { Side } from '../design/types';
import type { Vec3, WheelRef } from '../mechanism/MechanismGraph';
import { camberFromAxis, toeFromHeading, wheelHeading } from '../mechanism/wheelAxis';
import type { CompiledMechanism } from '../solver/CompiledMechanism';
import type { XyMm } from './analysisTypes';
import { innerWheelDeg, straightAheadReason, type PlanWheel } from './ackermann';
import { tyreLowestPoint } from './poseSnapshot';
import { RAD, xyz, type XyzMm } from './vec3';

/** One rear wheel of a leaning pair in a solved pose. */
export interface RearWheelAlignment {
  side: Side;
  /** Road-wheel angle: ISO 8855 heading about the ground normal, positive left (0 for an unsteered wheel that stays straight). */
  steerDeg: number;
  /** Toe to the vehicle's x axis, toe-in positive. */
  toeDeg: number;
  /** Camber to the ground normal, top outward positive. */
  camberDeg: number;
  /** Camber to the frame's z axis, top outward positive. */
  camberToFrameDeg: number;
  centreMm: XyzMm;
  /** Lowest tyre point (on the ground: the rear tyre is held there in every pose mode). */
  contactPatchMm: XyzMm;
}

/** Each wheel's slip angle to the four-wheel turn centre, degrees (ISO 8855). */
export interface FourWheelSlip {
  frontLeftDeg: number;
  frontRightDeg: number;
  rearLeftDeg: number;
  rearRightDeg: number;
}

export interface FourWheelTurnCentre {
  /** Least-squares point of the four wheels' axis lines in the ground plane; null straight ahead. */
  centreMm: XyMm | null;
  /** Root mean square distance of the four axis lines from that point, mm (0 when they meet in one point). */
  lineSpreadMm: number | null;
  slipDeg: FourWheelSlip | null;
  /** Largest slip magnitude of the four, degrees. */
  worstSlipDeg: number | null;
  reason?: string;
}

export interface RearPairMeasures {
  left: RearWheelAlignment;
  right: RearWheelAlignment;
  turnCentre: FourWheelTurnCentre;
}

const c3: Vec3 = [0, 0, 0];
const a3: Vec3 = [0, 0, 0];

/** A rear wheel's alignment from the mechanism's current (forwarded) state. */
export function rearWheelAlignment(m: CompiledMechanism, w: WheelRef, frameUp: Vec3): RearWheelAlignment {
  m.worldPoint(w.body, w.centre, c3);
  m.worldDirection(w.body, w.spinAxis, a3);
  const heading = wheelHeading(a3[0], a3[1]);
  const contact = tyreLowestPoint(c3, a3, w.rollingRadius, w.crownRadius);
  return {
    side: w.side,
    steerDeg: heading * RAD,
    toeDeg: toeFromHeading(w.side, heading) * RAD,
    camberDeg: camberFromAxis(w.side, a3[0], a3[1], a3[2]) * RAD,
    camberToFrameDeg: camberFromAxis(w.side, a3[0], a3[1], a3[2], frameUp) * RAD,
    centreMm: xyz(c3),
    contactPatchMm: xyz(contact),
  };
}

/** Slip angle (radians, ISO 8855) of a wheel in a rigid turn about c, turning left when `left`. */
export function slipToCentre(w: PlanWheel, c: XyMm, left: boolean): number {
  const s = left ? 1 : -1;
  // velocity of the contact centre: omega z x (p - c), omega's sign that of the turn
  const beta = Math.atan2(s * (w.x - c.x), s * (c.y - w.y));
  let d = beta - w.heading;
  while (d > Math.PI) d -= 2 * Math.PI;
  while (d < -Math.PI) d += 2 * Math.PI;
  return d;
}

/**
 * The least-squares turn centre of four wheels (front left, front right, rear left, rear right)
 * and each one's slip to it. `straightDeg`: the straight-ahead threshold on the inner front road
 * wheel (ackermann.ts).
 */
export function fourWheelTurnCentre(fl: PlanWheel, fr: PlanWheel, rl: PlanWheel, rr: PlanWheel, straightDeg: number): FourWheelTurnCentre {
  const none = (reason: string): FourWheelTurnCentre => ({ centreMm: null, lineSpreadMm: null, slipDeg: null, worstSlipDeg: null, reason });
  if (!(innerWheelDeg(fl, fr) >= straightDeg)) return none(straightAheadReason(straightDeg));
  const wheels = [fl, fr, rl, rr];
  // minimise sum (n_i . (c - p_i))^2, n_i = (cos h, sin h) the line's normal (the heading)
  let a11 = 0, a12 = 0, a22 = 0, b1 = 0, b2 = 0;
  for (const w of wheels) {
    const nx = Math.cos(w.heading);
    const ny = Math.sin(w.heading);
    const np = nx * w.x + ny * w.y;
    a11 += nx * nx;
    a12 += nx * ny;
    a22 += ny * ny;
    b1 += nx * np;
    b2 += ny * np;
  }
  const det = a11 * a22 - a12 * a12;
  // Near-parallel lines: the centre is kilometres away and ill-defined.
  if (!(det > 1e-12 * (a11 + a22) ** 2)) return none('the four wheels\u2019 axis lines are near parallel: no turn centre');
  const c: XyMm = { x: (a22 * b1 - a12 * b2) / det, y: (a11 * b2 - a12 * b1) / det };
  let sq = 0;
  for (const w of wheels) {
    const d = Math.cos(w.heading) * (c.x - w.x) + Math.sin(w.heading) * (c.y - w.y);
    sq += d * d;
  }
  const left = (fl.heading + fr.heading) / 2 >= 0;
  const slips = wheels.map((w) => slipToCentre(w, c, left) * RAD);
  return {
    centreMm: c,
    lineSpreadMm: Math.sqrt(sq / wheels.length),
    slipDeg: { frontLeftDeg: slips[0], frontRightDeg: slips[1], rearLeftDeg: slips[2], rearRightDeg: slips[3] },
    worstSlipDeg: Math.max(...slips.map(Math.abs)),
  };
}
