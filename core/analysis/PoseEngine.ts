/**
 * The pose engine: the one place that turns a design and a pose request into a solved,
 * measured and judged pose. The CLI's `pose`, the workbench (through its view adapter) and
 * the studies all call it; sweeps and steering limits (sweep.ts, limits.ts) run on its
 * solvers, so every caller solves from the design's assembly branch the same way and fills
 * the measures that need other poses the same way (relativeMeasures.ts).
 *
 * It keeps its solvers warm between calls: the main one (in the requested steering mode),
 * one for the poses beside the requested one (handlebar either side, straight ahead at the
 * same lean and travel) and one for the upright poses (zero lean and travel: the base pose and
 * the upright local ratio, cached by handlebar).
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs, type MechanismGraph, type PoseInputs } from '../mechanism/MechanismGraph';
import { buildMechanism, type PoseMode } from '../mechanism/templates/buildMechanism';
import { PoseSolver, type SolveResult } from '../solver/PoseSolver';
import type { PoseAnalysis } from './analysisTypes';
import { PoseAnalyser } from './PoseAnalyser';
import { takeSnapshot, type PoseSnapshot } from './poseSnapshot';
import type { SeedUse, SolverRole } from './solveSeeds';
import { completeMeasures, ratioBetween, type BaseSteer, type PoseRelatives, type Relative } from './relativeMeasures';

/** Half the handlebar step used for the local steering ratio, degrees. */
export const LOCAL_RATIO_STEP_DEG = 0.25;

export const NOT_WHILE_PLAYING = 'not found while playing (the poses beside this one were not solved)';

export interface EngineOptions {
  /** Write findings (words) for checks outside tolerance or in the warning band (default true). */
  findings?: boolean;
  /** Seed books to start from and to record into (studies of moved copies of a design; solveSeeds.ts). */
  seeds?: SeedUse;
}

export interface PoseRequestOptions {
  /** Solve the poses beside this one for the relative measures (default true; playback skips them). */
  relatives?: boolean;
}

export interface EnginePose {
  result: SolveResult;
  /** Every measure of the requested pose, judged; null when it was not reached. */
  analysis: PoseAnalysis | null;
  /**
   * The pose to draw: the requested one; the last good one when the request failed; or the
   * hardpoints as entered (design pose, loops not closed) when no pose has closed yet.
   */
  snapshot: PoseSnapshot;
  shown: 'requested' | 'last-good' | 'as-entered';
}

/** A solver with its analyser, remembering whether it holds a good pose to start from. */
export class WarmSolver {
  readonly solver: PoseSolver;
  readonly analyser: PoseAnalyser;
  private warm = false;

  constructor(
    design: ResolvedDesign,
    graph: MechanismGraph,
    findings: boolean,
    private readonly seeds: SeedUse = {},
    private readonly role: SolverRole = 'main',
  ) {
    this.solver = new PoseSolver(graph);
    this.analyser = new PoseAnalyser(design, this.solver.mechanism, { findings });
  }

  /**
   * Solve, warm from the last good pose when there is one (cold: from the design pose, by
   * continuation); from a seed of another design's solution of the same pose when the engine
   * replays a seed book (solveSeeds.ts), falling back to the usual start if that fails.
   */
  solve(inputs: PoseInputs): SolveResult {
    let r: SolveResult | null = null;
    const seed = this.seeds.replay?.seedFor(this.role, inputs);
    if (seed && this.solver.seedFrom(seed)) {
      r = this.solver.solve(inputs, true);
      if (!r.reached) {
        this.solver.reset();
        this.warm = false;
        r = null;
      }
    }
    r ??= this.solver.solve(inputs, this.warm);
    if (r.reached) {
      this.warm = true;
      this.seeds.record?.record(this.role, inputs, this.solver.goodPose());
    }
    return r;
  }

  /** Solve and measure; null when the pose was not reached. */
  analyse(inputs: PoseInputs): PoseAnalysis | null {
    const r = this.solve(inputs);
    return r.reached ? this.analyser.analyse(r) : null;
  }

  /** Forget the warm start: the next solve starts from the design pose, by continuation. */
  reset(): void {
    this.solver.reset();
    this.warm = false;
  }
}

export class PoseEngine {
  readonly design: ResolvedDesign;
  readonly mode: PoseMode;
  /** The main mechanism's graph (the drawing layout comes with it). */
  readonly graph: MechanismGraph;
  readonly main: WarmSolver;
  private readonly findings: boolean;
  private readonly seeds: SeedUse;
  private sideSolver: WarmSolver | null = null;
  private uprightSolver: WarmSolver | null = null;
  private base: Relative<BaseSteer> | null = null;
  private uprightRatio: { handlebarDeg: number; ratio: Relative<number> } | null = null;

  constructor(design: ResolvedDesign, mode: PoseMode, options: EngineOptions = {}) {
    this.design = design;
    this.mode = mode;
    this.findings = options.findings ?? true;
    this.graph = buildMechanism(design, mode);
    this.seeds = options.seeds ?? {};
    this.main = new WarmSolver(design, this.graph, this.findings, this.seeds, 'main');
  }

