/**
 * A sweep over the ride input: speed x handlebar, each pose at the lean that balances the
 * turn it makes (ridePose.ts), with every measure (the relative ones from the poses beside
 * it, as for a single pose) and core's verdict. One pose engine serves the whole sweep, warm
 * from pose to pose, handlebar innermost and each row run opposite to the one before.
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs } from '../mechanism/MechanismGraph';
import { failedPose } from './PoseAnalyser';
import { PoseEngine } from './PoseEngine';
import { solveRide } from './ridePose';
import { inRidingRegion, turnOf } from './ridingRegion';
import { checkAxisValues, SweepInputError, type SweepCell, type SweepContact } from './sweep';

export interface RideAxes {
  speedKmh: number[];
  handlebarDeg: number[];
}

/** A ride sweep's cell: the pose as a sweep cell (its lean is the balanced one) and the balance. */
export interface RideCell {
  speedKmh: number;
  speedIndex: number;
  cell: SweepCell;
  balanceResidualDeg: number | null;
  lateralG: number | null;
  notes: string[];
}

export interface RideSweepSummary {
  poses: number;
  solved: number;
  failed: number;
  /** Poses where no balance was found within the lean limit (or the lean did not settle). */
  unbalanced: number;
  elapsedMs: number;
}

export function runRideSweep(
  design: ResolvedDesign,
  axes: RideAxes,
  options: { contact?: SweepContact; onProgress?: (done: number, total: number) => void },
  onCell: (cell: RideCell) => void,
): RideSweepSummary {
  checkAxisValues({ ...axes });
  if (axes.speedKmh.some((v) => v < 0)) throw new SweepInputError('speeds must be 0 km/h or more');
  const t0 = Date.now();
  const contact = options.contact ?? 'ground';
  const engine = new PoseEngine(design, { contact, steerBy: 'handlebar' }, { findings: false });
  const total = axes.speedKmh.length * axes.handlebarDeg.length;
  let done = 0;
  let solved = 0;
  let failed = 0;
  let unbalanced = 0;
  axes.speedKmh.forEach((speedKmh, vi) => {
    const n = axes.handlebarDeg.length;
    for (let k = 0; k < n; k++) {
      const hi = vi % 2 === 0 ? k : n - 1 - k;
      const handlebarDeg = axes.handlebarDeg[hi];
      const ride = solveRide(engine, speedKmh, { ...zeroInputs(), handlebarDeg });
      const a = ride.pose.analysis;
      const lean = ride.leanDeg;
      const where = { leanIndex: vi, handlebarIndex: hi, travelIndex: 0, leanDeg: lean, handlebarDeg, travelMm: 0 };
      const turn = a ? turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm) : ({ side: 'straight' } as const);
      const region = inRidingRegion(lean, turn, design.riding, design.vehicle.tilting);
      let cell: SweepCell;
      if (a) {
        solved++;
        cell = { ...where, region, ok: true, analysis: a };
      } else {
        failed++;
        const asked = { ...zeroInputs(), leanDeg: lean, handlebarDeg };
        cell = { ...where, region, ok: false, failure: failedPose(asked, ride.pose.result) };
      }
      if (design.vehicle.tilting && (ride.balanceResidualDeg === null || Math.abs(ride.balanceResidualDeg) > 1e-4)) unbalanced++;
      onCell({ speedKmh, speedIndex: vi, cell, balanceResidualDeg: ride.balanceResidualDeg, lateralG: ride.lateralG, notes: ride.notes });
      done++;
      options.onProgress?.(done, total);
    }
  });
  return { poses: total, solved, failed, unbalanced, elapsedMs: Date.now() - t0 };
}
