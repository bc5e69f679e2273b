/**
 * `tiltbench report`: the workshop report of one design (core/report) as a self-contained HTML
 * file, or as PDF printed from that HTML by headless Chromium. The output goes through the
 * CLI's one output path (checked first, temporary file, renamed), never over the design.
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { accessSync, constants, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, isAbsolute, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_CANNOT_WRITE, EXIT_CODES_HELP, EXIT_OK } from '../io';
import { ArgError, parseArgs } from '../args';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { checkOutputPath, writeWholeOutput, type OutputTarget } from '../outputFile';
import { MAX_DESIGN_BYTES } from '../loadDesignFile';
import { clip, MAX_ECHOED_NAME, quoted } from '../safeText';
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

export const reportHelp = `tiltbench report <design.tiltsheet> --out REPORT.html|REPORT.pdf [--chromium PATH] [--with-sensitivity] [--with-tolerance N [--seed S]] [--lean-step DEG] [--steer-step DEG] [--travel-step MM] [--map-step DEG]
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
  --with-sensitivity    add the sensitivity study (as 'tiltbench sensitivity' by default)
  --with-tolerance N    add the tolerance spread of N Monte Carlo samples (+-0.5 mm on every
                        coordinate, normal; at most ${MAX_REPORT_SAMPLES}); --seed S (default 1)
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

/** Print an HTML file to PDF with headless Chromium; resolves to the PDF's bytes. */
export function printToPdf(chromium: string, htmlPath: string, pdfPath: string, profileDir: string): Promise<Uint8Array> {
  const args = [
    '--headless',
    '--no-sandbox',
    '--disable-gpu',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
    `--user-data-dir=${profileDir}`,
    '--no-pdf-header-footer',
    `--print-to-pdf=${pdfPath}`,
    pathToFileURL(htmlPath).href,
  ];
  return new Promise((resolve, reject) => {
    execFile(chromium, args, { timeout: PDF_TIMEOUT_MS, killSignal: 'SIGKILL', maxBuffer: 4 * 1024 * 1024 }, (error, _stdout, stderr) => {
      let bytes: Buffer | null = null;
      try {
        bytes = readFileSync(pdfPath);
      } catch {
        bytes = null;
      }
      if (bytes && bytes.length > 4 && bytes.subarray(0, 5).toString('latin1') === '%PDF-') return resolve(bytes);
      const why = error ? (error.killed ? `it did not finish within ${PDF_TIMEOUT_MS / 1000} s` : error.message.split('\n')[0]) : 'it wrote no PDF';
      const lastLine = String(stderr).trim().split('\n').filter((l) => !/dbus|DBus/.test(l)).pop() ?? '';
      reject(new Error(`Chromium (${chromium}) could not print the report: ${why}${lastLine ? `; it said: ${clip(lastLine, 200)}` : ''}`));
    });
  });
}

