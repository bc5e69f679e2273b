// @vitest-environment node
// The chart option builders are pure and render to SVG without a screen (ECharts SSR), the way
// the CLI's reports will use them.
import { describe, expect, it } from 'vitest';
import { renderOptionToSvg } from '../../renderer/charts/echartsSetup';
import { CURVE_CHARTS, curveOption, leanSteerOption } from '../../renderer/charts/curveOptions';
import { heatMapOption } from '../../renderer/charts/heatMapOptions';
import { computeCurves, computeMap } from '../../renderer/workers/sweepJobs';
import { demoDesign } from './helpers';

describe('charts without a screen', () => {
  const curves = computeCurves({ design: demoDesign('swift-parallelogram-trike') });

  it('the lean-steer chart renders to an SVG string with its title, axes and both wheels', () => {
    const svg = renderOptionToSvg(leanSteerOption(curves), 640, 320);
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('Lean steer');
    expect(svg).toContain('toe change (deg, toe-in +)');
    expect(svg).toContain('lean steer (toe change), left');
    expect(svg).toContain('<path');
  });

  it('every 1-D chart builds an option that renders', () => {
    for (const c of CURVE_CHARTS) {
      const svg = renderOptionToSvg(curveOption(c.id, curves, { leanDeg: 5, handlebarDeg: 10, travelMm: 0, ackermann: { innerDeg: 10, outerDeg: 9 } }));
      expect(svg, c.id).toMatch(/^<svg[\s\S]*<\/svg>$/);
    }
  });

  it('the envelope heat map renders with its legend of conditions', () => {
    const map = computeMap({ design: demoDesign('swift-parallelogram-trike'), angleStepDeg: 10 });
    expect(map.cells).toHaveLength(map.lean.length * map.handlebar.length);
    const svg = renderOptionToSvg(heatMapOption(map, 'status', { leanDeg: 0, handlebarDeg: 0 }), 640, 360);
    expect(svg).toContain('Envelope map');
    expect(svg).toContain('within');
    expect(svg).toContain('assemble');
    expect(svg).toContain('<rect');
  });

  it('curves are core’s: zero toe change at zero lean, tolerance and ratings from the design', () => {
    const lean = curves.curves.leanSteer!;
    const i0 = lean.x.values.indexOf(0);
    expect(lean.series.find((s) => s.id === 'toeError.left')!.values[i0]).toBeCloseTo(0, 9);
    expect(curves.tolerances.toeErrorDeg).toBe(0.25);
    expect(curves.ratedDeg.tieRodOuter).toBeGreaterThan(0);
    expect(Object.keys(curves.curves).sort()).toEqual(['ackermann', 'bumpSteer', 'camberLean', 'camberTravel', 'frontLift', 'jointsLean', 'jointsSteer', 'leanSteer', 'steeringRatio']);
  });

  it('a non-tilting design has no lean curves, and the chart says why', () => {
    const set = computeCurves({ design: demoDesign('wren-rack-trike') });
    expect(set.curves.leanSteer).toBeUndefined();
    expect(renderOptionToSvg(leanSteerOption(set))).toContain('does not lean');
  });
});
