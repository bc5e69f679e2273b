/**
 * Solver speed bench: `npm run bench` (tsx test/bench/run.ts).
 *
 * Prints one table, both tilting demos side by side (ground contact, steer by handlebar):
 *   - warm-started poses/s along a lean x steer serpentine (median of 5 timed passes after a
 *     warm-up pass; each pass runs the serpentine sweepRepeats times, every other time
 *     backwards, from a collected heap), with iterations per pose, non-converged poses and
 *     the worst residual;
 *   - cold-start solves/s at random poses inside the design's envelope;
 *   - the same serpentine through ml-levenberg-marquardt (the general-purpose path), its
 *     accuracy, and the ratio ours / general (both run interleaved, row by row);
 *   - a 91 x 61 x 9 lean x steer x travel envelope ('travel' mode), solver only, with a place
 *     for the "with every measure" figure (see everyMeasureHook below).
 * Targets are printed beside the figures with PASS / MISS as measured.
 *
 * Importing this module runs nothing; the measurement functions are re-exported from
 * ./measure for reuse. Profile with (the directory keeps .cpuprofile files out of the repo):
 *   node --import tsx --cpu-prof --cpu-prof-dir=/tmp/tiltbench-prof test/bench/run.ts
 */

import { execFileSync } from 'node:child_process';
import os from 'node:os';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { ResolvedDesign } from '../../core/design/types';
import type { PoseSolver } from '../../core/solver/PoseSolver';
import {
  CPU_CLOCK,
  GROUND_MODE,
  TILTING_DEMOS,
  TRAVEL_MODE,
  envelopeGrid,
  loadDemoDesign,
  makeSolver,
  median,
  randomEnvelopePoses,
  serpentineSweep,
  timeColdSolves,
  timeEnvelope,
  timeGeneralSweep,
  timeWarmSweep,
  type EnvelopeGrid,
  type GeneralStats,
  type PoseHook,
  type SweepStats,
} from './measure';
import { everyMeasureHookFor } from './envelope';

export * from './measure';
export { FlatParameters } from './flatParameters';

/** Project targets. */
export const TARGETS = {
  warmPosesPerSecond: 50_000,
  ratioOverGeneral: 30,
};

// =============================================================================================
// ANALYSIS OVERHEAD COLUMN ("with every measure") -- to be filled in by the analysis work.
// Return a hook that computes every measure of the pose the solver has just solved; it runs
// inside the timed loop of the envelope sweep, right after each solve, and must not change
// the solver's state. While this returns undefined the column prints "not wired yet".
// =============================================================================================
export function everyMeasureHook(design: ResolvedDesign, solver: PoseSolver): PoseHook | undefined {
  return everyMeasureHookFor(design, solver);
}

export interface BenchConfig {
  passes: number;
  warmupPasses: number;
  coldPoses: number;
  generalPasses: number;
  envelopePasses: number;
  /** Also run the general-purpose path with our analytic Jacobian (informative row). */
  generalWithAnalyticJacobian: boolean;
  /** Sweeps per timed pass of the warm serpentine. */
  sweepRepeats: number;
  /** Fresh child processes per garbage collector for the speed ratio. */
  ratioProcesses: number;
}

export const DEFAULT_CONFIG: BenchConfig = {
  passes: 5,
  warmupPasses: 1,
  coldPoses: 1000,
  generalPasses: 5,
  envelopePasses: 3,
  generalWithAnalyticJacobian: true,
  sweepRepeats: 5,
  ratioProcesses: 3,
};

/**
 * The speed ratio, measured in fresh child processes: a process's JIT and memory layout move
 * the pose solver by up to a fifth from one process to the next, and the general path's speed
 * depends on V8's garbage collector. It allocates heavily; with the default parallel collector
 * on a 2-core machine it waits for a helper thread that may not get the other core, and here it
 * then ran up to 1.9x slower than with --single-threaded-gc, while the pose solver (almost no
 * garbage) did not care. So the ratio is measured under both collectors, in several processes
 * each: default V8 settings for the target, the single-threaded collector as the stricter
 * reading (the general path at its fastest), both with their verdicts.
 */
export interface ProcessRatio {
  name: string;
  generalPosesPerSecond: number;
  oursPosesPerSecond: number;
  ratio: number;
}

export type Collector = 'default' | 'single-threaded';

export interface RatioRuns {
  collector: Collector;
  /** One entry per child process: that process's figures per design (or why it failed). */
  processes: (ProcessRatio[] | string)[];
}

