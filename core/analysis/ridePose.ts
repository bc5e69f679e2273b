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
const MAX_BALANCE_STEPS = 60;

/** What the ride solve found, without the pose itself: the figures a report or a readout shows. */
export type RideFigures = Omit<RidePose, 'pose'>;

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
  // g(lean) = balanced lean for the turn the linkage makes at that lean, minus the lean.
  const gap = (lean: number): number | null => {
    at.leanDeg = lean;
    const p = engine.solve(at, { relatives: false });
    if (!p.analysis) return null;
    return balancedLeanDeg(speedKmh, turnOf(p.analysis.slip.turnCentreMm?.y ?? null, p.analysis.slip.turnRadiusMm)) - lean;
  };
  // The search stays within the lean limit: a balance beyond it is not a pose the vehicle reaches.
  const limit = design.riding.maxLeanDeg;
  let lean = 0;
  let g = gap(lean);
  let steps = 1;
  let prev: { lean: number; g: number } | null = null;
  let pinned = false;
  while (g !== null && Math.abs(g) >= BALANCE_TOLERANCE_DEG && steps < MAX_BALANCE_STEPS) {
    // Secant step once two points are known (a fixed-point step before, or when they are too close).
    const slope = prev && Math.abs(prev.g - g) > 1e-15 ? (g - prev.g) / (lean - prev.lean) : -1;
    const next = Math.max(-limit, Math.min(limit, lean - g / slope));
    if (next === lean) {
      // At the limit and the turn still asks for more lean: no balance inside the limit.
      pinned = true;
      break;
    }
    prev = { lean, g };
    lean = next;
    g = gap(lean);
    steps++;
  }
  let balanced: number | null = null;
  at.leanDeg = lean;
  const pose = engine.solve(at, { relatives });
  const a = pose.analysis;
  let lateral: number | null = null;
  if (!a) {
    notes.push(`the linkage cannot reach the pose at lean ${lean.toFixed(2)} deg: ${pose.result.message}`);
    balanced = null;
  } else {
    const turn = turnOf(a.slip.turnCentreMm?.y ?? null, a.slip.turnRadiusMm);
    balanced = balancedLeanDeg(speedKmh, turn);
    lateral = turn.side === 'straight' ? null : lateralG(speedKmh, turn.radiusMm);
    if (pinned) notes.push(`no balance within the lean limit (${limit} deg): at the limit this turn needs ${Math.abs(balanced).toFixed(1)} deg of lean`);
    else if (Math.abs(balanced - lean) >= BALANCE_TOLERANCE_DEG) notes.push(`the lean did not settle within ${MAX_BALANCE_STEPS} steps`);
    if (lateral !== null && lateral > design.riding.gripG) notes.push(`the turn needs ${lateral.toFixed(2)} g, past the grip limit (${design.riding.gripG} g)`);
    if (turn.side === 'straight') notes.push('straight ahead: balanced upright');
  }
  return {
    pose,
    speedKmh,
    leanDeg: lean,
    balancedLeanDeg: balanced,
    balanceResidualDeg: balanced === null ? null : lean - balanced,
    lateralG: lateral,
    steps,
    notes,
  };
}
