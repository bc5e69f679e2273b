/**
 * Option builders of the 1-D charts: pure functions from core's curves (core/analysis/curves.ts)
 * to an ECharts option, so the same charts render in the workbench (SVG renderer) and, later,
 * without a screen for the CLI's reports (ECharts server-side SVG).
 */
import type { EChartsCoreOption } from 'echarts/core';
import { CURVE_KINDS, sweepsLean, type Curve, type CurveKind, type CurveSeries } from '../../analysis/curves';
import type { CurveSet } from './chartData';
import { keepLimitsInView } from './axisRange';
import { CHART_COLOURS, axis, base, labelEndAwayFrom, line, nowLine, toleranceLines, type LimitLabelEnd, type Pair } from './chartStyle';

export interface ChartMarker {
  leanDeg: number | null;
  handlebarDeg: number | null;
  travelMm: number | null;
  /** Current Ackermann point (inner, outer), degrees. */
  ackermann: { innerDeg: number; outerDeg: number } | null;
}

export const NO_MARKER: ChartMarker = { leanDeg: null, handlebarDeg: null, travelMm: null, ackermann: null };

export type CurveChartId = 'leanSteer' | 'bumpSteer' | 'ratioLean' | 'slipSteer' | 'ackermann' | 'camber' | 'jointsLean' | 'jointsSteer' | 'ratio' | 'frontLift';

export const CURVE_CHARTS: { id: CurveChartId; label: string }[] = [
  { id: 'leanSteer', label: 'Lean steer' },
  { id: 'bumpSteer', label: 'Bump steer' },
  { id: 'ratioLean', label: 'Ratio change' },
  { id: 'slipSteer', label: 'Toe mismatch' },
  { id: 'ackermann', label: 'Ackermann' },
  { id: 'camber', label: 'Camber' },
  { id: 'jointsLean', label: 'Joints vs lean' },
  { id: 'jointsSteer', label: 'Joints vs steer' },
  { id: 'ratio', label: 'Steering ratio' },
  { id: 'frontLift', label: 'Front lift' },
];

function unavailable(title: string, why: string): EChartsCoreOption {
  return { ...base(title, why), xAxis: axis(''), yAxis: axis(''), series: [] };
}

function points(c: Curve, s: CurveSeries): Pair[] {
  const out: Pair[] = [];
  c.x.values.forEach((x, i) => {
    if (x !== null) out.push([x, s.values[i]]);
  });
  return c.kind === 'ackermann' ? out.sort((a, b) => a[0] - b[0]) : out;
}

const sideOf = (id: string) => (id.endsWith('.left') ? 'left' : id.endsWith('.right') ? 'right' : null);
const sideColour = (id: string) => (sideOf(id) === 'right' ? CHART_COLOURS.right : CHART_COLOURS.left);

function pick(c: Curve, prefix: string): CurveSeries[] {
  return c.series.filter((s) => s.id === prefix || s.id.startsWith(`${prefix}.`));
}

function withNow(series: Record<string, unknown>[], x: number | null): Record<string, unknown>[] {
  const mark = nowLine(x);
  if (mark && series[0]) series[0] = { ...series[0], markLine: mark };
  return series;
}

/** The ± tolerance lines as a legend entry of their own, its icon drawn like the lines (dashed, the limit's colour). */
function toleranceSeries(tol: number, unit: string, position: LimitLabelEnd = 'insideEndTop'): Record<string, unknown> {
  return {
    type: 'line',
    name: `tolerance ±${tol} ${unit}`,
    data: [],
    lineStyle: { color: CHART_COLOURS.limit, type: 'dashed', width: 1 },
    itemStyle: { color: CHART_COLOURS.limit },
    markLine: toleranceLines(tol, `${tol} ${unit}`, true, position),
  };
}

/** The x axis name of a curve, with its unit. */
const xName = (c: Curve, sign = '') => `${c.x.label} (${c.x.unit}${sign})`;

function failuresNote(c: Curve): string {
  return c.failures.length ? `; ${c.failures.length} pose${c.failures.length === 1 ? '' : 's'} could not be assembled (gaps)` : '';
}

/** One curve's series against the ± tolerance of the measure they show. */
interface ToleranceChart {
  kind: 'leanSteer' | 'bumpSteer' | 'ratioLean' | 'slipSteer';
  /** Series id prefix to draw. */
  series: string;
  title: string;
  subtitle: string;
  /** Sign note after the x unit. */
  xSign: string;
  yName: string;
  tolerance: number;
  unit: string;
}

