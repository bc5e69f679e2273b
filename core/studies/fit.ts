/**
 * Fit to a built vehicle: the hardpoint coordinates the user says may be off are moved until the
 * model reproduces measurements taken on the prototype (measurementCsv.ts), by weighted least
 * squares with ml-levenberg-marquardt (Jacobian: forward differences of the full solve).
 *
 * Uncertainty, after the fit (Press, Teukolsky, Vetterling & Flannery, Numerical Recipes, 3rd
 * ed., 15.4-15.5: the covariance of a least-squares fit is (J^T W J)^-1, scaled by the residual
 * variance s^2 = sum(w r^2) / (m - n) when the weights are only relative):
 *   standard error of variable j = sqrt(s^2 [(J^T W J)^-1]_jj).
 * What the data cannot see: the eigen-decomposition of the column-scaled J^T W J (the squares of
 * the singular values of the scaled, weighted Jacobian). An eigenvalue below IDENTIFIABLE_SHARE
 * of the largest is a direction the measurements do not constrain; each variable with a large
 * part in such a direction is named, and its move and standard error are reported as absent.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import type { DesignFile } from '../design/types';
import { resolveDesign } from '../design/resolveDesign';
import type { PoseAnalysis } from '../analysis/analysisTypes';
import { measureAtPoses, poseWords, type StudyPose } from './studyPoses';
import type { StudyQuantity } from './studyQuantities';
import type { Measurement, MeasuredQuantity } from './measurementCsv';
import type { ResolvedVariable } from './tunePlan';
import { applyTuneOffsets } from './tuneVariables';

/** Finite-difference step of the fit's Jacobian, mm. */
export const FIT_STEP_MM = 0.02;
/** An eigenvalue of the scaled normal matrix below this share of the largest: not identifiable. */
export const IDENTIFIABLE_SHARE = 1e-8;
/** Residual given to a measurement at a pose that does not assemble, deg (keeps the fit away). */
const NOT_ASSEMBLED_DEG = 30;

export interface FitOptions {
  maxIterations?: number;
  onProgress?: (done: number, total: number) => void;
}

export interface FittedVariable {
  id: string;
  words: string;
  /** How far the fit moved it, mm; null when the data cannot pin it down. */
  movedMm: number | null;
  /** One standard error of that move, mm; null when not identifiable or with no spare measurements. */
  standardErrorMm: number | null;
  identifiable: boolean;
}

export interface FittedMeasurement {
  line: number;
  pose: string;
  side: 'left' | 'right';
  quantity: MeasuredQuantity;
  measured: number;
  /** The fitted design's value; null where it did not assemble. */
  modelled: number | null;
  before: number | null;
  residual: number | null;
}

export interface FitReport {
  fitted: DesignFile;
  variables: FittedVariable[];
  measurements: FittedMeasurement[];
  /** Weighted root-mean-square residual before and after, deg. */
  rmsBeforeDeg: number;
  rmsAfterDeg: number;
  iterations: number;
  evaluations: number;
  seconds: number;
  /** Sentences for the reader: points the data cannot see, poses that did not assemble. */
  notes: string[];
}

const READERS: Record<MeasuredQuantity, (a: PoseAnalysis, side: 'left' | 'right') => number> = {
  toe_deg: (a, s) => a.wheels[s].toeDeg,
  camber_deg: (a, s) => a.wheels[s].camberDeg,
  road_wheel_angle_deg: (a, s) => a.wheels[s].steerDeg,
};

const key = (p: StudyPose) => `${p.leanDeg}|${p.handlebarDeg}|${p.travelMm}`;

/** The model: each measurement's value for a design moved by the variables' offsets. */
class FitModel {
  readonly poses: StudyPose[] = [];
  private readonly poseOf: number[] = [];
  private readonly quantityOf: number[] = [];
  private readonly quantities: StudyQuantity[] = [];
  evaluations = 0;
  failed: string[] = [];

