/**
 * 3-vectors as number tuples: the one home of the vector helpers outside the solver.
 *
 * Output-side code (design checks, analysis measures), so these allocate and return a new
 * tuple; the arithmetic is gl-matrix's `vec3`, called with a fresh plain array as its output
 * (gl-matrix's own `create()` would give a Float32Array and lose the doubles). The solver keeps
 * private typed-array helpers in its hot loops on purpose (see core/solver/CompiledMechanism.ts).
 * Angles in radians.
 */
import { vec3 } from 'gl-matrix';

export type Vec3 = [number, number, number];

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;

export const sub = (a: Vec3, b: Vec3): Vec3 => vec3.subtract([0, 0, 0], a, b) as Vec3;
export const add = (a: Vec3, b: Vec3): Vec3 => vec3.add([0, 0, 0], a, b) as Vec3;
export const scale = (a: Vec3, s: number): Vec3 => vec3.scale([0, 0, 0], a, s) as Vec3;
/** a + s b */
export const addScaled = (a: Vec3, b: Vec3, s: number): Vec3 => vec3.scaleAndAdd([0, 0, 0], a, b, s) as Vec3;
export const dot = (a: Vec3, b: Vec3): number => vec3.dot(a, b);
export const cross = (a: Vec3, b: Vec3): Vec3 => vec3.cross([0, 0, 0], a, b) as Vec3;
// gl-matrix 3.4 takes the square root of the sum of squares, not Math.hypot (which guards
// against an overflow millimetre geometry cannot reach and is several times slower in V8).
export const norm = (a: Vec3): number => vec3.length(a);
export const dist = (a: Vec3, b: Vec3): number => vec3.distance(a, b);

/** Unit vector; a zero vector stays zero (callers guard the degenerate cases they care about). */
export const normalize = (a: Vec3): Vec3 => vec3.normalize([0, 0, 0], a) as Vec3;

/**
 * Angle between two directions, radians in [0, pi]. The atan2 form, not gl-matrix's
 * `vec3.angle` (acos of the cosine), which loses half its digits near 0 and pi.
 */
export function angleBetween(a: Vec3, b: Vec3): number {
  return Math.atan2(norm(cross(a, b)), dot(a, b));
}

/** Foot of the perpendicular from p onto the line through o with unit direction u. */
export function footOnLine(p: Vec3, o: Vec3, u: Vec3): Vec3 {
  return addScaled(o, u, dot(sub(p, o), u));
}

/** Distance from p to the line through `through` along `direction` (any nonzero length). */
export function distanceToLine(p: Vec3, through: Vec3, direction: Vec3): number {
  return norm(cross(sub(p, through), direction)) / norm(direction);
}

/** Wrap an angle to (-pi, pi]. */
export function wrapPi(a: number): number {
  return a - 2 * Math.PI * Math.round(a / (2 * Math.PI));
}

export const clamp = (x: number, lo: number, hi: number): number => (x < lo ? lo : x > hi ? hi : x);

/** A point or direction written with named components, as files and reports write it. */
export interface XyzMm {
  x: number;
  y: number;
  z: number;
}

export const xyz = (v: Vec3): XyzMm => ({ x: v[0], y: v[1], z: v[2] });
export const tuple = (p: XyzMm): Vec3 => [p.x, p.y, p.z];
