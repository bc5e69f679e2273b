/**
 * Tolerance spread: how far self-steer, slip (toe mismatch) and the joint margins scatter
 * over built vehicles whose hardpoints are off by their manufacturing tolerances
 * (toleranceBands.ts), at the study's poses and over them all.
 *
 * Two ways, each sample's errors drawn from one seeded generator in the same order:
 *
 *   monte-carlo  every sample is a design file with its errors applied, validated, resolved
 *                and solved afresh at every pose (a sample that cannot be assembled or is no
 *                longer a valid design is counted, never measured)
 *   first-order  every sample is the design's values plus the sensitivity (central
 *                differences, each side and axis alone) times its errors: q = q0 + J e. Fast;
 *                blind to curvature and to samples that would not assemble.
 *
 * Either way the first-order estimate of each spread is reported beside it,
 *
 *   sigma_q^2 = sum_i (dq/dx_i sigma_i)^2
 *
 * (independent errors; the worst over the poses linearised at its active entry), and its terms
 * rank which tolerances drive the spread.
 */

import type { DesignFile } from '../design/types';
import { resolveDesign } from '../design/resolveDesign';
import { validateDesign } from '../design/validateDesign';
import { offsetDesignFile } from './studyCoordinates';
import { measureAtPoses, poseWords, type StudyPose } from './studyPoses';
import { activeEntry, objectiveValue, withinTolerance, type StudyObjective } from './studyQuantities';
import { centralRates, setUpStudy, DEFAULT_STEP_MM, type StudyProgress, type StudySetup } from './sensitivity';
import { DISTRIBUTION_WORDS, drawErrors, toleranceCoordinates, type Distribution, type ToleranceBands, type ToleranceCoordinate } from './toleranceBands';
import { seededRandom } from './seededRandom';
import { summarise, type SampleSummary } from './sampleStatistics';

export type SpreadMethod = 'monte-carlo' | 'first-order';

/** Most samples each method takes. */
export const MAX_SAMPLES: Record<SpreadMethod, number> = { 'monte-carlo': 20_000, 'first-order': 1_000_000 };

export interface ToleranceOptions extends StudyProgress {
  samples: number;
  seed: number;
  bands: ToleranceBands;
  distribution?: Distribution;
  method?: SpreadMethod;
  poses?: StudyPose[];
  bins?: number;
  /** Central-difference step of the sensitivity, mm (default 0.5). */
  stepMm?: number;
}

export interface SpreadDriver {
  coordinateId: string;
  point: string;
  direction: string;
  bandMm: number;
  /** d(quantity)/d(mm). */
  perMm: number;
  /** |perMm| sigma: this tolerance's share of the spread, as a standard deviation. */
  sigma: number;
  /** Its share of the first-order variance, percent. */
  sharePct: number;
}

export interface Spread {
  id: string;
  label: string;
  unit: 'deg' | '%';
  /** The pose it is measured at; null for a worst or least over all the poses. */
  pose: StudyPose | null;
  /** Limit from the design's tolerances (|value| at most, or at least for a margin); null if none. */
  tolerance: number | null;
  kind: 'worst' | 'least' | 'value';
  /** On the design as drawn. */
  nominal: number | null;
  /** Of the samples measured; null when none was. */
  summary: SampleSummary | null;
  /** Share of the measured samples inside the tolerance; null when it has none. */
  withinTolerance: number | null;
  /** sqrt(sum (dq/dx_i sigma_i)^2); null when a rate is missing. */
  firstOrderSigma: number | null;
  /** The largest terms of that sum, largest first. */
  drivers: SpreadDriver[];
}

