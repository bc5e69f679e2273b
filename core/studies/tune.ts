/**
 * Tune: move the plan's hardpoint coordinates (and tie-rod lengths) inside their ranges to
 * minimise the plan's weighted objectives while keeping its constraints, over the study poses
 * (the operating-region sample by default).
 *
 * Least squares of the sampled residuals (tuneResiduals.ts) with ml-levenberg-marquardt. The
 * ranges are kept by a smooth transform (tuneVariables.ts), so every design the optimiser
 * tries lies inside them. Each residual vector is a full solve of the moved design at every
 * pose by its own pose engine (studyPoses.ts measureAtPoses). The Jacobian is ours, passed to
 * the library:
 *   'finite-difference'  forward differences of the full solve at a fixed step (0.05 mm by
 *                        default: the solver closes loops to 1e-9 mm, so the step is far above
 *                        its noise and far below the curvature of any measure), every iteration;
 *   'secant' (default)   that Jacobian at the first iteration and every REFRESH_EVERY
 *                        iterations, and between them Broyden's rank-one update from the
 *                        step just taken, J += (dr - J dx) dx^T / (dx^T dx) (Broyden 1965; Nocedal
 *                        and Wright, Numerical Optimization, 2nd ed., section 11.1): one solve
 *                        per iteration instead of n + 1.
 * Multi-start: the design as it is, then seeded points inside the ranges; the best design any
 * start reached is kept (every design evaluated is a real, solved design).
 *
 * The library keeps stepping from a worse point (it only remembers the best), so a start
 * wanders at most maxIterations steps; a pose that stops assembling makes every residual of it
 * large (NOT_ASSEMBLED), so such a design never wins.
 */

import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { SeedBook } from '../analysis/solveSeeds';
import type { DesignFile } from '../design/types';
import { resolveDesign } from '../design/resolveDesign';
import { seededRandom } from './seededRandom';
import { StudyInputError, checkStudyPoses, measureAtPoses, poseWords, regionSamplePoses, type StudyPose } from './studyPoses';
import type { StudyProgress } from './sensitivity';
import { residualTerms, residualVector, termQuantities, type ResidualTerm, type SummaryKey } from './tuneResiduals';
import type { ResolvedVariable, TunePlan } from './tunePlan';
import { applyTuneOffsets, boundedOffset, boundedSlope, unboundedOf } from './tuneVariables';
import type { StudyQuantity } from './studyQuantities';

export const DEFAULT_TUNE_STEP_MM = 0.05;
export const REFRESH_EVERY = 6;
/** Starting damping, on the unit diagonal of the column-scaled J^T J. */
export const INITIAL_DAMPING_SHARE = 1e-2;

export type JacobianMethod = 'finite-difference' | 'secant';

export interface TuneOptions extends StudyProgress {
  jacobian?: JacobianMethod;
  stepMm?: number;
  /**
   * Start each moved design's solves from the nearest evaluated design's solutions of the same
   * poses (the implicit-function tangent, polished by Newton: solveSeeds.ts). Default true;
   * false solves every copy afresh from its design pose (the plain path, for comparison).
   */
  seeded?: boolean;
}

export interface TuneSummaryItem extends SummaryKey {
  group: 'objective' | 'constraint';
  before: number | null;
  beforeWhere: string | null;
  after: number | null;
  afterWhere: string | null;
  /** Inside the limit (null when the item has none or was not measured). */
  keptBefore: boolean | null;
  keptAfter: boolean | null;
}

export interface TunedVariable {
  id: string;
  words: string;
  rangeMm: [number, number];
  movedMm: number;
  /** Within 1 % of the range of one end: the optimum may lie beyond it. */
  atBound: 'low' | 'high' | null;
}

export interface TuneStart {
  from: 'design' | 'seeded';
  startOffsetsMm: number[];
  cost: number;
  iterations: number;
  evaluations: number;
  /** How it ended: settled (best cost stopped falling), out of iterations, or stopped by the user. */
  ended: 'settled' | 'iterations' | 'stopped';
}

export interface TuneReport {
  design: string;
  method: string;
  jacobian: JacobianMethod;
  poses: StudyPose[];
  posesFrom: 'given' | 'region sample';
  /** Poses the design as it is cannot be assembled at (left out). */
  notAssembled: string[];
  variables: TunedVariable[];
  summary: TuneSummaryItem[];
  /** Sum of squared residuals, before and after. */
  costBefore: number;
  costAfter: number;
  /** Poses the tuned design cannot be assembled at (none when it is accepted). */
  notAssembledAfter: string[];
  starts: TuneStart[];
  bestStart: number;
  iterations: number;
  evaluations: number;
  elapsedMs: number;
  cancelled: boolean;
  tuned: DesignFile;
}

