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

describe('reference outline over the envelope map', () => {
  it("outlines the reference's cells within tolerance on the measure shown, on the same grid only", async () => {
    const { computeMap } = await import('../../../core/report/chartSweeps');
    const { heatMapOption } = await import('../../../core/report/charts/heatMapOptions');
    const { bandEdges } = await import('../../../core/report/charts/regionOutline');
    const { sameGrid, withReferenceMap } = await import('../../../core/report/charts/referenceOverlay');
    const design = demoDesign('heron-tilting-velomobile');
    const map = computeMap({ design, angleStepDeg: 5 });
    const own = heatMapOption(map, 'selfSteer');
    const withRef = withReferenceMap(own, map, 'selfSteer', 'pinned');
    const added = (withRef as { series: Series[] }).series.slice((own as { series: Series[] }).series.length);
    expect(added).toHaveLength(1);
    expect(added[0].name).toBe('within tolerance (pinned)');
    // Every corner of the outline is a band edge of the grid, and it passes along the edge of
    // every within cell that has an outside neighbour (checked on one: the first such cell).
    const xs = bandEdges(map.lean);
    const ys = bandEdges(map.handlebar);
    const pts = (added[0].data as [number | null, number | null][]).filter((p) => p[0] !== null) as [number, number][];
    for (const [x, y] of pts) {
      expect(xs.some((e) => Math.abs(e - x) < 1e-9)).toBe(true);
      expect(ys.some((e) => Math.abs(e - y) < 1e-9)).toBe(true);
    }
    const within = map.cells.filter((c) => c.severity.selfSteer === 'within');
    expect(within.length).toBeGreaterThan(0);
    expect(within.length).toBeLessThan(map.cells.length);
    // A measure on which no cell is within draws no outline (negative control).
    const none = { ...map, cells: map.cells.map((c) => ({ ...c, severity: { ...c.severity, selfSteer: 'over' as const } })) };
    expect(withReferenceMap(own, none, 'selfSteer', 'x')).toBe(own);
    // Another grid step is another grid.
    expect(sameGrid(map, map)).toBe(true);
    expect(sameGrid(map, computeMap({ design, angleStepDeg: 10 }))).toBe(false);
  }, 60_000);
});
