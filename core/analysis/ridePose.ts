/**
 * The ride input: a speed and a handlebar angle instead of a lean. The lean is found so the
 * vehicle balances in the turn the linkage makes there, tan(lean) = v^2 / (g R)
 * (ridingRegion.ts), by fixed-point iteration on the lean together with the linkage solve:
 * solve the pose at a lean, read the turn radius, take the balanced lean for it, and repeat.
 * The turn radius changes little with lean, so each step shrinks the lean change by the
 * factor d(lean_balanced)/d(lean), well below 1 on every design we have tried; the loop stops
 * when the lean moves less than BALANCE_TOLERANCE_DEG, and says so when it does not.
 */

import type { PoseInputs } from '../mechanism/MechanismGraph';
import type { EnginePose, PoseEngine } from './PoseEngine';
import { balancedLeanDeg, lateralG, turnOf } from './ridingRegion';

export const BALANCE_TOLERANCE_DEG = 1e-6;
const MAX_BALANCE_STEPS = 40;

export interface RidePose {
  pose: EnginePose;
  speedKmh: number;
  /** The lean the pose was solved at, degrees (positive right side down). */
  leanDeg: number;
  /** Balanced lean for the turn the solved pose makes; null when the pose was not reached. */
  balancedLeanDeg: number | null;
  /** leanDeg - balancedLeanDeg: how far from balance the answer is, degrees; null with `reason`. */
  balanceResidualDeg: number | null;
  /** Lateral acceleration of the turn at this speed, g; null going straight or not reached. */
  lateralG: number | null;
  /** Lean-and-solve steps taken. */
  steps: number;
  /** Why a figure is missing, or what limits the answer (lean limit, grip). */
  notes: string[];
}

/** Solve the pose a rider reaches at `speedKmh` with the handlebar of `inputs` (its lean is ignored). */
export function solveRide(engine: PoseEngine, speedKmh: number, inputs: PoseInputs, relatives = true): RidePose {
  const design = engine.design;
  const notes: string[] = [];
  if (!(speedKmh >= 0) || !Number.isFinite(speedKmh)) throw new RangeError(`speed must be a finite number of km/h, not below 0 (found ${speedKmh})`);
  const at: PoseInputs = { ...inputs, leanDeg: 0 };
  if (!design.vehicle.tilting) {
    const pose = engine.solve(at, { relatives });
    const a = pose.analysis;
    const turn = a ? turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm) : null;
    notes.push('the vehicle does not lean: lean stays 0');
    return {
      pose,
      speedKmh,
      leanDeg: 0,
      balancedLeanDeg: null,
      balanceResidualDeg: null,
      lateralG: turn && turn.side !== 'straight' ? lateralG(speedKmh, turn.radiusMm) : null,
      steps: 1,
      notes,
    };
  }
  let lean = 0;
  let balanced: number | null = null;
  let steps = 0;
  for (; steps < MAX_BALANCE_STEPS; steps++) {
    at.leanDeg = lean;
    const p = engine.solve(at, { relatives: false });
    if (!p.analysis) break;
    const turn = turnOf(p.analysis.slip.turnCentreMm?.y ?? null, p.analysis.slip.turnRadiusMm);
    balanced = balancedLeanDeg(speedKmh, turn);
    if (Math.abs(balanced - lean) < BALANCE_TOLERANCE_DEG) break;
    lean = balanced;
    balanced = null;
  }
  at.leanDeg = lean;
  const pose = engine.solve(at, { relatives });
  const a = pose.analysis;
  let g: number | null = null;
  if (!a) {
    notes.push(`the linkage cannot reach the pose at lean ${lean.toFixed(2)} deg: ${pose.result.message}`);
    balanced = null;
  } else {
    const turn = turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm);
    balanced = balancedLeanDeg(speedKmh, turn);
    g = turn.side === 'straight' ? null : lateralG(speedKmh, turn.radiusMm);
    if (Math.abs(balanced - lean) >= BALANCE_TOLERANCE_DEG) notes.push(`the lean did not settle within ${MAX_BALANCE_STEPS} steps`);
    if (Math.abs(lean) > design.riding.maxLeanDeg) notes.push(`the balanced lean is past the lean limit (${design.riding.maxLeanDeg} deg)`);
    if (g !== null && g > design.riding.gripG) notes.push(`the turn needs ${g.toFixed(2)} g, past the grip limit (${design.riding.gripG} g)`);
    if (turn.side === 'straight') notes.push('straight ahead: balanced upright');
  }
  return {
    pose,
    speedKmh,
    leanDeg: lean,
    balancedLeanDeg: balanced,
    balanceResidualDeg: balanced === null ? null : lean - balanced,
    lateralG: g,
    steps: steps + 1,
    notes,
  };
}
