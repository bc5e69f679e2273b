/**
 * What every solve of every fuzzed design must satisfy, as functions returning a list of
 * problems (empty when all is well), so a property can report them all at once.
 *
 * The checks on a converged pose do not trust the solver's own residuals: they rebuild each
 * loop's closure from the snapshot's body transforms (world = R p + t, written out here),
 * the frame's roll from the rotation about x, travel from the frame's own axes, and the road-
 * wheel angle from the spin axis with the ISO 8855 heading (SAE J670 / ISO 8855: yaw positive
 * to the left, x forward, y left, z up).
 */
import type { ResolvedDesign } from '../../../core/design/types';
import { buildMechanism, type PoseMode } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type MechanismGraph, type PoseInputs, type Vec3 } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver, type SolveResult, type SolveStatus } from '../../../core/solver/PoseSolver';
import { LevenbergMarquardt } from '../../../core/solver/levenbergMarquardt';
import { takeSnapshot, type PoseSnapshot } from '../../../core/analysis/poseSnapshot';
import { solveSinglePose, type PoseRequest } from '../../../core/analysis/solveSinglePose';
import type { FigureTally } from './fuzzFigures';

export const NAMED_STATUSES: readonly SolveStatus[] = ['converged', 'cannot-assemble', 'singular', 'did-not-converge', 'invalid-input'];

/** Longest a single solve may take before the test calls it a hang (generous: a loaded 2-core CI box). */
export const SOLVE_TIME_LIMIT_MS = 4000;

/** Closure tolerance for the independent re-check of a converged pose, mm (the solver's is 1e-9 mm). */
const CLOSURE_MM = 1e-6;

/**
 * Counts the Levenberg-Marquardt iterations actually run, whatever a result reports: wraps
 * LevenbergMarquardt.prototype.solve for the duration of a test file. Returns the uninstaller.
 */
export const lmCounter = { iterations: 0, runs: 0 };
export function installLmCounter(): () => void {
  const original = LevenbergMarquardt.prototype.solve;
  LevenbergMarquardt.prototype.solve = function (this: LevenbergMarquardt, ...args: Parameters<LevenbergMarquardt['solve']>) {
    const out = original.apply(this, args);
    lmCounter.iterations += out.iterations;
    lmCounter.runs++;
    return out;
  };
  return () => {
    LevenbergMarquardt.prototype.solve = original;
  };
}

/**
 * The most LM iterations one solve can run: the continuation splits the input change into
 * ceil(span) pieces (span in units of maxStepDeg / maxStepMm), each failure doubles the pieces
 * of what is left, at most maxBisections times, and each piece runs at most maxIterations.
 */
export function iterationBound(solver: PoseSolver, from: PoseInputs, to: PoseInputs): number {
  const o = solver.options;
  let span = 0;
  for (const k of Object.keys(to) as (keyof PoseInputs)[]) {
    const d = Math.abs(to[k] - from[k]);
    span = Math.max(span, k.endsWith('Deg') ? d / o.maxStepDeg : d / o.maxStepMm);
  }
  const pieces = (Math.ceil(span) + 1) * 2 ** (o.maxBisections + 1);
  return o.maxIterations * pieces;
}

/** Every number in a value that is NaN or infinite, and every string that spells one, with its path. */
export function nonFiniteIn(value: unknown, path = '', out: string[] = [], seen = new Set<unknown>()): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) out.push(`${path || '(value)'} = ${value}`);
  } else if (typeof value === 'string') {
    // A number printed from NaN, Infinity or a missing value ("undefined mm"); prose may say "undefined".
    if (/\bNaN\b|\bInfinity\b|\bundefined\s*(mm|deg|°|%)|^undefined$/.test(value)) out.push(`${path || '(value)'} reads "${value.slice(0, 200)}"`);
  } else if (typeof value === 'object' && value !== null && !seen.has(value)) {
    seen.add(value);
    if (ArrayBuffer.isView(value)) {
      Array.from(value as unknown as ArrayLike<number>).forEach((v, i) => nonFiniteIn(v, `${path}[${i}]`, out, seen));
    } else {
      for (const [k, v] of Object.entries(value)) nonFiniteIn(v, path ? `${path}.${k}` : k, out, seen);
    }
  }
  return out;
}

