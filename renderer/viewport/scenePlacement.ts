/** Where drawing points sit in a solved pose: named points from the snapshot, body points by the body's pose. */
import { Matrix4, type Vector3 } from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingPointRef } from '../../core/mechanism/drawingLayout';

const m4 = new Matrix4();

/** A body's pose (column-major rotation, translation) as a Matrix4. */
export function bodyMatrix(snap: PoseSnapshot, i: number, out: Matrix4): Matrix4 {
  const { rotation: r, translation: t } = snap.bodies[i];
  return out.set(r[0], r[3], r[6], t[0], r[1], r[4], r[7], t[1], r[2], r[5], r[8], t[2], 0, 0, 0, 1);
}

const bodyIndexCache = new WeakMap<PoseSnapshot['bodies'], Map<string, number>>();

/** Body id -> index in the snapshot (cached per snapshot's body list). */
export function bodyIndexOf(snap: PoseSnapshot): Map<string, number> {
  let m = bodyIndexCache.get(snap.bodies);
  if (!m) {
    m = new Map(snap.bodies.map((b, i) => [b.id, i]));
    bodyIndexCache.set(snap.bodies, m);
  }
  return m;
}

/** World position of a drawing point in a snapshot; false when the snapshot lacks it. */
export function place(ref: DrawingPointRef, snap: PoseSnapshot, bodies: Map<string, number>, out: Vector3): boolean {
  if ('point' in ref) {
    const p = snap.points[ref.point];
    if (!p) return false;
    out.set(p[0], p[1], p[2]);
    return true;
  }
  const i = bodies.get(ref.body);
  if (i === undefined) return false;
  bodyMatrix(snap, i, m4);
  out.set(ref.design[0], ref.design[1], ref.design[2]).applyMatrix4(m4);
  return true;
}

/** The pose of a body as a matrix; false (and `out` untouched) when the snapshot lacks it. */
export function bodyPose(body: string, snap: PoseSnapshot, bodies: Map<string, number>, out: Matrix4): boolean {
  const i = bodies.get(body);
  if (i === undefined) return false;
  bodyMatrix(snap, i, out);
  return true;
}
