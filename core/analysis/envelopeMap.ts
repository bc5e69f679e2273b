/**
 * The envelope map: lean x handlebar (x travel) with, per cell, the worst slip angle, the
 * worst joint margin, the worst clearance, the worst toe error and a status (within
 * tolerance, warning, over, clearance violated, joint over rating, cannot assemble). Cells
 * that cannot be assembled carry their solver status and message and no numbers.
 */

import type { ResolvedDesign } from '../design/types';
import type { SolveStatus } from '../solver/PoseSolver';
import type { PoseStatus } from './analysisTypes';
import { runSweep, type SweepAxes, type SweepCell, type SweepContact, type SweepSummary } from './sweep';

export interface EnvelopeCell {
  leanDeg: number;
  handlebarDeg: number;
  travelMm: number;
  status: PoseStatus;
  solverStatus: SolveStatus;
  /** Largest |slip| of the front wheels, degrees. */
  worstSlipDeg: number | null;
  /** Smallest rated - articulation over every joint, degrees. */
  worstJointMarginDeg: number | null;
  /** Smallest clearance over every pair, mm. */
  worstClearanceMm: number | null;
  /** Largest |toe error| (lean steer + bump steer), degrees. */
  worstToeErrorDeg: number | null;
  /** Why the numbers are null (the solver's message), for a cell that cannot be assembled. */
  reason?: string;
}

export interface EnvelopeMap {
  design: string;
  contact: SweepContact;
  axes: SweepAxes;
  /** Cells in grid order: index = (travelIndex * nLean + leanIndex) * nHandlebar + handlebarIndex. */
  cells: EnvelopeCell[];
  summary: SweepSummary;
}

export function envelopeCell(c: SweepCell): EnvelopeCell {
  if (!c.ok) {
    return {
      leanDeg: c.leanDeg,
      handlebarDeg: c.handlebarDeg,
      travelMm: c.travelMm,
      status: 'cannot-assemble',
      solverStatus: c.failure.solver.status,
      worstSlipDeg: null,
      worstJointMarginDeg: null,
      worstClearanceMm: null,
      worstToeErrorDeg: null,
      reason: c.failure.solver.message,
    };
  }
  const w = c.analysis.worst;
  return {
    leanDeg: c.leanDeg,
    handlebarDeg: c.handlebarDeg,
    travelMm: c.travelMm,
    status: c.analysis.status,
    solverStatus: c.analysis.solver.status,
    worstSlipDeg: w.slipDeg,
    worstJointMarginDeg: Number.isFinite(w.jointMarginDeg) ? w.jointMarginDeg : null,
    worstClearanceMm: Number.isFinite(w.clearanceMm) ? w.clearanceMm : null,
    worstToeErrorDeg: w.toeErrorDeg,
  };
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
  return { design: design.name, contact: options.contact ?? 'ground', axes, cells, summary };
}
