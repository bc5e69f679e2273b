// End-to-end: the studies beside the hardpoint table in the built workbench (Debian Chromium,
// real Web Workers): a tune run in the worker with progress, previewed as a ghost in the view
// and as dotted curves, applied as one undo step. Screenshots at 1280x800 and 1920x1080 go to
// test-artifacts/e2e/ (look at them).
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium } from './support/chromium';
import { differingPixels, evalIn, pollFor, shotPath, text, waitForPicture, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;
let problems: string[];

beforeAll(async () => {
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
});

async function open(width: number, height: number) {
  problems = [];
  context = await browser.newContext({ viewport: { width, height } });
  page = await context.newPage();
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  await page.goto(url);
  await waitForWorkbench(page);
}

afterEach(async () => {
  await context?.close();
  expect(problems).toEqual([]);
});

const designText = () => evalIn<string>(page, 'window.__tiltbench.document.getState().designText');

async function canvasShot(): Promise<Buffer> {
  await waitForPicture(page);
  return page.locator('[data-testid=viewport] canvas').screenshot();
}

describe('studies in the workbench', () => {
  it('tunes in the worker, previews the result as a ghost and dotted curves, and applies it as one undo step', async () => {
    await open(1280, 800);
    const before = await designText();
    // The "vary" ticks are in the full hardpoint table, the tune in Studies: tabs of the column beside the view.
    await page.getByTestId('column-tab-hardpoints').click();
    await page.getByTestId('vary-steering.tieRodJoint.right').check();
    await page.getByTestId('column-tab-studies').click();
    await page.getByTestId('pick-steering.tieRodJoint:y').getByRole('button').click();
    const panel = page.getByTestId('tune-panel');
    await panel.getByLabel(/^starts/).fill('1');
    await panel.getByLabel(/^iterations each/).fill('6');
    await page.getByTestId('run-tune').click();
    await page.getByTestId('tune-result').waitFor({ timeout: 120_000 });
    await page.getByTestId('studies-panel').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('studies-tune-1280') });
    expect(await text(page.getByTestId('tune-moves'))).toMatch(/mm|forward|up/);

    const plain = await canvasShot();
    await page.getByTestId('tune-preview').click();
    await pollFor(page, "Boolean(document.querySelector('[data-testid=reference-note]'))", 60_000, 'the dotted reference curves');
    const ghosted = await canvasShot();
    // The ghost adds lines to the picture (negative control: the design itself is unchanged).
    expect(await differingPixels(page, plain, ghosted)).toBeGreaterThan(50);
    expect(await designText()).toBe(before);
    await page.screenshot({ path: shotPath('studies-preview-1280') });

    await page.getByTestId('tune-apply').click();
    expect(await designText()).not.toBe(before);
    await page.keyboard.press('Control+z');
    expect(await designText()).toBe(before);
  }, 240_000);

  it('finds the proposals and shows them under the points at 1920x1080', async () => {
    await open(1920, 1080);
    await page.getByTestId('column-tab-studies').click();
    await page.getByTestId('study-tab-proposals').click();
    await page.getByTestId('run-proposals').click();
    await page.getByTestId('proposal-tieRodLine').waitFor({ timeout: 60_000 });
    await page.getByTestId('column-tab-hardpoints').click();
    await page.getByTestId('proposal-at-steering.tieRodJoint.right-tieRodLine').waitFor();
    await page.screenshot({ path: shotPath('studies-proposals-1920') });
    await page.getByTestId('column-tab-studies').click();
    await page.getByTestId('study-tab-spread').click();
    await page.getByLabel(/^samples/).fill('60');
    await page.getByTestId('run-spread').click();
    await page.getByTestId('spread-histogram').waitFor({ timeout: 120_000 });
    await page.getByTestId('spread-result').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('studies-spread-1920') });
  }, 240_000);
});
