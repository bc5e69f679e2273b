/**
 * The poses a study measures a design at, and measuring it there.
 *
 * Default: a coarse sample of the operating region, the cells of a 5 x 5 lean x handlebar
 * grid over the design's envelope (each axis -max..max, including 0) at zero travel that lie
 * in the region (ridingRegion.ts, judged on the nominal design by the turn each cell makes),
 * so the study looks where the vehicle is ridden and not at countersteer corners. A vehicle
 * that does not tilt takes lean 0 only.
 *
 * Each pose is solved by the pose engine (one engine per design, fresh for every perturbed
 * copy, poses in serpentine order so each solve starts next to its answer), with the relative
 * measures (self-steer, steering-ratio change) from the engine's own extra solves.
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs, type PoseInputs } from '../mechanism/MechanismGraph';
import { PoseEngine } from '../analysis/PoseEngine';
import { inRidingRegion, turnOf } from '../analysis/ridingRegion';
import type { PoseAnalysis } from '../analysis/analysisTypes';
import type { SeedUse } from '../analysis/solveSeeds';
import type { StudyQuantity } from './studyQuantities';

/** A pose of a study: tyres on the ground, travel lowering the frame (heave = -travel), as sweeps do. */
export interface StudyPose {
  leanDeg: number;
  handlebarDeg: number;
  travelMm: number;
}

/** A pose the design cannot take (the CLI exits 2 on it). */
export class StudyInputError extends Error {}

export function studyPoseInputs(p: StudyPose): PoseInputs {
  return { ...zeroInputs(), leanDeg: p.leanDeg, handlebarDeg: p.handlebarDeg, heaveMm: -p.travelMm };
}

export function poseWords(p: StudyPose): string {
  const f = (x: number) => String(Math.round(x * 100) / 100);
  return `lean ${f(p.leanDeg)} deg, handlebar ${f(p.handlebarDeg)} deg${p.travelMm !== 0 ? `, travel ${f(p.travelMm)} mm` : ''}`;
}

/** Refuse poses the design cannot be asked for (lean on a vehicle that does not tilt, travel on a centre-pivot pair on the ground). */
export function checkStudyPoses(design: ResolvedDesign, poses: readonly StudyPose[]): void {
  if (poses.length === 0) throw new StudyInputError('no poses to study');
  for (const p of poses) {
    if (![p.leanDeg, p.handlebarDeg, p.travelMm].every(Number.isFinite)) throw new StudyInputError(`a pose has a value that is not a finite number`);
    if (!design.vehicle.tilting && p.leanDeg !== 0) throw new StudyInputError(`the design does not tilt: lean must be 0 (${poseWords(p)})`);
    if (design.frontEnd.kind === 'centrePivot' && p.travelMm !== 0) {
      throw new StudyInputError(`a centre-pivot front end on the ground has its ride height set by the linkage: travel must be 0 (${poseWords(p)})`);
    }
  }
}

/** n values -max..max, evenly spaced (n odd includes 0). */
function spread(max: number, n: number): number[] {
  if (!(max > 0) || n < 2) return [0];
  return Array.from({ length: n }, (_, i) => -max + (2 * max * i) / (n - 1));
}

export interface RegionSample {
  /** Poses in the operating region, in serpentine order. */
  poses: StudyPose[];
  /** Grid cells left out: outside the region, or not assembled on the nominal design. */
  outside: number;
  notAssembled: number;
}

/** The cells of an n x n lean x handlebar grid over the envelope, at zero travel, that lie in the operating region. */
export function regionSamplePoses(design: ResolvedDesign, n = 5): RegionSample {
  const leans = design.vehicle.tilting ? spread(design.envelope.leanDeg, n) : [0];
  const bars = spread(design.envelope.handlebarDeg, n);
  const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' }, { findings: false });
  const poses: StudyPose[] = [];
  let outside = 0;
  let notAssembled = 0;
  leans.forEach((leanDeg, row) => {
    for (let k = 0; k < bars.length; k++) {
      const handlebarDeg = bars[row % 2 === 0 ? k : bars.length - 1 - k];
      const pose = { leanDeg, handlebarDeg, travelMm: 0 };
      // The turn a pose makes needs no relative measures: the solve alone decides the region.
      const a = engine.solve(studyPoseInputs(pose), { relatives: false }).analysis;
      if (!a) {
        notAssembled++;
        continue;
      }
      const turn = turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm);
      if (inRidingRegion(leanDeg, turn, design.riding, design.vehicle.tilting).inside) poses.push(pose);
      else outside++;
    }
  });
  return { poses, outside, notAssembled };
}

/** Values of the quantities at the poses: pose-major, NaN where not available; and the poses that failed. */
export interface Measured {
  values: Float64Array;
  failed: { pose: number; message: string }[];
}

/**
 * Solve the design at each pose with a fresh engine and read every quantity. With seeds, the
 * engine starts each solve from another design's solution of the same pose (replay) and/or
 * keeps its own for later copies (record): solveSeeds.ts.
 */
export function measureAtPoses(design: ResolvedDesign, poses: readonly StudyPose[], quantities: readonly StudyQuantity[], seeds?: SeedUse): Measured {
  const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' }, { findings: false, seeds });
  const Q = quantities.length;
  const values = new Float64Array(poses.length * Q).fill(NaN);
  const failed: Measured['failed'] = [];
  poses.forEach((p, i) => {
    const r = engine.solve(studyPoseInputs(p));
    if (!r.analysis) {
      failed.push({ pose: i, message: `${poseWords(p)}: ${r.result.message}` });
      return;
    }
    readQuantities(r.analysis, quantities, values, i * Q);
  });
  return { values, failed };
}

function readQuantities(a: PoseAnalysis, quantities: readonly StudyQuantity[], out: Float64Array, offset: number): void {
  for (let q = 0; q < quantities.length; q++) {
    const v = quantities[q].read(a);
    out[offset + q] = v === null || !Number.isFinite(v) ? NaN : v;
  }
}
