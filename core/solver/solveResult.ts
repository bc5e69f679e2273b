/**
 * How a pose solve ends: the named statuses, the result record, and the words for each way
 * it can end. Pure functions of what the solve found (an LM outcome, whether a branch jump
 * was refused, how far it got): the pose solver decides, this module says it.
 */

import type { LmOutcome } from './levenbergMarquardt';

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

/** A failed solve: nothing reached; the residual only when one was evaluated and finite. */
export function failedResult(status: SolveStatus, message: string, culprit?: string, gap = NaN, out?: LmOutcome): SolveResult {
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

/** A pose reached: 'converged', or 'singular' when its conditioning is below the threshold. */
export function reachedResult(res: LmOutcome, iterations: number, evaluations: number, substeps: number, singularPivotRatio: number): SolveResult {
  if (res.pivotRatio < singularPivotRatio) {
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

/** What a continuation that stopped short of its target found, for failureResult. */
export interface StoppedSolve {
  /** The last LM run. */
  out: LmOutcome;
  /** Whether it stopped because a converged step jumped branch (refused), not because LM failed. */
  jump: boolean;
  /** The target in words (describeInputs). */
  where: string;
  /** Fraction of the way to the target reached, 0..1. */
  reached: number;
  /** Whether the solve started from the design pose. */
  startedCold: boolean;
  /** Label of the constraint with the worst residual, if any. */
  culprit: string | undefined;
  maxIterations: number;
  assemblyGapMm: number;
}

/** The status and message for a continuation that stopped short. */
export function failureResult(s: StoppedSolve): SolveResult {
  const { out, jump, where, reached, culprit } = s;
  const gap = out.maxResidual;
  if (jump && reached === 0 && s.startedCold) {
    return failedResult(
      'singular',
      `from the design position the first step toward ${where} moves a joint far more than the inputs allow: ` +
        'the design position may not close in this mode (for ground contact, check the wheel-centre height against the tyre radii) or sits at a dead centre',
      culprit,
      gap,
      out,
    );
  }
  if (jump) {
    return failedResult(
      'singular',
      `the linkage passes a dead centre or would switch assembly branch before reaching ${where} (${Math.round(reached * 100)} % of the way)`,
      culprit,
      gap,
      out,
    );
  }
  if (out.ending === 'non-finite') {
    return failedResult('did-not-converge', `the constraints could not be evaluated at ${where}`, culprit, gap, out);
  }
  if (out.ending === 'max-iterations') {
    return failedResult('did-not-converge', `no convergence in ${s.maxIterations} iterations at ${where}; worst: ${culprit} (${fmtMm(gap)} mm)`, culprit, gap, out);
  }
  if (gap > s.assemblyGapMm) {
    return failedResult('cannot-assemble', `${culprit} cannot close at ${where}: gap ${fmtMm(gap)} mm`, culprit, gap, out);
  }
  return failedResult('did-not-converge', `stalled ${fmtMm(gap)} mm short of closure at ${where}; worst: ${culprit}`, culprit, gap, out);
}

/** A length for a message: three decimals, or three significant digits when small. */
export function fmtMm(x: number): string {
  return Number.isFinite(x) ? (Math.abs(x) >= 0.01 ? x.toFixed(3) : x.toExponential(2)) : String(x);
}
