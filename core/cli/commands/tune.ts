/**
 * `tiltbench tune`: move hardpoints by a plan to minimise self-steer, slip and the rest while
 * keeping joints, clearances and the linkage's transmission; or list the variables a plan may
 * name; or show the two geometric proposals and write one.
 */
import { readInputFile } from '../readInputFile';
import { checkOutputPath, writeWholeOutput, type OutputTarget } from '../outputFile';
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs } from '../args';
import { formatIssue } from '../formatIssue';
import { readJsonText } from '../../design/readJsonText';
import type { DesignFile } from '../../design/types';
import type { TuneReport, TuneSummaryItem } from '../../studies/tune';
import type { Proposal } from '../../studies/geometricSuggestion';
import { stopOnInterrupt, studyProgressBar, table } from './studyArgs';

/** A plan is a few lines of JSON; anything larger is not one. */
export const MAX_PLAN_BYTES = 256 * 1024;

export const tuneHelp = `tiltbench tune <design.tiltsheet> --plan PLAN.json --out TUNED.tiltsheet [--jacobian secant|difference] [--json]
tiltbench tune <design.tiltsheet> --list-variables
tiltbench tune <design.tiltsheet> --suggest [tie-rods|ackermann --out PROPOSED.tiltsheet] [--json]
  Move hardpoints inside their ranges to minimise the plan's weighted objectives (self-steer, slip
  angle, steering-ratio change, Ackermann percentage or steering ratio toward a target) while
  keeping its constraints (joint margins, clearances, a transmission-angle floor, every pose
  assembled), over the operating-region sample (or the plan's poses). Least squares of the sampled
  residuals by Levenberg-Marquardt from several starts; the tuned copy is written to --out (never
  over the design or the plan). A plan (JSON):
    { "variables": [ { "id": "steering.tieRodJoint:z", "rangeMm": [-20, 20] }, ... ],
      "objectives": [ { "measure": "selfSteer", "weight": 1 }, { "measure": "ackermann", "weight": 0.2, "target": 60 } ],
      "constraints": { "jointMargin": true, "clearance": true, "transmissionFloorDeg": 10 },
      "poses": "region", "starts": 3, "maxIterations": 25, "seed": 1 }
  measures: selfSteer, slip, ratioChange, ackermann (target %, default 100), steeringRatio (target needed).
  Variable ids: --list-variables prints them (x forward, z up, y outward for a point on each side;
  a mirrored pair moves together unless the id names a side; tieRod.length moves the inner joint
  along the rod).
  --jacobian secant|difference        secant (default): differences every few iterations, Broyden
                                      updates between; difference: forward differences every iteration
  --suggest                           the two drawing-board proposals (tie rods on the instant-centre
                                      lines; steering arms aimed at the rear axle middle) and what each
                                      does over the region sample; with a name and --out, write it
  Exit 0 when every objective and constraint with a limit is kept after tuning, 1 when some are not
  (the tuned design is still written) or the run was stopped (Ctrl-C: the best design so far is
  written), 2 for bad input.`;



/** A plan file read as JSON (size-limited; syntax errors by line and column). */
export function readPlan(path: string): { ok: true; json: unknown } | { ok: false; message: string } {
  const read = readInputFile(path, MAX_PLAN_BYTES, 'a plan');
  if (!read.ok) return read;
  const r = readJsonText(read.text, path);
  if (!r.ok) return { ok: false, message: r.issues.map((i) => formatIssue(i)).join('\n') };
  return { ok: true, json: r.json };
}

const num = (x: number | null, unit: string, digits = 3) => (x === null ? '-' : `${x.toFixed(digits)}${unit ? ' ' + unit : ''}`);

function limitWords(s: TuneSummaryItem): string {
  if (s.limit === null) return '-';
  return s.kind === 'worst' ? `at most ${s.limit} ${s.unit}`.trim() : `at least ${s.limit} ${s.unit}`.trim();
}

const keptWords = (k: boolean | null) => (k === null ? '' : k ? 'kept' : 'NOT KEPT');

