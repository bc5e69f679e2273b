/**
 * Sensitivity: how much each objective and each joint margin moves per mm of each hardpoint
 * coordinate, which way, ranked by effect.
 *
 * Central differences of the full solve: the design file's coordinate is moved by +h and -h
 * (default h = 0.5 mm), each copy is resolved and solved afresh at the same poses by its own
 * pose engine (from its own design pose, by continuation), and
 *
 *   dq/dx ~ (q(x + h) - q(x - h)) / 2h        (error of order h^2 q''' / 6)
 *
 * The same at h/2 checks that h lies in the linear range: the two estimates differ by about
 * h^2 q''' / 8, so when they agree within LINEAR_REL (or both are below LINEAR_ABS per mm)
 * the rate at h is trusted; otherwise it is flagged as not linear (a kink, a worst pose that
 * changes, a joint near its limit).
 *
 * Coordinates are ranked by the largest rate of any quantity a tolerance judges (self-steer,
 * slip, ratio change, joint margin) at any pose, as a share of that tolerance: what 1 mm does
 * at the pose where it does most, which stays meaningful where the worst value over the poses
 * has a kink.
 *
 * Plain data in (a design file, poses, options), plain data out; progress reported after
 * every perturbed copy solved, and `shouldStop()` asked before each one (a stopped study
 * returns the coordinates finished so far, marked cancelled).
 */

import type { DesignFile } from '../design/types';
import { SeedBook } from '../analysis/solveSeeds';
import { resolveDesign } from '../design/resolveDesign';
import { offsetDesignFile, studyCoordinates, type SideMode, type StudyCoordinate } from './studyCoordinates';
import { StudyInputError, checkStudyPoses, measureAtPoses, poseWords, regionSamplePoses, type StudyPose } from './studyPoses';
import { activeEntry, objectiveValue, studyObjectives, studyQuantities, type StudyObjective, type StudyQuantity } from './studyQuantities';

export const DEFAULT_STEP_MM = 0.5;
/** Relative agreement of the rates at h and h/2 taken as linear. */
export const LINEAR_REL = 0.05;
/** Rates below this (per mm, in the quantity's unit) agree whatever their ratio: the solver closes loops to 1e-9 mm. */
export const LINEAR_ABS = 1e-5;

/** The objectives a coordinate's sentence and score use (each has a tolerance in the design). */
export const HEADLINE_OBJECTIVES = ['selfSteer', 'slip', 'ratioChange', 'jointMargin'] as const;

export interface StudyProgress {
  onProgress?: (done: number, total: number) => void;
  shouldStop?: () => boolean;
}

export interface SensitivityOptions extends StudyProgress {
  /** Poses to study (default: the region sample, studyPoses.ts). */
  poses?: StudyPose[];
  /** Central-difference step h, mm (default 0.5). */
  stepMm?: number;
  /** Mirrored pairs together (default) or each side alone. */
  sides?: SideMode;
  /** Check the linear range with a second difference at h/2 (default true). */
  linearityCheck?: boolean;
  /** Study only these coordinates (ids as studyCoordinates gives them, e.g. 'upright.wheelCentre:z'); default all. */
  coordinateIds?: string[];
}

export interface ObjectiveRate {
  /** d(objective)/d(mm) at step h; null when a perturbed copy could not be measured at the objective's pose. */
  perMm: number | null;
  /** The same at h/2; null when not checked or not measured. */
  halfStepPerMm: number | null;
  /** Whether the two agree (see LINEAR_REL, LINEAR_ABS); null when not checked. */
  linear: boolean | null;
  /**
   * The largest rate of any of the objective's quantities at any pose (signed, per mm) and
   * where: smooth even where the worst passes from one pose or wheel to another within the step.
   */
  largestPoseRate: number | null;
  largestPoseWhere: string | null;
}

export interface CoordinateSensitivity {
  coordinate: StudyCoordinate;
  /** By objective id. */
  objectives: Record<string, ObjectiveRate>;
  /** d(quantity)/d(mm) at step h, per pose (rows) and quantity (columns); null where not measured. */
  perPose: (number | null)[][];
  /** Largest |rate| of a headline objective's quantities at any pose / its tolerance: the share of a tolerance 1 mm uses. */
  score: number;
  /** Poses a perturbed copy could not be assembled at. */
  failures: string[];
  /** 'move the ... 1 mm up: worst self-steer +0.041 deg, ...' */
  sentence: string;
}

