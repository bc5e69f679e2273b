/**
 * Viewport speed benchmark: the built workbench in headless Debian Chromium, WebGL on
 * SwiftShader (no GPU), window 1280 x 800, the demo design.
 *
 *   frames per second  while the demo plays a lean sweep (renders counted in the page)
 *   latency            from a lean-slider input event to the next rendered frame that shows
 *                      the new pose, with the readouts already showing it
 *
 * Targets (issue 4): at least 30 fps, under 50 ms. Each figure is printed with PASS or MISS.
 *
 * It runs twice, in two browser configurations, because the browser itself sets a ceiling:
 *   - "brief flags": the flags the e2e tests use (--use-angle=swiftshader). They put Chromium's
 *     own compositing on SwiftShader too, so every frame of the whole 1280 x 800 window is
 *     composited on the CPU; the page's empty-canvas ceiling is printed beside the figures.
 *   - "software compositing": the same plus --disable-gpu-compositing, which is what Chromium
 *     does on a machine without a usable GPU: WebGL on SwiftShader, compositing in software.
 *
 * Frames per second are measured in three windows of N seconds and the median reported (this
 * machine is shared; the load average is printed so a reader can judge the figures).
 *
 * Usage: tsx test/bench/viewport.ts [--no-build | --dir BUILT_RENDERER] [--seconds N] [--trials N] [--config brief|software]
 */
import os from 'node:os';
import { chromium, type Browser, type Page } from 'playwright-core';
import { buildRenderer, BUILD_DIR, DESIGNS_DIR } from '../e2e/support/buildRenderer';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../e2e/support/chromium';
import { serveStatic } from '../e2e/support/staticServer';

const TARGET_FPS = 30;
const TARGET_LATENCY_MS = 50;
const WIDTH = 1280;
const HEIGHT = 800;

interface Args {
  build: boolean;
  /** A renderer built elsewhere to serve instead (e.g. an earlier version, to compare). */
  dir: string | null;
  seconds: number;
  configs: string[];
  trials: number;
}

function parseArgs(argv: string[]): Args {
  const a: Args = { build: true, dir: null, seconds: 5, configs: ['brief', 'software'], trials: 20 };
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--no-build') a.build = false;
    else if (argv[i] === '--seconds') a.seconds = Number(argv[++i]);
    else if (argv[i] === '--trials') a.trials = Number(argv[++i]);
    else if (argv[i] === '--config') a.configs = [argv[++i]];
    else if (argv[i] === '--dir') a.dir = argv[++i];
    else throw new Error(`unknown argument ${argv[i]}`);
  }
  return a;
}

const CONFIGS: Record<string, { label: string; args: string[] }> = {
  brief: { label: 'brief flags (compositing on SwiftShader)', args: CHROMIUM_ARGS },
  software: { label: 'software compositing (+ --disable-gpu-compositing)', args: [...CHROMIUM_ARGS, '--disable-gpu-compositing'] },
};

const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * (s.length - 1) + 0.5))];
};

/** Expressions run in the page as strings: the page's CSP forbids eval, the debugger protocol is fine. */
const js = <T>(page: Page, expression: string) => page.evaluate(expression) as Promise<T>;

async function waitFor(page: Page, expression: string, timeoutMs = 60_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await js<boolean>(page, expression).catch(() => false))) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${expression}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/**
 * Frames per second of a page that only clears a WebGL canvas every frame: the browser's
 * ceiling. With `text`, static panels of text fill the rest of the window (nothing in them
 * changes), which shows what compositing a full window costs per frame.
 */
async function ceilingFps(browser: Browser, seconds: number, text = false): Promise<number> {
  const page = await browser.newPage({ viewport: { width: WIDTH, height: HEIGHT } });
  const panel = (left: number, width: number) =>
    `<div style="position:absolute;left:${left}px;top:0;width:${width}px;height:${HEIGHT}px;overflow:hidden;font:13px sans-serif;background:#fbfbf8">${'<p>Toe 0.000 deg camber 1.25 deg trail 32.0 mm scrub radius 12.5 mm</p>'.repeat(40)}</div>`;
  const filler = text ? panel(0, 300) + panel(900, 380) + `<div style="position:absolute;left:300px;top:480px;width:600px;height:320px;overflow:hidden;font:12px sans-serif">${'<span>lean steer 0.12 deg </span>'.repeat(200)}</div>` : '';
  await page.setContent(`${filler}<canvas id="c" width="600" height="420" style="position:absolute;left:300px;top:40px"></canvas>`);
  const fps = await js<number>(
    page,
    `new Promise((done) => {
      const gl = document.getElementById('c').getContext('webgl2', { antialias: false });
      let n = 0, t0 = 0;
      const f = (t) => {
        if (!t0) t0 = t;
        gl.clearColor((n % 60) / 60, 0.5, 0.5, 1); gl.clear(gl.COLOR_BUFFER_BIT); n++;
        if (t - t0 < ${seconds * 1000}) requestAnimationFrame(f); else done((n - 1) / ((t - t0) / 1000));
      };
      requestAnimationFrame(f);
    })`,
  );
  await page.close();
  return fps;
}

interface Figures {
  renderer: string;
  ceilingFps: number;
  ceilingTextFps: number;
  fps: number;
  fpsWindows: number[];
  movingDpr: number;
  latency: number[];
}

