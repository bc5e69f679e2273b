// @vitest-environment node
// The chart option builders are pure and render to SVG without a screen (ECharts SSR), the way
// the CLI's reports will use them.
import { describe, expect, it } from 'vitest';
import { resolveDesign } from '../../core/design/resolveDesign';
import { renderOptionToSvg } from '../../core/report/charts/renderSvg';
import { CHART_COLOURS } from '../../core/report/charts/chartStyle';
import { CURVE_CHARTS, curveOption, leanSteerOption, type CurveChartId } from '../../core/report/charts/curveOptions';
import { heatMapOption } from '../../core/report/charts/heatMapOptions';
import { computeCurves, computeMap } from '../../core/report/chartSweeps';
import { demoDesign } from './helpers';

/** The title each chart must carry, written out here (not read from the builders). */
const TITLES: Record<CurveChartId, string> = {
  leanSteer: 'Lean steer',
  bumpSteer: 'Bump steer',
  ratioLean: 'Ratio change',
  slipSteer: 'Toe mismatch',
  ackermann: 'Ackermann',
  camber: 'Camber',
  jointsLean: 'Joint articulation against lean',
  jointsSteer: 'Joint articulation against steer',
  ratio: 'Steering ratio',
  frontLift: 'Front lift with steer',
};

/**
 * Whether the SVG draws a data line in `colour`: a stroked path of at least `points` vertices
 * (a legend's icon in the same colour has a handful).
 */
function drawsLine(svg: string, colour: string, points = 8): boolean {
  for (const tag of svg.match(/<path\b[^>]*>/g) ?? []) {
    if (!tag.includes(`stroke="${colour}"`)) continue;
    const d = /\sd="([^"]*)"/.exec(tag)?.[1] ?? '';
    if ((d.match(/[ML]/g) ?? []).length >= points) return true;
  }
  return false;
}

describe('charts without a screen', () => {
  const design = demoDesign('swift-parallelogram-trike');
  const curves = computeCurves({ design });
  const marker = { leanDeg: 5, handlebarDeg: 10, travelMm: 0, ackermann: { innerDeg: 10, outerDeg: 9 } };

  it('the lean-steer chart renders to an SVG string with its title, axes and both wheels', () => {
    const svg = renderOptionToSvg(leanSteerOption(curves), 640, 320);
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('Lean steer');
    expect(svg).toContain('self-steer (deg, left +)');
    expect(svg).toContain('self-steer (road-wheel angle change, left +), left');
    expect(drawsLine(svg, CHART_COLOURS.left)).toBe(true);
    expect(drawsLine(svg, CHART_COLOURS.right)).toBe(true);
  });

  it('every 1-D chart builds an option that renders its title and a drawn line', () => {
    expect(CURVE_CHARTS.map((c) => c.id).sort()).toEqual(Object.keys(TITLES).sort());
    for (const c of CURVE_CHARTS) {
      const svg = renderOptionToSvg(curveOption(c.id, curves, marker));
      expect(svg, c.id).toMatch(/^<svg[\s\S]*<\/svg>$/);
      expect(svg, c.id).toContain(`>${TITLES[c.id]}<`);
      expect(svg, c.id).toContain('<path');
      expect(drawsLine(svg, CHART_COLOURS.left), `${c.id} draws a data line`).toBe(true);
    }
  });

  it('negative control: a chart whose curve is missing draws no data line', () => {
    const svg = renderOptionToSvg(curveOption('slipSteer', { ...curves, curves: {}, missing: { slipSteer: 'the sweep failed' } }, marker));
    expect(svg).toContain('the sweep failed');
    expect(drawsLine(svg, CHART_COLOURS.left)).toBe(false);
  });

  it('the envelope heat map renders with its legend of conditions', () => {
    const map = computeMap({ design, angleStepDeg: 10 });
    expect(map.cells).toHaveLength(map.lean.length * map.handlebar.length);
    const svg = renderOptionToSvg(heatMapOption(map, 'status', { leanDeg: 0, handlebarDeg: 0 }), 640, 360);
    expect(svg).toContain('Envelope map');
    expect(svg).toContain('within');
    expect(svg).toContain('assemble');
    expect(svg).toContain('<rect');
  });

  it('curves are core’s: zero self-steer at zero lean, tolerances and ratings from the design', () => {
    const lean = curves.curves.leanSteer!;
    const i0 = lean.x.values.indexOf(0);
    expect(i0).toBeGreaterThanOrEqual(0);
    // Self-steer is the road-wheel angle at zero handlebar minus upright's: zero upright by definition.
    expect(lean.series.find((s) => s.id === 'selfSteer.left')!.values[i0]).toBeCloseTo(0, 9);
    expect(lean.series.find((s) => s.id === 'selfSteer.left')!.values.some((v) => v !== null && Math.abs(v) > 1e-6)).toBe(true);
    const resolved = resolveDesign(design);
    expect(curves.tolerances).toEqual(resolved.tolerances);
    expect(curves.ratedDeg.tieRodOuter).toBe(resolved.joints.tieRodOuter.ratedDeg);
    expect(Object.keys(curves.curves).sort()).toEqual(['ackermann', 'bumpSteer', 'camberLean', 'camberTravel', 'frontLift', 'jointsLean', 'jointsSteer', 'leanSteer', 'ratioLean', 'slipSteer', 'steeringRatio']);
  });

  it('a non-tilting design has no lean curves, and the chart says why', () => {
    const set = computeCurves({ design: demoDesign('wren-rack-trike') });
    expect(set.curves.leanSteer).toBeUndefined();
    expect(set.curves.ratioLean).toBeUndefined();
    expect(renderOptionToSvg(leanSteerOption(set))).toContain('does not lean');
  });
});
