// End-to-end (issue 11, plots): the plot strip of the built workbench read as a designer would,
// at 1280x800 and 1920x1080 on every demo. In the strip no two visible text boxes overlap (the
// SVG <text> boxes ECharts draws and the DOM text around the charts, each from the browser's own
// layout), every tab is inside the strip's visible box and takes a click, and the map's
// current-pose marker lies inside the map's cells. Also: the Recent menu's list lies over the
// view (a click at its first line lands on it), and a pose's alerts are in the window without
// scrolling at 1280x800. Screenshots go to test-artifacts/e2e/plots-*.png.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium } from './support/chromium';
import { evalIn, pollFor, shotPath, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let context: BrowserContext | null = null;

beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});
afterEach(async () => {
  await context?.close();
  context = null;
});

const DEMOS = ['heron-tilting-velomobile', 'wren-rack-trike', 'swift-parallelogram-trike', 'linnet-track-rod-trike', 'finch-knuckle-steered-trike'];
const SIZES: [number, number][] = [
  [1280, 800],
  [1920, 1080],
];

async function open(demo: string, [width, height]: [number, number]): Promise<Page> {
  context = await browser.newContext({ viewport: { width, height } });
  const page = await context.newPage();
  await page.goto(`${url}?design=designs/${demo}.tiltsheet`);
  await waitForWorkbench(page);
  // The plot strip mounts after the view's first frame.
  await pollFor(page, `document.querySelectorAll('[data-testid=plots] [role=tab]').length > 3`, 30_000, 'the plot tabs');
  return page;
}

interface TextBox {
  text: string;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  svg: boolean;
}

/**
 * Every visible text box in the plot strip: each ECharts SVG <text> (its client rect) and each
 * DOM text node outside the SVG (its range's rects), clipped to nothing when hidden.
 */
const STRIP_TEXTS = `(() => {
  const strip = document.querySelector('[data-testid=plots]');
  const out = [];
  const visible = (el) => { for (let e = el; e && e !== document.body; e = e.parentElement) { const s = getComputedStyle(e); if (s.display === 'none' || s.visibility === 'hidden' || Number(s.opacity) === 0) return false; } return true; };
  for (const t of strip.querySelectorAll('svg text')) {
    const r = t.getBoundingClientRect();
    if (r.width < 1 || r.height < 1 || !t.textContent.trim() || !visible(t)) continue;
    if (Number(t.getAttribute('fill-opacity') ?? 1) === 0 || Number(t.getAttribute('opacity') ?? 1) === 0) continue;
    // The box is the glyphs' height (the font size about the line's middle), not the font's whole line box, whose ascent and descent stacked tick labels share without touching.
    const fs = parseFloat(getComputedStyle(t).fontSize) || r.height;
    const mid = (r.top + r.bottom) / 2;
    out.push({ text: t.textContent, x0: r.left, y0: mid - Math.min(fs, r.height) / 2, x1: r.right, y1: mid + Math.min(fs, r.height) / 2, svg: true });
  }
  const walker = document.createTreeWalker(strip, NodeFilter.SHOW_TEXT);
  for (let n = walker.nextNode(); n; n = walker.nextNode()) {
    if (!n.textContent.trim() || n.parentElement.closest('svg') || !visible(n.parentElement)) continue;
    const range = document.createRange();
    range.selectNodeContents(n);
    for (const r of range.getClientRects()) if (r.width >= 1 && r.height >= 1) out.push({ text: n.textContent.trim(), x0: r.left, y0: r.top, x1: r.right, y1: r.bottom, svg: false });
  }
  return out;
})()`;

/** Pairs of boxes overlapping by more than 1 px each way (speed labels over cell numbers on the map are drawn so on purpose, with a background). */
function overlapping(boxes: TextBox[]): string[] {
  const out: string[] = [];
  const number = (t: string) => /^-?\d+(\.\d+)?$/.test(t);
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++) {
      const p = boxes[i];
      const q = boxes[j];
      if ((/km\/h$/.test(p.text) && number(q.text)) || (/km\/h$/.test(q.text) && number(p.text))) continue;
      if (Math.min(p.x1, q.x1) - Math.max(p.x0, q.x0) > 1 && Math.min(p.y1, q.y1) - Math.max(p.y0, q.y0) > 1) out.push(`"${p.text}" over "${q.text}"`);
    }
  return out;
}

/** The plot strip's tabs: each box, and whether a point at its middle hits the tab itself. */
const TABS = `(() => {
  const strip = document.querySelector('[data-testid=plots]').getBoundingClientRect();
  return [...document.querySelectorAll('[data-testid=plots] [role=tab]')].map((b) => {
    const r = b.getBoundingClientRect();
    const hit = document.elementFromPoint((r.left + r.right) / 2, (r.top + r.bottom) / 2);
    return { id: b.getAttribute('data-testid'), inside: r.width > 0 && r.left >= strip.left - 0.5 && r.right <= strip.right + 0.5 && r.top >= strip.top - 0.5 && r.bottom <= Math.min(strip.bottom, innerHeight) + 0.5, hits: Boolean(hit && b.contains(hit)) };
  });
})()`;

