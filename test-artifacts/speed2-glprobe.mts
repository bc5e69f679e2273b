// Ad-hoc probe (speed2): WebGL context creation and first resize on SwiftShader, alone and right after a page of text is painted.
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../test/e2e/support/chromium';
const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
const text = '<p>Toe 0.000 deg camber 1.25 deg trail 32.0 mm scrub radius 12.5 mm</p>'.repeat(60);
for (let k = 0; k < 6; k++) {
  const withText = k % 2 === 1;
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  await page.setContent(`<div id=t style="columns:4;font:13px sans-serif"></div><canvas id=c style="position:absolute;left:300px;top:40px"></canvas>`);
  const r = await page.evaluate(`new Promise((done) => {
    if (${withText}) document.getElementById('t').innerHTML = ${JSON.stringify(text)};
    requestAnimationFrame(() => setTimeout(() => {
    const c = document.getElementById('c');
    const t0 = performance.now();
    const gl = c.getContext('webgl2', { antialias: false, alpha: false, stencil: false, depth: true, powerPreference: 'high-performance' });
    const t1 = performance.now();
    c.width = 640; c.height = 520; gl.viewport(0,0,640,520);
    const t2 = performance.now();
    gl.clearColor(1,0,0,1); gl.clear(gl.COLOR_BUFFER_BIT);
    const p = new Uint8Array(4); gl.readPixels(0,0,1,1,gl.RGBA,gl.UNSIGNED_BYTE,p);
    const t3 = performance.now();
    done({ withText: ${withText}, getContext: t1 - t0, resize: t2 - t1, drawRead: t3 - t2 });
  }, 0)); })`);
  console.log(k, JSON.stringify(r));
  await page.close();
}
await browser.close();