function ratioRuns(collector: Collector, processes: number, passes: number): RatioRuns {
  const runs: (ProcessRatio[] | string)[] = [];
  for (let k = 0; k < processes; k++) {
    try {
      const flags = collector === 'single-threaded' ? ['--single-threaded-gc'] : [];
      const out = execFileSync(process.execPath, [...process.execArgv, ...flags, fileURLToPath(import.meta.url), '--ratio-child', collector, String(passes)], {
        encoding: 'utf8',
        maxBuffer: 1 << 20,
      });
      runs.push(JSON.parse(out.trim().split('\n').pop()!) as ProcessRatio[]);
    } catch (e) {
      runs.push(`could not run: ${(e as Error).message.split('\n')[0]}`);
    }
  }
  return { collector, processes: runs };
}

function ratioChild(collector: Collector, passes: number): void {
  const rows: ProcessRatio[] = TILTING_DEMOS.map((name) => {
    const design = loadDemoDesign(name);
    const solver = makeSolver(design, GROUND_MODE);
    const sweep = serpentineSweep();
    // With the single-threaded collector, marking and sweeping left over from the general
    // path's garbage would run inside the pose solver's slices: there each pass is whole
    // sweeps instead (a collected heap, our sweep, then its sweep).
    const sliceLength = collector === 'single-threaded' ? sweep.length : undefined;
    const g = timeGeneralSweep(solver, sweep, { jacobian: 'finite-difference', passes, warmupPasses: 1, ...(sliceLength ? { sliceLength } : {}) });
    return { name, generalPosesPerSecond: g.posesPerSecond, oursPosesPerSecond: median(g.oursRates), ratio: g.ratio };
  });
  console.log(JSON.stringify(rows));
}

export interface DesignBench {
  name: string;
  label: string;
  nVars: number;
  nResiduals: number;
  warm: SweepStats;
  cold: SweepStats;
  general: GeneralStats;
  generalAnalytic?: GeneralStats;
  envelope: SweepStats;
  envelopeGrid: Omit<EnvelopeGrid, 'poses'>;
  /** Envelope with every measure; undefined until everyMeasureHook returns a hook. */
  envelopeWithMeasures?: SweepStats;
}

export function benchDesign(name: string, cfg: BenchConfig = DEFAULT_CONFIG): DesignBench {
  const design = loadDemoDesign(name);
  const solver = makeSolver(design, GROUND_MODE);
  const sweep = serpentineSweep();
  const warm = timeWarmSweep(solver, sweep, { passes: cfg.passes, warmupPasses: cfg.warmupPasses, repeats: cfg.sweepRepeats });
  const cold = timeColdSolves(solver, randomEnvelopePoses(design, solver, cfg.coldPoses), {
    passes: cfg.passes,
    warmupPasses: cfg.warmupPasses,
  });
  const general = timeGeneralSweep(solver, sweep, {
    jacobian: 'finite-difference',
    passes: cfg.generalPasses,
    warmupPasses: cfg.warmupPasses,
  });
  const generalAnalytic = cfg.generalWithAnalyticJacobian
    ? timeGeneralSweep(solver, sweep, { jacobian: 'analytic', passes: cfg.generalPasses, warmupPasses: cfg.warmupPasses })
    : undefined;
  const travelSolver = makeSolver(design, TRAVEL_MODE);
  const grid = envelopeGrid(design);
  const envelope = timeEnvelope(travelSolver, grid, { passes: cfg.envelopePasses, warmupPasses: cfg.warmupPasses });
  const hook = everyMeasureHook(design, travelSolver);
  const envelopeWithMeasures = hook
    ? timeEnvelope(travelSolver, grid, { passes: cfg.envelopePasses, warmupPasses: cfg.warmupPasses, hook })
    : undefined;
  const { poses: _poses, ...gridShape } = grid;
  return {
    name,
    label: design.name.replace(/\s*\(demo\)\s*$/, ''),
    nVars: solver.mechanism.nVars,
    nResiduals: solver.mechanism.nResiduals,
    warm,
    cold,
    general,
    ...(generalAnalytic ? { generalAnalytic } : {}),
    envelope,
    envelopeGrid: gridShape,
    ...(envelopeWithMeasures ? { envelopeWithMeasures } : {}),
  };
}

// ---------------------------------------------------------------------------------------------
// Formatting
// ---------------------------------------------------------------------------------------------

const int = (x: number) => Math.round(x).toLocaleString('en-US');
const sci = (x: number) => (Number.isFinite(x) ? x.toExponential(3) : String(x));
const verdict = (ok: boolean) => (ok ? 'PASS' : 'MISS');
/** Spread of the timed passes, as min..max in thousands. */
const spread = (rates: number[]) => `${(Math.min(...rates) / 1000).toFixed(1)}k..${(Math.max(...rates) / 1000).toFixed(1)}k`;

