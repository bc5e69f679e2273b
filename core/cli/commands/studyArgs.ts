/** What the study commands (sensitivity, tolerance) share: their pose option, progress bar, Ctrl-C and tables. */
import { ArgError, numberOption, type ParsedArgs } from '../args';
import { POSE_INPUT_LIMITS, requireWithin } from '../inputLimits';
import { quoted } from '../safeText';
import type { CliIo } from '../io';
import type { StudyPose } from '../../studies/studyPoses';

/** Most poses a study takes (each is solved once per design copy). */
export const MAX_STUDY_POSES = 50;

export const POSES_HELP = `--poses "LEAN,HANDLEBAR[,TRAVEL];..."  poses to study instead of the region sample: lean and
                                      handlebar in degrees, travel in mm (tyres on the ground,
                                      travel lowers the frame); at most ${MAX_STUDY_POSES}, lean within
                                      +-${POSE_INPUT_LIMITS.leanDeg.most} deg, handlebar +-${POSE_INPUT_LIMITS.handlebarDeg.most} deg, travel +-${POSE_INPUT_LIMITS.travelMm.most} mm`;

/** `--poses "20,-5;-10,5,10"`: lean, handlebar and optional travel per pose, separated by ';'. */
export function parsePoses(args: ParsedArgs): StudyPose[] | undefined {
  const raw = args.options.get('poses');
  if (raw === undefined) return undefined;
  if (raw === true) throw new ArgError('option --poses needs a list "LEAN,HANDLEBAR[,TRAVEL];..."');
  const items = raw.split(';').map((s) => s.trim()).filter((s) => s !== '');
  if (items.length === 0) throw new ArgError('option --poses: no pose given');
  if (items.length > MAX_STUDY_POSES) throw new ArgError(`option --poses: ${items.length} poses is too many (at most ${MAX_STUDY_POSES})`);
  return items.map((item, k) => {
    const parts = item.split(',').map((p) => p.trim());
    const values = parts.map(Number);
    if (parts.length < 2 || parts.length > 3 || parts.some((p) => p === '') || values.some((v) => !Number.isFinite(v))) {
      throw new ArgError(`option --poses, pose ${k + 1} ${quoted(item)}: expected LEAN,HANDLEBAR or LEAN,HANDLEBAR,TRAVEL (degrees, degrees, mm)`);
    }
    const where = `option --poses, pose ${k + 1}`;
    return {
      leanDeg: requireWithin(values[0], POSE_INPUT_LIMITS.leanDeg, `${where}, lean`),
      handlebarDeg: requireWithin(values[1], POSE_INPUT_LIMITS.handlebarDeg, `${where}, handlebar`),
      travelMm: requireWithin(values[2] ?? 0, POSE_INPUT_LIMITS.travelMm, `${where}, travel`),
    };
  });
}

/** A number option inside (lo, hi], with the unit in the message. */
export function boundedOption(args: ParsedArgs, name: string, unit: string, fallback: number, lo: number, hi: number): number {
  const v = numberOption(args, name, unit, fallback);
  if (!(v > lo && v <= hi)) throw new ArgError(`option --${name}: expected more than ${lo} and at most ${hi} ${unit}, found ${v}`);
  return v;
}

/** A whole-number option in [lo, hi]; required when there is no fallback. */
export function countOption(args: ParsedArgs, name: string, what: string, fallback: number | undefined, lo: number, hi: number): number {
  const raw = args.options.get(name);
  if (raw === undefined) {
    if (fallback === undefined) throw new ArgError(`option --${name} is required (a whole number of ${what} from ${lo} to ${hi})`);
    return fallback;
  }
  const v = raw === true ? NaN : Number(raw);
  if (raw === true || raw.trim() === '' || !Number.isInteger(v) || v < lo || v > hi) {
    throw new ArgError(`option --${name}: expected a whole number of ${what} from ${lo} to ${hi}, found ${raw === true ? 'no value' : quoted(raw)}`);
  }
  return v;
}

/** A progress bar on stderr, drawn only on a terminal and at most every 1 %, counting what the study counts. */
export function studyProgressBar(io: CliIo, label: string, unit: string): { update(done: number, total: number): void; end(): void } {
  let last = -1;
  let drawn = false;
  return {
    update(done, total) {
      if (!io.isTty || total <= 0) return;
      const pct = Math.floor((100 * done) / total);
      if (pct === last) return;
      last = pct;
      const width = 30;
      const filled = Math.round((width * Math.min(done, total)) / total);
      io.err(`\r${label} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${String(pct).padStart(3)}% ${done}/${total} ${unit}`);
      drawn = true;
    },
    end() {
      if (drawn) io.err('\n');
    },
  };
}

/** Ctrl-C asks the study to stop (it reports what it finished); a second Ctrl-C is Node's default. */
export function stopOnInterrupt(io: CliIo): { shouldStop(): boolean; release(): void } {
  let stop = false;
  const handler = () => {
    stop = true;
    io.err('\nstopping after the current step (Ctrl-C again to quit at once)\n');
    process.removeListener('SIGINT', handler);
  };
  process.on('SIGINT', handler);
  return { shouldStop: () => stop, release: () => process.removeListener('SIGINT', handler) };
}

/** Rows of cells as aligned text: the first column left-aligned, the others right-aligned unless `left` names them. */
export function table(rows: string[][], left: number[] = [0]): string[] {
  const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => (r[i] ?? '').length)));
  return rows.map((r) => r.map((cell, i) => (left.includes(i) ? cell.padEnd(widths[i]) : cell.padStart(widths[i]))).join('  ').trimEnd());
}
