import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_CODES_HELP, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, MAX_RANGE_VALUES, parseArgs, type ParsedArgs } from '../args';
import { limitedRange, MAX_GRID_POSES, POSE_INPUT_LIMITS, POSE_LIMITS_HELP, requireGridSize } from '../inputLimits';
import { checkOutputPath, type OutputTarget } from '../outputFile';
import { studyProgressBar } from './studyArgs';
import { quoted } from '../safeText';
import { formatOf, type TableFormat } from './sweepTable';
import { writeTableFile } from './sweepFile';
// The analysis modules are loaded when the command runs, so other commands start faster.
import type { runSweep as RunSweep, uprightReferences as UprightReferences, SweepAxes, SweepCell, SweepContact, SweepSummary } from '../../analysis/sweep';
import type { PoseEngine } from '../../analysis/PoseEngine';
import type { ResolvedDesign } from '../../design/types';
import { VERDICT_ORDER } from '../../analysis/tolerance';

export { csvValue, jsonValue } from './sweepTable';

export const sweepHelp = `tiltbench sweep <design.tiltsheet> --lean A:B:STEP --steer A:B:STEP [--travel A:B:STEP] [--hold suspension] --out FILE.csv|FILE.json
       tiltbench sweep <design.tiltsheet> --speed A:B:STEP --steer A:B:STEP --out FILE.csv|FILE.json
  With --speed (km/h) instead of --lean: the ride sweep, each pose at the lean that balances
  the turn it makes at that speed (tan(lean) = v^2 / (g R)); rows add the speed, the balance
  residual (deg) and the lateral acceleration (g) before the usual columns.
  Solves every pose of the grid lean x handlebar x travel (each range inclusive; an axis left
  out is 0) with one solver stepping warm through neighbouring poses, and writes one row per
  pose with every measure (alignment, steering, Ackermann and scrub, turning circle, joints,
  clearances, suspension, status). A pose that cannot be assembled is written with its
  status and message and no numbers. Rows are in grid order: travel, then lean, then steer.
  --lean A:B:STEP     frame roll, degrees, positive lowers the right side
  --steer A:B:STEP    handlebar angle, degrees, positive turns left
  --travel A:B:STEP   wheel travel, mm, bump positive: with the tyres on the ground the frame
                      is lowered by it (heave = -travel); see --contact
  --contact ground|travel  tyres on the ground (default), or wheel travel held relative to the frame
  --hold suspension   steering only, with the wishbones or centre members held at their design
                      position (as on a jig, to compare with bench measurements): no ground
                      contact, lean 0, travel 0; takes no --lean, --travel or --contact
  --out FILE          .csv (header row of column names with units) or .json (columns, rows,
                      definitions and the caution); never the design itself. Written whole or
                      not at all: rows go to a temporary file beside it, renamed over FILE at the
                      end; on Ctrl-C, SIGTERM or a full disk the temporary file is removed and an
                      earlier FILE is left as it was.
  A progress bar goes to stderr on a terminal; a summary line is always printed.
  ${POSE_LIMITS_HELP}
  A range gives at most ${MAX_RANGE_VALUES} values, a grid at most ${MAX_GRID_POSES} poses (a ride sweep ${20_000}).
  Exit 0 when every pose was solved, 1 when some could not be assembled (the file is still
  written), 2 for bad input. ${EXIT_CODES_HELP}`;

/** Largest grid a sweep accepts (poses). */
export const MAX_SWEEP_POSES = MAX_GRID_POSES;

/** Rows solved between two turns of the event loop (about a tenth of a second of work). */
const POSES_PER_SLICE = 2000;

/** A progress bar on stderr, drawn only on a terminal and at most every 1 %, counting poses. */
export function progressBar(io: CliIo, label: string): { update(done: number, total: number): void; end(): void } {
  return studyProgressBar(io, label, 'poses');
}

export function summaryLine(s: SweepSummary): string {
  const parts = VERDICT_ORDER.filter((k) => s.byStatus[k] > 0).map((k) => `${k} ${s.byStatus[k]}`);
  return `${s.poses} poses (${parts.join(', ') || 'none'}) in ${(s.elapsedMs / 1000).toFixed(2)} s`;
}

