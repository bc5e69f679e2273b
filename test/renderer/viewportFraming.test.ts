// The 3D view's geometry: every view frames every wheel (front and rear) of every demo,
// Front/Side/Top are true orthographic elevations, the solid tyres sit exactly on the solved
// wheels (centre, spin axis, and the tread touching the ground at core's contact point), the
// near wheel is see-through in the Side view, and the front view's lean label reads the
// frame's solved lean.
import { describe, expect, it } from 'vitest';
import {
  BufferAttribute,
  BufferGeometry,
  CylinderGeometry,
  IcosahedronGeometry,
  InstancedMesh,
  LineSegments,
  Matrix4,
  Object3D,
  OrthographicCamera,
  PerspectiveCamera,
  PlaneGeometry,
  Vector3,
} from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { applyFraming, framingFor, orthographicFraming, scenePoints, type CameraViewName } from '../../renderer/viewport/framing';
import { JOINT_CAPACITY, LINE_CAPACITY, TUBE_CAPACITY, updateScene, type SceneObjects } from '../../renderer/viewport/sceneUpdate';
import { markGeometries } from '../../renderer/viewport/markGeometry';
import { createWheelSlots, type MadeSlot } from '../../renderer/viewport/wheelSlots';
import { NEAR_WHEEL_OPACITY } from '../../renderer/viewport/wheelsUpdate';
import { TYRE_SEGMENTS } from '../../renderer/viewport/wheelGeometry';
import { demoWorkbench } from './helpers';

const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike', 'plover-tilting-quad', 'pipit-balance-beam-trike'];
const VIEWS: CameraViewName[] = ['threeQuarter', 'front', 'side', 'top'];
// Canvas sizes of the viewport at 1280x800 and 1920x1080 windows, and a tall narrow one.
const SIZES: [number, number][] = [
  [700, 470],
  [1250, 720],
  [420, 640],
];

/**
 * Points on every drawn tyre: two circles (the faces) of 72 points each at the rolling
 * radius, computed here from the snapshot directly (front: the solved wheel; rear: the
 * carrying body's column-major rotation and translation applied by hand).
 */
function tyrePoints(snap: PoseSnapshot, layout: DrawingLayout): Vector3[] {
  const wheels: { c: Vector3; a: Vector3; r: number; w: number }[] = [];
  for (const fw of layout.frontWheels) {
    const w = snap.wheels[fw.side];
    wheels.push({ c: new Vector3(...w.centre), a: new Vector3(...w.spinAxis).normalize(), r: fw.rollingRadius, w: fw.width });
  }
  for (const rw of layout.rearWheels) {
    const b = snap.bodies.find((x) => x.id === rw.body)!;
    const R = b.rotation;
    const rot = (v: readonly number[]) => new Vector3(R[0] * v[0] + R[3] * v[1] + R[6] * v[2], R[1] * v[0] + R[4] * v[1] + R[7] * v[2], R[2] * v[0] + R[5] * v[1] + R[8] * v[2]);
    wheels.push({ c: rot(rw.centre).add(new Vector3(...b.translation)), a: rot(rw.spinAxis).normalize(), r: rw.rollingRadius, w: rw.width });
  }
  const pts: Vector3[] = [];
  for (const { c, a, r, w } of wheels) {
    const u = new Vector3(0, 0, 1).cross(a);
    if (u.lengthSq() < 1e-9) u.set(1, 0, 0);
    u.normalize();
    const v = new Vector3().crossVectors(a, u);
    for (let k = 0; k < 72; k++) {
      const t = (2 * Math.PI * k) / 72;
      for (const s of [-0.5, 0.5]) pts.push(c.clone().addScaledVector(u, r * Math.cos(t)).addScaledVector(v, r * Math.sin(t)).addScaledVector(a, s * w));
    }
  }
  return pts;
}

function cameraFor(view: CameraViewName, box: Vector3[], w: number, h: number) {
  const cam = view === 'threeQuarter' ? new PerspectiveCamera(32, w / h, 10, 40000) : new OrthographicCamera();
  applyFraming(cam, framingFor(view, box, w, h, 32), w, h);
  return cam;
}

const outside = (pts: Vector3[], cam: PerspectiveCamera | OrthographicCamera) => pts.filter((p) => {
  const n = p.clone().project(cam);
  return !(Math.abs(n.x) <= 1 && Math.abs(n.y) <= 1 && Math.abs(n.z) <= 1);
});

