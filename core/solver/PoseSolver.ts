/**
 * Solves poses of a mechanism graph: Levenberg-Marquardt on the closed-loop constraints,
 * warm-started from the previous pose, with continuation (sub-stepping the inputs) so the
 * linkage stays on the assembly branch it started on. A solve never throws for failing to
 * converge and never lets NaN out: it returns a result with a named status and, on failure,
 * keeps the last good pose so a sweep can continue from it.
 *
 * Helpers live beside it: the options and their check (solverOptions.ts), the result and
 * its messages (solveResult.ts), the predictor along a sweep (SweepPredictor.ts) and input
 * vectors (inputVector.ts).
 */

import { CompiledMechanism } from './CompiledMechanism';
import { LevenbergMarquardt, type LmOptions, type LmOutcome } from './levenbergMarquardt';
import { INPUT_NAMES, type MechanismGraph, type PoseInputs } from '../mechanism/MechanismGraph';
import { DEFAULT_SOLVER_OPTIONS, solverOptionsProblem, type PoseSolverOptions } from './solverOptions';
import { failedResult, failureResult, fmtMm, reachedResult, type SolveResult } from './solveResult';
import { SweepPredictor } from './SweepPredictor';
import {
  backFraction,
  describeInputs,
  INPUT_IS_DEG,
  interpolateInputs,
  liesBeyond,
  N_INPUTS,
  readInputs,
  reverses,
  sameVector,
  vectorToInputs,
} from './inputVector';

export { DEFAULT_SOLVER_OPTIONS, solverOptionsProblem, type PoseSolverOptions } from './solverOptions';
export type { SolveResult, SolveStatus } from './solveResult';
export { leastSquaresExtrapolation } from './SweepPredictor';

const DEG = Math.PI / 180;

/** A solved pose as plain data: joint coordinates, spherical joints' rotations, inputs (INPUT_NAMES order). */
export interface SolverSeed {
  coord: Float64Array;
  sph: Float64Array;
  inputs: Float64Array;
}

export class PoseSolver {
  readonly mechanism: CompiledMechanism;
  /** The options in force (frozen: the checks below were made on these values). */
  readonly options: Readonly<PoseSolverOptions>;
  /** Why the options are unusable (every solve then ends 'invalid-input'), or undefined. */
  private readonly optionsProblem: string | undefined;
  private readonly lm: LevenbergMarquardt;
  private readonly predictor: SweepPredictor;
  private goodCoord: Float64Array;
  private goodSph: Float64Array;
  private readonly stepCoord: Float64Array;
  private readonly stepSph: Float64Array;
  /** Input records are vectors in INPUT_NAMES order: the hot loops index, never key by name. */
  private goodInputs: Float64Array;
  private hasGood = false;
  /** See holdsGoodPose. */
  private holdsClosed = false;
  /** The good pose before the last one: reversing along a sweep retraces from it. */
  private prevCoord: Float64Array;
  private prevSph: Float64Array;
  private prevInputs: Float64Array;
  private hasPrev = false;
  /** Spare input record: the records rotate roles (spare -> good -> prev) instead of a new one per pose. */
  private spareInputs: Float64Array;
  /** A state saved while the turning check tries the mirror image of a solution. */
  private readonly turnCoord: Float64Array;
  private readonly turnSph: Float64Array;
  /** Named points at three states, for the turning check (sized on first use). */
  private pNow = new Float64Array(0);
  private pGood = new Float64Array(0);
  private pPrev = new Float64Array(0);
  private readonly lmOptions: LmOptions;
  private readonly work = new Float64Array(N_INPUTS);
  private readonly target = new Float64Array(N_INPUTS);
  private readonly zeros = new Float64Array(N_INPUTS);
  /** A boundary found from the current good pose (the loop stopped closing there). */
  private failedAt: { inputs: Float64Array; result: SolveResult } | undefined;
  // Where the solve under way starts, chosen by startPose (fields, so choosing allocates nothing).
  private from: Float64Array;
  /** The start is the predictor's guess (close enough to try the kept factorisation first). */
  private predictedStart = false;
  /** The solve goes back the way the last step came. */
  private turning = false;
  /** The solve started from the design pose. */
  private startedCold = false;

  constructor(graph: MechanismGraph, options: Partial<PoseSolverOptions> = {}) {
    this.options = Object.freeze({ ...DEFAULT_SOLVER_OPTIONS, ...options });
    // Checked up front and reported by every solve, not thrown: only an invalid graph throws.
    this.optionsProblem = solverOptionsProblem(this.options);
    this.mechanism = new CompiledMechanism(graph);
    this.lm = new LevenbergMarquardt(this.mechanism);
    this.predictor = new SweepPredictor(this.mechanism);
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
    this.from = this.zeros;
    this.lmOptions = { tolerance: this.options.toleranceMm, maxIterations: this.options.maxIterations, tau: 1e-10, reuseFactorisation: false };
  }

