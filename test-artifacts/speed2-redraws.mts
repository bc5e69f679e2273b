// Ad-hoc probe (speed2): how many times the open chart is drawn (ECharts setOption: its SVG root's
// children replaced) in the 2.5 s after a typed hardpoint edit, and when the first draw of the
// edited design's result lands. Robust to machine load (a count, not a time).
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
import { serveStatic } from '../test/e2e/support/staticServer';
import { DESIGNS_DIR } from '../test/e2e/support/buildRenderer';
const dirs = process.argv.slice(2);
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
for (const dir of dirs) {
  const server = await serveStatic(dir, DESIGNS_DIR);
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  await page.goto(server.url);
  const idle = `(() => { const j = window.__tiltbench.jobs.store.getState(); return j.curves.progress === null && j.map.progress === null; })()`;
  for (;;) { if (await page.evaluate(`window.__tiltbench && window.__tiltbench.jobs.store.getState().curves.resultRevision >= 0 && ${idle}`)) break; await page.waitForTimeout(100); }
  const tt = page.getByTestId('column-tab-hardpoints');
  if ((await tt.count()) > 0) await tt.click();
  await page.waitForTimeout(2000);
  const f = page.getByTestId('hp-steering.pivot-z');
  const v0 = Number(await f.inputValue());
  const counts: string[] = [];
  for (let k = 0; k < 4; k++) {
    await page.evaluate(`(() => {
      const node = document.querySelector('.plots .chart svg') || document.querySelector('.plots .chart');
      window.__draws = []; window.__t0 = performance.now(); const wb = window.__tiltbench; window.__offJ = wb.jobs.store.subscribe((st, pr) => { if (st.curves.resultRevision !== pr.curves.resultRevision || st.curves.result !== pr.curves.result) window.__draws.push('result@' + Math.round(performance.now() - window.__t0) + '(worker ' + st.curves.result.elapsedMs + ' ms)'); });
      const mo = new MutationObserver((recs) => { window.__draws.push(Math.round(performance.now() - window.__t0) + ':' + recs.length); });
      mo.observe(document.querySelector('.plots .chart'), { subtree: true, childList: true, attributes: true, characterData: true });
      window.__mo = mo;
    })()`);
    await f.fill((v0 + (k % 2 === 0 ? 2 : 0)).toFixed(1));
    await f.press('Enter');
    await page.waitForTimeout(2500);
    for (;;) { if (await page.evaluate(idle)) break; await page.waitForTimeout(100); }
    counts.push(String(await page.evaluate('(window.__mo.disconnect(), window.__offJ(), window.__draws.join(","))')));
  }
  console.log(dir, 'mutation batches on the chart svg per edit:', counts.join(' | '));
  await page.close();
  await server.close();
}
await browser.close();
