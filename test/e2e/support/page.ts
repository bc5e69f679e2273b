// Helpers for driving the workbench page in the end-to-end tests.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { ARTIFACTS_DIR } from './buildRenderer';

export const SHOTS_DIR = path.join(ARTIFACTS_DIR, 'e2e');
mkdirSync(SHOTS_DIR, { recursive: true });

export function shotPath(name: string): string {
  return path.join(SHOTS_DIR, `${name}.png`);
}

/**
 * Polls an expression in the page until it is truthy. (Playwright's waitForFunction compiles
 * its predicate with eval, which the workbench's Content-Security-Policy rightly refuses;
 * page.evaluate goes through the debugging protocol instead.)
 */
export async function pollFor(page: Page, expression: string, timeoutMs = 30_000, what = expression): Promise<void> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    if (await page.evaluate(expression).catch(() => false)) return;
    if (Date.now() > end) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Waits until the workbench is up: state hook present, the first frame rendered. */
export async function waitForWorkbench(page: Page): Promise<void> {
  await pollFor(page, 'Boolean(window.__tiltbench && window.__tiltbenchStats && window.__tiltbenchStats.frames > 0)', 60_000, 'the first frame');
}

/** Resolves after the viewport has rendered everything it was asked to show so far and settled at full resolution. */
export async function waitForPicture(page: Page): Promise<void> {
  await pollFor(
    page,
    `(() => { const s = window.__tiltbenchStats; return s.renderedSerial >= s.sceneSerial && performance.now() - s.lastRenderAt > 400; })()`,
    30_000,
    'the picture to settle',
  );
}

export async function text(loc: Locator): Promise<string> {
  return ((await loc.textContent()) ?? '').trim();
}

/** A reading's number (true minus signs accepted). */
export async function readNumber(page: Page, testId: string): Promise<number> {
  const t = await text(page.getByTestId(testId));
  const m = /[−-]?\d+(\.\d+)?/.exec(t);
  if (!m) throw new Error(`no number in ${testId}: "${t}"`);
  return Number(m[0].replace('−', '-'));
}

/** Evaluates an expression string in the page (strings avoid the test compiler's helpers). */
export function evalIn<T>(page: Page, expression: string): Promise<T> {
  return page.evaluate(expression) as Promise<T>;
}

/**
 * How many pixels differ between two PNG screenshots (any channel by more than `tolerance`),
 * counted in the page with a 2D canvas (no image library needed).
 */
export async function differingPixels(page: Page, a: Buffer, b: Buffer, tolerance = 8): Promise<number> {
  return page.evaluate(
    `(async () => {
      const load = (b64) => new Promise((res, rej) => { const i = new Image(); i.onload = () => res(i); i.onerror = rej; i.src = 'data:image/png;base64,' + b64; });
      const [ia, ib] = await Promise.all([load(${JSON.stringify(a.toString('base64'))}), load(${JSON.stringify(b.toString('base64'))})]);
      const w = Math.min(ia.width, ib.width), h = Math.min(ia.height, ib.height);
      const px = (img) => { const c = document.createElement('canvas'); c.width = w; c.height = h; const g = c.getContext('2d'); g.drawImage(img, 0, 0); return g.getImageData(0, 0, w, h).data; };
      const da = px(ia), db = px(ib);
      let n = 0;
      for (let i = 0; i < da.length; i += 4) {
        if (Math.abs(da[i] - db[i]) > ${tolerance} || Math.abs(da[i + 1] - db[i + 1]) > ${tolerance} || Math.abs(da[i + 2] - db[i + 2]) > ${tolerance}) n++;
      }
      return n;
    })()`,
  ) as Promise<number>;
}
