// @vitest-environment node
// A reference design's curves over a chart: drawn (ECharts' own SSR renderer turns the option into
// SVG) as extra lines in the same colours with the reference dash, named after the reference, with
// the reference's own numbers; the design on screen's lines and marks unchanged.
import { describe, expect, it } from 'vitest';
import { curveOption } from '../../../core/report/charts/curveOptions';
import { REFERENCE_DASH, withReference } from '../../../core/report/charts/referenceOverlay';
import { renderOptionToSvg } from '../../../core/report/charts/renderSvg';
import { computeCurves } from '../../../core/report/chartSweeps';
import { demoDesign } from '../../renderer/helpers';

type Series = { type: string; name: string; data: unknown; lineStyle?: { type?: unknown }; markLine?: unknown };

describe('reference curves over a chart', () => {
  it("adds the reference's lines, dotted and named, and leaves the design's own series as they were", () => {
    const design = demoDesign('wren-rack-trike');
    const moved = JSON.parse(JSON.stringify(design)) as typeof design;
    (moved as unknown as { frontEnd: { upper: { outerJoint: { z: number } } } }).frontEnd.upper.outerJoint.z += 8;
    const own = curveOption('bumpSteer', computeCurves({ design }));
    const ref = curveOption('bumpSteer', computeCurves({ design: moved }));
    const both = withReference(own, ref, 'before');
    const series = (both as { series: Series[] }).series;
    const ownSeries = (own as { series: Series[] }).series;
    expect(series.slice(0, ownSeries.length)).toEqual(ownSeries);
    const added = series.slice(ownSeries.length);
    const refLines = (ref as { series: Series[] }).series.filter((s) => s.type === 'line' && Array.isArray(s.data) && (s.data as unknown[]).length > 1);
    expect(added).toHaveLength(refLines.length);
    expect(added.length).toBeGreaterThan(0);
    added.forEach((s, i) => {
      expect(s.name).toBe(`${refLines[i].name} (before)`);
      expect(s.data).toEqual(refLines[i].data);
      expect(s.lineStyle?.type).toEqual(REFERENCE_DASH);
      expect(s.markLine).toBeUndefined();
    });
    // The moved design's bump steer differs: the overlay carries other numbers (negative control).
    expect(added[0].data).not.toEqual(ownSeries.find((s) => s.name === refLines[0].name)?.data);
    const svg = renderOptionToSvg(both);
    // ECharts writes the dash array comma-separated; the charts of the design itself use other patterns.
    expect(renderOptionToSvg(own)).not.toContain(`stroke-dasharray="${REFERENCE_DASH.join(',')}"`);
    expect(svg).toContain(`stroke-dasharray="${REFERENCE_DASH.join(',')}"`);
    expect(svg).toContain('(before)');
  });
});
