/**
 * `tiltbench report`: the workshop report of one design (core/report) as a self-contained HTML
 * file, or as PDF printed from that HTML by headless Chromium. The output goes through the
 * CLI's one output path (checked first, temporary file, renamed), never over the design.
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { accessSync, constants, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, delimiter, isAbsolute, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_CANNOT_WRITE, EXIT_CODES_HELP, EXIT_INTERRUPTED, EXIT_OK } from '../io';
import { nextTurn, watchInterrupts } from '../interrupts';
import { SweepInputError } from '../../analysis/sweep';
import { StudyInputError } from '../../studies/studyPoses';
import { ArgError, parseArgs } from '../args';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { checkOutputPath, writeWholeOutput, type OutputTarget } from '../outputFile';
import { MAX_DESIGN_BYTES } from '../loadDesignFile';
import { clip, MAX_ECHOED_NAME, quoted } from '../safeText';
import { crop, decodePng, encodePng } from '../png';
import { boundedOption, countOption } from './studyArgs';
import { requireGridSize } from '../inputLimits';
import { DEFAULT_MAP_STEP_DEG } from '../../report/gatherReport';

/** Chromium gets this long to print the report. */
export const PDF_TIMEOUT_MS = 120_000;
/** The most Monte Carlo samples a report's tolerance study takes (the study's own command allows more). */
export const MAX_REPORT_SAMPLES = 2000;
/** Coarsest envelope map a report draws, deg. */
export const MAX_MAP_STEP_DEG = 30;
/** Names tried on the PATH when neither --chromium nor TILTBENCH_CHROMIUM names a browser. */
export const CHROMIUM_NAMES = ['chromium', 'chromium-browser', 'google-chrome', 'google-chrome-stable'];

export const reportHelp = `tiltbench report <design.tiltsheet> --out REPORT.html|REPORT.pdf [--plots FOLDER [--png]] [--chromium PATH] [--with-sensitivity] [--with-tolerance N [--seed S]] [--with-tune PLAN.json] [--lean-step DEG] [--steer-step DEG] [--travel-step MM] [--map-step DEG]
  The workshop report of the design, one document: name, SHA-256 of the design file, date,
  units, axes and sign conventions; the hardpoint table; alignment at design position; the
  curves and the envelope map with the operating region (the workbench's charts, as SVG); the
  limits table of 'tiltbench check' (worst value, where, verdict) and the steering limits;
  turning circles at full lock; front and side elevations and a plan view of the front end with
  numbered hardpoints and dimensions; the design's notes; the safety caution.
  --out FILE.html       a self-contained HTML file (no scripts, nothing fetched)
  --out FILE.pdf        PDF printed from that HTML by headless Chromium, found by --chromium
                        PATH, else the TILTBENCH_CHROMIUM environment variable, else
                        ${CHROMIUM_NAMES.join(', ')} on the PATH
  --plots FOLDER        also (or, without --out, only) every chart of the report as its own SVG
                        file in FOLDER (lean-steer.svg, ..., envelope-map.svg: the workbench's
                        charts at its size); --png adds a PNG of each at twice that size, drawn
                        by headless Chromium (found as for a PDF)
  --with-sensitivity    add the sensitivity study (as 'tiltbench sensitivity' by default)
  --with-tolerance N    add the tolerance spread of N Monte Carlo samples (+-0.5 mm on every
                        coordinate, normal; at most ${MAX_REPORT_SAMPLES}); --seed S (default 1)
  --with-tune PLAN.json add what a tune with that plan (as 'tiltbench tune --plan') would change:
                        every objective and constraint before and after, and the moves; the
                        rest of the report stays the design as drawn
  --lean-step DEG, --steer-step DEG, --travel-step MM
                        grid of the limits table, as 'tiltbench check' (default 1, 1, 10)
  --map-step DEG        cell size of the envelope map (default ${DEFAULT_MAP_STEP_DEG}, at most ${MAX_MAP_STEP_DEG})
  Never writes over the design. Exit 0 when the report is written (a design that fails its
  check still gets its report: the result is on it), 2 for bad input or when no Chromium is
  found for a PDF (nothing is written), 74 when Chromium fails to print it. ${EXIT_CODES_HELP}`;

