/**
 * The lean x handlebar envelope map as an ECharts heat map: each cell coloured by core's
 * verdict on the chosen measure (a legend explains the colours, the tooltip gives the
 * number), cells that cannot be assembled marked as such. Over it: core's operating region as
 * a dashed outline (the cells outside it paler, so the outline is not the only sign), core's
 * balanced-turn line for each riding speed with its speed written beside it, and a marker at
 * the current pose.
 *
 * The cells sit on category axes; everything drawn over them uses a second, hidden pair of
 * value axes spanning the same bands (half a step beyond the first and last values), so lines
 * and the marker land at their true lean and handlebar rather than at the nearest cell.
 */
import type { EChartsCoreOption } from 'echarts/core';
import { SEVERITY_STYLE, type Severity } from '../severity';
import type { EnvelopeMapData, MapBalancedLine, MapCell, MapMetric } from './chartData';
import { CHART_COLOURS } from './chartStyle';
import { EM_WIDTH } from './fitLayout';
import { bandEdges, regionOutline } from './regionOutline';

export const MAP_METRICS: { id: MapMetric; label: string; unit: string }[] = [
  { id: 'status', label: 'Overall verdict', unit: '' },
  { id: 'slip', label: 'Worst slip (toe mismatch)', unit: 'deg' },
  { id: 'selfSteer', label: 'Worst self-steer', unit: 'deg' },
  { id: 'ratioChange', label: 'Steering-ratio change', unit: '%' },
  { id: 'jointMargin', label: 'Least joint margin', unit: 'deg' },
  { id: 'clearance', label: 'Least clearance', unit: 'mm' },
];

const LEVELS: Severity[] = ['none', 'within', 'close', 'over', 'broken'];

/** Series names, also the legend's words. */
export const REGION_SERIES = 'operating region';
export const BALANCED_SERIES = 'balanced turn';

/** Width of the colour key's words at the right of the map, px. */
const KEY_WIDTH = 156;

/** Opacity of the cells outside the operating region. */
const OUTSIDE_OPACITY = 0.4;
const REGION_COLOUR = '#14242b';
const LINE_COLOUR = '#3b3f8f';

export function describeCell(map: EnvelopeMapData, cell: MapCell, metric: MapMetric): string[] {
  const lean = map.lean[cell.leanIndex];
  const bar = map.handlebar[cell.handlebarIndex];
  const meta = MAP_METRICS.find((m) => m.id === metric)!;
  const lines = [`lean ${lean.toFixed(1)} deg, handlebar ${bar.toFixed(1)} deg`, cell.inRegion ? 'in the operating region' : 'outside the operating region'];
  if (cell.status === 'broken' && cell.reason) {
    lines.push(`cannot assemble: ${cell.reason}`);
    return lines;
  }
  if (metric !== 'status') {
    const v = cell.values[metric];
    lines.push(`${meta.label.toLowerCase()}: ${v === null ? '—' : `${v.toFixed(2)} ${meta.unit}`} (${SEVERITY_STYLE[cell.severity[metric]].word})`);
  }
  lines.push(`pose: ${SEVERITY_STYLE[cell.status].pose}`);
  return lines;
}

type Point = [number, number] | [null, null];
const GAP: Point = [null, null];

/**
 * The outline of the map cells for which `inside` holds, its loops joined by gaps into one line
 * series in axis values (drawn on the map's second axes); null when no cell is inside.
 */
export function cellOutlineSeries(map: EnvelopeMapData, inside: (cell: EnvelopeMapData['cells'][number]) => boolean, name: string, lineStyle: Record<string, unknown>): Record<string, unknown> | null {
  const nL = map.lean.length;
  const nH = map.handlebar.length;
  const flags = new Uint8Array(nL * nH);
  for (const c of map.cells) if (inside(c)) flags[c.leanIndex * nH + c.handlebarIndex] = 1;
  const loops = regionOutline(nL, nH, (i, j) => flags[i * nH + j] === 1);
  if (loops.length === 0) return null;
  const xs = bandEdges(map.lean);
  const ys = bandEdges(map.handlebar);
  const data: Point[] = [];
  for (const loop of loops) {
    if (data.length) data.push(GAP);
    for (const [i, j] of [...loop, loop[0]]) data.push([xs[i], ys[j]]);
  }
  const colour = (lineStyle.color as string | undefined) ?? REGION_COLOUR;
  return {
    type: 'line',
    name,
    xAxisIndex: 1,
    yAxisIndex: 1,
    data,
    showSymbol: false,
    connectNulls: false,
    silent: true,
    lineStyle,
    itemStyle: { color: colour },
    z: 5,
    tooltip: { show: false },
  };
}