  /**
   * Whether the mechanism holds a closed pose: the last solve's answer, or after a failure the
   * last good pose or the last continuation sub-step that closed (false before any solve, after
   * reset, and when a cold start could not even settle the design pose).
   */
  get holdsGoodPose(): boolean {
    return this.holdsClosed;
  }

  /** The inputs of the last good pose. */
  get inputs(): Readonly<PoseInputs> {
    return vectorToInputs(this.goodInputs);
  }

  /**
   * The last good pose as plain data (a copy), to seed another solver of a mechanism built by
   * the same layout from a slightly different design; null before any good pose.
   */
  goodPose(): SolverSeed | null {
    if (!this.hasGood) return null;
    return { coord: Float64Array.from(this.goodCoord), sph: Float64Array.from(this.goodSph), inputs: Float64Array.from(this.goodInputs) };
  }

  /**
   * Start the next solve from a pose of another solver (goodPose): with the same inputs it is
   * Newton's method from that pose on this mechanism's constraints, whose first step is the
   * implicit-function tangent -C_x^-1 C(x, p) of the design change. The seed must come from a
   * mechanism of the same shape (same layout and joints); a seed of another shape is ignored
   * (false) and the solver keeps its own warm start.
   */
  seedFrom(seed: SolverSeed): boolean {
    if (seed.coord.length !== this.goodCoord.length || seed.sph.length !== this.goodSph.length || seed.inputs.length !== N_INPUTS) return false;
    this.goodCoord.set(seed.coord);
    this.goodSph.set(seed.sph);
    this.goodInputs.set(seed.inputs);
    this.hasGood = true;
    this.hasPrev = false;
    this.failedAt = undefined;
    this.predictor.clear();
    this.lm.forgetFactorisation();
    return true;
  }

  /** Forget the warm start: the next solve starts from the design pose. */
  reset(): void {
    this.holdsClosed = false;
    this.failedAt = undefined;
    this.hasGood = false;
    this.hasPrev = false;
    this.predictor.clear();
    this.lm.forgetFactorisation();
  }

  /**
   * Solve the pose at `target`. With `warm` (default) it continues from the last good
   * pose; otherwise from the design pose with all inputs zero.
   *
   * The continuation loop stays in one piece on purpose: its state (how far it got, the
   * sub-step grid, bisections, work counts) is a handful of numbers in locals; spread over
   * methods it would need fields or an object per solve on the hot path.
   */
  solve(inputs: PoseInputs, warm = true): SolveResult {
    if (this.optionsProblem !== undefined) return failedResult('invalid-input', this.optionsProblem);
    const target = this.target;
    // Read by name once (in INPUT_NAMES order); everything after works on the vector.
    readInputs(target, inputs);
    for (let k = 0; k < N_INPUTS; k++) {
      if (!Number.isFinite(target[k])) {
        const name = INPUT_NAMES[k];
        return failedResult('invalid-input', `input ${name} is ${String(inputs[name])}; every input must be a finite number`);
      }
    }
    const m = this.mechanism;
    // Past a boundary already found from this good pose: the loop broke there, so anything
    // further along the same line is on no branch reachable from here.
    if (warm && this.hasGood && this.failedAt && liesBeyond(this.goodInputs, this.failedAt.inputs, target)) {
      return { ...this.failedAt.result, message: `${this.failedAt.result.message}; ${describeInputs(target)} lies beyond it`, iterations: 0, evaluations: 0, substeps: 1 };
    }
    const early = this.startPose(target, warm);
    if (early !== undefined) return early;
    const from = this.from;
    let predicted = this.predictedStart;
    const opts = this.options;
    let pieces = this.substepsNeeded(from, target);
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
    let checkTurn = this.turning && from === this.goodInputs;
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
    return this.accept(last!, target, warm, iterations, evaluations, substeps);
  }

