import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_CODES_HELP, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, numberOption, parseArgs } from '../args';
import { MAX_GRID_POSES, requireGridSize } from '../inputLimits';
import { clip, MAX_ECHOED_NAME, quoted } from '../safeText';
// The analysis modules are loaded when the command runs, so other commands start faster.
import type { CheckItem, CheckRegion, CheckSection, DesignCheck, TravelAxis } from '../../analysis/designCheck';
import type { LeanLimits, LimitKind } from '../../analysis/limits';
import type { SweepAxes } from '../../analysis/sweep';
import { parseContact, progressBar, summaryLine } from './sweep';

export const checkHelp = `tiltbench check <design.tiltsheet> [--region operating|full] [--lean-step DEG] [--steer-step DEG] [--travel-step MM] [--contact ground|travel] [--json]
  Sweeps the design's envelope (envelope.leanDeg each way, envelope.handlebarDeg each way,
  -envelope.reboundMm..envelope.bumpMm of travel, each including 0) and prints, for the
  operating region (the poses balanced turns at the riding block's speeds reach, widened by its
  transient band, within its lean and grip limits) and for the full rectangle, a table of every
  tolerance (self-steer, steering-ratio change, slip), every joint and every clearance pair with
  its worst value, where it occurs (lean, handlebar, travel) and its verdict; for an item over
  its limit, where it is first exceeded (of the poses where it is, the one nearest upright,
  straight ahead and unloaded, each input measured against its envelope).
  --region operating|full             which section decides the result (default operating)
  --lean-step DEG, --steer-step DEG   grid spacing, at most (default 1)
  --travel-step MM                    grid spacing, at most (default 10)
  --contact ground|travel             tyres on the ground (default; travel lowers the frame), or
                                      wheel travel held relative to the frame
  --json                              machine-readable output
  The grid holds at most ${MAX_GRID_POSES} poses (a larger one is refused before any work:
  widen a step). Besides each side's parts, the two tyres are kept apart (left to right).
  Exit 0 when everything passes (warnings allowed), 1 when anything is violated or a pose
  cannot be assembled, 2 for bad input. ${EXIT_CODES_HELP}`;

function positiveOption(args: ReturnType<typeof parseArgs>, name: string, unit: string, fallback: number): number {
  const v = numberOption(args, name, unit, fallback);
  if (!(v > 0)) throw new ArgError(`option --${name}: expected a positive number in ${unit}, found ${v}`);
  return v;
}

const f1 = (x: number) => (Math.abs(x) < 0.05 ? 0 : x).toFixed(1);

function poseText(w: CheckItem['where']): string {
  return w ? `${f1(w.leanDeg)}, ${f1(w.handlebarDeg)}, ${f1(w.travelMm)}` : '-';
}

function whereText(it: CheckItem): string {
  return poseText(it.where);
}

/** The detail column: core's words, then where the item is first exceeded (nearest the design pose). */
function detailText(it: CheckItem, travel: TravelAxis): string {
  const first = it.firstOver ? `first exceeded at ${poseText(it.firstOver)}${travel.kind === 'spring' ? ' (lean, handlebar, spring travel)' : ''}` : '';
  return [it.detail ?? '', first].filter((x) => x).join('; ');
}

function worstText(it: CheckItem): string {
  if (it.worst === null) return '-';
  if (it.unit === 'poses') return String(it.worst);
  return `${it.worst.toFixed(it.unit === 'mm' ? 1 : 2)} ${it.unit}`;
}

function axisText(values: number[], unit: string): string {
  if (values.length === 1) return `${values[0]} ${unit}`;
  return `${values[0]}..${values[values.length - 1]} ${unit} (${values.length} values)`;
}

function sectionTable(sec: CheckSection, travel: TravelAxis): string[] {
  const rows: string[][] = [['item', 'worst', `where (lean, handlebar, ${travel.name})`, 'allowed', 'verdict', '']];
  for (const it of sec.items) rows.push([it.label, worstText(it), whereText(it), it.limit, it.verdict.toUpperCase(), detailText(it, travel)]);
  const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  return rows.map((r) => r.map((cell, i) => (i === 1 ? cell.padStart(widths[i]) : cell.padEnd(widths[i]))).join('  ').trimEnd());
}

function sectionVerdict(sec: CheckSection): string {
  const fails = sec.items.filter((i) => i.verdict === 'over' || i.verdict === 'broken').length;
  const close = sec.items.filter((i) => i.verdict === 'close').length;
  return sec.passed
    ? `PASS (${sec.items.length} items, ${close} close to the limit)`
    : `FAIL (${fails} of ${sec.items.length} items over the limit or broken, ${close} close to the limit)`;
}

const SECTION_TITLE: Record<CheckRegion, string> = {
  operating: 'operating region: the poses balanced turns reach, where the vehicle is ridden',
  full: 'full rectangle: every pose of the grid, including poses the vehicle never rides',
};

