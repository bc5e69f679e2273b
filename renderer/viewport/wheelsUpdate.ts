/**
 * Writes the wheels of a pose: each wheel's group (solid tyre and rim, spokes and hub) at the
 * solved wheel centre with its z axis on the solved spin axis (front wheels from the
 * snapshot's wheels, rear wheels from the body carrying them), the contact mark under it
 * (shape and colour from the front wheel's status) and its soft shadow. In the Side view the
 * near wheel is drawn see-through so the linkage behind it shows. Scratch objects only.
 */
import { Matrix4, Quaternion, Vector3, type BufferGeometry, type Mesh, type MeshBasicMaterial, type MeshLambertMaterial, type Object3D } from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import type { PoseOutcome } from '../model/analysisAdapter';
import { SEVERITY_STYLE, type Severity } from '../model/severity';
import { VIEW_COLOUR } from './palette';
import { bodyIndexOf, bodyPose } from './scenePlacement';

/** Wheel slots: the layout's front wheels first (FRONT_SLOTS), then its rear wheels. */
export const WHEEL_SLOTS = 4;
export const FRONT_SLOTS = 2;
/** Opacity of the near wheel in the Side view. */
export const NEAR_WHEEL_OPACITY = 0.22;

export interface WheelSlot {
  /** Parent of the tyre and wheel meshes, which are built about +z at the origin. */
  group: Object3D;
  tyreMat: MeshLambertMaterial;
  rimMat: MeshLambertMaterial;
  mark: Mesh;
  markMat: MeshBasicMaterial;
  shadow: Mesh;
}

export interface WheelsInput {
  outcome: PoseOutcome;
  layout: DrawingLayout;
  snap: PoseSnapshot;
  /** The view shown ('side' draws the near wheel see-through). */
  view: string | null;
}

const Z = new Vector3(0, 0, 1);
const centre = new Vector3();
const axis = new Vector3();
const contact = new Vector3();
const fwd = new Vector3();
const down = new Vector3();
const m4 = new Matrix4();
const q = new Quaternion();

function setSeeThrough(mat: MeshLambertMaterial, on: boolean): void {
  if (mat.transparent === on) return;
  mat.transparent = on;
  mat.opacity = on ? NEAR_WHEEL_OPACITY : 1;
  mat.depthWrite = !on;
  mat.needsUpdate = true;
}

/** Where a torus tyre (rolling radius r, crown radius c) touches flat ground: the lowest point of its crown circle, straight down by c. */
export function torusContact(c: Vector3, a: Vector3, r: number, crown: number, out: Vector3): Vector3 {
  down.set(0, 0, -1);
  down.addScaledVector(a, -down.dot(a));
  const len = down.length();
  if (len < 1e-9) return out.set(c.x, c.y, c.z - r); // wheel lying flat: no such point; under the centre
  down.multiplyScalar(1 / len);
  return out.copy(c).addScaledVector(down, r - crown).add(fwd.set(0, 0, -crown));
}

function place(slot: WheelSlot, sev: Severity, tyreHex: string, size: { r: number; crown: number; width: number }, nearInSide: boolean, markGeo: Record<Severity, BufferGeometry>, contactAt: Vector3 | null): void {
  const g = slot.group;
  g.visible = true;
  g.position.copy(centre);
  g.quaternion.setFromUnitVectors(Z, axis);
  g.updateMatrix();
  slot.tyreMat.color.set(tyreHex);
  setSeeThrough(slot.tyreMat, nearInSide);
  setSeeThrough(slot.rimMat, nearInSide);
  const p = contactAt ?? torusContact(centre, axis, size.r, size.crown, contact);
  // Heading on the ground: forward is the spin axis crossed with up.
  fwd.crossVectors(axis, Z);
  const heading = fwd.lengthSq() > 1e-12 ? Math.atan2(fwd.y, fwd.x) : 0;
  const mark = slot.mark;
  mark.visible = true;
  mark.geometry = markGeo[sev];
  mark.position.set(p.x, p.y, Math.max(p.z, 0) + 1.5);
  mark.rotation.set(0, 0, heading);
  const d = Math.max(70, 1.7 * size.width);
  mark.scale.set(d, d, 1);
  slot.markMat.color.set(sev === 'none' ? VIEW_COLOUR.groundMark : SEVERITY_STYLE[sev].colour);
  const shadow = slot.shadow;
  shadow.visible = true;
  shadow.position.set(centre.x, centre.y, 0.5);
  shadow.rotation.set(0, 0, heading);
  // The wheel seen from straight above: its length along the heading, its lean widens it.
  shadow.scale.set(2.1 * size.r, Math.max(2.6 * size.width, 2 * size.r * Math.abs(axis.z) + 1.6 * size.width), 1);
}

/** Places every wheel slot for the pose; slots without a wheel are hidden. */
export function drawWheels({ outcome, layout, snap, view }: WheelsInput, slots: readonly (WheelSlot | null)[], markGeo: Record<Severity, BufferGeometry>): void {
  const used = new Set<number>();
  layout.frontWheels.slice(0, FRONT_SLOTS).forEach((fw, i) => {
    const slot = slots[i];
    const wheel = snap.wheels[fw.side];
    if (!slot || !wheel) return;
    centre.set(wheel.centre[0], wheel.centre[1], wheel.centre[2]);
    axis.set(wheel.spinAxis[0], wheel.spinAxis[1], wheel.spinAxis[2]).normalize();
    const sev: Severity = outcome.shown === 'as-entered' ? 'broken' : (outcome.parts[fw.id] ?? 'none');
    const tyreHex = sev === 'within' || sev === 'none' ? VIEW_COLOUR.tyre : SEVERITY_STYLE[sev].colour;
    contact.set(wheel.contactPoint[0], wheel.contactPoint[1], wheel.contactPoint[2]);
    place(slot, sev, tyreHex, { r: fw.rollingRadius, crown: fw.crownRadius, width: fw.width }, view === 'side' && centre.y > 1, markGeo, contact);
    used.add(i);
  });
  const bodies = bodyIndexOf(snap);
  layout.rearWheels.slice(0, WHEEL_SLOTS - FRONT_SLOTS).forEach((rw, k) => {
    const i = FRONT_SLOTS + k;
    const slot = slots[i];
    if (!slot || !bodyPose(rw.body, snap, bodies, m4)) return;
    centre.set(rw.centre[0], rw.centre[1], rw.centre[2]).applyMatrix4(m4);
    q.setFromRotationMatrix(m4);
    axis.set(rw.spinAxis[0], rw.spinAxis[1], rw.spinAxis[2]).applyQuaternion(q).normalize();
    place(slot, 'none', VIEW_COLOUR.tyre, { r: rw.rollingRadius, crown: rw.crownRadius, width: rw.width }, view === 'side' && centre.y > 1, markGeo, null);
    used.add(i);
  });
  slots.forEach((s, i) => {
    if (s && !used.has(i)) hideSlot(s);
  });
}

export function hideSlot(s: WheelSlot): void {
  s.group.visible = false;
  s.mark.visible = false;
  s.shadow.visible = false;
}
