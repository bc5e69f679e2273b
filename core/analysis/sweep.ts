/**
 * Sweeps over a grid of lean x handlebar x travel with every measure at every pose.
 *
 * One PoseSolver (one mode) does the whole sweep, stepping warm through neighbouring poses
 * in serpentine order (travel outermost, then lean, handlebar innermost; each row and each
 * layer run opposite to the one before), so the linkage stays on the assembly branch it
 * started on and each solve starts next to its answer. A pose the solver cannot reach is
 * reported with its status and no numbers; the solver then goes on from the last good pose.
 *
 * The travel axis: with contact 'ground' (tyres on the ground, the default) travel t lowers
 * the frame by t (heave = -t), so at zero lean both wheel centres rise t relative to the frame
 * (bump positive); a centre-pivot front end on the ground has its ride height set by the
 * linkage, so it takes no travel axis there. With contact 'travel' both wheel centres are
 * held at travel t relative to the frame (a centre-pivot pair takes it on the right wheel).
 *
 * Measures that need other poses are filled in here from the grid itself (relativeMeasures.ts):
 * an upright pass (zero lean and travel, each handlebar value) run first gives the base pose
 * and the upright local ratios; each row's neighbouring handlebar values give the local ratio;
 * the row's straight-ahead cell gives self-steer and front lift (when the handlebar values do
 * not include 0, the engine solves straight ahead for each row).
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs, type PoseInputs } from '../mechanism/MechanismGraph';
import type { FailedPose, PoseAnalysis } from './analysisTypes';
import { failedPose } from './PoseAnalyser';
import { PoseEngine } from './PoseEngine';
import { completeMeasures, ratioBetween, type BaseSteer, type PoseRelatives, type Relative } from './relativeMeasures';
import { VERDICT_ORDER, type Verdict } from './tolerance';
import { inRidingRegion, turnOf, type RegionVerdict, type Turn } from './ridingRegion';

export type SweepContact = 'ground' | 'travel';

export interface SweepAxes {
  leanDeg: number[];
  handlebarDeg: number[];
  travelMm: number[];
}

export interface SweepOptions {
  contact?: SweepContact;
  /** Write findings (words) for each pose outside tolerance (default false: faster). */
  findings?: boolean;
  /** Called every `progressEvery` poses and once at the end. */
  onProgress?: (done: number, total: number) => void;
  progressEvery?: number;
  /** Run on this engine's solvers (its mode must steer by handlebar with the sweep's contact). */
  engine?: PoseEngine;
  /**
   * The upright pass already run for these handlebar values (`uprightReferences`): a grid
   * swept in slices (the CLI writes each slice as it comes) runs it once, not per slice.
   */
  upright?: UprightReferences;
}

/** Grid position and the inputs asked for. */
export interface SweepPoint {
  leanIndex: number;
  handlebarIndex: number;
  travelIndex: number;
  leanDeg: number;
  handlebarDeg: number;
  travelMm: number;
}

export type SweepCell = SweepPoint & {
  /** Whether the pose lies in the design's operating region (ridingRegion.ts). */
  region: RegionVerdict;
} & ({ ok: true; analysis: PoseAnalysis } | { ok: false; failure: FailedPose });

export interface SweepSummary {
  poses: number;
  solved: number;
  failed: number;
  byStatus: Record<Verdict, number>;
  /** Poses solved (main grid plus the reference pass). */
  solves: number;
  /** Poses in the operating region. */
  inRegion: number;
  /** The turn each handlebar value makes upright (zero lean and travel), in handlebar order. */
  uprightTurns: Turn[];
  elapsedMs: number;
}

/** Invalid sweep input (the CLI exits 2 on it). */
export class SweepInputError extends Error {}

/** Every axis has values, all finite (any sweep's axes, named as the caller names them). */
export function checkAxisValues(axes: Record<string, number[]>): void {
  for (const [name, values] of Object.entries(axes)) {
    if (values.length === 0) throw new SweepInputError(`the ${name} axis has no values`);
    for (const x of values) if (!Number.isFinite(x)) throw new SweepInputError(`the ${name} axis has a value that is not a finite number`);
  }
}

export function checkAxes(design: ResolvedDesign, axes: SweepAxes, contact: SweepContact): void {
  checkAxisValues({ ...axes });
  if (!design.vehicle.tilting && axes.leanDeg.some((x) => x !== 0)) {
    throw new SweepInputError('the design does not tilt (vehicle.tilting is false): lean must be 0');
  }
  if (contact === 'ground' && design.frontEnd.kind === 'centrePivot' && axes.travelMm.some((x) => x !== 0)) {
    throw new SweepInputError(
      'a centre-pivot front end with both tyres on the ground has its ride height set by the linkage: ' +
        'sweep travel with contact "travel" (wheel travel relative to the frame) instead',
    );
  }
}

