// End-to-end: the built workbench in Debian Chromium (headless, WebGL on SwiftShader), driven
// by playwright-core. Screenshots go to test-artifacts/e2e/ (look at them).
import { readFileSync } from 'node:fs';
import { mkdtemp } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import { launchChromium } from './support/chromium';
import { differingPixels, evalIn, pollFor, readNumber, shotPath, text, waitForPicture, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;
/** Page errors and policy violations seen during a test; each test ends with none. */
let problems: string[];

beforeAll(async () => {
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
});

beforeEach(async () => {
  problems = [];
  context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  page = await context.newPage();
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  await page.goto(url);
  await waitForWorkbench(page);
  // Every reading is a tab of the strip under the view, which mounts after the first frame.
  await page.getByTestId('readouts').waitFor({ state: 'attached', timeout: 30_000 });
});

afterEach(async () => {
  await context?.close();
  expect(problems).toEqual([]);
});

/** Reads the workbench's document store (design, its text, undo history) in the page. */
const doc = <T>(expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.document.getState(); return ${expr}; })()`);
/** Reads the workbench's pose store (pose asked for, ride mode, core's outcome) in the page. */
const pose = <T>(expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.pose.getState(); return ${expr}; })()`);

/** Shows a tab of the column beside the view (the full hardpoint table is one tab away from the findings). */
async function showColumn(tab: 'findings' | 'hardpoints' | 'studies' | 'settings') {
  await page.getByTestId(`column-tab-${tab}`).click();
}

/**
 * Opens the strip's Numbers tab when it is not showing: a hidden tab's readings are not kept up
 * to date (React's Activity defers them until the tab is shown), as the user never sees them.
 */
async function showNumbers() {
  if (!(await page.getByTestId('readouts').isVisible())) await page.getByTestId('tab-numbers').click();
}

/** A reading's text, as shown in the Numbers tab. */
async function readout(testId: string): Promise<string> {
  await showNumbers();
  return text(page.getByTestId(testId));
}

/** A reading's number, as shown in the Numbers tab. */
async function readoutNumber(testId: string): Promise<number> {
  await showNumbers();
  return readNumber(page, testId);
}

async function commitField(testId: string, value: string) {
  if (testId.startsWith('hp-')) await showColumn('hardpoints');
  const f = page.getByTestId(testId);
  await f.fill(value);
  await f.press('Enter');
}

async function canvasShot(): Promise<Buffer> {
  await waitForPicture(page);
  return page.locator('[data-testid=viewport] canvas').screenshot();
}