/** World position of design point p on body b from a snapshot (R column-major, world = R p + t). */
function worldOf(s: PoseSnapshot, b: number, p: Vec3): Vec3 {
  if (b < 0) return p;
  const { rotation: r, translation: t } = s.bodies[b];
  return [r[0] * p[0] + r[3] * p[1] + r[6] * p[2] + t[0], r[1] * p[0] + r[4] * p[1] + r[7] * p[2] + t[1], r[2] * p[0] + r[5] * p[1] + r[8] * p[2] + t[2]];
}
function dirOf(s: PoseSnapshot, b: number, d: Vec3): Vec3 {
  if (b < 0) return d;
  const r = s.bodies[b].rotation;
  return [r[0] * d[0] + r[3] * d[1] + r[6] * d[2], r[1] * d[0] + r[4] * d[1] + r[7] * d[2], r[2] * d[0] + r[5] * d[1] + r[8] * d[2]];
}
const dist = (a: Vec3, b: Vec3) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
const wrapDeg = (a: number) => a - 360 * Math.round(a / 360);

/**
 * Loops that must be closed in a converged pose, measured on the snapshot: coincident joints,
 * link lengths, tyres on the ground, travel relative to the frame, a road-wheel angle target,
 * the frame's roll.
 */
export function closureProblems(graph: MechanismGraph, s: PoseSnapshot, target: PoseInputs, scaleMm: number): string[] {
  const tol = CLOSURE_MM * Math.max(1, scaleMm / 1000);
  const problems: string[] = [];
  for (const c of graph.constraints) {
    switch (c.kind) {
      case 'coincident': {
        const gap = dist(worldOf(s, c.bodyA, c.pointA), worldOf(s, c.bodyB, c.pointB));
        if (!(gap <= tol)) problems.push(`${c.label}: joint open by ${gap} mm`);
        break;
      }
      case 'distance': {
        const err = Math.abs(dist(worldOf(s, c.bodyA, c.pointA), worldOf(s, c.bodyB, c.pointB)) - c.length);
        if (!(err <= tol)) problems.push(`${c.label}: length off by ${err} mm`);
        break;
      }
      case 'groundContact': {
        // A front wheel's contact from the snapshot; a rear wheel on its own body (a leaning rear
        // pair) from the tilted crown circle's lowest point: (R - r) sqrt(1 - a_z^2) below the centre, then r.
        const w = graph.wheels.find((x) => x.body === c.body);
        const a = dirOf(s, c.body, c.spinAxis);
        const z = w
          ? s.wheels[w.side].contactPoint[2]
          : worldOf(s, c.body, c.wheelCentre)[2] - (c.rollingRadius - c.crownRadius) * Math.sqrt(Math.max(0, 1 - a[2] * a[2] / (a[0] ** 2 + a[1] ** 2 + a[2] ** 2))) - c.crownRadius;
        if (!(Math.abs(z) <= tol)) problems.push(`${c.label}: contact point at z = ${z} mm`);
        break;
      }
      case 'pointHeight': {
        // Height of the point along the frame's own z axis, from the frame's origin.
        const f = c.refBody;
        const p = worldOf(s, c.body, c.point);
        const o = worldOf(s, f, [0, 0, 0]);
        const zAxis = dirOf(s, f, [0, 0, 1]);
        const h = (p[0] - o[0]) * zAxis[0] + (p[1] - o[1]) * zAxis[1] + (p[2] - o[2]) * zAxis[2];
        const want = c.point[2] + c.target.gain * target[c.target.input];
        if (!(Math.abs(h - want) <= tol)) problems.push(`${c.label}: height ${h} mm in the frame, wanted ${want} mm`);
        break;
      }
      case 'meanContactY': {
        // A lean linkage's frame place: the two front contact points' mean y is 0.
        const y = (s.wheels.left.contactPoint[1] + s.wheels.right.contactPoint[1]) / 2;
        if (!(Math.abs(y) <= tol)) problems.push(`${c.label}: mean contact y = ${y} mm`);
        break;
      }
      case 'wheelHeading': {
        const a = dirOf(s, c.body, c.spinAxis);
        const heading = (Math.atan2(-a[0], a[1]) * 180) / Math.PI;
        const want = (c.target.gain * target[c.target.input] * 180) / Math.PI;
        if (!(Math.abs(wrapDeg(heading - want)) <= 1e-6)) problems.push(`${c.label}: heading ${heading} deg, wanted ${want} deg`);
        break;
      }
    }
  }
  // The frame's rotation is the roll about x by the lean (right-hand rule), whatever else moved.
  const r = s.bodies[graph.frameBody].rotation;
  const lean = (target.leanDeg * Math.PI) / 180;
  const expected = [1, 0, 0, 0, Math.cos(lean), Math.sin(lean), 0, -Math.sin(lean), Math.cos(lean)];
  const off = Math.max(...expected.map((e, i) => Math.abs(e - r[i])));
  if (!(off <= 1e-9)) problems.push(`frame rotation is not a roll of ${target.leanDeg} deg about x (off by ${off})`);
  return problems;
}

