/**
 * The parts of ECharts the charts use, registered once (tree-shaken, SVG renderer only), and an
 * option rendered to an SVG string without a screen (ECharts server-side rendering): the
 * workbench draws the same options live (renderer/charts/echartsSetup.ts re-exports these), the
 * report inlines the SVG.
 */
import * as echarts from 'echarts/core';
import { HeatmapChart, LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TitleComponent, TooltipComponent, VisualMapComponent } from 'echarts/components';
import { SVGRenderer } from 'echarts/renderers';
import { EM_WIDTH, fitToSize } from './fitLayout';

echarts.use([
  LineChart,
  ScatterChart,
  HeatmapChart,
  GridComponent,
  LegendComponent,
  TitleComponent,
  TooltipComponent,
  VisualMapComponent,
  MarkLineComponent,
  MarkAreaComponent,
  SVGRenderer,
]);

// Without a screen ECharts measures text with Arial-like widths, narrower than the DejaVu Sans
// the SVG is usually shown in, so legend items ran into each other: here (no document: Node, a
// worker) every glyph counts as EM_WIDTH of the font size, the generous width fitLayout.ts
// also lays out with (common practice, no source).
if (typeof (globalThis as { document?: unknown }).document === 'undefined') {
  echarts.setPlatformAPI({
    measureText: (text: string, font?: string) => {
      const size = /(\d+(?:\.\d+)?)px/.exec(font ?? '');
      return { width: (text ?? '').length * (size ? Number(size[1]) : 12) * EM_WIDTH };
    },
  });
}

export { echarts };

/** An option rendered to an SVG string without a screen (ECharts server-side rendering), fitted to its size (fitLayout.ts). */
export function renderOptionToSvg(option: echarts.EChartsCoreOption, width = 720, height = 360): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption(fitToSize(option, width, height));
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}
