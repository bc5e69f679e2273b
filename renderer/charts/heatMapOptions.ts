/**
 * The lean x handlebar envelope map as an ECharts heat map: each cell coloured by core's
 * verdict on the chosen measure (a legend explains the colours, the tooltip gives the
 * number), cells that cannot be assembled marked as such, and a marker at the current pose.
 */
import type { EChartsCoreOption } from 'echarts/core';
import { SEVERITY_STYLE, type Severity } from '../model/severity';
import type { EnvelopeMapData, MapCell, MapMetric } from './chartData';
import { CHART_COLOURS } from './chartStyle';

export const MAP_METRICS: { id: MapMetric; label: string; unit: string }[] = [
  { id: 'status', label: 'Overall verdict', unit: '' },
  { id: 'slip', label: 'Worst slip (toe mismatch)', unit: 'deg' },
  { id: 'selfSteer', label: 'Worst self-steer', unit: 'deg' },
  { id: 'ratioChange', label: 'Steering-ratio change', unit: '%' },
  { id: 'jointMargin', label: 'Least joint margin', unit: 'deg' },
  { id: 'clearance', label: 'Least clearance', unit: 'mm' },
];

const LEVELS: Severity[] = ['none', 'within', 'close', 'over', 'broken'];


export function describeCell(map: EnvelopeMapData, cell: MapCell, metric: MapMetric): string[] {
  const lean = map.lean[cell.leanIndex];
  const bar = map.handlebar[cell.handlebarIndex];
  const meta = MAP_METRICS.find((m) => m.id === metric)!;
  const lines = [`lean ${lean.toFixed(1)} deg, handlebar ${bar.toFixed(1)} deg`];
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

export function heatMapOption(
  map: EnvelopeMapData,
  metric: MapMetric,
  marker: { leanDeg: number; handlebarDeg: number } | null = null,
): EChartsCoreOption {
  const meta = MAP_METRICS.find((m) => m.id === metric)!;
  const data = map.cells.map((c) => [c.leanIndex, c.handlebarIndex, LEVELS.indexOf(c.severity[metric])]);
  const nearest = (values: number[], x: number) => values.reduce((best, v, i) => (Math.abs(v - x) < Math.abs(values[best] - x) ? i : best), 0);
  const series: Record<string, unknown>[] = [
    {
      type: 'heatmap',
      name: meta.label,
      data,
      itemStyle: { borderColor: '#fbfbf8', borderWidth: 0.5 },
      emphasis: { itemStyle: { borderColor: CHART_COLOURS.ink, borderWidth: 1 } },
    },
  ];
  if (marker) {
    series.push({
      type: 'scatter',
      name: 'now',
      data: [[nearest(map.lean, marker.leanDeg), nearest(map.handlebar, marker.handlebarDeg)]],
      symbol: 'circle',
      symbolSize: 14,
      itemStyle: { color: 'transparent', borderColor: CHART_COLOURS.marker, borderWidth: 3 },
      z: 10,
      tooltip: { show: false },
      silent: true,
    });
  }
  const label = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(1));
  return {
    animation: false,
    backgroundColor: '#fbfbf8',
    textStyle: { fontFamily: 'system-ui, DejaVu Sans, sans-serif', color: CHART_COLOURS.ink },
    title: {
      text: `Envelope map: ${meta.label.toLowerCase()}`,
      subtext: `lean × handlebar, tyres on the ground, travel ${map.travelMm} mm; click a cell to go there`,
      left: 8,
      top: 4,
      textStyle: { fontSize: 13 },
      subtextStyle: { fontSize: 11, color: '#4f5b62' },
    },
    grid: { left: 62, right: 150, top: 58, bottom: 44 },
    tooltip: {
      confine: true,
      formatter: (p: { data?: number[] }) => {
        const d = p.data;
        if (!d) return '';
        const cell = map.cells.find((c) => c.leanIndex === d[0] && c.handlebarIndex === d[1]);
        return cell ? describeCell(map, cell, metric).join('<br/>') : '';
      },
    },
    xAxis: { type: 'category', name: 'lean (deg, right side down +)', nameLocation: 'middle', nameGap: 28, data: map.lean.map(label), splitArea: { show: false } },
    yAxis: { type: 'category', name: 'handlebar (deg, left +)', nameLocation: 'middle', nameGap: 40, data: map.handlebar.map(label) },
    visualMap: {
      type: 'piecewise',
      dimension: 2,
      seriesIndex: 0,
      orient: 'vertical',
      right: 8,
      top: 'middle',
      itemWidth: 14,
      itemHeight: 10,
      textStyle: { fontSize: 11 },
      pieces: LEVELS.map((s, i) => ({
        value: i,
        label: `${SEVERITY_STYLE[s].glyph} ${s === 'none' ? 'no value' : SEVERITY_STYLE[s].word}`,
        color: s === 'none' ? '#d5d9d2' : SEVERITY_STYLE[s].colour,
      })),
    },
    series,
  };
}