/** A Chromium to print with: the flag, the environment, the PATH; null with the places tried. */
export function findChromium(flag: string | undefined, env: NodeJS.ProcessEnv = process.env): { path: string } | { path: null; tried: string } {
  const usable = (p: string) => {
    try {
      const st = statSync(p);
      if (!st.isFile()) return false;
      accessSync(p, constants.X_OK);
      return true;
    } catch {
      return false;
    }
  };
  if (flag !== undefined) return usable(flag) ? { path: flag } : { path: null, tried: `--chromium ${quoted(flag)} (no executable file there)` };
  const fromEnv = env.TILTBENCH_CHROMIUM;
  if (fromEnv) return usable(fromEnv) ? { path: fromEnv } : { path: null, tried: `TILTBENCH_CHROMIUM=${quoted(fromEnv)} (no executable file there)` };
  const dirs = (env.PATH ?? '').split(delimiter).filter((d) => d && isAbsolute(d));
  for (const name of CHROMIUM_NAMES) for (const d of dirs) if (usable(join(d, name))) return { path: join(d, name) };
  return { path: null, tried: `${CHROMIUM_NAMES.join(', ')} on the PATH` };
}

/** Flags every Chromium run gets: headless, no sandbox (containers), no GPU, nothing fetched in the background. */
function chromiumArgs(profileDir: string): string[] {
  return ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', `--user-data-dir=${profileDir}`];
}

/** Run Chromium on a page; resolves to the file it was to write, when that begins with `magic`. */
function runChromium(chromium: string, args: string[], outPath: string, magic: Buffer, what: string, stopped: () => boolean = () => false): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    // A Ctrl-C or SIGTERM seen while Chromium works ends it too.
    const abort = new AbortController();
    const poll = setInterval(() => stopped() && abort.abort(), 50);
    execFile(chromium, args, { timeout: PDF_TIMEOUT_MS, killSignal: 'SIGKILL', maxBuffer: 4 * 1024 * 1024, signal: abort.signal }, (error, _stdout, stderr) => {
      clearInterval(poll);
      if (abort.signal.aborted) return reject(new Error('stopped'));
      let bytes: Buffer | null = null;
      try {
        bytes = readFileSync(outPath);
      } catch {
        bytes = null;
      }
      if (bytes && bytes.length > magic.length && bytes.subarray(0, magic.length).equals(magic)) return resolve(bytes);
      const why = error ? (error.killed ? `it did not finish within ${PDF_TIMEOUT_MS / 1000} s` : error.message.split('\n')[0]) : 'it wrote nothing';
      const lastLine = String(stderr).trim().split('\n').filter((l) => !/dbus|DBus/.test(l)).pop() ?? '';
      reject(new Error(`Chromium (${chromium}) could not ${what}: ${why}${lastLine ? `; it said: ${clip(lastLine, 200)}` : ''}`));
    });
  });
}

/** Print an HTML file to PDF with headless Chromium; resolves to the PDF's bytes. */
export function printToPdf(chromium: string, htmlPath: string, pdfPath: string, profileDir: string, stopped?: () => boolean): Promise<Uint8Array> {
  const args = [...chromiumArgs(profileDir), '--no-pdf-header-footer', `--print-to-pdf=${pdfPath}`, pathToFileURL(htmlPath).href];
  return runChromium(chromium, args, pdfPath, Buffer.from('%PDF-'), 'print the report', stopped);
}

/** Pixels per SVG unit in the PNG plots (twice the workbench's size, for print). */
export const PNG_SCALE = 2;

/**
 * The plots as PNG: every SVG on one page, one above the other, photographed once by headless
 * Chromium at PNG_SCALE and cut into one picture per plot.
 */
