/**
 * Side-by-side speed of two copies of core/'s pose solver, in one process:
 *
 *   npx tsx test/bench/compareCores.ts BEFORE_CORE_DIR [AFTER_CORE_DIR]
 *   TILTBENCH_CORE_BEFORE=/path/to/copy/of/core npx tsx test/bench/compareCores.ts
 *
 * AFTER defaults to this checkout's core/. Keep a copy of core/ from before a change
 * (`cp -r core /somewhere/core-before`) and pass it as BEFORE.
 *
 * Why in one process, alternating: a process's JIT luck moves absolute figures by up to a
 * fifth, but not the ratio of two copies timed turn about (DEVELOPERS.md, "To compare two
 * versions of the solver"). Each copy is its own module graph, so V8 keeps separate type
 * feedback for them. Both solve the same mechanism graph (plain data, built once by AFTER's
 * layout template, each solver given its own copy) along the demos' lean x steer serpentine;
 * every timed pass starts from a collected heap, and the order alternates A B, B A, ... so a
 * drift in the machine's speed lands on both.
 *
 * Before timing, both copies solve the whole serpentine once and the script prints the largest
 * difference between their joint coordinates and statuses: a refactoring that should not
 * change the numbers shows 0 here.
 */

import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { collectGarbage, GROUND_MODE, loadDemoDesign, median, serpentineSweep, startClock, TILTING_DEMOS } from './measure';
import type { MechanismGraph, PoseInputs } from '../../core/mechanism/MechanismGraph';
import type { PoseMode } from '../../core/mechanism/templates/buildMechanism';
import type { ResolvedDesign } from '../../core/design/types';

/** The little of a pose solver this script touches (true of every version so far). */
interface SolverLike {
  readonly mechanism: { readonly coord: Float64Array; readonly sph: Float64Array };
  solve(inputs: PoseInputs, warm?: boolean): { status: string; iterations: number };
  reset(): void;
}
type SolverClass = new (graph: MechanismGraph) => SolverLike;
type BuildMechanism = (design: ResolvedDesign, mode: PoseMode) => MechanismGraph;

interface CoreCopy {
  label: string;
  dir: string;
  PoseSolver: SolverClass;
}

const PASSES = Number(process.env.COMPARE_PASSES ?? 10);
/** Serpentine sweeps per timed pass, every other one backwards (a pass of a few tens of ms). */
const REPEATS = Number(process.env.COMPARE_REPEATS ?? 3);

async function loadCore(label: string, dir: string): Promise<CoreCopy> {
  const url = pathToFileURL(resolve(dir, 'solver/PoseSolver.ts')).href;
  const mod = (await import(url)) as { PoseSolver: SolverClass };
  return { label, dir, PoseSolver: mod.PoseSolver };
}

/** One timed pass: poses[0] solved cold untimed, then REPEATS warm sweeps on a collected heap. */
function pass(solver: SolverLike, poses: PoseInputs[]): number {
  solver.reset();
  solver.solve(poses[0], false);
  const n = poses.length;
  collectGarbage();
  const stop = startClock();
  for (let rep = 0; rep < REPEATS; rep++) {
    const back = rep % 2 === 1;
    for (let k = 0; k < n; k++) solver.solve(poses[back ? n - 1 - k : k]);
  }
  return ((n * REPEATS) / stop().wallMs) * 1000;
}

/** Largest coordinate difference and status disagreements along one warm sweep. */
function agreement(a: SolverLike, b: SolverLike, poses: PoseInputs[]): { maxDiff: number; statusDiffs: number; iterationDiffs: number } {
  a.reset();
  b.reset();
  let maxDiff = 0;
  let statusDiffs = 0;
  let iterationDiffs = 0;
  poses.forEach((p, i) => {
    const ra = a.solve(p, i > 0);
    const rb = b.solve(p, i > 0);
    if (ra.status !== rb.status) statusDiffs++;
    if (ra.iterations !== rb.iterations) iterationDiffs++;
    for (const key of ['coord', 'sph'] as const) {
      const x = a.mechanism[key];
      const y = b.mechanism[key];
      for (let k = 0; k < x.length; k++) maxDiff = Math.max(maxDiff, Math.abs(x[k] - y[k]));
    }
  });
  return { maxDiff, statusDiffs, iterationDiffs };
}

async function main(): Promise<void> {
  const beforeDir = process.argv[2] ?? process.env.TILTBENCH_CORE_BEFORE;
  if (!beforeDir) {
    console.error('usage: npx tsx test/bench/compareCores.ts BEFORE_CORE_DIR [AFTER_CORE_DIR] (or set TILTBENCH_CORE_BEFORE)');
    process.exit(2);
  }
  const afterDir = process.argv[3] ?? new URL('../../core', import.meta.url).pathname;
  const copies = [await loadCore('before', beforeDir), await loadCore('after', afterDir)];
  const { buildMechanism } = (await import(pathToFileURL(resolve(afterDir, 'mechanism/templates/buildMechanism.ts')).href)) as { buildMechanism: BuildMechanism };
  console.log(`before: ${resolve(beforeDir)}\nafter:  ${resolve(afterDir)}`);
  console.log(`${PASSES} timed passes each, alternating; a pass is ${REPEATS} warm serpentine sweeps on a collected heap.\n`);

  for (const name of TILTING_DEMOS) {
    const graph = buildMechanism(loadDemoDesign(name), GROUND_MODE);
    const solvers = copies.map((c) => new c.PoseSolver(structuredClone(graph)));
    const poses = serpentineSweep();
    const agree = agreement(solvers[0], solvers[1], poses);
    console.log(`${name}: ${poses.length} poses; before vs after: max |coordinate difference| ${agree.maxDiff.toExponential(2)}, status differences ${agree.statusDiffs}, iteration-count differences ${agree.iterationDiffs}`);
    // Warm-up: one untimed pass each.
    for (const s of solvers) pass(s, poses);
    const rates: number[][] = [[], []];
    const roundRatios: number[] = [];
    for (let p = 0; p < PASSES; p++) {
      const order = p % 2 === 0 ? [0, 1] : [1, 0];
      for (const i of order) rates[i].push(pass(solvers[i], poses));
      roundRatios.push(rates[1][p] / rates[0][p]);
    }
    const [mb, ma] = [median(rates[0]), median(rates[1])];
    const row = (label: string, r: number[]) => `  ${label.padEnd(7)} ${Math.round(median(r)).toLocaleString('en-US').padStart(9)} poses/s (passes ${r.map((x) => (x / 1000).toFixed(1)).join(' ')} k)`;
    console.log(row('before', rates[0]));
    console.log(row('after', rates[1]));
    console.log(`  after/before: ${(ma / mb).toFixed(3)} (ratio of medians), ${median(roundRatios).toFixed(3)} (median of per-round ratios)\n`);
  }
}

await main();
