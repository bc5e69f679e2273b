/**
 * The envelope map: lean x handlebar (x travel) with, per cell, the worst slip angle, the
 * worst joint margin, the worst clearance, the worst self-steer, the steering-ratio change,
 * each check's verdict and the cell's verdict (core's judge, tolerance.ts: the same words as
 * the pose readouts). Cells that cannot be assembled are 'broken' and carry their solver
 * status and message and no numbers.
 */

import type { ResolvedDesign } from '../design/types';
import type { SolveStatus } from '../solver/PoseSolver';
import { noChecks } from './poseVerdict';
import { balancedLeanDeg, lateralG, type Turn } from './ridingRegion';
import type { CheckKind, Verdict } from './tolerance';
import { runSweep, type SweepAxes, type SweepCell, type SweepContact, type SweepSummary } from './sweep';

export interface EnvelopeCell {
  leanDeg: number;
  handlebarDeg: number;
  travelMm: number;
  status: Verdict;
  /** Each check's verdict (null: not measured here). */
  checks: Record<CheckKind, Verdict | null>;
  solverStatus: SolveStatus;
  /** Largest |slip| of the front wheels, degrees. */
  worstSlipDeg: number | null;
  /** Smallest rated - articulation over every joint, degrees. */
  worstJointMarginDeg: number | null;
  /** Smallest clearance over every pair, mm. */
  worstClearanceMm: number | null;
  /** Largest |self-steer| of the two wheels, degrees. */
  worstSelfSteerDeg: number | null;
  /** Steering-ratio change from upright, percent. */
  ratioChangePct: number | null;
  /** Whether the pose lies in the operating region (ridingRegion.ts). */
  inRegion: boolean;
  /** Why the numbers are null (the solver's message), for a cell that cannot be assembled. */
  reason?: string;
}

/** Lean of the balanced turn against handlebar at one speed (upright turn radius of each handlebar value). */
export interface BalancedLine {
  speedKmh: number;
  /** One per handlebar value of the map; null where that speed cannot ride the turn (grip) or past the lean limit. */
  leanDeg: (number | null)[];
}

export interface EnvelopeMap {
  design: string;
  contact: SweepContact;
  axes: SweepAxes;
  /** Cells in grid order: index = (travelIndex * nLean + leanIndex) * nHandlebar + handlebarIndex. */
  cells: EnvelopeCell[];
  /** Balanced-turn lines for the riding speeds (lowest, highest and between); none for a vehicle that does not lean. */
  balancedLines: BalancedLine[];
  summary: SweepSummary;
}

export function envelopeCell(c: SweepCell): EnvelopeCell {
  if (!c.ok) {
    return {
      leanDeg: c.leanDeg,
      handlebarDeg: c.handlebarDeg,
      travelMm: c.travelMm,
      status: 'broken',
      checks: noChecks(),
      solverStatus: c.failure.solver.status,
      worstSlipDeg: null,
      worstJointMarginDeg: null,
      worstClearanceMm: null,
      worstSelfSteerDeg: null,
      ratioChangePct: null,
      inRegion: c.region.inside,
      reason: c.failure.solver.message,
    };
  }
  const w = c.analysis.worst;
  return {
    leanDeg: c.leanDeg,
    handlebarDeg: c.handlebarDeg,
    travelMm: c.travelMm,
    status: c.analysis.status,
    checks: c.analysis.checks,
    solverStatus: c.analysis.solver.status,
    worstSlipDeg: w.slipDeg,
    worstJointMarginDeg: Number.isFinite(w.jointMarginDeg) ? w.jointMarginDeg : null,
    worstClearanceMm: Number.isFinite(w.clearanceMm) ? w.clearanceMm : null,
    worstSelfSteerDeg: w.selfSteerDeg,
    ratioChangePct: w.ratioChangePct,
    inRegion: c.region.inside,
  };
}

/** Speeds for the balanced lines: the riding range's ends and round speeds between, at most `count`. */
export function lineSpeeds(riding: ResolvedDesign['riding'], count = 5): number[] {
  const { minKmh, maxKmh } = riding;
  if (!(maxKmh > minKmh)) return [minKmh];
  const out: number[] = [];
  for (let i = 0; i < count; i++) out.push(Math.round(minKmh + ((maxKmh - minKmh) * i) / (count - 1)));
  return [...new Set(out)];
}

/** The balanced lean at each handlebar value for each speed, from the turn each handlebar makes upright. */
export function balancedLines(design: ResolvedDesign, uprightTurns: Turn[]): BalancedLine[] {
  if (!design.vehicle.tilting) return [];
  const r = design.riding;
  return lineSpeeds(r).map((speedKmh) => ({
    speedKmh,
    leanDeg: uprightTurns.map((turn) => {
      if (turn.side !== 'straight' && lateralG(speedKmh, turn.radiusMm) > r.gripG) return null;
      const lean = balancedLeanDeg(speedKmh, turn);
      return Math.abs(lean) > r.maxLeanDeg ? null : lean;
    }),
  }));
}

export function cellIndex(axes: SweepAxes, travelIndex: number, leanIndex: number, handlebarIndex: number): number {
  return (travelIndex * axes.leanDeg.length + leanIndex) * axes.handlebarDeg.length + handlebarIndex;
}

export function envelopeMap(
  design: ResolvedDesign,
  axes: SweepAxes,
  options: { contact?: SweepContact; onProgress?: (done: number, total: number) => void } = {},
): EnvelopeMap {
  const cells: EnvelopeCell[] = new Array(axes.leanDeg.length * axes.handlebarDeg.length * axes.travelMm.length);
  const summary = runSweep(design, axes, { contact: options.contact, onProgress: options.onProgress }, (c) => {
    cells[cellIndex(axes, c.travelIndex, c.leanIndex, c.handlebarIndex)] = envelopeCell(c);
  });
  return { design: design.name, contact: options.contact ?? 'ground', axes, cells, balancedLines: balancedLines(design, summary.uprightTurns), summary };
}
