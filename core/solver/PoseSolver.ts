/**
 * Solves poses of a mechanism graph: Levenberg-Marquardt on the closed-loop constraints,
 * warm-started from the previous pose, with continuation (sub-stepping the inputs) so the
 * linkage stays on the assembly branch it started on. A solve never throws for failing to
 * converge and never lets NaN out: it returns a result with a named status and, on failure,
 * keeps the last good pose so a sweep can continue from it.
 */

import { CompiledMechanism } from './CompiledMechanism';
import { LevenbergMarquardt, type LmOptions, type LmOutcome } from './levenbergMarquardt';
import { INPUT_NAMES, type MechanismGraph, type PoseInputs } from '../mechanism/MechanismGraph';
import { DEFAULT_SOLVER_OPTIONS, solverOptionsProblem, type PoseSolverOptions } from './solverOptions';

export { DEFAULT_SOLVER_OPTIONS, solverOptionsProblem, type PoseSolverOptions } from './solverOptions';

export type SolveStatus = 'converged' | 'cannot-assemble' | 'singular' | 'did-not-converge' | 'invalid-input';

export interface SolveResult {
  status: SolveStatus;
  /**
   * Whether the mechanism now holds a closed pose at the requested inputs. True for
   * 'converged' and for a pose reached at a dead centre ('singular'); false for every failure,
   * including a solve stopped before a branch switch (also 'singular'), which keeps the last
   * good pose instead.
   */
  reached: boolean;
  /**
   * Largest constraint residual at the returned pose, mm (heading rows scaled to mm);
   * null when no residual was evaluated (invalid input).
   */
  residualMm: number | null;
  iterations: number;
  evaluations: number;
  /** Continuation sub-steps taken to reach the inputs. */
  substeps: number;
  message: string;
  /** The loop or joint that would not close, when one is to blame. */
  culprit?: string;
}

const DEG = Math.PI / 180;
const N_INPUTS = INPUT_NAMES.length;
/**
 * Poses kept along a straight sweep. Through up to INTERPOLATED of them the predictor
 * interpolates (a quintic at most); once LINE_HISTORY evenly spaced ones are there it fits a
 * degree-FIT_DEGREE polynomial to all of them by least squares instead: the poses are closed
 * only to the solver's tolerance, and interpolating more of them would amplify that noise
 * (the weights' absolute sum grows like 2^k), while the fit reaches a higher degree at a
 * similar amplification (sum 84 against 63).
 */
const LINE_HISTORY = 10;
const INTERPOLATED = 6;
const FIT_DEGREE = 7;
/** Least-squares weights: one step beyond LINE_HISTORY evenly spaced poses, oldest first. */
const FIT_WEIGHTS = leastSquaresExtrapolation(LINE_HISTORY, FIT_DEGREE);
/** EVEN_WEIGHTS[k][j] = (-1)^(k-1-j) C(k, j): one step beyond k evenly spaced poses, oldest first. */
const EVEN_WEIGHTS: readonly Float64Array[] = Array.from({ length: INTERPOLATED + 1 }, (_, k) => {
  const row = new Float64Array(k);
  let c = 1; // C(k, 0)
  for (let j = 0; j < k; j++) {
    row[j] = (k - 1 - j) % 2 === 0 ? c : -c;
    c = (c * (k - j)) / (j + 1);
  }
  return row;
});
/** Which inputs are angles (stepped in degrees) rather than lengths (mm). */
const INPUT_IS_DEG: readonly boolean[] = INPUT_NAMES.map((n) => n.endsWith('Deg'));
// solve() reads the record in this order by name; keep them in step with INPUT_NAMES.
if (INPUT_NAMES.join() !== 'leanDeg,heaveMm,handlebarDeg,travelRightMm,travelLeftMm,wheelAngleDeg') {
  throw new Error('PoseSolver: INPUT_NAMES order changed; update solve()');
}

