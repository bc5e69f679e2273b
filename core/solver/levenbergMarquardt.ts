/**
 * A small dense Levenberg-Marquardt solver for nonlinear least squares, min 1/2 |r(x)|^2.
 *
 * Damping update and stopping rules follow K. Madsen, H. B. Nielsen, O. Tingleff, "Methods
 * for Non-Linear Least Squares Problems", DTU 2004 (Algorithm 3.16, with Marquardt's diagonal
 * scaling as in J. J. Moré, 1978). Works on a problem object that owns its state, so
 * rotations can be updated on their manifold. Every array is allocated once per problem size.
 * It never throws for failing to converge: it reports how it ended.
 */

import { choleskyFactor, choleskySolve } from './denseCholesky';

export interface LeastSquaresProblem {
  readonly nVars: number;
  readonly nResiduals: number;
  /** Residuals at the current state; false if any is not finite. */
  residuals(r: Float64Array): boolean;
  /** Row-major nResiduals x nVars Jacobian at the state of the last `residuals` call. */
  jacobian(jac: Float64Array): void;
  /**
   * Optional static sparsity: for each residual row, the columns that can be non-zero.
   * With it, J^T J is accumulated from the non-zeros only (the block-sparse structure of a
   * linkage: each loop touches few joints).
   */
  jacobianPattern?(): Int32Array[];
  /** Apply an increment to the state. */
  step(h: Float64Array): void;
  save(): void;
  restore(): void;
}

export type LmEnding =
  | 'converged' // max |r| below the tolerance
  | 'stationary' // gradient vanished with the residual still above tolerance (no closure)
  | 'small-step' // the step shrank to nothing
  | 'max-iterations'
  | 'non-finite' // the residual could not be evaluated at the start
  | 'invalid-input'; // the options are unusable (LmOutcome.problem says which and why); nothing was evaluated

export interface LmOptions {
  /** Converged when max |r_i| is below this. */
  tolerance: number;
  maxIterations: number;
  /** Initial damping relative to diag(J^T J) (Madsen's tau, with Marquardt scaling). */
  tau: number;
  /**
   * Start with up to two chord steps on the Jacobian and factorisation kept from an earlier
   * solve (a warm start next to the last pose, such as a predicted point along a sweep): a
   * start that close converges on them without forming a new Jacobian. Each step must shrink
   * the largest residual at least tenfold; otherwise, or if it would not close, the solve goes
   * on as plain LM with a fresh Jacobian from wherever the chord steps got to. Default false.
   */
  reuseFactorisation?: boolean;
}

export interface LmOutcome {
  ending: LmEnding;
  iterations: number;
  evaluations: number;
  maxResidual: number;
  /** Smallest/largest pivot of the scaled normal matrix at the end: a conditioning measure. */
  pivotRatio: number;
  /** Index of the residual with the largest magnitude at the end. */
  worstResidual: number;
  /** For 'invalid-input': the option at fault, its value and what it must be; otherwise ''. */
  problem: string;
}

/**
 * The first problem with a set of LM options, naming the option and the value found; undefined
 * when they are usable. Checked before a solve touches the problem, as mature least-squares
 * solvers check theirs: a zero or negative tolerance could never be met, a non-positive damping
 * would leave a singular normal matrix undamped, and an iteration cap below 1 solves nothing.
 */
export function lmOptionsProblem(opts: LmOptions): string | undefined {
  if (!(Number.isFinite(opts.tolerance) && opts.tolerance > 0)) return `LM option tolerance is ${opts.tolerance}; it must be a finite number above 0`;
  if (!(Number.isInteger(opts.maxIterations) && opts.maxIterations >= 1)) return `LM option maxIterations is ${opts.maxIterations}; it must be a whole number, 1 or more`;
  if (!(Number.isFinite(opts.tau) && opts.tau > 0)) return `LM option tau is ${opts.tau}; it must be a finite number above 0`;
  return undefined;
}

