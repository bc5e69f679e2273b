/**
 * Writes the linkage's three.js objects for a pose, from core's drawing layout and the pose
 * outcome: tube and joint instances, axis, outline, frame hoop, selection halo, path and lean
 * lines, and the wheels (wheelsUpdate.ts).
 * LinkageModel makes the objects once; this only sets matrices, colours and visibility, with
 * module-level scratch objects (no allocation per part).
 */
import { Color, Matrix4, Object3D, Vector3, type BufferAttribute, type BufferGeometry, type InstancedMesh, type LineSegments } from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import type { DesignFile } from '../../core/design/types';
import type { PoseOutcome } from '../model/analysisAdapter';
import { hardpointRows } from '../model/hardpoints';
import { SEVERITY_STYLE, type Severity } from '../model/severity';
import { PART_CLASS_COLOUR, partCondition } from './drawingParts';
import { VIEW_COLOUR } from './palette';
import { bodyIndexOf, bodyPose, place } from './scenePlacement';
import { drawWheels, hideSlot, type WheelSlot } from './wheelsUpdate';

export const TUBE_CAPACITY = 96;
export const JOINT_CAPACITY = 64;
export const LINE_CAPACITY = 420;
/** Half the length of each wheel's path arc drawn on the ground, mm. */
const PATH_HALF_MM = 700;
/** Segments of each path arc; every other one is drawn (dashed: the paths' second channel besides colour). */
const PATH_SEGMENTS = 20;
/** Paths, radii and the turn-centre cross are left out beyond this distance, mm. */
const FAR_MM = 30000;
/** Drawn size of a joint ball relative to its radius when selected. */
const SELECTED_SCALE = 1.7;
/** Radius of the selection halo's rings relative to the joint's radius. */
const HALO_SCALE = 3.2;
/** Tubes and joints over a tolerance or in a loop that will not close are drawn this much thicker (a second channel). */
const ALERT_SCALE = 1.45;
const Y = new Vector3(0, 1, 0);
const Z = new Vector3(0, 0, 1);

/** Scratch objects. */
const va = new Vector3();
const vb = new Vector3();
const vd = new Vector3();
const vc = new Vector3();
const m4 = new Matrix4();
const dummy = new Object3D();
const colour = new Color();

export interface SceneObjects {
  tubes: InstancedMesh | null;
  joints: InstancedMesh | null;
  lines: LineSegments | null;
  /** The wheels: the layout's front wheels first, then its rear wheels (wheelsUpdate.ts). */
  wheels: (WheelSlot | null)[];
  /** Contact mark shapes, one per status. */
  markGeo: Record<Severity, BufferGeometry>;
  /** The lean angle's label in the front view. */
  leanLabel?: LeanLabel | null;
}

/** A text label in the scene (textLabel.ts's, or a stand-in in tests). */
export interface LeanLabel {
  object: Object3D;
  set(text: string): void;
}

/** What the scene shows: the outcome of the pose, the selected hardpoint, the design (drawn as entered when nothing is solved). */
export interface SceneInput {
  outcome: PoseOutcome;
  selection: string | null;
  design: DesignFile;
  /** The view shown: 'front' adds the lean angle, 'side' draws the near wheel see-through. */
  view?: string | null;
}

function severityColour(s: Severity | undefined, fallback: string): string {
  return s && s !== 'none' ? SEVERITY_STYLE[s].colour : fallback;
}

const alerting = (s: Severity | undefined) => s === 'over' || s === 'broken';

/** Fills the instances and line vertices of one update, counting what it wrote. */
class SceneWriter {
  nt = 0;
  nj = 0;
  nl = 0;
  private readonly pos: BufferAttribute;
  private readonly col: BufferAttribute;

  constructor(
    readonly tubes: InstancedMesh,
    readonly joints: InstancedMesh,
    readonly lines: LineSegments,
  ) {
    this.pos = lines.geometry.getAttribute('position') as BufferAttribute;
    this.col = lines.geometry.getAttribute('color') as BufferAttribute;
  }