export class PoseSolver {
  readonly mechanism: CompiledMechanism;
  /** The options in force (frozen: the checks below were made on these values). */
  readonly options: Readonly<PoseSolverOptions>;
  /** Why the options are unusable (every solve then ends 'invalid-input'), or undefined. */
  private readonly optionsProblem: string | undefined;
  private readonly lm: LevenbergMarquardt;
  private goodCoord: Float64Array;
  private goodSph: Float64Array;
  private readonly stepCoord: Float64Array;
  private readonly stepSph: Float64Array;
  /** Input records are vectors in INPUT_NAMES order: the hot loops index, never key by name. */
  private goodInputs: Float64Array;
  private hasGood = false;
  /** The good pose before the last one, for the secant predictor. */
  private prevCoord: Float64Array;
  private prevSph: Float64Array;
  private prevInputs: Float64Array;
  private hasPrev = false;
  /** Spare input record: the records rotate roles (spare -> good -> prev) instead of a new one per pose. */
  private spareInputs: Float64Array;
  /**
   * Accepted poses along the current straight line of inputs, oldest first (at most
   * LINE_HISTORY): their inputs and their unknowns (CompiledMechanism.getUnknowns), for the
   * predictor. A pose off the line starts a new line from the pose before it.
   */
  private readonly lineInputs: Float64Array[];
  private readonly lineState: Float64Array[];
  private lineCount = 0;
  private lineHead = 0;
  private readonly linePos = new Float64Array(LINE_HISTORY);
  /** lineGap[k]: distance in inputs from line pose k-1 to pose k (lineGap[0] unused). */
  private lineGap = new Float64Array(LINE_HISTORY);
  private readonly lineWeight = new Float64Array(LINE_HISTORY);
  private readonly predicted: Float64Array;
  private readonly lmOptions: LmOptions;
  private readonly work = new Float64Array(N_INPUTS);
  private readonly target = new Float64Array(N_INPUTS);
  private readonly zeros = new Float64Array(N_INPUTS);

  constructor(graph: MechanismGraph, options: Partial<PoseSolverOptions> = {}) {
    this.options = Object.freeze({ ...DEFAULT_SOLVER_OPTIONS, ...options });
    // Checked up front and reported by every solve, not thrown: only an invalid graph throws.
    this.optionsProblem = solverOptionsProblem(this.options);
    this.mechanism = new CompiledMechanism(graph);
    this.lm = new LevenbergMarquardt(this.mechanism);
    const nb = this.mechanism.nBodies;
    this.goodCoord = new Float64Array(nb);
    this.goodSph = new Float64Array(9 * nb);
    this.stepCoord = new Float64Array(nb);
    this.stepSph = new Float64Array(9 * nb);
    this.turnCoord = new Float64Array(nb);
    this.turnSph = new Float64Array(9 * nb);
    this.goodInputs = new Float64Array(N_INPUTS);
    this.prevCoord = new Float64Array(nb);
    this.prevSph = new Float64Array(9 * nb);
    this.prevInputs = new Float64Array(N_INPUTS);
    this.spareInputs = new Float64Array(N_INPUTS);
    const nv = this.mechanism.nVars;
    this.lineInputs = Array.from({ length: LINE_HISTORY }, () => new Float64Array(N_INPUTS));
    this.lineState = Array.from({ length: LINE_HISTORY }, () => new Float64Array(nv));
    this.predicted = new Float64Array(nv);
    this.lmOptions = { tolerance: this.options.toleranceMm, maxIterations: this.options.maxIterations, tau: 1e-10, reuseFactorisation: false };
  }

  /** The inputs of the last good pose. */
  get inputs(): Readonly<PoseInputs> {
    return vectorToInputs(this.goodInputs);
  }

  /** Forget the warm start: the next solve starts from the design pose. */
  reset(): void {
    this.failedAt = undefined;
    this.hasGood = false;
    this.hasPrev = false;
    this.lineCount = 0;
    this.lm.forgetFactorisation();
  }