export function formatTune(r: TuneReport, outPath: string): string {
  const lines = [`${r.design}: tune`, `  method: ${r.method}`, `  poses: ${r.poses.length} (${r.posesFrom})`];
  if (r.notAssembled.length > 0) lines.push(`  left out (the design as it is cannot be assembled there): ${r.notAssembled.join('; ')}`);
  lines.push('', 'variables (offset from the design, mm):');
  const vrows = [['variable', 'range', 'moved', '']];
  for (const v of r.variables) vrows.push([v.words, `${v.rangeMm[0]}..${v.rangeMm[1]}`, `${v.movedMm >= 0 ? '+' : ''}${v.movedMm.toFixed(2)}`, v.atBound ? `at the ${v.atBound} end of its range` : '']);
  lines.push(...table(vrows, [0, 3]).map((l) => '  ' + l));
  lines.push('', 'objectives and constraints over the poses (before -> after):');
  const rows = [['item', 'before', 'after', 'allowed', '']];
  for (const s of r.summary) rows.push([`${s.group === 'constraint' ? '[constraint] ' : ''}${s.label}`, num(s.before, s.unit), num(s.after, s.unit), limitWords(s), `${keptWords(s.keptBefore)} -> ${keptWords(s.keptAfter)}`]);
  rows.push(['poses not assembled', String(r.notAssembled.length), String(r.notAssembledAfter.length), '0', '']);
  lines.push(...table(rows, [0, 3, 4]).map((l) => '  ' + l));
  const worst = r.summary.find((s) => s.after !== null && s.afterWhere && s.keptAfter === false);
  if (worst) lines.push(`  still outside: ${worst.label} ${num(worst.after, worst.unit)} at ${worst.afterWhere}`);
  lines.push('', `cost (sum of squared scaled residuals): ${r.costBefore.toPrecision(5)} -> ${r.costAfter.toPrecision(5)}`);
  lines.push('starts:');
  r.starts.forEach((s, i) => lines.push(`  ${i + 1}. from ${s.from === 'design' ? 'the design' : 'a seeded point'}: cost ${s.cost.toPrecision(5)}, ${s.iterations} iterations, ${s.evaluations} designs solved, ${s.ended === 'settled' ? 'settled' : s.ended === 'iterations' ? 'out of iterations' : 'stopped'}${i === r.bestStart ? '  <- best' : ''}`));
  lines.push(`${r.evaluations} designs solved in ${(r.elapsedMs / 1000).toFixed(1)} s${r.cancelled ? ' (stopped by the user: the best design so far is written)' : ''}`);
  lines.push(`tuned design written to ${outPath}; confirm it with \`tiltbench check\` over the whole envelope`);
  return lines.join('\n') + '\n';
}

function formatProposals(ps: Proposal[]): string {
  const lines: string[] = [];
  for (const p of ps) {
    lines.push(`${p.title} (--suggest ${p.id === 'tieRodLine' ? 'tie-rods' : 'ackermann'})`, `  rule: ${p.rule}`);
    if (!p.design) {
      lines.push(`  does not apply: ${p.reason}`, '');
      continue;
    }
    const f = (v: { x: number; y: number; z: number }) => `${v.x.toFixed(1)}, ${v.y.toFixed(1)}, ${v.z.toFixed(1)}`;
    for (const m of p.moves) lines.push(`  ${m.point}: ${f(m.fromMm)} -> ${f(m.toMm)} mm`);
    if (p.effect) {
      const rows = [['over the region sample', 'now', 'proposed', 'allowed']];
      for (const e of p.effect) rows.push([e.label, num(e.before, e.unit), num(e.after, e.unit), e.tolerance === null ? '-' : `${e.kind === 'worst' ? 'at most' : 'at least'} ${e.tolerance} ${e.unit}`]);
      lines.push(...table(rows, [0, 3]).map((l) => '  ' + l));
    }
    lines.push('');
  }
  return lines.join('\n');
}

function listVariables(file: DesignFile, ids: { id: string; words: string }[]): string {
  return [`${file.name}: variables a tune plan may name`, ...table([['id', 'moves'], ...ids.map((v) => [v.id, v.words])], [0, 1]).map((l) => '  ' + l)].join('\n') + '\n';
}