  tube(a: Vector3, b: Vector3, radius: number, hex: string): void {
    if (this.nt >= TUBE_CAPACITY) return;
    vd.subVectors(b, a);
    const len = vd.length();
    dummy.position.addVectors(a, b).multiplyScalar(0.5);
    if (len > 1e-9) dummy.quaternion.setFromUnitVectors(Y, vd.multiplyScalar(1 / len));
    dummy.scale.set(radius, Math.max(len, 1e-3), radius);
    dummy.updateMatrix();
    this.tubes.setMatrixAt(this.nt, dummy.matrix);
    this.tubes.setColorAt(this.nt++, colour.set(hex));
  }

  joint(p: Vector3, radius: number, hex: string): void {
    if (this.nj >= JOINT_CAPACITY) return;
    dummy.position.copy(p);
    dummy.quaternion.identity();
    dummy.scale.setScalar(radius);
    dummy.updateMatrix();
    this.joints.setMatrixAt(this.nj, dummy.matrix);
    this.joints.setColorAt(this.nj++, colour.set(hex));
  }

  line(a: Vector3, b: Vector3, hex: string): void {
    if (this.nl >= LINE_CAPACITY) return;
    colour.set(hex);
    this.pos.setXYZ(2 * this.nl, a.x, a.y, a.z);
    this.pos.setXYZ(2 * this.nl + 1, b.x, b.y, b.z);
    this.col.setXYZ(2 * this.nl, colour.r, colour.g, colour.b);
    this.col.setXYZ(2 * this.nl + 1, colour.r, colour.g, colour.b);
    this.nl++;
  }

  /** Hands the counts to three.js and marks what changed for upload. */
  finish(): void {
    const { tubes, joints, lines } = this;
    tubes.count = this.nt;
    joints.count = this.nj;
    // Picking tests a bounding sphere first; let three.js recompute it for the new pose.
    tubes.boundingSphere = null;
    joints.boundingSphere = null;
    tubes.instanceMatrix.needsUpdate = true;
    joints.instanceMatrix.needsUpdate = true;
    if (tubes.instanceColor) tubes.instanceColor.needsUpdate = true;
    if (joints.instanceColor) joints.instanceColor.needsUpdate = true;
    lines.geometry.setDrawRange(0, this.nl * 2);
    this.pos.needsUpdate = true;
    this.col.needsUpdate = true;
  }
}

/** One update's shared reading of the pose. */
interface Pose {
  input: SceneInput;
  layout: DrawingLayout;
  snap: PoseSnapshot;
  bodies: Map<string, number>;
  w: SceneWriter;
}

/** Writes every object of the scene for the pose. Exported for tests of the mapping. */
export function updateScene(input: SceneInput, layout: DrawingLayout | null, o: SceneObjects): void {
  if (!o.tubes || !o.joints || !o.lines) return;
  const w = new SceneWriter(o.tubes, o.joints, o.lines);
  const snap = input.outcome.snapshot;
  if (snap && layout) {
    const pose: Pose = { input, layout, snap, bodies: bodyIndexOf(snap), w };
    drawTubes(pose);
    drawHandlebar(pose);
    drawJoints(pose);
    drawAxisLines(pose);
    drawOutline(pose);
    drawFrameHoop(pose);
    if (input.outcome.shown === 'requested') drawTurnPaths(pose);
    drawLean(pose, input.view === 'front' ? (o.leanLabel ?? null) : null);
    if (o.leanLabel && input.view !== 'front') o.leanLabel.object.visible = false;
    drawWheels({ outcome: input.outcome, layout, snap, view: input.view ?? null }, o.wheels, o.markGeo);
  } else {
    drawAsEntered(input, w, o);
  }
  w.finish();
}

