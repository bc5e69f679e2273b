/**
 * Viewport speed benchmark: the built workbench in headless Debian Chromium, WebGL on
 * SwiftShader (no GPU), window 1280 x 800, the demo design.
 *
 *   frames per second  while the demo plays a lean sweep (renders counted in the page), with
 *                      the pixel ratio it plays at
 *   back to full       ms from stopping playback to the first frame at full resolution
 *   latency            from a lean-slider input event to the next rendered frame that shows
 *                      the new pose, with the readouts already showing it
 *
 * Targets (issues 4 and 11): at least 30 fps at a pixel ratio of at least 0.75, full resolution
 * within 100 ms of stopping, under 50 ms slider latency. Each figure is printed with PASS or MISS.
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
 * Responsiveness (issue 11), in the "brief flags" browser, each figure the median of several:
 *   first frame        ms from navigation start to the viewport's first rendered frame (a fresh
 *                      page each time, the bundle from the local server; the browser's very
 *                      first page, which starts its GPU process, is not counted)
 *   edit to plots      ms from a typed hardpoint edit (the Enter key) to the frame after the open
 *                      chart has drawn the curves of the edited design: once on a curve tab, once
 *                      on the envelope map at its coarse resolution
 * Targets: first frame within 2000 ms, plots within 150 ms of an edit.
 *
 * With --baseline BUILT_RENDERER the same figures (all of them) are measured for that build too (e.g. one
 * built from an earlier commit with `git archive` + buildRenderer), interleaved in the same run
 * so both meet the same machine load, and printed side by side.
 *
 * Usage: tsx test/bench/viewport.ts [--no-build | --dir BUILT_RENDERER] [--baseline BUILT_RENDERER]
 *          [--seconds N] [--trials N] [--config brief|software] [--only speed|frames] [--loads N] [--edits N]
 */
import os from 'node:os';
import { chromium, type Browser, type Page } from 'playwright-core';
import { buildRenderer, BUILD_DIR, DESIGNS_DIR } from '../e2e/support/buildRenderer';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../e2e/support/chromium';
import { serveStatic } from '../e2e/support/staticServer';

const TARGET_FPS = 30;
const TARGET_LATENCY_MS = 50;
const TARGET_FIRST_FRAME_MS = 2000;
const TARGET_EDIT_TO_PLOTS_MS = 150;
const TARGET_TO_FULL_MS = 100;
const TARGET_MOVING_DPR = 0.75;
/** Loads and edits per build for the responsiveness figures. */
const SPEED_LOADS = 4;
const SPEED_EDITS = 6;
/** The hardpoint edited (typed into its table cell), and by how much, mm. */
const EDIT_FIELD = 'hp-steering.pivot-z';
const EDIT_STEP_MM = 2;
const WIDTH = 1280;
const HEIGHT = 800;

interface Args {
  build: boolean;
  /** A renderer built elsewhere to serve instead (e.g. an earlier version, to compare). */
  dir: string | null;
  seconds: number;
  configs: string[];
  trials: number;
  /** A second build measured beside the first (first frame, edit to plots). */
  baseline: string | null;
  /** Only the responsiveness figures, or only the frames and slider latency. */
  only: 'speed' | 'frames' | null;
  /** Loads per build for the first frame, and edits per build and tab (0: first frames only). */
  loads: number;
  edits: number;
}

