// End-to-end, in the built workbench in headless Chromium: the File menu's Import/Export.
// The .glb files are taken from real downloads and passed to the Khronos glTF validator (npm
// gltf-validator); a hardpoint table goes in through the real file chooser, the dialog lists
// what moves, Apply changes the design and one Undo restores it; a bad table changes nothing.
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { validateBytes } from 'gltf-validator';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { exportHardpointCsv } from '../../core/design/hardpointCsv';
import { parseDesignText } from '../../core/design/validateDesign';
import { launchChromium } from './support/chromium';
import { evalIn, shotPath, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let page: Page;
let dir: string;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await browser.newPage({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  await page.goto(url);
  await waitForWorkbench(page);
  dir = await mkdtemp(path.join(os.tmpdir(), 'tiltbench-exchange-'));
});

afterAll(async () => {
  await browser?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

async function download(testId: string): Promise<{ name: string; bytes: Uint8Array }> {
  await page.getByTestId('file-exchange').click();
  const waiting = page.waitForEvent('download');
  await page.getByTestId(testId).click();
  const d = await waiting;
  return { name: d.suggestedFilename(), bytes: new Uint8Array(await readFile((await d.path())!)) };
}

async function importTable(file: string): Promise<void> {
  await page.getByTestId('file-exchange').click();
  const chooser = page.waitForEvent('filechooser');
  await page.getByTestId('file-import-hardpoints').click();
  await (await chooser).setFiles(file);
  await page.getByTestId('import-hardpoints').waitFor();
}

const designText = () => evalIn<string>(page, 'window.__tiltbench.document.getState().designText');

it('downloads the pose and the lean sweep as .glb files the Khronos validator passes', async () => {
  for (const [testId, name] of [['file-export-pose-glb', 'heron-tilting-velomobile.pose.glb'], ['file-export-sweep-glb', 'heron-tilting-velomobile.lean-sweep.glb']]) {
    const d = await download(testId);
    expect(d.name).toBe(name);
    const report = await validateBytes(d.bytes);
    expect([report.issues.numErrors, report.issues.numWarnings], `${name}: ${JSON.stringify(report.issues.messages.slice(0, 3))}`).toEqual([0, 0]);
  }
  expect(problems).toEqual([]);
});

it('the downloaded table, edited, goes back in through the file chooser: the dialog lists the move, Apply changes the design, one Undo restores it', async () => {
  const table = await download('file-export-hardpoints');
  expect(table.name).toBe('heron-tilting-velomobile.hardpoints.csv');
  const text = new TextDecoder().decode(table.bytes);
  // The download is the table core writes for the design on screen.
  const parsed = parseDesignText(await designText(), 'x.tiltsheet');
  expect(parsed.ok && exportHardpointCsv(parsed.design)).toBe(text);

  const before = await designText();
  const edited = path.join(dir, 'edited.csv');
  const moved = text.replace('steering.pivot,centre,-75,0,107', 'steering.pivot,centre,-75,0,112');
  expect(moved).not.toBe(text);
  await writeFile(edited, moved);
  await importTable(edited);
  const rows = page.getByTestId('import-changes').locator('tbody tr');
  expect(await rows.count()).toBe(1);
  expect(await rows.first().getAttribute('data-point')).toBe('steering.pivot');
  await page.screenshot({ path: shotPath('exchange-import-dialog') });
  await page.getByTestId('import-apply').click();
  expect(await evalIn<number>(page, 'window.__tiltbench.document.getState().design.steering.pivot.z')).toBe(112);
  await page.getByRole('button', { name: 'Undo' }).click();
  expect(await designText()).toBe(before);

  const bad = path.join(dir, 'bad.csv');
  await writeFile(bad, moved.replace('steering.pivot,centre,-75,0,112', 'steering.pivot,middle,-75,0,112'));
  await importTable(bad);
  expect(await page.getByTestId('import-problems').textContent()).toMatch(/bad\.csv:\d+:16: steering\.pivot side: expected centre/);
  await page.getByTestId('import-close').click();
  expect(await designText()).toBe(before);
  expect(problems).toEqual([]);
});