export interface ObjectiveSummary {
  id: string;
  label: string;
  unit: 'deg' | '%';
  kind: 'worst' | 'least';
  tolerance: number | null;
  /** Its value on the design as it is; null when not measured. */
  value: number | null;
  /** Where that value is found, in words. */
  where: string | null;
}

export interface SensitivityReport {
  design: string;
  method: string;
  stepMm: number;
  halfStepMm: number | null;
  sides: SideMode;
  poses: StudyPose[];
  posesFrom: 'given' | 'region sample';
  /** Grid cells of the region sample left out: outside the region, or not assembled. */
  regionSample: { outside: number; notAssembled: number } | null;
  quantities: { id: string; label: string; unit: 'deg' | '%' }[];
  /** Quantities of the design as it is, per pose; null where not measured. */
  nominal: (number | null)[][];
  objectives: ObjectiveSummary[];
  /** Ranked by score, largest first. */
  coordinates: CoordinateSensitivity[];
  /** Given poses the design as it is cannot be assembled at (left out of the study). */
  notAssembled: string[];
  cancelled: boolean;
  /** Designs solved (the nominal and every perturbed copy). */
  designsSolved: number;
  elapsedMs: number;
}

/** What a study measures, set up once from the nominal design. */
export interface StudySetup {
  poses: StudyPose[];
  quantities: StudyQuantity[];
  objectives: StudyObjective[];
  nominal: Float64Array;
  notAssembled: string[];
  posesFrom: 'given' | 'region sample';
  regionSample: { outside: number; notAssembled: number } | null;
  /** The nominal design's solutions, to start the solves of every moved copy from (solveSeeds.ts). */
  seeds: SeedBook;
}

/** Poses (given or the region sample), quantities, objectives and the nominal values; poses the nominal cannot take are dropped and named. */
export function setUpStudy(file: DesignFile, given: StudyPose[] | undefined): StudySetup {
  const design = resolveDesign(file);
  let poses: StudyPose[];
  let regionSample: StudySetup['regionSample'] = null;
  if (given) {
    checkStudyPoses(design, given);
    poses = given;
  } else {
    const s = regionSamplePoses(design);
    poses = s.poses;
    regionSample = { outside: s.outside, notAssembled: s.notAssembled };
  }
  if (poses.length === 0) throw new StudyInputError('no pose of the region sample lies in the operating region: give poses with --poses');
  const quantities = studyQuantities(design);
  const seeds = new SeedBook();
  const measured = measureAtPoses(design, poses, quantities, { record: seeds });
  const bad = new Set(measured.failed.map((f) => f.pose));
  const Q = quantities.length;
  const keep = poses.flatMap((_, i) => (bad.has(i) ? [] : [i]));
  const nominal = new Float64Array(keep.length * Q);
  keep.forEach((p, k) => nominal.set(measured.values.subarray(p * Q, p * Q + Q), k * Q));
  return {
    poses: keep.map((i) => poses[i]),
    quantities,
    objectives: studyObjectives(quantities, design.tolerances),
    nominal,
    notAssembled: measured.failed.map((f) => f.message),
    posesFrom: given ? 'given' : 'region sample',
    regionSample,
    seeds,
  };
}

/** Rates per mm for one coordinate at one step: of every quantity at every pose (pose-major) and of every objective; NaN where not measured. */
export interface CoordinateRates {
  rates: Float64Array;
  objectiveRates: Float64Array;
  failures: string[];
}

/**
 * Central differences for one coordinate at step h: of every quantity at every pose, and of
 * every objective (its worst or least value over the poses, found afresh on each copy, so a
 * worst pose that changes within the step shows as a rate that is not linear).
 */