function drawTubes({ input, layout, snap, bodies, w }: Pose): void {
  for (const t of layout.tubes) {
    if (!place(t.a, snap, bodies, va) || !place(t.b, snap, bodies, vb)) continue;
    const sev = partCondition(layout, input.outcome.parts, t.id);
    w.tube(va, vb, t.radius * (alerting(sev) ? ALERT_SCALE : 1), severityColour(sev, PART_CLASS_COLOUR[t.part]));
  }
}

/** The symbolic handlebar: a bar turned by its input about the body's z axis, on a stem. */
function drawHandlebar({ layout, snap, bodies, w }: Pose): void {
  const h = layout.handlebar;
  if (!h || !bodyPose(h.body, snap, bodies, m4)) return;
  const [hx, hy, hz] = h.at;
  const angle = (snap.inputs[h.turnedBy] * Math.PI) / 180;
  va.set(0, h.halfWidth, 0).applyAxisAngle(Z, angle).add(vd.set(hx, hy, hz)).applyMatrix4(m4);
  vb.set(0, -h.halfWidth, 0).applyAxisAngle(Z, angle).add(vd.set(hx, hy, hz)).applyMatrix4(m4);
  const hex = PART_CLASS_COLOUR[h.part];
  w.tube(va, vb, h.barRadius, hex);
  va.set(hx, hy, hz).applyMatrix4(m4);
  vb.set(hx, hy, hz - h.stem).applyMatrix4(m4);
  w.tube(va, vb, h.stemRadius, hex);
}

function drawJoints({ input, layout, snap, bodies, w }: Pose): void {
  const out = input.outcome;
  for (const j of layout.joints) {
    if (!place(j.at, snap, bodies, va)) continue;
    const selected = input.selection === j.hardpoint;
    const sev = out.parts[j.id];
    const hex = selected ? VIEW_COLOUR.selection : out.shown === 'as-entered' ? SEVERITY_STYLE.broken.colour : severityColour(sev, VIEW_COLOUR.joint);
    w.joint(va, j.radius * (selected ? SELECTED_SCALE : alerting(sev) ? ALERT_SCALE : 1), hex);
    if (selected) halo(w, va, j.radius * HALO_SCALE);
  }
}

/** Three rings about a point (in the x-y, y-z and x-z planes): the selection's mark beside its colour. */
function halo(w: SceneWriter, c: Vector3, r: number): void {
  const n = 20;
  for (let plane = 0; plane < 3; plane++) {
    for (let k = 0; k < n; k++) {
      const t0 = (2 * Math.PI * k) / n;
      const t1 = (2 * Math.PI * (k + 1)) / n;
      ring(vb, plane, r, t0).add(c);
      ring(vd, plane, r, t1).add(c);
      w.line(vb, vd, VIEW_COLOUR.selection);
    }
  }
}

function ring(out: Vector3, plane: number, r: number, t: number): Vector3 {
  const a = r * Math.cos(t);
  const b = r * Math.sin(t);
  return plane === 0 ? out.set(a, b, 0) : plane === 1 ? out.set(0, a, b) : out.set(a, 0, b);
}

function drawAxisLines({ layout, snap, bodies, w }: Pose): void {
  const hex = PART_CLASS_COLOUR.axis;
  for (const l of layout.axisLines) {
    if (!place(l.a, snap, bodies, va) || !place(l.b, snap, bodies, vb)) continue;
    vd.subVectors(vb, va);
    if (l.toGround && vd.z < -1e-6) {
      // On through b down to the ground plane.
      vd.multiplyScalar(-vb.z / vd.z).add(vb);
      w.line(va, vd, hex);
    } else {
      w.line(va, vb, hex);
    }
  }
}

