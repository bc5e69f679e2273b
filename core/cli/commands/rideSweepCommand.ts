/**
 * `tiltbench sweep --speed A:B:STEP --steer A:B:STEP`: the ride sweep (core/analysis/
 * rideSweep.ts), each pose at the lean that balances its turn at that speed. Rows carry the
 * speed, the balance residual and the lateral acceleration before the usual pose columns (the
 * lean column holds the balanced lean found).
 */
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs } from '../args';
import { limitedRange, POSE_INPUT_LIMITS } from '../inputLimits';
import { checkOutputPath, type OutputTarget } from '../outputFile';
import { quoted } from '../safeText';
import type { RideAxes, RideCell, RideSweepSummary } from '../../analysis/rideSweep';
import type { CellValue } from '../../analysis/poseColumns';
import { parseContact, progressBar, sweepHelp } from './sweep';
import { formatOf, type TableFormat } from './sweepTable';
import { writeTableFile } from './sweepFile';

/** Largest ride grid (poses): each pose takes a few solves to find its balance. */
export const MAX_RIDE_POSES = 20_000;

/** Ride poses solved between two turns of the event loop (each speed's slice has its own engine). */
const RIDE_POSES_PER_SLICE = 400;

interface RideRequest {
  axes: RideAxes;
  out: OutputTarget;
  format: TableFormat;
  designPath: string;
  contact: ReturnType<typeof parseContact>;
}

/** The ride sweep's options, checked; throws ArgError naming the option at fault. */
function parseRideArgs(argv: string[]): RideRequest {
  const args = parseArgs(argv, { flags: [], values: ['speed', 'steer', 'out', 'contact', 'lean', 'travel'] });
  if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
  if (args.options.has('lean')) throw new ArgError('give either --lean or --speed, not both (the speed sets the lean)');
  if (args.options.has('travel')) throw new ArgError('--speed sweeps ride at design travel: leave out --travel');
  const speed = limitedRange(args, 'speed', POSE_INPUT_LIMITS.speedKmh);
  const steer = limitedRange(args, 'steer', POSE_INPUT_LIMITS.handlebarDeg);
  if (!speed || !steer) throw new ArgError('a ride sweep needs both --speed A:B:STEP (km/h) and --steer A:B:STEP (degrees)');
  if (speed.some((v) => v < 0)) throw new ArgError('option --speed: speeds must be 0 km/h or more');
  if (speed.length * steer.length > MAX_RIDE_POSES) {
    throw new ArgError(`${speed.length * steer.length} poses is too many for a ride sweep (at most ${MAX_RIDE_POSES}): widen a STEP`);
  }
  const out = args.options.get('out');
  if (typeof out !== 'string') throw new ArgError('option --out FILE.csv|FILE.json is required');
  const format = formatOf(out);
  if (!format) throw new ArgError(`option --out: expected a .csv or .json file, found ${quoted(out)}`);
  const designPath = args.positionals[0];
  const contact = parseContact(args.options.get('contact'));
  return { axes: { speedKmh: speed, handlebarDeg: steer }, out: checkOutputPath(out, '--out', [{ path: designPath, what: 'design' }]), format, designPath, contact };
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
  const jsonHead = { tiltbench: 'ride sweep', design: loaded.path, name: design.name, caution: SAFETY_CAUTION, axes, riding: design.riding, definitions: ANALYSIS_DEFINITIONS, columns: head };
  const bar = progressBar(io, 'ride sweep');
  const total = axes.speedKmh.length * axes.handlebarDeg.length;
  let written: Awaited<ReturnType<typeof writeTableFile<RideSweepSummary>>>;
  try {
    written = await writeTableFile(io, 'sweep', out, { format, columns: head, head: jsonHead }, async (table, between) => {
      // A few speeds at a time, a turn of the event loop between; rows come serpentine along the
      // handlebar, and each speed's row is written in ascending order.
      const n = axes.handlebarDeg.length;
      const speedsPerSlice = Math.max(1, Math.floor(RIDE_POSES_PER_SLICE / n));
      const sum: RideSweepSummary = { poses: 0, solved: 0, failed: 0, unbalanced: 0, elapsedMs: 0 };
      for (let first = 0; first < axes.speedKmh.length; first += speedsPerSlice) {
        let row: RideCell[] = [];
        let filled = 0;
        const before = sum.poses;
        const slice = { speedKmh: axes.speedKmh.slice(first, first + speedsPerSlice), handlebarDeg: axes.handlebarDeg };
        const s = runRideSweep(design, slice, { contact, onProgress: (d) => bar.update(before + d, total) }, (cell) => {
          row[cell.cell.handlebarIndex] = cell;
          if (++filled === n) {
            for (const r of row) table.row(values(r));
            row = [];
            filled = 0;
          }
        });
        sum.poses += s.poses;
        sum.solved += s.solved;
        sum.failed += s.failed;
        sum.unbalanced += s.unbalanced;
        sum.elapsedMs += s.elapsedMs;
        await between();
      }
      return sum;
    });
  } finally {
    bar.end();
  }
  if ('exit' in written) return written.exit;
  const summary = written.summary;
  io.out(
    `${design.name}: ${summary.poses} ride poses (${summary.solved} solved, ${summary.failed} not assembled, ${summary.unbalanced} without a balance inside the lean limit) ` +
      `in ${(summary.elapsedMs / 1000).toFixed(2)} s; wrote ${summary.poses} rows to ${out.given}\n`,
  );
  io.out(SAFETY_CAUTION + '\n');
  return summary.failed > 0 ? EXIT_FAILED : EXIT_OK;
}