export function centralRates(file: DesignFile, coords: readonly StudyCoordinate[], index: number, setup: StudySetup, stepMm: number): CoordinateRates {
  const offsets = new Float64Array(coords.length);
  const measure = (d: number) => {
    offsets[index] = d;
    return measureAtPoses(resolveDesign(offsetDesignFile(file, coords, offsets)), setup.poses, setup.quantities, { replay: setup.seeds });
  };
  const plus = measure(stepMm);
  const minus = measure(-stepMm);
  const rates = new Float64Array(plus.values.length);
  for (let i = 0; i < rates.length; i++) rates[i] = (plus.values[i] - minus.values[i]) / (2 * stepMm);
  const P = setup.poses.length;
  const Q = setup.quantities.length;
  // An objective over fewer poses than the nominal's is not the same objective: no rate.
  const complete = plus.failed.length === 0 && minus.failed.length === 0;
  const objectiveRates = new Float64Array(setup.objectives.length).fill(NaN);
  if (complete) {
    setup.objectives.forEach((o, k) => {
      objectiveRates[k] = (objectiveValue(o, plus.values, P, Q) - objectiveValue(o, minus.values, P, Q)) / (2 * stepMm);
    });
  }
  const failures = [...plus.failed.map((f) => `moved +${stepMm} mm: ${f.message}`), ...minus.failed.map((f) => `moved -${stepMm} mm: ${f.message}`)];
  return { rates, objectiveRates, failures };
}

const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

const rowsOf = (flat: Float64Array, P: number, Q: number): (number | null)[][] =>
  Array.from({ length: P }, (_, p) => Array.from(flat.subarray(p * Q, p * Q + Q), (v) => (Number.isFinite(v) ? v : null)));

export function isLinear(a: number, b: number): boolean {
  return Math.abs(a - b) <= LINEAR_REL * Math.max(Math.abs(a), Math.abs(b)) || Math.max(Math.abs(a), Math.abs(b)) < LINEAR_ABS;
}

export function runSensitivity(file: DesignFile, options: SensitivityOptions = {}): SensitivityReport {
  const t0 = Date.now();
  const h = options.stepMm ?? DEFAULT_STEP_MM;
  if (!(h > 0) || !Number.isFinite(h)) throw new RangeError(`the step must be a positive number of mm, found ${h}`);
  const check = options.linearityCheck ?? true;
  const sides = options.sides ?? 'together';
  const setup = setUpStudy(file, options.poses);
  const all = studyCoordinates(file, sides);
  const coords = options.coordinateIds ? all.filter((c) => options.coordinateIds!.includes(c.id)) : all;
  const unknown = (options.coordinateIds ?? []).filter((id) => !all.some((c) => c.id === id));
  if (unknown.length > 0) throw new RangeError(`not a hardpoint coordinate of this design: ${unknown.join(', ')}`);
  const P = setup.poses.length;
  const Q = setup.quantities.length;
  const perCoordinate = check ? 4 : 2;
  const total = 1 + coords.length * perCoordinate;
  let done = 1;
  options.onProgress?.(done, total);
  const results: CoordinateSensitivity[] = [];
  let cancelled = false;
  for (let i = 0; i < coords.length; i++) {
    if (options.shouldStop?.()) {
      cancelled = true;
      break;
    }
    const full = centralRates(file, coords, i, setup, h);
    done += 2;
    options.onProgress?.(done, total);
    const half = check ? centralRates(file, coords, i, setup, h / 2) : null;
    if (half) {
      done += 2;
      options.onProgress?.(done, total);
    }
    const objectives: Record<string, ObjectiveRate> = {};
    setup.objectives.forEach((o, k) => {
      const perMm = finiteOrNull(full.objectiveRates[k]);
      const halfStepPerMm = half ? finiteOrNull(half.objectiveRates[k]) : null;
      const linear = perMm === null || halfStepPerMm === null ? null : isLinear(perMm, halfStepPerMm);
      objectives[o.id] = { perMm, halfStepPerMm, linear, ...largestPoseRate(o, setup, full.rates) };
    });
    const c = coords[i];
    results.push({
      coordinate: c,
      objectives,
      perPose: rowsOf(full.rates, P, Q),
      score: score(setup.objectives, objectives),
      failures: [...full.failures, ...(half?.failures ?? [])],
      sentence: sensitivitySentence(c, setup.objectives, objectives),
    });
  }
  results.sort((a, b) => b.score - a.score);
  return {
    design: file.name,
    method:
      `central differences of the full solve: each coordinate moved +-${h} mm in the design file, the copy resolved and solved afresh ` +
      `at every pose${check ? `; checked against the same at +-${h / 2} mm (linear when within ${LINEAR_REL * 100} %)` : ''}`,
    stepMm: h,
    halfStepMm: check ? h / 2 : null,
    sides,
    poses: setup.poses,
    posesFrom: setup.posesFrom,
    regionSample: setup.regionSample,
    quantities: setup.quantities.map((q) => ({ id: q.id, label: q.label, unit: q.unit })),
    nominal: rowsOf(setup.nominal, P, Q),
    objectives: setup.objectives.map((o) => summarise(o, setup)),
    coordinates: results,
    notAssembled: setup.notAssembled,
    cancelled,
    designsSolved: done,
    elapsedMs: Date.now() - t0,
  };
}

