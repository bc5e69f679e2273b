/**
 * The posed mechanism as a three.js scene for glTF export: one node per drawn part, named in
 * the drawing layout's words, placed from a solved pose the way the viewport places it
 * (renderer/viewport/scenePlacement.ts).
 *
 * glTF is in metres with +Y up, +Z forward and +X left; our axes are ISO 8855 in mm (x
 * forward, y left, z up). A point (x, y, z) mm is written at glTF (y, z, x) / 1000: a cyclic
 * permutation of the axes (a proper rotation) and a scale, folded into each node's own
 * translation, rotation and scale, so every node sits directly under the scene and a
 * joint's node translation is the joint's position in metres.
 *
 * Parts are the layout's tubes (a unit cylinder along its local Y, scaled to the tube's
 * radius and length), the handlebar (bar and stem, two such cylinders), joints (a unit
 * sphere scaled to the ball's radius), front and rear tyres (a torus around its local Z, the
 * spin axis) and the body outline (a closed line in the body's axes). Axis lines are a
 * viewport aid and are not written.
 */
import {
  BufferGeometry,
  CylinderGeometry,
  Float32BufferAttribute,
  LineLoop,
  Matrix4,
  Mesh,
  MeshBasicMaterial,
  MeshStandardMaterial,
  type Object3D,
  Quaternion,
  Scene,
  SphereGeometry,
  TorusGeometry,
  Vector3,
} from 'three';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { DrawingLayout, PartClass } from '../../core/mechanism/drawingLayout';
import { PART_COLOUR } from '../model/severity';
import { PART_CLASS_COLOUR } from '../viewport/drawingParts';
import { bodyIndexOf, bodyPose, place } from '../viewport/scenePlacement';

/** What kind of node a part is, for its geometry. */
export type ExportPartKind = 'tube' | 'joint' | 'frontTyre' | 'rearTyre' | 'outline';

/** One exported part: its node's name (the layout's label) and what it is drawn from. */
export interface ExportPart {
  /** Unique: the layout's part id (with `.bar` / `.stem` for the handlebar's two pieces). */
  id: string;
  name: string;
  kind: ExportPartKind;
  colour: string;
}

/** A node's placement in glTF axes and metres. */
export interface NodeTrs {
  translation: [number, number, number];
  /** Unit quaternion x, y, z, w. */
  rotation: [number, number, number, number];
  scale: [number, number, number];
}

const MM_TO_M = 1e-3;
const Y = new Vector3(0, 1, 0);
const Z = new Vector3(0, 0, 1);
/** ISO 8855 -> glTF axes: glTF (X, Y, Z) = ISO (y, z, x). */
const ISO_TO_GLTF = new Quaternion().setFromRotationMatrix(new Matrix4().set(0, 1, 0, 0, 0, 0, 1, 0, 1, 0, 0, 0, 0, 0, 0, 1));

/** A point in ISO 8855 mm as glTF metres. */
export function gltfPosition(p: readonly [number, number, number] | Vector3): [number, number, number] {
  const [x, y, z] = p instanceof Vector3 ? [p.x, p.y, p.z] : p;
  return [y * MM_TO_M, z * MM_TO_M, x * MM_TO_M];
}

/** Every part the export writes, in a fixed order (the node order). */
export function exportParts(layout: DrawingLayout): ExportPart[] {
  const parts: ExportPart[] = [];
  for (const t of layout.tubes) parts.push({ id: t.id, name: t.label, kind: 'tube', colour: PART_CLASS_COLOUR[t.part] });
  const h = layout.handlebar;
  if (h) {
    parts.push({ id: `${h.id}.bar`, name: `${h.label} bar`, kind: 'tube', colour: PART_CLASS_COLOUR[h.part] });
    parts.push({ id: `${h.id}.stem`, name: `${h.label} stem`, kind: 'tube', colour: PART_CLASS_COLOUR[h.part] });
  }
  for (const j of layout.joints) parts.push({ id: j.id, name: j.label, kind: 'joint', colour: PART_COLOUR.joint });
  for (const w of layout.frontWheels) parts.push({ id: w.id, name: w.label, kind: 'frontTyre', colour: PART_COLOUR.tyre });
  for (const w of layout.rearWheels) parts.push({ id: w.id, name: w.label, kind: 'rearTyre', colour: PART_COLOUR.tyre });
  if (layout.outline) parts.push({ id: layout.outline.id, name: layout.outline.label, kind: 'outline', colour: PART_CLASS_COLOUR[layout.outline.part as PartClass] });
  return parts;
}

