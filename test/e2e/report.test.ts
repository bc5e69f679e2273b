// End-to-end, in the built workbench in headless Chromium (under the app's Content-Security-
// Policy): the File menu's workshop report. The report is made in the sweep worker and taken
// from a real download (its sheets and the design's name read back); Print puts it in a hidden
// frame whose own print() is caught here (headless Chromium has no print dialog), with the
// report's inline styles applied there (the policy allows them) and no policy complaint.
import { readFile } from 'node:fs/promises';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { launchChromium } from './support/chromium';
import { shotPath, waitForWorkbench } from './support/page';

const url = inject('tiltbenchUrl');
let browser: Browser;
let page: Page;
const problems: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await browser.newPage({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || /Content Security Policy|Refused to/.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`);
  });
  // Every frame's print() records what it would print, in the top window.
  await page.addInitScript(() => {
    window.print = () => {
      const top = window.top as unknown as { __reportPrinted?: { h1: string; sheets: number; cautionBorder: string }[] };
      const caution = document.querySelector('.caution');
      (top.__reportPrinted ??= []).push({ h1: document.querySelector('h1')?.textContent ?? '', sheets: document.querySelectorAll('section.sheet').length, cautionBorder: caution ? getComputedStyle(caution).borderTopColor : '' });
    };
  });
  await page.goto(url);
  await waitForWorkbench(page);
});

afterAll(async () => {
  await browser?.close();
});

it('Workshop report (HTML) downloads the design\u2019s report, made in the worker', async () => {
  const name = await page.evaluate(() => (window as unknown as { __tiltbench: { document: { getState(): { design: { name: string } } } } }).__tiltbench.document.getState().design.name);
  await page.getByTestId('file-exchange').click();
  const download = page.waitForEvent('download', { timeout: 90_000 });
  await page.getByTestId('file-export-report').click();
  const d = await download;
  expect(d.suggestedFilename()).toMatch(/\.report\.html$/);
  const html = await readFile((await d.path())!, 'utf8');
  expect(html).toContain(`<h1>Workshop report: ${name.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</h1>`);
  expect(html.match(/<section class="sheet"/g)).toHaveLength(7);
  expect(html).not.toMatch(/<script/i);
  await page.screenshot({ path: shotPath('report-downloaded') });
}, 120_000);

it('Print workshop report prints the report from a hidden frame, styled, and removes the frame after', async () => {
  await page.getByTestId('file-exchange').click();
  await page.getByTestId('file-print-report').click();
  await expect.poll(() => page.evaluate(() => (window as unknown as { __reportPrinted?: unknown[] }).__reportPrinted?.length ?? 0), { timeout: 90_000 }).toBe(1);
  const printed = await page.evaluate(() => (window as unknown as { __reportPrinted: { h1: string; sheets: number; cautionBorder: string }[] }).__reportPrinted[0]);
  expect(printed.h1).toMatch(/^Workshop report: /);
  expect(printed.sheets).toBe(7);
  // The caution's red border (core/report's stylesheet, #d8453b) is applied inside the frame.
  expect(printed.cautionBorder).toBe('rgb(216, 69, 59)');
  await page.evaluate(() => document.querySelector<HTMLIFrameElement>('iframe[data-testid="report-print-frame"]')?.contentWindow?.dispatchEvent(new Event('afterprint')));
  await expect.poll(() => page.evaluate(() => document.querySelectorAll('iframe[data-testid="report-print-frame"]').length)).toBe(0);
  expect(problems).toEqual([]);
}, 120_000);
