// Ad-hoc probe (speed helper): CPU profile of the load up to the first frame, self time by function.
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
import { serveStatic } from '../test/e2e/support/staticServer';
import { DESIGNS_DIR } from '../test/e2e/support/buildRenderer';

const dir = process.argv[2];
const server = await serveStatic(dir, DESIGNS_DIR);
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
if (process.argv[3] === 'second') {
  // A first load in this browser, so the profiled one meets a warm GPU process (as the bench's later loads).
  const p0 = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  await p0.goto(server.url);
  for (;;) { if (await p0.evaluate('Boolean(window.__tiltbenchStats && window.__tiltbenchStats.frames > 0)')) break; await p0.waitForTimeout(50); }
  await p0.waitForTimeout(2000);
  await p0.close();
}
const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
const cdp = await page.context().newCDPSession(page);
await cdp.send('Profiler.enable');
await cdp.send('Profiler.setSamplingInterval', { interval: 1000 });
await cdp.send('Profiler.start');
await page.goto(server.url);
for (;;) { if (await page.evaluate('Boolean(window.__tiltbenchStats && window.__tiltbenchStats.frames > 0)')) break; await page.waitForTimeout(20); }
const ff = await page.evaluate('performance.now()');
let { profile } = (await cdp.send('Profiler.stop')) as any;
if (process.argv[3] === 'edit') {
  // Profile three hardpoint edits instead, each until its curves are painted.
  await page.waitForTimeout(4000);
  await cdp.send('Profiler.start');
  for (let k = 0; k < 3; k++) {
    const tt = page.getByTestId('column-tab-hardpoints'); if (k === 0 && (await tt.count()) > 0) await tt.click();
    const f = page.getByTestId('hp-steering.pivot-z');
    const v = Number(await f.inputValue());
    await f.fill(String(v + (k % 2 ? -2 : 2)));
    await f.press('Enter');
    for (;;) { if (await page.evaluate('(() => { const wb = window.__tiltbench; return wb.jobs.store.getState().curves.resultRevision === wb.document.getState().revision; })()')) break; await page.waitForTimeout(20); }
    await page.waitForTimeout(600);
  }
  profile = ((await cdp.send('Profiler.stop')) as any).profile;
}
const byId = new Map(profile.nodes.map((n: any) => [n.id, n]));
const self = new Map<string, number>();
const dt = profile.timeDeltas as number[];
profile.samples.forEach((id: number, i: number) => {
  const n: any = byId.get(id);
  const k = `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`;
  self.set(k, (self.get(k) ?? 0) + (dt[i] ?? 0) / 1000);
});
// inclusive time per function (counted once per sample)
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const incl = new Map<string, number>();
profile.samples.forEach((id: number, i: number) => {
  const seen = new Set<string>();
  for (let cur: number | undefined = id; cur !== undefined; cur = parent.get(cur)) {
    const n: any = byId.get(cur);
    const k = `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`;
    if (!seen.has(k)) { seen.add(k); incl.set(k, (incl.get(k) ?? 0) + (dt[i] ?? 0) / 1000); }
  }
});
console.log('first frame at', Math.round(ff as number), 'ms');
console.log('SELF top', [...self].sort((a, b) => b[1] - a[1]).slice(0, 25).map(([k, v]) => `${v.toFixed(0).padStart(6)} ${k}`).join('\n'));
console.log('INCL top', [...incl].sort((a, b) => b[1] - a[1]).slice(0, 60).map(([k, v]) => `${v.toFixed(0).padStart(6)} ${k}`).join('\n'));
await browser.close(); await server.close();