  /** Solve one pose, measure and judge it; the relative measures from extra solves unless told not to. */
  solve(inputs: PoseInputs, options: PoseRequestOptions = {}): EnginePose {
    const result = this.main.solve(inputs);
    let analysis: PoseAnalysis | null = null;
    if (result.reached) {
      analysis = this.main.analyser.analyse(result);
      const here = this.handlebarInputs();
      // Straight ahead by the handlebar, the pose is its own straight-ahead reference.
      const self = this.mode.steerBy === 'handlebar' ? analysis : null;
      const rel = options.relatives === false ? this.notWhilePlaying() : this.relativesAt(here, self);
      completeMeasures(analysis, rel, this.design.tolerances, this.findings);
    }
    const m = this.main.solver.mechanism;
    let shown: EnginePose['shown'] = result.reached ? 'requested' : 'last-good';
    if (!result.reached && !this.main.solver.holdsGoodPose) {
      m.applyInputs(zeroInputs());
      m.resetToDesign();
      shown = 'as-entered';
    }
    return { result, analysis, snapshot: takeSnapshot(m), shown };
  }

  /** The main mechanism's pose as handlebar inputs (a wheel-angle request reports its handlebar). */
  private handlebarInputs(): PoseInputs {
    const m = this.main.solver.mechanism;
    return { ...m.currentInputs, ...m.reportedInputs(), wheelAngleDeg: 0 };
  }

  /** A solver steered by the handlebar with the same contact (and hold) as the main one. */
  private handlebarSolver(role: SolverRole): WarmSolver {
    const mode: PoseMode = { contact: this.mode.contact, steerBy: 'handlebar', ...(this.mode.hold ? { hold: this.mode.hold } : {}) };
    return new WarmSolver(this.design, buildMechanism(this.design, mode), false, this.seeds, role);
  }

  private notWhilePlaying(): PoseRelatives {
    const reason = { reason: NOT_WHILE_PLAYING };
    return { neighbours: reason, straight: reason, base: reason, uprightLocalRatio: reason };
  }

  /**
   * The poses the relative measures of a pose at `here` (handlebar inputs) need; `self`, the
   * pose's own analysis when it was solved by handlebar, serves as the straight-ahead pose at
   * handlebar 0 instead of solving it again.
   */
  relativesAt(here: PoseInputs, self: PoseAnalysis | null = null): PoseRelatives {
    const side = (this.sideSolver ??= this.handlebarSolver('side'));
    const h = here.handlebarDeg;
    const lower = side.analyse({ ...here, handlebarDeg: h - LOCAL_RATIO_STEP_DEG });
    const upper = side.analyse({ ...here, handlebarDeg: h + LOCAL_RATIO_STEP_DEG });
    return {
      neighbours:
        lower && upper ? { value: { lower, upper } } : { reason: `a pose ${LOCAL_RATIO_STEP_DEG} deg of handlebar either side could not be solved` },
      straight: h === 0 && self ? { value: self } : this.straightAt(here),
      base: this.baseSteer(),
      uprightLocalRatio: this.uprightLocalRatio(h),
    };
  }

  /** The straight-ahead pose (handlebar 0) at the lean and travel of `here`. */
  straightAt(here: PoseInputs): Relative<PoseAnalysis> {
    const side = (this.sideSolver ??= this.handlebarSolver('side'));
    const straight = side.analyse({ ...here, handlebarDeg: 0, wheelAngleDeg: 0 });
    return straight ? { value: straight } : { reason: 'the straight-ahead pose at this lean and travel could not be solved' };
  }

  /** Road-wheel angles at zero lean, travel and handlebar (solved once). */
  baseSteer(): Relative<BaseSteer> {
    if (!this.base) {
      const a = this.upright().analyse(zeroInputs());
      this.base = a
        ? { value: { leftDeg: a.wheels.left.steerDeg, rightDeg: a.wheels.right.steerDeg } }
        : { reason: 'the design pose (zero lean, travel and handlebar) could not be solved' };
    }
    return this.base;
  }

  /** Local steering ratio at zero lean and travel and the given handlebar (the last one cached). */
  uprightLocalRatio(handlebarDeg: number): Relative<number> {
    if (this.uprightRatio?.handlebarDeg === handlebarDeg) return this.uprightRatio.ratio;
    const up = this.upright();
    const at = (h: number) => up.analyse({ ...zeroInputs(), handlebarDeg: h });
    const lower = at(handlebarDeg - LOCAL_RATIO_STEP_DEG);
    const upper = at(handlebarDeg + LOCAL_RATIO_STEP_DEG);
    const ratio: Relative<number> =
      lower && upper ? ratioBetween(lower, upper) : { reason: `the upright poses ${LOCAL_RATIO_STEP_DEG} deg of handlebar either side could not be solved` };
    this.uprightRatio = { handlebarDeg, ratio };
    return ratio;
  }

  private upright(): WarmSolver {
    return (this.uprightSolver ??= this.handlebarSolver('upright'));
  }
}