export function formatCheck(c: DesignCheck): string {
  const a: SweepAxes = c.axes;
  const r = c.riding;
  const header = [
    `${clip(c.design, MAX_ECHOED_NAME)}: check over the envelope, ${c.contact === 'ground' ? 'tyres on the ground' : 'wheel travel relative to the frame'}`,
    `  grid: lean ${axisText(a.leanDeg, 'deg')} x handlebar ${axisText(a.handlebarDeg, 'deg')} x ${c.travelAxis.kind === 'spring' ? 'spring travel (compression +)' : 'travel'} ${axisText(a.travelMm, 'mm')}: ${summaryLine(c.summary)}`,
    `  riding: ${r.minKmh}..${r.maxKmh} km/h, lean limit ${r.maxLeanDeg} deg, transient band ${r.transientBandDeg} deg, grip ${r.gripG} g ` +
      '(balanced turn: tan(lean) = v^2 / (g R), R the rear axle centre path radius)',
    '',
  ];
  const order: CheckRegion[] = c.judged === 'operating' ? ['operating', 'full'] : ['full', 'operating'];
  const sections: string[] = [];
  for (const region of order) {
    const sec = region === 'operating' ? c.operating : c.full;
    const role = region === c.judged ? 'judged' : 'for information';
    sections.push(`== ${SECTION_TITLE[region]} (${sec.poses} poses; ${role})`, ...sectionTable(sec, c.travelAxis), `section verdict: ${sectionVerdict(sec)}`, '');
  }
  const limits = ['steering limits (first limit met each way, zero travel; handlebar deg, road-wheel L/R deg):'];
  const lim = (l: LeanLimits['left']) =>
    l.handlebarDeg === null
      ? `none (${l.reason})`
      : `${l.handlebarDeg.toFixed(1)} (${wheelText(l.leftWheelDeg)}/${wheelText(l.rightWheelDeg)}): ${l.kinds.map((k) => LIMIT_WORDS[k]).join(', ')}: ${l.detail}`;
  for (const l of c.limits) {
    limits.push(`  lean ${f1(l.leanDeg).padStart(5)}  left turn ${lim(l.left)}`);
    limits.push(`              right turn ${lim(l.right)}`);
  }
  const result = `RESULT (${c.judged === 'operating' ? 'operating region' : 'full rectangle'}): ${sectionVerdict(c.judged === 'operating' ? c.operating : c.full)}`;
  return [...header, ...sections, ...limits, '', ...c.info.map((i) => `note: ${i}`), '', result].join('\n') + '\n';
}

const wheelText = (x: number | null) => (x === null ? '-' : x.toFixed(1));

const LIMIT_WORDS: Record<LimitKind, string> = {
  'cannot-assemble': 'cannot assemble',
  'dead-centre': 'dead centre',
  'joint-rating': 'joint over its rating',
  clearance: 'clearance',
};

export async function runCheck(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let steps: { leanDeg: number; handlebarDeg: number; travelMm: number };
  let json: boolean;
  let contact: ReturnType<typeof parseContact>;
  let region: CheckRegion;
  try {
    const args = parseArgs(argv, { flags: ['json'], values: ['lean-step', 'steer-step', 'travel-step', 'contact', 'region'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    steps = {
      leanDeg: positiveOption(args, 'lean-step', 'degrees', 1),
      handlebarDeg: positiveOption(args, 'steer-step', 'degrees', 1),
      travelMm: positiveOption(args, 'travel-step', 'mm', 10),
    };
    json = args.options.has('json');
    contact = parseContact(args.options.get('contact'));
    const rawRegion = args.options.get('region');
    if (rawRegion !== undefined && rawRegion !== 'operating' && rawRegion !== 'full') {
      throw new ArgError(`option --region: expected operating or full, found ${rawRegion === true ? 'no value' : quoted(rawRegion)}`);
    }
    region = rawRegion ?? 'operating';
  } catch (e) {
    return reportArgError(e, io, 'check', checkHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const { checkDesign, checkGridPoses } = await import('../../analysis/designCheck');
  try {
    requireGridSize(checkGridPoses(loaded.design, steps, contact), 'the envelope grid at these steps', 'give a larger --lean-step, --steer-step or --travel-step');
  } catch (e) {
    return reportArgError(e, io, 'check', checkHelp);
  }
  const { SweepInputError } = await import('../../analysis/sweep');
  const { ANALYSIS_DEFINITIONS } = await import('../../analysis/definitions');
  const bar = progressBar(io, 'check');
  let result: DesignCheck;
  try {
    result = checkDesign(loaded.design, { contact, steps, judged: region, onProgress: (d, t) => bar.update(d, t) });
  } catch (e) {
    if (e instanceof SweepInputError) {
      io.err(`tiltbench check: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    } else throw e;
  } finally {
    bar.end();
  }
  if (json) {
    const report = {
      tiltbench: 'check',
      design: loaded.path,
      name: result.design,
      passed: result.passed,
      judged: result.judged,
      contact: result.contact,
      axes: result.axes,
      travelAxis: result.travelAxis,
      riding: result.riding,
      items: result.items,
      operating: result.operating,
      full: result.full,
      info: result.info,
      limits: result.limits,
      summary: result.summary,
      definitions: ANALYSIS_DEFINITIONS,
      caution: SAFETY_CAUTION,
    };
    io.out(JSON.stringify(report, null, 2) + '\n');
  } else {
    io.out(formatCheck(result) + '\n' + SAFETY_CAUTION + '\n');
  }
  return result.passed ? EXIT_OK : EXIT_FAILED;
}