export async function runReportCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let target: OutputTarget;
  let pdf: boolean;
  let chromiumFlag: string | undefined;
  let sensitivity: boolean;
  let tolerance: { samples: number; seed: number } | undefined;
  let checkSteps: { leanDeg: number; handlebarDeg: number; travelMm: number };
  let mapStepDeg: number;
  try {
    const args = parseArgs(argv, { flags: ['with-sensitivity'], values: ['out', 'chromium', 'with-tolerance', 'seed', 'lean-step', 'steer-step', 'travel-step', 'map-step'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    const outPath = args.options.get('out');
    if (outPath === undefined || outPath === true) throw new ArgError('give --out REPORT.html or --out REPORT.pdf');
    const lower = outPath.toLowerCase();
    if (!lower.endsWith('.html') && !lower.endsWith('.htm') && !lower.endsWith('.pdf')) throw new ArgError(`--out: the report is written to a .html or .pdf file, found ${quoted(clip(outPath, 80))}`);
    pdf = lower.endsWith('.pdf');
    const c = args.options.get('chromium');
    if (c === true) throw new ArgError('option --chromium needs a path');
    chromiumFlag = c;
    if (chromiumFlag !== undefined && !pdf) throw new ArgError('option --chromium is for a PDF report (--out FILE.pdf)');
    sensitivity = args.options.has('with-sensitivity');
    if (args.options.has('with-tolerance')) {
      tolerance = { samples: countOption(args, 'with-tolerance', 'samples', undefined, 1, MAX_REPORT_SAMPLES), seed: countOption(args, 'seed', 'seed', 1, 0, 0xffffffff) };
    } else if (args.options.has('seed')) throw new ArgError('option --seed is for --with-tolerance N');
    checkSteps = {
      leanDeg: boundedOption(args, 'lean-step', 'degrees', 1, 0, 90),
      handlebarDeg: boundedOption(args, 'steer-step', 'degrees', 1, 0, 90),
      travelMm: boundedOption(args, 'travel-step', 'mm', 10, 0, 1000),
    };
    mapStepDeg = boundedOption(args, 'map-step', 'degrees', DEFAULT_MAP_STEP_DEG, 0.1, MAX_MAP_STEP_DEG);
    target = checkOutputPath(outPath, '--out', [{ path: designPath, what: 'design' }]);
  } catch (e) {
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'report', reportHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const { checkGridPoses } = await import('../../analysis/designCheck');
  try {
    requireGridSize(checkGridPoses(loaded.design, checkSteps, 'ground'), 'the envelope grid at these steps', 'give a larger --lean-step, --steer-step or --travel-step');
    const mapCells = (n: number) => 2 * Math.ceil(n / mapStepDeg - 1e-9) + 1;
    requireGridSize(mapCells(loaded.design.envelope.leanDeg) * mapCells(loaded.design.envelope.handlebarDeg), 'the envelope map at this --map-step', 'give a larger --map-step');
  } catch (e) {
    return reportArgError(e, io, 'report', reportHelp);
  }
  // Before any work: a PDF needs a browser.
  let chromium: string | null = null;
  if (pdf) {
    const found = findChromium(chromiumFlag);
    if (found.path === null) {
      io.err(
        `tiltbench report: no Chromium to print the PDF with: tried ${found.tried}. Install Chromium (Debian: apt-get install chromium), ` +
          `name it with --chromium PATH or TILTBENCH_CHROMIUM, or write --out REPORT.html and print that from a browser. Nothing was written.\n`,
      );
      return EXIT_BAD_INPUT;
    }
    chromium = found.path;
  }
  const bytes = readFileSync(loaded.path);
  if (bytes.length > MAX_DESIGN_BYTES) throw new Error('the design file grew while it was read');
  const sha256 = createHash('sha256').update(bytes).digest('hex');

  const { gatherReport } = await import('../../report/gatherReport');
  const { reportHtml } = await import('../../report/reportHtml');
  const name = clip(loaded.file.name, MAX_ECHOED_NAME);
  const data = gatherReport(
    { file: loaded.file, design: loaded.design, fileName: designPath, sha256, madeAt: new Date().toISOString().replace(/\.\d{3}Z$/, 'Z') },
    { sensitivity, tolerance, checkSteps, mapStepDeg, onStage: (s) => io.isTty && io.err(`\rreport: ${s}...`.padEnd(40)) },
  );
  if (io.isTty) io.err('\r' + ' '.repeat(40) + '\r');
  const html = reportHtml(data);
  if (!pdf) {
    writeWholeOutput(target, html);
    io.out(`${name}: wrote the report (${(html.length / 1024).toFixed(0)} kB of HTML) to ${target.given}\n`);
    return EXIT_OK;
  }
  const work = mkdtempSync(join(tmpdir(), 'tiltbench-report-'));
  try {
    const htmlPath = join(work, 'report.html');
    writeFileSync(htmlPath, html);
    let pdfBytes: Uint8Array;
    try {
      pdfBytes = await printToPdf(chromium!, htmlPath, join(work, 'report.pdf'), join(work, 'profile'));
    } catch (e) {
      io.err(`tiltbench report: ${(e as Error).message}. Nothing was written.\n`);
      return EXIT_CANNOT_WRITE;
    }
    writeWholeOutput(target, pdfBytes);
    io.out(`${name}: wrote the report (${(pdfBytes.length / 1024).toFixed(0)} kB of PDF, printed by ${chromium}) to ${target.given}\n`);
    return EXIT_OK;
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
