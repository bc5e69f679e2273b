// @vitest-environment node
// A chart's y range keeps its limit lines in view, and a held range stays put through an edit.
// Checked on what ECharts itself draws (its SSR SVG): the tolerance line's label is in the picture.
import { describe, expect, it } from 'vitest';
import { dataExtent, heldRanges, LIMIT_HEADROOM, limitValues, niceOut, withHeldRanges } from '../../../core/report/charts/axisRange';
import { curveOption } from '../../../core/report/charts/curveOptions';
import { renderOptionToSvg } from '../../../core/report/charts/renderSvg';
import { computeCurves } from '../../../core/report/chartSweeps';
import { demoDesign } from '../../renderer/helpers';

type Axis = { min: unknown; max: unknown };

describe('y range of the curve charts', () => {
  it('always reaches past the tolerance lines, however small the curves', () => {
    const design = demoDesign('wren-rack-trike');
    const set = computeCurves({ design });
    const opt = curveOption('bumpSteer', set);
    const limits = limitValues(opt, 0);
    expect(limits.length).toBeGreaterThan(0);
    const tol = Math.max(...limits);
    const axis = (opt as { yAxis: Axis }).yAxis;
    // ECharts calls min/max with the data's extent: a tiny extent still shows the limits.
    const min = (axis.min as (v: { min: number }) => number)({ min: -0.001 });
    const max = (axis.max as (v: { max: number }) => number)({ max: 0.002 });
    // The limit plus its headroom, rounded up to a readable end (0.2875 -> 0.3).
    expect(max).toBeGreaterThanOrEqual(tol * (1 + LIMIT_HEADROOM));
    expect(max).toBe(niceOut(tol * (1 + LIMIT_HEADROOM), 1));
    expect(min).toBeLessThanOrEqual(-tol);
    // Large data is not clipped (negative control of the widening).
    expect((axis.max as (v: { max: number }) => number)({ max: 9 })).toBe(9);
    const svg = renderOptionToSvg(opt);
    expect(svg).toContain(`+${tol} deg`);
  });

  it('ends the axis on a readable number, rounded outwards to half the order of magnitude', () => {
    expect(niceOut(39.11914239064057, 1)).toBe(40);
    expect(niceOut(0.2875, 1)).toBe(0.3);
    expect(niceOut(-0.2875, -1)).toBe(-0.3);
    expect(niceOut(1.15, 1)).toBe(1.5);
    expect(niceOut(-0.0012, -1)).toBe(-0.0015);
    expect(niceOut(-0.001, -1)).toBe(-0.001);
    expect(niceOut(9, 1)).toBe(9);
    expect(niceOut(0, 1)).toBe(0);
  });

  it('a held range stays as it was when the curves change', () => {
    const design = demoDesign('wren-rack-trike');
    const before = curveOption('bumpSteer', computeCurves({ design }));
    const ranges = heldRanges(before);
    const ext = dataExtent(before, 0)!;
    expect(ranges[0]![0]).toBeLessThanOrEqual(ext[0]);
    expect(ranges[0]![1]).toBeGreaterThanOrEqual(ext[1]);
    const moved = JSON.parse(JSON.stringify(design)) as typeof design;
    (moved as unknown as { frontEnd: { upper: { outerJoint: { z: number } } } }).frontEnd.upper.outerJoint.z += 15;
    const after = curveOption('bumpSteer', computeCurves({ design: moved }));
    expect(dataExtent(after, 0)).not.toEqual(ext);
    const held = withHeldRanges(after, ranges) as { yAxis: Axis };
    expect(held.yAxis.min).toBe(ranges[0]![0]);
    expect(held.yAxis.max).toBe(ranges[0]![1]);
  });
});
