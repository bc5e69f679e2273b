// @vitest-environment node
// Plots a designer can read: every chart of every demo, drawn by ECharts itself (its SSR SVG,
// the report's rendering) at the report's size and at a small strip's size: no legend paged
// ("1/2") or cut, no two texts on top of each other (boxes from the SVG's own text positions,
// glyph widths as the layout counts them, EM_WIDTH), the joints' limit lines written once each.
import { describe, expect, it } from 'vitest';
import { renderOptionToSvg } from '../../../core/report/charts/renderSvg';
import { CURVE_CHARTS, curveOption, jointLimitLines, camberLegendName, jointLegendName } from '../../../core/report/charts/curveOptions';
import { EM_WIDTH, fitAxisName, fitToSize, legendLines } from '../../../core/report/charts/fitLayout';
import { computeCurves, computeMap } from '../../../core/report/chartSweeps';
import { heatMapOption } from '../../../core/report/charts/heatMapOptions';
import { demoDesign } from '../../renderer/helpers';

export interface Box {
  text: string;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** The box of each <text> in an ECharts SVG (translate or rotation matrix, anchor, central baseline). */
export function textBoxes(svg: string): Box[] {
  const out: Box[] = [];
  for (const m of svg.matchAll(/<text([^>]*)>([^<]*)<\/text>/g)) {
    const attrs = m[1];
    const text = m[2].replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>');
    if (!text.trim()) continue;
    const size = Number(/font-size:([\d.]+)px/.exec(attrs)?.[1] ?? 12);
    const anchor = /text-anchor="(\w+)"/.exec(attrs)?.[1] ?? 'start';
    const dx = Number(/ x="([-\d.e]+)"/.exec(attrs)?.[1] ?? 0);
    const dy = Number(/ y="([-\d.e]+)"/.exec(attrs)?.[1] ?? 0);
    const central = /dominant-baseline="central"/.test(attrs);
    const w = text.length * size * EM_WIDTH;
    // In the text's own frame.
    const lx0 = dx - (anchor === 'middle' ? w / 2 : anchor === 'end' ? w : 0);
    const ly0 = central ? dy - size / 2 : dy - size * 0.8;
    const t = /transform="translate\(([-\d.e]+)[ ,]([-\d.e]+)\)"/.exec(attrs);
    const mx = /transform="matrix\(([^)]*)\)"/.exec(attrs);
    const [a, b, c, d, e, f] = t ? [1, 0, 0, 1, Number(t[1]), Number(t[2])] : mx ? mx[1].split(',').map(Number) : [1, 0, 0, 1, 0, 0];
    const corners = [
      [lx0, ly0],
      [lx0 + w, ly0],
      [lx0, ly0 + size],
      [lx0 + w, ly0 + size],
    ].map(([x, y]) => [a * x + c * y + e, b * x + d * y + f]);
    out.push({ text, x0: Math.min(...corners.map((p) => p[0])), x1: Math.max(...corners.map((p) => p[0])), y0: Math.min(...corners.map((p) => p[1])), y1: Math.max(...corners.map((p) => p[1])) });
  }
  return out;
}

/** Pairs of boxes that overlap by more than `slack` px each way. */
export function overlaps(boxes: Box[], slack = 1): [string, string][] {
  const out: [string, string][] = [];
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++) {
      const p = boxes[i];
      const q = boxes[j];
      if (Math.min(p.x1, q.x1) - Math.max(p.x0, q.x0) > slack && Math.min(p.y1, q.y1) - Math.max(p.y0, q.y0) > slack) out.push([p.text, q.text]);
    }
  return out;
}

const DEMOS = ['heron-tilting-velomobile', 'wren-rack-trike', 'swift-parallelogram-trike', 'linnet-track-rod-trike', 'finch-knuckle-steered-trike'];
const SIZES: [number, number][] = [
  [720, 360],
  [560, 300],
];