export interface ToleranceReport {
  design: string;
  method: SpreadMethod;
  methodWords: string;
  distribution: Distribution;
  distributionWords: string;
  seed: number;
  samplesAsked: number;
  samplesDone: number;
  /** Samples measured (monte-carlo: assembled at every pose; first-order: every sample). */
  samplesMeasured: number;
  /** Monte-carlo samples that could not be assembled or were no longer valid designs, with the first few reasons. */
  notAssembled: number;
  notAssembledExamples: string[];
  stepMm: number;
  poses: StudyPose[];
  posesFrom: 'given' | 'region sample';
  regionSample: StudySetup['regionSample'];
  bands: { coordinateId: string; point: string; direction: string; bandMm: number; sigmaMm: number }[];
  /** Worst or least over all the poses. */
  overPoses: Spread[];
  /** At each pose. */
  atPoses: Spread[];
  /** Share of measured samples with every judged measure over the poses inside its tolerance. */
  withinAll: number | null;
  cancelled: boolean;
  /** Poses the design as drawn cannot be assembled at (left out). */
  notAssembledNominal: string[];
  /**
   * Coordinates whose moved copies could not be assembled at some pose, with the first reason:
   * their rates are missing there, so first-order values over those poses are absent (a
   * centre-pivot parallelogram, for one, locks when one side alone is moved).
   */
  rateFailures: string[];
  elapsedMs: { sensitivity: number; sampling: number };
}

/** What is spread: a worst or least over the poses, or one quantity at one pose. */
interface Target {
  spread: Omit<Spread, 'summary' | 'withinTolerance' | 'firstOrderSigma' | 'drivers'>;
  objective: StudyObjective | null;
  /** For a per-pose target: the value's index in the pose-major values. */
  index: number;
  values: Float64Array;
}

const SPREAD_OBJECTIVES = ['selfSteer', 'slip', 'jointMargin'];
const PER_POSE = ['selfSteer.left', 'selfSteer.right', 'slip.left', 'slip.right', 'leastJointMargin'];

function targets(setup: StudySetup, samples: number): Target[] {
  const P = setup.poses.length;
  const Q = setup.quantities.length;
  const out: Target[] = [];
  for (const o of setup.objectives) {
    if (!SPREAD_OBJECTIVES.includes(o.id) && !o.id.startsWith('joint.')) continue;
    const nominal = objectiveValue(o, setup.nominal, P, Q);
    out.push({
      spread: { id: o.id, label: `${o.label} over the poses`, unit: o.unit, pose: null, tolerance: o.tolerance, kind: o.kind, nominal: Number.isFinite(nominal) ? nominal : null },
      objective: o,
      index: -1,
      values: new Float64Array(samples).fill(NaN),
    });
  }
  setup.poses.forEach((pose, p) => {
    for (const id of PER_POSE) {
      const q = setup.quantities.findIndex((x) => x.id === id);
      const quantity = setup.quantities[q];
      const tolerance = id.startsWith('selfSteer') ? setup.objectives.find((o) => o.id === 'selfSteer')!.tolerance : id.startsWith('slip') ? setup.objectives.find((o) => o.id === 'slip')!.tolerance : setup.objectives.find((o) => o.id === 'jointMargin')!.tolerance;
      const v = setup.nominal[p * Q + q];
      out.push({
        spread: { id: `${id}@${p}`, label: `${quantity.label} at ${poseWords(pose)}`, unit: quantity.unit, pose, tolerance, kind: 'value', nominal: Number.isFinite(v) ? v : null },
        objective: null,
        index: p * Q + q,
        values: new Float64Array(samples).fill(NaN),
      });
    }
  });
  return out;
}

/** Record one sample's values (pose-major) in every target. */
function record(ts: Target[], s: number, values: ArrayLike<number>, P: number, Q: number, nominal: ArrayLike<number>): void {
  for (const t of ts) t.values[s] = t.objective ? (complete(t.objective.quantities, values, nominal, P, Q) ? objectiveValue(t.objective, values, P, Q) : NaN) : values[t.index];
}

/**
 * Whether a sample has every entry of an objective the design itself has: a worst or least
 * over fewer poses (a first-order sample whose rates are missing where a moved copy could not
 * be assembled) is another, smaller objective, not this one.
 */
