/**
 * Where a leaning vehicle is ridden. In a steady turn it leans into the turn until gravity and
 * the centripetal acceleration balance (point mass, no tyre width, camber thrust or gyroscopic
 * terms):
 *
 *   tan(lean) = v^2 / (g R)
 *
 * with R the radius of the path and g standard gravity. So lean and handlebar are tied by
 * speed. The operating region of a design is every pose a balanced turn reaches for a speed in
 * riding.minKmh..maxKmh, widened by riding.transientBandDeg either side (the countersteer that
 * starts a turn), bounded by riding.maxLeanDeg and by the grip limit v^2 / R <= gripG g.
 * A vehicle that does not tilt rides upright: its region is lean 0, every handlebar.
 *
 * R is the radius of the rear axle centre's path about the kinematic turn centre (slip.ts: on
 * the rear axle line, where the front slip angles balance). The design carries no position of
 * the mass centre; for one a distance a ahead of the rear axle the path radius is
 * sqrt(R^2 + a^2), larger by about a^2 / 2R.
 */

import type { Riding } from '../design/types';
import { DEG, RAD } from './vec3';

/** Standard gravity, m/s^2 (3rd CGPM, 1901; ISO 80000-3). */
export const STANDARD_GRAVITY = 9.80665;

const MS_PER_KMH = 1 / 3.6;

/** A turn as the region needs it: its side and the path radius, or straight ahead. */
export type Turn = { side: 'left' | 'right'; radiusMm: number } | { side: 'straight' };

/** Lateral acceleration of a steady turn, in g. */
export function lateralG(speedKmh: number, radiusMm: number): number {
  const v = speedKmh * MS_PER_KMH;
  return (v * v) / (STANDARD_GRAVITY * (radiusMm / 1000));
}

/** Balanced lean for a speed and turn, degrees, ISO sign (positive right side down: a right turn). */
export function balancedLeanDeg(speedKmh: number, turn: Turn): number {
  if (turn.side === 'straight') return 0;
  const lean = Math.atan(lateralG(speedKmh, turn.radiusMm)) * RAD;
  return turn.side === 'right' ? lean : -lean;
}

/** Speed of the balanced turn at a lean, km/h; null when the lean leans out of the turn or the turn is straight. */
export function balancedSpeedKmh(leanDeg: number, turn: Turn): number | null {
  if (turn.side === 'straight') return null;
  const into = turn.side === 'right' ? leanDeg : -leanDeg;
  if (!(into > 0) || into >= 90) return null;
  return Math.sqrt(Math.tan(into * DEG) * STANDARD_GRAVITY * (turn.radiusMm / 1000)) / MS_PER_KMH;
}

export interface RegionVerdict {
  inside: boolean;
  /** Balanced leans over the speeds that may ride this turn (signed, lower first); null when none may. */
  balancedDeg: [number, number] | null;
  /** Why the pose is outside, in words. */
  reason?: string;
}

/** Whether a pose (its lean and the turn it makes) lies in the operating region. */
export function inRidingRegion(leanDeg: number, turn: Turn, riding: Riding, tilting: boolean): RegionVerdict {
  if (!tilting) {
    return leanDeg === 0 ? { inside: true, balancedDeg: [0, 0] } : { inside: false, balancedDeg: [0, 0], reason: 'the vehicle does not lean' };
  }
  const band = riding.transientBandDeg;
  if (Math.abs(leanDeg) > riding.maxLeanDeg + 1e-9) {
    return { inside: false, balancedDeg: null, reason: `past the lean limit (${riding.maxLeanDeg} deg)` };
  }
  if (turn.side === 'straight') {
    const inside = Math.abs(leanDeg) <= band + 1e-9;
    return inside ? { inside, balancedDeg: [0, 0] } : { inside, balancedDeg: [0, 0], reason: `leaning ${Math.abs(leanDeg).toFixed(1)} deg while going straight` };
  }
  // Speeds that may ride this turn: the riding range, capped by grip.
  const gripCapKmh = Math.sqrt(riding.gripG * STANDARD_GRAVITY * (turn.radiusMm / 1000)) / MS_PER_KMH;
  const lo = riding.minKmh;
  const hi = Math.min(riding.maxKmh, gripCapKmh);
  if (lo > hi) {
    return { inside: false, balancedDeg: null, reason: `too tight to ride at ${lo} km/h within ${riding.gripG} g of grip` };
  }
  const a = balancedLeanDeg(lo, turn);
  const b = balancedLeanDeg(hi, turn);
  const balanced: [number, number] = [Math.min(a, b), Math.max(a, b)];
  const inside = leanDeg >= balanced[0] - band - 1e-9 && leanDeg <= balanced[1] + band + 1e-9;
  if (inside) return { inside, balancedDeg: balanced };
  return {
    inside,
    balancedDeg: balanced,
    reason: `a balanced turn here leans ${balanced[0].toFixed(1)}..${balanced[1].toFixed(1)} deg (band ${band} deg)`,
  };
}

/** The turn a pose makes, from its slip-balanced turn centre (slip.ts). */
export function turnOf(turnCentreYMm: number | null, turnRadiusMm: number | null): Turn {
  if (turnCentreYMm === null || turnRadiusMm === null) return { side: 'straight' };
  return { side: turnCentreYMm > 0 ? 'left' : 'right', radiusMm: turnRadiusMm };
}
