/**
 * The y range of a curve chart: wide enough to show every limit line the chart draws (a
 * tolerance, a joint's rating), so an edit never rescales a limit out of sight; and, when the
 * user holds the axis while editing, a fixed range taken from the chart as it was.
 */
import type { EChartsCoreOption } from 'echarts/core';

type Obj = Record<string, unknown>;

const asArray = <T,>(x: T | T[] | undefined): T[] => (x === undefined ? [] : Array.isArray(x) ? x : [x]);

/** Headroom beyond a limit line, as a share of the line's distance from zero (so its label shows). */
export const LIMIT_HEADROOM = 0.15;

/** The y values of the limit lines drawn on y axis `index` (markLine entries with a yAxis value). */
export function limitValues(option: EChartsCoreOption, index: number): number[] {
  const out: number[] = [];
  for (const s of asArray((option as Obj).series as Obj | Obj[])) {
    if (((s.yAxisIndex as number | undefined) ?? 0) !== index) continue;
    const ml = s.markLine as Obj | undefined;
    for (const d of asArray(ml?.data as Obj[] | undefined)) if (typeof d.yAxis === 'number' && Number.isFinite(d.yAxis)) out.push(d.yAxis);
  }
  return out;
}

/** The extent of the data drawn on y axis `index` (line series of [x, y] pairs), or null when there is none. */
export function dataExtent(option: EChartsCoreOption, index: number): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of asArray((option as Obj).series as Obj | Obj[])) {
    if (((s.yAxisIndex as number | undefined) ?? 0) !== index || !Array.isArray(s.data)) continue;
    for (const p of s.data as unknown[]) {
      const y = Array.isArray(p) ? p[1] : null;
      if (typeof y === 'number' && Number.isFinite(y)) {
        lo = Math.min(lo, y);
        hi = Math.max(hi, y);
      }
    }
  }
  return lo <= hi ? [lo, hi] : null;
}

function mapYAxes(option: EChartsCoreOption, f: (axis: Obj, index: number) => Obj): EChartsCoreOption {
  const y = (option as Obj).yAxis as Obj | Obj[] | undefined;
  if (y === undefined) return option;
  return { ...option, yAxis: Array.isArray(y) ? y.map(f) : f(y, 0) };
}

/**
 * `v` rounded away from the middle (`dir` +1 up, -1 down) to half its order of magnitude, so
 * the axis ends on a readable number (40, 0.3, 1.5), not on 39.11914239064057.
 */
export function niceOut(v: number, dir: 1 | -1): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  const step = 10 ** Math.floor(Math.log10(Math.abs(v))) / 2;
  const r = (dir > 0 ? Math.ceil(v / step) : Math.floor(v / step)) * step;
  return Number(r.toPrecision(12));
}

/** Every y axis widened, where needed, to show its limit lines with a little room for their labels. */
export function keepLimitsInView(option: EChartsCoreOption): EChartsCoreOption {
  return mapYAxes(option, (axis, i) => {
    const limits = limitValues(option, i);
    if (limits.length === 0) return axis;
    const room = (v: number) => v + Math.sign(v) * LIMIT_HEADROOM * Math.abs(v);
    const lo = Math.min(...limits.map(room));
    const hi = Math.max(...limits.map(room));
    const fixedMin = typeof axis.min === 'number' ? axis.min : null;
    // An end found here need not be a tick: its label is left out (it would crowd the tick beside it).
    const labels = { ...(axis.axisLabel as Record<string, unknown> | undefined), showMaxLabel: false, ...(fixedMin === null ? { showMinLabel: false } : {}) };
    return {
      ...axis,
      axisLabel: labels,
      min: fixedMin ?? ((v: { min: number }) => niceOut(Math.min(v.min, lo), -1)),
      max: (v: { max: number }) => niceOut(Math.max(v.max, hi), 1),
    };
  });
}

/** The y ranges to hold: each axis's data and limits as the chart shows them now (null where it has nothing). */
export function heldRanges(option: EChartsCoreOption): ([number, number] | null)[] {
  const y = (option as Obj).yAxis as Obj | Obj[] | undefined;
  const n = Array.isArray(y) ? y.length : y ? 1 : 0;
  return Array.from({ length: n }, (_, i) => {
    const d = dataExtent(option, i);
    const limits = limitValues(option, i).map((v) => v + Math.sign(v) * LIMIT_HEADROOM * Math.abs(v));
    const all = [...(d ?? []), ...limits];
    if (all.length === 0) return null;
    const lo = Math.min(...all);
    const hi = Math.max(...all);
    const pad = hi > lo ? 0.05 * (hi - lo) : Math.max(1e-3, Math.abs(hi) * 0.05);
    return [lo - pad, hi + pad];
  });
}

/** The chart with its y axes fixed to held ranges (an axis without a range keeps its own). */
export function withHeldRanges(option: EChartsCoreOption, ranges: readonly ([number, number] | null)[]): EChartsCoreOption {
  return mapYAxes(option, (axis, i) => {
    const r = ranges[i];
    return r ? { ...axis, min: r[0], max: r[1], scale: false } : axis;
  });
}