const POSES = [{}, { leanDeg: 20, handlebarDeg: -8 }, { handlebarDeg: 25 }];

describe('camera framing', () => {
  for (const demo of DEMOS) {
    it(`shows every wheel and every solved point in every view (${demo})`, () => {
      const wb = demoWorkbench(demo);
      let checked = 0;
      for (const pose of POSES) {
        wb.actions.setPose(pose);
        const { outcome, drawing } = wb.pose.getState();
        const snap = outcome.snapshot!;
        const pts = [...tyrePoints(snap, drawing!), ...Object.values(snap.points).map((p) => new Vector3(...p))];
        expect(drawing!.rearWheels.length).toBeGreaterThan(0);
        const box = scenePoints(snap, drawing);
        for (const view of VIEWS) {
          for (const [w, h] of SIZES) {
            const cam = cameraFor(view, box, w, h);
            expect(outside(pts, cam), `${view} ${w}x${h} ${JSON.stringify(pose)}`).toEqual([]);
            checked += pts.length;
          }
        }
      }
      expect(checked).toBeGreaterThan(1000);
    });
  }

  it('keeps clear of the controls over the canvas (view buttons on top, legend below)', () => {
    const insets = { top: 46, bottom: 64, left: 0, right: 0 };
    for (const demo of DEMOS) {
      const wb = demoWorkbench(demo);
      wb.actions.setPose({ handlebarDeg: 12 });
      const { outcome, drawing } = wb.pose.getState();
      const pts = tyrePoints(outcome.snapshot!, drawing!);
      for (const view of VIEWS) {
        for (const [w, h] of SIZES) {
          const cam = view === 'threeQuarter' ? new PerspectiveCamera(32, w / h, 10, 40000) : new OrthographicCamera();
          applyFraming(cam, framingFor(view, scenePoints(outcome.snapshot, drawing), w, h, 32, insets), w, h);
          for (const p of pts) {
            const n = p.clone().project(cam);
            const px = ((n.x + 1) / 2) * w;
            const py = ((1 - n.y) / 2) * h;
            expect(px, `${demo} ${view} ${w}x${h}`).toBeGreaterThanOrEqual(0);
            expect(px).toBeLessThanOrEqual(w);
            expect(py, `${demo} ${view} ${w}x${h}`).toBeGreaterThanOrEqual(insets.top - 0.5);
            expect(py, `${demo} ${view} ${w}x${h}`).toBeLessThanOrEqual(h - insets.bottom + 0.5);
          }
        }
      }
    }
  });

  it('negative control: a box without the rear wheel leaves it out of the side view', () => {
    const wb = demoWorkbench();
    const { outcome, drawing } = wb.pose.getState();
    const snap = outcome.snapshot!;
    const frontOnly = { ...drawing!, rearWheels: [], tubes: [], outline: null };
    const pointsOnly = { ...snap, points: Object.fromEntries(Object.entries(snap.points).filter(([, p]) => p[0] > -300)) };
    const cam = cameraFor('side', scenePoints(pointsOnly, frontOnly), 700, 470);
    expect(outside(tyrePoints(snap, drawing!), cam).length).toBeGreaterThan(0);
  });

  it('fills the canvas: the box touches the margin on at least one axis', () => {
    const wb = demoWorkbench();
    const { outcome, drawing } = wb.pose.getState();
    const box = scenePoints(outcome.snapshot, drawing);
    for (const view of VIEWS) {
      const cam = cameraFor(view, box, 700, 470);
      let mx = 0;
      let my = 0;
      for (const p of tyrePoints(outcome.snapshot!, drawing!)) {
        const n = p.project(cam);
        mx = Math.max(mx, Math.abs(n.x));
        my = Math.max(my, Math.abs(n.y));
      }
      // Not lost in the middle: the drawing reaches at least 70 % of the way to an edge.
      expect(Math.max(mx, my), view).toBeGreaterThan(0.7);
    }
  });
});