function setTravel(p: PoseInputs, contact: SweepContact, travel: number): void {
  if (contact === 'ground') {
    p.heaveMm = -travel;
    p.travelRightMm = 0;
    p.travelLeftMm = 0;
  } else {
    p.heaveMm = 0;
    p.travelRightMm = travel;
    p.travelLeftMm = travel;
  }
}

function emptyCounts(): Record<Verdict, number> {
  const c = {} as Record<Verdict, number>;
  for (const s of VERDICT_ORDER) c[s] = 0;
  return c;
}

/** Which grid index the k-th step of a serpentine pass visits. */
const serpentine = (k: number, n: number, forward: boolean): number => (forward ? k : n - 1 - k);

/** The local ratio of cell i of a row from its neighbours in the row (one-sided at the ends). */
function rowNeighbours(row: (PoseAnalysis | null)[], i: number): PoseRelatives['neighbours'] {
  const here = row[i];
  const lower = i > 0 ? row[i - 1] : here;
  const upper = i < row.length - 1 ? row[i + 1] : here;
  if (!here || !lower || !upper || lower === upper) {
    return { reason: row.length < 2 ? NO_ROW_NEIGHBOURS : 'a neighbouring pose along the handlebar could not be solved' };
  }
  return { value: { lower, upper } };
}

const NO_ROW_NEIGHBOURS = 'the sweep has one handlebar value: no neighbouring pose for the local ratio';

/** What the upright pass (zero lean and travel, every handlebar value) gives every row. */
export interface UprightReferences {
  /** Local ratio upright at each handlebar value: the reference of the ratio change. */
  ratio: Relative<number>[];
  /** The turn each handlebar value makes upright (a failed cell's region uses it). */
  turns: Turn[];
  /** Road-wheel angles at zero lean, travel and handlebar. */
  base: Relative<BaseSteer>;
  solves: number;
}

const turnAt = (a: PoseAnalysis | null): Turn => (a ? turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm) : { side: 'straight' });

/**
 * The upright pass, ascending along the handlebar, run first on the grid's own solver; its
 * local ratios come from the same grid spacing as every row's, so the ratio change compares
 * like with like.
 */
export function uprightReferences(engine: PoseEngine, axes: Pick<SweepAxes, 'handlebarDeg'>, contact: SweepContact): UprightReferences {
  const input = zeroInputs();
  setTravel(input, contact, 0);
  const row: (PoseAnalysis | null)[] = axes.handlebarDeg.map((bar) => {
    input.handlebarDeg = bar;
    return engine.main.analyse(input);
  });
  const ratio = row.map((_, i): Relative<number> => {
    const n = rowNeighbours(row, i);
    return 'value' in n ? ratioBetween(n.value.lower, n.value.upper) : { reason: `upright: ${n.reason}` };
  });
  const straight = axes.handlebarDeg.indexOf(0);
  const s = straight >= 0 ? row[straight] : null;
  const base: Relative<BaseSteer> = s ? { value: { leftDeg: s.wheels.left.steerDeg, rightDeg: s.wheels.right.steerDeg } } : engine.baseSteer();
  return { ratio, turns: row.map(turnAt), base, solves: row.length };
}

/**
 * Run a sweep; `onCell` receives every cell once, row by row (a row is one lean and travel,
 * all handlebar values, in ascending handlebar order). The sweep runs on the engine's main
 * solver (given, or made for the design in handlebar mode with the sweep's contact). The pose
 * loop is written out in one piece with literal objects: it runs per pose, and V8's object
 * spread and extra closures there cost measurable time.
 */