  constructor(
    private readonly file: DesignFile,
    private readonly variables: readonly ResolvedVariable[],
    readonly measurements: readonly Measurement[],
  ) {
    const poseIndex = new Map<string, number>();
    for (const q of Object.keys(READERS) as MeasuredQuantity[]) {
      for (const side of ['left', 'right'] as const) this.quantities.push({ id: `${q}.${side}`, label: `${q} ${side}`, unit: 'deg', read: (a) => READERS[q](a, side) });
    }
    for (const m of measurements) {
      if (!poseIndex.has(key(m.pose))) {
        poseIndex.set(key(m.pose), this.poses.length);
        this.poses.push(m.pose);
      }
      this.poseOf.push(poseIndex.get(key(m.pose))!);
      this.quantityOf.push(this.quantities.findIndex((q) => q.id === `${m.quantity}.${m.side}`));
    }
  }

  designAt(offsets: ArrayLike<number>): DesignFile {
    return applyTuneOffsets(this.file, this.variables, offsets);
  }

  /** Values of every measurement (NaN where its pose did not assemble). */
  values(offsets: ArrayLike<number>): Float64Array {
    this.evaluations++;
    const measured = measureAtPoses(resolveDesign(this.designAt(offsets)), this.poses, this.quantities);
    this.failed = measured.failed.map((f) => f.message);
    const Q = this.quantities.length;
    return Float64Array.from(this.measurements, (_, i) => measured.values[this.poseOf[i] * Q + this.quantityOf[i]]);
  }
}

/** Symmetric eigen-decomposition by cyclic Jacobi rotations (Numerical Recipes 11.1); small n. */
export function symmetricEigen(a: number[][]): { values: number[]; vectors: number[][] } {
  const n = a.length;
  const A = a.map((r) => r.slice());
  const V: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += A[p][q] ** 2;
    if (off < 1e-30) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        if (Math.abs(A[p][q]) < 1e-300) continue;
        const theta = (A[q][q] - A[p][p]) / (2 * A[p][q]);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = A[k][p];
          const akq = A[k][q];
          A[k][p] = c * akp - s * akq;
          A[k][q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = A[p][k];
          const aqk = A[q][k];
          A[p][k] = c * apk - s * aqk;
          A[q][k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = V[k][p];
          const vkq = V[k][q];
          V[k][p] = c * vkp - s * vkq;
          V[k][q] = s * vkp + c * vkq;
        }
      }
    }
  }
  return { values: A.map((r, i) => r[i]), vectors: V };
}

function jacobian(model: FitModel, at: Float64Array, base: Float64Array): number[][] {
  return Array.from(at, (_, j) => {
    const moved = Float64Array.from(at);
    moved[j] += FIT_STEP_MM;
    const v = model.values(moved);
    return Array.from(v, (x, i) => (Number.isFinite(x) && Number.isFinite(base[i]) ? (x - base[i]) / FIT_STEP_MM : 0));
  }); // column-major: J[j][i] = d value_i / d x_j
}

/** Input the fit cannot use (the CLI exits 2 on it). */
export class FitInputError extends Error {}

/** The least-squares library needs three points at least. */
export const MIN_MEASUREMENTS = 3;

