/**
 * Solver speed measurements, importable without side effects (test/bench/run.ts prints
 * them as a table; a later test may reuse the functions, but no timed unit test should
 * assert on them: wall-clock figures depend on the machine).
 *
 * Every timed function returns plain data: rates, iteration counts, how many poses did
 * not converge and the largest residual reached, so a figure is never reported without
 * the accuracy it was bought at.
 */

import { readFileSync } from 'node:fs';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { parseDesignText } from '../../core/design/validateDesign';
import { resolveDesign } from '../../core/design/resolveDesign';
import type { ResolvedDesign } from '../../core/design/types';
import { buildMechanism, type PoseMode } from '../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs } from '../../core/mechanism/MechanismGraph';
import { PoseSolver, type SolveResult } from '../../core/solver/PoseSolver';
import { CompiledMechanism } from '../../core/solver/CompiledMechanism';
import { FlatParameters } from './flatParameters';

// ---------------------------------------------------------------------------------------------
// Designs and pose sets
// ---------------------------------------------------------------------------------------------

/** The two tilting demo designs the bench runs on. */
export const TILTING_DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike'] as const;

/** Front-end mode of the warm sweep, the cold solves and the general-purpose comparison. */
export const GROUND_MODE: PoseMode = { contact: 'ground', steerBy: 'handlebar' };
/** Mode of the envelope sweep: wheel travel is an input. */
export const TRAVEL_MODE: PoseMode = { contact: 'travel', steerBy: 'handlebar' };

export function loadDemoDesign(name: string): ResolvedDesign {
  const url = new URL(`../../assets/designs/${name}.tiltsheet`, import.meta.url);
  const parsed = parseDesignText(readFileSync(url, 'utf8'), `${name}.tiltsheet`);
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
  return resolveDesign(parsed.design);
}

export function makeSolver(design: ResolvedDesign, mode: PoseMode): PoseSolver {
  return new PoseSolver(buildMechanism(design, mode));
}

function pose(fields: Partial<PoseInputs>): PoseInputs {
  // Same key order for every pose object (one hidden class in the solver's input loops).
  const p = zeroInputs();
  Object.assign(p, fields);
  return p;
}

/** n values from lo to hi inclusive, evenly spaced. */
export function linspace(lo: number, hi: number, n: number): number[] {
  if (n === 1) return [lo];
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? hi : lo + ((hi - lo) * i) / (n - 1)));
}

/**
 * Lean x steer serpentine: lean -20..20 step 0.5 (81 rows), handlebar -20..20 in 61 steps,
 * each row run in the opposite direction of the one before, so every pose is a neighbour of
 * the previous one.
 */
export function serpentineSweep(
  leans: number[] = linspace(-20, 20, 81),
  handlebars: number[] = linspace(-20, 20, 61),
): PoseInputs[] {
  const out: PoseInputs[] = [];
  leans.forEach((leanDeg, row) => {
    for (let k = 0; k < handlebars.length; k++) {
      const handlebarDeg = handlebars[row % 2 === 0 ? k : handlebars.length - 1 - k];
      out.push(pose({ leanDeg, handlebarDeg }));
    }
  });
  return out;
}

export interface EnvelopeGrid {
  poses: PoseInputs[];
  leanDeg: [number, number, number];
  handlebarDeg: [number, number, number];
  travelMm: [number, number, number];
}

/**
 * The design's lean x steer envelope times wheel travel (both wheels together), default
 * 91 x 61 x 9 with travel -40..40 mm, as a serpentine in all three dimensions (travel outer,
 * lean middle, handlebar inner) so every pose neighbours the previous one.
 */