describe('elevations', () => {
  it('front, side and top are orthographic, look along -x, -y and -z, and keep one scale across and up', () => {
    const wb = demoWorkbench();
    const { outcome, drawing } = wb.pose.getState();
    const box = scenePoints(outcome.snapshot, drawing);
    const look: Record<string, [number, number, number]> = { front: [-1, 0, 0], side: [0, -1, 0], top: [0, 0, -1] };
    for (const view of ['front', 'side', 'top'] as const) {
      const cam = cameraFor(view, box, 700, 470) as OrthographicCamera;
      expect(cam).toBeInstanceOf(OrthographicCamera);
      const dir = cam.getWorldDirection(new Vector3());
      expect(dir.distanceTo(new Vector3(...look[view]))).toBeLessThan(1e-9);
      // A true elevation: moving a point along the line of sight does not move it on screen.
      const p = new Vector3(100, 50, 200);
      const q = p.clone().addScaledVector(dir, 700);
      const a = p.clone().project(cam);
      const b = q.clone().project(cam);
      expect(Math.hypot(a.x - b.x, a.y - b.y)).toBeLessThan(1e-9);
      // 100 mm across and 100 mm up the screen are the same number of pixels.
      const right = new Vector3(1, 0, 0).applyQuaternion(cam.quaternion);
      const up = new Vector3(0, 1, 0).applyQuaternion(cam.quaternion);
      const px = (v: Vector3) => {
        const n = v.clone().project(cam);
        return [(n.x * 700) / 2, (n.y * 470) / 2];
      };
      const o = px(p);
      const r = px(p.clone().addScaledVector(right, 100));
      const u = px(p.clone().addScaledVector(up, 100));
      expect(Math.hypot(r[0] - o[0], r[1] - o[1])).toBeCloseTo(Math.hypot(u[0] - o[0], u[1] - o[1]), 6);
    }
    // Top: forward to the screen's left as in the Side view, the vehicle's left at the bottom
    // (ISO 8855 seen from above, the plan drawn over the side elevation).
    const top = cameraFor('top', box, 700, 470);
    const side = cameraFor('side', box, 700, 470);
    const o = new Vector3(0, 0, 0);
    const ahead = new Vector3(500, 0, 0).project(top).x - o.clone().project(top).x;
    const aheadSide = new Vector3(500, 0, 0).project(side).x - o.clone().project(side).x;
    const left = new Vector3(0, 500, 0).project(top).y - o.clone().project(top).y;
    expect(ahead).toBeLessThan(0);
    expect(Math.sign(ahead)).toBe(Math.sign(aheadSide));
    expect(left).toBeLessThan(0);
    // On a landscape canvas the plan of a vehicle longer than wide is drawn larger than with forward up the screen.
    const forwardUp = orthographicFraming(box, new Vector3(0, 0, 1), new Vector3(1, 0, 0), 700, 470);
    expect((top as OrthographicCamera).zoom / forwardUp.zoom).toBeGreaterThan(1.2);
  });
});

function sceneObjects(layout: DrawingLayout): SceneObjects & { wheels: (MadeSlot | null)[]; label: { text: string; object: Object3D } } {
  const line = new BufferGeometry();
  line.setAttribute('position', new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3));
  line.setAttribute('color', new BufferAttribute(new Float32Array(LINE_CAPACITY * 6), 3));
  const marks = markGeometries();
  const label = { text: '', object: new Object3D() };
  return {
    tubes: new InstancedMesh(new CylinderGeometry(), undefined, TUBE_CAPACITY),
    joints: new InstancedMesh(new IcosahedronGeometry(), undefined, JOINT_CAPACITY),
    lines: new LineSegments(line),
    wheels: createWheelSlots(layout, marks, new PlaneGeometry(1, 1), null),
    markGeo: marks,
    leanLabel: { object: label.object, set: (t) => (label.text = t) },
    label,
  };
}