/** The dashed outline of the operating region. */
export function regionOutlineSeries(map: EnvelopeMapData): Record<string, unknown> | null {
  return cellOutlineSeries(map, (c) => c.inRegion, REGION_SERIES, { color: REGION_COLOUR, width: 2.5, type: [7, 4] });
}

/**
 * Where to write a line's speed: its end towards full left lock (`towards` +1, the upper half
 * of the map) or full right lock (-1): the last point inside the map, before a gap, going out
 * from straight ahead; null when nothing of that half is drawn.
 */
export function labelAnchor(map: EnvelopeMapData, line: MapBalancedLine, towards: 1 | -1): [number, number] | null {
  const xs = bandEdges(map.lean);
  const ys = bandEdges(map.handlebar);
  const inMap = (j: number) => {
    const lean = line.leanDeg[j];
    const bar = line.handlebarDeg[j];
    return lean !== null && lean >= xs[0] && lean <= xs[xs.length - 1] && bar >= ys[0] && bar <= ys[ys.length - 1];
  };
  const n = line.handlebarDeg.length;
  let j = towards > 0 ? line.handlebarDeg.findIndex((h) => h >= 0) : n - 1 - [...line.handlebarDeg].reverse().findIndex((h) => h <= 0);
  if (j < 0 || j >= n) return null;
  let last: number | null = null;
  for (; j >= 0 && j < n && inMap(j); j += towards) last = j;
  return last === null ? null : [line.leanDeg[last]!, line.handlebarDeg[last]];
}

/**
 * Where a speed's words go beside the end of its line. The text reaches towards the middle of
 * the map. A line leaving through the top or bottom of the map gets its words beside its end;
 * otherwise (a line stopped by the lean limit or grip) above or below it: the fastest line of
 * its half, the flattest, on the side towards straight ahead, where no other line ends, and
 * the others on the far side, so neighbouring ends do not cover each other's words.
 */
function labelPlace(map: EnvelopeMapData, at: [number, number], all: { at: [number, number]; speedKmh: number }[]): Record<string, unknown> {
  const ys = bandEdges(map.handlebar);
  const step = ys.length > 1 ? ys[1] - ys[0] : 1;
  const align = at[0] <= 0 ? 'left' : 'right';
  const atEdge = (bar: number) => bar >= ys[ys.length - 1] - step || bar <= ys[0] + step;
  if (atEdge(at[1])) return { position: at[0] <= 0 ? 'right' : 'left' };
  const upper = at[1] > 0;
  const sameHalf = all.filter((a) => a.at[1] > 0 === upper && !atEdge(a.at[1]));
  const fastest = sameHalf.reduce((best, a) => (a.speedKmh > best.speedKmh ? a : best), sameHalf[0]);
  const towardsStraight = fastest.at === at;
  return { position: upper === towardsStraight ? 'bottom' : 'top', align, distance: 3 };
}

