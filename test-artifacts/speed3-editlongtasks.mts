// Ad-hoc probe (speed3): the main thread's long tasks (PerformanceObserver 'longtask', >= 50 ms)
// after each typed hardpoint edit, from the Enter key to the curves of the edit being in the
// jobs store plus 600 ms. Usage: npx tsx test-artifacts/speed3-editlongtasks.mts BUILT [edits]
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
import { serveStatic } from '../test/e2e/support/staticServer';
import { DESIGNS_DIR } from '../test/e2e/support/buildRenderer';

const server = await serveStatic(process.argv[2], DESIGNS_DIR);
const edits = Number(process.argv[3] ?? 6);
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
await page.addInitScript(`(() => {
  const m = (window.__lt = { tasks: [], enter: 0 });
  new PerformanceObserver((l) => { for (const e of l.getEntries()) m.tasks.push([e.startTime, e.duration]); }).observe({ type: 'longtask', buffered: true });
  document.addEventListener('keydown', (e) => { if (e.key === 'Enter') m.enter = performance.now(); }, true);
})()`);
await page.goto(server.url);
const idle = '(() => { const j = window.__tiltbench.jobs.store.getState(); return j.curves.progress === null && j.map.progress === null; })()';
for (;;) { if (await page.evaluate('Boolean(window.__tiltbench && window.__tiltbench.jobs.store.getState().curves.resultRevision >= 0)')) break; await page.waitForTimeout(100); }
await page.getByTestId('column-tab-hardpoints').click();
await page.waitForTimeout(4000);
const f = page.getByTestId('hp-steering.pivot-z');
const v0 = Number(await f.inputValue());
const rows: string[] = [];
let sum = 0;
for (let k = 0; k < edits; k++) {
  for (;;) { if (await page.evaluate(idle)) break; await page.waitForTimeout(50); }
  await page.waitForTimeout(700);
  await page.evaluate('window.__lt.tasks = []');
  await f.fill((v0 + (k % 2 === 0 ? 2 : 0)).toFixed(1));
  await f.press('Enter');
  for (;;) { if (await page.evaluate('(() => { const wb = window.__tiltbench; return wb.jobs.store.getState().curves.resultRevision === wb.document.getState().revision; })()')) break; await page.waitForTimeout(20); }
  const readAt = (await page.evaluate('performance.now() - window.__lt.enter')) as number;
  await page.waitForTimeout(600);
  const t = (await page.evaluate('window.__lt.tasks.map(([s, d]) => [s - window.__lt.enter, d])')) as [number, number][];
  const total = t.filter(([s]) => s > -20).reduce((a, [, d]) => a + d, 0);
  if (k > 0) sum += total;
  rows.push(`edit ${k + 1}: curves in store ${readAt.toFixed(0)} ms after Enter; long tasks ${t.map(([s, d]) => `${d.toFixed(0)} ms at ${s.toFixed(0)}`).join(', ') || 'none'}; total ${total.toFixed(0)} ms`);
}
console.log(rows.join('\n'));
console.log(`mean long-task total per edit (edits 2..${edits}): ${(sum / Math.max(1, edits - 1)).toFixed(0)} ms`);
await browser.close();
await server.close();
