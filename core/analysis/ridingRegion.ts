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

/** Why a pose lies outside the operating region. */
export type OutsideWhy = 'does-not-lean' | 'lean-limit' | 'straight-lean' | 'too-tight' | 'off-balance';

/**
 * Whether a pose lies in the operating region, as plain numbers (a sweep makes one per cell,
 * so no strings or arrays here: regionWords says it in words when asked).
 */
export interface RegionVerdict {
  inside: boolean;
  /** Balanced leans over the speeds that may ride this turn (signed, lower first); null when none may. */
  balancedLoDeg: number | null;
  balancedHiDeg: number | null;
  /** Why the pose is outside; null inside. */
  why: OutsideWhy | null;
}

const verdict = (inside: boolean, lo: number | null, hi: number | null, why: OutsideWhy | null): RegionVerdict => ({
  inside,
  balancedLoDeg: lo,
  balancedHiDeg: hi,
  why,
});

/** Whether a pose (its lean and the turn it makes) lies in the operating region. */
export function inRidingRegion(leanDeg: number, turn: Turn, riding: Riding, tilting: boolean): RegionVerdict {
  if (!tilting) return leanDeg === 0 ? verdict(true, 0, 0, null) : verdict(false, 0, 0, 'does-not-lean');
  const band = riding.transientBandDeg;
  if (Math.abs(leanDeg) > riding.maxLeanDeg + 1e-9) return verdict(false, null, null, 'lean-limit');
  if (turn.side === 'straight') return Math.abs(leanDeg) <= band + 1e-9 ? verdict(true, 0, 0, null) : verdict(false, 0, 0, 'straight-lean');
  // Speeds that may ride this turn: the riding range, capped by grip.
  const gripCapKmh = Math.sqrt(riding.gripG * STANDARD_GRAVITY * (turn.radiusMm / 1000)) / MS_PER_KMH;
  const lo = riding.minKmh;
  const hi = Math.min(riding.maxKmh, gripCapKmh);
  if (lo > hi) return verdict(false, null, null, 'too-tight');
  const a = balancedLeanDeg(lo, turn);
  const b = balancedLeanDeg(hi, turn);
  const low = Math.min(a, b);
  const high = Math.max(a, b);
  const inside = leanDeg >= low - band - 1e-9 && leanDeg <= high + band + 1e-9;
  return verdict(inside, low, high, inside ? null : 'off-balance');
}

/** Why a pose lies outside the region, in words (null inside). */
export function regionWords(v: RegionVerdict, leanDeg: number, riding: Riding): string | null {
  switch (v.why) {
    case null:
      return null;
    case 'does-not-lean':
      return 'the vehicle does not lean';
    case 'lean-limit':
      return `past the lean limit (${riding.maxLeanDeg} deg)`;
    case 'straight-lean':
      return `leaning ${Math.abs(leanDeg).toFixed(1)} deg while going straight`;
    case 'too-tight':
      return `too tight to ride at ${riding.minKmh} km/h within ${riding.gripG} g of grip`;
    case 'off-balance':
      return `a balanced turn here leans ${v.balancedLoDeg!.toFixed(1)}..${v.balancedHiDeg!.toFixed(1)} deg (band ${riding.transientBandDeg} deg)`;
  }
}

/** The turn a pose makes, from its slip-balanced turn centre (slip.ts). */
export function turnOf(turnCentreYMm: number | null, turnRadiusMm: number | null): Turn {
  if (turnCentreYMm === null || turnRadiusMm === null) return { side: 'straight' };
  return { side: turnCentreYMm > 0 ? 'left' : 'right', radiusMm: turnRadiusMm };
}