export function parseContact(raw: string | true | undefined): SweepContact {
  if (raw === undefined) return 'ground';
  if (raw === 'ground' || raw === 'travel') return raw;
  throw new ArgError(`option --contact: expected ground or travel, found ${raw === true ? 'no value' : quoted(raw)}`);
}

/**
 * `--hold suspension` (pose and sweep): the wishbones or members held at design, only the
 * steering moves. Refuses the options that would move the suspension or the frame.
 */
export function parseHold(args: ParsedArgs, refused: readonly string[]): 'suspension' | undefined {
  const raw = args.options.get('hold');
  if (raw === undefined) return undefined;
  if (raw !== 'suspension') throw new ArgError(`option --hold: expected suspension, found ${raw === true ? 'no value' : quoted(raw)}`);
  const given = refused.filter((n) => args.options.has(n)).map((n) => `--${n}`);
  if (given.length > 0) {
    throw new ArgError(
      `--hold suspension holds the wishbones or members at their design position and the frame upright ` +
        `(only the steering moves): it takes no ${given.join(', ')}`,
    );
  }
  return 'suspension';
}

interface SweepRequest {
  axes: SweepAxes;
  out: OutputTarget;
  format: TableFormat;
  contact: SweepContact;
  hold: 'suspension' | undefined;
  designPath: string;
}

/** The sweep's options, checked; throws ArgError naming the option at fault. */
function parseSweepArgs(argv: string[]): SweepRequest {
  const args = parseArgs(argv, { flags: [], values: ['lean', 'steer', 'travel', 'out', 'contact', 'hold'] });
  const hold = parseHold(args, ['lean', 'travel', 'contact']);
  if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
  const axes: SweepAxes = {
    leanDeg: limitedRange(args, 'lean', POSE_INPUT_LIMITS.leanDeg) ?? [0],
    handlebarDeg: limitedRange(args, 'steer', POSE_INPUT_LIMITS.handlebarDeg) ?? [0],
    travelMm: limitedRange(args, 'travel', POSE_INPUT_LIMITS.travelMm) ?? [0],
  };
  const out = args.options.get('out');
  if (out === undefined || out === true) throw new ArgError('option --out FILE.csv or FILE.json is required');
  const format = formatOf(out);
  if (!format) throw new ArgError(`option --out: the file name must end in .csv or .json, found ${quoted(out)}`);
  // Held, no row of the mechanism reads the contact; travel (all zero) keeps the frame at design height.
  const contact = hold ? 'travel' : parseContact(args.options.get('contact'));
  const poses = axes.leanDeg.length * axes.handlebarDeg.length * axes.travelMm.length;
  requireGridSize(poses, 'the grid', 'widen a STEP or narrow a range');
  const designPath = args.positionals[0];
  return { axes, out: checkOutputPath(out, '--out', [{ path: designPath, what: 'design' }]), format, contact, hold, designPath };
}