const STAGNATION_WINDOW = 10;
/** Chord steps tried on a kept factorisation before forming a fresh Jacobian. */
const REUSED_CHORD_STEPS = 2;
/**
 * A kept factorisation's conditioning screen stands for the current pose only while it is
 * this recent (solves since it was made) and this comfortable; otherwise the end of a solve
 * re-forms the Jacobian at the solution. Healthy poses of the demos screen at 0.1-0.6; a dead
 * centre drives the screen towards zero, so a pose one sweep step from a screen of 1e-2
 * cannot be one.
 */
const SCREEN_TRUST_AGE = 4;
const SCREEN_TRUST_LEVEL = 1e-2;
/** Try a chord step once the residual is within this factor of the tolerance. */
const CHORD_BELOW = 1e4;

export class LevenbergMarquardt {
  private readonly n: number;
  private readonly m: number;
  private readonly r: Float64Array;
  private readonly rTrial: Float64Array;
  private readonly jac: Float64Array;
  private readonly a: Float64Array;
  private readonly aDamped: Float64Array;
  private readonly g: Float64Array;
  private readonly negG: Float64Array;
  private readonly h: Float64Array;
  private readonly scale: Float64Array;
  private readonly pivots: Float64Array;
  private normalValid = false;
  private readonly costHistory = new Float64Array(STAGNATION_WINDOW);
  private readonly pattern: Int32Array[] | undefined;
  private readonly invSqrtDiag: Float64Array;
  /** Conditioning screen from the last damped factorisation, and its damping. */
  private screen = 0;
  private screenMu = 1;
  /**
   * Solves begun since jac and aDamped last held a matching Jacobian and damped factor
   * (0: made in this solve; Infinity: none).
   */
  private factorAge = Infinity;
  /** tau of the solve under way, for a factorisation re-formed at its end. */
  private tau = 1e-10;
  private readonly conditioningWork: Float64Array;

  constructor(private readonly problem: LeastSquaresProblem) {
    const n = problem.nVars;
    const m = problem.nResiduals;
    this.n = n;
    this.m = m;
    this.r = new Float64Array(m);
    this.rTrial = new Float64Array(m);
    this.jac = new Float64Array(m * n);
    this.a = new Float64Array(n * n);
    this.aDamped = new Float64Array(n * n);
    this.g = new Float64Array(n);
    this.negG = new Float64Array(n);
    this.h = new Float64Array(n);
    this.scale = new Float64Array(n);
    this.pivots = new Float64Array(n);
    this.invSqrtDiag = new Float64Array(n);
    this.conditioningWork = new Float64Array(n * n);
    // Columns sorted within each row, so the sparse products land in the lower triangle.
    this.pattern = problem.jacobianPattern?.().map((cols) => Int32Array.from(cols).sort());
  }

  /** The residual vector at the end of the last solve. */
  get lastResiduals(): Float64Array {
    return this.r;
  }

  /** Drop the kept factorisation (the state it was made at is no longer near). */
  forgetFactorisation(): void {
    this.factorAge = Infinity;
  }