function drawOutline({ layout, snap, bodies, w }: Pose): void {
  const outline = layout.outline;
  if (!outline || outline.points.length < 2 || !bodyPose(outline.body, snap, bodies, m4)) return;
  const pts = outline.points;
  for (let k = 0; k < pts.length; k++) {
    const p = pts[k];
    const n = pts[(k + 1) % pts.length];
    va.set(p[0], p[1], p[2]).applyMatrix4(m4);
    vb.set(n[0], n[1], n[2]).applyMatrix4(m4);
    w.line(va, vb, PART_CLASS_COLOUR[outline.part]);
  }
}

/**
 * A frame hoop: a rectangle across the frame at the handlebar, fixed in the frame, from near
 * the ground to the bar's height, so the frame's lean reads at a glance in every view.
 */
function drawFrameHoop({ layout, snap, bodies, w }: Pose): void {
  const h = layout.handlebar;
  if (!h || !bodyPose(h.body, snap, bodies, m4)) return;
  const x = h.at[0];
  const half = h.halfWidth;
  const z0 = 120;
  const z1 = Math.max(h.at[2], z0 + 300);
  const c: [number, number][] = [[-half, z0], [half, z0], [half, z1], [-half, z1]];
  for (let k = 0; k < 4; k++) {
    const [y0, za] = c[k];
    const [y1, zb] = c[(k + 1) % 4];
    va.set(x, y0, za).applyMatrix4(m4);
    vb.set(x, y1, zb).applyMatrix4(m4);
    w.line(va, vb, VIEW_COLOUR.frame);
  }
}

/**
 * The lean in the front view: the vertical and the frame's up axis from the roll axis (the x
 * axis through the origin, README's definition), the arc between them and its label in
 * degrees with the side that is down. The frame's up axis is read from the pose of the body
 * carrying the handlebar (the frame), so the drawing shows the lean the solved frame has.
 */
/** Radius of the front view's lean arc: reaching just above the frame and the rear wheel, where it is clear of them. */
export function leanGaugeRadius(layout: DrawingLayout): number {
  const top = Math.max(layout.handlebar?.at[2] ?? 0, ...layout.rearWheels.map((w) => 2 * w.rollingRadius), 400);
  return Math.min(1400, 1.12 * top);
}

function drawLean({ layout, snap, bodies, w }: Pose, label: LeanLabel | null): void {
  const body = layout.handlebar?.body ?? layout.outline?.body ?? layout.rearWheels[0]?.body;
  if (!label || !body || !bodyPose(body, snap, bodies, m4)) return;
  // Frame up in world: the rotation's third column.
  vc.set(0, 0, 1).transformDirection(m4);
  const leanRad = Math.atan2(-vc.y, vc.z); // positive lean lowers the right (-y) side
  // In front of everything the front elevation shows, reaching about the frame's height.
  const x = Math.max(snap.wheels.left.centre[0], snap.wheels.right.centre[0]) + 400;
  const r = leanGaugeRadius(layout);
  // The vertical, dashed.
  for (let k = 0; k < 11; k += 2) {
    va.set(x, 0, (r * 1.1 * k) / 11);
    vb.set(x, 0, (r * 1.1 * (k + 1)) / 11);
    w.tube(va, vb, 2.5, VIEW_COLOUR.vertical);
  }
  // The frame's up axis and the arc from the vertical to it, as thin rods (lines are one pixel).
  va.set(x, 0, 0);
  vb.set(x, -Math.sin(leanRad) * r * 1.1, Math.cos(leanRad) * r * 1.1);
  w.tube(va, vb, 4, VIEW_COLOUR.lean);
  const n = Math.max(1, Math.min(16, Math.ceil(Math.abs(leanRad) / (Math.PI / 60))));
  if (Math.abs(leanRad) > 1e-4) {
    for (let k = 0; k < n; k++) {
      const t0 = (leanRad * k) / n;
      const t1 = (leanRad * (k + 1)) / n;
      va.set(x, -Math.sin(t0) * r, Math.cos(t0) * r);
      vb.set(x, -Math.sin(t1) * r, Math.cos(t1) * r);
      w.tube(va, vb, 3.5, VIEW_COLOUR.lean);
    }
  }
  const deg = (leanRad * 180) / Math.PI;
  const upright = Math.abs(deg) < 0.05;
  label.set(`lean ${upright ? '0.0' : deg.toFixed(1)}° · ${upright ? 'upright' : deg > 0 ? 'right side down' : 'left side down'}`);
  // Just beyond the top of the frame's axis.
  label.object.position.set(x, -Math.sin(leanRad) * r * 1.18, Math.cos(leanRad) * r * 1.18 + 20);
  label.object.visible = true;
}