describe('solid wheels', () => {
  for (const demo of DEMOS) {
    it(`each tyre's centre and axis are the solved wheel's, and its tread touches the ground at core's contact point (${demo})`, () => {
      const wb = demoWorkbench(demo);
      const tilting = wb.document.getState().design.vehicle.tilting;
      wb.actions.setPose({ ...(tilting ? { leanDeg: 20 } : {}), handlebarDeg: 10 });
      const s = wb.pose.getState();
      const layout = s.drawing!;
      const snap = s.outcome.snapshot!;
      const o = sceneObjects(layout);
      updateScene({ outcome: s.outcome, selection: null, design: wb.document.getState().design, view: 'threeQuarter' }, layout, o);
      const m = new Matrix4();
      layout.frontWheels.forEach((fw, i) => {
        const slot = o.wheels[i]!;
        const wheel = snap.wheels[fw.side];
        slot.group.updateMatrixWorld(true);
        expect(slot.group.visible).toBe(true);
        expect(slot.group.position.distanceTo(new Vector3(...wheel.centre))).toBeLessThan(1e-9);
        const axis = new Vector3(0, 0, 1).applyQuaternion(slot.group.quaternion);
        expect(axis.distanceTo(new Vector3(...wheel.spinAxis).normalize())).toBeLessThan(1e-9);
        // The drawn tread's lowest vertex: on the ground at the contact point (within the tessellation).
        m.copy(slot.tyreMesh.matrixWorld);
        const pos = slot.tyreMesh.geometry.getAttribute('position');
        const v = new Vector3();
        let low = new Vector3(0, 0, Infinity);
        for (let k = 0; k < pos.count; k++) {
          v.fromBufferAttribute(pos, k).applyMatrix4(m);
          if (v.z < low.z) low = v.clone();
        }
        const cp = new Vector3(...wheel.contactPoint);
        const sag = fw.rollingRadius * (1 - Math.cos(Math.PI / TYRE_SEGMENTS));
        expect(low.z - cp.z).toBeGreaterThan(-0.05);
        expect(low.z - cp.z).toBeLessThan(sag + 0.3);
        expect(Math.hypot(low.x - cp.x, low.y - cp.y)).toBeLessThan(fw.rollingRadius * Math.sin(Math.PI / TYRE_SEGMENTS) + 2);
        // The contact mark lies on the ground under the contact point.
        expect(Math.hypot(slot.mark.position.x - cp.x, slot.mark.position.y - cp.y)).toBeLessThan(1e-9);
      });
      // Rear wheels: centre and axis through the carrying body's pose.
      layout.rearWheels.forEach((rw, k) => {
        const slot = o.wheels[2 + k]!;
        const b = snap.bodies.find((x) => x.id === rw.body)!;
        const R = b.rotation;
        const rot = (p: readonly number[]) => new Vector3(R[0] * p[0] + R[3] * p[1] + R[6] * p[2], R[1] * p[0] + R[4] * p[1] + R[7] * p[2], R[2] * p[0] + R[5] * p[1] + R[8] * p[2]);
        expect(slot.group.position.distanceTo(rot(rw.centre).add(new Vector3(...b.translation)))).toBeLessThan(1e-9);
        expect(new Vector3(0, 0, 1).applyQuaternion(slot.group.quaternion).distanceTo(rot(rw.spinAxis).normalize())).toBeLessThan(1e-9);
        // Its mark sits where its torus meets the ground (the rear tyre rests on the ground).
        expect(Math.abs(slot.mark.position.z - 1.5)).toBeLessThan(3);
      });
    });
  }

  it('the Side view draws the near (left) wheel see-through, and only in that view', () => {
    const wb = demoWorkbench();
    const s = wb.pose.getState();
    const layout = s.drawing!;
    const o = sceneObjects(layout);
    const design = wb.document.getState().design;
    updateScene({ outcome: s.outcome, selection: null, design, view: 'side' }, layout, o);
    layout.frontWheels.forEach((fw, i) => {
      const mat = o.wheels[i]!.tyreMat;
      expect(mat.transparent, fw.side).toBe(fw.side === 'left');
      expect(mat.opacity).toBe(fw.side === 'left' ? NEAR_WHEEL_OPACITY : 1);
    });
    updateScene({ outcome: s.outcome, selection: null, design, view: 'front' }, layout, o);
    for (const slot of o.wheels) if (slot) expect(slot.tyreMat.transparent).toBe(false);
  });

  it('the front view labels the frame lean in degrees with the side that is down, read from the solved frame', () => {
    const wb = demoWorkbench();
    const s0 = wb.pose.getState();
    const o = sceneObjects(s0.drawing!);
    const design = wb.document.getState().design;
    for (const lean of [15, -7.5, 0]) {
      wb.actions.setPose({ leanDeg: lean, handlebarDeg: 0 });
      const s = wb.pose.getState();
      updateScene({ outcome: s.outcome, selection: null, design, view: 'front' }, s.drawing, o);
      const side = lean > 0 ? 'right side down' : lean < 0 ? 'left side down' : 'upright';
      expect(o.label.text).toBe(`lean ${lean.toFixed(1)}° · ${side}`);
      expect(o.label.object.visible).toBe(true);
    }
    updateScene({ outcome: wb.pose.getState().outcome, selection: null, design, view: 'top' }, s0.drawing, o);
    expect(o.label.object.visible).toBe(false);
  });
});
