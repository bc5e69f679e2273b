/**
 * A solved pose as plain, serialisable data: every body's transform, every named
 * hardpoint's world position, and each wheel's basic alignment (toe, camber, contact point).
 * Computed from the compiled mechanism's current state; allocation is fine here (this is
 * output, not the solver's inner loop).
 */

import type { CompiledMechanism } from '../solver/CompiledMechanism';
import type { PoseInputs, Vec3 } from '../mechanism/MechanismGraph';
import { camberFromAxis, toeFromHeading, wheelHeading } from '../mechanism/wheelAxis';

const RAD = 180 / Math.PI;

export interface BodyPose {
  id: string;
  /** Column-major rotation, design -> world. */
  rotation: number[];
  translation: Vec3;
}

export interface WheelPose {
  side: 'left' | 'right';
  centre: Vec3;
  /** Unit spin axis pointing left. */
  spinAxis: Vec3;
  /** Lowest point of the tyre (on the ground when the wheel touches it). */
  contactPoint: Vec3;
  /** Road-wheel angle: ISO 8855 heading of the wheel, positive to the left. */
  steerDeg: number;
  /** Toe, toe-in positive. */
  toeDeg: number;
  /** Camber to the ground normal, top outward positive. */
  camberDeg: number;
  /** Camber to the frame's z axis, top outward positive. */
  camberToFrameDeg: number;
}

export interface PoseSnapshot {
  inputs: PoseInputs;
  bodies: BodyPose[];
  points: Record<string, Vec3>;
  wheels: { left: WheelPose; right: WheelPose };
}

export function takeSnapshot(m: CompiledMechanism): PoseSnapshot {
  m.forward();
  const g = m.graph;
  const bodies: BodyPose[] = g.bodies.map((b, i) => ({
    id: b.id,
    rotation: Array.from(m.rot.subarray(9 * i, 9 * i + 9)),
    translation: [m.trans[3 * i], m.trans[3 * i + 1], m.trans[3 * i + 2]],
  }));
  const points: Record<string, Vec3> = {};
  const tmp = [0, 0, 0];
  for (const p of g.points) {
    m.worldPoint(p.body, p.design, tmp);
    points[p.id] = [tmp[0], tmp[1], tmp[2]];
  }
  const frameUp: Vec3 = [0, 0, 0];
  m.worldDirection(g.frameBody, [0, 0, 1], frameUp);
  const wheels = {} as PoseSnapshot['wheels'];
  for (const w of g.wheels) {
    const c: Vec3 = [0, 0, 0];
    const a: Vec3 = [0, 0, 0];
    m.worldPoint(w.body, w.centre, c);
    m.worldDirection(w.body, w.spinAxis, a);
    const heading = wheelHeading(a[0], a[1]);
    wheels[w.side] = {
      side: w.side,
      centre: c,
      spinAxis: a,
      contactPoint: tyreLowestPoint(c, a, w.rollingRadius, w.crownRadius),
      steerDeg: heading * RAD,
      toeDeg: toeFromHeading(w.side, heading) * RAD,
      camberDeg: camberFromAxis(w.side, a[0], a[1], a[2]) * RAD,
      camberToFrameDeg: camberFromAxis(w.side, a[0], a[1], a[2], frameUp) * RAD,
    };
  }
  const reported = m.reportedInputs();
  return { inputs: { ...m.currentInputs, ...reported }, bodies, points, wheels };
}

/**
 * Lowest point of a tyre modelled as a torus: the crown circle (radius R - r about the
 * wheel centre, in the wheel plane) swept by the crown radius r. The crown centre nearest
 * the ground lies along the in-plane direction closest to straight down.
 */
export function tyreLowestPoint(c: Vec3, a: Vec3, rolling: number, crown: number): Vec3 {
  // d = normalize(-z + a_z a): straight down, projected into the wheel plane
  let dx = a[2] * a[0];
  let dy = a[2] * a[1];
  let dz = -1 + a[2] * a[2];
  const n = Math.hypot(dx, dy, dz);
  if (n < 1e-12) return [c[0], c[1], c[2] - crown]; // wheel lying flat: no defined lowest rim point
  dx /= n;
  dy /= n;
  dz /= n;
  const k = rolling - crown;
  return [c[0] + k * dx, c[1] + k * dy, c[2] + k * dz - crown];
}
