/**
 * A reference design's curves drawn over a chart of the design on screen: the reference's own
 * chart option for the same chart, its data lines copied in with the same colours, a finer dash
 * pattern, a lighter stroke and a name that says which design they are. Marks (tolerance lines,
 * the current-pose marker) and other series are the design on screen's only.
 */
import type { EChartsCoreOption } from 'echarts/core';

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
