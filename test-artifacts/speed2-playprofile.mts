// Ad-hoc probe (speed2): CPU profile of 4 s of lean playback in the built workbench, self and
// inclusive time by function, and the frames drawn (headless Chromium, SwiftShader, 1280x800).
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
import { serveStatic } from '../test/e2e/support/staticServer';
import { DESIGNS_DIR } from '../test/e2e/support/buildRenderer';
const server = await serveStatic(process.argv[2], DESIGNS_DIR);
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
await page.goto(server.url);
for (;;) { if (await page.evaluate('Boolean(window.__tiltbench && window.__tiltbench.jobs.store.getState().curves.resultRevision >= 0)')) break; await page.waitForTimeout(100); }
await page.waitForTimeout(2000);
const cdp = await page.context().newCDPSession(page);
await cdp.send('Profiler.enable');
await cdp.send('Profiler.setSamplingInterval', { interval: 1000 });
await page.getByTestId('play').click();
await page.waitForTimeout(1000);
const f0 = (await page.evaluate('window.__tiltbenchStats.frames')) as number;
await cdp.send('Profiler.start');
await page.waitForTimeout(4000);
const { profile } = (await cdp.send('Profiler.stop')) as any;
const f1 = (await page.evaluate('window.__tiltbenchStats.frames')) as number;
console.log('frames in 4 s:', f1 - f0, 'dpr', await page.evaluate('window.__tiltbenchStats.dpr'));
const byId = new Map(profile.nodes.map((n: any) => [n.id, n]));
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
const self = new Map<string, number>();
const incl = new Map<string, number>();
const name = (n: any) => `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`;
profile.samples.forEach((id: number, i: number) => {
  const dt = (profile.timeDeltas[i] ?? 0) / 1000;
  self.set(name(byId.get(id)), (self.get(name(byId.get(id))) ?? 0) + dt);
  const seen = new Set<string>();
  for (let cur: number | undefined = id; cur !== undefined; cur = parent.get(cur)) {
    const k = name(byId.get(cur));
    if (!seen.has(k)) { seen.add(k); incl.set(k, (incl.get(k) ?? 0) + dt); }
  }
});
console.log('SELF', [...self].sort((a, b) => b[1] - a[1]).slice(0, 20).map(([k, v]) => `${v.toFixed(0).padStart(6)} ${k}`).join('\n'));
console.log('INCL', [...incl].sort((a, b) => b[1] - a[1]).slice(0, 45).map(([k, v]) => `${v.toFixed(0).padStart(6)} ${k}`).join('\n'));
await browser.close(); await server.close();