  /**
   * Put the mechanism at the start of the solve and set from / predictedStart / turning /
   * startedCold. Returns a result only when a cold start cannot even settle the design pose.
   */
  private startPose(target: Float64Array, warm: boolean): SolveResult | undefined {
    const m = this.mechanism;
    this.startedCold = false;
    this.turning = false;
    this.predictedStart = false;
    if (warm && this.hasGood && this.hasPrev && reverses(this.goodInputs, this.prevInputs, target)) {
      // Going back the way the last step came: start from the previous good pose when the
      // target is at or past it, else from between the two, so the linkage retraces its own
      // branch instead of being solved afresh next to a turning point.
      const back = backFraction(this.goodInputs, this.prevInputs, target);
      this.turning = true;
      if (back >= 1 - 1e-12) {
        this.from = this.prevInputs;
        m.applyInputVector(this.prevInputs);
        m.setState(this.prevCoord, this.prevSph);
      } else {
        this.from = this.goodInputs;
        m.setState(this.goodCoord, this.goodSph);
        m.extrapolate(this.prevCoord, this.prevSph, back);
      }
      return undefined;
    }
    if (warm && this.hasGood) {
      this.from = this.goodInputs;
      m.setState(this.goodCoord, this.goodSph);
      // The first stretch starts at the good pose, whatever the predictor guesses: the jump
      // check measures from here, and a retry starts from here.
      m.getState(this.stepCoord, this.stepSph);
      this.predictedStart = this.predictor.predict(target);
      return undefined;
    }
    this.startedCold = true;
    this.from = this.zeros;
    m.applyInputVector(this.zeros);
    m.resetToDesign();
    const settled = this.settleDesignPose();
    this.holdsClosed = settled === undefined;
    return settled;
  }

  /**
   * Settle at zero inputs first: a design position that does not quite close in this mode (a
   * wheel centre whose height does not match the tyre, for ground contact) is brought to the
   * nearest closed pose before continuation, with no jump check, since no input has moved yet.
   */
  private settleDesignPose(): SolveResult | undefined {
    const m = this.mechanism;
    const settle = this.lm.solve(this.lmOptions);
    if (settle.ending === 'non-finite') {
      return failedResult('did-not-converge', 'the constraints could not be evaluated at the design position (does the design hold a non-finite number?)');
    }
    if (settle.ending !== 'converged') {
      const culprit = settle.worstResidual >= 0 ? m.constraintLabelOfRow(settle.worstResidual) : undefined;
      const result = failedResult(
        settle.maxResidual > this.options.assemblyGapMm ? 'cannot-assemble' : 'did-not-converge',
        `the design position cannot be closed in this mode at zero inputs; worst: ${culprit} (${fmtMm(settle.maxResidual)} mm)`,
        culprit,
        settle.maxResidual,
        settle,
      );
      result.substeps = 1;
      return result;
    }
    return undefined;
  }

  /** Continuation sub-steps the input change needs: at most maxStepDeg / maxStepMm each. */
  private substepsNeeded(from: Float64Array, target: Float64Array): number {
    const opts = this.options;
    let span = 0;
    for (let k = 0; k < N_INPUTS; k++) {
      const d = Math.abs(target[k] - from[k]);
      span = Math.max(span, INPUT_IS_DEG[k] ? d / opts.maxStepDeg : d / opts.maxStepMm);
    }
    return Math.max(1, Math.ceil(span - 1e-12));
  }

  /** Accept the pose reached (the mechanism's state) and remember it as the warm start. */
  private accept(res: LmOutcome, target: Float64Array, warm: boolean, iterations: number, evaluations: number, substeps: number): SolveResult {
    const m = this.mechanism;
    const same = this.hasGood && warm && sameVector(target, this.goodInputs);
    this.failedAt = undefined;
    this.holdsClosed = true;
    if (same) {
      // The same pose again: keep the direction the sweep came from.
      m.getState(this.goodCoord, this.goodSph);
      return reachedResult(res, iterations, evaluations, substeps, this.options.singularPivotRatio);
    }
    const spare = this.spareInputs;
    if (this.hasGood && warm && !this.turning) {
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
    if (this.startedCold) this.predictor.clear();
    this.predictor.record(target);
    return reachedResult(res, iterations, evaluations, substeps, this.options.singularPivotRatio);
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
    const m = this.mechanism;
    // Back to the last good pose so the caller (a sweep) can go on from it.
    if (this.hasGood) {
      // the good pose's inputs too: its coordinates with the partly reached inputs close no loop
      m.applyInputVector(this.goodInputs);
      m.setState(this.goodCoord, this.goodSph);
    }
    const result = failureResult({
      out,
      jump,
      where: describeInputs(target),
      reached,
      startedCold: this.startedCold,
      culprit: out.worstResidual >= 0 ? m.constraintLabelOfRow(out.worstResidual) : undefined,
      maxIterations: this.options.maxIterations,
      assemblyGapMm: this.options.assemblyGapMm,
    });
    // Count the whole attempt, every sub-step and retry, not only the last LM run.
    result.iterations = iterations;
    result.evaluations = evaluations;
    result.substeps = substeps;
    // A boundary (the loop cannot close) is remembered; a refused jump is not one.
    if (this.hasGood && !jump) this.failedAt = { inputs: target.slice(), result: { ...result } };
    return result;
  }
}
