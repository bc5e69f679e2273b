/**
 * Camera framing: the points of everything drawn (every solved point and tube end, the body
 * outline, the rim of every tyre front and rear) and, for each view, the camera that shows
 * them all inside a margin. Front, Side and Top are true elevations (orthographic); the
 * three-quarter view is a perspective. Pure three.js maths, no React.
 */
import { Box3, Matrix4, OrthographicCamera, PerspectiveCamera, Vector3 } from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { bodyIndexOf, bodyPose, place } from './scenePlacement';

export type ElevationName = 'front' | 'side' | 'top';
export type CameraViewName = ElevationName | 'threeQuarter';

/** For each view: direction from the target to the camera, and the camera's up (x forward, y left, z up). */
export const VIEW_AXES: Record<CameraViewName, { toCamera: [number, number, number]; up: [number, number, number] }> = {
  // Looking rearward (along -x): the vehicle's left on the screen's right.
  front: { toCamera: [1, 0, 0], up: [0, 0, 1] },
  // Looking from the left side (along -y): forward is to the screen's left.
  side: { toCamera: [0, 1, 0], up: [0, 0, 1] },
  // Looking down (along -z), forward to the screen's left as in the Side view, the vehicle's left
  // at the bottom (the plan drawn above the side elevation). The vehicle's length then lies
  // along the canvas's long side: forward up the screen drew it at about half the size at 1280x800.
  top: { toCamera: [0, 0, 1], up: [0, -1, 0] },
  threeQuarter: { toCamera: [1, 0.85, 0.62], up: [0, 0, 1] },
};

/** Share of the canvas left free around the framed box (each side). */
export const FRAME_MARGIN = 0.06;

const v = new Vector3();
const m4 = new Matrix4();

/** World centre and unit spin axis of every drawn wheel (front from the snapshot, rear from its body). */
export function drawnWheels(snap: PoseSnapshot, layout: DrawingLayout): { centre: Vector3; axis: Vector3; radius: number; width: number }[] {
  const out: { centre: Vector3; axis: Vector3; radius: number; width: number }[] = [];
  for (const fw of layout.frontWheels) {
    const w = snap.wheels[fw.side];
    if (!w) continue;
    out.push({ centre: new Vector3(...w.centre), axis: new Vector3(...w.spinAxis).normalize(), radius: fw.rollingRadius, width: fw.width });
  }
  const bodies = bodyIndexOf(snap);
  for (const rw of layout.rearWheels) {
    if (!bodyPose(rw.body, snap, bodies, m4)) continue;
    const centre = new Vector3(...rw.centre).applyMatrix4(m4);
    const axis = new Vector3(...rw.spinAxis).transformDirection(m4);
    out.push({ centre, axis, radius: rw.rollingRadius, width: rw.width });
  }
  return out;
}

/** Points on each wheel's two faces, per face. */
const RIM_POINTS = 32;

/**
 * The points a view frames: every solved point and tube end, the outline, and RIM_POINTS on
 * each face of every tyre (front and rear). Tighter than the box's corners in perspective.
 */
export function scenePoints(snap: PoseSnapshot | null, layout: DrawingLayout | null): Vector3[] {
  const pts: Vector3[] = [];
  if (!snap) return pts;
  for (const p of Object.values(snap.points)) pts.push(new Vector3(p[0], p[1], p[2]));
  if (!layout) return pts;
  const bodies = bodyIndexOf(snap);
  for (const t of layout.tubes) {
    if (place(t.a, snap, bodies, v)) pts.push(v.clone());
    if (place(t.b, snap, bodies, v)) pts.push(v.clone());
  }
  if (layout.outline && bodyPose(layout.outline.body, snap, bodies, m4)) {
    for (const p of layout.outline.points) pts.push(new Vector3(p[0], p[1], p[2]).applyMatrix4(m4));
  }
  for (const w of drawnWheels(snap, layout)) {
    const u = new Vector3(0, 0, 1).cross(w.axis);
    if (u.lengthSq() < 1e-9) u.set(1, 0, 0);
    u.normalize();
    const s = new Vector3().crossVectors(w.axis, u);
    // Just outside the true circle, so the chords between the points stay inside what is framed.
    const r = w.radius / Math.cos(Math.PI / RIM_POINTS);
    for (let k = 0; k < RIM_POINTS; k++) {
      const t = (2 * Math.PI * k) / RIM_POINTS;
      for (const side of [-0.5, 0.5]) {
        pts.push(w.centre.clone().addScaledVector(u, r * Math.cos(t)).addScaledVector(s, r * Math.sin(t)).addScaledVector(w.axis, side * w.width));
      }
    }
  }
  return pts;
}

