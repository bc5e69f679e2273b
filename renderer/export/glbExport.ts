/**
 * The posed mechanism as glTF 2.0 binary (.glb), through three.js's GLTFExporter: the pose on
 * screen, or a sweep of lean (the handlebar for a vehicle that does not lean) as an
 * animation.
 *
 * The animation keeps the scene of the first pose and gives every node a translation, a
 * rotation and a scale keyframe per pose (linear between them): a joint moves, a tyre moves
 * and turns, a tube (a unit cylinder) moves, turns and stretches between its two points, so
 * each keyframe shows the solved pose exactly. Poses are solved by a fresh pose session of
 * core (renderer/model/analysisAdapter.ts), not the one on screen; a pose that will not
 * close is left out of the animation and named.
 */
import { AnimationClip, QuaternionKeyframeTrack, VectorKeyframeTrack } from 'three';
import { GLTFExporter } from 'three/examples/jsm/exporters/GLTFExporter.js';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { ResolvedDesign } from '../../core/design/types';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { SAFETY_CAUTION } from '../app/SafetyCaution';
import { PoseSession } from '../model/analysisAdapter';
import type { PoseUi } from '../model/poseInputs';
import { buildMechanismScene, partPlacements, type NodeTrs } from './mechanismScene';

/** What every export says of itself (glTF `extras` of the scene). */
function sceneInfo(extra: Record<string, unknown>): Record<string, unknown> {
  return {
    units: 'metres (the design is in millimetres: divided by 1000)',
    axes: 'glTF: +X left, +Y up, +Z forward; from ISO 8855 (x forward, y left, z up) as glTF (X, Y, Z) = (y, z, x)',
    caution: SAFETY_CAUTION,
    ...extra,
  };
}

/** Pose inputs in words, for a title. */
export function poseWords(snap: PoseSnapshot): string {
  const i = snap.inputs;
  const parts = [`lean ${round(i.leanDeg)} deg`, `handlebar ${round(i.handlebarDeg)} deg`];
  if (i.heaveMm) parts.push(`heave ${round(i.heaveMm)} mm`);
  if (i.travelRightMm || i.travelLeftMm) parts.push(`travel right ${round(i.travelRightMm)} mm, left ${round(i.travelLeftMm)} mm`);
  return parts.join(', ');
}

const round = (x: number) => Math.round(x * 100) / 100;

async function toGlb(scene: Parameters<GLTFExporter['parseAsync']>[0], animations: AnimationClip[]): Promise<Uint8Array> {
  const out = await new GLTFExporter().parseAsync(scene, { binary: true, trs: true, animations, onlyVisible: false });
  if (!(out instanceof ArrayBuffer)) throw new Error('the glTF exporter did not return binary data');
  return new Uint8Array(out);
}

export interface GlbResult {
  bytes: Uint8Array;
  /** Parts the export could not place (left out), by name. */
  missing: string[];
}

/** The mechanism at one solved pose as .glb. */
export async function poseGlb(layout: DrawingLayout, snap: PoseSnapshot, designName: string): Promise<GlbResult> {
  const built = buildMechanismScene(layout, snap, `${designName} at ${poseWords(snap)}`, sceneInfo({ pose: { ...snap.inputs } }));
  return { bytes: await toGlb(built.scene, []), missing: built.missing };
}

export interface SweepPoses {
  /** What was swept, in words ('lean', 'handlebar'). */
  swept: 'lean' | 'handlebar';
  /** The input value of each pose solved (deg). */
  values: number[];
  snapshots: PoseSnapshot[];
  /** Input values (deg) whose pose would not close: left out. */
  skipped: number[];
}

/**
 * Solves `count` poses from -limit to +limit of the envelope's lean (or handlebar, when the
 * vehicle does not lean), the other inputs as in `pose`.
 */
export function sweepPoses(design: ResolvedDesign, pose: PoseUi, count: number): SweepPoses {
  const swept = design.vehicle.tilting && design.envelope.leanDeg > 0 ? 'lean' : 'handlebar';
  const limit = swept === 'lean' ? design.envelope.leanDeg : design.envelope.handlebarDeg;
  const session = new PoseSession(design, pose.contact);
  const out: SweepPoses = { swept, values: [], snapshots: [], skipped: [] };
  const n = Math.max(2, Math.floor(count));
  for (let k = 0; k < n; k++) {
    const value = -limit + (2 * limit * k) / (n - 1);
    const at: PoseUi = swept === 'lean' ? { ...pose, leanDeg: value } : { ...pose, handlebarDeg: value };
    const outcome = session.solve(at, false);
    if (outcome.reached && outcome.shown === 'requested' && outcome.snapshot) {
      out.values.push(value);
      out.snapshots.push(outcome.snapshot);
    } else {
      out.skipped.push(value);
    }
  }
  return out;
}

/** Keeps each quaternion in the same hemisphere as the one before, so linear keys turn the short way. */
function continuous(rotations: NodeTrs['rotation'][]): number[] {
  const flat: number[] = [];
  let prev: NodeTrs['rotation'] | null = null;
  for (const r of rotations) {
    const dot = prev ? prev[0] * r[0] + prev[1] * r[1] + prev[2] * r[2] + prev[3] * r[3] : 1;
    const q: NodeTrs['rotation'] = dot < 0 ? [-r[0], -r[1], -r[2], -r[3]] : r;
    flat.push(...q);
    prev = q;
  }
  return flat;
}

/** A sweep as an animated .glb: the first pose's scene, every node keyed at each pose. */
export async function sweepGlb(layout: DrawingLayout, sweep: SweepPoses, designName: string, secondsPerPose = 0.1): Promise<GlbResult> {
  if (sweep.snapshots.length < 2) throw new Error(`the ${sweep.swept} sweep closed ${sweep.snapshots.length} pose${sweep.snapshots.length === 1 ? '' : 's'}; an animation needs two or more`);
  const first = sweep.snapshots[0];
  const last = sweep.values[sweep.values.length - 1];
  const title = `${designName}, ${sweep.swept} sweep ${round(sweep.values[0])} to ${round(last)} deg`;
  const built = buildMechanismScene(layout, first, title, sceneInfo({ sweep: { input: sweep.swept, degrees: sweep.values, skipped: sweep.skipped, secondsPerPose } }));
  const placements = sweep.snapshots.map((s) => partPlacements(layout, s));
  const times = sweep.snapshots.map((_, k) => k * secondsPerPose);
  const tracks = [];
  const missing = [...built.missing];
  for (const [id, node] of built.nodes) {
    const keys = placements.map((p) => p.get(id));
    if (keys.some((k) => k === undefined)) {
      // Placed in the first pose but not in a later one: kept still, and said.
      missing.push(`${node.name} (not moved: not placed in every pose)`);
      continue;
    }
    const trs = keys as NodeTrs[];
    tracks.push(new VectorKeyframeTrack(`${node.uuid}.position`, times, trs.flatMap((t) => t.translation)));
    tracks.push(new QuaternionKeyframeTrack(`${node.uuid}.quaternion`, times, continuous(trs.map((t) => t.rotation))));
    tracks.push(new VectorKeyframeTrack(`${node.uuid}.scale`, times, trs.flatMap((t) => t.scale)));
  }
  const clip = new AnimationClip(`${sweep.swept} sweep`, times[times.length - 1], tracks);
  return { bytes: await toGlb(built.scene, [clip]), missing };
}
