// Ad-hoc probe (speed3): which parts of the page change while the demo plays (DOM mutation
// records in 3 s, grouped by the nearest ancestor with a data-testid or a class).
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
await page.getByTestId('play').click();
await page.waitForTimeout(1000);
const out = await page.evaluate(`new Promise((done) => {
  const counts = {};
  const f0 = window.__tiltbenchStats.frames;
  const label = (n) => { for (let e = n.nodeType === 1 ? n : n.parentElement; e; e = e.parentElement) { if (e.dataset && e.dataset.testid) return 'testid=' + e.dataset.testid; } return 'none'; };
  const top = (n) => { let best = 'none'; for (let e = n.nodeType === 1 ? n : n.parentElement; e; e = e.parentElement) { if (e.dataset && e.dataset.testid) best = e.dataset.testid; } return best; };
  const mo = new MutationObserver((recs) => { for (const r of recs) { const k = top(r.target) + ' > ' + label(r.target) + ' ' + r.type + ':' + (r.attributeName || '') + ' ' + (r.target.nodeType === 1 ? r.target.tagName : '#text'); counts[k] = (counts[k] || 0) + 1; } });
  mo.observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
  setTimeout(() => { mo.disconnect(); done({ frames: window.__tiltbenchStats.frames - f0, counts }); }, 3000);
})`);
const o = out as { frames: number; counts: Record<string, number> };
console.log('frames', o.frames);
const byTop: Record<string, number> = {}; for (const [k, v] of Object.entries(o.counts)) { const t = k.split(" > ")[0]; byTop[t] = (byTop[t] ?? 0) + v; }
console.log("mutations per frame by part:", Object.entries(byTop).sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ${(v / o.frames).toFixed(1)}`).join(", "), "; total", (Object.values(byTop).reduce((a, b) => a + b, 0) / o.frames).toFixed(1));
console.log(Object.entries(o.counts).sort((a, b) => b[1] - a[1]).slice(0, 30).map(([k, v]) => `${String(v).padStart(6)} ${k}`).join('\n'));
await browser.close(); await server.close();
