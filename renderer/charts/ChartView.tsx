/** One ECharts chart (SVG renderer) showing an option; resized with its box. */
import { useEffect, useRef } from 'react';
import type { EChartsCoreOption } from 'echarts/core';
import { echarts } from './echartsSetup';
import { fitToSize } from '../../core/report/charts/fitLayout';

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
  // The option last given, fitted again to each new size.
  const shown = useRef<EChartsCoreOption | null>(null);
  useEffect(() => {
    click.current = onClick;
  }, [onClick]);

  useEffect(() => {
    const node = el.current;
    if (!node) return;
    const c = echarts.init(node, null, { renderer: 'svg' });
    chart.current = c;
    c.on('click', (p) => click.current?.(p as ChartClick));
    // A new size re-fits the option (legend lines, axis names, cell numbers) before resizing.
    const ro =
      typeof ResizeObserver === 'undefined'
        ? null
        : new ResizeObserver(() => {
            if (shown.current) c.setOption(fitToSize(shown.current, node.clientWidth, node.clientHeight), { notMerge: true });
            c.resize();
          });
    ro?.observe(node);
    return () => {
      ro?.disconnect();
      c.dispose();
      chart.current = null;
    };
  }, []);

  useEffect(() => {
    shown.current = option;
    const node = el.current;
    // Drawn at once, not on ECharts' next animation frame: with software compositing a frame can
    // take 50-90 ms, and a new result should show in the frame that follows it.
    chart.current?.setOption(node ? fitToSize(option, node.clientWidth, node.clientHeight) : option, { notMerge: true, lazyUpdate: false });
  }, [option]);

  return <div ref={el} className="chart" data-testid={testId} />;
}