function parseArgs(argv: string[]): Args {
  const a: Args = { build: true, dir: null, seconds: 5, configs: ['brief', 'software'], trials: 20, baseline: null, only: null, loads: SPEED_LOADS, edits: SPEED_EDITS };
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--no-build') a.build = false;
    else if (argv[i] === '--seconds') a.seconds = Number(argv[++i]);
    else if (argv[i] === '--trials') a.trials = Number(argv[++i]);
    else if (argv[i] === '--config') a.configs = [argv[++i]];
    else if (argv[i] === '--dir') a.dir = argv[++i];
    else if (argv[i] === '--baseline') a.baseline = argv[++i];
    else if (argv[i] === '--loads') a.loads = Number(argv[++i]);
    else if (argv[i] === '--edits') a.edits = Number(argv[++i]);
    else if (argv[i] === '--only') {
      const o = argv[++i];
      if (o !== 'speed' && o !== 'frames') throw new Error(`--only takes speed or frames, not ${o}`);
      a.only = o;
    } else throw new Error(`unknown argument ${argv[i]}`);
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
  /** ms from stopping playback to a frame at full resolution. */
  toFullMs: number;
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
  // Stop, in the page (a click's own latency is not the picture's): ms from the stop to the
  // first frame drawn at full resolution again (the pixel ratio of the rendered frame where
  // the build records it, else the ratio asked for with a frame rendered after it).
  const toFull = await js<number>(
    page,
    `new Promise((done) => {
      const s = window.__tiltbenchStats;
      const full = window.devicePixelRatio >= 1 ? Math.min(2, window.devicePixelRatio) : 1;
      const t0 = performance.now();
      document.querySelector('[data-testid=play]').click();
      let asked = null;
      const check = () => {
        const now = performance.now();
        if (asked === null && s.dpr === full) asked = now;
        const drawn = s.renderedDpr !== undefined ? s.renderedDpr === full && s.lastRenderAt > t0 : asked !== null && s.lastRenderAt > asked;
        if (drawn) done(s.lastRenderAt - t0);
        else if (now - t0 > 5000) done(NaN);
        else requestAnimationFrame(check);
      };
      requestAnimationFrame(check);
    })`,
  );
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
  return { renderer, ceilingFps: ceiling, ceilingTextFps: ceilingText, fps: fps.fps, fpsWindows: windows.map((w) => w.fps), movingDpr: fps.dpr, latency, toFullMs: toFull };
}

/**
 * Records in the page, before its scripts run: when the first frame was rendered (polled each
 * animation frame from navigation on) and when the Enter key went down (the edit's start).
 */
const SPEED_INIT = `(() => {
  const m = (window.__speedBench = { firstFrame: null, editStart: null });
  const tick = () => {
    const s = window.__tiltbenchStats;
    if (s && s.frames > 0) m.firstFrame = performance.now();
    else requestAnimationFrame(tick);
  };
  requestAnimationFrame(tick);
  document.addEventListener('keydown', (e) => { if (e.key === 'Enter') m.editStart = performance.now(); }, true);
})()`;

/**
 * In the page: resolves with ms from the edit's Enter to the frame after the open chart drew the
 * result for the design's current revision (the jobs store's slot for the tab, then the chart's
 * SVG changing, then the next animation frame). Armed before the edit is typed.
 */
const ARM_EDIT = (slot: 'curves' | 'map', chart: string) => `(() => {
  const wb = window.__tiltbench;
  const m = window.__speedBench;
  m.editMs = null;
  m.editStart = null;
  const node = document.querySelector('[data-testid=${chart}]');
  let drawnAfterResult = false;
  let resultSeen = false;
  const finish = () => requestAnimationFrame(() => { m.editMs = performance.now() - m.editStart; });
  const mo = new MutationObserver(() => {
    if (resultSeen && !drawnAfterResult) { drawnAfterResult = true; mo.disconnect(); finish(); }
  });
  mo.observe(node, { subtree: true, childList: true, attributes: true, characterData: true });
  const off = wb.jobs.store.subscribe((s) => {
    if (m.editStart === null || resultSeen) return;
    if (s.${slot}.resultRevision === wb.document.getState().revision && s.${slot}.resultRevision > m.revision0) {
      resultSeen = true;
      off();
    }
  });
  m.revision0 = wb.document.getState().revision;
})()`;

interface Speed {
  firstFrameMs: number[];
  curvesMs: number[];
  mapMs: number[];
}

async function waitPlotsIdle(page: Page): Promise<void> {
  await waitFor(page, `(() => { const j = window.__tiltbench.jobs.store.getState(); return j.curves.progress === null && j.map.progress === null && !document.querySelector('[data-testid=sweep-progress]'); })()`);
}