/** Core's balanced-turn lines and their speeds, on the hidden value axes. */
export function balancedLineSeries(map: EnvelopeMapData): Record<string, unknown>[] {
  if (map.balancedLines.length === 0) return [];
  const lines = map.balancedLines.map((l) => ({
    type: 'line',
    name: BALANCED_SERIES,
    xAxisIndex: 1,
    yAxisIndex: 1,
    data: l.leanDeg.map((lean, j): Point => (lean === null ? GAP : [lean, l.handlebarDeg[j]])),
    showSymbol: false,
    connectNulls: false,
    silent: true,
    lineStyle: { color: LINE_COLOUR, width: 1.75, type: 'solid' },
    itemStyle: { color: LINE_COLOUR },
    z: 6,
    tooltip: { show: false },
  }));
  // Fast lines end close together at the lean limit: the speeds are written at alternate ends
  // (left lock, right lock, ...), reaching towards the middle of the map.
  const anchors = map.balancedLines.flatMap((l, k) => {
    const at = labelAnchor(map, l, k % 2 === 0 ? 1 : -1) ?? labelAnchor(map, l, k % 2 === 0 ? -1 : 1);
    return at ? [{ at, speedKmh: l.speedKmh }] : [];
  });
  const labels = anchors.map(({ at, speedKmh }) => ({ value: at, name: `${speedKmh} km/h`, label: labelPlace(map, at, anchors) }));
  return [
    ...lines,
    {
      type: 'scatter',
      name: 'speeds',
      xAxisIndex: 1,
      yAxisIndex: 1,
      data: labels,
      symbolSize: 5,
      itemStyle: { color: LINE_COLOUR },
      label: {
        show: true,
        formatter: '{b}',
        distance: 4,
        fontSize: 11,
        color: LINE_COLOUR,
        backgroundColor: 'rgba(251,251,248,0.85)',
        padding: [1, 3],
        borderRadius: 2,
      },
      labelLayout: { hideOverlap: true },
      silent: true,
      z: 8,
      tooltip: { show: false },
    },
  ];
}

/**
 * The continuous scale of a numeric measure, light to dark, the darker the worse: lightness
 * falls steadily along it, so it reads the same under every colour-vision deficiency and in
 * grey print (the same principle as the viridis and cividis scales; our own stops).
 */
export const VALUE_RAMP = ['#f6f2cf', '#b9dca0', '#5fae93', '#2f7d86', '#2d4f7e', '#2b2352'];

/** Measures where a smaller number is the worse one (the ramp runs the other way). */
const SMALLER_IS_WORSE: ReadonlySet<MapMetric> = new Set<MapMetric>(['jointMargin', 'clearance']);

/** Significant figures a cell's number is written with. */
const cellNumber = (v: number) => (Math.abs(v) >= 100 ? v.toFixed(0) : Math.abs(v) >= 10 ? v.toFixed(1) : v.toFixed(2));

/** The colour of a cell that has no number on a numeric measure (it cannot be assembled, or it was not measured). */
function noValueStyle(c: MapCell): { color: string; word: string } {
  return c.status === 'broken' ? { color: SEVERITY_STYLE.broken.colour, word: `${SEVERITY_STYLE.broken.glyph} ${SEVERITY_STYLE.broken.word}` } : { color: '#d5d9d2', word: `${SEVERITY_STYLE.none.glyph} no value` };
}