describe('workbench', () => {
  it('loads the demo design with its readouts, legend and safety caution', async () => {
    await expect.poll(() => text(page.getByTestId('doc-title'))).toContain('Heron T3');
    expect(await text(page.getByTestId('readout-toe-left'))).toMatch(/^0\.000/);
    expect(await text(page.getByTestId('pose-status'))).toMatch(/within every tolerance/);
    const caution = await text(page.getByTestId('safety-caution'));
    expect(caution).toMatch(/design aid/);
    expect(caution).toMatch(/measurement and testing/);
    expect(caution).toMatch(/regulations and licensed engineering practice/);
    expect(await text(page.getByTestId('legend'))).toMatch(/within.*close.*over.*won't assemble/);
    // The readings are the strip's "Numbers" tab.
    expect(await page.getByTestId('readout-toe-left').isVisible()).toBe(false);
    await page.getByTestId('tab-numbers').click();
    expect(await page.getByTestId('readout-toe-left').isVisible()).toBe(true);
    await page.getByTestId('about').click();
    expect(await text(page.getByTestId('about-dialog'))).toMatch(/design aid.*measurement and testing/);
    await page.screenshot({ path: shotPath('01-demo-about') });
    await page.getByTestId('about-close').click();
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('01-demo') });
  });

  it('renders WebGL on SwiftShader', async () => {
    const renderer = await evalIn<string>(page, 'window.__tiltbenchStats.glRenderer');
    expect(renderer).toMatch(/SwiftShader/);
    const direct = await evalIn<string>(
      page,
      `(() => { const gl = document.createElement('canvas').getContext('webgl2'); const e = gl.getExtension('WEBGL_debug_renderer_info'); return String(gl.getParameter(e ? e.UNMASKED_RENDERER_WEBGL : gl.RENDERER)); })()`,
    );
    expect(direct).toMatch(/SwiftShader/);
  });

  it('moving the lean slider changes the readouts and the picture', async () => {
    const before = await canvasShot();
    const camberBefore = await readout('readout-camberGround-left');
    const box = (await page.getByTestId('slider-leanDeg').boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.66, box.y + box.height / 2, { steps: 8 });
    await page.mouse.move(box.x + box.width * 0.78, box.y + box.height / 2, { steps: 8 });
    await page.mouse.up();
    const lean = await pose<number>('s.pose.leanDeg');
    expect(lean).toBeGreaterThan(10);
    await expect.poll(() => readoutNumber('readout-lean')).toBeCloseTo(lean, 2);
    expect(await readout('readout-camberGround-left')).not.toBe(camberBefore);
    const after = await canvasShot();
    const changed = await differingPixels(page, before, after);
    expect(changed).toBeGreaterThan(2000);
    await page.screenshot({ path: shotPath('02-leaned') });
  });

  it('ride mode: the speed slider moves the lean to the balanced lean of the turn the handlebar makes', async () => {
    await commitField('pose-handlebarDeg', '5');
    await page.getByTestId('mode-ride').click();
    const slider = page.getByTestId('slider-speedKmh');
    await slider.waitFor();
    expect(await page.getByTestId('slider-leanDeg').isDisabled()).toBe(true);

    /** Drags the speed slider to a fraction of its track; returns the speed the pose took. */
    const dragSpeedTo = async (fraction: number) => {
      const box = (await slider.boundingBox())!;
      const from = await pose<number>('s.ride.speedKmh');
      const min = Number(await slider.getAttribute('min'));
      const max = Number(await slider.getAttribute('max'));
      await page.mouse.move(box.x + box.width * ((from - min) / (max - min)), box.y + box.height / 2);
      await page.mouse.down();
      await page.mouse.move(box.x + box.width * fraction, box.y + box.height / 2, { steps: 10 });
      await page.mouse.up();
      const speed = await pose<number>('s.ride.speedKmh');
      await expect.poll(() => readoutNumber('readout-rideSpeed')).toBeCloseTo(speed, 1);
      return speed;
    };
    /**
     * The balanced lean of a steady turn, tan(lean) = v^2 / (g R), with R the turn radius
     * readout and g = 9.80665 m/s^2 (standard gravity, 3rd CGPM 1901; ISO 80000-3); the
     * point-mass balance of a leaning vehicle, common practice, no source. A left turn
     * (handlebar +) leans left: negative lean (right side down +).
     */
    const balancedLean = (speedKmh: number, radiusMm: number) => -(Math.atan((speedKmh / 3.6) ** 2 / (9.80665 * (radiusMm / 1000))) * 180) / Math.PI;

    const slow = await dragSpeedTo(0.25);
    expect(slow).toBeGreaterThan(5);
    const leanSlow = await readoutNumber('readout-lean');
    // The lean readout has two decimals and the radius none: agreement to 0.02 deg.
    expect(Math.abs(leanSlow - balancedLean(slow, await readoutNumber('readout-turnRadius')))).toBeLessThan(0.02);
    expect(Math.abs(await readoutNumber('readout-rideResidual'))).toBeLessThan(1e-3);

    const fast = await dragSpeedTo(0.38);
    expect(fast).toBeGreaterThan(slow + 5);
    const leanFast = await readoutNumber('readout-lean');
    expect(leanFast).toBeLessThan(leanSlow - 1);
    expect(Math.abs(leanFast - balancedLean(fast, await readoutNumber('readout-turnRadius')))).toBeLessThan(0.02);
    const leanSolved = await pose<number>('s.pose.leanDeg');
    expect(leanSolved).toBeCloseTo(leanFast, 1);
    expect(await page.getByTestId('pose-leanDeg').inputValue()).toBe(leanSolved.toFixed(1));
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('11-ride-mode') });

    // Faster still, this turn needs more lean than the design allows: the lean stops at the
    // limit and the panel says so.
    await dragSpeedTo(0.65);
    await expect.poll(() => text(page.getByTestId('ride-notes'))).toMatch(/no balance within the lean limit/);
    const limit = await evalIn<number>(page, 'window.__tiltbench.pose.getState().resolved.riding.maxLeanDeg');
    expect(await pose<number>('s.pose.leanDeg')).toBeCloseTo(-limit, 6);
    expect(Math.abs(await readoutNumber('readout-rideResidual'))).toBeGreaterThan(0.5);
  });

  it('editing a hardpoint changes toe, and undo restores it', async () => {
    await commitField('pose-handlebarDeg', '10');
    await expect.poll(() => readoutNumber('readout-handlebar')).toBe(10);
    const toeBefore = await readout('readout-toe-right');
    await commitField('hp-upright.steeringArmJoint.right-x', '-90');
    await expect.poll(() => readout('readout-toe-right')).not.toBe(toeBefore);
    expect(Math.abs((await readoutNumber('readout-toe-right')) - Number(toeBefore.replace('−', '-').split(' ')[0]))).toBeGreaterThan(0.05);
    await expect(page.getByTestId('dirty-marker').isVisible()).resolves.toBe(true);
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('03-edited') });
    await page.getByTestId('undo').click();
    await expect.poll(() => readout('readout-toe-right')).toBe(toeBefore);
    expect(await page.getByTestId('hp-upright.steeringArmJoint.right-x').inputValue()).toBe('-75');
    expect(await page.getByTestId('dirty-marker').count()).toBe(0);
    await page.keyboard.press('Control+Shift+Z');
    await expect.poll(() => page.getByTestId('hp-upright.steeringArmJoint.right-x').inputValue()).toBe('-90');
  });

  it('save then open round-trips the design exactly (browser download and file input)', async () => {
    await commitField('hp-steering.pivot-z', '112.5');
    await showColumn('hardpoints');
    await page.getByTestId('unlink-upright.wheelCentre').click();
    await commitField('hp-upright.wheelCentre.left-x', '3');
    const savedText = await doc<string>('s.designText');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('file-save').click()]);
    const dir = await mkdtemp(path.join(os.tmpdir(), 'tiltbench-e2e-'));
    const file = path.join(dir, download.suggestedFilename());
    await download.saveAs(file);
    expect(download.suggestedFilename()).toMatch(/\.tiltsheet$/);
    const onDisk = readFileSync(file, 'utf8');
    expect(onDisk).toBe(savedText);
    expect(await page.getByTestId('dirty-marker').count()).toBe(0);

    // Change it again, then open the saved file over it.
    await commitField('hp-steering.pivot-z', '130');
    await page.getByTestId('file-open').click();
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByTestId('confirm-ok').click()]);
    await chooser.setFiles(file);
    await expect.poll(() => doc<string>('s.designText')).toBe(onDisk);
    expect(await doc<unknown>('s.design')).toEqual(JSON.parse(onDisk));
    expect(await page.getByTestId('hp-upright.wheelCentre.left-x').inputValue()).toBe('3');
    expect(await page.getByTestId('dirty-marker').count()).toBe(0);
    expect(await text(page.getByTestId('doc-title'))).toContain(path.basename(file));
  });

  it('a malformed file shows a clear error and loses nothing', async () => {
    await commitField('hp-steering.pivot-z', '111');
    const before = await doc<string>('s.designText');
    await page.getByTestId('open-file-input').setInputFiles({ name: 'broken.tiltsheet', mimeType: 'application/json', buffer: Buffer.from('{ "tiltsheet": 1, "name": "half a file",') });
    const notice = page.getByTestId('notice');
    await notice.waitFor();
    const words = await text(notice);
    expect(words).toMatch(/Could not open broken\.tiltsheet/);
    expect(words).toMatch(/line 1/);
    expect(words).toMatch(/still here/);
    await page.screenshot({ path: shotPath('04-malformed') });
    await page.getByTestId('notice-ok').click();
    expect(await doc<string>('s.designText')).toBe(before);
    expect(await page.getByTestId('dirty-marker').isVisible()).toBe(true);

    // Valid JSON with a bad field: the message names the field.
    const bad = JSON.parse(before);
    bad.vehicle.wheelbaseMm = -5;
    await page.getByTestId('open-file-input').setInputFiles({ name: 'negative.tiltsheet', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await notice.waitFor();
    expect(await text(notice)).toMatch(/vehicle\.wheelbaseMm/);
    await page.getByTestId('notice-ok').click();
    expect(await doc<string>('s.designText')).toBe(before);
  });

  it("a design that cannot assemble shows that state, not a broken picture", async () => {
    const design = JSON.parse(await doc<string>('s.designText'));
    design.name = 'Tyres too big to reach the ground';
    design.wheels.front.rollingRadiusMm = 1500;
    await page.getByTestId('open-file-input').setInputFiles({ name: 'too-big.tiltsheet', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(design)) });
    const status = page.getByTestId('viewport-status');
    await status.waitFor();
    expect(await text(status)).toMatch(/Won't assemble/);
    expect(await text(status)).toMatch(/hardpoints as entered/);
    expect(await pose<string>('s.outcome.shown')).toBe('as-entered');
    expect(await readout('readouts')).toMatch(/No readings/);
    expect(await text(page.getByTestId('alerts'))).toMatch(/cannot reach this pose/);
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('05-cannot-assemble') });
  });

  it('a pose the linkage cannot reach keeps the last pose that closed and says why', async () => {
    await commitField('pose-handlebarDeg', '60');
    const status = page.getByTestId('viewport-status');
    await status.waitFor();
    expect(await text(status)).toMatch(/Won't reach this pose/);
    expect(await text(status)).toMatch(/tie rod/);
    expect(await pose<string>('s.outcome.shown')).toBe('last-good');
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('06-unreachable-pose') });
    await commitField('pose-handlebarDeg', '5');
    await expect.poll(() => page.getByTestId('viewport-status').count()).toBe(0);
  });

  it('autosaves unsaved work and offers to restore it after a reload', async () => {
    await commitField('hp-steering.pivot-z', '123');
    await page.waitForTimeout(1500);
    await page.reload();
    await waitForWorkbench(page);
    const offer = page.getByTestId('recovery');
    await offer.waitFor();
    expect(await text(offer)).toMatch(/unsaved changes to Heron T3/);
    await page.screenshot({ path: shotPath('07-recovery-offer') });
    await page.getByTestId('recovery-restore').click();
    await expect.poll(() => page.getByTestId('hp-steering.pivot-z').inputValue()).toBe('123');
    expect(await page.getByTestId('dirty-marker').isVisible()).toBe(true);
  });

  it('draws the envelope map in the worker, and a click on a cell moves the pose there', async () => {
    await page.getByTestId('tab-map').click();
    const chart = page.getByTestId('chart-map');
    await chart.waitFor({ timeout: 60_000 });
    await pollFor(page, `document.querySelectorAll('[data-testid=chart-map] svg path, [data-testid=chart-map] svg rect').length > 50`, 60_000, 'the heat map');
    const box = (await chart.boundingBox())!;
    await page.mouse.click(box.x + 62 + (box.width - 62 - 170) * 0.85, box.y + 58 + (box.height - 58 - 44) * 0.2);
    await expect.poll(() => pose<number>('s.pose.leanDeg')).toBeGreaterThan(5);
    expect(Math.abs(await pose<number>('s.pose.handlebarDeg'))).toBeGreaterThan(5);
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('08-envelope-map') });
  });
});