export async function plotsToPng(chromium: string, plots: readonly { svg: string; width: number; height: number }[], work: string, stopped?: () => boolean): Promise<Buffer[]> {
  const width = Math.max(...plots.map((p) => p.width));
  const height = plots.reduce((h, p) => h + p.height, 0);
  const page =
    '<!DOCTYPE html><html><head><meta charset="utf-8"><style>html,body{margin:0;padding:0;background:#fff}div{overflow:hidden}svg{display:block}</style></head><body>' +
    plots.map((p) => `<div style="width:${p.width}px;height:${p.height}px">${p.svg}</div>`).join('') +
    '</body></html>';
  const htmlPath = join(work, 'plots.html');
  writeFileSync(htmlPath, page);
  const shot = join(work, 'plots.png');
  const args = [...chromiumArgs(join(work, 'profile')), '--hide-scrollbars', '--default-background-color=ffffffff', `--force-device-scale-factor=${PNG_SCALE}`, `--window-size=${width},${height}`, `--screenshot=${shot}`, pathToFileURL(htmlPath).href];
  const picture = decodePng(await runChromium(chromium, args, shot, Buffer.from([0x89, 0x50, 0x4e, 0x47]), 'draw the plots', stopped));
  if (picture.width < width * PNG_SCALE || picture.height < height * PNG_SCALE) throw new Error(`Chromium drew the plots at ${picture.width} x ${picture.height} pixels, not ${width * PNG_SCALE} x ${height * PNG_SCALE}`);
  let y = 0;
  return plots.map((p) => {
    const png = encodePng(crop(picture, 0, y * PNG_SCALE, p.width * PNG_SCALE, p.height * PNG_SCALE));
    y += p.height;
    return png;
  });
}