export function envelopeGrid(design: ResolvedDesign, nLean = 91, nSteer = 61, nTravel = 9, travelMm = 40): EnvelopeGrid {
  const L = design.envelope.leanDeg;
  const H = design.envelope.handlebarDeg;
  const leans = linspace(-L, L, nLean);
  const bars = linspace(-H, H, nSteer);
  const travels = linspace(-travelMm, travelMm, nTravel);
  const poses: PoseInputs[] = [];
  let row = 0;
  travels.forEach((t, ti) => {
    for (let li = 0; li < leans.length; li++) {
      const leanDeg = leans[ti % 2 === 0 ? li : leans.length - 1 - li];
      for (let k = 0; k < bars.length; k++) {
        const handlebarDeg = bars[row % 2 === 0 ? k : bars.length - 1 - k];
        poses.push(pose({ leanDeg, handlebarDeg, travelRightMm: t, travelLeftMm: t }));
      }
      row++;
    }
  });
  return { poses, leanDeg: [-L, L, nLean], handlebarDeg: [-H, H, nSteer], travelMm: [-travelMm, travelMm, nTravel] };
}

/** Small seeded PRNG (mulberry32) so the random poses are the same every run. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Random poses inside the design's envelope: lean and handlebar uniform within +-envelope;
 * heave uniform in [-bump, +rebound] mm when heave is an input of this mechanism (heave up
 * lifts the frame, i.e. rebound), else 0.
 */
