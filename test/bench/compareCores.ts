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
 * Even so, one copy can draw a slow compilation for a whole process (an A/A run, the same core
 * twice, has shown ratios from 0.6 to 1.1 on a busy 2-core machine), so the comparison runs in
 * COMPARE_PROCESSES fresh processes (default 6), alternating which copy is loaded and warmed
 * first (the first copy ran several per cent off the second in one process, even for two
 * identical copies), and reports the median of their ratios and of each before-first and
 * after-first pair's geometric mean (order-balanced; use an even process count).
 *
 * Before timing, both copies solve the whole serpentine once and the script prints the largest
 * difference between their joint coordinates and statuses: a refactoring that should not
 * change the numbers shows 0 here.
 */

import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { collectGarbage, envelopeGrid, GROUND_MODE, linspace, loadDemoDesign, median, serpentineSweep, startClock, TILTING_DEMOS, TRAVEL_MODE } from './measure';
import type { MechanismGraph, PoseInputs } from '../../core/mechanism/MechanismGraph';
import type { PoseMode } from '../../core/mechanism/templates/buildMechanism';
import type { ResolvedDesign } from '../../core/design/types';

/** The little of a pose solver this script touches (true of every version so far). */
interface SolverLike {
  readonly mechanism: { readonly coord: Float64Array; readonly sph: Float64Array };
  solve(inputs: PoseInputs, warm?: boolean): { status: string; iterations: number; message: string };
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
const PROCESSES = Number(process.env.COMPARE_PROCESSES ?? 6);
/** Serpentine sweeps per timed pass, every other one backwards (a pass of a few tens of ms). */
const REPEATS = Number(process.env.COMPARE_REPEATS ?? 3);

async function loadCore(label: string, dir: string): Promise<CoreCopy> {
  const url = pathToFileURL(resolve(dir, 'solver/PoseSolver.ts')).href;
  const mod = (await import(url)) as { PoseSolver: SolverClass };
  return { label, dir, PoseSolver: mod.PoseSolver };
}

/**
 * One timed pass: poses[0] solved cold untimed, then REPEATS warm sweeps on a collected heap.
 * Returns poses per second of wall time and of this process's CPU time (the CPU reading is
 * steadier when other processes share the machine).
 */
function pass(solver: SolverLike, poses: PoseInputs[]): { wall: number; cpu: number } {
  solver.reset();
  solver.solve(poses[0], false);
  const n = poses.length;
  collectGarbage();
  const stop = startClock();
  for (let rep = 0; rep < REPEATS; rep++) {
    const back = rep % 2 === 1;
    for (let k = 0; k < n; k++) solver.solve(poses[back ? n - 1 - k : k]);
  }
  const clock = stop();
  return { wall: ((n * REPEATS) / clock.wallMs) * 1000, cpu: ((n * REPEATS) / clock.cpuMs) * 1000 };
}

/** Largest coordinate difference and status disagreements along one sweep (warm, or cold solves). */
function agreement(a: SolverLike, b: SolverLike, poses: PoseInputs[], warm = true): { maxDiff: number; statusDiffs: number; iterationDiffs: number; converged: number } {
  a.reset();
  b.reset();
  let maxDiff = 0;
  let statusDiffs = 0;
  let iterationDiffs = 0;
  let converged = 0;
  poses.forEach((p, i) => {
    const ra = a.solve(p, warm && i > 0);
    const rb = b.solve(p, warm && i > 0);
    if (ra.status !== rb.status || ra.message !== rb.message) statusDiffs++;
    if (ra.status === 'converged') converged++;
    if (ra.iterations !== rb.iterations) iterationDiffs++;
    for (const key of ['coord', 'sph'] as const) {
      const x = a.mechanism[key];
      const y = b.mechanism[key];
      for (let k = 0; k < x.length; k++) maxDiff = Math.max(maxDiff, Math.abs(x[k] - y[k]));
    }
  });
  return { maxDiff, statusDiffs, iterationDiffs, converged };
}

/**
 * One process's measurement: prints its table, then a JSON line of after/before ratios by
 * design. `afterFirst` loads, builds and warms the after copy first: the copy that goes first
 * has measured faster or slower by several per cent in a process (an A/A run showed it), so the
 * parent alternates the order between processes and the bias cancels in the median.
 */
async function measureHere(beforeDir: string, afterDir: string, afterFirst: boolean): Promise<void> {
  const loaded = afterFirst ? [await loadCore('after', afterDir), await loadCore('before', beforeDir)] : [await loadCore('before', beforeDir), await loadCore('after', afterDir)];
  const copies = afterFirst ? [loaded[1], loaded[0]] : loaded; // copies[0] is before, copies[1] after
  const firstIndex = afterFirst ? 1 : 0;
  const { buildMechanism } = (await import(pathToFileURL(resolve(afterDir, 'mechanism/templates/buildMechanism.ts')).href)) as { buildMechanism: BuildMechanism };
  const ratios: Record<string, number> = {};
  // The other constraint kinds (point heights in travel mode, wheel headings when a wheel angle
  // steers) and cold solves: same numbers too? Checked on smaller sweeps, untimed.
  for (const name of TILTING_DEMOS) {
    const design = loadDemoDesign(name);
    const checks: Array<[string, PoseMode, PoseInputs[], boolean]> = [
      ['travel mode, envelope grid 19 x 13 x 5', TRAVEL_MODE, envelopeGrid(design, 19, 13, 5).poses, true],
      ['wheel-angle steering, serpentine 21 x 21', { contact: 'ground', steerBy: 'leftWheel' }, serpentineSweep(linspace(-20, 20, 21), linspace(-20, 20, 21)).map((p) => ({ ...p, wheelAngleDeg: p.handlebarDeg, handlebarDeg: 0 })), true],
      ['cold solves, serpentine 9 x 9', GROUND_MODE, serpentineSweep(linspace(-20, 20, 9), linspace(-20, 20, 9)), false],
    ];
    for (const [what, mode, poses, warm] of checks) {
      const graph = buildMechanism(design, mode);
      const pair = copies.map((c) => new c.PoseSolver(structuredClone(graph)));
      const agree = agreement(pair[0], pair[1], poses, warm);
      console.log(`${name}, ${what} (${agree.converged}/${poses.length} converged): max |coordinate difference| ${agree.maxDiff.toExponential(2)}, status or message differences ${agree.statusDiffs}, iteration-count differences ${agree.iterationDiffs}`);
    }
  }
  for (const name of TILTING_DEMOS) {
    const graph = buildMechanism(loadDemoDesign(name), GROUND_MODE);
    const solvers: SolverLike[] = [];
    for (const i of [firstIndex, 1 - firstIndex]) solvers[i] = new copies[i].PoseSolver(structuredClone(graph));
    const poses = serpentineSweep();
    const agree = agreement(solvers[0], solvers[1], poses);
    console.log(`${name}: ${poses.length} poses; before vs after: max |coordinate difference| ${agree.maxDiff.toExponential(2)}, status or message differences ${agree.statusDiffs}, iteration-count differences ${agree.iterationDiffs}`);
    // Warm-up: one untimed pass each, the first copy first.
    for (const i of [firstIndex, 1 - firstIndex]) pass(solvers[i], poses);
    const wall: number[][] = [[], []];
    const cpu: number[][] = [[], []];
    for (let p = 0; p < PASSES; p++) {
      const order = p % 2 === 0 ? [firstIndex, 1 - firstIndex] : [1 - firstIndex, firstIndex];
      for (const i of order) {
        const r = pass(solvers[i], poses);
        wall[i].push(r.wall);
        cpu[i].push(r.cpu);
      }
    }
    const row = (label: string, i: number) =>
      `  ${label.padEnd(7)} ${Math.round(median(wall[i])).toLocaleString('en-US').padStart(9)} poses/s wall, ${Math.round(median(cpu[i])).toLocaleString('en-US').padStart(9)} per CPU s (wall passes ${wall[i].map((x) => (x / 1000).toFixed(1)).join(' ')} k)`;
    console.log(row('before', 0));
    console.log(row('after', 1));
    ratios[`${name} wall`] = median(wall[1]) / median(wall[0]);
    ratios[`${name} cpu`] = median(cpu[1]) / median(cpu[0]);
    console.log(`  after/before: ${ratios[`${name} wall`].toFixed(3)} wall, ${ratios[`${name} cpu`].toFixed(3)} CPU`);
  }
  console.log(JSON.stringify(ratios));
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const child = args[0] === '--child' || args[0] === '--child-after-first';
  const afterFirst = args[0] === '--child-after-first';
  if (child) args.shift();
  const beforeDir = args[0] ?? process.env.TILTBENCH_CORE_BEFORE;
  if (!beforeDir) {
    console.error('usage: npx tsx test/bench/compareCores.ts BEFORE_CORE_DIR [AFTER_CORE_DIR] (or set TILTBENCH_CORE_BEFORE)');
    process.exit(2);
  }
  const afterDir = args[1] ?? fileURLToPath(new URL('../../core', import.meta.url));
  if (child) return measureHere(beforeDir, afterDir, afterFirst);
  console.log(`before: ${resolve(beforeDir)}\nafter:  ${resolve(afterDir)}`);
  console.log(`${PROCESSES} processes (which copy goes first alternates between them); in each, ${PASSES} timed passes per copy, alternating; a pass is ${REPEATS} warm serpentine sweeps on a collected heap.\n`);
  const byDesign: Record<string, number[]> = {};
  for (let k = 0; k < PROCESSES; k++) {
    const flag = k % 2 === 0 ? '--child' : '--child-after-first';
    const out = execFileSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), flag, beforeDir, afterDir], { encoding: 'utf8', maxBuffer: 1 << 22 });
    const lines = out.trim().split('\n');
    console.log(`-- process ${k + 1} (${k % 2 === 0 ? 'before' : 'after'} first)\n${lines.slice(0, -1).join('\n')}`);
    for (const [name, r] of Object.entries(JSON.parse(lines[lines.length - 1]) as Record<string, number>)) (byDesign[name] ??= []).push(r);
  }
  console.log('\nafter/before poses/s, per process (before first, after first, ...) and median:');
  for (const [name, rs] of Object.entries(byDesign)) {
    // Each before-first process paired with the after-first one next to it: the geometric mean
    // of the pair cancels the first-copy advantage.
    const balanced: number[] = [];
    for (let k = 0; k + 1 < rs.length; k += 2) balanced.push(Math.sqrt(rs[k] * rs[k + 1]));
    const pairs = balanced.length > 0 ? `; order-balanced pairs ${balanced.map((r) => r.toFixed(3)).join(' ')}, median ${median(balanced).toFixed(3)}` : '';
    console.log(`  ${name.padEnd(33)} ${rs.map((r) => r.toFixed(3)).join(' ')}  median ${median(rs).toFixed(3)}${pairs}`);
  }
}

await main();
