import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs, type ParsedArgs } from '../args';
import { readInputFile } from '../readInputFile';
import { clip, MAX_ECHOED_NAME, quoted } from '../safeText';
// The study modules are loaded when the command runs, so other commands start faster.
import type { Spread, SpreadMethod, ToleranceReport } from '../../studies/toleranceSpread';
import type { Distribution, ToleranceBands } from '../../studies/toleranceBands';
import type { StudyPose } from '../../studies/studyPoses';
import { POSES_HELP, boundedOption, countOption, parsePoses, stopOnInterrupt, studyProgressBar, table } from './studyArgs';

/** Limits, stated in the help and refused (exit 2) beyond. */
export const TOLERANCE_LIMITS = { monteCarloSamples: 20_000, firstOrderSamples: 1_000_000, bandMm: 5, bandsFileBytes: 1024 * 1024 };
/** Samples when none are asked for: a few seconds of full solves on a demo design. */
export const DEFAULT_SAMPLES = 200;
/** Share of samples that must be inside every tolerance for exit 0. */
export const REQUIRED_WITHIN = 0.95;

export const toleranceHelp = `tiltbench tolerance <design.tiltsheet> [--samples N] [--seed S] [--band MM] [--bands FILE.json] [--distribution normal|uniform] [--method monte-carlo|first-order] [--poses "LEAN,HANDLEBAR[,TRAVEL];..."] [--json]
  How far self-steer, slip (toe mismatch) and the joint margins scatter over built vehicles whose
  hardpoints are off by their manufacturing tolerances: every point's x, y and z on each side off
  independently within +-band. Reports the design as drawn, mean, standard deviation, the 5th,
  50th and 95th percentiles and a histogram of each, the share of samples inside the design's
  tolerances, and which tolerances drive the spread (first-order estimate from the sensitivity:
  sigma^2 = sum (dq/dx_i sigma_i)^2, printed beside the sampled spread).
  --samples N                         samples (default ${DEFAULT_SAMPLES}): 1 to ${TOLERANCE_LIMITS.monteCarloSamples} for monte-carlo,
                                      1 to ${TOLERANCE_LIMITS.firstOrderSamples} for first-order
  --seed S                            seed of the random errors, a whole number 0 to 4294967295
                                      (default 1; the same seed gives the same numbers)
  --band MM                           +- band of every coordinate (default 0.5, at most ${TOLERANCE_LIMITS.bandMm})
  --bands FILE.json                   bands of particular points, mm: {"frontEnd.lower.outerJoint": 0.2,
                                      "upright.wheelCentre.right": {"z": 0.5}} (points as the
                                      hardpoint table's CSV names them; 0 leaves a point exact)
  --distribution normal|uniform       normal (default): the band is 3 standard deviations, 99.73 % of
                                      parts inside it; uniform: every error within the band equally likely
  --method monte-carlo|first-order    monte-carlo (default): every sample solved afresh at every pose;
                                      first-order: the design's values plus the sensitivity times the
                                      errors (fast; blind to curvature and to samples that would not assemble)
  ${POSES_HELP}
  --json                              machine-readable output (every pose, histogram and driver)
  A progress bar goes to stderr on a terminal; Ctrl-C stops and reports the samples finished.
  Exit 0 when every sample was assembled and at least ${REQUIRED_WITHIN * 100} % of them keep self-steer, slip
  and every joint margin within the design's tolerances over the poses; 1 when a sample (or the
  design as drawn, at a given pose) cannot be assembled, fewer than ${REQUIRED_WITHIN * 100} % are within, or the
  study was stopped; 2 for bad input.`;

function readBands(args: ParsedArgs, band: number): ToleranceBands {
  const path = args.options.get('bands');
  if (path === undefined) return { defaultMm: band };
  if (path === true) throw new ArgError('option --bands needs a file name');
  const read = readInputFile(path, TOLERANCE_LIMITS.bandsFileBytes, 'bands file');
  if (!read.ok) throw new ArgError(`option --bands: ${read.message}`);
  let points: unknown;
  try {
    points = JSON.parse(read.text);
  } catch (e) {
    throw new ArgError(`option --bands: ${path} is not JSON: ${(e as Error).message}`);
  }
  if (typeof points !== 'object' || points === null || Array.isArray(points)) throw new ArgError(`option --bands: ${path} must hold one object of point: band`);
  return { defaultMm: band, points: points as ToleranceBands['points'] };
}

