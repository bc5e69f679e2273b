/**
 * Screenshots of the 3D view: every demo in every view (3D perspective, Front, Side, Top) at
 * 1280 x 800 and 1920 x 1080, the whole window and the viewport alone, into
 * test-artifacts/viewport-shots/ (git-ignored). Also one each with a hardpoint selected and
 * the front view at a lean. Look at them.
 *
 * Usage: tsx test/bench/viewportShots.ts [--no-build] [--demo NAME] [--size 1280x800]
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { ARTIFACTS_DIR, buildRenderer, DESIGNS_DIR } from '../e2e/support/buildRenderer';
import { launchChromium } from '../e2e/support/chromium';
import { serveStatic } from '../e2e/support/staticServer';
import { waitForPicture, waitForWorkbench } from '../e2e/support/page';

const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike'];
const SIZES: [number, number][] = [
  [1280, 800],
  [1920, 1080],
];
const VIEWS = ['threeQuarter', 'front', 'side', 'top'];

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  const build = !argv.includes('--no-build');
  const only = argv.includes('--demo') ? argv[argv.indexOf('--demo') + 1] : null;
  const size = argv.includes('--size') ? argv[argv.indexOf('--size') + 1] : null;
  const outDir = path.join(ARTIFACTS_DIR, 'viewport-shots');
  const buildDir = path.join(ARTIFACTS_DIR, 'viewport-shots-build');
  mkdirSync(outDir, { recursive: true });
  if (build) await buildRenderer(buildDir);
  const server = await serveStatic(buildDir, DESIGNS_DIR);
  const browser = await launchChromium();
  try {
    for (const [w, h] of SIZES.filter(([a, b]) => !size || size === `${a}x${b}`)) {
      const page = await browser.newPage({ viewport: { width: w, height: h } });
      for (const demo of DEMOS.filter((d) => !only || d === only)) {
        await page.goto(`${server.url}?design=designs/${demo}.tiltsheet`);
        await waitForWorkbench(page);
        await waitForPicture(page);
        const tilting = await page.evaluate(`window.__tiltbench.document.getState().design.vehicle.tilting`);
        await page.evaluate(`window.__tiltbench.actions.setPose({ ${tilting ? 'leanDeg: 15, ' : ''}handlebarDeg: -8 })`);
        for (const view of VIEWS) {
          await page.getByTestId(`view-${view}`).click();
          await waitForPicture(page);
          const name = `${demo}-${view}-${w}x${h}`;
          await page.screenshot({ path: path.join(outDir, `${name}-window.png`) });
          await page.locator('[data-testid=viewport]').screenshot({ path: path.join(outDir, `${name}.png`) });
          console.log(name);
        }
        // A hardpoint selected (halo, gizmo bar) in the perspective view.
        await page.getByTestId('view-threeQuarter').click();
        const row = await page.evaluate(`window.__tiltbench.pose.getState().drawing.joints[3].hardpoint`);
        await page.evaluate(`window.__tiltbench.actions.select(${JSON.stringify(row)})`);
        await waitForPicture(page);
        await page.locator('[data-testid=viewport]').screenshot({ path: path.join(outDir, `${demo}-selected-${w}x${h}.png`) });
        await page.evaluate(`window.__tiltbench.actions.select(null)`);
      }
      await page.close();
    }
  } finally {
    await browser.close();
    await server.close();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