async function measure(browser: Browser, url: string, args: Args): Promise<Figures> {
  const ceiling = await ceilingFps(browser, Math.min(3, args.seconds));
  const ceilingText = await ceilingFps(browser, Math.min(3, args.seconds), true);
  const page = await browser.newPage({ viewport: { width: WIDTH, height: HEIGHT } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(url);
  await waitFor(page, 'Boolean(window.__tiltbenchStats && window.__tiltbenchStats.frames > 0)');
  // Let start-up work settle (first charts in the worker, full-resolution frame).
  await waitFor(page, `!document.querySelector('[data-testid=sweep-progress]')`);
  await page.waitForTimeout(1000);
  const renderer = await js<string>(page, 'window.__tiltbenchStats.glRenderer');

  // Frames per second while the demo plays a lean sweep.
  await page.getByTestId('play').click();
  await page.waitForTimeout(1000);
  const windows: { fps: number; dpr: number }[] = [];
  for (let w = 0; w < 3; w++) {
    windows.push(
      await js<{ fps: number; dpr: number }>(
        page,
        `new Promise((done) => {
          const s = window.__tiltbenchStats;
          const f0 = s.frames, t0 = performance.now();
          setTimeout(() => done({ fps: (s.frames - f0) / ((performance.now() - t0) / 1000), dpr: s.dpr }), ${args.seconds * 1000});
        })`,
      ),
    );
  }
  const fps = { fps: quantile(windows.map((w) => w.fps), 0.5), dpr: windows[0].dpr };
  await page.getByTestId('play').click();
  await page.waitForTimeout(800);

  // Latency: slider input event -> readouts show the new lean -> the next frame with the new pose rendered.
  const latency: number[] = [];
  for (let k = 0; k < args.trials; k++) {
    const target = k % 2 === 0 ? 4 + (k % 7) * 2.5 : -(3 + (k % 5) * 3);
    const ms = await js<number>(
      page,
      `new Promise((done) => {
        const el = document.querySelector('[data-testid=slider-leanDeg]');
        const out = document.querySelector('[data-testid=readout-lean]');
        const stats = window.__tiltbenchStats;
        const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value').set;
        const want = (${target}).toFixed(2);
        const t0 = performance.now();
        const serial0 = stats.sceneSerial;
        setter.call(el, String(${target}));
        el.dispatchEvent(new Event('input', { bubbles: true }));
        const check = () => {
          const shown = (out.textContent || '').replace('\\u2212', '-');
          if (shown.includes(want) && stats.renderedSerial > serial0) done(performance.now() - t0);
          else requestAnimationFrame(check);
        };
        requestAnimationFrame(check);
      })`,
    );
    latency.push(ms);
    await page.waitForTimeout(350); // still again: full resolution, as a user pausing between moves
  }
  if (errors.length) throw new Error(`page errors: ${errors.join('; ')}`);
  await page.close();
  return { renderer, ceilingFps: ceiling, ceilingTextFps: ceilingText, fps: fps.fps, fpsWindows: windows.map((w) => w.fps), movingDpr: fps.dpr, latency };
}

const verdict = (ok: boolean) => (ok ? 'PASS' : 'MISS');

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  const dir = args.dir ?? (args.build ? await buildRenderer() : BUILD_DIR);
  const server = await serveStatic(dir, DESIGNS_DIR);
  console.log(`Viewport benchmark: ${WIDTH} x ${HEIGHT}, demo design playing a lean sweep, headless ${CHROMIUM_PATH}`);
  console.log(`targets: >= ${TARGET_FPS} fps while playing; < ${TARGET_LATENCY_MS} ms from a slider change to updated readouts and picture`);
  const load = () => os.loadavg().map((x) => x.toFixed(2)).join(' ');
  console.log(`machine: ${os.cpus().length} cores, load average ${load()} (1, 5, 15 min)\n`);
  try {
    for (const name of args.configs) {
      const cfg = CONFIGS[name];
      if (!cfg) throw new Error(`unknown config ${name}`);
      const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: cfg.args });
      try {
        const f = await measure(browser, server.url, args);
        const med = quantile(f.latency, 0.5);
        const p95 = quantile(f.latency, 0.95);
        console.log(`== ${cfg.label}`);
        console.log(`   WebGL renderer: ${f.renderer}`);
        console.log(`   browser ceiling, one WebGL canvas cleared per frame: ${f.ceilingFps.toFixed(1)} fps alone; ${f.ceilingTextFps.toFixed(1)} fps with static text panels around it`);
        console.log(
          `   frames per second, lean sweep playing:  ${f.fps.toFixed(1)} fps median of ${f.fpsWindows.map((x) => x.toFixed(1)).join(', ')} (pixel ratio while moving ${f.movingDpr})  target >= ${TARGET_FPS}: ${verdict(f.fps >= TARGET_FPS)}`,
        );
        console.log(`   slider -> readouts + picture latency:   median ${med.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, max ${Math.max(...f.latency).toFixed(1)} ms over ${f.latency.length} changes  target < ${TARGET_LATENCY_MS} (p95): ${verdict(p95 < TARGET_LATENCY_MS)}`);
        console.log('');
      } finally {
        await browser.close();
      }
    }
  } finally {
    await server.close();
  }
  console.log(`load average at the end: ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.stack : e);
  process.exit(1);
});
