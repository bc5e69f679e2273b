import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs } from '../args';
import { clip, MAX_ECHOED_NAME } from '../safeText';
// The study modules are loaded when the command runs, so other commands start faster.
import type { CoordinateSensitivity, ObjectiveSummary, SensitivityReport } from '../../studies/sensitivity';
import type { StudyPose } from '../../studies/studyPoses';
import { oppositeDirection } from '../../studies/studyCoordinates';
import { POSES_HELP, boundedOption, countOption, parsePoses, stopOnInterrupt, studyProgressBar, table } from './studyArgs';

/** Largest central-difference step, mm: beyond it the rate is no longer a rate at the design. */
export const MAX_STEP_MM = 5;

export const sensitivityHelp = `tiltbench sensitivity <design.tiltsheet> [--poses "LEAN,HANDLEBAR[,TRAVEL];..."] [--step MM] [--each-side] [--top N] [--json]
  How much each objective and each joint margin moves per mm of each hardpoint coordinate, which
  way, ranked by effect: worst self-steer, worst slip angle (toe mismatch), worst Ackermann error,
  worst steering-ratio change and the least margin of every joint over the poses. Found by central
  differences of the full solve: each coordinate is moved +-STEP mm in the design, the copy solved
  afresh at every pose, and the same at +-STEP/2 to check the rate is linear over the step.
  Poses: by default the cells of a 5 x 5 lean x handlebar grid over the envelope (zero travel) that
  lie in the operating region. Directions: x forward, z up; y outward for a point on each side
  (away from the centre line), to the left for a centre point.
  ${POSES_HELP}
  --step MM                           central-difference step (default 0.5, at most ${MAX_STEP_MM})
  --each-side                         move each side's point alone (default: mirrored pairs together)
  --top N                             sentences for the N largest effects (default 10)
  --json                              machine-readable output (every rate, per pose too)
  A progress bar goes to stderr on a terminal; Ctrl-C stops the study and prints what it finished.
  Exit 0 when every design copy was solved at every pose, 1 when the design or a moved copy cannot
  be assembled at a study pose (those rates are missing) or the study was stopped, 2 for bad input.`;

const f = (x: number | null, unit: string, digits = 3) => (x === null ? '-' : `${x.toFixed(digits)} ${unit}`);

function rate(c: CoordinateSensitivity, id: string, unit: string): string {
  const r = c.objectives[id];
  if (!r || r.perMm === null) return '-';
  const digits = Math.abs(r.perMm) >= 0.01 ? 3 : 4;
  const t = r.perMm.toFixed(digits);
  return `${Number(t) > 0 ? '+' : ''}${Number(t) === 0 ? (0).toFixed(digits) : t} ${unit}${r.linear === false ? '*' : ''}`;
}

function posesLine(r: SensitivityReport): string {
  if (r.posesFrom === 'given') return `poses: ${r.poses.length} given`;
  const s = r.regionSample!;
  return (
    `poses: ${r.poses.length} from a 5 x 5 lean x handlebar grid over the envelope at zero travel, those in the operating region ` +
    `(${s.outside} cells outside it${s.notAssembled > 0 ? `, ${s.notAssembled} not assembled` : ''} left out)`
  );
}

function designLines(objectives: ObjectiveSummary[]): string[] {
  const rows = [['measure (over the poses)', 'value', 'allowed', 'where']];
  for (const o of objectives) {
    if (o.id.startsWith('joint.')) continue;
    const allowed = o.tolerance === null ? '-' : o.kind === 'worst' ? `at most ${o.tolerance} ${o.unit}` : `at least ${o.tolerance} ${o.unit}`;
    rows.push([o.label, f(o.value, o.unit), allowed, o.where ?? '-']);
  }
  return table(rows, [0, 2, 3]).map((l) => '  ' + l);
}

/** Which objective a coordinate moves most (against its tolerance), and which way improves it. */
function hint(c: CoordinateSensitivity, r: SensitivityReport): string | null {
  let best: { o: ObjectiveSummary; share: number; perMm: number } | null = null;
  for (const o of r.objectives) {
    const perMm = c.objectives[o.id]?.perMm;
    // A worst that passes to another pose within the step has no one way to improve it.
    if (o.id.startsWith('joint.') || o.tolerance === null || perMm === null || perMm === undefined || c.objectives[o.id].linear === false) continue;
    const share = Math.abs(perMm) / o.tolerance;
    if (!best || share > best.share) best = { o, share, perMm };
  }
  if (!best || best.share === 0) return null;
  const { o, perMm } = best;
  const improveUp = o.kind === 'worst' ? perMm < 0 : perMm > 0;
  const goal = o.kind === 'worst' ? `lower the ${o.label}` : `raise the ${o.label}`;
  return `to ${goal}: move ${improveUp ? c.coordinate.direction : oppositeDirection(c.coordinate.direction)} (1 mm uses ${(100 * best.share).toFixed(0)} % of its tolerance)`;
}

const JOINT_SHORT: Record<string, string> = { upperOuter: 'UO', lowerOuter: 'LO', tieRodOuter: 'TO', tieRodInner: 'TI' };

