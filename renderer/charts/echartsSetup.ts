/** ECharts as the workbench uses it: registered once in core/report/charts/renderSvg.ts (the report renders the same options to SVG). */
export { echarts, renderOptionToSvg } from '../../core/report/charts/renderSvg';
