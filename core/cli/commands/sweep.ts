import { closeSync, openSync, writeSync } from 'node:fs';
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs, rangeOption, type ParsedArgs } from '../args';
import { studyProgressBar } from './studyArgs';
// The analysis modules are loaded when the command runs, so other commands start faster.
import type { SweepAxes, SweepCell, SweepContact, SweepSummary } from '../../analysis/sweep';
import type { CellValue, Column } from '../../analysis/poseColumns';
import { VERDICT_ORDER } from '../../analysis/tolerance';

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
                      definitions and the caution)
  A progress bar goes to stderr on a terminal; a summary line is always printed.
  Exit 0 when every pose was solved, 1 when some could not be assembled (the file is still
  written), 2 for bad input.`;

/** Largest grid a sweep accepts (poses). */
export const MAX_SWEEP_POSES = 2_000_000;

/** A progress bar on stderr, drawn only on a terminal and at most every 1 %, counting poses. */
export function progressBar(io: CliIo, label: string): { update(done: number, total: number): void; end(): void } {
  return studyProgressBar(io, label, 'poses');
}

export function csvValue(v: CellValue): string {
  if (v === null) return '';
  if (typeof v === 'number') return String(Math.round(v * 1e6) / 1e6);
  return /[",\n\r]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

export function jsonValue(v: CellValue): CellValue {
  return typeof v === 'number' ? Math.round(v * 1e6) / 1e6 : v;
}

/** Open a sweep's output file, or say why not (null). */
export function openOutput(out: string, io: CliIo): number | null {
  try {
    return openSync(out, 'w');
  } catch (e) {
    io.err(`tiltbench sweep: cannot write ${out}: ${(e as Error).message}\n`);
    return null;
  }
}

export function summaryLine(s: SweepSummary): string {
  const parts = VERDICT_ORDER.filter((k) => s.byStatus[k] > 0).map((k) => `${k} ${s.byStatus[k]}`);
  return `${s.poses} poses (${parts.join(', ') || 'none'}) in ${(s.elapsedMs / 1000).toFixed(2)} s`;
}

export function parseContact(raw: string | true | undefined): SweepContact {
  if (raw === undefined) return 'ground';
  if (raw === 'ground' || raw === 'travel') return raw;
  throw new ArgError(`option --contact: expected ground or travel, found "${String(raw)}"`);
}

/**
 * `--hold suspension` (pose and sweep): the wishbones or members held at design, only the
 * steering moves. Refuses the options that would move the suspension or the frame.
 */
export function parseHold(args: ParsedArgs, refused: readonly string[]): 'suspension' | undefined {
  const raw = args.options.get('hold');
  if (raw === undefined) return undefined;
  if (raw !== 'suspension') throw new ArgError(`option --hold: expected suspension, found "${String(raw)}"`);
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
  out: string;
  format: 'csv' | 'json';
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
    leanDeg: rangeOption(args, 'lean', 'degrees') ?? [0],
    handlebarDeg: rangeOption(args, 'steer', 'degrees') ?? [0],
    travelMm: rangeOption(args, 'travel', 'mm') ?? [0],
  };
  const out = args.options.get('out');
  if (out === undefined || out === true) throw new ArgError('option --out FILE.csv or FILE.json is required');
  const lower = out.toLowerCase();
  let format: 'csv' | 'json';
  if (lower.endsWith('.csv')) format = 'csv';
  else if (lower.endsWith('.json')) format = 'json';
  else throw new ArgError(`option --out: the file name must end in .csv or .json, found "${out}"`);
  // Held, no row of the mechanism reads the contact; travel (all zero) keeps the frame at design height.
  const contact = hold ? 'travel' : parseContact(args.options.get('contact'));
  const poses = axes.leanDeg.length * axes.handlebarDeg.length * axes.travelMm.length;
  if (poses > MAX_SWEEP_POSES) throw new ArgError(`the grid has ${poses} poses; a sweep takes at most ${MAX_SWEEP_POSES}`);
  return { axes, out, format, contact, hold, designPath: args.positionals[0] };
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
  const { runSweep, checkAxes, SweepInputError } = await import('../../analysis/sweep');
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
  const fd = openOutput(out, io);
  if (fd === null) return EXIT_BAD_INPUT;
  const columns: Column[] = poseColumns(design);
  const nL = axes.leanDeg.length;
  const nS = axes.handlebarDeg.length;
  // Cells arrive a row (one lean, all handlebar values) at a time in serpentine lean order;
  // buffer one travel layer and write it in grid order.
  let layer: string[] = new Array(nL * nS);
  let layerCount = 0;
  let firstJsonRow = true;
  const write = (text: string) => writeSync(fd, text);
  const rowText = (cell: SweepCell): string => {
    const values = cellRow(columns, cell);
    if (format === 'csv') return values.map(csvValue).join(',') + '\n';
    return JSON.stringify(values.map(jsonValue));
  };
  const flushLayer = () => {
    for (const text of layer) {
      if (text === undefined) continue;
      if (format === 'csv') write(text);
      else {
        write((firstJsonRow ? '\n    ' : ',\n    ') + text);
        firstJsonRow = false;
      }
    }
    layer = new Array(nL * nS);
    layerCount = 0;
  };
  if (format === 'csv') {
    write(columns.map((c) => csvValue(c.name)).join(',') + '\n');
  } else {
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
    const text = JSON.stringify(head, null, 2);
    write(text.slice(0, text.lastIndexOf('}')).trimEnd() + ',\n  "rows": [');
  }
  const bar = progressBar(io, 'sweep');
  let summary: SweepSummary;
  try {
    // Held, the sweep runs on an engine built in that mode (runSweep's own is free to move).
    const engine = hold ? new PoseEngine(design, { contact, steerBy: 'handlebar', hold }, { findings: false }) : undefined;
    summary = runSweep(design, axes, { contact, engine, onProgress: (d, t) => bar.update(d, t), progressEvery: 200 }, (cell) => {
      layer[cell.leanIndex * nS + cell.handlebarIndex] = rowText(cell);
      layerCount++;
      if (layerCount === nL * nS) flushLayer();
    });
    if (layerCount > 0) flushLayer();
    if (format === 'json') write(`\n  ],\n  "summary": ${JSON.stringify(summary)}\n}\n`);
  } finally {
    bar.end();
    closeSync(fd);
  }
  io.out(`${design.name}${hold ? ' (suspension held at its design position)' : ''}: ${summaryLine(summary)}; wrote ${summary.poses} rows to ${out}\n`);
  if (summary.failed > 0) io.out(`${summary.failed} poses could not be assembled (status and message in their rows, no numbers)\n`);
  io.out(SAFETY_CAUTION + '\n');
  return summary.failed > 0 ? EXIT_FAILED : EXIT_OK;
}
