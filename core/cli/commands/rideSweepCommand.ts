/**
 * `tiltbench sweep --speed A:B:STEP --steer A:B:STEP`: the ride sweep (core/analysis/
 * rideSweep.ts), each pose at the lean that balances its turn at that speed. Rows carry the
 * speed, the balance residual and the lateral acceleration before the usual pose columns (the
 * lean column holds the balanced lean found).
 */
import { closeSync, writeSync } from 'node:fs';
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs, rangeOption } from '../args';
import type { RideAxes, RideCell, RideSweepSummary } from '../../analysis/rideSweep';
import type { CellValue } from '../../analysis/poseColumns';
import { csvValue, jsonValue, openOutput, parseContact, progressBar, sweepHelp } from './sweep';

/** Largest ride grid (poses): each pose takes a few solves to find its balance. */
export const MAX_RIDE_POSES = 20_000;

interface RideRequest {
  axes: RideAxes;
  out: string;
  format: 'csv' | 'json';
  designPath: string;
  contact: ReturnType<typeof parseContact>;
}

/** The ride sweep's options, checked; throws ArgError naming the option at fault. */
function parseRideArgs(argv: string[]): RideRequest {
  const args = parseArgs(argv, { flags: [], values: ['speed', 'steer', 'out', 'contact', 'lean', 'travel'] });
  if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
  if (args.options.has('lean')) throw new ArgError('give either --lean or --speed, not both (the speed sets the lean)');
  if (args.options.has('travel')) throw new ArgError('--speed sweeps ride at design travel: leave out --travel');
  const speed = rangeOption(args, 'speed', 'km/h');
  const steer = rangeOption(args, 'steer', 'degrees');
  if (!speed || !steer) throw new ArgError('a ride sweep needs both --speed A:B:STEP (km/h) and --steer A:B:STEP (degrees)');
  if (speed.some((v) => v < 0)) throw new ArgError('option --speed: speeds must be 0 km/h or more');
  if (speed.length * steer.length > MAX_RIDE_POSES) {
    throw new ArgError(`${speed.length * steer.length} poses is too many for a ride sweep (at most ${MAX_RIDE_POSES}): widen a STEP`);
  }
  const out = args.options.get('out');
  if (typeof out !== 'string') throw new ArgError('option --out FILE.csv|FILE.json is required');
  let format: 'csv' | 'json';
  if (/\.csv$/i.test(out)) format = 'csv';
  else if (/\.json$/i.test(out)) format = 'json';
  else throw new ArgError(`option --out: expected a .csv or .json file, found "${out}"`);
  return { axes: { speedKmh: speed, handlebarDeg: steer }, out, format, designPath: args.positionals[0], contact: parseContact(args.options.get('contact')) };
}

export async function runRideSweepCommand(argv: string[], io: CliIo): Promise<number> {
  let request: RideRequest;
  try {
    request = parseRideArgs(argv);
  } catch (e) {
    return reportArgError(e, io, 'sweep', sweepHelp);
  }
  const { axes, out, format, designPath, contact } = request;
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const design = loaded.design;
  if (contact === 'travel' && design.frontEnd.kind === 'centrePivot') {
    io.err('tiltbench sweep: a ride sweep puts the tyres on the ground (leave out --contact travel)\n');
    return EXIT_BAD_INPUT;
  }
  const { runRideSweep } = await import('../../analysis/rideSweep');
  const { cellRow, poseColumns } = await import('../../analysis/poseColumns');
  const { ANALYSIS_DEFINITIONS } = await import('../../analysis/definitions');
  const columns = poseColumns(design);
  const head = [
    { name: 'speedKmh', unit: 'km/h' },
    { name: 'balanceResidualDeg', unit: 'deg' },
    { name: 'lateralG', unit: 'g' },
    { name: 'rideNotes', unit: '' },
    ...columns.map((c) => ({ name: c.name, unit: c.unit })),
  ];
  const values = (r: RideCell): CellValue[] => [r.speedKmh, r.balanceResidualDeg, r.lateralG, r.notes.join('; '), ...cellRow(columns, r.cell)];
  const fd = openOutput(out, io);
  if (fd === null) return EXIT_BAD_INPUT;
  const write = (t: string) => writeSync(fd, t);
  let first = true;
  const emit = (r: RideCell) => {
    if (format === 'csv') write(values(r).map(csvValue).join(',') + '\n');
    else {
      write((first ? '\n    ' : ',\n    ') + JSON.stringify(values(r).map(jsonValue)));
      first = false;
    }
  };
  if (format === 'csv') write(head.map((h) => csvValue(h.name)).join(',') + '\n');
  else {
    const text = JSON.stringify({ tiltbench: 'ride sweep', design: loaded.path, name: design.name, caution: SAFETY_CAUTION, axes, riding: design.riding, definitions: ANALYSIS_DEFINITIONS, columns: head }, null, 2);
    write(text.slice(0, text.lastIndexOf('}')).trimEnd() + ',\n  "rows": [');
  }
  const bar = progressBar(io, 'ride sweep');
  let summary: RideSweepSummary;
  // Rows come serpentine along the handlebar; each speed's row is written in ascending order.
  let row: RideCell[] = [];
  try {
    summary = runRideSweep(design, axes, { contact, onProgress: (d, t) => bar.update(d, t) }, (cell) => {
      row[cell.cell.handlebarIndex] = cell;
      if (row.filter(Boolean).length === axes.handlebarDeg.length) {
        row.forEach(emit);
        row = [];
      }
    });
    if (format === 'json') write(`\n  ],\n  "summary": ${JSON.stringify(summary)}\n}\n`);
  } finally {
    bar.end();
    closeSync(fd);
  }
  io.out(
    `${design.name}: ${summary.poses} ride poses (${summary.solved} solved, ${summary.failed} not assembled, ${summary.unbalanced} without a balance inside the lean limit) ` +
      `in ${(summary.elapsedMs / 1000).toFixed(2)} s; wrote ${summary.poses} rows to ${out}\n`,
  );
  io.out(SAFETY_CAUTION + '\n');
  return summary.failed > 0 ? EXIT_FAILED : EXIT_OK;
}