export interface PoseCase {
  mode: PoseMode;
  inputs: PoseInputs;
  /** Continue from the previous pose (a sweep) or start from the design pose. */
  warm: boolean;
}

/** The poses tried on each design: inside the envelope, at its corners, and far beyond it. */
export function posePlan(design: ResolvedDesign, variant: number): PoseCase[] {
  const env = design.envelope;
  const lean = design.vehicle.tilting ? env.leanDeg : 0;
  const hb = Math.max(env.handlebarDeg, 5);
  const pose = (p: Partial<PoseInputs>): PoseInputs => ({ ...zeroInputs(), ...p });
  const ground: PoseMode = { contact: 'ground', steerBy: 'handlebar' };
  const cases: PoseCase[] = [
    { mode: ground, inputs: pose({}), warm: false },
    { mode: ground, inputs: pose({ leanDeg: lean, handlebarDeg: hb / 2 }), warm: true },
    { mode: ground, inputs: pose({ leanDeg: lean, handlebarDeg: hb }), warm: true },
    { mode: ground, inputs: pose({ leanDeg: -lean, handlebarDeg: -hb }), warm: true },
    { mode: ground, inputs: pose({ leanDeg: design.vehicle.tilting ? 60 : 0, handlebarDeg: 180 }), warm: false },
  ];
  const other = variant % 3;
  if (other === 0) {
    const travel: PoseMode = { contact: 'travel', steerBy: 'handlebar' };
    cases.push(
      { mode: travel, inputs: pose({ travelRightMm: env.bumpMm, travelLeftMm: -env.reboundMm, handlebarDeg: hb / 2 }), warm: false },
      { mode: travel, inputs: pose({ travelRightMm: -env.reboundMm, travelLeftMm: env.bumpMm, leanDeg: lean / 2, heaveMm: 10 }), warm: true },
      { mode: travel, inputs: pose({ travelRightMm: 1000, travelLeftMm: -1000 }), warm: false },
    );
  } else {
    const wheel: PoseMode = { contact: 'ground', steerBy: other === 1 ? 'leftWheel' : 'rightWheel' };
    cases.push(
      { mode: wheel, inputs: pose({ wheelAngleDeg: 10, leanDeg: lean / 2 }), warm: false },
      { mode: wheel, inputs: pose({ wheelAngleDeg: 30, leanDeg: lean / 2 }), warm: true },
      { mode: wheel, inputs: pose({ wheelAngleDeg: -85 }), warm: false },
    );
  }
  return cases;
}

/** Largest coordinate of a design, mm: the scale tolerances are relative to. */
export function designScaleMm(design: ResolvedDesign): number {
  let m = 1;
  const walk = (v: unknown) => {
    if (typeof v === 'number') m = Math.max(m, Math.abs(v));
    else if (typeof v === 'object' && v !== null) Object.values(v).forEach(walk);
  };
  walk(design.frontEnd);
  walk(design.upright);
  walk(design.steering);
  return m;
}

export function describeInputs(i: PoseInputs): string {
  return Object.entries(i)
    .filter(([, v]) => v !== 0)
    .map(([k, v]) => `${k}=${v}`)
    .join(' ') || 'design pose';
}

/** Problems with one solve result and the snapshot after it. */
export function resultProblems(
  graph: MechanismGraph,
  solver: PoseSolver,
  result: SolveResult,
  target: PoseInputs,
  elapsedMs: number,
  scaleMm: number,
): string[] {
  const problems: string[] = [];
  if (!NAMED_STATUSES.includes(result.status)) problems.push(`unnamed status ${String(result.status)}`);
  if (typeof result.message !== 'string' || result.message.trim() === '') problems.push('empty message');
  problems.push(...nonFiniteIn(result, 'result'));
  if (result.residualMm !== null && !(result.residualMm >= 0)) problems.push(`residualMm ${result.residualMm}`);
  for (const k of ['iterations', 'evaluations', 'substeps'] as const) {
    if (!Number.isInteger(result[k]) || result[k] < 0) problems.push(`${k} = ${result[k]}`);
  }
  // Bounded work: each continuation sub-step runs at most maxIterations LM iterations.
  const o = solver.options;
  if (result.iterations > o.maxIterations * Math.max(1, result.substeps)) {
    problems.push(`${result.iterations} iterations in ${result.substeps} sub-steps exceeds ${o.maxIterations} per sub-step`);
  }
  if (elapsedMs > SOLVE_TIME_LIMIT_MS) problems.push(`took ${elapsedMs.toFixed(0)} ms (limit ${SOLVE_TIME_LIMIT_MS} ms)`);
  if (result.status === 'converged' && !(result.residualMm !== null && result.residualMm <= o.toleranceMm)) {
    problems.push(`converged with residual ${result.residualMm} mm above the tolerance ${o.toleranceMm} mm`);
  }
  if (result.status !== 'converged' && result.status !== 'invalid-input' && result.culprit !== undefined && typeof result.culprit !== 'string') {
    problems.push('culprit is not a string');
  }
  let snapshot: PoseSnapshot | undefined;
  try {
    snapshot = takeSnapshot(solver.mechanism);
  } catch (e) {
    problems.push(`takeSnapshot threw ${(e as Error).message}`);
  }
  if (snapshot) {
    problems.push(...nonFiniteIn(snapshot, 'snapshot'));
    if (result.status === 'converged') {
      problems.push(...closureProblems(graph, snapshot, target, scaleMm));
      for (const k of ['leanDeg', 'heaveMm', 'travelRightMm', 'travelLeftMm'] as const) {
        if (snapshot.inputs[k] !== target[k] && graph.joints.some((j) => j.driver?.input === k)) {
          problems.push(`snapshot input ${k} = ${snapshot.inputs[k]}, solved for ${target[k]}`);
        }
      }
    }
  }
  return problems;
}