export function formatTable(results: DesignBench[], cfg: BenchConfig = DEFAULT_CONFIG, ratios: RatioRuns[] = []): string {
  type Row = [string, ...string[]];
  const rows: Row[] = [];
  const add = (label: string, cell: (r: DesignBench) => string, target = '') => rows.push([label, ...results.map(cell), target]);
  const sep = () => rows.push(['']);
  const sweepPoses = results[0].warm.poses;

  rows.push(['', ...results.map((r) => r.label), 'target']);
  add('unknowns x residuals (ground mode)', (r) => `${r.nVars} x ${r.nResiduals}`);
  sep();
  const warmCell = (x: number) => `${int(x)}  ${verdict(x >= TARGETS.warmPosesPerSecond)}`;
  const ratioCell = (q: number) => `${q.toFixed(1)}x  ${verdict(q >= TARGETS.ratioOverGeneral)}`;
  add(`WARM serpentine, ${sweepPoses} poses x ${cfg.sweepRepeats} per pass: poses/s`, (r) => warmCell(r.warm.posesPerSecond), `>= ${int(TARGETS.warmPosesPerSecond)}`);
  add(`  median of ${cfg.passes} passes; pass spread`, (r) => spread(r.warm.passRates));
  add('  same, per CPU-second (see header)', (r) => warmCell(r.warm.cpuPosesPerSecond), `>= ${int(TARGETS.warmPosesPerSecond)}`);
  add('  avg iterations / pose', (r) => r.warm.avgIterations.toFixed(2));
  add('  non-converged poses', (r) => `${r.warm.nonConverged} / ${r.warm.poses}`);
  add('  max residual, mm', (r) => sci(r.warm.maxResidualMm), '< 1e-9');
  sep();
  add(`COLD solve(x, false), ${results[0].cold.poses} random: solves/s`, (r) => int(r.cold.posesPerSecond));
  add('  same, per CPU-second', (r) => int(r.cold.cpuPosesPerSecond));
  add('  avg iterations / solve', (r) => r.cold.avgIterations.toFixed(1));
  add('  non-converged', (r) => `${r.cold.nonConverged} / ${r.cold.poses}`);
  sep();
  add('GENERAL ml-levenberg-marquardt 5.1.0, same sweep', () => '');
  add('  (its own finite-difference Jacobian): poses/s', (r) => int(r.general.posesPerSecond));
  add(`  median of ${cfg.generalPasses} passes; pass spread`, (r) => spread(r.general.passRates));
  add('  avg iterations / pose', (r) => r.general.avgIterations.toFixed(2));
  add('  avg residual-vector evaluations / pose', (r) => r.general.avgEvaluations.toFixed(1));
  add('  max residual reached, mm (ours beside)', (r) => `${sci(r.general.maxResidualMm)} (${sci(r.warm.maxResidualMm)})`, '< 1e-9');
  add('  poses above 1e-9 mm', (r) => `${r.general.nonConverged} / ${r.general.poses}`);
  add('  max |p_general - p_ours| (rad or mm)', (r) => sci(r.general.maxDeviationFromOurs));
  add('  ratio ours / general in this process (default V8 GC)', (r) => `${r.general.ratio.toFixed(1)}x`);
  add('  every pass', (r) => r.general.passRatios.map((q) => q.toFixed(1)).join(' '));
  add('  (ours in the same passes: poses/s)', (r) => int(median(r.general.oursRates)));
  for (const runs of ratios) {
    const label = runs.collector === 'single-threaded' ? 'single-threaded V8 GC (stricter)' : 'default V8 settings';
    const of = (r: DesignBench) => runs.processes.map((p) => (typeof p === 'string' ? undefined : p.find((x) => x.name === r.name)));
    const failed = runs.processes.find((p) => typeof p === 'string');
    add(`RATIO, ${runs.processes.length} fresh processes, ${label}`, (r) => {
      const got = of(r).filter((x): x is ProcessRatio => x !== undefined).map((x) => x.ratio);
      return got.length ? ratioCell(median(got)) : String(failed ?? 'none');
    }, `>= ${TARGETS.ratioOverGeneral}x`);
    add('  each process (median of its passes)', (r) => of(r).map((x) => (x ? x.ratio.toFixed(1) : '-')).join(' '));
    add('  general path / ours, poses/s per process', (r) => of(r).map((x) => (x ? `${(x.generalPosesPerSecond / 1000).toFixed(1)}k/${(x.oursPosesPerSecond / 1000).toFixed(0)}k` : '-')).join(' '));
  }
  if (results.every((r) => r.generalAnalytic)) {
    add('general with OUR analytic Jacobian: poses/s', (r) => int(r.generalAnalytic!.posesPerSecond));
    add('  avg iterations; max residual, mm', (r) => `${r.generalAnalytic!.avgIterations.toFixed(2)}; ${sci(r.generalAnalytic!.maxResidualMm)}`);
    add('  ratio ours / general (analytic J), this process', (r) => `${r.generalAnalytic!.ratio.toFixed(1)}x`);
    add('  every pass', (r) => r.generalAnalytic!.passRatios.map((q) => q.toFixed(1)).join(' '));
  }
  sep();
  const g = results[0].envelopeGrid;
  add(`ENVELOPE ${g.leanDeg[2]} lean x ${g.handlebarDeg[2]} steer x ${g.travelMm[2]} travel ('travel' mode)`, () => '');
  add('  lean / handlebar range, deg', (r) => `+-${r.envelopeGrid.leanDeg[1]} / +-${r.envelopeGrid.handlebarDeg[1]}`);
  add(`  travel ${g.travelMm[0]}..${g.travelMm[1]} mm, both wheels: poses`, (r) => int(r.envelope.poses));
  add(`  solver only: poses/s (median of ${cfg.envelopePasses})`, (r) => int(r.envelope.posesPerSecond));
  add('  same, per CPU-second', (r) => int(r.envelope.cpuPosesPerSecond));
  add('  solver only: seconds per envelope', (r) => (r.envelope.poses / r.envelope.posesPerSecond).toFixed(2));
  add('  avg iterations; non-converged', (r) => `${r.envelope.avgIterations.toFixed(2)}; ${r.envelope.nonConverged}`);
  // ---- "with every measure" column: filled once everyMeasureHook (above) returns a hook ----
  add('  WITH EVERY MEASURE: poses/s', (r) =>
    r.envelopeWithMeasures ? int(r.envelopeWithMeasures.posesPerSecond) : 'not wired yet',
  );
  add('  with every measure: seconds per envelope', (r) =>
    r.envelopeWithMeasures ? (r.envelopeWithMeasures.poses / r.envelopeWithMeasures.posesPerSecond).toFixed(2) : '-',
  );

  const widths: number[] = [];
  for (const row of rows) row.forEach((c, i) => (widths[i] = Math.max(widths[i] ?? 0, c.length)));
  return rows
    .map((row) => row.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('   ').trimEnd())
    .join('\n');
}

