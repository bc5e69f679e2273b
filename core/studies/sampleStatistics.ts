/**
 * Statistics of a sample: mean, standard deviation, percentiles and a histogram. Values that
 * are not finite (a sample that could not be assembled) are left out.
 *
 * Percentiles interpolate linearly between order statistics: the p-th percentile of n sorted
 * values is at position (n - 1) p / 100 (R. J. Hyndman and Y. Fan, "Sample quantiles in
 * statistical packages", The American Statistician 50, 1996, their definition 7: from memory;
 * the default of R and NumPy).
 */

export interface Histogram {
  /** Bin edges, one more than the bins; the last bin includes its upper edge. */
  edges: number[];
  counts: number[];
}

export interface SampleSummary {
  count: number;
  mean: number;
  /** Sample standard deviation (n - 1 in the denominator); 0 for one value. */
  std: number;
  min: number;
  max: number;
  p5: number;
  p50: number;
  p95: number;
  histogram: Histogram;
}

/** Percentile p (0..100) of values sorted ascending (Hyndman and Fan, definition 7). */
export function percentileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const pos = ((n - 1) * p) / 100;
  const lo = Math.floor(pos);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (pos - lo) * (sorted[hi] - sorted[lo]);
}

/** Equal bins from the smallest to the largest value; all in one bin when they are equal. */
export function histogram(sorted: ArrayLike<number>, bins: number): Histogram {
  const n = sorted.length;
  if (n === 0) return { edges: [], counts: [] };
  const lo = sorted[0];
  const hi = sorted[n - 1];
  if (!(hi > lo)) return { edges: [lo, hi], counts: [n] };
  const width = (hi - lo) / bins;
  const edges = Array.from({ length: bins + 1 }, (_, i) => (i === bins ? hi : lo + i * width));
  const counts = new Array<number>(bins).fill(0);
  for (let i = 0; i < n; i++) counts[Math.min(bins - 1, Math.floor((sorted[i] - lo) / width))]++;
  return { edges, counts };
}

/** The summary of the finite values of a sample; null when it has none. */
export function summarise(values: ArrayLike<number>, bins = 20): SampleSummary | null {
  const finite: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite.push(values[i]);
  const n = finite.length;
  if (n === 0) return null;
  const sorted = Float64Array.from(finite).sort();
  let sum = 0;
  for (let i = 0; i < n; i++) sum += sorted[i];
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (sorted[i] - mean) ** 2;
  return {
    count: n,
    mean,
    std: n > 1 ? Math.sqrt(ss / (n - 1)) : 0,
    min: sorted[0],
    max: sorted[n - 1],
    p5: percentileOfSorted(sorted, 5),
    p50: percentileOfSorted(sorted, 50),
    p95: percentileOfSorted(sorted, 95),
    histogram: histogram(sorted, bins),
  };
}
