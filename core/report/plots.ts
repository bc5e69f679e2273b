/**
 * The workbench's charts as standalone SVG files: every 1-D curve chart and the envelope map,
 * drawn by the same option builders and rendered by ECharts without a screen. The report
 * inlines the same renderings.
 */
import { renderOptionToSvg } from './charts/renderSvg';
import { CURVE_CHARTS, curveOption, type ChartMarker, type CurveChartId } from './charts/curveOptions';
import { heatMapOption } from './charts/heatMapOptions';
import type { CurveSet, EnvelopeMapData } from './charts/chartData';

export interface Plot {
  /** File name without extension, in words ('lean-steer', 'envelope-map'). */
  name: string;
  title: string;
  svg: string;
  width: number;
  height: number;
}

/** The design position, marked on every chart. */
export const DESIGN_MARKER: ChartMarker = { leanDeg: 0, handlebarDeg: 0, travelMm: 0, ackermann: null };

/** 'leanSteer' -> 'lean-steer'. */
export const plotName = (id: CurveChartId | 'envelopeMap') => id.replace(/([a-z])([A-Z])/g, '$1-$2').toLowerCase();

/** The envelope map's option, without the workbench's hint to click a cell. */
export function mapOptionForPaper(map: EnvelopeMapData): ReturnType<typeof heatMapOption> {
  const option = heatMapOption(map, 'status', { leanDeg: 0, handlebarDeg: 0 }) as { title?: { subtext?: string } | { subtext?: string }[] };
  const main = Array.isArray(option.title) ? option.title[0] : option.title;
  if (main && typeof main.subtext === 'string') main.subtext = main.subtext.replace(/; click a cell to go there$/, '');
  return option as ReturnType<typeof heatMapOption>;
}

/** The files `renderPlots` makes, in its order. */
export const PLOT_FILES: readonly string[] = [...CURVE_CHARTS.map((c) => plotName(c.id)), plotName('envelopeMap')];

export interface PlotSizes {
  curve: [number, number];
  map: [number, number];
}

/** The size of the workbench's plot panel, about. */
export const WORKBENCH_PLOT_SIZES: PlotSizes = { curve: [720, 360], map: [720, 420] };

export function renderPlots(curves: CurveSet, map: EnvelopeMapData, sizes: PlotSizes = WORKBENCH_PLOT_SIZES): Plot[] {
  const plots: Plot[] = CURVE_CHARTS.map((c) => {
    const [width, height] = sizes.curve;
    return { name: plotName(c.id), title: c.label, svg: renderOptionToSvg(curveOption(c.id, curves, DESIGN_MARKER), width, height), width, height };
  });
  const [width, height] = sizes.map;
  plots.push({ name: plotName('envelopeMap'), title: 'Envelope map', svg: renderOptionToSvg(mapOptionForPaper(map), width, height), width, height });
  return plots;
}
