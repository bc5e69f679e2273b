/**
 * A chart option fitted to the box it is drawn in (pure): the builders do not know the size,
 * the workbench (ChartView, on every resize) and the report (renderOptionToSvg) do.
 *
 * - The legend is never paged: it wraps onto as many lines as it needs, and the grid's top
 *   moves down to leave room for them.
 * - A y-axis name longer than the grid is tall drops its sign note, then everything but its
 *   unit, so the unit is never clipped ("deg/de").
 * - The envelope map writes each cell's number in the cell when cells are big enough for it.
 *
 * Text widths are estimated, not measured (no screen in the report): EM_WIDTH is a generous
 * average glyph width of DejaVu Sans / system sans fonts ("common practice, no source"), so the
 * estimate errs towards one line too many, never too few.
 */
import type { EChartsCoreOption } from 'echarts/core';

type Obj = Record<string, unknown>;

/** Average glyph width as a share of the font size (generous; common practice, no source). */
export const EM_WIDTH = 0.62;
/** Height of one legend line, px (item height 8, font 10.5, gap). */
export const LEGEND_LINE_PX = 17;
/** Height of one subtitle line, px (font 11). */
export const SUBTITLE_LINE_PX = 14;

const asArray = <T,>(x: T | T[] | undefined): T[] => (x === undefined ? [] : Array.isArray(x) ? x : [x]);

export const textWidth = (text: string, fontSize: number) => text.length * fontSize * EM_WIDTH;

function legendNames(option: Obj, legend: Obj): string[] {
  const data = legend.data as (string | { name: string })[] | undefined;
  if (data) return data.map((d) => (typeof d === 'string' ? d : d.name));
  const names: string[] = [];
  for (const s of asArray(option.series as Obj | Obj[])) {
    const n = s.name;
    if (typeof n === 'string' && !names.includes(n) && s.type !== 'heatmap') names.push(n);
  }
  return names;
}

/** Lines a horizontal legend needs in `width` px, laid out as ECharts' box layout does (items in order, wrapped). */
export function legendLines(texts: string[], width: number, opts: { itemWidth: number; itemGap: number; fontSize: number }): number {
  if (texts.length === 0) return 0;
  let lines = 1;
  let x = 0;
  for (const t of texts) {
    const w = opts.itemWidth + 5 + textWidth(t, opts.fontSize);
    if (x > 0 && x + w > width) {
      lines += 1;
      x = 0;
    }
    x += w + opts.itemGap;
  }
  return lines;
}

function num(v: unknown, whole: number): number | null {
  if (typeof v === 'number') return v;
  if (typeof v === 'string' && v.endsWith('%')) return (parseFloat(v) / 100) * whole;
  return null;
}

/** A y-axis name short enough for `room` px: whole, without its sign note, or its unit only. */
export function fitAxisName(name: string, room: number, fontSize = 12): string {
  if (textWidth(name, fontSize) <= room) return name;
  const m = /^(.*?)\s*\(([^,)]*)(,[^)]*)?\)\s*$/.exec(name);
  if (!m) return name;
  const noSign = `${m[1]} (${m[2]})`;
  if (textWidth(noSign, fontSize) <= room) return noSign;
  return m[2];
}