class StopSignal extends Error {}

/** A run has settled when its best cost fell by less than this share over the last SETTLE_ITERATIONS iterations. */
export const SETTLE_SHARE = 1e-4;
export const SETTLE_ITERATIONS = 6;
/** Never settled before this many iterations: the damping adapts over the first few. */
export const SETTLE_AFTER = 8;

interface Evaluated {
  offsets: Float64Array;
  residuals: Float64Array;
  values: Float64Array;
  failed: Map<number, string>;
  cost: number;
  /** Its solutions, to seed the solves of designs near it (null when not kept). */
  seeds: SeedBook | null;
}

/** Solves moved designs at the study poses, counting and remembering the best. */
class Evaluator {
  count = 0;
  best: Evaluated | null = null;
  /** The design evaluated last (the library's trial point after a step). */
  last: Evaluated | null = null;
  private readonly quantities: StudyQuantity[];
  private readonly cache = new Map<string, Evaluated>();

  constructor(
    private readonly file: DesignFile,
    private readonly variables: readonly ResolvedVariable[],
    private readonly poses: readonly StudyPose[],
    private readonly terms: readonly ResidualTerm[],
    private readonly progress: () => void,
    private readonly shouldStop: () => boolean,
    private readonly seeded: boolean,
  ) {
    this.quantities = termQuantities(terms);
  }

  /**
   * The design moved by these offsets, solved at every pose. `from`: a design already evaluated
   * nearby whose solutions seed these solves (solveSeeds.ts), unless seeding is off.
   */
  evaluate(offsets: ArrayLike<number>, from?: Evaluated, keepSeeds = true): Evaluated {
    const key = Array.from(offsets, (x) => x.toPrecision(15)).join(',');
    const hit = this.cache.get(key);
    if (hit) {
      this.last = hit;
      return hit;
    }
    if (this.shouldStop()) throw new StopSignal();
    const n = this.poses.length * this.terms.length;
    const values = new Float64Array(n).fill(NaN);
    const failed = new Map<number, string>();
    // A difference column is never a point the run moves to: its solutions need not be kept.
    const seeds = this.seeded && keepSeeds ? new SeedBook() : null;
    try {
      const moved = resolveDesign(applyTuneOffsets(this.file, this.variables, offsets));
      const replay = this.seeded ? ((from ?? this.last)?.seeds ?? undefined) : undefined;
      const m = measureAtPoses(moved, this.poses, this.quantities, { replay, record: seeds ?? undefined });
      values.set(m.values);
      for (const f of m.failed) failed.set(f.pose, f.message);
    } catch (e) {
      // A moved design the mechanism cannot even be built from: every pose fails.
      this.poses.forEach((p, i) => failed.set(i, `${poseWords(p)}: ${(e as Error).message}`));
    }
    const residuals = residualVector(this.terms, this.poses, values, new Set(failed.keys()), new Float64Array(n));
    let cost = 0;
    for (const r of residuals) cost += r * r;
    const ev: Evaluated = { offsets: Float64Array.from(offsets), residuals, values, failed, cost, seeds };
    if (this.cache.size > 64) this.cache.clear();
    this.cache.set(key, ev);
    this.count++;
    this.last = ev;
    if (!this.best || cost < this.best.cost) this.best = ev;
    this.progress();
    return ev;
  }
}

/** The Jacobian d(residual)/d(offset), m x n row-major, by forward differences (a step that would leave the range is taken backwards). */
function differenceJacobian(ev: Evaluator, at: Evaluated, variables: readonly ResolvedVariable[], stepMm: number): Float64Array {
  const m = at.residuals.length;
  const n = variables.length;
  const J = new Float64Array(m * n);
  for (let j = 0; j < n; j++) {
    const x = Float64Array.from(at.offsets);
    const h = x[j] + stepMm <= variables[j].hi ? stepMm : -stepMm;
    x[j] += h;
    const r = ev.evaluate(x, at, false).residuals;
    for (let i = 0; i < m; i++) J[i * n + j] = (r[i] - at.residuals[i]) / h;
  }
  return J;
}