export function randomEnvelopePoses(design: ResolvedDesign, solver: PoseSolver, count: number, seed = 12345): PoseInputs[] {
  const rnd = seededRandom(seed);
  const heaveDriven = solver.mechanism.graph.joints.some((j) => j.driver?.input === 'heaveMm');
  const e = design.envelope;
  const out: PoseInputs[] = [];
  for (let i = 0; i < count; i++) {
    const leanDeg = (2 * rnd() - 1) * e.leanDeg;
    const handlebarDeg = (2 * rnd() - 1) * e.handlebarDeg;
    const heaveMm = heaveDriven ? -e.bumpMm + rnd() * (e.bumpMm + e.reboundMm) : 0;
    out.push(pose({ leanDeg, handlebarDeg, heaveMm }));
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Timing helpers
// ---------------------------------------------------------------------------------------------

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * A pass's clocks: wall time, and the CPU time of this (the main) thread. On a loaded
 * machine wall time includes waiting for a CPU; thread CPU time does not, so it is the
 * steadier measure of the code itself. It leaves out V8's helper threads (concurrent GC),
 * which would otherwise charge an allocation-heavy path for the second core it borrows.
 * Linux: /proc/self/task/<pid>/schedstat (nanoseconds on CPU of the main thread); elsewhere
 * the process's CPU time (all threads) stands in.
 */
export interface PassClock {
  wallMs: number;
  cpuMs: number;
}

const SCHEDSTAT = `/proc/self/task/${process.pid}/schedstat`;
const hasSchedstat = (() => {
  try {
    return Number.isFinite(Number(readFileSync(SCHEDSTAT, 'utf8').split(' ')[0]));
  } catch {
    return false;
  }
})();

/** What the CPU figures measure, for the report. */
export const CPU_CLOCK = hasSchedstat ? 'main-thread CPU time (schedstat)' : 'process CPU time (all threads)';

function cpuNowMs(): number {
  if (hasSchedstat) return Number(readFileSync(SCHEDSTAT, 'utf8').split(' ')[0]) / 1e6;
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
}

/**
 * A full garbage collection, run before every timed pass: each pass then starts from a clean
 * heap and pays only for its own garbage, never for what the pass before it left (the
 * general-purpose path allocates heavily; the pose solver almost nothing). Needs V8's gc(),
 * exposed here at run time so the bench needs no special node flags.
 */
const fullGc: () => void = (() => {
  setFlagsFromString('--expose-gc');
  const gc = runInNewContext('gc') as unknown;
  return typeof gc === 'function' ? (gc as () => void) : () => {};
})();

export function collectGarbage(): void {
  fullGc();
}

export function startClock(): () => PassClock {
  const c0 = cpuNowMs();
  const t0 = performance.now();
  return () => {
    const wallMs = performance.now() - t0;
    return { wallMs, cpuMs: cpuNowMs() - c0 };
  };
}

/** Rates (per second) of count items over each pass, wall and CPU. */
function rates(count: number[], clocks: PassClock[]): { wall: number[]; cpu: number[] } {
  return {
    wall: clocks.map((c, i) => (count[i] / c.wallMs) * 1000),
    cpu: clocks.map((c, i) => (count[i] / c.cpuMs) * 1000),
  };
}

export interface SweepStats {
  poses: number;
  /** Median over the timed passes, wall clock. */
  posesPerSecond: number;
  /** Median over the timed passes, per second of this process's CPU time. */
  cpuPosesPerSecond: number;
  /** Every timed pass, poses per second (wall clock). */
  passRates: number[];
  /** Every timed pass, poses per CPU second. */
  cpuPassRates: number[];
  /** Per pose, from the last timed pass. */
  avgIterations: number;
  /** Solves whose status was not 'converged' (any other status), last timed pass (all its repeats). */
  nonConverged: number;
  /** Count of each status, last timed pass. */
  statuses: Record<string, number>;
  /** Largest residual over the converged poses, mm. */
  maxResidualMm: number;
}

/**
 * Called after every solve of a timed sweep: the place for "with every measure" timing
 * (pose analysis on top of the solve). Must not change the solver's state.
 */
export type PoseHook = (mechanism: CompiledMechanism, inputs: PoseInputs, result: SolveResult) => void;

export interface SweepOptions {
  warmupPasses?: number;
  passes?: number;
  /** Solve warm (from the previous pose) or cold (from the design pose, solve(x, false)). */
  warm?: boolean;
  hook?: PoseHook;
  /** Run the sweep this many times per timed pass (every other time backwards). Default 1. */
  repeats?: number;
}

interface PassTally {
  clock: PassClock;
  /** Solves in the pass (poses times repeats). */
  solves: number;
  iterations: number;
  nonConverged: number;
  statuses: Record<string, number>;
  maxRes: number;
}

/**
 * One timed pass of the pose solver over the poses (a warm pass starts from poses[0], solved
 * untimed). With `repeats` > 1 the pass runs the sweep that many times in one clock, every
 * other time backwards, so each pose still neighbours the one before; a longer pass is less
 * exposed to a single scheduler hiccup. Tallies cover every repeat.
 */
function solverPass(solver: PoseSolver, poses: PoseInputs[], warm: boolean, hook?: PoseHook, repeats = 1): PassTally {
  solver.reset();
  if (warm) solver.solve(poses[0], false);
  let iterations = 0;
  let nonConverged = 0;
  let maxRes = 0;
  const statuses: Record<string, number> = {};
  const n = poses.length;
  collectGarbage();
  const stop = startClock();
  for (let rep = 0; rep < repeats; rep++) {
    const backwards = rep % 2 === 1;
    for (let k = 0; k < n; k++) {
      const i = backwards ? n - 1 - k : k;
      const r = solver.solve(poses[i], warm);
      if (hook) hook(solver.mechanism, poses[i], r);
      iterations += r.iterations;
      if (r.status !== 'converged') {
        nonConverged++;
        statuses[r.status] = (statuses[r.status] ?? 0) + 1;
      } else if (r.residualMm !== null && r.residualMm > maxRes) {
        maxRes = r.residualMm;
      }
    }
  }
  const clock = stop();
  statuses.converged = n * repeats - nonConverged;
  return { clock, iterations, nonConverged, statuses, maxRes, solves: n * repeats };
}

/**
 * Time a pose solver over a list of poses. For warm sweeps each pass starts from the first
 * pose already solved (untimed), so every timed solve is warm-started from its neighbour.
 */
export function timeSolverSweep(solver: PoseSolver, poses: PoseInputs[], opts: SweepOptions = {}): SweepStats {
  const { warmupPasses = 1, passes = 5, warm = true, hook, repeats = 1 } = opts;
  const clocks: PassClock[] = [];
  const counts: number[] = [];
  let last: PassTally | undefined;
  for (let pass = 0; pass < warmupPasses + passes; pass++) {
    last = solverPass(solver, poses, warm, hook, repeats);
    if (pass >= warmupPasses) {
      clocks.push(last.clock);
      counts.push(last.solves);
    }
  }
  const rate = rates(counts, clocks);
  return {
    poses: poses.length,
    posesPerSecond: median(rate.wall),
    cpuPosesPerSecond: median(rate.cpu),
    passRates: rate.wall,
    cpuPassRates: rate.cpu,
    avgIterations: last!.iterations / last!.solves,
    nonConverged: last!.nonConverged,
    statuses: last!.statuses,
    maxResidualMm: last!.maxRes,
  };
}

/** Warm-started sweep (the serpentine). */
export function timeWarmSweep(solver: PoseSolver, poses: PoseInputs[], opts: Omit<SweepOptions, 'warm'> = {}): SweepStats {
  return timeSolverSweep(solver, poses, { ...opts, warm: true });
}

/** Cold starts: solve(inputs, false) at each pose. */
export function timeColdSolves(solver: PoseSolver, poses: PoseInputs[], opts: Omit<SweepOptions, 'warm' | 'hook'> = {}): SweepStats {
  return timeSolverSweep(solver, poses, { ...opts, warm: false });
}

/**
 * The envelope sweep. Solver only unless a hook is given; with a hook ("every measure"),
 * the hook runs after each solve inside the timed loop.
 */
export function timeEnvelope(solver: PoseSolver, grid: EnvelopeGrid, opts: Omit<SweepOptions, 'warm'> = {}): SweepStats {
  return timeSolverSweep(solver, grid.poses, { warmupPasses: 1, passes: 3, ...opts, warm: true });
}

// ---------------------------------------------------------------------------------------------
// The general-purpose path: ml-levenberg-marquardt on the same residuals
// ---------------------------------------------------------------------------------------------

export interface GeneralOptions {
  /** 'finite-difference': the library's own Jacobian (residuals only); 'analytic': ours, via jacobianFunction. */
  jacobian: 'finite-difference' | 'analytic';
  /**
   * The library stops when the sum of squared residuals is <= this. 1e-18 mm^2 guarantees
   * max |r| <= 1e-9 mm, the pose solver's tolerance.
   */
  errorTolerance?: number;
  maxIterations?: number;
  /** Forward-difference step for every parameter (rad or mm). */
  gradientDifference?: number;
  warmupPasses?: number;
  passes?: number;
  /** Stop early once a pass has taken this long (ms); the figure is still per pose. */
  maxPassMs?: number;
  /**
   * Poses per interleaved slice: the pose solver solves a slice, then the general path solves
   * the same slice, and so on along the sweep (default 305, five serpentine rows: about 2 ms
   * of ours against 50-80 ms of the general path). Both sides' times are summed over the same
   * stretch of wall-clock time, so a change in machine speed (another tenant, frequency
   * scaling) lands on both instead of on whichever ran then.
   */
  sliceLength?: number;
}

export interface GeneralStats {
  poses: number;
  /** General path, median over the timed passes (wall clock, its slices only). */
  posesPerSecond: number;
  passRates: number[];
  avgIterations: number;
  /** Poses whose final max |residual| is above the pose solver's tolerance. */
  nonConverged: number;
  /** Largest final |residual| over all poses, mm. */
  maxResidualMm: number;
  /** Largest difference, in flat parameters (rad or mm), from the pose solver's solution. */
  maxDeviationFromOurs: number;
  /** Residual evaluations (whole residual vectors) per pose. */
  avgEvaluations: number;
  /** Median over the timed passes of (pose solver rate / general rate) over interleaved slices. */
  ratio: number;
  /** That ratio in every timed pass. */
  passRatios: number[];
  /** The pose solver's rates in the same passes (its slices only). */
  oursRates: number[];
}

/**
 * Solve the same sweep with ml-levenberg-marquardt: data x = residual index 0..m-1, y = 0,
 * the model returns residual i at parameter vector p (FlatParameters over its own copy of
 * the mechanism), warm-started from the previous pose's parameters. The pose solver runs the
 * same sweep interleaved with it, slice by slice (see sliceLength), each side continuing
 * from its own previous pose; each pass starts both at the first pose solved by our solver
 * (untimed), as the pose-solver sweep does.
 */
export function timeGeneralSweep(graphSolver: PoseSolver, poses: PoseInputs[], opts: GeneralOptions): GeneralStats {
  const {
    jacobian,
    errorTolerance = 1e-18,
    maxIterations = 100,
    gradientDifference = 1e-7,
    warmupPasses = 1,
    passes = 3,
    maxPassMs = Infinity,
    sliceLength = 305,
  } = opts;
  const solverTolerance = graphSolver.options.toleranceMm;
  // Our solutions along the sweep, for the branch check (untimed).
  graphSolver.reset();
  const mech = new CompiledMechanism(graphSolver.mechanism.graph);
  const flat = new FlatParameters(mech);
  const ourFlat = new FlatParameters(graphSolver.mechanism);
  const n = flat.nParams;
  const m = flat.nResiduals;
  const ours = new Float64Array(poses.length * n);
  const tmp = new Float64Array(n);
  graphSolver.solve(poses[0], false);
  for (let i = 0; i < poses.length; i++) {
    graphSolver.solve(poses[i]);
    ourFlat.get(tmp);
    ours.set(tmp, i * n);
  }
  const start = Array.from(ours.subarray(0, n));

  const x = Array.from({ length: m }, (_, i) => i);
  const y = new Array<number>(m).fill(0);
  const data = { x, y };
  let evaluations = 0;
  const rBuf = new Float64Array(m);
  const model = (p: number[]) => {
    evaluations++;
    flat.residuals(p, rBuf);
    const r = rBuf.slice();
    return (i: number) => r[i];
  };
  const jBuf = new Float64Array(m * n);
  const jacobianFunction = (p: number[]) => {
    flat.jacobian(p, jBuf);
    const j = jBuf.slice();
    return (i: number) => Array.from(j.subarray(i * n, i * n + n));
  };
  const libOptions = {
    errorTolerance,
    maxIterations,
    ...(jacobian === 'analytic' ? { jacobianFunction } : { gradientDifference }),
  };

  const mine = new Float64Array(poses.length * n);
  const generalRates: number[] = [];
  const oursRates: number[] = [];
  const passRatios: number[] = [];
  let iterations = 0;
  let solved = 0;
  for (let pass = 0; pass < warmupPasses + passes; pass++) {
    graphSolver.reset();
    graphSolver.solve(poses[0], false);
    let p = start;
    iterations = 0;
    evaluations = 0;
    let oursMs = 0;
    let generalMs = 0;
    collectGarbage();
    let i = 0;
    while (i < poses.length && generalMs <= maxPassMs) {
      const end = Math.min(poses.length, i + sliceLength);
      const t0 = performance.now();
      for (let k = i; k < end; k++) graphSolver.solve(poses[k]);
      const t1 = performance.now();
      for (let k = i; k < end; k++) {
        mech.applyInputs(poses[k]);
        const res = levenbergMarquardt(data, model, { ...libOptions, initialValues: p });
        p = res.parameterValues;
        iterations += res.iterations;
        for (let q = 0; q < n; q++) mine[k * n + q] = p[q];
      }
      const t2 = performance.now();
      oursMs += t1 - t0;
      generalMs += t2 - t1;
      i = end;
    }
    solved = i;
    if (pass >= warmupPasses) {
      generalRates.push((solved / generalMs) * 1000);
      oursRates.push((solved / oursMs) * 1000);
      passRatios.push(generalMs / oursMs);
    }
  }
  // Accuracy and branch, untimed, over the last pass.
  let maxRes = 0;
  let nonConverged = 0;
  let maxDev = 0;
  const p = new Float64Array(n);
  for (let i = 0; i < solved; i++) {
    mech.applyInputs(poses[i]);
    for (let k = 0; k < n; k++) {
      p[k] = mine[i * n + k];
      maxDev = Math.max(maxDev, Math.abs(p[k] - ours[i * n + k]));
    }
    const worst = flat.maxResidual(p);
    maxRes = Math.max(maxRes, worst);
    if (!(worst < solverTolerance)) nonConverged++;
  }
  graphSolver.reset();
  return {
    poses: solved,
    posesPerSecond: median(generalRates),
    passRates: generalRates,
    avgIterations: iterations / solved,
    nonConverged,
    maxResidualMm: maxRes,
    maxDeviationFromOurs: maxDev,
    avgEvaluations: evaluations / solved,
    ratio: median(passRatios),
    passRatios,
    oursRates,
  };
}
