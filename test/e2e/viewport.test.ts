// The 3D view in the built workbench (issue 11): for every demo, each view button shows a
// view with every wheel inside the canvas and clear of the view buttons and the legend; Front,
// Side and Top are orthographic; the arrow keys nudge the selected hardpoint, each press one
// undo step. Screenshots of each view go to test-artifacts/e2e/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchChromium } from './support/chromium';
import { evalIn, shotPath, waitForPicture, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console error: ${m.text()}`);
  });
});

afterAll(async () => {
  await browser?.close();
});

/** Canvas pixels of 24 points round each face of every drawn tyre (front from the solved wheels, rear through its body). */
const TYRE_PIXELS = `(() => {
  const s = window.__tiltbench.pose.getState(), snap = s.outcome.snapshot, d = s.drawing;
  const wheels = d.frontWheels.map((w) => ({ c: snap.wheels[w.side].centre, a: snap.wheels[w.side].spinAxis, r: w.rollingRadius, h: w.width / 2 }));
  for (const w of d.rearWheels) {
    const b = snap.bodies.find((x) => x.id === w.body), R = b.rotation, t = b.translation;
    const rot = (p) => [R[0]*p[0]+R[3]*p[1]+R[6]*p[2], R[1]*p[0]+R[4]*p[1]+R[7]*p[2], R[2]*p[0]+R[5]*p[1]+R[8]*p[2]];
    const c = rot(w.centre);
    wheels.push({ c: [c[0]+t[0], c[1]+t[1], c[2]+t[2]], a: rot(w.spinAxis), r: w.rollingRadius, h: w.width / 2 });
  }
  const out = [];
  for (const { c, a, r, h } of wheels) {
    const n = Math.hypot(a[0], a[1], a[2]), ax = [a[0]/n, a[1]/n, a[2]/n];
    let u = [-ax[1], ax[0], 0]; const un = Math.hypot(u[0], u[1]) || 1; u = [u[0]/un, u[1]/un, 0];
    const v = [ax[1]*u[2]-ax[2]*u[1], ax[2]*u[0]-ax[0]*u[2], ax[0]*u[1]-ax[1]*u[0]];
    for (let k = 0; k < 24; k++) for (const sd of [-h, h]) {
      const t = 2 * Math.PI * k / 24, co = r * Math.cos(t), si = r * Math.sin(t);
      out.push(window.__tiltbenchStats.project(c[0]+u[0]*co+v[0]*si+ax[0]*sd, c[1]+u[1]*co+v[1]*si+ax[1]*sd, c[2]+u[2]*co+v[2]*si+ax[2]*sd));
    }
  }
  return out;
})()`;

async function box(testId: string) {
  return (await page.getByTestId(testId).boundingBox())!;
}

describe('the 3D view', () => {
  for (const demo of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike']) {
    it(`frames every wheel in every view, clear of the buttons and the legend (${demo})`, async () => {
      await page.goto(`${url}?design=designs/${demo}.tiltsheet`);
      await waitForWorkbench(page);
      await waitForPicture(page);
      const canvas = (await page.locator('[data-testid=viewport] canvas').boundingBox())!;
      for (const view of ['threeQuarter', 'front', 'side', 'top']) {
        await page.getByTestId(`view-${view}`).click();
        await waitForPicture(page);
        expect(await page.getByTestId(`view-${view}`).getAttribute('aria-pressed')).toBe('true');
        expect(await evalIn<string>(page, 'window.__tiltbenchStats.camera')).toBe(view === 'threeQuarter' ? 'perspective' : 'orthographic');
        const bar = await box('view-fit');
        const legend = await box('legend');
        const pts = await evalIn<[number, number][]>(page, TYRE_PIXELS);
        expect(pts.length).toBeGreaterThanOrEqual(48 * 3);
        for (const [x, y] of pts) {
          expect(x, `${view} x`).toBeGreaterThanOrEqual(0);
          expect(x, `${view} x`).toBeLessThanOrEqual(canvas.width);
          // Below the view buttons and above the legend (page coordinates).
          expect(canvas.y + y, `${view} y`).toBeGreaterThanOrEqual(bar.y + bar.height - 1);
          expect(canvas.y + y, `${view} y`).toBeLessThanOrEqual(legend.y + 1);
        }
        await page.locator('[data-testid=viewport]').screenshot({ path: shotPath(`viewport-${demo}-${view}`) });
      }
      expect(problems).toEqual([]);
    });
  }

  it('arrow keys nudge the selected hardpoint, 1 mm or 0.1 mm with Shift, each press one undo step', async () => {
    await page.goto(`${url}?design=designs/swift-parallelogram-trike.tiltsheet`);
    await waitForWorkbench(page);
    const id = await evalIn<string>(page, 'window.__tiltbench.pose.getState().drawing.joints[0].hardpoint');
    await evalIn(page, `window.__tiltbench.actions.select(${JSON.stringify(id)})`);
    await page.getByTestId('gizmo-bar').waitFor();
    const design = () => evalIn<string>(page, 'JSON.stringify(window.__tiltbench.document.getState().design)');
    const before = await design();
    await page.locator('[data-testid=viewport] canvas').hover();
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('Shift+ArrowLeft');
    await page.keyboard.press('PageDown');
    const steps = await evalIn<{ before: Record<string, number>; after: Record<string, number> }[]>(
      page,
      'window.__tiltbench.document.getState().history.past.map((d) => ({ before: d.changes[0].before, after: d.changes[0].after }))',
    );
    expect(steps).toHaveLength(3);
    const moved = steps.map(({ before: b, after: a }) => ['x', 'y', 'z'].map((k) => Math.round((a[k] - b[k]) * 1e6) / 1e6));
    // ISO 8855: up arrow forward (+x), left arrow left (+y), PageDown down (-z).
    expect(moved).toEqual([
      [1, 0, 0],
      [0, 0.1, 0],
      [0, 0, -1],
    ]);
    for (let k = 0; k < 3; k++) await page.keyboard.press('Control+z');
    expect(await design()).toBe(before);
    expect(problems).toEqual([]);
  });
});
