/**
 * Writes the linkage's three.js objects for a pose, from core's drawing layout and the pose
 * outcome: tube and joint instances, axis, outline and path lines, tyres and contact patches.
 * LinkageModel makes the objects once; this only sets matrices, colours and visibility, with
 * module-level scratch objects (no allocation per part).
 */
import {
  Color,
  Matrix4,
  Object3D,
  Quaternion,
  Vector3,
  type BufferAttribute,
  type InstancedMesh,
  type LineSegments,
  type Mesh,
  type MeshLambertMaterial,
} from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import type { DesignFile } from '../../core/design/types';
import type { PoseOutcome } from '../model/analysisAdapter';
import { hardpointRows } from '../model/hardpoints';
import { PART_COLOUR, SEVERITY_STYLE, type Severity } from '../model/severity';
import { PART_CLASS_COLOUR, partCondition } from './drawingParts';
import { bodyIndexOf, bodyPose, place } from './scenePlacement';

export const TUBE_CAPACITY = 64;
export const JOINT_CAPACITY = 64;
export const LINE_CAPACITY = 200;
/** Half the length of each wheel's path arc drawn on the ground, mm. */
const PATH_HALF_MM = 700;
const PATH_SEGMENTS = 14;
/** Paths, radii and the turn-centre cross are left out beyond this distance, mm. */
const FAR_MM = 30000;
/** Drawn size of a joint ball relative to its radius when selected. */
const SELECTED_SCALE = 1.7;
const Y = new Vector3(0, 1, 0);
const Z = new Vector3(0, 0, 1);

/** Scratch objects. */
const va = new Vector3();
const vb = new Vector3();
const vd = new Vector3();
const q = new Quaternion();
const m4 = new Matrix4();
const dummy = new Object3D();
const colour = new Color();

export interface SceneObjects {
  tubes: InstancedMesh | null;
  joints: InstancedMesh | null;
  lines: LineSegments | null;
  /** Front tyres and their contact patches, in the layout's order of front wheels. */
  tyres: (Mesh | null)[];
  patches: (Mesh | null)[];
  rear: (Mesh | null)[];
  tyreMats: MeshLambertMaterial[];
  patchMats: MeshLambertMaterial[];
}

/** What the scene shows: the outcome of the pose, the selected hardpoint, the design (drawn as entered when nothing is solved). */
export interface SceneInput {
  outcome: PoseOutcome;
  selection: string | null;
  design: DesignFile;
}

function severityColour(s: Severity | undefined, fallback: string): string {
  return s && s !== 'none' ? SEVERITY_STYLE[s].colour : fallback;
}

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
    if (input.outcome.shown === 'requested') drawTurnPaths(pose);
    drawFrontWheels(pose, o);
    drawRearWheels(pose, o);
  } else {
    drawAsEntered(input, w, o);
  }
  w.finish();
}