export function runSweep(design: ResolvedDesign, axes: SweepAxes, options: SweepOptions, onCell: (cell: SweepCell) => void): SweepSummary {
  const contact = options.contact ?? 'ground';
  checkAxes(design, axes, contact);
  const t0 = Date.now();
  const engine = options.engine ?? new PoseEngine(design, { contact, steerBy: 'handlebar' }, { findings: options.findings ?? false });
  const words = options.findings ?? false;
  const tol = design.tolerances;
  const grid = engine.main;
  const nL = axes.leanDeg.length;
  const nS = axes.handlebarDeg.length;
  const nT = axes.travelMm.length;
  const total = nL * nS * nT;
  const every = Math.max(1, options.progressEvery ?? 500);
  const input = zeroInputs();
  const upright = options.upright ?? uprightReferences(engine, axes, contact);
  let solves = options.upright ? 0 : upright.solves;
  const tilting = design.vehicle.tilting;
  // A cell's region from the turn it makes; a cell that failed takes the upright turn of its handlebar.
  const regionOf = (lean: number, a: PoseAnalysis | null, si: number): RegionVerdict =>
    inRidingRegion(lean, a ? turnAt(a) : upright.turns[si], design.riding, tilting);
  const straight = axes.handlebarDeg.indexOf(0);
  const counts = emptyCounts();
  let inRegion = 0;
  let solved = 0;
  let failed = 0;
  let done = 0;
  let row = 0;
  const rowCells: SweepCell[] = new Array(nS);
  const rowAnalyses: (PoseAnalysis | null)[] = new Array(nS);
  for (let ti = 0; ti < nT; ti++) {
    const travel = axes.travelMm[ti];
    for (let lk = 0; lk < nL; lk++) {
      const li = serpentine(lk, nL, ti % 2 === 0);
      const lean = axes.leanDeg[li];
      const forward = row % 2 === 0;
      row++;
      for (let sk = 0; sk < nS; sk++) {
        const si = serpentine(sk, nS, forward);
        const bar = axes.handlebarDeg[si];
        input.leanDeg = lean;
        input.handlebarDeg = bar;
        setTravel(input, contact, travel);
        const r = grid.solve(input);
        solves++;
        if (r.reached) {
          // Judged below, once the row's neighbours are in (completeMeasures).
          const analysis = grid.analyser.analyse(r, false);
          rowAnalyses[si] = analysis;
          const region = regionOf(lean, analysis, si);
          rowCells[si] = { leanIndex: li, handlebarIndex: si, travelIndex: ti, leanDeg: lean, handlebarDeg: bar, travelMm: travel, region, ok: true, analysis };
        } else {
          rowAnalyses[si] = null;
          const asked = { leanDeg: lean, handlebarDeg: bar, heaveMm: input.heaveMm, travelRightMm: input.travelRightMm, travelLeftMm: input.travelLeftMm, wheelAngleDeg: 0 };
          const region = regionOf(lean, null, si);
          rowCells[si] = { leanIndex: li, handlebarIndex: si, travelIndex: ti, leanDeg: lean, handlebarDeg: bar, travelMm: travel, region, ok: false, failure: failedPose(asked, r) };
        }
        done++;
        if (options.onProgress && done % every === 0) options.onProgress(done, total);
      }
      if (straight < 0) solves++;
      const straightRel = straight >= 0 ? straightCell(rowAnalyses[straight]) : engine.straightAt(input);
      for (let si = 0; si < nS; si++) {
        const c = rowCells[si];
        if (c.region.inside) inRegion++;
        if (c.ok) {
          const rel: PoseRelatives = { neighbours: rowNeighbours(rowAnalyses, si), straight: straightRel, base: upright.base, uprightLocalRatio: upright.ratio[si] };
          completeMeasures(c.analysis, rel, tol, words);
          solved++;
          counts[c.analysis.status]++;
        } else {
          failed++;
          counts.broken++;
        }
        onCell(c);
      }
    }
  }
  if (options.onProgress && done % every !== 0) options.onProgress(done, total);
  return { poses: total, solved, failed, byStatus: counts, solves, inRegion, uprightTurns: upright.turns, elapsedMs: Date.now() - t0 };
}

const straightCell = (p: PoseAnalysis | null): PoseRelatives['straight'] =>
  p ? { value: p } : { reason: 'the straight-ahead pose of this lean and travel could not be solved' };

/**
 * Axes covering a design's envelope: lean -L..L, handlebar -H..H, travel -rebound..bump
 * (ground contact: none for a centre-pivot front end), each including 0 and stepped no
 * coarser than the steps given.
 */
export function envelopeAxes(
  design: ResolvedDesign,
  steps: { leanDeg?: number; handlebarDeg?: number; travelMm?: number } = {},
  contact: SweepContact = 'ground',
): SweepAxes {
  const symmetric = (half: number, step: number): number[] => {
    if (!(half > 0)) return [0];
    const n = Math.ceil(half / step - 1e-9);
    return Array.from({ length: 2 * n + 1 }, (_, i) => (half * (i - n)) / n);
  };
  const e = design.envelope;
  const travelStep = steps.travelMm ?? 10;
  let travel: number[] = [0];
  if (!(contact === 'ground' && design.frontEnd.kind === 'centrePivot')) {
    const down = e.reboundMm > 0 ? Math.ceil(e.reboundMm / travelStep - 1e-9) : 0;
    const up = e.bumpMm > 0 ? Math.ceil(e.bumpMm / travelStep - 1e-9) : 0;
    travel = [];
    for (let i = down; i >= 1; i--) travel.push((-e.reboundMm * i) / down);
    travel.push(0);
    for (let i = 1; i <= up; i++) travel.push((e.bumpMm * i) / up);
  }
  return {
    leanDeg: design.vehicle.tilting ? symmetric(e.leanDeg, steps.leanDeg ?? 1) : [0],
    handlebarDeg: symmetric(e.handlebarDeg, steps.handlebarDeg ?? 1),
    travelMm: travel,
  };
}
