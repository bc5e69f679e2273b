/**
 * A tuning plan: which hardpoint coordinates the optimiser may move and how far, what it
 * minimises (weighted objectives), what it must keep (constraints) and where it looks (poses).
 *
 * Plain data, written as JSON by a person (`tiltbench tune --plan PLAN.json`) or built by the
 * workbench. `readTunePlan` checks a plan against the design and names the field at fault
 * ("variables[2].rangeMm: ...") so a bad plan is refused before any solve.
 *
 * Variables are offsets from the design as it is, in mm, in the directions a designer thinks
 * in (studyCoordinates.ts): x forward, z up, y outward for a point on each side. A mirrored
 * pair moves together unless the id names a side. Besides the hardpoint coordinates there is
 * the tie-rod length: its inner joint (on the crank, lever or rack) moved along the rod's own
 * line, positive = a longer rod.
 */

import type { DesignFile, Vec3Mm } from '../design/types';
import { isTwoSided, resolveSidedVec } from '../design/resolveDesign';
import { studyCoordinates, type StudyCoordinate } from './studyCoordinates';
import type { StudyPose } from './studyPoses';

/** What the optimiser minimises; each is a sampled residual over the poses. */
export type TuneMeasure = 'selfSteer' | 'slip' | 'ratioChange' | 'ackermann' | 'steeringRatio';

export const TUNE_MEASURES: readonly TuneMeasure[] = ['selfSteer', 'slip', 'ratioChange', 'ackermann', 'steeringRatio'];

export const MEASURE_WORDS: Record<TuneMeasure, string> = {
  selfSteer: 'self-steer (lean and bump steer)',
  slip: 'slip angle (toe mismatch)',
  ratioChange: 'steering-ratio change with lean',
  ackermann: 'Ackermann percentage toward a target',
  steeringRatio: 'overall steering ratio toward a target (upright poses)',
};

export interface TuneObjective {
  measure: TuneMeasure;
  /** Relative weight (> 0); residuals are scaled by the design's tolerance, so weights compare like with like. */
  weight: number;
  /** Target of 'ackermann' (%, default 100) or 'steeringRatio' (handlebar deg per road-wheel deg, required). */
  target?: number;
}

export interface TuneVariable {
  /** A coordinate id as studyCoordinates gives it ('steering.tieRodJoint:z', 'upright.steeringArmJoint.left:x') or 'tieRod.length' ('.left' / '.right' for one side). */
  id: string;
  /** Offsets allowed from the design as it is, mm: [lowest, highest], lowest <= 0 <= highest. */
  rangeMm: [number, number];
}

export interface TuneConstraints {
  /** Every joint's articulation inside its rating minus the design's margin (default true). */
  jointMargin: boolean;
  /** Every modelled pair of parts at least the design's clearance apart (default true). */
  clearance: boolean;
  /** Smallest transmission angle of the steering linkage, deg (default 10). */
  transmissionFloorDeg: number;
}

export interface TunePlan {
  variables: TuneVariable[];
  objectives: TuneObjective[];
  constraints: TuneConstraints;
  /** Poses to tune over; 'region' (default): the operating-region sample studyPoses.ts takes. */
  poses: 'region' | StudyPose[];
  /** Starts of the optimiser: the design as it is, then seeded points inside the ranges (default 3). */
  starts: number;
  /** Iterations per start (default 25). */
  maxIterations: number;
  /** Seed of the extra starts (default 1). */
  seed: number;
}

export const DEFAULT_CONSTRAINTS: TuneConstraints = { jointMargin: true, clearance: true, transmissionFloorDeg: 10 };
export const MAX_TUNE_VARIABLES = 24;
export const MAX_TUNE_RANGE_MM = 100;
export const MAX_TUNE_STARTS = 10;
export const MAX_TUNE_ITERATIONS = 200;
export const MAX_TUNE_POSES = 50;

/** A plan that cannot be used; the message names the field. */
export class TunePlanError extends Error {}

/** A tune variable resolved against the design. */
export type ResolvedVariable =
  | { kind: 'coordinate'; id: string; coordinate: StudyCoordinate; lo: number; hi: number; words: string }
  | { kind: 'tieRodLength'; id: string; side: 'both' | 'left' | 'right'; lo: number; hi: number; words: string };

type Obj = Record<string, unknown>;