  /**
   * Solve from the problem's current state. The outcome record is reused by the next solve.
   *
   * One method on purpose: the iteration's state (damping mu and nu, cost, largest residual,
   * counts) lives in locals that V8 keeps unboxed; split into methods it would move to fields
   * or be passed as boxed numbers on every call of the hot loop.
   */
  solve(opts: LmOptions): LmOutcome {
    const { n, r, rTrial, a, aDamped, g, negG, h, scale } = this;
    const p = this.problem;
    const problem = lmOptionsProblem(opts);
    if (problem !== undefined) return this.refuse(problem);
    this.outcome.problem = '';
    let evaluations = 1;
    this.normalValid = false;
    this.factorAge++;
    this.tau = opts.tau;
    if (!p.residuals(r)) return this.nonFiniteStart();
    let cost = halfSquaredNorm(r);
    let maxR = maxAbs(r);
    if (n === 0 || maxR < opts.tolerance) {
      return this.finish(maxR < opts.tolerance ? 'converged' : 'stationary', 0, evaluations, maxR);
    }
    let iterations = 0;
    if (opts.reuseFactorisation && this.factorAge < Infinity) {
      for (let c = 0; c < REUSED_CHORD_STEPS && iterations < opts.maxIterations; c++) {
        const before = maxR;
        const after = this.chordStep();
        evaluations += after === null ? 2 : 1;
        iterations++;
        if (after === null) break; // rejected; state and r restored
        maxR = after;
        if (maxR < opts.tolerance) return this.finish('converged', iterations, evaluations, maxR);
        if (maxR > 0.1 * before) break;
      }
      cost = halfSquaredNorm(r);
    }
    this.normalEquations();
    // With Marquardt's scaling D = diag(J^T J) the damping is dimensionless: mu = tau.
    let mu = opts.tau;
    let nu = 2;
    const firstIteration = iterations;
    const costHistory = this.costHistory;
    while (iterations < opts.maxIterations) {
      // Stagnation: a run that creeps (cost down by less than 1e-4 relative over the last
      // STAGNATION_WINDOW iterations) is stuck at a gap, not converging; say so early
      // instead of burning the iteration budget.
      costHistory[iterations % STAGNATION_WINDOW] = cost;
      if (iterations - firstIteration >= STAGNATION_WINDOW && cost > (1 - 1e-4) * costHistory[(iterations + 1) % STAGNATION_WINDOW]) {
        return this.finish('stationary', iterations, evaluations, maxR);
      }
      iterations++;
      // Stationary point with residual left: the loop cannot close here.
      if (maxAbs(g) < 1e-15 * Math.max(1, maxDiagonal(a, n))) {
        return this.finish('stationary', iterations, evaluations, maxR);
      }
      // Solve (A + mu D) h = -g, D = diag(A) floored (Marquardt scaling keeps mm and
      // radian variables on an equal footing).
      for (let i = 0; i < n; i++) negG[i] = -g[i];
      if (!this.factorDamped(mu)) {
        mu *= nu;
        nu *= 2;
        continue;
      }
      choleskySolve(aDamped, n, negG, h);
      let hNorm = 0;
      for (let i = 0; i < n; i++) hNorm += h[i] * h[i];
      if (Math.sqrt(hNorm) < 1e-15) {
        return this.finish(maxR < opts.tolerance ? 'converged' : 'small-step', iterations, evaluations, maxR);
      }
      p.save();
      p.step(h);
      evaluations++;
      const finite = p.residuals(rTrial);
      const newCost = finite ? halfSquaredNorm(rTrial) : Infinity;
      // Predicted decrease L(0) - L(h) = 1/2 h^T (mu D h - g).
      let predicted = 0;
      for (let i = 0; i < n; i++) predicted += h[i] * (mu * scale[i] * h[i] - g[i]);
      predicted *= 0.5;
      const rho = predicted > 0 ? (cost - newCost) / predicted : -1;
      if (finite && rho > 0) {
        r.set(rTrial);
        cost = newCost;
        maxR = maxAbs(r);
        if (maxR < opts.tolerance) return this.finish('converged', iterations, evaluations, maxR);
        // Nearly there: one chord step (the Jacobian and factorisation just used, with the new
        // residual) usually finishes the job, since the last step barely moved the Jacobian.
        // It costs a residual and two triangular solves instead of a new Jacobian and factor.
        if (maxR < CHORD_BELOW * opts.tolerance && iterations < opts.maxIterations) {
          const chord = this.chordStep();
          evaluations++;
          if (chord !== null && chord < opts.tolerance) {
            iterations++;
            return this.finish('converged', iterations, evaluations, chord);
          }
          if (chord !== null) {
            cost = halfSquaredNorm(r);
            maxR = chord;
          }
        }
        this.normalEquations();
        const t = 2 * rho - 1;
        mu *= Math.max(1 / 3, 1 - t * t * t);
        nu = 2;
      } else {
        // Rejected (or non-finite, which only shrinks the step): back to the saved state.
        p.restore();
        p.residuals(r);
        evaluations++;
        mu *= nu;
        nu *= 2;
        if (!Number.isFinite(mu) || mu > 1e30) {
          return this.finish('stationary', iterations, evaluations, maxR);
        }
      }
    }
    return this.finish('max-iterations', iterations, evaluations, maxR);
  }

