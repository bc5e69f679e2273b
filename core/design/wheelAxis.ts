/**
 * Wheel spin axis from toe and camber, the sign conventions of ISO 8855 / SAE J670:
 * toe-in positive (the front of the wheel points toward the centre line), camber positive
 * when the top of the wheel leans outward. The axis returned points to the vehicle's left
 * (+y) for both wheels, so one heading formula serves both sides.
 *
 * It belongs to the design format (static toe and camber are written in these conventions);
 * core/mechanism/wheelAxis.ts re-exports it for the layers above.
 */

import { DEG, type Vec3 } from '../math/vec3';
import type { Side } from './types';

/** Unit spin axis, pointing left, of a wheel with the given toe and camber (degrees). */
export function wheelSpinAxisAtDesign(side: Side, toeDeg: number, camberDeg: number): Vec3 {
  const t = toeDeg * DEG;
  const c = camberDeg * DEG;
  // Outward axis: rotate the outward horizontal axis by the toe (about z) and tilt it down
  // by the camber (top of the wheel outward = outward axis below horizontal).
  if (side === 'left') return [Math.sin(t) * Math.cos(c), Math.cos(t) * Math.cos(c), -Math.sin(c)];
  // Right wheel: outward is -y; mirror and flip to point left.
  return [-Math.sin(t) * Math.cos(c), Math.cos(t) * Math.cos(c), Math.sin(c)];
}

/** ISO 8855 heading (yaw, radians, positive to the left) of a wheel with left-pointing spin axis a. */
export function wheelHeading(ax: number, ay: number): number {
  return Math.atan2(-ax, ay);
}

/** Toe (radians, toe-in positive) from the heading of a wheel on a side. */
export function toeFromHeading(side: Side, heading: number): number {
  return side === 'left' ? -heading : heading;
}

/**
 * Camber (radians, top outward positive) of a wheel with left-pointing spin axis a,
 * measured against the given up direction (ground normal, or the frame's z axis).
 */
export function camberFromAxis(side: Side, ax: number, ay: number, az: number, up: Vec3 = [0, 0, 1]): number {
  // outward axis o: camber = asin(-(o . up))
  const s = side === 'left' ? 1 : -1;
  const d = s * (ax * up[0] + ay * up[1] + az * up[2]);
  return Math.asin(Math.max(-1, Math.min(1, -d)));
}