/** Broyden's rank-one update of J (m x n) for the step dx that changed the residuals by dr. */
function broydenUpdate(J: Float64Array, dx: Float64Array, dr: Float64Array): void {
  const n = dx.length;
  const m = dr.length;
  let dd = 0;
  for (const d of dx) dd += d * d;
  if (!(dd > 0)) return;
  for (let i = 0; i < m; i++) {
    let jd = 0;
    for (let j = 0; j < n; j++) jd += J[i * n + j] * dx[j];
    const k = (dr[i] - jd) / dd;
    for (let j = 0; j < n; j++) J[i * n + j] += k * dx[j];
  }
}

interface RunResult {
  /** Iterations (Jacobians) taken. */
  iterations: number;
  /** Stopped because the best cost stopped falling (else: ran out of iterations). */
  settled: boolean;
}

/** Damping divided on an accepted step and multiplied on a rejected one (Nielsen-style factors). */
export const DAMPING_DOWN = 3;
export const DAMPING_UP = 4;
/** Damping past which a run has nowhere left to go. */
const DAMPING_CEILING = 1e8;

/**
 * One Levenberg-Marquardt run from the given offsets. Each step is the library's (one
 * iteration of ml-levenberg-marquardt from the current point with our Jacobian and damping);
 * the acceptance is ours: a step that does not lower the cost is refused and the damping
 * raised, one that does is kept and the damping lowered (Marquardt 1963; Nocedal and Wright,
 * Numerical Optimization, 2nd ed., section 10.3). The library alone would carry on from a
 * worse point and only remember the best.
 *
 * The library damps with lambda I, blind to how strongly each variable acts, so its
 * parameters are the bounded variables scaled by their Jacobian columns' norms at the start,
 * v_j = c_j u_j: every column starts at unit norm (More's diagonal scaling, same section). A
 * variable that hardly acts gets a floor scale so a tiny gradient does not fling it across its
 * range.
 */
function runFrom(ev: Evaluator, variables: readonly ResolvedVariable[], start: Float64Array, plan: TunePlan, method: JacobianMethod, stepMm: number): RunResult {
  const n = variables.length;
  const toOffsets = (u: ArrayLike<number>) => Float64Array.from({ length: n }, (_, j) => boundedOffset(u[j], variables[j].lo, variables[j].hi));
  const slopesAt = (u: ArrayLike<number>) => Array.from(u, (uj, j) => boundedSlope(uj, variables[j].lo, variables[j].hi));
  const u0 = Array.from(start, (x, j) => unboundedOf(x, variables[j].lo, variables[j].hi));
  let cur = ev.evaluate(start);
  const m = cur.residuals.length;
  let J = differenceJacobian(ev, cur, variables, stepMm);
  const s0 = slopesAt(u0);
  const norms = Array.from({ length: n }, (_, j) => {
    let d = 0;
    for (let i = 0; i < m; i++) d += (J[i * n + j] * s0[j]) ** 2;
    return Math.sqrt(d);
  });
  const floor = 1e-3 * Math.max(...norms, 1e-9);
  const c = norms.map((x) => Math.max(x, floor));
  const toU = (v: ArrayLike<number>) => Array.from(v, (vj, j) => vj / c[j]);
  let v = u0.map((uj, j) => uj * c[j]);
  let damping = INITIAL_DAMPING_SHARE;
  let sinceRefresh = 0;
  const costs = [cur.cost];
  const data = { x: Array.from({ length: m }, (_, i) => i), y: new Array<number>(m).fill(0) };
  const model = (p: number[]) => {
    const r = ev.evaluate(toOffsets(toU(p)), cur).residuals;
    return (i: number) => r[i];
  };
  for (let it = 1; it <= plan.maxIterations; it++) {
    const k = slopesAt(toU(v)).map((sl, j) => sl / c[j]);
    const Jv = J;
    levenbergMarquardt(data, model, {
      initialValues: v,
      maxIterations: 1,
      damping,
      errorTolerance: 0,
      // Chain rule through the bounds' transform and the scaling: dr/dv_j = dr/dx_j * dx_j/du_j / c_j.
      jacobianFunction: () => (i) => k.map((kj, j) => Jv[i * n + j] * kj),
    });
    const trial = ev.last!;
    if (method === 'secant') {
      // The trial is secant information whether or not it is kept.
      broydenUpdate(J, Float64Array.from(trial.offsets, (x, j) => x - cur.offsets[j]), Float64Array.from(trial.residuals, (r, i) => r - cur.residuals[i]));
    }
    if (trial.cost < cur.cost) {
      cur = trial;
      v = Array.from(trial.offsets, (x, j) => unboundedOf(x, variables[j].lo, variables[j].hi) * c[j]);
      damping = Math.max(damping / DAMPING_DOWN, 1e-9);
      if (method === 'finite-difference' || ++sinceRefresh >= REFRESH_EVERY) {
        J = differenceJacobian(ev, cur, variables, stepMm);
        sinceRefresh = 0;
      }
    } else {
      damping *= DAMPING_UP;
      // A secant Jacobian that led nowhere is refreshed at once: Broyden's update is only good along steps that work.
      if (method === 'secant' && sinceRefresh > 0) {
        J = differenceJacobian(ev, cur, variables, stepMm);
        sinceRefresh = 0;
      }
    }
    costs.push(cur.cost);
    const back = costs.length - 1 - SETTLE_ITERATIONS;
    if (damping > DAMPING_CEILING || (it >= SETTLE_AFTER && back >= 0 && costs[back] - cur.cost <= SETTLE_SHARE * costs[back])) return { iterations: it, settled: true };
  }
  return { iterations: plan.maxIterations, settled: false };
}