function drawTubes({ input, layout, snap, bodies, w }: Pose): void {
  for (const t of layout.tubes) {
    if (!place(t.a, snap, bodies, va) || !place(t.b, snap, bodies, vb)) continue;
    w.tube(va, vb, t.radius, severityColour(partCondition(layout, input.outcome.parts, t.id), PART_CLASS_COLOUR[t.part]));
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
    const hex = selected ? PART_COLOUR.selection : out.shown === 'as-entered' ? SEVERITY_STYLE.broken.colour : severityColour(out.parts[j.id], PART_COLOUR.joint);
    w.joint(va, j.radius * (selected ? SELECTED_SCALE : 1), hex);
  }
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

/** The turn centre and each wheel's path about it (from core's slip analysis). */
function drawTurnPaths({ input, layout, snap, bodies, w }: Pose): void {
  const centre = input.outcome.analysis?.slip.turnCentreMm;
  if (!centre) return;
  const contacts: [number, number][] = layout.frontWheels.map((fw) => {
    const c = snap.wheels[fw.side].contactPoint;
    return [c[0], c[1]];
  });
  for (const rw of layout.rearWheels) {
    if (!bodyPose(rw.body, snap, bodies, m4)) continue;
    va.set(rw.centre[0], rw.centre[1], 0).applyMatrix4(m4);
    contacts.push([va.x, va.y]);
  }
  for (const [px, py] of contacts) {
    const radius = Math.hypot(px - centre.x, py - centre.y);
    if (!(radius > 1)) continue;
    const a0 = Math.atan2(py - centre.y, px - centre.x);
    const half = Math.min(Math.PI / 3, PATH_HALF_MM / radius);
    for (let k = 0; k < PATH_SEGMENTS; k++) {
      const t0 = a0 - half + (2 * half * k) / PATH_SEGMENTS;
      const t1 = a0 - half + (2 * half * (k + 1)) / PATH_SEGMENTS;
      va.set(centre.x + radius * Math.cos(t0), centre.y + radius * Math.sin(t0), 1);
      vb.set(centre.x + radius * Math.cos(t1), centre.y + radius * Math.sin(t1), 1);
      w.line(va, vb, PART_COLOUR.path);
    }
    if (radius < FAR_MM) {
      va.set(centre.x, centre.y, 1);
      vb.set(px, py, 1);
      w.line(va, vb, PART_COLOUR.pathRadius);
    }
  }
  if (Math.hypot(centre.x, centre.y) < FAR_MM) {
    for (const [dx, dy] of [[60, 0], [0, 60], [42, 42], [42, -42]] as const) {
      va.set(centre.x - dx, centre.y - dy, 1);
      vb.set(centre.x + dx, centre.y + dy, 1);
      w.line(va, vb, PART_COLOUR.path);
    }
  }
}

/** Front tyres and contact patches; a tyre within tolerance keeps its colour, its patch shows the condition. */
function drawFrontWheels({ input, layout, snap }: Pose, o: SceneObjects): void {
  const out = input.outcome;
  layout.frontWheels.forEach((fw, i) => {
    const wheel = snap.wheels[fw.side];
    const sev: Severity = out.shown === 'as-entered' ? 'broken' : (out.parts[fw.id] ?? 'none');
    const tyre = o.tyres[i];
    if (tyre) {
      tyre.visible = true;
      tyre.position.set(wheel.centre[0], wheel.centre[1], wheel.centre[2]);
      tyre.quaternion.setFromUnitVectors(Z, vd.set(wheel.spinAxis[0], wheel.spinAxis[1], wheel.spinAxis[2]).normalize());
      o.tyreMats[i].color.set(sev === 'within' ? PART_COLOUR.tyre : severityColour(sev, PART_COLOUR.tyre));
    }
    const patch = o.patches[i];
    if (patch) {
      patch.visible = true;
      const c = wheel.contactPoint;
      patch.position.set(c[0], c[1], Math.max(c[2], 0) + 1.5);
      patch.scale.set(fw.width * 0.9, fw.width * 0.9, 1);
      o.patchMats[i].color.set(severityColour(sev, PART_COLOUR.rim));
    }
  });
}

function drawRearWheels({ layout, snap, bodies }: Pose, o: SceneObjects): void {
  layout.rearWheels.forEach((rw, i) => {
    const mesh = o.rear[i];
    if (!mesh || !bodyPose(rw.body, snap, bodies, m4)) return;
    mesh.visible = true;
    mesh.position.set(rw.centre[0], rw.centre[1], rw.centre[2]).applyMatrix4(m4);
    q.setFromRotationMatrix(m4);
    mesh.quaternion.setFromUnitVectors(Z, vd.set(rw.spinAxis[0], rw.spinAxis[1], rw.spinAxis[2])).premultiply(q);
  });
}

/** Invalid design: only the hardpoints as entered, in the "won't assemble" colour. */
function drawAsEntered(input: SceneInput, w: SceneWriter, o: SceneObjects): void {
  for (const r of hardpointRows(input.design)) {
    const p = r.value;
    if (![p?.x, p?.y, p?.z].every((c) => typeof c === 'number' && Number.isFinite(c))) continue;
    va.set(p.x, p.y, p.z);
    const selected = input.selection === r.id;
    w.joint(va, 13 * (selected ? SELECTED_SCALE : 1), selected ? PART_COLOUR.selection : SEVERITY_STYLE.broken.colour);
  }
  for (const m of [...o.tyres, ...o.patches, ...o.rear]) if (m) m.visible = false;
}
