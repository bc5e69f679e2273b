/**
 * A reference design over the charts of the design on screen. Curves: the reference's own chart
 * option for the same chart, its data lines copied in with the same colours, a finer dash
 * pattern, a lighter stroke and a name that says which design they are; marks (tolerance lines,
 * the current-pose marker) and other series are the design on screen's only. Envelope map: the
 * outline of the cells where the reference is within tolerance on the measure shown, dotted,
 * when both maps have the same grid.
 */
import type { EChartsCoreOption } from 'echarts/core';
import type { EnvelopeMapData, MapMetric } from './chartData';
import { cellOutlineSeries } from './heatMapOptions';

/** Dash pattern of reference lines (px): distinct from the solid and the 'dashed' lines of the charts themselves. */
export const REFERENCE_DASH = [2, 3];

type Series = Record<string, unknown>;

function seriesOf(option: EChartsCoreOption): Series[] {
  const s = (option as { series?: unknown }).series;
  return Array.isArray(s) ? (s as Series[]) : s ? [s as Series] : [];
}

export function withReference(option: EChartsCoreOption, reference: EChartsCoreOption, label: string): EChartsCoreOption {
  const added = seriesOf(reference)
    .filter((s) => s.type === 'line' && Array.isArray(s.data) && (s.data as unknown[]).length > 1)
    .map((s) => {
      const { markLine: _ml, markArea: _ma, markPoint: _mp, ...rest } = s;
      const lineStyle = (s.lineStyle as Record<string, unknown> | undefined) ?? {};
      return { ...rest, name: `${String(s.name ?? '')} (${label})`, z: 1, lineStyle: { ...lineStyle, type: REFERENCE_DASH, width: 1.5, opacity: 0.75 }, emphasis: { disabled: true } };
    });
  return { ...option, series: [...seriesOf(option), ...added] };
}

/** Colour of the reference's outline on the map: dark grey, apart from the verdict colours and the region's. */
export const REFERENCE_MAP_COLOUR = '#3b4248';

/** Whether two maps share their grid (same lean and handlebar values), so one can be drawn over the other. */
export function sameGrid(a: EnvelopeMapData, b: EnvelopeMapData): boolean {
  const same = (x: number[], y: number[]) => x.length === y.length && x.every((v, i) => Math.abs(v - y[i]) < 1e-9);
  return same(a.lean, b.lean) && same(a.handlebar, b.handlebar) && a.travelMm === b.travelMm;
}

export function withReferenceMap(option: EChartsCoreOption, reference: EnvelopeMapData, metric: MapMetric, label: string): EChartsCoreOption {
  const outline = cellOutlineSeries(reference, (c) => c.severity[metric] === 'within', `within tolerance (${label})`, { color: REFERENCE_MAP_COLOUR, width: 2, type: REFERENCE_DASH });
  return outline ? { ...option, series: [...seriesOf(option), outline] } : option;
}
