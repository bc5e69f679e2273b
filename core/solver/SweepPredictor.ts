/**
 * The pose solver's predictor along a sweep: it keeps the poses accepted along the current
 * straight line of inputs (a ring of LINE_HISTORY) and, when the next target lies on that
 * line, extrapolates their unknowns to it, so the corrector starts within about 1e-8 mm of
 * closure on a smooth sweep. It owns its buffers (allocated once) and reads and writes the
 * mechanism's unknowns through KinematicTree.getUnknowns / setUnknowns.
 */

import type { KinematicTree } from './KinematicTree';
import { collinearStep, inputDistance, N_INPUTS } from './inputVector';

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

export class SweepPredictor {
  /**
   * Accepted poses along the current straight line of inputs, oldest first (at most
   * LINE_HISTORY): their inputs and their unknowns (KinematicTree.getUnknowns). A pose off
   * the line starts a new line from the pose before it.
   */
  private readonly lineInputs: Float64Array[];
  private readonly lineState: Float64Array[];
  private lineCount = 0;
  private lineHead = 0;
  private readonly linePos = new Float64Array(LINE_HISTORY);
  /** lineGap[k]: distance in inputs from line pose k-1 to pose k (lineGap[0] unused). */
  private readonly lineGap = new Float64Array(LINE_HISTORY);
  private readonly lineWeight = new Float64Array(LINE_HISTORY);
  private readonly predicted: Float64Array;
  /** collinearStep's answer: [length of the earlier step, ratio of the later to it]. */
  private readonly line = new Float64Array(2);

  constructor(private readonly tree: KinematicTree) {
    this.lineInputs = Array.from({ length: LINE_HISTORY }, () => new Float64Array(N_INPUTS));
    this.lineState = Array.from({ length: LINE_HISTORY }, () => new Float64Array(tree.nVars));
    this.predicted = new Float64Array(tree.nVars);
  }

  /** Forget the line: the next pose recorded starts a new one. */
  clear(): void {
    this.lineCount = 0;
  }

  /** Add the pose just accepted (the mechanism's state) to the line history. */
  record(inputs: Float64Array): void {
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
    this.tree.getUnknowns(this.lineState[at]);
    this.lineCount = k + 1;
  }

  /** Buffer index of the j-th pose on the line, oldest first (a ring of LINE_HISTORY). */
  private slot(j: number): number {
    const i = this.lineHead + j;
    return i >= LINE_HISTORY ? i - LINE_HISTORY : i;
  }

  /**
   * When the target lies on the line the last poses were solved along, set the mechanism's
   * unknowns to their extrapolation to it and return true (positions measured along the line):
   * with
   * LINE_HISTORY evenly spaced poses, one step on, the least-squares fit of FIT_DEGREE; else
   * the interpolating polynomial through up to INTERPOLATED of them. Along a smooth sweep each
   * extra pose gains about an order of magnitude: measured on the demos' lean x steer sweep,
   * the residual at the guess falls from about 2e-4 mm (three poses) to about 1e-8 mm (the
   * fit), so the corrector usually needs no new Jacobian (see
   * LmOptions.reuseFactorisation). Far beyond the last step (more than 1.5 steps) only the last
   * three poses are used. A bad guess is harmless: the corrector and the jump check follow.
   */
  predict(target: Float64Array): boolean {
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
    this.tree.setUnknowns(x);
    return true;
  }
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