/** One load: its first-frame time. */
async function loadRound(browser: Browser, url: string, into: Speed): Promise<void> {
  const page = await browser.newPage({ viewport: { width: WIDTH, height: HEIGHT } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.addInitScript(SPEED_INIT);
  await page.goto(url);
  await waitFor(page, 'window.__speedBench && window.__speedBench.firstFrame !== null');
  into.firstFrameMs.push(await js<number>(page, 'window.__speedBench.firstFrame'));
  if (errors.length) throw new Error(`page errors: ${errors.join('; ')}`);
  await page.close();
}

/**
 * Edit-to-plots times on the curves tab and the coarse map: one page per build, open side by
 * side, edited in turn (the order alternating edit by edit) so the machine's load lands on all.
 */
async function editRounds(browser: Browser, urls: string[], edits: number, into: Speed[]): Promise<void> {
  const errors: string[] = [];
  const pages: { page: Page; v0: number; tab: string }[] = [];
  for (const url of urls) {
    const page = await browser.newPage({ viewport: { width: WIDTH, height: HEIGHT } });
    page.on('pageerror', (e) => errors.push(e.message));
    await page.addInitScript(SPEED_INIT);
    await page.goto(url);
    await waitFor(page, `window.__tiltbench && window.__tiltbench.jobs.store.getState().curves.resultRevision >= 0`);
    await waitPlotsIdle(page);
    // A build whose hardpoint table sits behind a column tab: open it first.
    const tableTab = page.getByTestId('column-tab-hardpoints');
    if ((await tableTab.count()) > 0) await tableTab.click();
    const v0 = Number(await page.getByTestId(EDIT_FIELD).inputValue());
    pages.push({ page, v0, tab: await js<string>(page, 'window.__tiltbench.ui.getState().plots.tab') });
  }
  for (const slot of ['curves', 'map'] as const) {
    for (const { page } of pages) {
      if (slot === 'map') {
        await page.getByTestId('tab-map').click();
        await waitFor(page, `window.__tiltbench.jobs.store.getState().map.resultRevision === window.__tiltbench.document.getState().revision`);
      }
      await waitPlotsIdle(page);
    }
    await new Promise((r) => setTimeout(r, 1500));
    for (let k = 0; k < edits; k++) {
      const order = pages.map((_, b) => b);
      if (k % 2 === 1) order.reverse();
      for (const b of order) {
        const { page, v0, tab } = pages[b];
        const field = page.getByTestId(EDIT_FIELD);
        await js(page, ARM_EDIT(slot, slot === 'map' ? 'chart-map' : `chart-${tab}`));
        await field.fill((v0 + (k % 2 === 0 ? EDIT_STEP_MM : 0)).toFixed(1));
        await field.press('Enter');
        await waitFor(page, 'window.__speedBench.editMs !== null', 20_000);
        (slot === 'map' ? into[b].mapMs : into[b].curvesMs).push(await js<number>(page, 'window.__speedBench.editMs'));
        await waitPlotsIdle(page);
        await page.waitForTimeout(700); // a designer's pause between edits
      }
    }
  }
  if (errors.length) throw new Error(`page errors: ${errors.join('; ')}`);
  for (const { page } of pages) await page.close();
}

const med = (xs: number[]) => (xs.length ? quantile(xs, 0.5) : NaN);
const spread = (xs: number[]) => `${med(xs).toFixed(0).padStart(5)} ms (${Math.min(...xs).toFixed(0)}-${Math.max(...xs).toFixed(0)}, n=${xs.length})`;

async function speedFigures(args: Args, builds: { label: string; url: string }[]): Promise<void> {
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CONFIGS.brief.args });
  try {
    const figures = builds.map(() => ({ firstFrameMs: [], curvesMs: [], mapMs: [] }) as Speed);
    // The browser's first page pays for starting its GPU process (a second or more on
    // SwiftShader): one load, not counted, before any measured one.
    await loadRound(browser, builds[0].url, { firstFrameMs: [], curvesMs: [], mapMs: [] });
    // Interleaved, the order alternating round by round, so both builds meet the same load:
    // loads first, then the edits (the builds' pages open together, edited in turn).
    for (let r = 0; r < args.loads; r++) {
      const order = builds.map((_, b) => b);
      if (r % 2 === 1) order.reverse();
      for (const b of order) await loadRound(browser, builds[b].url, figures[b]);
    }
    if (args.edits > 0) await editRounds(browser, builds.map((b) => b.url), args.edits, figures);
    console.log(`== responsiveness (${CONFIGS.brief.label}), median (min-max, n)`);
    const rows: [string, (f: Speed) => number[], number][] = [
      ['first frame after load', (f) => f.firstFrameMs, TARGET_FIRST_FRAME_MS],
      ['edit to plots, curve tab', (f) => f.curvesMs, TARGET_EDIT_TO_PLOTS_MS],
      ['edit to plots, coarse map', (f) => f.mapMs, TARGET_EDIT_TO_PLOTS_MS],
    ];
    console.log(`   ${''.padEnd(28)}${builds.map((b) => b.label.padEnd(34)).join('')}target`);
    for (const [name, pick, target] of rows.filter(([, pick]) => pick(figures[0]).length > 0)) {
      const cells = figures.map((f) => `${spread(pick(f))} ${verdict(med(pick(f)) <= target)}`.padEnd(34)).join('');
      console.log(`   ${name.padEnd(28)}${cells}<= ${target} ms`);
    }
    console.log('');
  } finally {
    await browser.close();
  }
}

