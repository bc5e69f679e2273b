/**
 * Small 3-vector helpers on number tuples for the analysis modules (output-side code, so
 * these allocate; the solver's hot loop does not use them). Angles in radians.
 */

import type { Vec3 } from '../mechanism/MechanismGraph';

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;

export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const scale = (a: Vec3, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
/** a + s b */
export const addScaled = (a: Vec3, b: Vec3, s: number): Vec3 => [a[0] + b[0] * s, a[1] + b[1] * s, a[2] + b[2] * s];
export const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
// sqrt of the sum of squares, not Math.hypot: hypot guards against overflow that millimetre
// geometry cannot reach, and is several times slower in V8.
export const norm = (a: Vec3): number => Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
export const dist = (a: Vec3, b: Vec3): number => {
  const x = a[0] - b[0], y = a[1] - b[1], z = a[2] - b[2];
  return Math.sqrt(x * x + y * y + z * z);
};

/** Unit vector; a zero vector stays zero (callers guard the degenerate cases they care about). */
export function normalize(a: Vec3): Vec3 {
  const n = norm(a);
  return n > 0 ? [a[0] / n, a[1] / n, a[2] / n] : [0, 0, 0];
}

/** Angle between two directions, radians in [0, pi]; robust near 0 and pi (atan2 form). */
export function angleBetween(a: Vec3, b: Vec3): number {
  return Math.atan2(norm(cross(a, b)), dot(a, b));
}

/** Foot of the perpendicular from p onto the line through o with unit direction u. */
export function footOnLine(p: Vec3, o: Vec3, u: Vec3): Vec3 {
  return addScaled(o, u, dot(sub(p, o), u));
}

/** Wrap an angle to (-pi, pi]. */
export function wrapPi(a: number): number {
  return a - 2 * Math.PI * Math.round(a / (2 * Math.PI));
}

export const clamp = (x: number, lo: number, hi: number): number => (x < lo ? lo : x > hi ? hi : x);

export interface XyzMm {
  x: number;
  y: number;
  z: number;
}

export const xyz = (v: Vec3): XyzMm => ({ x: v[0], y: v[1], z: v[2] });