  /**
   * Solve the pose at `target`. With `warm` (default) it continues from the last good
   * pose; otherwise from the design pose with all inputs zero.
   */
  solve(inputs: PoseInputs, warm = true): SolveResult {
    if (this.optionsProblem !== undefined) return this.fail('invalid-input', this.optionsProblem);
    const target = this.target;
    // Read by name once (in INPUT_NAMES order); everything after works on the vector.
    target[0] = inputs.leanDeg;
    target[1] = inputs.heaveMm;
    target[2] = inputs.handlebarDeg;
    target[3] = inputs.travelRightMm;
    target[4] = inputs.travelLeftMm;
    target[5] = inputs.wheelAngleDeg;
    for (let k = 0; k < N_INPUTS; k++) {
      if (!Number.isFinite(target[k])) {
        const name = INPUT_NAMES[k];
        return this.fail('invalid-input', `input ${name} is ${String(inputs[name])}; every input must be a finite number`);
      }
    }
    const m = this.mechanism;
    // Past a boundary already found from this good pose: the loop broke there, so anything
    // further along the same line is on no branch reachable from here.
    if (warm && this.hasGood && this.failedAt && this.beyond(this.failedAt.inputs, target)) {
      return { ...this.failedAt.result, message: `${this.failedAt.result.message}; ${describeInputs(target)} lies beyond it`, iterations: 0, evaluations: 0, substeps: 1 };
    }
    let from: Float64Array;
    let predicted = false;
    const opts = this.options;
    this.startedCold = false;
    let turning = false;
    if (warm && this.hasGood && this.hasPrev && this.reverses(target)) {
      // Going back the way the last step came: start from the previous good pose when the
      // target is at or past it, else from between the two, so the linkage retraces its own
      // branch instead of being solved afresh next to a turning point.
      const back = this.backFraction(target);
      turning = true;
      if (back >= 1 - 1e-12) {
        from = this.prevInputs;
        m.applyInputVector(this.prevInputs);
        m.setState(this.prevCoord, this.prevSph);
      } else {
        from = this.goodInputs;
        m.setState(this.goodCoord, this.goodSph);
        m.extrapolate(this.prevCoord, this.prevSph, back);
      }
    } else if (warm && this.hasGood) {
      from = this.goodInputs;
      m.setState(this.goodCoord, this.goodSph);
      // The first stretch starts at the good pose, whatever the predictor guesses: the jump
      // check measures from here, and a retry starts from here.
      m.getState(this.stepCoord, this.stepSph);
      predicted = this.predict(target);
    } else {
      this.startedCold = true;
      from = this.zeros;
      m.applyInputVector(from);
      m.resetToDesign();
      // Settle at zero inputs first: a design position that does not quite close in this
      // mode (a wheel centre whose height does not match the tyre, for ground contact) is
      // brought to the nearest closed pose before continuation, with no jump check, since
      // no input has moved yet.
      const settle = this.lm.solve(this.lmOptions);
      if (settle.ending === 'non-finite') {
        return this.fail('did-not-converge', 'the constraints could not be evaluated at the design position (does the design hold a non-finite number?)');
      }
      if (settle.ending !== 'converged') {
        const culprit = settle.worstResidual >= 0 ? m.constraintLabelOfRow(settle.worstResidual) : undefined;
        const result = this.fail(
          settle.maxResidual > opts.assemblyGapMm ? 'cannot-assemble' : 'did-not-converge',
          `the design position cannot be closed in this mode at zero inputs; worst: ${culprit} (${fmt(settle.maxResidual)} mm)`,
          culprit,
          settle.maxResidual,
          settle,
        );
        result.substeps = 1;
        return result;
      }
    }
    // How many sub-steps the input change needs.
    let span = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const d = Math.abs(target[k] - from[k]);
      span = Math.max(span, INPUT_IS_DEG[k] ? d / opts.maxStepDeg : d / opts.maxStepMm);
    }
    let pieces = Math.max(1, Math.ceil(span - 1e-12));
    let iterations = 0;
    let evaluations = 0;
    let substeps = 0;
    let bisections = 0;
    let last: LmOutcome | undefined;
    let reached = 0; // fraction in [0, 1]
    // Coming back along the line the last step came in on: the first sub-step must move the
    // linkage back the way it came; one that carries on through a turning point has crossed
    // onto the other assembly branch (near a dead centre both branches are close, so the jump
    // check cannot see it).
    let checkTurn = turning && from === this.goodInputs;
    while (reached < 1) {
      const next = Math.min(1, reached + 1 / pieces);
      interpolateInputs(this.work, from, target, next);
      // A predicted start is close enough for the corrector to try the last factorisation first.
      const lmOptions = this.lmOptions;
      lmOptions.reuseFactorisation = predicted;
      if (predicted) predicted = false;
      else m.getState(this.stepCoord, this.stepSph);
      m.applyInputVector(this.work);
      const out = this.lm.solve(lmOptions);
      lmOptions.reuseFactorisation = false;
      last = out;
      iterations += out.iterations;
      evaluations += out.evaluations;
      substeps++;
      const stepSize = next - reached;
      // Only a converged step can have jumped branch; a failed one is handled as a failure.
      let jump = out.ending === 'converged' && this.jumped(stepSize, from, target);
      if (checkTurn && out.ending === 'converged' && !jump && this.carriedOn()) {
        // Try again from the mirror image of that solution about the good pose: the same
        // branch lies on the other side.
        m.getState(this.turnCoord, this.turnSph);
        m.setState(this.stepCoord, this.stepSph);
        m.extrapolate(this.turnCoord, this.turnSph, -1);
        const again = this.lm.solve(this.lmOptions);
        iterations += again.iterations;
        evaluations += again.evaluations;
        last = again;
        jump = !(again.ending === 'converged' && !this.jumped(stepSize, from, target) && !this.carriedOn());
      }
      checkTurn = false;
      if (last!.ending === 'converged' && !jump) {
        reached = next;
        continue;
      }
      // Failed or jumped: retry this stretch in smaller pieces, from where it started.
      m.setState(this.stepCoord, this.stepSph);
      if (bisections >= opts.maxBisections) {
        interpolateInputs(this.work, from, target, reached);
        m.applyInputVector(this.work);
        return this.finishFailure(last!, jump, target, reached, iterations, evaluations, substeps);
      }
      bisections++;
      pieces = Math.round(1 / stepSize) * 2;
      // keep `reached` on the new grid
      reached = Math.round(reached * pieces) / pieces;
    }
    const res = last!;
    // Accept and remember as the warm start.
    const same = this.hasGood && warm && sameVector(target, this.goodInputs);
    this.failedAt = undefined;
    if (same) {
      // The same pose again: keep the direction the sweep came from.
      m.getState(this.goodCoord, this.goodSph);
      return this.finishSuccess(res, iterations, evaluations, substeps);
    }
    const spare = this.spareInputs;
    if (this.hasGood && warm && !turning) {
      // The good pose becomes the previous one: swap the buffers instead of copying.
      const c = this.prevCoord;
      const sp = this.prevSph;
      this.prevCoord = this.goodCoord;
      this.prevSph = this.goodSph;
      this.goodCoord = c;
      this.goodSph = sp;
      this.hasPrev = true;
    } else {
      // After retracing, or from a cold start, there is no step behind the new pose.
      this.hasPrev = false;
    }
    this.spareInputs = this.prevInputs;
    this.prevInputs = this.goodInputs;
    m.getState(this.goodCoord, this.goodSph);
    spare.set(target);
    this.goodInputs = spare;
    this.hasGood = true;
    if (this.startedCold) this.lineCount = 0;
    this.recordOnLine(target);
    return this.finishSuccess(res, iterations, evaluations, substeps);
  }

  /** Add the pose just accepted (the mechanism's state) to the line history. */
  private recordOnLine(inputs: Float64Array): void {
    const n = this.lineCount;
    if (n >= 2 && !collinearStep(this.lineInputs[this.slot(n - 2)], this.lineInputs[this.slot(n - 1)], inputs, this.line)) {
      // Off the line: a new line starts from the last pose.
      this.lineHead = this.slot(n - 1);
      this.lineCount = 1;
    } else if (n === LINE_HISTORY) {
      // Full: drop the oldest.
      this.lineHead = this.slot(1);
      this.lineCount = LINE_HISTORY - 1;
    }
    const k = this.lineCount;
    const at = this.slot(k);
    this.lineInputs[at].set(inputs);
    this.lineGap[at] = k > 0 ? inputDistance(this.lineInputs[this.slot(k - 1)], inputs) : 0;
    this.mechanism.getUnknowns(this.lineState[at]);
    this.lineCount = k + 1;
  }

  /** Buffer index of the j-th pose on the line, oldest first (a ring of LINE_HISTORY). */
  private slot(j: number): number {
    const i = this.lineHead + j;
    return i >= LINE_HISTORY ? i - LINE_HISTORY : i;
  }

  private finishSuccess(res: LmOutcome, iterations: number, evaluations: number, substeps: number): SolveResult {
    const opts = this.options;
    const singular = res.pivotRatio < opts.singularPivotRatio;
    if (singular) {
      return {
        status: 'singular',
        reached: true,
        residualMm: res.maxResidual,
        iterations,
        evaluations,
        substeps,
        message: `the linkage is at a dead centre or has lost a degree of freedom here (conditioning ${res.pivotRatio.toExponential(1)})`,
      };
    }
    return { status: 'converged', reached: true, residualMm: res.maxResidual, iterations, evaluations, substeps, message: 'converged' };
  }

  /**
   * Predictor along a sweep: when the target lies on the line the last poses were solved
   * along, extrapolate their unknowns to it (positions measured along the line): with
   * LINE_HISTORY evenly spaced poses, one step on, the least-squares fit of FIT_DEGREE; else
   * the interpolating polynomial through up to INTERPOLATED of them. Along a smooth sweep each
   * extra pose gains about an order of magnitude: measured on the demos' lean x steer sweep,
   * the residual at the guess falls from about 2e-4 mm (three poses) to about 1e-8 mm (the
   * fit), so the corrector usually needs no new Jacobian (see
   * LmOptions.reuseFactorisation). Far beyond the last step (more than 1.5 steps) only the last
   * three poses are used. A bad guess is harmless: the corrector and the jump check follow.
   */
  private predict(target: Float64Array): boolean {
    const n = this.lineCount;
    if (n < 2) return false;
    const line = this.line;
    if (!collinearStep(this.lineInputs[this.slot(n - 2)], this.lineInputs[this.slot(n - 1)], target, line) || line[1] > 2) return false;
    const T = line[0] * line[1]; // distance from the last pose to the target
    const gaps = this.lineGap;
    const w = this.lineWeight;
    // An evenly spaced sweep (the usual case) extrapolating one step: with a full history the
    // least-squares weights; else the signed binomial coefficients, (-1)^(k-1-j) C(k, j) for k
    // poses. Otherwise Lagrange's formula through the last few.
    const h = gaps[this.slot(n - 1)];
    let evenFrom = n - 1; // poses evenFrom..n-1 are evenly spaced, one step behind the target
    if (Math.abs(T - h) <= 1e-9 * h) while (evenFrom > 0 && Math.abs(gaps[this.slot(evenFrom)] - h) <= 1e-9 * h) evenFrom--;
    const evenCount = n - evenFrom;
    let use = Math.min(n, INTERPOLATED);
    if (line[1] > 1.5) use = Math.min(3, n);
    let first = n - use;
    if (evenCount === LINE_HISTORY) {
      first = 0;
      for (let j = 0; j < n; j++) w[j] = FIT_WEIGHTS[j];
    } else if (evenCount >= use) {
      const row = EVEN_WEIGHTS[use];
      for (let j = first; j < n; j++) w[j] = row[j - first];
    } else {
      const pos = this.linePos;
      pos[n - 1] = 0;
      for (let j = n - 2; j >= first; j--) pos[j] = pos[j + 1] - gaps[this.slot(j + 1)];
      for (let j = first; j < n; j++) {
        let wj = 1;
        for (let l = first; l < n; l++) if (l !== j) wj *= (T - pos[l]) / (pos[j] - pos[l]);
        w[j] = wj;
      }
    }
    const x = this.predicted;
    x.fill(0);
    for (let j = first; j < n; j++) {
      const wj = w[j];
      const state = this.lineState[this.slot(j)];
      for (let v = 0; v < x.length; v++) x[v] += wj * state[v];
    }
    this.mechanism.setUnknowns(x);
    return true;
  }
  /** collinearStep's answer: [length of the earlier step, ratio of the later to it]. */
  private readonly line = new Float64Array(2);

  private failedAt: { inputs: Float64Array; result: SolveResult } | undefined;
  /** Whether the solve under way started from the design pose. */
  private startedCold = false;

  /** Whether `target` lies on the ray from the good pose through `failed`, at or past it. */
  private beyond(failed: Float64Array, target: Float64Array): boolean {
    let dot = 0;
    let nf = 0;
    let nt = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const f = failed[k] - this.goodInputs[k];
      const t = target[k] - this.goodInputs[k];
      dot += f * t;
      nf += f * f;
      nt += t * t;
    }
    return nf > 0 && dot >= 0.9999 * Math.sqrt(nf * nt) && nt >= nf;
  }

  /** How far back toward the previous good pose the target lies: |target - good| / |prev - good|. */
  private backFraction(target: Float64Array): number {
    let n1 = 0;
    let n2 = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const d1 = this.goodInputs[k] - this.prevInputs[k];
      const d2 = target[k] - this.goodInputs[k];
      n1 += d1 * d1;
      n2 += d2 * d2;
    }
    return Math.sqrt(n2 / n1);
  }

  /** The target lies back along the line of the last accepted step (inputs antiparallel). */
  private reverses(target: Float64Array): boolean {
    let dot = 0;
    let n1 = 0;
    let n2 = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const d1 = this.goodInputs[k] - this.prevInputs[k];
      const d2 = target[k] - this.goodInputs[k];
      dot += d1 * d2;
      n1 += d1 * d1;
      n2 += d2 * d2;
    }
    return n1 > 0 && n2 > 0 && dot <= -0.9999 * Math.sqrt(n1 * n2);
  }

  /**
   * Whether the sub-step just solved moved the linkage on in the direction of the last accepted
   * step (prev -> good) instead of back: the dot product of the two motions of the named
   * points, each measured with the driven joints at the current inputs.
   */
  private carriedOn(): boolean {
    const m = this.mechanism;
    const pts = m.graph.points;
    const n = 3 * pts.length;
    if (n === 0) return false;
    const at = (out: Float64Array) => {
      m.forward();
      for (let i = 0; i < pts.length; i++) m.worldPoint(pts[i].body, pts[i].design, out, 3 * i);
    };
    if (this.pNow.length !== n) {
      this.pNow = new Float64Array(n);
      this.pGood = new Float64Array(n);
      this.pPrev = new Float64Array(n);
    }
    m.getState(this.turnCoord, this.turnSph);
    at(this.pNow);
    m.setState(this.goodCoord, this.goodSph);
    at(this.pGood);
    m.setState(this.prevCoord, this.prevSph);
    at(this.pPrev);
    m.setState(this.turnCoord, this.turnSph);
    let dot = 0;
    let a2 = 0;
    let b2 = 0;
    for (let i = 0; i < n; i++) {
      const a = this.pNow[i] - this.pGood[i];
      const b = this.pGood[i] - this.pPrev[i];
      dot += a * b;
      a2 += a * a;
      b2 += b * b;
    }
    // Ignore motions lost in rounding (a pose that barely moves has no direction).
    return a2 > 1e-18 && b2 > 1e-18 && dot > 0;
  }
  private pNow = new Float64Array(0);
  private pGood = new Float64Array(0);
  private pPrev = new Float64Array(0);
  private turnCoord = new Float64Array(0);
  private turnSph = new Float64Array(0);

  /** A converged sub-step that moved some joint far more than the input change allows. */
  private jumped(stepFraction: number, from: Float64Array, target: Float64Array): boolean {
    let inputRad = 0;
    let inputMm = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const d = Math.abs(target[k] - from[k]) * stepFraction;
      if (INPUT_IS_DEG[k]) inputRad = Math.max(inputRad, d * DEG);
      else inputMm = Math.max(inputMm, d);
    }
    // A branch switch moves joints by a finite amount however small the step; a steep but
    // continuous motion shrinks with it. Allow generous gearing: 25 degrees, or 12 times
    // the input change (radians), plus the mm change of an input travelling 1:1.
    const allowedRad = Math.max(25 * DEG, 12 * (inputRad + inputMm / 100));
    return this.mechanism.changeExceeds(this.stepCoord, this.stepSph, allowedRad);
  }

  private finishFailure(
    out: LmOutcome,
    jump: boolean,
    target: Float64Array,
    reached: number,
    iterations: number,
    evaluations: number,
    substeps: number,
  ): SolveResult {
    const result = this.describeFailure(out, jump, target, reached);
    // Count the whole attempt, every sub-step and retry, not only the last LM run.
    result.iterations = iterations;
    result.evaluations = evaluations;
    result.substeps = substeps;
    // A boundary (the loop cannot close) is remembered; a refused jump is not one.
    if (this.hasGood && !jump) this.failedAt = { inputs: target.slice(), result: { ...result } };
    return result;
  }

  private describeFailure(out: LmOutcome, jump: boolean, target: Float64Array, reached: number): SolveResult {
    const m = this.mechanism;
    // Back to the last good pose so the caller (a sweep) can go on from it.
    if (this.hasGood) {
      // the good pose's inputs too: its coordinates with the partly reached inputs close no loop
      m.applyInputVector(this.goodInputs);
      m.setState(this.goodCoord, this.goodSph);
    }
    const culprit = out.worstResidual >= 0 ? m.constraintLabelOfRow(out.worstResidual) : undefined;
    const where = describeInputs(target);
    const gap = out.maxResidual;
    if (jump && reached === 0 && this.startedCold) {
      return this.fail(
        'singular',
        `from the design position the first step toward ${where} moves a joint far more than the inputs allow: ` +
          'the design position may not close in this mode (for ground contact, check the wheel-centre height against the tyre radii) or sits at a dead centre',
        culprit,
        gap,
        out,
      );
    }
    if (jump) {
      return this.fail(
        'singular',
        `the linkage passes a dead centre or would switch assembly branch before reaching ${where} (${Math.round(reached * 100)} % of the way)`,
        culprit,
        gap,
        out,
      );
    }
    if (out.ending === 'non-finite') {
      return this.fail('did-not-converge', `the constraints could not be evaluated at ${where}`, culprit, gap, out);
    }
    if (out.ending === 'max-iterations') {
      return this.fail('did-not-converge', `no convergence in ${this.options.maxIterations} iterations at ${where}; worst: ${culprit} (${fmt(gap)} mm)`, culprit, gap, out);
    }
    if (gap > this.options.assemblyGapMm) {
      return this.fail('cannot-assemble', `${culprit} cannot close at ${where}: gap ${fmt(gap)} mm`, culprit, gap, out);
    }
    return this.fail('did-not-converge', `stalled ${fmt(gap)} mm short of closure at ${where}; worst: ${culprit}`, culprit, gap, out);
  }

  private fail(status: SolveStatus, message: string, culprit?: string, gap = NaN, out?: LmOutcome): SolveResult {
    return {
      status,
      reached: false,
      residualMm: Number.isFinite(gap) ? gap : null,
      iterations: out?.iterations ?? 0,
      evaluations: out?.evaluations ?? 0,
      substeps: 0,
      message,
      ...(culprit ? { culprit } : {}),
    };
  }
}

