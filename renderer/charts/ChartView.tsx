/** One ECharts chart (SVG renderer) showing an option; resized with its box. */
import { useEffect, useRef } from 'react';
import type { EChartsCoreOption } from 'echarts/core';
import { echarts } from './echartsSetup';

export interface ChartClick {
  seriesType?: string;
  data?: unknown;
  value?: unknown;
}

export function ChartView({ option, onClick, testId }: { option: EChartsCoreOption; onClick?: (p: ChartClick) => void; testId?: string }) {
  const el = useRef<HTMLDivElement>(null);
  const chart = useRef<ReturnType<typeof echarts.init> | null>(null);
  // The latest click handler, for the chart's listener made once below (kept current after
  // each render, never written during one).
  const click = useRef(onClick);
  useEffect(() => {
    click.current = onClick;
  }, [onClick]);

  useEffect(() => {
    const node = el.current;
    if (!node) return;
    const c = echarts.init(node, null, { renderer: 'svg' });
    chart.current = c;
    c.on('click', (p) => click.current?.(p as ChartClick));
    const ro = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(() => c.resize());
    ro?.observe(node);
    return () => {
      ro?.disconnect();
      c.dispose();
      chart.current = null;
    };
  }, []);

  useEffect(() => {
    chart.current?.setOption(option, { notMerge: true, lazyUpdate: true });
  }, [option]);

  return <div ref={el} className="chart" data-testid={testId} />;
}