function toleranceChart(set: CurveSet, spec: ToleranceChart, x: number | null): EChartsCoreOption {
  const c = set.curves[spec.kind];
  if (!c) return unavailable(spec.title, set.missing[spec.kind] ?? 'not computed');
  // A series with no side in its id takes the left colour.
  const series: Record<string, unknown>[] = pick(c, spec.series).map((s) => line(s.label, points(c, s), sideColour(s.id)));
  series.push(toleranceSeries(spec.tolerance, spec.unit, labelEndAwayFrom(x, c.x.values)));
  return {
    ...base(spec.title, spec.subtitle + failuresNote(c)),
    xAxis: axis(xName(c, spec.xSign)),
    yAxis: axis(spec.yName),
    series: withNow(series, x),
  };
}

const SELF_STEER_AXIS = 'self-steer (deg, left +)';

export function leanSteerOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const spec = { kind: 'leanSteer', series: 'selfSteer', title: 'Lean steer', subtitle: 'road-wheel angle change with lean, handlebar held at zero', xSign: ', right side down +' } as const;
  return toleranceChart(set, { ...spec, yName: SELF_STEER_AXIS, tolerance: set.tolerances.selfSteerDeg, unit: 'deg' }, m.leanDeg);
}

export function bumpSteerOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const spec = { kind: 'bumpSteer', series: 'selfSteer', title: 'Bump steer', subtitle: 'road-wheel angle change with wheel travel (both wheels), no lean, handlebar at zero', xSign: '' } as const;
  return toleranceChart(set, { ...spec, yName: SELF_STEER_AXIS, tolerance: set.tolerances.selfSteerDeg, unit: 'deg' }, m.travelMm);
}

export function ratioChangeOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const spec = { kind: 'ratioLean', series: 'ratioChange', title: 'Ratio change', subtitle: 'road-wheel degrees per handlebar degree against upright, handlebar at zero', xSign: ', right side down +' } as const;
  return toleranceChart(set, { ...spec, yName: 'steering-ratio change (%)', tolerance: set.tolerances.ratioChangePct, unit: '%' }, m.leanDeg);
}

export function slipOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const spec = { kind: 'slipSteer', series: 'slip', title: 'Toe mismatch', subtitle: 'front slip angles about the common turn centre against handlebar, no lean', xSign: ', left +' } as const;
  return toleranceChart(set, { ...spec, yName: 'slip angle (deg, ISO 8855)', tolerance: set.tolerances.slipDeg, unit: 'deg' }, m.handlebarDeg);
}

export function ackermannOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const c = set.curves.ackermann;
  if (!c) return unavailable('Ackermann', set.missing.ackermann ?? 'not computed');
  const outer = c.series.find((s) => s.id === 'outer');
  const ideal = c.series.find((s) => s.id === 'idealOuter');
  const series: Record<string, unknown>[] = [];
  if (ideal) series.push(line(ideal.label, points(c, ideal), CHART_COLOURS.ideal, true));
  if (outer) series.push(line(outer.label, points(c, outer), CHART_COLOURS.left));
  if (m.ackermann) {
    series.push({
      type: 'scatter',
      name: 'now',
      data: [[m.ackermann.innerDeg, m.ackermann.outerDeg]],
      symbolSize: 10,
      itemStyle: { color: 'transparent', borderColor: CHART_COLOURS.marker, borderWidth: 2 },
    });
  }
  return {
    ...base('Ackermann', 'outer road-wheel angle against the inner (left turns), with the ideal; no lean' + failuresNote(c)),
    xAxis: axis(xName(c)),
    yAxis: axis('outer road-wheel angle (deg)'),
    series,
  };
}

/** A camber series' legend words: the title says camber, the axis its sign. */
export const camberLegendName = (name: string) => name.replace(/^camber /, '').replace(/\s*\(top out \+\)/, '');

export function camberOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const lean = set.curves.camberLean;
  const travel = set.curves.camberTravel;
  const series: Record<string, unknown>[] = [];
  const grids: Record<string, unknown>[] = [];
  const xAxes: Record<string, unknown>[] = [];
  const yAxes: Record<string, unknown>[] = [];
  const panels = [lean ? { c: lean, x: m.leanDeg } : null, travel ? { c: travel, x: m.travelMm } : null].filter((p) => p !== null);
  panels.forEach((p, gi) => {
    const half = panels.length === 2;
    grids.push(half ? (gi === 0 ? { left: 56, right: '53%', top: 66, bottom: 42 } : { left: '56%', right: 18, top: 66, bottom: 42 }) : { left: 60, right: 24, top: 66, bottom: 42 });
    xAxes.push(axis(xName(p.c), { gridIndex: gi }));
    // The panel on the right measures the same camber: its axis is named once, on the left (its name sat in the gap, over the left panel's 'now').
    yAxes.push(axis(gi === 0 ? 'camber (deg, top out +)' : '', { gridIndex: gi, nameGap: 30 }));
    const s = [...pick(p.c, 'camber'), ...pick(p.c, 'camberToFrame')].map((cs) =>
      line(cs.label, points(p.c, cs), sideColour(cs.id), cs.id.startsWith('camberToFrame'), { xAxisIndex: gi, yAxisIndex: gi }),
    );
    series.push(...withNow(s, p.x));
  });
  if (panels.length === 0) return unavailable('Camber', set.missing.camberLean ?? 'not computed');
  return {
    ...base('Camber', 'to ground (solid) and to frame (dashed); against lean and against wheel travel'),
    legend: { ...(base('', '').legend as Record<string, unknown>), formatter: camberLegendName },
    grid: grids,
    xAxis: xAxes,
    yAxis: yAxes,
    series,
  };
}