export function heatMapOption(map: EnvelopeMapData, metric: MapMetric, marker: { leanDeg: number; handlebarDeg: number } | null = null): EChartsCoreOption {
  const meta = MAP_METRICS.find((m) => m.id === metric)!;
  const numeric = metric !== 'status';
  const valueOf = (c: MapCell): number | null => (metric === 'status' ? null : c.values[metric]);
  const faded = (c: MapCell) => (c.inRegion ? {} : { itemStyle: { opacity: OUTSIDE_OPACITY } });
  const withValue = numeric ? map.cells.filter((c) => valueOf(c) !== null && Number.isFinite(valueOf(c))) : [];
  const data = numeric
    ? withValue.map((c) => ({ value: [c.leanIndex, c.handlebarIndex, valueOf(c)!], ...faded(c) }))
    : map.cells.map((c) => ({ value: [c.leanIndex, c.handlebarIndex, LEVELS.indexOf(c.severity[metric])], ...faded(c) }));
  const values = withValue.map((c) => valueOf(c)!);
  const lo = values.length ? Math.min(...values) : 0;
  const hi = values.length ? Math.max(...values) : 1;
  const xs = bandEdges(map.lean);
  const ys = bandEdges(map.handlebar);
  // The marker stays at least half a cell inside the map (its circle never cut by the grid's edge).
  const clampIn = (v: number, centres: number[]) => Math.min(centres[centres.length - 1], Math.max(centres[0], v));
  const series: Record<string, unknown>[] = [
    {
      type: 'heatmap',
      name: meta.label,
      data,
      itemStyle: { borderColor: '#fbfbf8', borderWidth: 0.5 },
      emphasis: { itemStyle: { borderColor: CHART_COLOURS.ink, borderWidth: 1 } },
      // Each cell's number, written when the cells are big enough (fitLayout.ts turns it on).
      ...(numeric
        ? {
            label: { show: false, formatter: (p: { value: number[] }) => cellNumber(p.value[2]), fontSize: 10, color: CHART_COLOURS.ink, textBorderColor: 'rgba(251,251,248,0.9)', textBorderWidth: 2 },
            cellLabel: { chars: Math.max(...values.map((v) => cellNumber(v).length), 1), fontSize: 10 },
          }
        : {}),
    },
  ];
  if (numeric) {
    // Cells without a number keep their category colour (won't assemble, no value) in a series of their own.
    const none = map.cells.filter((c) => !withValue.includes(c));
    const words = [...new Set(none.map((c) => noValueStyle(c).word))];
    for (const w of words) {
      const cells = none.filter((c) => noValueStyle(c).word === w);
      const colour = noValueStyle(cells[0]).color;
      series.push({
        type: 'heatmap',
        name: w,
        data: cells.map((c) => ({ value: [c.leanIndex, c.handlebarIndex, 0], itemStyle: { color: colour, ...(c.inRegion ? {} : { opacity: OUTSIDE_OPACITY }) } })),
        itemStyle: { color: colour, borderColor: '#fbfbf8', borderWidth: 0.5 },
      });
    }
  }
  const region = regionOutlineSeries(map);
  if (region) series.push(region);
  series.push(...balancedLineSeries(map));
  if (marker) {
    series.push({
      type: 'scatter',
      name: 'now',
      xAxisIndex: 1,
      yAxisIndex: 1,
      data: [[clampIn(marker.leanDeg, map.lean), clampIn(marker.handlebarDeg, map.handlebar)]],
      symbol: 'circle',
      symbolSize: 14,
      clip: false,
      itemStyle: { color: 'transparent', borderColor: CHART_COLOURS.marker, borderWidth: 3 },
      z: 10,
      tooltip: { show: false },
      silent: true,
    });
  }
  const label = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(1));
  const hidden = (edges: number[]) => ({ type: 'value', min: edges[0], max: edges[edges.length - 1], show: false });
  const leans = map.balancedLines.length ? '' : '; the vehicle does not lean';
  const oneColumn = map.lean.length === 1;
  const grid = oneColumn ? { left: 62, width: 56, top: 58, bottom: 44 } : { left: 62, right: 170, top: 58, bottom: 44 };
  const smallerWorse = SMALLER_IS_WORSE.has(metric);
  const extraTitles: Record<string, unknown>[] = [];
  // The scale's heading: the measure and its unit (wrapped to the key's width), then which end is worse.
  const headingLines = numeric ? [`${meta.label} (${meta.unit})`, 'darker is worse'] : [];
  const headingPx = headingLines.reduce((n, l) => n + Math.ceil((l.length * 11 * EM_WIDTH) / KEY_WIDTH), 0) * 14 + 8;
  if (numeric) {
    extraTitles.push({
      text: headingLines.join('\n'),
      right: 8,
      top: 58,
      textStyle: { fontSize: 11, fontWeight: 'normal', color: CHART_COLOURS.ink, lineHeight: 14, width: KEY_WIDTH, overflow: 'break' },
    });
  }
  if (oneColumn) {
    extraTitles.push({
      text: 'One column: this vehicle does not lean, so the map is its handlebar range at lean 0 (top: full left lock).',
      left: 140,
      top: 'middle',
      textStyle: { fontSize: 12, fontWeight: 'normal', color: '#4f5b62', lineHeight: 16, width: 300, overflow: 'break' },
    });
  }
  const noValueWords = series.filter((x, i) => i > 0 && x.type === 'heatmap').map((x) => x.name as string);
  const legendItems = [
    { name: REGION_SERIES, icon: 'path://M0,0h6v2h-6zM9,0h6v2h-6zM18,0h6v2h-6z' },
    ...(map.balancedLines.length ? [{ name: BALANCED_SERIES, icon: 'path://M0,0h24v2h-24z' }] : []),
    ...noValueWords.map((name) => ({ name, icon: 'rect', itemStyle: { opacity: 1 } })),
  ];
  const fmt = (v: number) => cellNumber(v);
  const visualMap = numeric
    ? {
        type: 'continuous',
        dimension: 2,
        seriesIndex: 0,
        min: lo,
        max: hi > lo ? hi : lo + 1,
        calculable: false,
        orient: 'vertical',
        right: 96,
        top: 58 + headingPx,
        itemWidth: 14,
        itemHeight: 120,
        text: [`${fmt(hi)} ${meta.unit}`, `${fmt(lo)} ${meta.unit}`],
        textGap: 4,
        textStyle: { fontSize: 11 },
        inRange: { color: smallerWorse ? [...VALUE_RAMP].reverse() : VALUE_RAMP },
      }
    : {
        type: 'piecewise',
        dimension: 2,
        seriesIndex: 0,
        orient: 'vertical',
        right: 8,
        top: 58,
        itemGap: 4,
        itemWidth: 14,
        itemHeight: 10,
        textStyle: { fontSize: 11 },
        pieces: LEVELS.map((s, i) => ({
          value: i,
          label: `${SEVERITY_STYLE[s].glyph} ${s === 'none' ? 'no value' : SEVERITY_STYLE[s].word}`,
          color: s === 'none' ? '#d5d9d2' : SEVERITY_STYLE[s].colour,
        })),
      };
  return {
    animation: false,
    backgroundColor: '#fbfbf8',
    textStyle: { fontFamily: 'system-ui, DejaVu Sans, sans-serif', color: CHART_COLOURS.ink },
    title: [
      {
        text: `Envelope map: ${meta.label.toLowerCase()}`,
        subtext: `lean × handlebar, tyres on the ground, ${map.travelName ?? 'travel'} ${map.travelMm} mm${leans}; click a cell to go there`,
        left: 8,
        top: 4,
        textStyle: { fontSize: 13 },
        subtextStyle: { fontSize: 11, color: '#4f5b62' },
      },
      ...extraTitles,
    ],
    grid,
    tooltip: {
      confine: true,
      formatter: (p: { seriesType?: string; value?: number[] }) => {
        const d = p.value;
        if (p.seriesType !== 'heatmap' || !d) return '';
        const cell = map.cells.find((c) => c.leanIndex === d[0] && c.handlebarIndex === d[1]);
        return cell ? describeCell(map, cell, metric).join('<br/>') : '';
      },
    },
    legend: {
      data: legendItems,
      orient: 'vertical',
      right: 8,
      // Under the colour key: the five verdicts (rows of 10 px and 4 px gaps from 58 px), or the
      // value scale (its heading, bar and end numbers; fitLayout.ts shortens the bar in a low box).
      top: numeric ? 58 + headingPx + 120 + 2 * 15 + 10 : 58 + LEVELS.length * 14 + 12,
      itemGap: 6,
      itemWidth: 24,
      itemHeight: numeric ? 6 : 3,
      selectedMode: false,
      textStyle: { fontSize: 11 },
    },
    xAxis: [
      // onZero off: with the value axes beside them, the category axes would otherwise sit at handlebar 0.
      { type: 'category', name: oneColumn ? 'lean (deg)' : 'lean (deg, right side down +)', nameLocation: 'middle', nameGap: 28, data: map.lean.map(label), splitArea: { show: false }, axisLine: { onZero: false }, axisLabel: { hideOverlap: true } },
      hidden(xs),
    ],
    yAxis: [{ type: 'category', name: 'handlebar (deg, left +)', nameLocation: 'middle', nameGap: 40, data: map.handlebar.map(label), axisLine: { onZero: false }, axisLabel: { hideOverlap: true } }, hidden(ys)],
    visualMap,
    series,
  };
}