const fmt = (x: number | null | undefined, unit: string, d = 3) => (x === null || x === undefined ? '-' : `${x.toFixed(d)} ${unit}`);
const pct = (x: number | null) => (x === null ? '-' : `${(100 * x).toFixed(1)} %`);

function spreadRows(spreads: Spread[]): string[] {
  const rows = [['measure', 'as drawn', 'mean', 'std', '5 %', '50 %', '95 %', 'within tolerance', 'first-order std']];
  for (const s of spreads) {
    const m = s.summary;
    rows.push([s.label, fmt(s.nominal, s.unit), fmt(m?.mean, s.unit), fmt(m?.std, s.unit, 4), fmt(m?.p5, s.unit), fmt(m?.p50, s.unit), fmt(m?.p95, s.unit), pct(s.withinTolerance), fmt(s.firstOrderSigma, s.unit, 4)]);
  }
  return table(rows).map((l) => '  ' + l);
}

function histogramLines(s: Spread): string[] {
  const h = s.summary?.histogram;
  if (!h || h.counts.length === 0) return [];
  const most = Math.max(...h.counts);
  const lines = [`histogram of ${s.label} (${s.unit}; ${s.summary!.count} samples):`];
  h.counts.forEach((k, i) => {
    const bar = '#'.repeat(Math.round((40 * k) / most));
    lines.push(`  ${h.edges[i].toFixed(3).padStart(9)} .. ${h.edges[i + 1].toFixed(3).padStart(9)}  ${bar} ${k}`);
  });
  return lines;
}

function driverLine(s: Spread): string {
  if (s.drivers.length === 0) return `  ${s.label}: no first-order estimate (a moved copy could not be assembled)`;
  const parts = s.drivers.map((d) => `${d.point} ${d.direction} ${d.sharePct.toFixed(0)} % (${d.perMm >= 0 ? '+' : ''}${d.perMm.toFixed(3)} ${s.unit}/mm, band ${d.bandMm} mm)`);
  return `  ${s.label}: ${parts.join('; ')}`;
}

export function formatTolerance(r: ToleranceReport, showPoses: boolean): string {
  const bands = [...new Set(r.bands.map((b) => b.bandMm))];
  const poses =
    r.posesFrom === 'given'
      ? `${r.poses.length} given`
      : `${r.poses.length} from a 5 x 5 lean x handlebar grid over the envelope at zero travel, those in the operating region`;
  const headline = r.overPoses.filter((s) => ['selfSteer', 'slip', 'jointMargin'].includes(s.id));
  const lines = [
    `${clip(r.design, MAX_ECHOED_NAME)}: tolerance spread over built vehicles`,
    `  method: ${r.methodWords}`,
    `  errors: x, y and z of every hardpoint on each side off independently, band +-${bands.join(' / +-')} mm (${r.bands.length} coordinates), ${r.distributionWords}; seed ${r.seed}`,
    `  poses: ${poses}`,
    `  samples: ${r.samplesAsked} asked, ${r.samplesDone} done, ${r.samplesMeasured} measured` + (r.method === 'monte-carlo' ? `, ${r.notAssembled} could not be assembled` : ''),
    `  within every tolerance (self-steer, slip and joint margins over the poses): ${pct(r.withinAll)} of the samples measured`,
    '',
    'over the poses (worst or least of all poses and wheels):',
    ...spreadRows(r.overPoses),
    '',
  ];
  for (const s of headline) lines.push(...histogramLines(s), '');
  lines.push('what drives the spread (first order: the share of the variance from each tolerance, largest five):');
  for (const s of headline) lines.push(driverLine(s));
  if (showPoses) lines.push('', 'at each pose:', ...spreadRows(r.atPoses));
  else lines.push('', `(the spread at each of the ${r.poses.length} poses is in --json, or printed here with --poses)`);
  if (r.notAssembledExamples.length > 0) lines.push('', 'samples that could not be assembled (first few):', ...r.notAssembledExamples.map((m) => `  ${m}`));
  if (r.notAssembledNominal.length > 0) lines.push('', 'poses the design as drawn cannot be assembled at (left out):', ...r.notAssembledNominal.map((m) => `  ${m}`));
  if (r.rateFailures.length > 0) {
    lines.push(
      '',
      `${r.rateFailures.length} coordinates moved alone give a design that cannot be assembled at some poses; their rates are missing there, so first-order values over those poses are absent:`,
      ...r.rateFailures.slice(0, 5).map((m) => `  ${m}`),
      ...(r.rateFailures.length > 5 ? [`  and ${r.rateFailures.length - 5} more`] : []),
    );
  }
  if (r.cancelled) lines.push('', `stopped before the end: ${r.samplesDone} of ${r.samplesAsked} samples`);
  lines.push('', `time: sensitivity ${(r.elapsedMs.sensitivity / 1000).toFixed(1)} s, sampling ${(r.elapsedMs.sampling / 1000).toFixed(1)} s`);
  return lines.join('\n') + '\n';
}