/** Solve every pose of the plan on one design; returns the problems found (empty = all good). */
export function exerciseDesign(design: ResolvedDesign, variant: number, tally: FigureTally, label: string): string[] {
  const problems: string[] = [];
  const scale = designScaleMm(design);
  const solvers = new Map<string, { graph: MechanismGraph; solver: PoseSolver }>();
  for (const pc of posePlan(design, variant)) {
    const key = `${pc.mode.contact}/${pc.mode.steerBy}`;
    let entry = solvers.get(key);
    if (!entry) {
      try {
        const graph = buildMechanism(design, pc.mode);
        entry = { graph, solver: new PoseSolver(graph) };
      } catch (e) {
        problems.push(`${label} ${key}: building the mechanism threw: ${(e as Error).message}`);
        continue;
      }
      solvers.set(key, entry);
    }
    const { graph, solver } = entry;
    let result: SolveResult;
    const from = pc.warm ? { ...solver.inputs } : zeroInputs();
    const lmBefore = lmCounter.iterations;
    const t0 = performance.now();
    try {
      result = solver.solve(pc.inputs, pc.warm);
    } catch (e) {
      problems.push(`${label} ${key} ${describeInputs(pc.inputs)}: solve threw: ${(e as Error).stack}`);
      continue;
    }
    const ms = performance.now() - t0;
    const lmIterations = lmCounter.iterations - lmBefore;
    tally.solve(result.status, ms, () => `${label}, ${key}, ${describeInputs(pc.inputs)}: ${result.status}`, lmIterations);
    const bound = iterationBound(solver, from, pc.inputs);
    if (lmIterations > bound) problems.push(`${label} ${key} ${describeInputs(pc.inputs)}: ${lmIterations} LM iterations, above the bound ${bound}`);
    for (const p of resultProblems(graph, solver, result, pc.inputs, ms, scale)) {
      problems.push(`${label} ${key} ${pc.warm ? 'warm' : 'cold'} ${describeInputs(pc.inputs)} -> ${result.status} (${result.message}): ${p}`);
    }
  }
  return problems;
}

/** The one-shot analysis (CLI `pose`): report and text must be finite and name the status. */
export function singlePoseProblems(design: ResolvedDesign, request: PoseRequest, tally: FigureTally, label: string): string[] {
  const problems: string[] = [];
  const t0 = performance.now();
  let out: ReturnType<typeof solveSinglePose>;
  try {
    out = solveSinglePose(design, request);
  } catch (e) {
    return [`${label}: solveSinglePose threw: ${(e as Error).stack}`];
  }
  const ms = performance.now() - t0;
  tally.solve(out.result.status, ms, () => `${label}, solveSinglePose: ${out.result.status}`);
  problems.push(...nonFiniteIn(out.report, 'report'));
  problems.push(...nonFiniteIn(out.text, 'text'));
  if (out.snapshot) problems.push(...nonFiniteIn(out.snapshot, 'snapshot'));
  if (!out.text.includes(out.result.status)) problems.push(`text does not name the status ${out.result.status}`);
  const solved = out.result.status === 'converged' || out.result.status === 'singular';
  if (solved !== (out.report.wheels !== undefined)) problems.push(`report wheels ${out.report.wheels ? 'present' : 'missing'} for status ${out.result.status}`);
  return problems.map((p) => `${label}: ${p}`);
}