/**
 * Whether the step a -> b and the step b -> target point the same way; if so, out receives
 * the length of a -> b and the ratio |b -> target| / |a -> b| (a typed array, not a new
 * object, so the predictor allocates nothing).
 */
function collinearStep(a: Float64Array, b: Float64Array, target: Float64Array, out: Float64Array): boolean {
  let dot = 0;
  let n1 = 0;
  let n2 = 0;
  for (let k = 0; k < N_INPUTS; k++) {
    const s1 = b[k] - a[k];
    const s2 = target[k] - b[k];
    dot += s1 * s2;
    n1 += s1 * s1;
    n2 += s2 * s2;
  }
  if (!(n1 > 0) || !(n2 > 0) || dot < 0.9999 * Math.sqrt(n1 * n2)) return false;
  out[0] = Math.sqrt(n1);
  out[1] = Math.sqrt(n2 / n1);
  return true;
}

/**
 * Weights w_j (oldest first) such that sum_j w_j x_j is the value at t = 0 of the
 * least-squares polynomial of the given degree through samples x_j at t = -k..-1. Built by
 * Gram-Schmidt (twice over, for accuracy) on the monomials in the centred variable
 * s = (t - mean) / half-width, each basis vector carried together with its value at t = 0,
 * which takes no part in the inner products: then w_j = sum_p phi_p(t_j) phi_p(0) for the
 * orthonormal basis phi_p. For k = 10, degree 7 the weights come out as -0.8, 4.8, -10.6, 8,
 * 5.6, -11.2, -2.8, 17.6, -16, 6.4 to about 5e-15.
 */