function choice<T extends string>(args: ParsedArgs, name: string, values: readonly T[], fallback: T): T {
  const raw = args.options.get(name);
  if (raw === undefined) return fallback;
  if (raw === true || !(values as readonly string[]).includes(raw)) throw new ArgError(`option --${name}: expected ${values.join(' or ')}, found ${raw === true ? 'no value' : quoted(raw)}`);
  return raw as T;
}

export async function runToleranceCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let samples: number;
  let seed: number;
  let bands: ToleranceBands;
  let distribution: Distribution;
  let method: SpreadMethod;
  let poses: StudyPose[] | undefined;
  let json: boolean;
  try {
    const args = parseArgs(argv, { flags: ['json'], values: ['samples', 'seed', 'band', 'bands', 'distribution', 'method', 'poses'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    method = choice(args, 'method', ['monte-carlo', 'first-order'] as const, 'monte-carlo');
    const most = method === 'monte-carlo' ? TOLERANCE_LIMITS.monteCarloSamples : TOLERANCE_LIMITS.firstOrderSamples;
    samples = countOption(args, 'samples', 'samples', DEFAULT_SAMPLES, 1, most);
    seed = countOption(args, 'seed', 'seed', 1, 0, 0xffffffff);
    bands = readBands(args, boundedOption(args, 'band', 'mm', 0.5, 0, TOLERANCE_LIMITS.bandMm));
    distribution = choice(args, 'distribution', ['normal', 'uniform'] as const, 'normal');
    poses = parsePoses(args);
    json = args.options.has('json');
  } catch (e) {
    return reportArgError(e, io, 'tolerance', toleranceHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const { runToleranceSpread } = await import('../../studies/toleranceSpread');
  const { StudyInputError } = await import('../../studies/studyPoses');
  const bar = studyProgressBar(io, 'tolerance', 'steps (2 solved copies per coordinate, then 1 per sample)');
  const interrupt = stopOnInterrupt(io);
  let report: ToleranceReport;
  try {
    report = runToleranceSpread(loaded.file, { samples, seed, bands, distribution, method, poses, onProgress: (d, t) => bar.update(d, t), shouldStop: interrupt.shouldStop });
  } catch (e) {
    if (e instanceof StudyInputError) {
      io.err(`tiltbench tolerance: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  } finally {
    bar.end();
    interrupt.release();
  }
  if (json) {
    const { design: name, ...rest } = report;
    io.out(JSON.stringify({ tiltbench: 'tolerance', design: loaded.path, name, ...rest, caution: SAFETY_CAUTION }, null, 2) + '\n');
  } else {
    io.out(formatTolerance(report, poses !== undefined) + '\n' + SAFETY_CAUTION + '\n');
  }
  const problem = report.cancelled || report.notAssembled > 0 || report.notAssembledNominal.length > 0 || report.withinAll === null || report.withinAll < REQUIRED_WITHIN;
  return problem ? EXIT_FAILED : EXIT_OK;
}