export async function runSweepCommand(argv: string[], io: CliIo): Promise<number> {
  // A speed instead of a lean: the ride sweep, each pose at its balanced lean.
  if (argv.some((a) => a === '--speed' || a.startsWith('--speed='))) {
    if (argv.some((a) => a === '--hold' || a.startsWith('--hold='))) {
      return reportArgError(new ArgError('--hold suspension steers on a jig: it takes no --speed'), io, 'sweep', sweepHelp);
    }
    const { runRideSweepCommand } = await import('./rideSweepCommand');
    return runRideSweepCommand(argv, io);
  }
  let request: SweepRequest;
  try {
    request = parseSweepArgs(argv);
  } catch (e) {
    return reportArgError(e, io, 'sweep', sweepHelp);
  }
  const { axes, out, format, contact, hold, designPath } = request;
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const design = loaded.design;
  const { runSweep, checkAxes, uprightReferences, SweepInputError } = await import('../../analysis/sweep');
  const { cellRow, poseColumns } = await import('../../analysis/poseColumns');
  const { ANALYSIS_DEFINITIONS } = await import('../../analysis/definitions');
  const { PoseEngine } = await import('../../analysis/PoseEngine');
  try {
    checkAxes(design, axes, contact);
  } catch (e) {
    if (e instanceof SweepInputError) {
      io.err(`tiltbench sweep: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  }
  const columns = poseColumns(design);
  const head = {
    tiltbench: 'sweep',
    design: loaded.path,
    name: design.name,
    caution: SAFETY_CAUTION,
    ...(hold ? { hold } : { contact }),
    axes,
    definitions: ANALYSIS_DEFINITIONS,
    columns: columns.map((c) => ({ name: c.name, unit: c.unit })),
  };
  const bar = progressBar(io, 'sweep');
  const engine = new PoseEngine(design, hold ? { contact, steerBy: 'handlebar', hold } : { contact, steerBy: 'handlebar' }, { findings: false });
  let written: Awaited<ReturnType<typeof writeTableFile<SweepSummary>>>;
  try {
    written = await writeTableFile(io, 'sweep', out, { format, columns, head }, (table, between) =>
      sweepInSlices({ design, axes, contact, engine, runSweep, uprightReferences }, (cell) => table.row(cellRow(columns, cell)), between, (d, t) => bar.update(d, t)),
    );
  } finally {
    bar.end();
  }
  if ('exit' in written) return written.exit;
  const summary = written.summary;
  io.out(`${design.name}${hold ? ' (suspension held at its design position)' : ''}: ${summaryLine(summary)}; wrote ${summary.poses} rows to ${out.given}\n`);
  if (summary.failed > 0) io.out(`${summary.failed} poses could not be assembled (status and message in their rows, no numbers)\n`);
  io.out(SAFETY_CAUTION + '\n');
  return summary.failed > 0 ? EXIT_FAILED : EXIT_OK;
}

interface SliceJob {
  design: ResolvedDesign;
  axes: SweepAxes;
  contact: SweepContact;
  engine: PoseEngine;
  // Passed in: the analysis modules are loaded when the command runs.
  runSweep: typeof RunSweep;
  uprightReferences: typeof UprightReferences;
}

/**
 * The grid a slice of rows at a time (one travel, a few leans, every handlebar value), each
 * row handed on as it comes: rows in grid order (travel, lean, handlebar), memory for one
 * row, and `between()` (a turn of the event loop) after each slice. One engine keeps the
 * solver warm from slice to slice, and the upright pass every row's ratio change refers to
 * is run once for the whole grid.
 */
async function sweepInSlices(job: SliceJob, onCell: (cell: SweepCell) => void, between: () => Promise<void>, progress: (done: number, total: number) => void): Promise<SweepSummary> {
  const { design, axes, contact, engine } = job;
  const t0 = Date.now();
  const total = axes.leanDeg.length * axes.handlebarDeg.length * axes.travelMm.length;
  const upright = job.uprightReferences(engine, axes, contact);
  const leansPerSlice = Math.max(1, Math.floor(POSES_PER_SLICE / axes.handlebarDeg.length));
  const byStatus = Object.fromEntries(VERDICT_ORDER.map((k) => [k, 0])) as SweepSummary['byStatus'];
  const sum: SweepSummary = { poses: 0, solved: 0, failed: 0, byStatus, solves: upright.solves, inRegion: 0, uprightTurns: upright.turns, elapsedMs: 0 };
  for (const travel of axes.travelMm) {
    for (let first = 0; first < axes.leanDeg.length; first += leansPerSlice) {
      const slice: SweepAxes = { leanDeg: axes.leanDeg.slice(first, first + leansPerSlice), handlebarDeg: axes.handlebarDeg, travelMm: [travel] };
      const before = sum.poses;
      const s = job.runSweep(design, slice, { contact, engine, upright, onProgress: (d) => progress(before + d, total), progressEvery: 200 }, onCell);
      addSummary(sum, s);
      await between();
    }
  }
  sum.elapsedMs = Date.now() - t0;
  return sum;
}

/** Add a slice's counts to the whole sweep's. */
function addSummary(into: SweepSummary, s: SweepSummary): void {
  into.poses += s.poses;
  into.solved += s.solved;
  into.failed += s.failed;
  into.solves += s.solves;
  into.inRegion += s.inRegion;
  for (const k of VERDICT_ORDER) into.byStatus[k] += s.byStatus[k];
}