/**
 * The turn centre and each wheel's path about it (from core's slip analysis; with a leaning rear
 * pair, core's four-wheel turn centre and the rear tyres' solved contact points).
 */
function drawTurnPaths({ input, layout, snap, bodies, w }: Pose): void {
  const rear = input.outcome.analysis?.rear;
  const centre = rear ? rear.turnCentre.centreMm : input.outcome.analysis?.slip.turnCentreMm;
  if (!centre) return;
  const contacts: [number, number][] = layout.frontWheels.map((fw) => {
    const c = snap.wheels[fw.side].contactPoint;
    return [c[0], c[1]];
  });
  if (rear) {
    contacts.push([rear.left.contactPatchMm.x, rear.left.contactPatchMm.y], [rear.right.contactPatchMm.x, rear.right.contactPatchMm.y]);
  } else {
    for (const rw of layout.rearWheels) {
      if (!bodyPose(rw.body, snap, bodies, m4)) continue;
      va.set(rw.centre[0], rw.centre[1], 0).applyMatrix4(m4);
      contacts.push([va.x, va.y]);
    }
  }
  for (const [px, py] of contacts) {
    const radius = Math.hypot(px - centre.x, py - centre.y);
    if (!(radius > 1)) continue;
    const a0 = Math.atan2(py - centre.y, px - centre.x);
    const half = Math.min(Math.PI / 3, PATH_HALF_MM / radius);
    for (let k = 0; k < PATH_SEGMENTS; k += 2) {
      const t0 = a0 - half + (2 * half * k) / PATH_SEGMENTS;
      const t1 = a0 - half + (2 * half * (k + 1)) / PATH_SEGMENTS;
      va.set(centre.x + radius * Math.cos(t0), centre.y + radius * Math.sin(t0), 1);
      vb.set(centre.x + radius * Math.cos(t1), centre.y + radius * Math.sin(t1), 1);
      w.line(va, vb, VIEW_COLOUR.path);
    }
    if (radius < FAR_MM) {
      va.set(centre.x, centre.y, 1);
      vb.set(px, py, 1);
      w.line(va, vb, VIEW_COLOUR.pathRadius);
    }
  }
  if (Math.hypot(centre.x, centre.y) < FAR_MM) {
    for (const [dx, dy] of [[60, 0], [0, 60], [42, 42], [42, -42]] as const) {
      va.set(centre.x - dx, centre.y - dy, 1);
      vb.set(centre.x + dx, centre.y + dy, 1);
      w.line(va, vb, VIEW_COLOUR.path);
    }
  }
}

/** Invalid design: only the hardpoints as entered, in the "won't assemble" colour. */
function drawAsEntered(input: SceneInput, w: SceneWriter, o: SceneObjects): void {
  for (const r of hardpointRows(input.design)) {
    const p = r.value;
    if (![p?.x, p?.y, p?.z].every((c) => typeof c === 'number' && Number.isFinite(c))) continue;
    va.set(p.x, p.y, p.z);
    const selected = input.selection === r.id;
    w.joint(va, 13 * (selected ? SELECTED_SCALE : 1), selected ? VIEW_COLOUR.selection : SEVERITY_STYLE.broken.colour);
    if (selected) halo(w, va, 13 * HALO_SCALE);
  }
  for (const s of o.wheels) if (s) hideSlot(s);
  if (o.leanLabel) o.leanLabel.object.visible = false;
}