const JOINT_OF = (id: string) => id.split('.')[1] ?? '';

/**
 * A joint series' legend words: the joint alone. Its rating is on the limit lines and its side
 * in the line style (the subtitle says solid left, dashed right), so both sides of a joint share
 * one legend entry (one click shows or hides the pair) and the legend takes half the lines.
 */
export const jointLegendName = (name: string) => name.replace(/\s*\(rated [^)]*\)/, '').replace(/, (left|right)$/, '');

/** Escapes a text for the tooltip's HTML. */
const html = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

interface TooltipItem {
  seriesId?: string;
  seriesName?: string;
  marker?: string;
  value?: unknown;
  axisValueLabel?: string;
}

/** The joints' tooltip names each line's side, which the shared legend entry no longer does. */
function jointTooltip(items: TooltipItem | TooltipItem[]): string {
  const list = Array.isArray(items) ? items : [items];
  const rows = list
    .filter((p) => p.seriesId && sideOf(p.seriesId))
    .map((p) => {
      const v = Array.isArray(p.value) ? p.value[1] : p.value;
      return `${p.marker ?? ''}${html(p.seriesName ?? '')}, ${sideOf(p.seriesId!)}: ${typeof v === 'number' ? v.toFixed(3) : '—'}`;
    });
  return [html(list[0]?.axisValueLabel ?? ''), ...rows].join('<br>');
}

/** Where each limit line's words go, in turn from the lowest line up (the ends: the middle is where the 'now' line's word is): neighbouring lines never share an end. */
const LABEL_SPOTS = ['insideEndTop', 'insideStartTop'] as const;

/**
 * The joints' rating lines and required-margin lines: one line per distinct value (a 25 deg
 * rating and "28 − 3 margin" are the same line, written once with both words), their words
 * at alternating ends so neighbouring lines do not print on top of each other.
 */
export function jointLimitLines(ratings: number[], margin: number): Record<string, unknown> {
  const byValue = new Map<number, { words: string[]; rated: boolean }>();
  const add = (v: number, words: string, rated: boolean) => {
    const e = byValue.get(v) ?? { words: [], rated: false };
    if (!e.words.includes(words)) e.words.push(words);
    e.rated ||= rated;
    byValue.set(v, e);
  };
  for (const r of [...new Set(ratings)].sort((a, b) => b - a)) {
    add(r, `rated ${r} deg`, true);
    add(r - margin, `${r} − ${margin} margin`, false);
  }
  const values = [...byValue.keys()].sort((a, b) => a - b);
  return {
    silent: true,
    symbol: 'none',
    data: values.map((v, i) => {
      const e = byValue.get(v)!;
      const colour = e.rated ? CHART_COLOURS.limit : CHART_COLOURS.warn;
      return {
        yAxis: v,
        name: e.words.join('; '),
        lineStyle: { color: colour, type: e.rated ? 'solid' : 'dashed' },
        label: { position: LABEL_SPOTS[i % LABEL_SPOTS.length], color: colour },
      };
    }),
    label: { formatter: '{b}', fontSize: 10, position: 'insideEndTop', backgroundColor: 'rgba(251,251,248,0.85)', padding: [0, 2] },
  };
}