export async function runReportCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let target: OutputTarget | null;
  let plotsDir: string | null;
  let pdf: boolean;
  let png: boolean;
  let chromiumFlag: string | undefined;
  let sensitivity: boolean;
  let tolerance: { samples: number; seed: number } | undefined;
  let tunePlanPath: string | undefined;
  let checkSteps: { leanDeg: number; handlebarDeg: number; travelMm: number };
  let mapStepDeg: number;
  try {
    const args = parseArgs(argv, { flags: ['with-sensitivity', 'png'], values: ['out', 'plots', 'chromium', 'with-tolerance', 'with-tune', 'seed', 'lean-step', 'steer-step', 'travel-step', 'map-step'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    const outPath = args.options.get('out');
    const plots = args.options.get('plots');
    if (outPath === true) throw new ArgError('option --out needs a file name');
    if (plots === true) throw new ArgError('option --plots needs a folder');
    if (outPath === undefined && plots === undefined) throw new ArgError('give --out REPORT.html or --out REPORT.pdf (or --plots FOLDER)');
    const lower = outPath?.toLowerCase() ?? '';
    if (outPath !== undefined && !lower.endsWith('.html') && !lower.endsWith('.htm') && !lower.endsWith('.pdf')) throw new ArgError(`--out: the report is written to a .html or .pdf file, found ${quoted(clip(outPath, 80))}`);
    pdf = lower.endsWith('.pdf');
    png = args.options.has('png');
    if (png && plots === undefined) throw new ArgError('option --png is for --plots FOLDER');
    const c = args.options.get('chromium');
    if (c === true) throw new ArgError('option --chromium needs a path');
    chromiumFlag = c;
    if (chromiumFlag !== undefined && !pdf && !png) throw new ArgError('option --chromium is for a PDF report (--out FILE.pdf) or PNG plots (--png)');
    sensitivity = args.options.has('with-sensitivity');
    if (args.options.has('with-tolerance')) {
      tolerance = { samples: countOption(args, 'with-tolerance', 'samples', undefined, 1, MAX_REPORT_SAMPLES), seed: countOption(args, 'seed', 'seed', 1, 0, 0xffffffff) };
    } else if (args.options.has('seed')) throw new ArgError('option --seed is for --with-tolerance N');
    const tp = args.options.get('with-tune');
    if (tp === true) throw new ArgError('option --with-tune needs a plan file (as tiltbench tune --plan takes)');
    tunePlanPath = tp;
    if (outPath === undefined && (sensitivity || tolerance || tunePlanPath)) throw new ArgError('the studies go into the report: give --out REPORT.html or REPORT.pdf');
    checkSteps = {
      leanDeg: boundedOption(args, 'lean-step', 'degrees', 1, 0, 90),
      handlebarDeg: boundedOption(args, 'steer-step', 'degrees', 1, 0, 90),
      travelMm: boundedOption(args, 'travel-step', 'mm', 10, 0, 1000),
    };
    mapStepDeg = boundedOption(args, 'map-step', 'degrees', DEFAULT_MAP_STEP_DEG, 0.1, MAX_MAP_STEP_DEG);
    target = outPath === undefined ? null : checkOutputPath(outPath, '--out', [{ path: designPath, what: 'design' }, ...(tunePlanPath ? [{ path: tunePlanPath, what: 'plan' }] : [])]);
    plotsDir = plots ?? null;
    if (plotsDir !== null) {
      let isFolder = false;
      try {
        isFolder = statSync(plotsDir).isDirectory();
      } catch {
        isFolder = false;
      }
      if (!isFolder) throw new ArgError(`--plots ${quoted(clip(plotsDir, 80))}: not a folder; name an existing folder for the plots`);
    }
  } catch (e) {
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'report', reportHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  let tune: { plan: import('../../studies/tunePlan').TunePlan; variables: import('../../studies/tunePlan').ResolvedVariable[]; planName: string } | undefined;
  if (tunePlanPath !== undefined) {
    const { readPlan } = await import('./tune');
    const { readTunePlan, TunePlanError } = await import('../../studies/tunePlan');
    const read = readPlan(tunePlanPath);
    if (!read.ok) {
      io.err(`tiltbench report: ${read.message}\n`);
      return EXIT_BAD_INPUT;
    }
    try {
      tune = { ...readTunePlan(read.json, loaded.file), planName: basename(tunePlanPath) };
    } catch (e) {
      if (!(e instanceof TunePlanError)) throw e;
      io.err(`tiltbench report: ${tunePlanPath}: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
  }
  const { checkGridPoses } = await import('../../analysis/designCheck');
  const { PLOT_FILES } = await import('../../report/plots');
  let plotTargets: OutputTarget[] = [];
  try {
    requireGridSize(checkGridPoses(loaded.design, checkSteps, 'ground'), 'the envelope grid at these steps', 'give a larger --lean-step, --steer-step or --travel-step');
    const mapCells = (n: number) => 2 * Math.ceil(n / mapStepDeg - 1e-9) + 1;
    requireGridSize(mapCells(loaded.design.envelope.leanDeg) * mapCells(loaded.design.envelope.handlebarDeg), 'the envelope map at this --map-step', 'give a larger --map-step');
    if (plotsDir !== null) {
      const inputs = [{ path: designPath, what: 'design' }];
      plotTargets = PLOT_FILES.flatMap((n) => [checkOutputPath(join(plotsDir!, `${n}.svg`), '--plots', inputs), ...(png ? [checkOutputPath(join(plotsDir!, `${n}.png`), '--plots', inputs)] : [])]);
    }
  } catch (e) {
    return reportArgError(e, io, 'report', reportHelp);
  }
  // Before any work: a PDF and PNG plots need a browser.
  let chromium: string | null = null;
  if (pdf || png) {
    const found = findChromium(chromiumFlag);
    if (found.path === null) {
      io.err(
        `tiltbench report: no Chromium to ${pdf ? 'print the PDF' : 'draw the PNG plots'} with: tried ${found.tried}. Install Chromium (Debian: apt-get install chromium), ` +
          `name it with --chromium PATH or TILTBENCH_CHROMIUM, or write --out REPORT.html and print that from a browser. Nothing was written.\n`,
      );
      return EXIT_BAD_INPUT;
    }
    chromium = found.path;
  }
  const name = clip(loaded.file.name, MAX_ECHOED_NAME);
  const progress = (s: string) => io.isTty && io.err(`\rreport: ${s}...`.padEnd(40));
  const clearProgress = () => io.isTty && io.err('\r' + ' '.repeat(40) + '\r');
  // Ctrl-C or SIGTERM: seen between the steps (the analyses run synchronously), it ends Chromium
  // if it runs, removes the working folder and writes nothing.
  const watch = watchInterrupts();
  const stopped = () => watch.received() !== null;
  const stop = (): number => {
    const signal = watch.received()!;
    clearProgress();
    io.err(`tiltbench report: stopped by ${signal === 'SIGINT' ? 'Ctrl-C (SIGINT)' : 'SIGTERM'}; nothing was written\n`);
    return EXIT_INTERRUPTED[signal];
  };
  const work = mkdtempSync(join(tmpdir(), 'tiltbench-report-'));
  try {
    await nextTurn();
    if (stopped()) return stop();
    // The plots first (their sweeps are the report's), all made before anything is written.
    let report: { text: string | Uint8Array; words: string } | null = null;
    let curves, map;
    if (target) {
      const bytes = readFileSync(loaded.path);
      if (bytes.length > MAX_DESIGN_BYTES) throw new Error('the design file grew while it was read');
      const sha256 = createHash('sha256').update(bytes).digest('hex');
      const { gatherReport } = await import('../../report/gatherReport');
      const { reportHtml } = await import('../../report/reportHtml');
      const data = gatherReport(
        { file: loaded.file, design: loaded.design, fileName: designPath, sha256, madeAt: new Date().toISOString().replace(/\.\d{3}Z$/, 'Z') },
        { sensitivity, tolerance, ...(tune ? { tune } : {}), checkSteps, mapStepDeg, onStage: progress },
      );
      ({ curves, map } = data);
      await nextTurn();
      if (stopped()) return stop();
      const html = reportHtml(data);
      if (!pdf) report = { text: html, words: `${(html.length / 1024).toFixed(0)} kB of HTML` };
      else {
        const htmlPath = join(work, 'report.html');
        writeFileSync(htmlPath, html);
        progress('printing');
        try {
          const bytes = await printToPdf(chromium!, htmlPath, join(work, 'report.pdf'), join(work, 'profile'), stopped);
          report = { text: bytes, words: `${(bytes.length / 1024).toFixed(0)} kB of PDF, printed by ${chromium}` };
        } catch (e) {
          if (stopped()) return stop();
          clearProgress();
          io.err(`tiltbench report: ${(e as Error).message}. Nothing was written.\n`);
          return EXIT_CANNOT_WRITE;
        }
      }
    }
    let plotFiles: (string | Uint8Array)[] = [];
    if (plotsDir !== null) {
      const { computeCurves, computeMap } = await import('../../report/chartSweeps');
      const { renderPlots } = await import('../../report/plots');
      progress('plots');
      curves ??= computeCurves({ design: loaded.file });
      map ??= computeMap({ design: loaded.file, angleStepDeg: mapStepDeg });
      const plots = renderPlots(curves, map);
      await nextTurn();
      if (stopped()) return stop();
      let pngs: Buffer[] = [];
      if (png) {
        try {
          pngs = await plotsToPng(chromium!, plots, work, stopped);
        } catch (e) {
          if (stopped()) return stop();
          clearProgress();
          io.err(`tiltbench report: ${(e as Error).message}. Nothing was written.\n`);
          return EXIT_CANNOT_WRITE;
        }
      }
      plotFiles = plots.flatMap((p, k) => [p.svg, ...(png ? [pngs[k]] : [])]);
    }
    await nextTurn();
    if (stopped()) return stop();
    clearProgress();
    if (target && report) {
      writeWholeOutput(target, report.text);
      io.out(`${name}: wrote the report (${report.words}) to ${target.given}\n`);
    }
    plotTargets.forEach((t, k) => writeWholeOutput(t, plotFiles[k]));
    if (plotsDir !== null) io.out(`${name}: wrote ${PLOT_FILES.length} plots as SVG${png ? ' and PNG' : ''} to ${plotsDir} (${PLOT_FILES.map((n) => n).join(', ')})\n`);
    return EXIT_OK;
  } catch (e) {
    // A design the analyses refuse (an envelope or riding block a sweep cannot take): bad input, as for check.
    if (e instanceof SweepInputError || e instanceof StudyInputError) {
      clearProgress();
      io.err(`tiltbench report: ${e.message}; nothing was written\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  } finally {
    rmSync(work, { recursive: true, force: true });
    watch.release();
  }
}