/** The option laid out for a `width` x `height` px box. */
export function fitToSize(option: EChartsCoreOption, width: number, height: number): EChartsCoreOption {
  const o = option as Obj;
  if (!(width > 0 && height > 0)) return option;
  const out: Obj = { ...o };
  // A subtitle longer than the box wraps; what is below it moves down by its extra lines.
  let shift = 0;
  const titles = asArray(o.title as Obj | Obj[]);
  const title = titles[0];
  if (title && typeof title.subtext === 'string') {
    const left = num(title.left, width) ?? 0;
    const room = width - left - 8;
    const st = (title.subtextStyle as Obj | undefined) ?? {};
    const fontSize = (st.fontSize as number | undefined) ?? 12;
    const lines = Math.max(1, Math.ceil(textWidth(title.subtext, fontSize) / room));
    shift = (lines - 1) * SUBTITLE_LINE_PX;
    const first = { ...title, subtextStyle: { ...st, width: room, overflow: 'break', lineHeight: SUBTITLE_LINE_PX } };
    // Further titles (the map's scale heading) placed in px move down with the rest.
    const rest = titles.slice(1).map((t) => (typeof t.top === 'number' ? { ...t, top: t.top + shift } : t));
    out.title = Array.isArray(o.title) ? [first, ...rest] : first;
  }
  const legend0 = o.legend as Obj | undefined;
  const legend = legend0 && typeof legend0.top === 'number' ? { ...legend0, top: legend0.top + shift } : legend0;
  if (legend && legend.orient === 'vertical') out.legend = legend;
  const vm = o.visualMap as Obj | undefined;
  if (vm && typeof vm.top === 'number') {
    out.visualMap = { ...vm, top: vm.top + shift };
    // A continuous scale's bar shortened in a low box, the legend under it moved up with it.
    if (vm.type === 'continuous' && typeof vm.itemHeight === 'number' && legend && typeof legend.top === 'number') {
      const items = asArray(legend.data as unknown[]).length;
      // Under the bar: its two end numbers (a line of text and a gap each), then the legend's items.
      const ends = 2 * 15 + 10;
      const free = height - (vm.top + shift) - ends - items * 17 - 8;
      const bar = Math.max(40, Math.min(vm.itemHeight, free));
      out.visualMap = { ...(out.visualMap as Obj), itemHeight: bar };
      out.legend = { ...legend, top: vm.top + shift + bar + ends };
    }
  }
  let top: number | null = null;
  if (legend && legend.orient !== 'vertical') {
    const left = num(legend.left, width) ?? 0;
    const right = num(legend.right, width) ?? 0;
    const fontSize = ((legend.textStyle as Obj | undefined)?.fontSize as number | undefined) ?? 12;
    const format = typeof legend.formatter === 'function' ? (legend.formatter as (n: string) => string) : (n: string) => n;
    const texts = legendNames(o, legend).map(format);
    const lines = legendLines(texts, width - left - right, { itemWidth: (legend.itemWidth as number) ?? 25, itemGap: (legend.itemGap as number) ?? 10, fontSize });
    const legendTop = (legend.top as number) ?? 0;
    out.legend = { ...legend, type: 'plain' };
    top = legendTop + Math.max(1, lines) * LEGEND_LINE_PX + 8;
  }
  const grids: Obj[] = asArray(o.grid as Obj | Obj[]).map((g) => {
    const t = top !== null ? Math.max(((g.top as number) ?? 0) + shift, top) : ((g.top as number) ?? 60) + shift;
    return { ...g, top: t };
  });
  if (grids.length) out.grid = Array.isArray(o.grid) ? grids : grids[0];
  // y-axis names within the grid's height.
  const yAxes = asArray(o.yAxis as Obj | Obj[]);
  if (yAxes.length) {
    const fitted = yAxes.map((a) => {
      if (a.nameLocation !== 'middle' || typeof a.name !== 'string') return a;
      const g = grids[((a.gridIndex as number) ?? 0)] ?? grids[0];
      const room = height - ((g?.top as number) ?? 60) - ((g?.bottom as number) ?? 60) - 4;
      const fontSize = ((a.nameTextStyle as Obj | undefined)?.fontSize as number | undefined) ?? 12;
      return { ...a, name: fitAxisName(a.name, room, fontSize) };
    });
    out.yAxis = Array.isArray(o.yAxis) ? fitted : fitted[0];
  }
  const series = asArray(o.series as Obj | Obj[]);
  const heat = series.find((s) => s.type === 'heatmap');
  if (heat && grids[0]) {
    const g = grids[0];
    const xs = asArray(o.xAxis as Obj[] | Obj)[0]?.data as unknown[] | undefined;
    const ys = asArray(o.yAxis as Obj[] | Obj)[0]?.data as unknown[] | undefined;
    const gw = typeof g.width === 'number' ? g.width : width - ((num(g.left, width) ?? 0) + (num(g.right, width) ?? 0));
    const cw = gw / Math.max(1, xs?.length ?? 1);
    const ch = (height - ((g.top as number) ?? 0) - ((g.bottom as number) ?? 0)) / Math.max(1, ys?.length ?? 1);
    const cl = heat.cellLabel as { chars: number; fontSize: number } | undefined;
    const fits = cl !== undefined && cw >= textWidth('0'.repeat(cl.chars), cl.fontSize) + 6 && ch >= cl.fontSize + 6;
    // Category labels every k-th cell where cells are lower (narrower) than a label.
    const every = (room: number, need: number) => Math.max(0, Math.ceil(need / Math.max(room, 1e-6)) - 1);
    const withInterval = (axes: unknown, k: number) => {
      const list = asArray(axes as Obj | Obj[]);
      const first = { ...list[0], axisLabel: { ...(list[0]?.axisLabel as Obj | undefined), interval: k } };
      return Array.isArray(axes) ? [first, ...list.slice(1)] : first;
    };
    out.yAxis = withInterval(out.yAxis, every(ch, 12 + 4));
    const widest = Math.max(...(xs ?? []).map((v) => textWidth(String(v), 12)), 0);
    out.xAxis = withInterval(o.xAxis, every(cw, widest + 6));
    out.series = series.map((s) => {
      if (s !== heat) return s;
      const { cellLabel: _hint, ...rest } = s;
      return cl ? { ...rest, label: { ...(s.label as Obj), show: fits } } : rest;
    });
  }
  return out as EChartsCoreOption;
}