function complete(quantities: readonly number[], values: ArrayLike<number>, nominal: ArrayLike<number>, P: number, Q: number): boolean {
  for (let p = 0; p < P; p++) {
    for (const q of quantities) {
      const k = p * Q + q;
      if (!Number.isNaN(nominal[k]) && Number.isNaN(values[k])) return false;
    }
  }
  return true;
}

function inside(t: Target, v: number): boolean {
  if (t.spread.tolerance === null) return true;
  if (t.objective) return withinTolerance(t.objective, v);
  return t.spread.id.startsWith('leastJointMargin') ? v >= t.spread.tolerance : Math.abs(v) <= t.spread.tolerance;
}

/** First-order sigma and drivers of a target from the rates (one per coordinate, pose-major). */
function firstOrder(t: Target, setup: StudySetup, coords: ToleranceCoordinate[], rates: Float64Array[]): Pick<Spread, 'firstOrderSigma' | 'drivers'> {
  const Q = setup.quantities.length;
  let index = t.index;
  let sign = 1;
  if (t.objective) {
    const a = activeEntry(t.objective, setup.nominal, setup.poses.length, Q);
    if (!a) return { firstOrderSigma: null, drivers: [] };
    index = a.pose * Q + a.quantity;
    sign = a.sign;
  }
  const terms = coords.map((c, i) => ({ c, perMm: sign * rates[i][index] }));
  if (terms.some((x) => !Number.isFinite(x.perMm))) return { firstOrderSigma: null, drivers: [] };
  const variance = terms.reduce((s, x) => s + (x.perMm * x.c.sigmaMm) ** 2, 0);
  const drivers = terms
    .map(({ c, perMm }) => ({
      coordinateId: c.coordinate.id,
      point: c.coordinate.point,
      direction: c.coordinate.direction,
      bandMm: c.bandMm,
      perMm,
      sigma: Math.abs(perMm) * c.sigmaMm,
      sharePct: variance > 0 ? (100 * (perMm * c.sigmaMm) ** 2) / variance : 0,
    }))
    .sort((a, b) => b.sigma - a.sigma)
    .slice(0, 5);
  return { firstOrderSigma: Math.sqrt(variance), drivers };
}

