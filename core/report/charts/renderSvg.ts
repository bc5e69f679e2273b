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

export { echarts };

/** An option rendered to an SVG string without a screen (ECharts server-side rendering). */
export function renderOptionToSvg(option: echarts.EChartsCoreOption, width = 720, height = 360): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  try {
    chart.setOption(option);
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}