/** The map's current-pose marker (ECharts' unit circle symbol, scaled, stroked in the marker's colour) and the box of the map's cells. */
const MARKER_AND_CELLS = `(() => {
  const svg = document.querySelector('[data-testid=chart-map] svg');
  if (!svg) return null;
  const marker = [...svg.querySelectorAll('path')].find((p) => (p.getAttribute('stroke') || '').toLowerCase() === '#0f62c9' && /^M1 0A1 1/.test(p.getAttribute('d') || ''));
  const cells = [...svg.querySelectorAll('path')].filter((p) => (p.getAttribute('stroke') || '').toLowerCase() === '#fbfbf8' && p.getAttribute('fill') && p.getAttribute('fill') !== 'none');
  if (!marker || cells.length === 0) return { marker: Boolean(marker), cells: cells.length };
  const m = marker.getBoundingClientRect();
  const b = cells.map((c) => c.getBoundingClientRect());
  return { marker: true, cells: cells.length, mx: (m.left + m.right) / 2, my: (m.top + m.bottom) / 2, x0: Math.min(...b.map((r) => r.left)), x1: Math.max(...b.map((r) => r.right)), y0: Math.min(...b.map((r) => r.top)), y1: Math.max(...b.map((r) => r.bottom)) };
})()`;

async function chartDrawn(page: Page, tab: string) {
  await pollFor(page, `(() => { const c = document.querySelector('[data-testid=chart-${tab}] svg'); return Boolean(c && c.querySelectorAll('text').length > 3); })()`, 60_000, `the ${tab} chart`);
  // ECharts draws on the next frame after a resize; let it settle.
  await page.waitForTimeout(250);
}

describe('plot strip legibility', () => {
  for (const demo of DEMOS)
    for (const size of SIZES) {
      it(`${demo} at ${size.join('x')}: tabs reachable, no two texts overlapping in the strip, marker inside the map`, async () => {
        const page = await open(demo, size);
        const tabs = await evalIn<{ id: string; inside: boolean; hits: boolean }[]>(page, TABS);
        expect(tabs.length).toBeGreaterThan(3);
        for (const t of tabs) expect(t, `${t.id} at ${size.join('x')}`).toMatchObject({ inside: true, hits: true });
        const problems: string[] = [];
        for (const t of tabs) {
          const tab = t.id.replace(/^tab-/, '');
          await page.getByTestId(t.id).click();
          await chartDrawn(page, tab);
          const boxes = await evalIn<TextBox[]>(page, STRIP_TEXTS);
          expect(boxes.filter((b) => b.svg).length, tab).toBeGreaterThan(3);
          problems.push(...overlapping(boxes).map((o) => `${tab}: ${o}`));
          if (tab === 'map') {
            const m = await evalIn<{ marker: boolean; cells: number; mx: number; my: number; x0: number; x1: number; y0: number; y1: number }>(page, MARKER_AND_CELLS);
            expect(m.marker && m.cells > 0, 'marker and cells drawn').toBe(true);
            expect(m.mx).toBeGreaterThanOrEqual(m.x0);
            expect(m.mx).toBeLessThanOrEqual(m.x1);
            expect(m.my).toBeGreaterThanOrEqual(m.y0);
            expect(m.my).toBeLessThanOrEqual(m.y1);
          }
          if (tab === 'map' || tab === 'jointsLean' || tab === 'camber') await page.screenshot({ path: shotPath(`plots-${demo.split('-')[0]}-${tab}-${size.join('x')}`) });
        }
        expect(problems).toEqual([]);
      });
    }
});

describe('menus and alerts within reach', () => {
  it('the Recent menu lies over the view: a click at its first line lands on the menu, not on the view buttons', async () => {
    const page = await open('heron-tilting-velomobile', SIZES[0]);
    await page.getByTestId('file-recent').click();
    await pollFor(page, `Boolean(document.querySelector('.recent-list li'))`, 10_000, 'the Recent list');
    const hit = await evalIn<{ onList: boolean; tag: string }>(
      page,
      `(() => { const li = document.querySelector('.recent-list li'); const r = li.getBoundingClientRect(); const e = document.elementFromPoint((r.left + r.right) / 2, (r.top + r.bottom) / 2); return { onList: Boolean(e && e.closest('.recent-list')), tag: e ? e.tagName + '.' + e.className : 'none' }; })()`,
    );
    expect(hit.onList, `the point hits ${hit.tag}`).toBe(true);
    await page.screenshot({ path: shotPath('plots-recent-menu-1280x800') });
  });

  it("a pose's alerts are in the window without scrolling at 1280x800 (Heron at lean 25, handlebar -25)", async () => {
    const page = await open('heron-tilting-velomobile', SIZES[0]);
    for (const [field, value] of [
      ['pose-leanDeg', '25'],
      ['pose-handlebarDeg', '-25'],
    ]) {
      const f = page.getByTestId(field);
      await f.fill(value);
      await f.press('Enter');
    }
    await pollFor(page, `Boolean(document.querySelector('[data-testid=alerts] li'))`, 20_000, 'an alert');
    const box = await evalIn<{ top: number; bottom: number; left: number; right: number; scrolled: number }>(
      page,
      `(() => { const r = document.querySelector('[data-testid=alerts] li').getBoundingClientRect(); return { top: r.top, bottom: r.bottom, left: r.left, right: r.right, scrolled: scrollY }; })()`,
    );
    expect(box.scrolled).toBe(0);
    expect(box.bottom).toBeGreaterThan(0);
    expect(box.top).toBeLessThan(800);
    expect(box.right).toBeGreaterThan(0);
    expect(box.left).toBeLessThan(1280);
    await page.screenshot({ path: shotPath('plots-alerts-1280x800') });
  });
});