function jointsOption(set: CurveSet, kind: 'jointsLean' | 'jointsSteer', title: string, x: number | null, sign: string): EChartsCoreOption {
  const c = set.curves[kind];
  if (!c) return unavailable(title, set.missing[kind] ?? 'not computed');
  const series: Record<string, unknown>[] = c.series.map((s) => ({ ...line(jointLegendName(s.label), points(c, s), CHART_COLOURS.joints[JOINT_OF(s.id)] ?? CHART_COLOURS.ink, sideOf(s.id) === 'right'), id: s.id }));
  const margin = set.tolerances.jointMarginDeg;
  series.push({ type: 'line', name: 'rating and required margin', data: [], lineStyle: { color: CHART_COLOURS.limit, width: 1 }, itemStyle: { color: CHART_COLOURS.limit }, markLine: jointLimitLines(Object.values(set.ratedDeg), margin) });
  return {
    ...base(title, 'articulation of each ball joint and rod end (solid left, dashed right)' + failuresNote(c)),
    tooltip: { ...(base('', '').tooltip as Record<string, unknown>), formatter: jointTooltip },
    xAxis: axis(xName(c, sign)),
    yAxis: axis('articulation (deg)', { min: 0 }),
    series: withNow(series, x),
  };
}

export function jointsLeanOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  return jointsOption(set, 'jointsLean', 'Joint articulation against lean', m.leanDeg, ', right side down +');
}

export function jointsSteerOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  return jointsOption(set, 'jointsSteer', 'Joint articulation against steer', m.handlebarDeg, ', left +');
}

export function ratioOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const c = set.curves.steeringRatio;
  if (!c) return unavailable('Steering ratio', set.missing.steeringRatio ?? 'not computed');
  const overall = c.series.find((s) => s.id === 'overallRatio');
  const local = c.series.find((s) => s.id === 'localRatio');
  const series: Record<string, unknown>[] = [];
  if (overall) series.push(line(overall.label, points(c, overall), CHART_COLOURS.left));
  if (local) series.push(line(local.label, points(c, local), CHART_COLOURS.right, true));
  return {
    ...base('Steering ratio', 'handlebar angle per mean road-wheel angle; no lean' + failuresNote(c)),
    xAxis: axis(xName(c, ', left +')),
    yAxis: axis('ratio (deg/deg)'),
    series: withNow(series, m.handlebarDeg),
  };
}

export function frontLiftOption(set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  const c = set.curves.frontLift;
  if (!c) return unavailable('Front lift', set.missing.frontLift ?? 'not computed');
  const lift = c.series.find((s) => s.id === 'frontLift');
  return {
    ...base('Front lift with steer', 'rise of the front with steer (the returning tendency of KPI and caster); no lean' + failuresNote(c)),
    xAxis: axis(xName(c, ', left +')),
    yAxis: axis('front lift (mm)'),
    series: withNow(lift ? [line(lift.label, points(c, lift), CHART_COLOURS.left)] : [], m.handlebarDeg),
  };
}

export function curveOption(id: CurveChartId, set: CurveSet, m: ChartMarker = NO_MARKER): EChartsCoreOption {
  // Limit lines stay in view whatever the curves do (an edit never rescales a tolerance away).
  return keepLimitsInView(chartOption(id, set, m));
}

function chartOption(id: CurveChartId, set: CurveSet, m: ChartMarker): EChartsCoreOption {
  switch (id) {
    case 'leanSteer':
      return leanSteerOption(set, m);
    case 'bumpSteer':
      return bumpSteerOption(set, m);
    case 'ratioLean':
      return ratioChangeOption(set, m);
    case 'slipSteer':
      return slipOption(set, m);
    case 'ackermann':
      return ackermannOption(set, m);
    case 'camber':
      return camberOption(set, m);
    case 'jointsLean':
      return jointsLeanOption(set, m);
    case 'jointsSteer':
      return jointsSteerOption(set, m);
    case 'ratio':
      return ratioOption(set, m);
    case 'frontLift':
      return frontLiftOption(set, m);
  }
}

/** Core's curve kinds each chart draws. */
export const CHART_CURVES: Record<CurveChartId, CurveKind[]> = {
  leanSteer: ['leanSteer'],
  bumpSteer: ['bumpSteer'],
  ratioLean: ['ratioLean'],
  slipSteer: ['slipSteer'],
  ackermann: ['ackermann'],
  camber: ['camberLean', 'camberTravel'],
  jointsLean: ['jointsLean'],
  jointsSteer: ['jointsSteer'],
  ratio: ['steeringRatio'],
  frontLift: ['frontLift'],
};

/** Core's curves swept against lean: a vehicle that does not lean has none of them. */
/** The curve kinds core sweeps along lean. */
export const LEAN_CURVES: ReadonlySet<CurveKind> = new Set<CurveKind>(CURVE_KINDS.filter(sweepsLean));

export const NO_LEAN_REASON = 'this vehicle does not lean';

/** Whether a chart draws nothing but lean curves (hidden for a vehicle that does not lean). */
export function isLeanChart(id: CurveChartId): boolean {
  return CHART_CURVES[id].every((k) => LEAN_CURVES.has(k));
}