  /**
   * One chord (simplified Newton) step with the Jacobian and damped factorisation of the
   * last iteration: h = -(A + mu D)^-1 J_old^T r, reusing that factor as it stands. Kept only if it lowers the residual; returns
   * the new max |r|, or null when it was rejected (state and r restored).
   */
  private chordStep(): number | null {
    const { n, m, r, rTrial, jac, aDamped, negG, h } = this;
    for (let i = 0; i < n; i++) {
      let gi = 0;
      for (let k = 0; k < m; k++) gi += jac[k * n + i] * r[k];
      negG[i] = -gi;
    }
    choleskySolve(aDamped, n, negG, h);
    const p = this.problem;
    const before = maxAbs(r);
    p.save();
    p.step(h);
    if (p.residuals(rTrial)) {
      const after = maxAbs(rTrial);
      if (after < before) {
        r.set(rTrial);
        // the Jacobian is now one step stale: the normal equations are recomputed by the caller
        return after;
      }
    }
    p.restore();
    p.residuals(r);
    return null;
  }

  /**
   * A = J^T J (lower triangle; the dense path fills both), g = J^T r at the current state,
   * and the Marquardt scaling diag(A).
   */
  private normalEquations(): void {
    const { n, m, r, jac, a, g, scale, pattern } = this;
    this.problem.jacobian(jac);
    this.normalValid = true;
    // jac no longer matches the kept factor until the next factorisation.
    this.factorAge = Infinity;
    if (pattern) {
      a.fill(0);
      g.fill(0);
      for (let k = 0; k < m; k++) {
        const cols = pattern[k];
        const row = k * n;
        const rk = r[k];
        for (let p = 0; p < cols.length; p++) {
          const i = cols[p];
          const ji = jac[row + i];
          if (ji === 0) continue;
          g[i] += ji * rk;
          for (let q = 0; q <= p; q++) {
            const j = cols[q];
            a[i * n + j] += ji * jac[row + j];
          }
        }
      }
      // Columns are sorted, so j <= i: only the lower triangle is formed, which is all the
      // Cholesky factor and the conditioning check read.
    } else {
      for (let i = 0; i < n; i++) {
        let gi = 0;
        for (let k = 0; k < m; k++) gi += jac[k * n + i] * r[k];
        g[i] = gi;
        for (let j = 0; j <= i; j++) {
          let s = 0;
          for (let k = 0; k < m; k++) s += jac[k * n + i] * jac[k * n + j];
          a[i * n + j] = s;
          a[j * n + i] = s;
        }
      }
    }
    let maxD = 0;
    for (let i = 0; i < n; i++) maxD = Math.max(maxD, a[i * n + i]);
    for (let i = 0; i < n; i++) scale[i] = Math.max(a[i * n + i], 1e-12 * maxD, 1e-300);
  }

  /** One outcome record per solver, overwritten by each solve (no allocation per pose). */
  private readonly outcome: LmOutcome = { ending: 'converged', iterations: 0, evaluations: 0, maxResidual: 0, pivotRatio: 1, worstResidual: -1, problem: '' };

  /** The outcome when the residual cannot be evaluated at the start (one evaluation made). */
  private nonFiniteStart(): LmOutcome {
    const o = this.outcome;
    o.ending = 'non-finite';
    o.iterations = 0;
    o.evaluations = 1;
    o.maxResidual = Infinity;
    o.pivotRatio = 0;
    o.worstResidual = worstIndex(this.r);
    return o;
  }

  /** The outcome for unusable options: nothing evaluated, the state untouched. */
  private refuse(problem: string): LmOutcome {
    const o = this.outcome;
    o.ending = 'invalid-input';
    o.iterations = 0;
    o.evaluations = 0;
    o.maxResidual = Infinity;
    o.pivotRatio = 0;
    o.worstResidual = -1;
    o.problem = problem;
    return o;
  }

  private finish(ending: LmEnding, iterations: number, evaluations: number, maxResidual: number): LmOutcome {
    const o = this.outcome;
    o.ending = ending;
    o.iterations = iterations;
    o.evaluations = evaluations;
    o.maxResidual = maxResidual;
    o.pivotRatio = this.pivotRatioHere();
    o.worstResidual = worstIndex(this.r);
    return o;
  }

