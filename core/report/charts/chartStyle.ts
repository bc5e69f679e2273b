/** The charts' own palette and shared option pieces (pure data). */
import type { EChartsCoreOption } from 'echarts/core';
import { SEVERITY_STYLE } from '../severity';

export const CHART_COLOURS = {
  left: '#17707c',
  right: '#c2571a',
  ideal: '#4a4f55',
  limit: SEVERITY_STYLE.over.colour,
  warn: SEVERITY_STYLE.close.colour,
  marker: '#0f62c9',
  frame: '#7a8a1f',
  ink: '#1d2529',
  grid: '#e3e6df',
  joints: { upperOuter: '#17707c', lowerOuter: '#5b4ea3', tieRodOuter: '#c2571a', tieRodInner: '#7a8a1f' } as Record<string, string>,
};

export type Pair = [number, number | null];

/** A tick's words: six significant figures at most, float noise below 1e-9 of a unit written as 0. */
export function tickWords(v: number): string {
  if (!Number.isFinite(v)) return '';
  return String(Math.abs(v) < 1e-9 ? 0 : Number(v.toPrecision(6)));
}

export function axis(name: string, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    type: 'value',
    name,
    nameLocation: 'middle',
    nameGap: 26,
    scale: true,
    axisLine: { lineStyle: { color: '#8a949a' } },
    splitLine: { lineStyle: { color: CHART_COLOURS.grid } },
    // Labels that would touch are left out (a low strip), and float noise is written as a number (0, not -6e-12).
    axisLabel: { color: '#4f5b62', hideOverlap: true, margin: 10, formatter: tickWords },
    nameTextStyle: { color: '#4f5b62' },
    ...extra,
  };
}

export function base(title: string, subtitle: string): EChartsCoreOption {
  return {
    animation: false,
    backgroundColor: '#fbfbf8',
    textStyle: { fontFamily: 'system-ui, DejaVu Sans, sans-serif', color: CHART_COLOURS.ink },
    title: { text: title, subtext: subtitle, left: 8, top: 4, textStyle: { fontSize: 13 }, subtextStyle: { fontSize: 11, color: '#4f5b62' } },
    // Never paged: fitToSize (fitLayout.ts) wraps it and moves the grid down to make room.
    legend: { type: 'plain', top: 40, left: 56, right: 8, itemWidth: 18, itemHeight: 8, textStyle: { fontSize: 10.5 } },
    grid: { left: 60, right: 24, top: 66, bottom: 42 },
    tooltip: { trigger: 'axis', confine: true, valueFormatter: (v: unknown) => (typeof v === 'number' ? v.toFixed(3) : '—') },
  };
}

/** A vertical line at the current pose (for the first series of a chart). */
export function nowLine(x: number | null, label = 'now'): Record<string, unknown> | undefined {
  if (x === null || !Number.isFinite(x)) return undefined;
  return {
    silent: true,
    symbol: 'none',
    lineStyle: { color: CHART_COLOURS.marker, type: 'solid', width: 1.5 },
    // The word at the foot of the line: the limit lines' words are written near the top, at their ends.
    label: { formatter: label, color: CHART_COLOURS.marker, position: 'insideStartTop' },
    data: [{ xAxis: x }],
  };
}

/** Where a horizontal limit line's words go: at the end of the line, or its start (away from a 'now' line near the end). */
export type LimitLabelEnd = 'insideEndTop' | 'insideStartTop';

/**
 * The end of the x range a horizontal line's words should go to, away from the 'now' line at
 * `x` (its word sits at the top of the chart, and a limit's words at the right end printed on
 * top of it when the pose was near that end).
 */
export function labelEndAwayFrom(x: number | null, xs: readonly (number | null)[]): LimitLabelEnd {
  if (x === null || !Number.isFinite(x)) return 'insideEndTop';
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of xs) {
    if (v === null || !Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  return hi > lo && x > (lo + hi) / 2 ? 'insideStartTop' : 'insideEndTop';
}

/** Horizontal lines at ± a tolerance. */
export function toleranceLines(limit: number, label: string, both = true, position: LimitLabelEnd = 'insideEndTop'): Record<string, unknown> {
  const data: Record<string, unknown>[] = [{ yAxis: limit, name: `+${label}` }];
  if (both) data.push({ yAxis: -limit, name: `−${label}` });
  return {
    silent: true,
    symbol: 'none',
    lineStyle: { color: CHART_COLOURS.limit, type: 'dashed', width: 1 },
    label: { formatter: '{b}', color: CHART_COLOURS.limit, fontSize: 10, position },
    data,
  };
}

export function line(name: string, data: Pair[], colour: string, dashed = false, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    type: 'line',
    name,
    data,
    showSymbol: false,
    connectNulls: false,
    lineStyle: { color: colour, width: 2, type: dashed ? 'dashed' : 'solid' },
    itemStyle: { color: colour },
    ...extra,
  };
}