const corners = (box: Box3): Vector3[] => {
  const { min: a, max: b } = box;
  return [
    new Vector3(a.x, a.y, a.z), new Vector3(b.x, a.y, a.z), new Vector3(a.x, b.y, a.z), new Vector3(b.x, b.y, a.z),
    new Vector3(a.x, a.y, b.z), new Vector3(b.x, a.y, b.z), new Vector3(a.x, b.y, b.z), new Vector3(b.x, b.y, b.z),
  ];
};

/** The camera's basis for a view direction: right, up and the unit vector towards the camera. */
function basis(toCamera: Vector3, up: Vector3) {
  const back = toCamera.clone().normalize();
  const right = new Vector3().crossVectors(up, back).normalize();
  const trueUp = new Vector3().crossVectors(back, right).normalize();
  return { back, right, up: trueUp };
}

/** Canvas pixels covered by the controls drawn over it, on each side. */
export interface Insets {
  top: number;
  bottom: number;
  left: number;
  right: number;
}

export const NO_INSETS: Insets = { top: 0, bottom: 0, left: 0, right: 0 };

/** The free part of the canvas: its size, and its centre in normalised device coordinates. */
function freeArea(width: number, height: number, i: Insets) {
  const w = Math.max(width * 0.3, width - i.left - i.right);
  const h = Math.max(height * 0.3, height - i.top - i.bottom);
  return { w, h, cx: (i.left - i.right) / width, cy: (i.bottom - i.top) / height };
}

export interface Framing {
  kind: 'orthographic' | 'perspective';
  position: Vector3;
  target: Vector3;
  up: Vector3;
  /** Orthographic: pixels per mm with a frustum of the canvas's size in pixels (React Three Fiber's convention). */
  zoom: number;
  near: number;
  far: number;
}

/**
 * An orthographic camera looking along `toCamera` reversed that shows the whole box on a
 * canvas of width x height pixels, with FRAME_MARGIN free on each side.
 */
export function orthographicFraming(points: readonly Vector3[], toCamera: Vector3, upHint: Vector3, width: number, height: number, insets: Insets = NO_INSETS): Framing {
  const { back, right, up } = basis(toCamera, upHint);
  // The extent of the points across, up and along the line of sight; centred on its middle.
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (const p of points) {
    const c = [p.dot(right), p.dot(up), p.dot(back)];
    for (let i = 0; i < 3; i++) {
      lo[i] = Math.min(lo[i], c[i]);
      hi[i] = Math.max(hi[i], c[i]);
    }
  }
  const mid = (i: number) => (lo[i] + hi[i]) / 2;
  const centre = new Vector3().addScaledVector(right, mid(0)).addScaledVector(up, mid(1)).addScaledVector(back, mid(2));
  const hr = (hi[0] - lo[0]) / 2;
  const hu = (hi[1] - lo[1]) / 2;
  const hb = (hi[2] - lo[2]) / 2;
  const usable = 1 - 2 * FRAME_MARGIN;
  const free = freeArea(width, height, insets);
  const zoom = Math.min((free.w * usable) / (2 * Math.max(hr, 1)), (free.h * usable) / (2 * Math.max(hu, 1)));
  // Shift the camera so the drawing's middle lands in the middle of the free area.
  centre.addScaledVector(right, -(free.cx * width) / 2 / zoom).addScaledVector(up, -(free.cy * height) / 2 / zoom);
  const dist = hb + 2000;
  return { kind: 'orthographic', position: centre.clone().addScaledVector(back, dist), target: centre, up: upHint.clone(), zoom, near: 1, far: dist + hb + 2000 };
}