// Scratch objects.
const va = new Vector3();
const vb = new Vector3();
const vd = new Vector3();
const m4 = new Matrix4();
const q = new Quaternion();
const qb = new Quaternion();

/** A placement in ISO 8855 mm turned into glTF axes and metres. */
function toGltf(position: Vector3, rotation: Quaternion, scale: readonly [number, number, number]): NodeTrs {
  const r = ISO_TO_GLTF.clone().multiply(rotation);
  return {
    translation: gltfPosition(position),
    rotation: [r.x, r.y, r.z, r.w],
    scale: [scale[0] * MM_TO_M, scale[1] * MM_TO_M, scale[2] * MM_TO_M],
  };
}

/** A unit cylinder along Y stretched from a to b with a radius (mm). */
function tubeTrs(a: Vector3, b: Vector3, radius: number): NodeTrs {
  vd.subVectors(b, a);
  const length = vd.length();
  // A tube of zero length has no direction: any rotation draws the same (empty) cylinder.
  if (length > 0) q.setFromUnitVectors(Y, vd.divideScalar(length));
  else q.identity();
  return toGltf(va.addVectors(a, b).multiplyScalar(0.5), q, [radius, length, radius]);
}

/**
 * Where each part's node sits in a solved pose (glTF axes, metres), by part id; a part the
 * snapshot cannot place (a point it lacks) is left out.
 */
export function partPlacements(layout: DrawingLayout, snap: PoseSnapshot): Map<string, NodeTrs> {
  const out = new Map<string, NodeTrs>();
  const bodies = bodyIndexOf(snap);
  for (const t of layout.tubes) {
    if (!place(t.a, snap, bodies, va) || !place(t.b, snap, bodies, vb)) continue;
    out.set(t.id, tubeTrs(va.clone(), vb.clone(), t.radius));
  }
  const h = layout.handlebar;
  if (h && bodyPose(h.body, snap, bodies, m4)) {
    // As the viewport draws it: the bar turned by its input about the body's z axis, on a stem straight down.
    const [hx, hy, hz] = h.at;
    const angle = ((snap.inputs[h.turnedBy] ?? 0) * Math.PI) / 180;
    const at = new Vector3(hx, hy, hz);
    const a = new Vector3(0, h.halfWidth, 0).applyAxisAngle(Z, angle).add(at).applyMatrix4(m4);
    const b = new Vector3(0, -h.halfWidth, 0).applyAxisAngle(Z, angle).add(at).applyMatrix4(m4);
    out.set(`${h.id}.bar`, tubeTrs(a, b, h.barRadius));
    out.set(`${h.id}.stem`, tubeTrs(at.clone().applyMatrix4(m4), new Vector3(hx, hy, hz - h.stem).applyMatrix4(m4), h.stemRadius));
  }
  for (const j of layout.joints) {
    if (!place(j.at, snap, bodies, va)) continue;
    out.set(j.id, toGltf(va, q.identity(), [j.radius, j.radius, j.radius]));
  }
  for (const w of layout.frontWheels) {
    const wheel = snap.wheels[w.side];
    if (!wheel) continue;
    va.set(wheel.centre[0], wheel.centre[1], wheel.centre[2]);
    q.setFromUnitVectors(Z, vd.set(wheel.spinAxis[0], wheel.spinAxis[1], wheel.spinAxis[2]).normalize());
    out.set(w.id, toGltf(va, q, [1, 1, 1]));
  }
  for (const w of layout.rearWheels) {
    if (!bodyPose(w.body, snap, bodies, m4)) continue;
    va.set(w.centre[0], w.centre[1], w.centre[2]).applyMatrix4(m4);
    qb.setFromRotationMatrix(m4);
    q.setFromUnitVectors(Z, vd.set(w.spinAxis[0], w.spinAxis[1], w.spinAxis[2]).normalize()).premultiply(qb);
    out.set(w.id, toGltf(va, q, [1, 1, 1]));
  }
  const o = layout.outline;
  if (o && o.points.length >= 2 && bodyPose(o.body, snap, bodies, m4)) {
    va.setFromMatrixPosition(m4);
    qb.setFromRotationMatrix(m4);
    out.set(o.id, toGltf(va, qb, [1, 1, 1]));
  }
  return out;
}