export function runToleranceSpread(file: DesignFile, options: ToleranceOptions): ToleranceReport {
  const method = options.method ?? 'monte-carlo';
  const distribution = options.distribution ?? 'normal';
  const N = options.samples;
  if (!Number.isInteger(N) || N < 1 || N > MAX_SAMPLES[method]) throw new RangeError(`samples: a whole number from 1 to ${MAX_SAMPLES[method]} for ${method}, found ${N}`);
  const stepMm = options.stepMm ?? DEFAULT_STEP_MM;
  const rng = seededRandom(options.seed);
  const coords = toleranceCoordinates(file, options.bands, distribution);
  const t0 = Date.now();
  const setup = setUpStudy(file, options.poses);
  const P = setup.poses.length;
  const Q = setup.quantities.length;
  const total = 1 + 2 * coords.length + N;
  let done = 1;
  let cancelled = false;
  const stop = () => (cancelled ||= options.shouldStop?.() ?? false);
  options.onProgress?.(done, total);

  // The sensitivity, each side and axis alone: the first-order estimate and drivers for both methods.
  const studied = coords.map((c) => c.coordinate);
  const rates: Float64Array[] = [];
  const rateFailures: string[] = [];
  for (let i = 0; i < coords.length && !stop(); i++) {
    const r = centralRates(file, studied, i, setup, stepMm);
    rates.push(r.rates);
    if (r.failures.length > 0) rateFailures.push(`${studied[i].point}, ${studied[i].direction}: ${r.failures[0]}`);
    done += 2;
    options.onProgress?.(done, total);
  }
  const t1 = Date.now();

  const ts = targets(setup, N);
  const errors = new Float64Array(coords.length);
  const linear = new Float64Array(P * Q);
  let samplesDone = 0;
  let notAssembled = 0;
  const examples: string[] = [];
  const every = method === 'first-order' ? 1000 : 1;
  for (let s = 0; s < N && rates.length === coords.length; s++) {
    if (s % every === 0 && stop()) break;
    drawErrors(coords, distribution, rng, errors);
    if (method === 'first-order') {
      linear.set(setup.nominal);
      for (let i = 0; i < coords.length; i++) {
        const e = errors[i];
        const r = rates[i];
        for (let k = 0; k < linear.length; k++) linear[k] += r[k] * e;
      }
      record(ts, s, linear, P, Q, setup.nominal);
    } else {
      const sample = offsetDesignFile(file, studied, errors);
      const valid = validateDesign(sample);
      const measured = valid.ok ? measureAtPoses(resolveDesign(sample), setup.poses, setup.quantities, { replay: setup.seeds }) : null;
      if (!valid.ok || measured!.failed.length > 0) {
        notAssembled++;
        if (examples.length < 5) examples.push(`sample ${s + 1}: ${valid.ok ? measured!.failed[0].message : `not a valid design: ${valid.issues[0].message}`}`);
      } else {
        record(ts, s, measured!.values, P, Q, setup.nominal);
      }
    }
    samplesDone++;
    if (method === 'monte-carlo' || samplesDone % every === 0) options.onProgress?.(done + samplesDone, total);
  }
  options.onProgress?.(done + samplesDone, total);

  const spreads = ts.map((t): Spread => {
    const summary = summarise(t.values.subarray(0, samplesDone), options.bins ?? 20);
    let within: number | null = null;
    if (summary && t.spread.tolerance !== null) {
      let k = 0;
      for (let s = 0; s < samplesDone; s++) if (Number.isFinite(t.values[s]) && inside(t, t.values[s])) k++;
      within = k / summary.count;
    }
    const fo = rates.length === coords.length ? firstOrder(t, setup, coords, rates) : { firstOrderSigma: null, drivers: [] };
    return { ...t.spread, summary, withinTolerance: within, ...fo };
  });
  const judged = ts.filter((t) => t.objective && SPREAD_OBJECTIVES.includes(t.objective.id));
  let measuredCount = 0;
  let allWithin = 0;
  for (let s = 0; s < samplesDone; s++) {
    if (!judged.every((t) => Number.isFinite(t.values[s]))) continue;
    measuredCount++;
    if (judged.every((t) => inside(t, t.values[s]))) allWithin++;
  }
  return {
    design: file.name,
    method,
    methodWords:
      method === 'monte-carlo'
        ? 'Monte Carlo with the full solve: each sample is the design with its errors applied, solved afresh at every pose'
        : 'first-order propagation: each sample is the design values plus the sensitivity times its errors (no solve per sample)',
    distribution,
    distributionWords: DISTRIBUTION_WORDS[distribution],
    seed: options.seed,
    samplesAsked: N,
    samplesDone,
    samplesMeasured: measuredCount,
    notAssembled,
    notAssembledExamples: examples,
    stepMm,
    poses: setup.poses,
    posesFrom: setup.posesFrom,
    regionSample: setup.regionSample,
    bands: coords.map((c) => ({ coordinateId: c.coordinate.id, point: c.coordinate.point, direction: c.coordinate.direction, bandMm: c.bandMm, sigmaMm: c.sigmaMm })),
    overPoses: spreads.filter((s) => s.pose === null),
    atPoses: spreads.filter((s) => s.pose !== null),
    withinAll: measuredCount > 0 ? allWithin / measuredCount : null,
    cancelled,
    notAssembledNominal: setup.notAssembled,
    rateFailures,
    elapsedMs: { sensitivity: t1 - t0, sampling: Date.now() - t1 },
  };
}
