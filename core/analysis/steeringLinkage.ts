/**
 * Steering linkage measures: overall and local steering ratio, and transmission angles that
 * show how close a lever is to dead centre.
 *
 * Transmission angle, as used here: asin of the cosine between a link's line and the
 * velocity of the lever joint it drives (or is driven by). 90 degrees: the link pushes
 * straight along the joint's path (ideal); 0: the link is in line with the lever (dead
 * centre, no torque transmitted, and the linkage folds or reverses). Signed so that the
 * design pose is positive: zero or negative means dead centre reached or passed.
 */

import type { Vec3 } from '../mechanism/MechanismGraph';
import { RAD, clamp } from './vec3';

/**
 * Unsigned-by-design transmission (radians, in [-pi/2, pi/2]) of a link from `joint` to
 * `other`, where `joint` turns about the axis through `axisPoint` along unit `axis`
 * (revolute) or slides along `axis` (prismatic).
 */
export function rawTransmission(joint: Vec3, other: Vec3, axisPoint: Vec3, axis: Vec3, kind: 'revolute' | 'prismatic'): number {
  // Scalar arithmetic: this runs four times per pose in a sweep.
  let vx = axis[0], vy = axis[1], vz = axis[2];
  if (kind === 'revolute') {
    // velocity of the joint turning about the axis: axis x (joint - foot); the foot's part
    // along the axis drops out of the cross product, so joint - axisPoint will do.
    const rx = joint[0] - axisPoint[0], ry = joint[1] - axisPoint[1], rz = joint[2] - axisPoint[2];
    vx = axis[1] * rz - axis[2] * ry;
    vy = axis[2] * rx - axis[0] * rz;
    vz = axis[0] * ry - axis[1] * rx;
  }
  const dx = other[0] - joint[0], dy = other[1] - joint[1], dz = other[2] - joint[2];
  const nv = Math.sqrt(vx * vx + vy * vy + vz * vz);
  const nd = Math.sqrt(dx * dx + dy * dy + dz * dz);
  if (!(nv > 0) || !(nd > 0)) return 0; // a joint on its own axis, or coincident joints: no transmission
  return Math.asin(clamp((vx * dx + vy * dy + vz * dz) / (nv * nd), -1, 1));
}

/** The sign that makes a transmission angle positive at design (1 when the design sits exactly at dead centre). */
export const designSign = (designValue: number): number => (designValue < 0 ? -1 : 1);

export function transmissionDeg(raw: number, sign: number): number {
  return sign * raw * RAD;
}

/** Overall ratio: handlebar / mean road-wheel angle; null near straight ahead. */
export function overallSteeringRatio(handlebarDeg: number, meanWheelDeg: number): number | null {
  return Math.abs(meanWheelDeg) >= 0.01 ? handlebarDeg / meanWheelDeg : null;
}

/** Local ratio from two neighbouring poses: d(handlebar) / d(mean wheel angle); null if the wheels did not move. */
export function localSteeringRatio(h0: number, w0: number, h1: number, w1: number): number | null {
  const dw = w1 - w0;
  return Math.abs(dw) > 1e-9 && h1 !== h0 ? (h1 - h0) / dw : null;
}