describe('curve charts a designer can read', () => {
  for (const demo of DEMOS) {
    it(`${demo}: no paged or cut legend, no two texts overlapping, at ${SIZES.map((s) => s.join('x')).join(' and ')}`, () => {
      const set = computeCurves({ design: demoDesign(demo) });
      // The 'now' line at the middle and near each end of the sweeps (its word sits at the top,
      // where a limit line's words at that end printed on top of it at lean 25 on the Heron).
      const ends = (...kinds: (keyof typeof set.curves)[]) => {
        const xs = kinds.flatMap((k) => (set.curves[k]?.x.values ?? []).filter((v): v is number => v !== null));
        return xs.length ? [Math.min(...xs) * 0.95, Math.max(...xs) * 0.95] : [0, 0];
      };
      const [lean, bar, travel] = [ends('leanSteer', 'camberLean'), ends('slipSteer'), ends('bumpSteer')];
      const markers = [0, 1].map((k) => ({ leanDeg: lean[k], handlebarDeg: bar[k], travelMm: travel[k], ackermann: null }));
      markers.unshift({ leanDeg: 0, handlebarDeg: 0, travelMm: 0, ackermann: null });
      for (const { id } of CURVE_CHARTS)
      for (const marker of markers) {
        const opt = curveOption(id, set, marker);
        for (const [w, h] of SIZES) {
          const svg = renderOptionToSvg(opt, w, h);
          const boxes = textBoxes(svg);
          const where = `${demo} ${id} ${w}x${h} now at lean ${marker.leanDeg.toFixed(1)}, handlebar ${marker.handlebarDeg.toFixed(1)}, travel ${marker.travelMm.toFixed(1)}`;
          // No pager ("1/2") and no name cut with an ellipsis.
          expect(boxes.filter((b) => /^\d+\/\d+$/.test(b.text) || b.text.includes('…')).map((b) => b.text), where).toEqual([]);
          // Every series' legend words written whole.
          const legend = (fitToSize(opt, w, h) as { legend?: { formatter?: (n: string) => string } }).legend;
          const fmt = legend?.formatter ?? ((n: string) => n);
          for (const s of (opt as { series: { name?: string; type: string }[] }).series) if (s.name) expect(boxes.map((b) => b.text), `${where}: ${s.name}`).toContain(fmt(s.name));
          // Nothing out of the picture, nothing on top of anything else.
          for (const b of boxes) {
            expect(b.x0, `${where}: ${b.text}`).toBeGreaterThanOrEqual(-1);
            expect(b.x1, `${where}: ${b.text}`).toBeLessThanOrEqual(w + 1);
            expect(b.y0, `${where}: ${b.text}`).toBeGreaterThanOrEqual(-1);
            expect(b.y1, `${where}: ${b.text}`).toBeLessThanOrEqual(h + 1);
          }
          expect(overlaps(boxes), `${where}: ${JSON.stringify(overlaps(boxes))}`).toEqual([]);
        }
      }
    }, 60_000);
  }

  it('the overlap check finds what printed on top of each other before (negative control)', () => {
    const boxes = textBoxes(
      '<text dominant-baseline="central" text-anchor="end" style="font-size:10px;" transform="translate(700 120)">rated 28 deg</text>' +
        '<text dominant-baseline="central" text-anchor="end" style="font-size:10px;" transform="translate(700 124)">28 − 3 margin</text>' +
        '<text dominant-baseline="central" text-anchor="end" style="font-size:10px;" transform="translate(700 160)">25 − 3 margin</text>',
    );
    expect(overlaps(boxes)).toEqual([['rated 28 deg', '28 − 3 margin']]);
  });

  it("joints' limit lines: one line per value, both words on a shared one, neighbours written at different places", () => {
    const ml = jointLimitLines([28, 25, 25], 3) as { data: { yAxis: number; name: string; label: { position: string } }[] };
    expect(ml.data.map((d) => d.yAxis)).toEqual([22, 25, 28]);
    expect(ml.data[1].name).toBe('28 − 3 margin; rated 25 deg');
    for (let i = 1; i < ml.data.length; i++) expect(ml.data[i].label.position).not.toBe(ml.data[i - 1].label.position);
  });

  it("the joints' legend: one entry per joint for both sides, at most two lines in a 560 px wide strip chart (issue 11: three lines crowded the plot at 1280x800)", () => {
    for (const demo of DEMOS) {
      const set = computeCurves({ design: demoDesign(demo) });
      for (const id of ['jointsLean', 'jointsSteer'] as const) {
        // A vehicle that does not lean has no lean curves.
        if (!set.curves[id]) continue;
        const opt = curveOption(id, set) as { series: { id?: string; name?: string }[] };
        const sided = opt.series.filter((s) => s.id && /\.(left|right)$/.test(s.id));
        expect(sided.length, `${demo} ${id}`).toBeGreaterThan(3);
        // Each left line has a right line of the same name (the legend's one entry toggles both).
        for (const s of sided.filter((x) => x.id!.endsWith('.left'))) expect(sided.find((x) => x.id === s.id!.replace(/left$/, 'right'))?.name, `${demo} ${s.id}`).toBe(s.name);
        const fitted = fitToSize(opt as never, 560, 300) as { grid: { top: number } };
        // base(): legend at 40 px, 17 px a line, 8 px below it (fitLayout.ts).
        expect(fitted.grid.top, `${demo} ${id}`).toBeLessThanOrEqual(40 + 2 * 17 + 8);
      }
    }
  }, 60_000);

  it('short legend words where the title and axis already say it', () => {
    expect(camberLegendName('camber to ground (top out +), left')).toBe('to ground, left');
    // Both sides of a joint share one legend entry (the side is the line style: solid left, dashed right).
    expect(jointLegendName('tie rod, outer end, right (rated 28 deg)')).toBe('tie rod, outer end');
    expect(jointLegendName('upper outer joint, left (rated 30 deg)')).toBe('upper outer joint');
  });

  it('legend lines and y-axis names fitted to the room', () => {
    const opts = { itemWidth: 18, itemGap: 10, fontSize: 10 };
    expect(legendLines(['a'.repeat(10), 'b'.repeat(10)], 1000, opts)).toBe(1);
    // Each item is 18 + 5 + 62 = 85 px: two fit in 180 px, the third wraps.
    expect(legendLines(['a'.repeat(10), 'b'.repeat(10), 'c'.repeat(10)], 180, opts)).toBe(2);
    expect(fitAxisName('self-steer (deg, left +)', 400)).toBe('self-steer (deg, left +)');
    expect(fitAxisName('self-steer (deg, left +)', 130)).toBe('self-steer (deg)');
    expect(fitAxisName('ratio (deg/deg)', 60)).toBe('deg/deg');
  });
});