  /**
   * The conditioning measure at the end of a solve. Damping only raises pivots, so a screen
   * far above the damping proves the Jacobian well conditioned; only a doubtful screen pays
   * for the exact check. A screen from a kept factorisation (a solve that converged on reused
   * chord steps, or at its start) speaks for this pose only while it is recent and
   * comfortable; otherwise the Jacobian is re-formed here first, which also gives the next
   * solve a fresh factor.
   */
  private pivotRatioHere(): number {
    if (this.n === 0) return 1;
    const trusted = this.factorAge === 0 || (this.factorAge <= SCREEN_TRUST_AGE && this.screen > SCREEN_TRUST_LEVEL);
    if (!trusted) this.refactor();
    return this.screen > 1e3 * this.screenMu && this.screen > 1e-8 ? this.screen : this.conditioning();
  }

  /** J^T J and its damped factor (damping tau, as a solve starts) at the current state, with its screen. */
  private refactor(): void {
    this.normalEquations();
    this.factorDamped(this.tau);
  }

  /**
   * Factor A + mu D into aDamped (kept for later chord steps) with its conditioning screen:
   * each pivot over its damped diagonal is how much of that column is independent of the
   * ones before it, free from the factorisation. False, with no factor kept, when A + mu D is
   * not positive definite.
   */
  private factorDamped(mu: number): boolean {
    const { n, a, aDamped, scale, pivots } = this;
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) aDamped[i * n + j] = a[i * n + j];
    for (let i = 0; i < n; i++) aDamped[i * n + i] += mu * scale[i];
    if (!choleskyFactor(aDamped, n, pivots)) {
      this.factorAge = Infinity;
      this.screen = 0;
      return false;
    }
    let screen = Infinity;
    for (let i = 0; i < n; i++) screen = Math.min(screen, pivots[i] / (a[i * n + i] + mu * scale[i]));
    this.screen = screen;
    this.screenMu = mu;
    this.factorAge = 0;
    return true;
  }


  /**
   * Conditioning of J at the current state: factor the normal matrix scaled to unit
   * diagonal and return the smallest pivot over the largest (about 1 / cond(J)^2).
   * Zero means J lost rank: a dead centre or a degenerate linkage.
   */
  private conditioning(): number {
    const { n, a, pivots, invSqrtDiag } = this;
    // Its own work array: the damped factor in aDamped is kept for the next solve's chord steps.
    const aDamped = this.conditioningWork;
    if (n === 0) return 1;
    // The normal matrix from the last accepted step is close enough to the end state for a
    // conditioning check; recompute only when none was formed yet.
    if (!this.normalValid) this.normalEquations();
    for (let i = 0; i < n; i++) {
      const d = a[i * n + i];
      invSqrtDiag[i] = d > 0 ? 1 / Math.sqrt(d) : 0;
    }
    for (let i = 0; i < n; i++) {
      const di = invSqrtDiag[i];
      for (let j = 0; j <= i; j++) aDamped[i * n + j] = a[i * n + j] * di * invSqrtDiag[j];
    }
    if (!choleskyFactor(aDamped, n, pivots)) return 0;
    let lo = Infinity;
    let hi = 0;
    for (let i = 0; i < n; i++) {
      lo = Math.min(lo, pivots[i]);
      hi = Math.max(hi, pivots[i]);
    }
    return hi > 0 ? lo / hi : 0;
  }
}

function halfSquaredNorm(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return 0.5 * s;
}

function maxAbs(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) {
    const x = Math.abs(v[i]);
    if (!(x <= s)) s = x; // NaN propagates as "large"
  }
  return s;
}

function worstIndex(v: Float64Array): number {
  // Start from a double (-Infinity, not -1): a small-integer start made V8 box every
  // comparison value on the heap, about 170 bytes of garbage per pose.
  let best = -1;
  let s = -Infinity;
  for (let i = 0; i < v.length; i++) {
    const x = Number.isFinite(v[i]) ? Math.abs(v[i]) : Infinity;
    if (x > s) {
      s = x;
      best = i;
    }
  }
  return best;
}

function maxDiagonal(a: Float64Array, n: number): number {
  let s = 0;
  for (let i = 0; i < n; i++) s = Math.max(s, a[i * n + i]);
  return s;
}