/** Plain-coloured parts carry no texture coordinates (the validator notes them as unused). */
function withoutUv(g: BufferGeometry): BufferGeometry {
  g.deleteAttribute('uv');
  return g;
}

/** The geometry of each part, in its node's local axes (sizes in the units its scale expects). */
function geometryFor(part: ExportPart, layout: DrawingLayout, shared: { tube: BufferGeometry; joint: BufferGeometry }): BufferGeometry {
  switch (part.kind) {
    case 'tube':
      return shared.tube;
    case 'joint':
      return shared.joint;
    case 'frontTyre':
    case 'rearTyre': {
      const w = [...layout.frontWheels, ...layout.rearWheels].find((x) => x.id === part.id)!;
      return withoutUv(new TorusGeometry(w.rollingRadius - w.crownRadius, w.crownRadius, 8, 36));
    }
    case 'outline': {
      const g = new BufferGeometry();
      g.setAttribute('position', new Float32BufferAttribute(layout.outline!.points.flatMap((p) => [p[0], p[1], p[2]]), 3));
      return g;
    }
  }
}

/** Sets an object's translation, rotation and scale. */
export function applyTrs(o: Object3D, t: NodeTrs): void {
  o.position.set(...t.translation);
  o.quaternion.set(...t.rotation);
  o.scale.set(...t.scale);
}

export interface MechanismScene {
  scene: Scene;
  /** The node of each part, by part id, in node order. */
  nodes: Map<string, Object3D>;
  parts: ExportPart[];
  /** Parts the pose could not place (left out of the scene), by name. */
  missing: string[];
}

/** The mechanism at a solved pose: a scene named `title`, one node per part, `extras` from `info`. */
export function buildMechanismScene(layout: DrawingLayout, snap: PoseSnapshot, title: string, info: Record<string, unknown>): MechanismScene {
  const scene = new Scene();
  scene.name = title;
  scene.userData = info;
  const shared = { tube: withoutUv(new CylinderGeometry(1, 1, 1, 12, 1, false)), joint: withoutUv(new SphereGeometry(1, 16, 10)) };
  // Lines take a plain colour (GLTFExporter reads a line's colour from a basic material).
  const materials = new Map<string, MeshStandardMaterial | MeshBasicMaterial>();
  const material = (part: ExportPart) => {
    const key = `${part.kind === 'outline' ? 'line' : 'mesh'} ${part.colour}`;
    let m = materials.get(key);
    if (!m) {
      m = part.kind === 'outline' ? new MeshBasicMaterial({ color: part.colour }) : new MeshStandardMaterial({ color: part.colour, metalness: 0.2, roughness: 0.6 });
      materials.set(key, m);
    }
    return m;
  };
  const placements = partPlacements(layout, snap);
  const parts = exportParts(layout);
  const nodes = new Map<string, Object3D>();
  const missing: string[] = [];
  for (const part of parts) {
    const trs = placements.get(part.id);
    if (!trs) {
      missing.push(part.name);
      continue;
    }
    const geometry = geometryFor(part, layout, shared);
    const node = part.kind === 'outline' ? new LineLoop(geometry, material(part)) : new Mesh(geometry, material(part));
    node.name = part.name;
    applyTrs(node, trs);
    scene.add(node);
    nodes.set(part.id, node);
  }
  return { scene, nodes, parts: parts.filter((p) => nodes.has(p.id)), missing };
}
