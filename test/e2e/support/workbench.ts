// Opening the built workbench on a design at a window size, and waiting for its plots, with a
// timeout and a message saying what was missing for every wait (shared by the e2e files).
import type { Page } from 'playwright-core';
import { evalIn, pollFor, waitForWorkbench } from './page';

export type WindowSize = readonly [width: number, height: number];

/** The two window sizes issue 11 reads the workbench at. */
export const WINDOW_SIZES: readonly WindowSize[] = [
  [1280, 800],
  [1920, 1080],
];

/**
 * Sizes the page's window, loads the workbench on `designFile` (a file of assets/designs, served
 * at /designs/) and waits for the 3D view's first frame and the plot strip's tabs (the strip
 * mounts after that frame).
 */
export async function openWorkbench(page: Page, url: string, size: WindowSize, designFile: string): Promise<void> {
  await page.setViewportSize({ width: size[0], height: size[1] });
  await page.goto(`${url}?design=designs/${designFile}`);
  await waitForWorkbench(page);
  await pollFor(page, `document.querySelectorAll('[data-testid=plots] [role=tab]').length > 3`, 20_000, `the plot strip's tabs (${designFile})`);
}

/** What the jobs store and the strip say, for a message when a chart does not come. */
export async function plotsState(page: Page): Promise<string> {
  return evalIn<string>(
    page,
    `(() => {
      const tb = window.__tiltbench;
      const j = tb && tb.jobs ? tb.jobs.store.getState() : null;
      const slot = (s) => s ? { asked: s.request ? s.request.revision : null, progress: s.progress, result: Boolean(s.result), resultRevision: s.resultRevision, error: s.error } : null;
      const strip = document.querySelector('[data-testid=plots] .plots-body');
      return JSON.stringify({ revision: tb ? tb.document.getState().revision : null, curves: j && slot(j.curves), map: j && slot(j.map), strip: strip ? strip.innerText.slice(0, 160) : null });
    })()`,
  );
}

/**
 * Waits until the chart of `tab` (a plot tab's id, 'map' for the envelope map) shows the open
 * design: its job's result is for the document's revision and its SVG text is drawn. The message
 * says what the jobs were doing.
 */
export async function waitForChart(page: Page, tab: string, timeoutMs = 20_000): Promise<void> {
  const slot = tab === 'map' ? 'map' : 'curves';
  try {
    await pollFor(
      page,
      `(() => { const tb = window.__tiltbench; if (tb.jobs.store.getState().${slot}.resultRevision !== tb.document.getState().revision) return false; const c = document.querySelector('[data-testid=chart-${tab}] svg'); return Boolean(c && c.querySelectorAll('text').length > 3); })()`,
      timeoutMs,
      `the ${tab} chart of the open design`,
    );
  } catch (e) {
    throw new Error(`${(e as Error).message}; plots: ${await plotsState(page).catch(() => 'unreadable')}`);
  }
}
