// Ad-hoc probe (speed2): every canvas width/height set during load, with its time and duration.
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
import { serveStatic } from '../test/e2e/support/staticServer';
import { DESIGNS_DIR } from '../test/e2e/support/buildRenderer';
const server = await serveStatic(process.argv[2], DESIGNS_DIR);
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
for (let k = 0; k < Number(process.argv[3] ?? 3); k++) {
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  await page.addInitScript(`(() => {
    const log = (window.__sizes = []);
    for (const prop of ['width', 'height']) {
      const d = Object.getOwnPropertyDescriptor(HTMLCanvasElement.prototype, prop);
      Object.defineProperty(HTMLCanvasElement.prototype, prop, { configurable: true, get: d.get, set(v) {
        const t0 = performance.now(); d.set.call(this, v); log.push(prop + '=' + v + ' at ' + t0.toFixed(0) + ' took ' + (performance.now() - t0).toFixed(1));
      } });
    }
    const gc = HTMLCanvasElement.prototype.getContext;
    HTMLCanvasElement.prototype.getContext = function (...a) { const t0 = performance.now(); const r = gc.apply(this, a); log.push('getContext ' + a[0] + ' at ' + t0.toFixed(0) + ' took ' + (performance.now() - t0).toFixed(1)); return r; };
  })()`);
  await page.goto(server.url);
  for (;;) { if (await page.evaluate('Boolean(window.__tiltbenchStats && window.__tiltbenchStats.frames > 0)')) break; await page.waitForTimeout(20); }
  console.log(k, await page.evaluate('performance.now()'), (await page.evaluate('window.__sizes')) as string[]);
  await page.close();
}
await browser.close(); await server.close();