const verdict = (ok: boolean) => (ok ? 'PASS' : 'MISS');

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  const dir = args.dir ?? (args.build ? await buildRenderer() : BUILD_DIR);
  const server = await serveStatic(dir, DESIGNS_DIR);
  const baseServer = args.baseline ? await serveStatic(args.baseline, DESIGNS_DIR) : null;
  console.log(`Viewport benchmark: ${WIDTH} x ${HEIGHT}, demo design playing a lean sweep, headless ${CHROMIUM_PATH}`);
  console.log(`targets: >= ${TARGET_FPS} fps while playing; < ${TARGET_LATENCY_MS} ms from a slider change to updated readouts and picture`);
  const load = () => os.loadavg().map((x) => x.toFixed(2)).join(' ');
  console.log(`machine: ${os.cpus().length} cores, load average ${load()} (1, 5, 15 min)\n`);
  try {
    if (args.only !== 'frames') {
      const builds = [{ label: `this build (${args.dir ?? 'built now'})`, url: server.url }];
      if (baseServer) builds.push({ label: `baseline (${args.baseline})`, url: baseServer.url });
      await speedFigures(args, builds);
    }
    for (const name of args.only === 'speed' ? [] : args.configs) {
      const cfg = CONFIGS[name];
      if (!cfg) throw new Error(`unknown config ${name}`);
      const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: cfg.args });
      try {
        const targets = [{ label: 'this build', url: server.url }];
        if (baseServer) targets.push({ label: `baseline (${args.baseline})`, url: baseServer.url });
        console.log(`== ${cfg.label}`);
        for (const t of targets) {
        const f = await measure(browser, t.url, args);
        const med = quantile(f.latency, 0.5);
        const p95 = quantile(f.latency, 0.95);
        console.log(`  -- ${t.label}`);
        console.log(`   WebGL renderer: ${f.renderer}`);
        console.log(`   browser ceiling, one WebGL canvas cleared per frame: ${f.ceilingFps.toFixed(1)} fps alone; ${f.ceilingTextFps.toFixed(1)} fps with static text panels around it`);
        console.log(
          `   frames per second, lean sweep playing:  ${f.fps.toFixed(1)} fps median of ${f.fpsWindows.map((x) => x.toFixed(1)).join(', ')} (pixel ratio while moving ${f.movingDpr})  target >= ${TARGET_FPS} at a ratio >= ${TARGET_MOVING_DPR}: ${verdict(f.fps >= TARGET_FPS && f.movingDpr >= TARGET_MOVING_DPR)}`,
        );
        console.log(`   full resolution after playback stops:   ${f.toFullMs.toFixed(0)} ms to the first full-resolution frame  target <= ${TARGET_TO_FULL_MS}: ${verdict(f.toFullMs <= TARGET_TO_FULL_MS)}`);
        console.log(`   slider -> readouts + picture latency:   median ${med.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, max ${Math.max(...f.latency).toFixed(1)} ms over ${f.latency.length} changes  target < ${TARGET_LATENCY_MS} (p95): ${verdict(p95 < TARGET_LATENCY_MS)}`);
        }
        console.log('');
      } finally {
        await browser.close();
      }
    }
  } finally {
    await server.close();
    await baseServer?.close();
  }
  console.log(`load average at the end: ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.stack : e);
  process.exit(1);
});