export function leastSquaresExtrapolation(k: number, degree: number): Float64Array {
  const mid = -(k + 1) / 2;
  const half = (k - 1) / 2;
  const basis: Float64Array[] = [];
  for (let p = 0; p <= degree; p++) {
    const v = new Float64Array(k + 1); // k sample values, then the value at t = 0
    for (let j = 0; j < k; j++) v[j] = ((j - k - mid) / half) ** p;
    v[k] = (-mid / half) ** p;
    for (let pass = 0; pass < 2; pass++) {
      for (const q of basis) {
        let d = 0;
        for (let j = 0; j < k; j++) d += v[j] * q[j];
        for (let j = 0; j <= k; j++) v[j] -= d * q[j];
      }
    }
    let norm = 0;
    for (let j = 0; j < k; j++) norm += v[j] * v[j];
    norm = Math.sqrt(norm);
    for (let j = 0; j <= k; j++) v[j] /= norm;
    basis.push(v);
  }
  const w = new Float64Array(k);
  for (const q of basis) for (let j = 0; j < k; j++) w[j] += q[j] * q[k];
  return w;
}

function inputDistance(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < N_INPUTS; k++) s += (b[k] - a[k]) * (b[k] - a[k]);
  return Math.sqrt(s);
}

function sameVector(a: Float64Array, b: Float64Array): boolean {
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}

function vectorToInputs(v: Float64Array): PoseInputs {
  const out = {} as PoseInputs;
  for (let k = 0; k < N_INPUTS; k++) out[INPUT_NAMES[k]] = v[k];
  return out;
}

function interpolateInputs(out: Float64Array, a: Float64Array, b: Float64Array, s: number): void {
  for (let k = 0; k < N_INPUTS; k++) out[k] = s >= 1 ? b[k] : a[k] + (b[k] - a[k]) * s;
}

function describeInputs(v: Float64Array): string {
  const t = vectorToInputs(v);
  return `lean ${t.leanDeg.toFixed(1)} deg, handlebar ${t.handlebarDeg.toFixed(1)} deg, heave ${t.heaveMm.toFixed(1)} mm, travel R/L ${t.travelRightMm.toFixed(1)}/${t.travelLeftMm.toFixed(1)} mm`;
}

function fmt(x: number): string {
  return Number.isFinite(x) ? (Math.abs(x) >= 0.01 ? x.toFixed(3) : x.toExponential(2)) : String(x);
}
