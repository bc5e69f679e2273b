// @vitest-environment node
// The envelope map's overlays: core's operating region drawn as a dashed outline (checked
// cell by cell against the cells core puts in the region) and one labelled balanced-turn line
// per riding speed.
import { describe, expect, it } from 'vitest';
import { renderOptionToSvg } from '../../core/report/charts/renderSvg';
import { BALANCED_SERIES, heatMapOption, REGION_SERIES } from '../../core/report/charts/heatMapOptions';
import { bandEdges, regionOutline } from '../../core/report/charts/regionOutline';
import { lineSpeeds } from '../../core/analysis/envelopeMap';
import { resolveDesign } from '../../core/design/resolveDesign';
import { computeMap } from '../../core/report/chartSweeps';
import { demoDesign } from './helpers';

type Pt = [number, number];

/** Even-odd point-in-polygon test over several loops (a ray cast along +x; textbook computational geometry). */
function insideLoops(p: Pt, loops: Pt[][]): boolean {
  let inside = false;
  for (const loop of loops) {
    for (let k = 0, m = loop.length - 1; k < loop.length; m = k++) {
      const [xa, ya] = loop[k];
      const [xb, yb] = loop[m];
      if (ya > p[1] !== yb > p[1] && p[0] < ((xb - xa) * (p[1] - ya)) / (yb - ya) + xa) inside = !inside;
    }
  }
  return inside;
}

/** Splits a line series' data at its gaps into loops (dropping each loop's repeated first point). */
function loopsOf(data: ([number, number] | [null, null])[]): Pt[][] {
  const loops: Pt[][] = [[]];
  for (const d of data) {
    if (d[0] === null) loops.push([]);
    else loops[loops.length - 1].push(d as Pt);
  }
  return loops.map((l) => l.slice(0, -1));
}

describe('region outline (cell-edge loops)', () => {
  it('an L of three cells is one loop of six corners, counter-clockwise (drawn by hand)', () => {
    const cells = new Set(['0,0', '1,0', '0,1']);
    const loops = regionOutline(3, 3, (i, j) => cells.has(`${i},${j}`));
    expect(loops).toEqual([
      [
        [0, 0],
        [2, 0],
        [2, 1],
        [1, 1],
        [1, 2],
        [0, 2],
      ],
    ]);
  });

  it('two separate patches give two loops; a ring gives an outer and an inner loop', () => {
    expect(regionOutline(4, 1, (i) => i !== 1 && i !== 2)).toHaveLength(2);
    const ring = regionOutline(3, 3, (i, j) => !(i === 1 && j === 1));
    expect(ring.map((l) => l.length).sort()).toEqual([4, 4]);
    expect(regionOutline(2, 2, () => false)).toEqual([]);
  });

  it('band edges sit half a step beyond the first and last values', () => {
    expect(bandEdges([-10, -5, 0, 5, 10])).toEqual([-12.5, -7.5, -2.5, 2.5, 7.5, 12.5]);
  });
});

describe('envelope map overlays', () => {
  const design = demoDesign('heron-tilting-velomobile');
  const map = computeMap({ design, angleStepDeg: 5 });
  const option = heatMapOption(map, 'status', { leanDeg: -6, handlebarDeg: 4 }) as { series: Record<string, unknown>[]; legend: { data: { name: string }[] } };

  it('outlines exactly the cells core puts in the operating region, dashed, and the legend names it', () => {
    const region = option.series.filter((s) => s.name === REGION_SERIES);
    expect(region).toHaveLength(1);
    expect((region[0].lineStyle as { type: unknown }).type).not.toBe('solid');
    const loops = loopsOf(region[0].data as ([number, number] | [null, null])[]);
    const inside = map.cells.filter((c) => c.inRegion).length;
    expect(inside).toBeGreaterThan(0);
    expect(inside).toBeLessThan(map.cells.length);
    for (const c of map.cells) {
      const centre: Pt = [map.lean[c.leanIndex], map.handlebar[c.handlebarIndex]];
      expect(insideLoops(centre, loops), `cell at lean ${centre[0]}, handlebar ${centre[1]}`).toBe(c.inRegion);
    }
    expect(option.legend.data.map((d) => d.name)).toContain('operating region');
  });

  it('draws one labelled balanced-turn line per riding speed', () => {
    const speeds = lineSpeeds(resolveDesign(design).riding);
    expect(speeds.length).toBeGreaterThan(2);
    const lines = option.series.filter((s) => s.name === BALANCED_SERIES);
    expect(lines).toHaveLength(speeds.length);
    expect(map.balancedLines.map((l) => l.speedKmh)).toEqual(speeds);
    for (const l of lines) {
      // Each line is drawn: more than one point of it lies on the map.
      expect((l.data as unknown[][]).filter((p) => p[0] !== null).length, String(l.name)).toBeGreaterThan(1);
    }
    const labels = option.series.find((s) => s.name === 'speeds')!.data as { name: string }[];
    expect(labels.map((l) => l.name).sort()).toEqual(speeds.map((v) => `${v} km/h`).sort());
    const svg = renderOptionToSvg(option as never, 900, 420);
    for (const v of speeds) expect(svg).toContain(`${v} km/h`);
    expect(svg).toContain('operating region');
  });

  it('a vehicle that does not lean has its region outlined and no balanced lines', () => {
    const wren = computeMap({ design: demoDesign('wren-rack-trike'), angleStepDeg: 10 });
    const o = heatMapOption(wren, 'status') as { series: Record<string, unknown>[] };
    expect(wren.balancedLines).toEqual([]);
    expect(o.series.filter((s) => s.name === BALANCED_SERIES)).toHaveLength(0);
    expect(o.series.filter((s) => s.name === REGION_SERIES)).toHaveLength(1);
  });
});