describe('gizmo', () => {
  it('drags a selected hardpoint in the viewport; the linkage re-solves and the drag is one undo step', async () => {
    await commitField('pose-handlebarDeg', '10');
    await showColumn('hardpoints');
    await page.getByTestId('hp-upright.steeringArmJoint.right').locator('th').click();
    await page.getByTestId('gizmo-bar').waitFor();
    await waitForPicture(page);
    const before = await doc<{ x: number; y: number; z: number }>('s.design.upright.steeringArmJoint');
    const toeBefore = await readout('readout-toe-right');
    const canvas = (await page.locator('[data-testid=viewport] canvas').boundingBox())!;
    const [px, py] = await evalIn<[number, number]>(
      page,
      `(() => { const p = window.__tiltbench.pose.getState().outcome.snapshot.points['upright.steeringArmJoint.right']; return window.__tiltbenchStats.project(p[0], p[1], p[2]); })()`,
    );
    const x0 = canvas.x + px;
    const y0 = canvas.y + py;
    await page.mouse.move(x0, y0);
    await page.mouse.down();
    for (let k = 1; k <= 10; k++) await page.mouse.move(x0 + 3 * k, y0 - 2 * k);
    await page.mouse.up();
    await waitForPicture(page);
    const after = await doc<{ x: number; y: number; z: number }>('s.design.upright.steeringArmJoint');
    expect(after).not.toEqual(before);
    expect(await doc<number>('s.history.past.length')).toBe(1);
    expect(await doc<string>('s.history.past[0].label')).toMatch(/move right upright steering arm joint/);
    await expect.poll(() => readout('readout-toe-right')).not.toBe(toeBefore);
    await page.screenshot({ path: shotPath('09-gizmo-drag') });
    await page.getByTestId('undo').click();
    expect(await doc<unknown>('s.design.upright.steeringArmJoint')).toEqual(before);
    await expect.poll(() => readout('readout-toe-right')).toBe(toeBefore);
  });
});

describe('start-up', () => {
  it('opens the design named in the address (what npm start passes without Electron)', async () => {
    await page.goto(`${url}?design=designs/wren-rack-trike.tiltsheet`);
    await waitForWorkbench(page);
    await expect.poll(() => text(page.getByTestId('doc-title'))).toContain('Wren R1');
    expect(await page.getByTestId('slider-leanDeg').isDisabled()).toBe(true);
    expect(await page.getByTestId('dirty-marker').count()).toBe(0);
    await waitForPicture(page);
    await page.screenshot({ path: shotPath('10-startup-wren') });
  });
});
