// End-to-end: the workbench's own arrangement (issue 11): ride | the vehicle | what's wrong ->
// fix. On the Heron at a pose with alerts (1280x800) the findings are in the window without
// scrolling; the operating region's check has run by itself; clicking a finding selects its
// part (the joint core's drawing names for it) and opens its fix (points with their rates per
// mm and the way to move them); editing a coordinate there is one undo step. On the Finch
// (1920x1080) a region finding takes the pose to where it is first exceeded and its fix lists
// proposals when asked. Screenshots go to test-artifacts/e2e/ (look at them).
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium } from './support/chromium';
import { evalIn, pollFor, shotPath, text, waitForPicture, waitForWorkbench } from './support/page';

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

async function open(width: number, height: number, design?: string) {
  problems = [];
  context = await browser.newContext({ viewport: { width, height } });
  page = await context.newPage();
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  await page.goto(design ? `${url}?design=designs/${design}.tiltsheet` : url);
  await waitForWorkbench(page);
}

afterEach(async () => {
  await context?.close();
  expect(problems).toEqual([]);
});

async function commitField(testId: string, value: string) {
  const f = page.getByTestId(testId);
  await f.fill(value);
  await f.press('Enter');
}

/** Whether an element lies inside the window and is what a click at its middle would hit (nothing scrolled). */
function inView(selector: string): Promise<{ inWindow: boolean; hit: boolean }> {
  return evalIn(
    page,
    `(() => {
      const el = document.querySelector(${JSON.stringify(selector)});
      if (!el) return { inWindow: false, hit: false };
      const r = el.getBoundingClientRect();
      const inWindow = r.width > 0 && r.height > 0 && r.top >= 0 && r.left >= 0 && r.bottom <= innerHeight && r.right <= innerWidth;
      const at = document.elementFromPoint(r.left + Math.min(20, r.width / 2), r.top + r.height / 2);
      return { inWindow, hit: Boolean(at && (el === at || el.contains(at))) };
    })()`,
  );
}

const ui = <T>(expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.ui.getState(); return ${expr}; })()`);
const doc = <T>(expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.document.getState(); return ${expr}; })()`);

describe("what's wrong -> fix", () => {
  it('Heron at 1280x800: findings in view, the check run by itself, a finding selects its part and opens its fix, an edit there is one undo step', async () => {
    await open(1280, 800);
    await commitField('pose-leanDeg', '25');
    await commitField('pose-handlebarDeg', '-25');
    await pollFor(page, `Boolean(document.querySelector('[data-testid=alerts] li .alert-button'))`, 15_000, 'an alert');
    // The findings are the first thing in the column: the first alert inside the window, unscrolled.
    expect(await evalIn<number>(page, `document.querySelector('.right-side').scrollTop`)).toBe(0);
    expect(await inView('[data-testid=alerts] li')).toEqual({ inWindow: true, hit: true });
    // The operating region's check runs by itself (no click), after the plots.
    await page.getByTestId('limits-verdict').waitFor({ timeout: 90_000 });
    expect(await text(page.getByTestId('limits-verdict'))).toMatch(/over/);

    // An alert about a joint: its button selects the joint core's outcome names for it.
    const alerts = await evalIn<{ text: string; hardpoint?: string; objective?: string }[]>(page, 'window.__tiltbench.pose.getState().outcome.alerts');
    const joint = alerts.find((a) => a.hardpoint && a.objective?.startsWith('joint.'));
    expect(joint, JSON.stringify(alerts)).toBeDefined();
    await page.getByTestId('alerts').getByRole('button', { name: joint!.text, exact: true }).click();
    expect(await ui<string>('s.selection')).toBe(joint!.hardpoint);
    // The view marks it (the selection ring is drawn for the selected hardpoint).
    await page.getByTestId('fix').waitFor();
    expect(await text(page.getByTestId('fix'))).toContain(joint!.text);
    // Its fix: points with their rates (the rates run by themselves after the check).
    await page.getByTestId('fix-points').waitFor({ timeout: 90_000 });
    const rows = page.locator('[data-testid=fix-points] [data-testid^=fix-point-]');
    expect(await rows.count()).toBeGreaterThan(0);
    expect(await text(rows.first())).toMatch(/1 mm (forward|rearward|outward|inward|up|down|to the left|to the right) improves it by \d+\.\d+ deg/);
    expect(await inView('[data-testid=fix-points] [data-testid^=fix-point-]')).toEqual({ inWindow: true, hit: true });
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('arrange-heron-fix-1280') });

    // Editing a coordinate there: the design changes by one undo step, and undo puts it back.
    const rowId = (await rows.first().getAttribute('data-testid'))!.replace('fix-point-', '');
    const field = page.getByTestId(`fix-${rowId}-z`);
    const z = Number(await field.inputValue());
    const before = await doc<string>('s.designText');
    const past = await doc<number>('s.history.past.length');
    await field.fill(String(z + 1));
    await field.press('Enter');
    await expect.poll(() => doc<number>('s.history.past.length')).toBe(past + 1);
    expect(await doc<string>('s.designText')).not.toBe(before);
    await expect.poll(() => field.inputValue()).toBe(String(z + 1));
    await page.getByTestId('undo').click();
    expect(await doc<string>('s.designText')).toBe(before);
    expect(await doc<number>('s.history.past.length')).toBe(past);
    await expect.poll(() => field.inputValue()).toBe(String(z));
  }, 240_000);

  it('Finch at 1920x1080: a region finding goes to where it is first exceeded, shows its fix and the proposals for it (found by themselves)', async () => {
    await open(1920, 1080, 'finch-knuckle-steered-trike');
    await page.getByTestId('limits-verdict').waitFor({ timeout: 90_000 });
    const item = page.locator('[data-testid=limits] li[data-testid^=limit-slip]').first();
    await item.waitFor();
    const label = await text(item);
    const m = /first exceeded at lean (−?[\d.]+)°, handlebar (−?[\d.]+)°/.exec(label);
    expect(m, label).not.toBeNull();
    await item.locator('.alert-button').click();
    const num = (s: string) => Number(s.replace('−', '-'));
    await expect.poll(() => evalIn<number>(page, 'window.__tiltbench.pose.getState().pose.leanDeg')).toBeCloseTo(num(m![1]), 6);
    expect(await evalIn<number>(page, 'window.__tiltbench.pose.getState().pose.handlebarDeg')).toBeCloseTo(num(m![2]), 6);
    await page.getByTestId('fix-points').waitFor({ timeout: 90_000 });
    expect(await text(page.getByTestId('fix'))).toMatch(/slip/);
    // The proposals are found by themselves while a fix is open.
    await pollFor(page, `Boolean(document.querySelector('[data-testid^=fix-proposal-]')) || /No proposal changes/.test(document.querySelector('[data-testid=fix-proposals]')?.textContent ?? '')`, 90_000, 'the proposals');
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('arrange-finch-fix-1920') });
    // The full table, studies and settings stay one tab away.
    await page.getByTestId('column-tab-hardpoints').click();
    expect(await page.getByTestId('hardpoint-table').isVisible()).toBe(true);
    await page.getByTestId('column-tab-studies').click();
    expect(await page.getByTestId('studies-panel').isVisible()).toBe(true);
    await page.getByTestId('column-tab-settings').click();
    expect(await page.getByTestId('hardpoint-table').isVisible()).toBe(false);
  }, 240_000);
});