export function runFit(file: DesignFile, measurements: readonly Measurement[], variables: readonly ResolvedVariable[], options: FitOptions = {}): FitReport {
  if (variables.length === 0) throw new FitInputError('no variables: name the hardpoint coordinates that may be off');
  if (measurements.length < Math.max(MIN_MEASUREMENTS, variables.length)) {
    throw new FitInputError(`${measurements.length} measurements for ${variables.length} variables: a fit needs at least as many measurements as variables, and ${MIN_MEASUREMENTS} at least`);
  }
  const t0 = Date.now();
  const model = new FitModel(file, variables, measurements);
  const n = variables.length;
  const m = measurements.length;
  const w = measurements.map((x) => x.weight);
  const measuredValues = measurements.map((x) => x.value);
  const residualsOf = (v: Float64Array) => Array.from(v, (x, i) => (Number.isFinite(x) ? x - measuredValues[i] : NOT_ASSEMBLED_DEG));
  const rms = (r: number[]) => Math.sqrt(r.reduce((s, ri, i) => s + w[i] * ri * ri, 0) / w.reduce((s, x) => s + x, 0));

  const start = new Float64Array(n);
  const before = model.values(start);
  const cache = new Map<string, Float64Array>([[Array.from(start).join(','), before]]);
  const valuesAt = (p: ArrayLike<number>) => {
    const k = Array.from(p).join(',');
    let v = cache.get(k);
    if (!v) {
      v = model.values(p);
      cache.set(k, v);
    }
    return v;
  };
  const maxIterations = options.maxIterations ?? 30;
  let iterations = 0;
  const fit = levenbergMarquardt(
    { x: measurements.map((_, i) => i), y: measuredValues },
    (p: number[]) => {
      const v = valuesAt(p);
      return (i: number) => (Number.isFinite(v[i]) ? v[i] : measuredValues[i] + NOT_ASSEMBLED_DEG);
    },
    {
      initialValues: Array.from(start),
      maxIterations,
      damping: 1e-2,
      errorTolerance: 1e-14,
      weights: w,
      jacobianFunction: (p: number[]) => {
        iterations++;
        options.onProgress?.(Math.min(iterations, maxIterations), maxIterations);
        const at = Float64Array.from(p);
        const J = jacobian(model, at, valuesAt(p));
        return (i: number) => J.map((col) => col[i]);
      },
    },
  );
  const x = Float64Array.from(fit.parameterValues);
  // Solved afresh (not from the cache) so the poses that failed are those of the answer.
  const after = model.values(x);
  const failedAfter = model.failed;
  const rAfter = residualsOf(after);
  const rBefore = residualsOf(before);

  // Normal matrix of the weighted Jacobian at the answer, columns scaled to unit norm.
  const J = jacobian(model, x, after);
  const norms = J.map((col) => Math.sqrt(col.reduce((s, c, i) => s + w[i] * c * c, 0)));
  const N = J.map((cj, a) => J.map((ck, b) => (norms[a] > 0 && norms[b] > 0 ? cj.reduce((s, c, i) => s + w[i] * c * ck[i], 0) / (norms[a] * norms[b]) : 0)));
  const { values: eig, vectors } = symmetricEigen(N);
  const largest = Math.max(...eig, 0);
  const blind = new Set<number>();
  eig.forEach((lambda, k) => {
    if (!(largest > 0) || lambda < IDENTIFIABLE_SHARE * largest) vectors.forEach((row, j) => Math.abs(row[k]) > 0.1 && blind.add(j));
  });
  norms.forEach((s, j) => !(s > 0) && blind.add(j));
  // Covariance from the identifiable directions only (a pseudo-inverse), in mm.
  const s2 = m > n ? rAfter.reduce((s, r, i) => s + w[i] * r * r, 0) / (m - n) : null;
  const variance = (j: number) => {
    let v = 0;
    eig.forEach((lambda, k) => {
      if (largest > 0 && lambda >= IDENTIFIABLE_SHARE * largest) v += vectors[j][k] ** 2 / lambda;
    });
    return v / norms[j] ** 2;
  };

  const notes: string[] = [];
  const fittedVariables: FittedVariable[] = variables.map((v, j) => {
    const identifiable = !blind.has(j);
    if (!identifiable) notes.push(`${v.words}: the measurements cannot pin this point down (moving it changes none of them, or only together with another point); measure at other poses or other quantities, or leave it out of the fit.`);
    return { id: v.id, words: v.words, movedMm: identifiable ? x[j] : null, standardErrorMm: identifiable && s2 !== null ? Math.sqrt(s2 * variance(j)) : null, identifiable };
  });
  // A variable the data cannot see is put back where the design had it.
  const answer = Float64Array.from(x, (xj, j) => (blind.has(j) ? 0 : xj));
  const final = blind.size > 0 ? model.values(answer) : after;
  const failedFinal = blind.size > 0 ? model.failed : failedAfter;
  if (s2 === null) notes.push(`${m} measurements for ${n} variables: no spare measurements, so no standard errors.`);
  for (const f of failedFinal) notes.push(`the fitted design does not assemble at ${f}`);
  const rFinal = residualsOf(final);
  return {
    fitted: model.designAt(answer),
    variables: fittedVariables,
    measurements: measurements.map((mm, i) => ({
      line: mm.line,
      pose: poseWords(mm.pose),
      side: mm.side,
      quantity: mm.quantity,
      measured: mm.value,
      modelled: Number.isFinite(final[i]) ? final[i] : null,
      before: Number.isFinite(before[i]) ? before[i] : null,
      residual: Number.isFinite(final[i]) ? final[i] - mm.value : null,
    })),
    rmsBeforeDeg: rms(rBefore),
    rmsAfterDeg: rms(rFinal),
    iterations: fit.iterations,
    evaluations: model.evaluations,
    seconds: (Date.now() - t0) / 1000,
    notes,
  };
}