export function formatSensitivity(r: SensitivityReport, top: number): string {
  const lines = [
    `${clip(r.design, MAX_ECHOED_NAME)}: sensitivity of the objectives to the hardpoints`,
    `  method: ${r.method}`,
    `  ${posesLine(r)}`,
    `  ${r.sides === 'together' ? 'mirrored pairs move together (both sides as mirror images)' : 'each side of a pair moves alone'}; ` +
      'directions: x forward, z up, y outward for a point on each side, to the left for a centre point',
    '',
    'the design as it is:',
    ...designLines(r.objectives),
    '',
    `largest effects, ${Math.min(top, r.coordinates.length)} of ${r.coordinates.length} (ranked by the largest rate of self-steer, slip, ratio change or a joint margin ` +
      'at any pose, as a share of its tolerance):',
  ];
  r.coordinates.slice(0, top).forEach((c, i) => {
    lines.push(`  ${String(i + 1).padStart(2)}. ${c.sentence}`);
    const h = hint(c, r);
    if (h) lines.push(`      ${h}`);
  });
  lines.push('', 'rate per mm of each coordinate (* not linear over the step: the rates at the step and half of it differ by more than 5 %):');
  const rows = [['hardpoint', 'direction', 'self-steer', 'slip angle', 'Ackermann', 'ratio change', 'least joint margin']];
  for (const c of r.coordinates) {
    rows.push([c.coordinate.point, c.coordinate.direction, rate(c, 'selfSteer', 'deg'), rate(c, 'slip', 'deg'), rate(c, 'ackermannError', 'deg'), rate(c, 'ratioChange', '%'), rate(c, 'jointMargin', 'deg')]);
  }
  lines.push(...table(rows).map((l) => '  ' + l));
  const joints = r.objectives.filter((o) => o.id.startsWith('joint.'));
  if (joints.length > 0) {
    const head = joints.map((o) => {
      const [, name, side] = o.id.split('.');
      return `${JOINT_SHORT[name] ?? name} ${side === 'left' ? 'L' : 'R'}`;
    });
    lines.push(
      '',
      'least margin of each joint over the poses, deg per mm (UO upper outer joint, LO lower outer joint, TO tie rod outer end, TI tie rod inner end; L left, R right):',
    );
    const jrows = [['hardpoint', 'direction', ...head]];
    for (const c of r.coordinates) jrows.push([c.coordinate.point, c.coordinate.direction, ...joints.map((o) => rate(c, o.id, '').trim())]);
    lines.push(...table(jrows).map((l) => '  ' + l));
  }
  const failed = r.coordinates.filter((c) => c.failures.length > 0);
  if (r.notAssembled.length > 0) lines.push('', 'poses the design as it is cannot be assembled at (left out):', ...r.notAssembled.map((m) => `  ${m}`));
  if (failed.length > 0) {
    lines.push('', `${failed.length} moved copies could not be assembled at every pose (their rates over those poses are missing):`);
    for (const c of failed.slice(0, 10)) lines.push(`  ${c.coordinate.point}, ${c.coordinate.direction}: ${c.failures[0]}${c.failures.length > 1 ? ` (and ${c.failures.length - 1} more)` : ''}`);
  }
  if (r.cancelled) lines.push('', `stopped before the end: ${r.coordinates.length} coordinates finished`);
  lines.push('', `${r.designsSolved} designs solved in ${(r.elapsedMs / 1000).toFixed(1)} s`);
  return lines.join('\n') + '\n';
}

export async function runSensitivityCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let poses: StudyPose[] | undefined;
  let stepMm: number;
  let top: number;
  let json: boolean;
  let eachSide: boolean;
  try {
    const args = parseArgs(argv, { flags: ['json', 'each-side'], values: ['poses', 'step', 'top'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    poses = parsePoses(args);
    stepMm = boundedOption(args, 'step', 'mm', 0.5, 0, MAX_STEP_MM);
    top = countOption(args, 'top', 'entries', 10, 1, 1000);
    json = args.options.has('json');
    eachSide = args.options.has('each-side');
  } catch (e) {
    return reportArgError(e, io, 'sensitivity', sensitivityHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const { runSensitivity } = await import('../../studies/sensitivity');
  const { StudyInputError } = await import('../../studies/studyPoses');
  const bar = studyProgressBar(io, 'sensitivity', 'designs');
  const interrupt = stopOnInterrupt(io);
  let report: SensitivityReport;
  try {
    report = runSensitivity(loaded.file, { poses, stepMm, sides: eachSide ? 'each' : 'together', onProgress: (d, t) => bar.update(d, t), shouldStop: interrupt.shouldStop });
  } catch (e) {
    if (e instanceof StudyInputError) {
      io.err(`tiltbench sensitivity: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  } finally {
    bar.end();
    interrupt.release();
  }
  const problem = report.cancelled || report.notAssembled.length > 0 || report.coordinates.some((c) => c.failures.length > 0);
  if (json) {
    const { design: name, ...rest } = report;
    io.out(JSON.stringify({ tiltbench: 'sensitivity', design: loaded.path, name, ...rest, caution: SAFETY_CAUTION }, null, 2) + '\n');
  } else {
    io.out(formatSensitivity(report, top) + '\n' + SAFETY_CAUTION + '\n');
  }
  return problem ? EXIT_FAILED : EXIT_OK;
}