describe('envelope map a designer can read', () => {
  const heron = computeMap({ design: demoDesign('heron-tilting-velomobile'), angleStepDeg: 5 });
  const wren = computeMap({ design: demoDesign('wren-rack-trike'), angleStepDeg: 5 });
  type Opt = { visualMap: Record<string, unknown>; series: Record<string, unknown>[]; grid: Record<string, unknown>; title: { text: string }[] };

  it('a numeric measure gets a continuous scale spanning its values, named with its unit; the verdict keeps its categories', () => {
    const o = heatMapOption(heron, 'slip') as unknown as Opt;
    const values = heron.cells.map((c) => c.values.slip).filter((v): v is number => v !== null);
    expect(o.visualMap.type).toBe('continuous');
    expect(o.visualMap.min).toBe(Math.min(...values));
    expect(o.visualMap.max).toBe(Math.max(...values));
    expect(o.title.map((t) => t.text).join(' ')).toContain('Worst slip (toe mismatch) (deg)');
    // Every cell drawn once: with its number, or in a category of its own when it has none.
    const drawn = o.series.filter((s) => s.type === 'heatmap').reduce((n, s) => n + (s.data as unknown[]).length, 0);
    expect(drawn).toBe(heron.cells.length);
    expect((heatMapOption(heron, 'status') as unknown as Opt).visualMap.type).toBe('piecewise');
    // Smaller is worse for a margin: the ramp runs the other way.
    const ramp = (m: 'slip' | 'jointMargin') => ((heatMapOption(heron, m) as unknown as Opt).visualMap.inRange as { color: string[] }).color;
    expect(ramp('jointMargin')).toEqual([...ramp('slip')].reverse());
  });

  it('cell numbers are written when the cells are big enough, and never on top of each other', () => {
    const o = heatMapOption(heron, 'slip', { leanDeg: 0, handlebarDeg: 0 });
    const big = renderOptionToSvg(o, 900, 520);
    const cellTexts = (svg: string) => textBoxes(svg).filter((b) => /^-?\d+\.\d+$/.test(b.text));
    expect(cellTexts(big).length).toBeGreaterThanOrEqual(heron.cells.length * 0.9);
    const small = renderOptionToSvg(o, 900, 250);
    expect(cellTexts(small)).toEqual([]);
    for (const [w, h] of [
      [900, 520],
      [720, 420],
      [900, 250],
    ]) {
      const boxes = textBoxes(renderOptionToSvg(o, w, h));
      // Speed labels sit over the cells on purpose (with a background); everything else is apart.
      const words = boxes.filter((b) => !/km\/h$/.test(b.text) && !/^-?\d+\.\d+$/.test(b.text));
      expect(overlaps(words), `${w}x${h}`).toEqual([]);
      for (const b of boxes) expect(b.x0 >= -1 && b.x1 <= w + 1 && b.y0 >= -1 && b.y1 <= h + 1, `${w}x${h}: ${b.text}`).toBe(true);
    }
  });

  it('the current-pose marker stays inside the map, half a cell from its edge at the most', () => {
    const o = heatMapOption(heron, 'status', { leanDeg: 90, handlebarDeg: -90 }) as unknown as Opt;
    const m = o.series.find((s) => s.name === 'now')!;
    const [x, y] = (m.data as number[][])[0];
    expect(x).toBe(heron.lean[heron.lean.length - 1]);
    expect(y).toBe(heron.handlebar[0]);
    expect(m.z as number).toBeGreaterThan(2);
  });

  it('a vehicle that does not lean: one narrow column and a sentence saying why', () => {
    expect(wren.lean).toEqual([0]);
    const o = heatMapOption(wren, 'status') as unknown as Opt;
    expect(o.grid.width).toBeLessThanOrEqual(80);
    expect(o.title.map((t) => t.text).join(' ')).toMatch(/does not lean/);
    const boxes = textBoxes(renderOptionToSvg(o as never, 720, 300));
    expect(overlaps(boxes)).toEqual([]);
    for (const b of boxes) expect(b.x0 >= -1 && b.x1 <= 721, b.text).toBe(true);
  });
});