function largestPoseRate(o: StudyObjective, setup: StudySetup, rates: Float64Array): Pick<ObjectiveRate, 'largestPoseRate' | 'largestPoseWhere'> {
  const Q = setup.quantities.length;
  let best: { r: number; p: number; q: number } | null = null;
  for (let p = 0; p < setup.poses.length; p++) {
    for (const q of o.quantities) {
      const r = rates[p * Q + q];
      if (Number.isFinite(r) && (!best || Math.abs(r) > Math.abs(best.r))) best = { r, p, q };
    }
  }
  if (!best) return { largestPoseRate: null, largestPoseWhere: null };
  return { largestPoseRate: best.r, largestPoseWhere: `${setup.quantities[best.q].label} at ${poseWords(setup.poses[best.p])}` };
}

function score(objectives: readonly StudyObjective[], rates: Record<string, ObjectiveRate>): number {
  let s = 0;
  for (const o of objectives) {
    const r = rates[o.id]?.largestPoseRate;
    if ((HEADLINE_OBJECTIVES as readonly string[]).includes(o.id) && o.tolerance && r !== null && r !== undefined) s = Math.max(s, Math.abs(r) / o.tolerance);
  }
  return s;
}

function summarise(o: StudyObjective, setup: StudySetup): ObjectiveSummary {
  const Q = setup.quantities.length;
  const a = activeEntry(o, setup.nominal, setup.poses.length, Q);
  return {
    id: o.id,
    label: o.label,
    unit: o.unit,
    kind: o.kind,
    tolerance: o.tolerance,
    value: a ? (o.kind === 'worst' ? Math.abs(a.value) : a.value) : null,
    where: a ? `${setup.quantities[a.quantity].label} at ${poseWords(setup.poses[a.pose])}` : null,
  };
}

/** A signed rate with its unit, to a precision that shows small rates: '+0.041 deg', '-0.0032 deg'. */
export function signedRate(x: number, unit: string): string {
  const digits = Math.abs(x) >= 0.01 ? 3 : 4;
  const t = x.toFixed(digits);
  const zero = Number(t) === 0;
  return `${zero ? '' : x > 0 ? '+' : ''}${zero ? (0).toFixed(digits) : t} ${unit}`;
}

/** 'move the lower wishbone outer joints (both sides) 1 mm up: worst self-steer +0.041 deg, ...' */
export function sensitivitySentence(c: StudyCoordinate, objectives: readonly StudyObjective[], rates: Record<string, ObjectiveRate>): string {
  const parts: string[] = [];
  for (const id of HEADLINE_OBJECTIVES) {
    const o = objectives.find((x) => x.id === id);
    if (!o) continue;
    const r = rates[id];
    const kink =
      r.linear === false
        ? ` (not linear over the step${r.largestPoseRate !== null ? `; at one pose up to ${signedRate(r.largestPoseRate, o.unit)}` : ''})`
        : '';
    parts.push(`${o.label} ${r.perMm === null ? 'not measured' : signedRate(r.perMm, o.unit)}${kink}`);
  }
  return `move the ${c.point} 1 mm ${c.direction}: ${parts.join(', ')}`;
}