function isObj(x: unknown): x is Obj {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function num(x: unknown, field: string, lo: number, hi: number, unit: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new TunePlanError(`${field}: expected a number${unit ? ` in ${unit}` : ''}, found ${JSON.stringify(x) ?? 'nothing'}`);
  if (x < lo || x > hi) throw new TunePlanError(`${field}: ${x}${unit ? ' ' + unit : ''} is outside ${lo}..${hi}`);
  return x;
}

function onlyKeys(o: Obj, field: string, keys: string[]): void {
  for (const k of Object.keys(o)) {
    if (!keys.includes(k)) throw new TunePlanError(`${field}: unknown field "${k.slice(0, 60)}"; fields: ${keys.join(', ')}`);
  }
}

const TIE_ROD_LENGTH = /^tieRod\.length(?:\.(left|right))?$/;

/** Every id a plan may name for this design: the coordinates (both forms) and the tie-rod lengths. */
export function tuneVariableIds(file: DesignFile): string[] {
  const coords = [...studyCoordinates(file, 'together'), ...studyCoordinates(file, 'each')].map((c) => c.id);
  // A one-piece track rod has no inner joints to move along the rod: its length is its ends' coordinates.
  return file.steering.kind === 'trackRod' ? coords : coords.concat(['tieRod.length', 'tieRod.length.left', 'tieRod.length.right']);
}

/** Resolve a variable id against the design, or say why it is not one. */
export function resolveVariable(file: DesignFile, v: TuneVariable, field: string): ResolvedVariable {
  const [lo, hi] = v.rangeMm;
  const m = TIE_ROD_LENGTH.exec(v.id);
  if (m && file.steering.kind === 'trackRod') {
    throw new TunePlanError(`${field}.id: "${v.id}" is not a variable of this design: its one-piece track rod has no inner tie-rod joints to move; vary the steering-arm joints (upright.steeringArmJoint) instead`);
  }
  if (m) {
    const side = (m[1] as 'left' | 'right' | undefined) ?? 'both';
    return { kind: 'tieRodLength', id: v.id, side, lo, hi, words: `tie-rod length${side === 'both' ? ' (both sides)' : `, ${side}`}, longer` };
  }
  const all = [...studyCoordinates(file, 'together'), ...studyCoordinates(file, 'each')];
  const c = all.find((x) => x.id === v.id);
  if (!c) {
    const near = all.filter((x) => x.id.split(':')[0] === v.id.split(':')[0]).map((x) => x.id);
    const hint = near.length > 0 ? `; did you mean ${near.slice(0, 3).join(', ')}` : '; `tiltbench tune --list-variables <design>` lists them';
    throw new TunePlanError(`${field}.id: "${v.id.slice(0, 80)}" is not a hardpoint coordinate of this design${hint}`);
  }
  const inward = inwardRoom(file, c);
  if (inward !== null && lo < -inward.allowed) {
    // A sided point moved inward past the centre line would end on the other side, and the
    // optimiser could write a design the validator refuses: the range stops 1 mm short of it.
    const limited = -inward.allowed;
    if (!(hi - limited > 0)) {
      throw new TunePlanError(`${field}.rangeMm: the ${c.point} is ${inward.distance.toFixed(1)} mm from the centre line, too close to move it inward; give a range from 0 outward`);
    }
    return { kind: 'coordinate', id: v.id, coordinate: c, lo: limited, hi, words: `${c.point}, ${c.direction} (inward at most ${inward.allowed.toFixed(1)} mm: the centre line)` };
  }
  return { kind: 'coordinate', id: v.id, coordinate: c, lo, hi, words: `${c.point}, ${c.direction}` };
}

/** Clearance kept between a sided point and the centre line when a tune moves it inward (mm). */
const CENTRE_LINE_CLEARANCE_MM = 1;

/**
 * How far a sided point's y coordinate may move inward (toward y = 0) and still stay on its
 * side with CENTRE_LINE_CLEARANCE_MM to spare: the nearer side's distance when the pair moves
 * together. Null for x, z and points on the centre line.
 */
function inwardRoom(file: DesignFile, c: StudyCoordinate): { distance: number; allowed: number } | null {
  if (c.axis !== 'y' || c.side === null) return null;
  let value: unknown = file;
  for (const k of c.key.split('.')) value = (value as Record<string, unknown> | undefined)?.[k];
  if (value === undefined || value === null || typeof value !== 'object') return null;
  const both = isTwoSided(value as Vec3Mm | { right: Vec3Mm; left: Vec3Mm }) ? (value as { right: Vec3Mm; left: Vec3Mm }) : resolveSidedVec(value as Vec3Mm);
  const sides = c.side === 'both' ? (['right', 'left'] as const) : [c.side];
  const distance = Math.min(...sides.map((s) => (s === 'right' ? -both[s].y : both[s].y)));
  if (!Number.isFinite(distance)) return null;
  return { distance, allowed: Math.max(0, distance - CENTRE_LINE_CLEARANCE_MM) };
}

function readVariable(x: unknown, field: string): TuneVariable {
  if (!isObj(x)) throw new TunePlanError(`${field}: expected an object { "id": ..., "rangeMm": [lowest, highest] }`);
  onlyKeys(x, field, ['id', 'rangeMm']);
  if (typeof x.id !== 'string' || x.id === '') throw new TunePlanError(`${field}.id: expected a coordinate id such as "steering.tieRodJoint:z"`);
  const r = x.rangeMm;
  if (!Array.isArray(r) || r.length !== 2) throw new TunePlanError(`${field}.rangeMm: expected [lowest, highest] in mm`);
  const lo = num(r[0], `${field}.rangeMm[0]`, -MAX_TUNE_RANGE_MM, 0, 'mm');
  const hi = num(r[1], `${field}.rangeMm[1]`, 0, MAX_TUNE_RANGE_MM, 'mm');
  if (hi - lo <= 0) throw new TunePlanError(`${field}.rangeMm: the range is empty (${lo}..${hi} mm); it must include the design as it is (0)`);
  return { id: x.id, rangeMm: [lo, hi] };
}

function readObjective(x: unknown, field: string): TuneObjective {
  if (!isObj(x)) throw new TunePlanError(`${field}: expected an object { "measure": ..., "weight": ... }`);
  onlyKeys(x, field, ['measure', 'weight', 'target']);
  if (typeof x.measure !== 'string' || !(TUNE_MEASURES as readonly string[]).includes(x.measure)) {
    throw new TunePlanError(`${field}.measure: expected one of ${TUNE_MEASURES.join(', ')}, found ${JSON.stringify(x.measure)?.slice(0, 60) ?? 'nothing'}`);
  }
  const measure = x.measure as TuneMeasure;
  const weight = x.weight === undefined ? 1 : num(x.weight, `${field}.weight`, 1e-6, 1e6, '');
  const o: TuneObjective = { measure, weight };
  if (measure === 'ackermann') o.target = x.target === undefined ? 100 : num(x.target, `${field}.target`, -100, 200, '%');
  else if (measure === 'steeringRatio') {
    if (x.target === undefined) throw new TunePlanError(`${field}.target: a steering-ratio objective needs a target ratio (handlebar deg per road-wheel deg)`);
    o.target = num(x.target, `${field}.target`, 0.05, 50, '');
  } else if (x.target !== undefined) throw new TunePlanError(`${field}.target: ${measure} is driven toward zero and takes no target`);
  return o;
}

function readPoses(x: unknown): 'region' | StudyPose[] {
  if (x === undefined || x === 'region') return 'region';
  if (!Array.isArray(x) || x.length === 0) throw new TunePlanError(`poses: expected "region" or a list of { "leanDeg", "handlebarDeg", "travelMm" }`);
  if (x.length > MAX_TUNE_POSES) throw new TunePlanError(`poses: ${x.length} poses; at most ${MAX_TUNE_POSES}`);
  return x.map((p, i) => {
    const field = `poses[${i}]`;
    if (!isObj(p)) throw new TunePlanError(`${field}: expected { "leanDeg", "handlebarDeg", "travelMm" }`);
    onlyKeys(p, field, ['leanDeg', 'handlebarDeg', 'travelMm']);
    return {
      leanDeg: num(p.leanDeg ?? 0, `${field}.leanDeg`, -80, 80, 'deg'),
      handlebarDeg: num(p.handlebarDeg ?? 0, `${field}.handlebarDeg`, -180, 180, 'deg'),
      travelMm: num(p.travelMm ?? 0, `${field}.travelMm`, -300, 300, 'mm'),
    };
  });
}

/** Check a plan (parsed JSON) against the design; throws TunePlanError naming the field. */
export function readTunePlan(json: unknown, file: DesignFile): { plan: TunePlan; variables: ResolvedVariable[] } {
  if (!isObj(json)) throw new TunePlanError('the plan: expected a JSON object with "variables" and "objectives"');
  onlyKeys(json, 'the plan', ['variables', 'objectives', 'constraints', 'poses', 'starts', 'maxIterations', 'seed']);
  if (!Array.isArray(json.variables) || json.variables.length === 0) throw new TunePlanError('variables: expected a non-empty list of { "id", "rangeMm" }');
  if (json.variables.length > MAX_TUNE_VARIABLES) throw new TunePlanError(`variables: ${json.variables.length} variables; at most ${MAX_TUNE_VARIABLES}`);
  const variables = json.variables.map((v, i) => readVariable(v, `variables[${i}]`));
  const seen = new Set<string>();
  variables.forEach((v, i) => {
    if (seen.has(v.id)) throw new TunePlanError(`variables[${i}].id: "${v.id}" is listed twice`);
    seen.add(v.id);
  });
  if (!Array.isArray(json.objectives) || json.objectives.length === 0) throw new TunePlanError(`objectives: expected a non-empty list of { "measure", "weight" }; measures: ${TUNE_MEASURES.join(', ')}`);
  const objectives = json.objectives.map((o, i) => readObjective(o, `objectives[${i}]`));
  const c = json.constraints === undefined ? {} : json.constraints;
  if (!isObj(c)) throw new TunePlanError('constraints: expected an object { "jointMargin", "clearance", "transmissionFloorDeg" }');
  onlyKeys(c, 'constraints', ['jointMargin', 'clearance', 'transmissionFloorDeg']);
  for (const k of ['jointMargin', 'clearance'] as const) {
    if (c[k] !== undefined && typeof c[k] !== 'boolean') throw new TunePlanError(`constraints.${k}: expected true or false`);
  }
  const constraints: TuneConstraints = {
    jointMargin: (c.jointMargin as boolean | undefined) ?? DEFAULT_CONSTRAINTS.jointMargin,
    clearance: (c.clearance as boolean | undefined) ?? DEFAULT_CONSTRAINTS.clearance,
    transmissionFloorDeg: c.transmissionFloorDeg === undefined ? DEFAULT_CONSTRAINTS.transmissionFloorDeg : num(c.transmissionFloorDeg, 'constraints.transmissionFloorDeg', 0, 60, 'deg'),
  };
  const plan: TunePlan = {
    variables,
    objectives,
    constraints,
    poses: readPoses(json.poses),
    starts: json.starts === undefined ? 3 : Math.round(num(json.starts, 'starts', 1, MAX_TUNE_STARTS, '')),
    maxIterations: json.maxIterations === undefined ? 25 : Math.round(num(json.maxIterations, 'maxIterations', 1, MAX_TUNE_ITERATIONS, '')),
    seed: json.seed === undefined ? 1 : num(json.seed, 'seed', 0, 0xffffffff, ''),
  };
  if (!Number.isInteger(plan.seed)) throw new TunePlanError(`seed: expected a whole number 0..4294967295, found ${plan.seed}`);
  return { plan, variables: checkVariables(file, plan) };
}

/** Resolve every variable and refuse two that move the same thing. */
export function checkVariables(file: DesignFile, plan: TunePlan): ResolvedVariable[] {
  const resolved = plan.variables.map((v, i) => resolveVariable(file, v, `variables[${i}]`));
  // A pair and one of its sides, or a tie-rod length on both and one side, move the same coordinate twice.
  const owner = new Map<string, number>();
  resolved.forEach((r, i) => {
    const keys =
      r.kind === 'tieRodLength'
        ? (r.side === 'both' ? ['left', 'right'] : [r.side]).map((s) => `tieRod.length.${s}`)
        : (r.coordinate.side === 'both' ? ['left', 'right'] : [r.coordinate.side ?? 'centre']).map((s) => `${r.coordinate.key}.${s}:${r.coordinate.axis}`);
    for (const k of keys) {
      const j = owner.get(k);
      if (j !== undefined) throw new TunePlanError(`variables[${i}].id: "${r.id}" moves what variables[${j}] ("${resolved[j].id}") moves`);
      owner.set(k, i);
    }
  });
  return resolved;
}