export function runBench(cfg: BenchConfig = DEFAULT_CONFIG): DesignBench[] {
  return TILTING_DEMOS.map((name) => benchDesign(name, cfg));
}

function main(): void {
  const t0 = performance.now();
  const load = os.loadavg().map((x) => x.toFixed(2)).join(' ');
  console.log(`Tiltbench solver bench -- node ${process.version}, ${os.cpus().length} CPU(s), load average ${load}`);
  console.log("Ground contact, steer by handlebar; serpentine lean -20..20 step 0.5 x handlebar -20..20 in 61 steps.");
  console.log('Each timed figure follows one untimed warm-up pass of the same work, and every timed pass starts');
  console.log(`from a collected heap. A pose-solver pass runs the serpentine ${DEFAULT_CONFIG.sweepRepeats} times (every other time backwards).`);
  console.log('Wall-clock figures are the headline; per-CPU-second figures use');
  console.log(`${CPU_CLOCK}, so they leave out time spent waiting for a CPU.`);
  console.log('Ratios: both solvers run the same sweep interleaved, five serpentine rows (305 poses) each in turn,');
  console.log('so both see the same machine; a pass gives the ratio of the summed times. The general path\'s speed');
  console.log("swings with V8's garbage collector (up to 1.9x here), and a process's JIT luck moves ours by up to a");
  console.log('fifth, so the ratio is also measured in three fresh processes with default V8 settings (what Node');
  console.log('gives any user: the target) and three with the single-threaded collector, where the general path');
  console.log('runs fastest (the stricter reading). Both verdicts are printed.\n');
  const results = runBench();
  const ratios = (['default', 'single-threaded'] as const).map((c) => ratioRuns(c, DEFAULT_CONFIG.ratioProcesses, DEFAULT_CONFIG.generalPasses));
  console.log(formatTable(results, DEFAULT_CONFIG, ratios));
  console.log(`\nbench time ${((performance.now() - t0) / 1000).toFixed(1)} s, load average after ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const child = process.argv.indexOf('--ratio-child');
  if (child >= 0) ratioChild(process.argv[child + 1] as Collector, Number(process.argv[child + 2]) || DEFAULT_CONFIG.generalPasses);
  else main();
}
