/**
 * `tiltbench compare`: two or more designs side by side (core/studies/variants.ts).
 */
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs } from '../args';
import { clip, MAX_ECHOED_NAME } from '../safeText';
import type { VariantsReport } from '../../studies/variants';
import type { StudyPose } from '../../studies/studyPoses';
import { POSES_HELP, parsePoses, table } from './studyArgs';

export const compareHelp = `tiltbench compare <A.tiltsheet> <B.tiltsheet> [more designs] [--poses "LEAN,HANDLEBAR[,TRAVEL];..."] [--all-hardpoints] [--check] [--json]
  Designs side by side, the first as the reference: the hardpoints that differ (each design's
  point and how far it moved from the first), other settings that differ (joint ratings,
  envelope, tolerances, ...), and the worst self-steer, slip, ratio change, Ackermann error and
  least joint margin of each over the same poses (the first design's operating-region sample
  by default), with where each is found.
  ${POSES_HELP}
  --all-hardpoints                    list every hardpoint, not only those that differ
  --check                             also run each design's check in its operating region
  Exit 0 when compared, 2 for bad input.`;

const f = (x: number | null, digits = 3) => (x === null ? '-' : x.toFixed(digits));
const xyz = (p: { x: number; y: number; z: number } | null) => (p ? `${f(p.x, 1)}, ${f(p.y, 1)}, ${f(p.z, 1)}` : '-');

export function formatCompare(r: VariantsReport): string {
  const lines = [`compare: ${r.labels.map((l, i) => `${String.fromCharCode(65 + i)} = ${l}`).join('; ')}`, `poses: ${r.poses.length} (${r.posesFrom})`, ''];
  const letters = r.labels.map((_, i) => String.fromCharCode(65 + i));
  if (r.hardpoints.length === 0) lines.push('hardpoints: the same in every design');
  else {
    lines.push('hardpoints (mm, x forward, y left, z up):');
    lines.push(...table([['point', ...letters, 'moved from A'], ...r.hardpoints.map((h) => [h.point, ...h.values.map(xyz), h.movedMm === null ? '-' : f(h.movedMm, 2)])], [0]).map((l) => '  ' + l));
  }
  lines.push('');
  if (r.settings.length === 0) lines.push('other settings: the same in every design');
  else lines.push('other settings:', ...table([['field', ...letters], ...r.settings.map((s) => [s.path, ...s.values.map((v) => clip(v ?? '-', MAX_ECHOED_NAME))])], [0]).map((l) => '  ' + l));
  lines.push('', 'over the poses:');
  const rows = [['measure', ...letters.map((l) => `${l}`), 'allowed (A)']];
  for (const res of r.results) rows.push([`${res.label} (${res.unit})`, ...res.values.map((v) => f(v)), res.limits[0] === null ? '-' : `${res.kind === 'worst' ? 'at most' : 'at least'} ${res.limits[0]}`]);
  lines.push(...table(rows, [0]).map((l) => '  ' + l));
  r.notAssembled.forEach((n, i) => {
    if (n.length > 0) lines.push(`  ${letters[i]} cannot be assembled at ${n.length} of the poses (its values over the poses are absent): ${n[0]}`);
  });
  if (r.check.some((c) => c !== null)) {
    lines.push('', 'check in the operating region:');
    r.check.forEach((c, i) => {
      if (c) lines.push(`  ${letters[i]}: ${c.passed ? 'PASS' : `FAIL (${c.over.length} over or broken: ${c.over.slice(0, 4).join('; ')}${c.over.length > 4 ? '; ...' : ''})`}`);
    });
  }
  return lines.join('\n') + '\n';
}

export async function runCompareCommand(argv: string[], io: CliIo): Promise<number> {
  let paths: string[];
  let poses: StudyPose[] | undefined;
  let all: boolean;
  let check: boolean;
  let json: boolean;
  try {
    const args = parseArgs(argv, { flags: ['json', 'all-hardpoints', 'check'], values: ['poses'] });
    if (args.positionals.length < 2) throw new ArgError(`expected at least two design files, found ${args.positionals.length}`);
    if (args.positionals.length > 8) throw new ArgError(`at most 8 designs at once, found ${args.positionals.length}`);
    paths = args.positionals;
    poses = parsePoses(args);
    all = args.options.has('all-hardpoints');
    check = args.options.has('check');
    json = args.options.has('json');
  } catch (e) {
    // A design that cannot be read is the first thing to say (its file and place), before the usage.
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'compare', compareHelp);
  }
  const loaded = [];
  for (const p of paths) {
    const l = loadDesignOrReport(p, io);
    if (!l) return EXIT_BAD_INPUT;
    loaded.push(l);
  }
  const { compareVariants } = await import('../../studies/variants');
  const { StudyInputError } = await import('../../studies/studyPoses');
  let report: VariantsReport;
  try {
    report = compareVariants(
      loaded.map((l) => ({ label: l.path, file: l.file })),
      { poses, allHardpoints: all, check },
    );
  } catch (e) {
    if (e instanceof StudyInputError) {
      io.err(`tiltbench compare: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  }
  if (json) io.out(JSON.stringify({ tiltbench: 'compare', ...report, caution: SAFETY_CAUTION }, null, 2) + '\n');
  else io.out(formatCompare(report) + '\n' + SAFETY_CAUTION + '\n');
  return EXIT_OK;
}