/** Worst |value - target| or least value of each report line over the poses, with where. */
function summarise(terms: readonly ResidualTerm[], poses: readonly StudyPose[], ev: Evaluated): Map<string, { value: number | null; where: string | null }> {
  const out = new Map<string, { value: number | null; where: string | null }>();
  const T = terms.length;
  terms.forEach((t, k) => {
    const s = t.summary;
    const cur = out.get(s.id) ?? { value: null, where: null };
    for (let p = 0; p < poses.length; p++) {
      if (ev.failed.has(p) || !t.at(poses[p])) continue;
      const v = ev.values[p * T + k];
      if (Number.isNaN(v)) continue;
      const score = s.kind === 'worst' ? Math.abs(v - s.target) : v;
      const better = cur.value === null || (s.kind === 'worst' ? score > cur.value : score < cur.value);
      if (better) {
        cur.value = score;
        cur.where = `${t.label} at ${poseWords(poses[p])}`;
      }
    }
    out.set(s.id, cur);
  });
  return out;
}

function kept(s: SummaryKey, v: number | null): boolean | null {
  if (v === null || s.limit === null) return null;
  return s.kind === 'worst' ? v <= s.limit : v >= s.limit;
}

function summaryItems(terms: readonly ResidualTerm[], poses: readonly StudyPose[], before: Evaluated, after: Evaluated): TuneSummaryItem[] {
  const b = summarise(terms, poses, before);
  const a = summarise(terms, poses, after);
  const items: TuneSummaryItem[] = [];
  for (const t of terms) {
    if (items.some((x) => x.id === t.summary.id)) continue;
    const bv = b.get(t.summary.id)!;
    const av = a.get(t.summary.id)!;
    items.push({ ...t.summary, group: t.group, before: bv.value, beforeWhere: bv.where, after: av.value, afterWhere: av.where, keptBefore: kept(t.summary, bv.value), keptAfter: kept(t.summary, av.value) });
  }
  return items;
}

/** Poses of the plan, with the ones the design as it is cannot be assembled at dropped and named. */
function planPoses(file: DesignFile, plan: TunePlan): { poses: StudyPose[]; from: 'given' | 'region sample' } {
  const design = resolveDesign(file);
  if (plan.poses === 'region') {
    const s = regionSamplePoses(design);
    if (s.poses.length === 0) throw new StudyInputError('no pose of the region sample lies in the operating region: give the plan its own poses');
    return { poses: s.poses, from: 'region sample' };
  }
  checkStudyPoses(design, plan.poses);
  return { poses: plan.poses, from: 'given' };
}

