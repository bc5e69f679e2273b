// End-to-end: the browser fallback's recovery copy (localStorage) survives the browser process
// being killed outright (SIGKILL, no graceful close), and the next start restores exactly the
// design that was on screen. Uses a persistent Chromium profile in a fresh temp directory.
import { execFileSync } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, expect, inject, it } from 'vitest';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './support/chromium';
import { evalIn, pollFor, shotPath, text, waitForPicture, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
const RECOVERY_KEY = 'tiltbench.recovery.v1';

let profileDir: string | undefined;
const contexts: BrowserContext[] = [];

afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  if (profileDir) await rm(profileDir, { recursive: true, force: true });
});

async function launch(dir: string): Promise<{ context: BrowserContext; page: Page; problems: string[] }> {
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1280, height: 800 },
  });
  contexts.push(context);
  const page = context.pages()[0] ?? (await context.newPage());
  const problems: string[] = [];
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  await page.goto(url);
  await waitForWorkbench(page);
  return { context, page, problems };
}

/** Pids and command lines of every process started with this profile directory. */
function profileProcesses(dir: string): { pid: number; args: string }[] {
  const out = execFileSync('ps', ['-eo', 'pid=,args='], { encoding: 'utf8' });
  return out
    .split('\n')
    .map((line) => /^\s*(\d+)\s+(.*)$/.exec(line))
    .filter((m): m is RegExpExecArray => m !== null && m[2].includes(`--user-data-dir=${dir}`))
    .map((m) => ({ pid: Number(m[1]), args: m[2] }));
}

/** Reads the workbench's document store (design and its text) in the page. */
const doc = <T>(page: Page, expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.document.getState(); return ${expr}; })()`);
/** Reads the workbench's UI store (the recovery offer) in the page. */
const ui = <T>(page: Page, expr: string) => evalIn<T>(page, `(() => { const s = window.__tiltbench.ui.getState(); return ${expr}; })()`);

async function commitField(page: Page, testId: string, value: string) {
  // The full hardpoint table and the design's settings are tabs of the column beside the view.
  if (testId.startsWith('hp-')) await page.getByTestId('column-tab-hardpoints').click();
  if (testId.startsWith('field-')) await page.getByTestId('column-tab-settings').click();
  const f = page.getByTestId(testId);
  await f.fill(value);
  await f.press('Enter');
}

it('after the browser process is killed, the next start offers the recovered design, identical to what was on screen', async () => {
  profileDir = await mkdtemp(path.join(os.tmpdir(), 'tiltbench-profile-'));

  // First run: edit two hardpoints and the design's name.
  const first = await launch(profileDir);
  let page = first.page;
  await commitField(page, 'hp-steering.pivot-z', '117.5');
  await commitField(page, 'hp-upright.steeringArmJoint.right-x', '-88');
  await commitField(page, 'field-name', 'Heron T3 after a crash');
  await expect.poll(() => doc<string>(page, 's.design.name')).toBe('Heron T3 after a crash');
  expect(await page.getByTestId('dirty-marker').isVisible()).toBe(true);

  // Wait for the autosave to write the recovery copy of exactly what is on screen.
  await pollFor(
    page,
    `localStorage.getItem(${JSON.stringify(RECOVERY_KEY)}) === window.__tiltbench.document.getState().designText`,
    10_000,
    'the recovery copy to match the design on screen',
  );
  const onScreen = await doc<unknown>(page, 's.design');
  const onScreenText = await doc<string>(page, 's.designText');
  expect(JSON.parse(onScreenText)).toEqual(onScreen);
  expect(onScreenText).toContain('117.5');
  expect(onScreenText).toContain('-88');

  // Kill the browser process hard: the one with our profile and no --type= (children have one).
  const procs = profileProcesses(profileDir);
  const browserProcs = procs.filter((p) => !/\s--type=/.test(p.args));
  expect(browserProcs, JSON.stringify(procs, null, 1)).toHaveLength(1);
  process.kill(browserProcs[0].pid, 'SIGKILL');
  await expect.poll(() => profileProcesses(profileDir!).length, { timeout: 15_000 }).toBe(0);
  expect(first.problems).toEqual([]);

  // Second run on the same profile: the recovery offer appears; restore it.
  const second = await launch(profileDir);
  page = second.page;
  const offer = page.getByTestId('recovery');
  await expect
    .poll(() => offer.count(), { timeout: 15_000, message: 'no recovery offer after the kill: the recovery copy seen in localStorage never reached the disk' })
    .toBe(1);
  // The copy on offer is the last one autosaved, not an older one.
  expect(await ui<string>(page, 's.recovery && s.recovery.text')).toBe(onScreenText);
  expect(await text(offer)).toMatch(/unsaved changes to Heron T3 after a crash/);
  await page.getByTestId('recovery-restore').click();
  await expect.poll(() => doc<string>(page, 's.design.name')).toBe('Heron T3 after a crash');

  expect(await doc<unknown>(page, 's.design')).toEqual(onScreen);
  expect(await doc<string>(page, 's.designText')).toBe(onScreenText);
  expect(await page.getByTestId('hp-steering.pivot-z').inputValue()).toBe('117.5');
  expect(await page.getByTestId('hp-upright.steeringArmJoint.right-x').inputValue()).toBe('-88');
  expect(await page.getByTestId('field-name').inputValue()).toBe('Heron T3 after a crash');
  expect(await page.getByTestId('dirty-marker').isVisible()).toBe(true);
  await waitForPicture(page);
  await page.screenshot({ path: shotPath('12-recovered-after-kill') });
  expect(second.problems).toEqual([]);
  await second.context.close();
});