/**
 * A perspective camera (vertical field of view fovDeg) looking along `toCamera` reversed at the
 * box's centre, as close as it can be with every corner of the box inside the margins.
 */
export function perspectiveFraming(points: readonly Vector3[], toCamera: Vector3, upHint: Vector3, fovDeg: number, width: number, height: number, insets: Insets = NO_INSETS): Framing {
  const { back, right, up } = basis(toCamera, upHint);
  const centre = new Box3().setFromPoints(points as Vector3[]).getCenter(new Vector3());
  const usable = 1 - 2 * FRAME_MARGIN;
  const free = freeArea(width, height, insets);
  const tanV = Math.tan((fovDeg * Math.PI) / 360);
  const tanH = tanV * (width / Math.max(1, height));
  const tv = tanV * usable * (free.h / height);
  const th = tanH * usable * (free.w / width);
  // A corner at (x, y) across and z towards the camera is inside when |x| <= th (D - z), |y| <= tv (D - z).
  let dist = 0;
  for (const q of points) {
    const p = v.subVectors(q, centre);
    const z = p.dot(back);
    dist = Math.max(dist, z + Math.abs(p.dot(right)) / th, z + Math.abs(p.dot(up)) / tv);
  }
  // Off centre (controls over the canvas): shift the camera sideways so the middle lands in the
  // free area, then check every point against the free area and step back until all are in.
  const cam = new PerspectiveCamera(fovDeg, width / Math.max(1, height), 1, 1e7);
  const target = new Vector3();
  const n = new Vector3();
  for (let iter = 0; iter < 8; iter++) {
    target.copy(centre).addScaledVector(right, -free.cx * tanH * dist).addScaledVector(up, -free.cy * tanV * dist);
    cam.up.copy(upHint);
    cam.position.copy(target).addScaledVector(back, dist);
    cam.lookAt(target);
    cam.updateMatrixWorld(true);
    let k = 0;
    for (const p of points) {
      n.copy(p).project(cam);
      k = Math.max(k, Math.abs(n.x - free.cx) / ((usable * free.w) / width), Math.abs(n.y - free.cy) / ((usable * free.h) / height));
    }
    if (k <= 1.0001) break;
    dist *= Math.min(2, k * 1.01);
  }
  return {
    kind: 'perspective',
    position: target.clone().addScaledVector(back, dist),
    target: target.clone(),
    up: upHint.clone(),
    zoom: 1,
    near: Math.max(1, dist / 100),
    far: dist * 20,
  };
}

/** The framing of a named view for the box on a canvas of the given size. */
export function framingFor(view: CameraViewName, points: readonly Vector3[], width: number, height: number, fovDeg: number, insets: Insets = NO_INSETS): Framing {
  const axes = VIEW_AXES[view];
  const dir = new Vector3(...axes.toCamera);
  const up = new Vector3(...axes.up);
  return view === 'threeQuarter' ? perspectiveFraming(points, dir, up, fovDeg, width, height, insets) : orthographicFraming(points, dir, up, width, height, insets);
}

/** Stand-in points when nothing is solved: a box of about a small vehicle's size. */
export function defaultPoints(): Vector3[] {
  return corners(new Box3(new Vector3(-1200, -600, 0), new Vector3(400, 600, 900)));
}

/** Sets a camera to a framing (the orthographic frustum in pixels, as React Three Fiber sizes it). */
export function applyFraming(camera: PerspectiveCamera | OrthographicCamera, f: Framing, width: number, height: number): void {
  camera.up.copy(f.up);
  camera.position.copy(f.position);
  camera.near = f.near;
  camera.far = f.far;
  if (camera instanceof OrthographicCamera) {
    camera.left = -width / 2;
    camera.right = width / 2;
    camera.top = height / 2;
    camera.bottom = -height / 2;
    camera.zoom = f.zoom;
  } else {
    camera.aspect = width / Math.max(1, height);
  }
  camera.lookAt(f.target);
  camera.updateProjectionMatrix();
  camera.updateMatrixWorld(true);
}
