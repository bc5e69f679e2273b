/**
 * The workbench's one door to core's kinematics: a PoseSession holds core's PoseEngine for
 * the design on screen and turns each engine result into view data (readout tables, alerts,
 * part conditions). Solving, measuring and judging all happen in core, once per slider move;
 * this module and readoutTables.ts only reshape.
 */
import type { ResolvedDesign } from '../../core/design/types';
import type { MechanismGraph } from '../../core/mechanism/MechanismGraph';
import type { SolveStatus } from '../../core/solver/PoseSolver';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import type { PoseAnalysis } from '../../core/analysis/analysisTypes';
import { PoseEngine, type EnginePose } from '../../core/analysis/PoseEngine';
import { solveRide } from '../../core/analysis/ridePose';
import type { Verdict } from '../../core/analysis/tolerance';
import type { Severity } from './severity';
import { toCoreInputs, type Contact, type PoseUi } from './poseInputs';
import { describePose } from './readoutTables';
import { rideTable, type RideFigures } from './rideReadout';
import { emptyDrawing } from '../../core/mechanism/drawingLayout';

export type Unit = 'mm' | 'deg' | '%' | 'm/km' | 'mm/mm' | 'deg/deg' | 'km/h' | 'g' | '';

export interface ReadoutCell {
  value: number | null;
  severity?: Severity;
}

export interface ReadoutRow {
  id: string;
  label: string;
  unit: Unit;
  digits: number;
  cells: ReadoutCell[];
  /** Shown instead of the numbers when every cell is null. */
  missing?: string;
  hint?: string;
}

export interface ReadoutTable {
  id: string;
  title: string;
  /** Column heads; one column means a plain list. */
  columns: string[];
  rows: ReadoutRow[];
}

export interface Alert {
  severity: Severity;
  text: string;
  /** The hardpoint to select to show what the alert is about (a joint of the part), when there is one. */
  hardpoint?: string;
  /** The study objective the alert is about (renderer/model/findings.ts), when the studies have one. */
  objective?: string;
}

export type OutcomeStatus = SolveStatus | 'invalid-design';

export interface PoseOutcome {
  status: OutcomeStatus;
  /** Whether the requested pose was reached (converged or singular). */
  reached: boolean;
  message: string;
  culprit?: string;
  /**
   * The pose drawn: the requested one; the last good one when the request failed; or the
   * hardpoints as entered (design pose, loops not closed) when no pose has closed yet.
   */
  snapshot: PoseSnapshot | null;
  shown: 'requested' | 'last-good' | 'as-entered' | 'none';
  /** Every measure of core's engine for the requested pose; null when not reached. */
  analysis: PoseAnalysis | null;
  /** Core's verdict on the pose ('broken' when it could not be reached). */
  poseStatus: Verdict | null;
  tables: ReadoutTable[];
  alerts: Alert[];
  /**
   * Condition of each checked part: 'tyre.<side>', 'joint.<point id>', 'tube.<tube id>',
   * 'constraint.<constraint id>'.
   */
  parts: Record<string, Severity>;
  iterations: number;
  residualMm: number | null;
  solveMs: number;
  /** In ride mode: the speed, the balanced lean core found for it and how well it balances. */
  ride?: RideFigures;
}

/** Which mechanism body carries each named point, and where it sits at design. */
export interface MechanismLayout {
  bodies: string[];
  points: Record<string, { body: string; design: [number, number, number] }>;
  links: { id: string; label: string }[];
  constraints: { id: string; label: string }[];
}

export function layoutOf(graph: MechanismGraph): MechanismLayout {
  const points: MechanismLayout['points'] = {};
  for (const p of graph.points) points[p.id] = { body: graph.bodies[p.body].id, design: [p.design[0], p.design[1], p.design[2]] };
  return {
    bodies: graph.bodies.map((b) => b.id),
    points,
    links: graph.links.map((l) => ({ id: l.id, label: l.label })),
    constraints: graph.constraints.map((c) => ({ id: c.id, label: c.label })),
  };
}

/**
 * Core's pose engine for one design and contact mode, warm from pose to pose. Rebuilt when the
 * design or the contact changes.
 */
export class PoseSession {
  readonly design: ResolvedDesign;
  readonly contact: Contact;
  readonly layout: MechanismLayout;
  readonly engine: PoseEngine;

  constructor(design: ResolvedDesign, contact: Contact) {
    this.design = design;
    this.contact = contact;
    this.engine = new PoseEngine(design, { contact, steerBy: 'handlebar' });
    this.layout = layoutOf(this.engine.graph);
  }

  /**
   * Solve a pose. With `detail` (default) the measures that need the poses beside it are found
   * too; playback leaves them out to keep each frame short.
   */
  solve(pose: PoseUi, detail = true): PoseOutcome {
    const t0 = performance.now();
    return this.describe(this.engine.solve(toCoreInputs(pose), { relatives: detail }), t0);
  }

  /**
   * Ride mode: the pose a rider reaches at `speedKmh` with the handlebar (and travel) of
   * `pose`; core finds the balanced lean (the lean of `pose` is ignored). The outcome's
   * `ride` carries the speed, the lean found, the balance residual and the lateral g, and the
   * readouts gain a table of them.
   */
  solveRide(pose: PoseUi, speedKmh: number, detail = true): PoseOutcome & { ride: RideFigures } {
    const t0 = performance.now();
    const r = solveRide(this.engine, speedKmh, toCoreInputs(pose), detail);
    const ride: RideFigures = {
      speedKmh: r.speedKmh,
      leanDeg: r.leanDeg,
      balancedLeanDeg: r.balancedLeanDeg,
      balanceResidualDeg: r.balanceResidualDeg,
      lateralG: r.lateralG,
      steps: r.steps,
      notes: r.notes,
      tilting: this.design.vehicle.tilting,
    };
    const outcome = this.describe(r.pose, t0);
    return { ...outcome, tables: [rideTable(ride, this.design.riding), ...outcome.tables], ride };
  }

  private describe({ result, analysis, snapshot, shown }: EnginePose, t0: number): PoseOutcome {
    return describePose(this.design, this.layout, this.engine.graph.drawing ?? emptyDrawing(), {
      status: result.status,
      reached: result.reached,
      message: result.message,
      culprit: result.culprit,
      snapshot,
      shown,
      analysis,
      iterations: result.iterations,
      residualMm: result.residualMm,
      solveMs: performance.now() - t0,
    });
  }
}

/** The outcome shown while the design itself is invalid (nothing is solved). */
export function invalidDesignOutcome(issueCount: number): PoseOutcome {
  const message = `the design has ${issueCount} error${issueCount === 1 ? '' : 's'}; fix the marked fields`;
  return {
    status: 'invalid-design',
    reached: false,
    message,
    snapshot: null,
    shown: 'none',
    analysis: null,
    poseStatus: null,
    tables: [],
    alerts: [{ severity: 'broken', text: `Not solved: ${message}.` }],
    parts: {},
    iterations: 0,
    residualMm: null,
    solveMs: 0,
  };
}

/** Looks a readout up: table, row id and column (0 = left or the value, 1 = right). */
export function readout(o: PoseOutcome, rowId: string, column = 0): number | null {
  for (const t of o.tables) {
    const r = t.rows.find((x) => x.id === rowId);
    if (r) return r.cells[column]?.value ?? null;
  }
  return null;
}