/** Tune the design by the plan; the input design is not changed (the report carries the tuned copy). */
export function runTune(file: DesignFile, plan: TunePlan, variables: readonly ResolvedVariable[], options: TuneOptions = {}): TuneReport {
  const t0 = Date.now();
  const method = options.jacobian ?? 'secant';
  const stepMm = options.stepMm ?? DEFAULT_TUNE_STEP_MM;
  const seeded = options.seeded ?? true;
  const design = resolveDesign(file);
  const terms = residualTerms(design, plan.objectives, plan.constraints);
  const planned = planPoses(file, plan);
  const n = variables.length;
  const perIteration = method === 'finite-difference' ? n + 1 : 1 + (n + 1) / REFRESH_EVERY;
  const budget = Math.ceil(plan.starts * (plan.maxIterations * perIteration + n + 2));
  let ev = new Evaluator(file, variables, planned.poses, terms, () => options.onProgress?.(Math.min(ev.count, budget - 1), budget), () => options.shouldStop?.() ?? false, seeded);

  // The design as it is, and the poses it cannot take (left out: the tune cannot be judged there).
  const zero = new Float64Array(n);
  const first = ev.evaluate(zero);
  const notAssembled = [...first.failed.values()];
  let poses = planned.poses;
  if (first.failed.size > 0) {
    poses = planned.poses.filter((_, i) => !first.failed.has(i));
    if (poses.length === 0) throw new StudyInputError(`the design cannot be assembled at any study pose: ${notAssembled.slice(0, 3).join('; ')}`);
    ev = new Evaluator(file, variables, poses, terms, () => options.onProgress?.(Math.min(ev.count, budget - 1), budget), () => options.shouldStop?.() ?? false, seeded);
  }
  const before = ev.evaluate(zero);

  const rng = seededRandom(plan.seed);
  const starts: TuneStart[] = [];
  let cancelled = false;
  let iterations = 0;
  let bestStart = 0;
  let bestCost = Infinity;
  for (let s = 0; s < plan.starts && !cancelled; s++) {
    // Seeded starts: uniform over the middle half of each range.
    const start = s === 0 ? zero : Float64Array.from(variables, (v) => (v.lo + (v.hi - v.lo) * (0.25 + 0.5 * rng.uniform())));
    const before = ev.count;
    const bestBefore = ev.best;
    ev.best = null;
    let its = 0;
    let ended: TuneStart['ended'] = 'stopped';
    try {
      const run = runFrom(ev, variables, start, plan, method, stepMm);
      its = run.iterations;
      ended = run.settled ? 'settled' : 'iterations';
    } catch (e) {
      if (!(e instanceof StopSignal)) throw e;
      cancelled = true;
    }
    const reached = ev.best as Evaluated | null;
    iterations += its;
    starts.push({ from: s === 0 ? 'design' : 'seeded', startOffsetsMm: Array.from(start), cost: reached?.cost ?? Infinity, iterations: its, evaluations: ev.count - before, ended });
    if (reached && reached.cost < bestCost) {
      bestCost = reached.cost;
      bestStart = s;
    }
    if (bestBefore && (reached === null || bestBefore.cost < reached.cost)) ev.best = bestBefore;
  }
  const best = ev.best ?? before;
  options.onProgress?.(budget, budget);
  const tuned = applyTuneOffsets(file, variables, best.offsets);
  tuned.notes = [file.notes ?? '', tuneNote(variables, best.offsets, before.cost, best.cost)].filter((x) => x !== '').join('\n');
  return {
    design: file.name,
    method:
      `Levenberg-Marquardt (ml-levenberg-marquardt) on ${before.residuals.length} sampled residuals, ` +
      `${method === 'secant' ? `forward-difference Jacobian every ${REFRESH_EVERY} iterations and Broyden updates between` : 'forward-difference Jacobian every iteration'} (step ${stepMm} mm), ` +
      `${plan.starts} start${plan.starts === 1 ? '' : 's'}`,
    jacobian: method,
    poses,
    posesFrom: planned.from,
    notAssembled,
    variables: variables.map((v, j) => {
      const x = best.offsets[j];
      const tol = 0.01 * (v.hi - v.lo);
      return { id: v.id, words: v.words, rangeMm: [v.lo, v.hi], movedMm: x, atBound: v.lo < 0 && x - v.lo < tol ? 'low' : v.hi > 0 && v.hi - x < tol ? 'high' : null };
    }),
    summary: summaryItems(terms, poses, before, best),
    costBefore: before.cost,
    costAfter: best.cost,
    notAssembledAfter: [...best.failed.values()],
    starts,
    bestStart,
    iterations,
    evaluations: ev.count,
    elapsedMs: Date.now() - t0,
    cancelled,
    tuned,
  };
}

function tuneNote(variables: readonly ResolvedVariable[], offsets: Float64Array, costBefore: number, costAfter: number): string {
  const moves = variables
    .map((v, j) => ({ v, d: offsets[j] }))
    .filter(({ d }) => Math.abs(d) >= 0.005)
    .map(({ v, d }) => `${v.id} ${d >= 0 ? '+' : ''}${d.toFixed(2)} mm`);
  return `Tuned by tiltbench tune (cost ${costBefore.toPrecision(4)} -> ${costAfter.toPrecision(4)}): ${moves.length > 0 ? moves.join(', ') : 'nothing moved'}.`;
}