export async function runTuneCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let planPath: string | undefined;
  let outPath: string | undefined;
  let json: boolean;
  let list: boolean;
  let suggest: string | undefined | true;
  let jacobian: 'secant' | 'finite-difference';
  let target: OutputTarget | undefined;
  try {
    const args = parseArgs(argv, { flags: ['json', 'list-variables', 'suggest'], values: ['plan', 'out', 'jacobian'] });
    // --suggest takes an optional proposal name as a second positional.
    const positionals = [...args.positionals];
    suggest = args.options.has('suggest') ? (positionals.length === 2 ? positionals.pop() : true) : undefined;
    if (positionals.length !== 1) throw new ArgError(`expected one design file, found ${positionals.length}`);
    designPath = positionals[0];
    planPath = args.options.get('plan') as string | undefined;
    outPath = args.options.get('out') as string | undefined;
    json = args.options.has('json');
    list = args.options.has('list-variables');
    const j = (args.options.get('jacobian') as string | undefined) ?? 'secant';
    if (j !== 'secant' && j !== 'difference') throw new ArgError(`--jacobian: expected secant or difference, found "${j.slice(0, 40)}"`);
    jacobian = j === 'secant' ? 'secant' : 'finite-difference';
    if (typeof suggest === 'string' && suggest !== 'tie-rods' && suggest !== 'ackermann') throw new ArgError(`--suggest: expected tie-rods or ackermann, found "${suggest.slice(0, 40)}"`);
    if (typeof suggest === 'string' && !outPath) throw new ArgError(`--suggest ${suggest} writes the proposal: give --out PROPOSED.tiltsheet`);
    if (!list && suggest === undefined && (!planPath || !outPath)) throw new ArgError('give --plan PLAN.json and --out TUNED.tiltsheet (or --list-variables, or --suggest)');
    if (outPath) target = checkOutputPath(outPath, '--out', [{ path: designPath, what: 'design' }, ...(planPath ? [{ path: planPath, what: 'plan' }] : [])]);
  } catch (e) {
    // A design that cannot be read is the first thing to say (its file and place), before the usage.
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'tune', tuneHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const { TunePlanError, readTunePlan, tuneVariableIds, resolveVariable } = await import('../../studies/tunePlan');
  const { StudyInputError } = await import('../../studies/studyPoses');

  if (list) {
    const ids = tuneVariableIds(loaded.file).map((id) => ({ id, words: resolveVariable(loaded.file, { id, rangeMm: [-1, 1] }, 'id').words }));
    io.out(json ? JSON.stringify({ tiltbench: 'tune-variables', design: loaded.path, variables: ids }, null, 2) + '\n' : listVariables(loaded.file, ids));
    return EXIT_OK;
  }

  if (suggest !== undefined) {
    const { geometricProposals } = await import('../../studies/geometricSuggestion');
    const proposals = geometricProposals(loaded.file, true);
    if (typeof suggest === 'string') {
      const p = proposals.find((x) => x.id === (suggest === 'tie-rods' ? 'tieRodLine' : 'ackermannArms'))!;
      if (!p.design) {
        io.err(`tiltbench tune: the ${p.title} proposal does not apply: ${p.reason}\n`);
        return EXIT_FAILED;
      }
      const out = { ...p.design, notes: [p.design.notes ?? '', `Proposal applied by tiltbench tune --suggest: ${p.title}.`].filter((x) => x).join('\n') };
      writeWholeOutput(target!, JSON.stringify(out, null, 2) + '\n');
    }
    if (json) {
      io.out(JSON.stringify({ tiltbench: 'tune-suggest', design: loaded.path, proposals: proposals.map(({ design, ...rest }) => ({ ...rest, applies: design !== null })), caution: SAFETY_CAUTION }, null, 2) + '\n');
    } else {
      io.out(`${loaded.file.name}: geometric proposals\n\n${formatProposals(proposals)}${typeof suggest === 'string' ? `proposal written to ${outPath}\n` : ''}\n${SAFETY_CAUTION}\n`);
    }
    return EXIT_OK;
  }

  const planText = readPlan(planPath!);
  if (!planText.ok) {
    io.err(`tiltbench tune: ${planText.message}\n`);
    return EXIT_BAD_INPUT;
  }
  const { runTune } = await import('../../studies/tune');
  let report: TuneReport;
  const bar = studyProgressBar(io, 'tune', 'designs');
  const interrupt = stopOnInterrupt(io);
  try {
    const { plan, variables } = readTunePlan(planText.json, loaded.file);
    report = runTune(loaded.file, plan, variables, { jacobian, onProgress: (d, t) => bar.update(d, t), shouldStop: interrupt.shouldStop });
  } catch (e) {
    if (e instanceof TunePlanError) {
      bar.end();
      io.err(`tiltbench tune: ${planPath}: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    if (e instanceof StudyInputError) {
      bar.end();
      io.err(`tiltbench tune: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  } finally {
    bar.end();
    interrupt.release();
  }
  writeWholeOutput(target!, JSON.stringify(report.tuned, null, 2) + '\n');
  const allKept = report.summary.every((s) => s.keptAfter !== false) && report.notAssembledAfter.length === 0;
  if (json) {
    const { design: name, tuned, ...rest } = report;
    io.out(JSON.stringify({ tiltbench: 'tune', design: loaded.path, name, out: outPath, ...rest, tunedName: tuned.name, caution: SAFETY_CAUTION }, null, 2) + '\n');
  } else {
    io.out(formatTune(report, outPath!) + '\n' + SAFETY_CAUTION + '\n');
  }
  return allKept && !report.cancelled ? EXIT_OK : EXIT_FAILED;
}
