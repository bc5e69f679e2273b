/**
 * Scrub: each front wheel's slip angle against the path a kinematic turn centre demands,
 * and the sideways scrub it causes.
 *
 * The turn centre lies on the rear axle line (the rear wheel or wheels are unsteered and
 * roll free of slip). Where on that line is decided by the front tyres: with equal tyres and
 * equal loads at low speed their side forces balance, so the centre is taken where the two
 * front slip angles are equal and opposite. Parametrised by the path curvature k = 1/y_c,
 * a point (x, y) moves along atan2(k (x - x_rear), 1 - k y); the sum of the slip angles
 * increases monotonically with k, so the root is unique and Newton with a bracket finds it.
 *
 * Slip angle, ISO 8855: from the wheel's heading to the velocity of its contact centre,
 * anticlockwise seen from above positive (SAE J670's older convention has the other sign).
 * Sideways scrub per distance travelled: 1000 tan(slip) m/km (geometry: a wheel travelling
 * 1 km along its path slides 1000 tan(slip) m across its heading), about 17.46 m/km per degree.
 */

import type { SlipMeasures, WheelSlip } from './analysisTypes';
import type { PlanWheel } from './ackermann';
import { RAD } from './vec3';

/** Below this curvature (1/mm) the path is called straight: no turn centre. */
const STRAIGHT_CURVATURE = 1e-9;

export function scrubMPerKm(slipDeg: number): number {
  return 1000 * Math.tan((slipDeg * Math.PI) / 180);
}

/** Curvature k (1/mm, positive left) of the balanced turn on the rear axle line x = rearAxleX. */
/** Sum of slip angles at curvature k and its derivative, written into out[0], out[1]. */
function slipSum(wheels: readonly PlanWheel[], rearAxleX: number, k: number, out: Float64Array): void {
  let s = 0;
  let d = 0;
  for (const w of wheels) {
    const a = w.x - rearAxleX;
    const u = k * a;
    const v = 1 - k * w.y;
    s += Math.atan2(u, v) - w.heading;
    d += a / (u * u + v * v);
  }
  out[0] = s;
  out[1] = d;
}

const sd = new Float64Array(2);

export function balancedCurvature(wheels: readonly PlanWheel[], rearAxleX: number): number {
  let mean = 0;
  let xm = 0;
  for (const w of wheels) {
    mean += w.heading / wheels.length;
    xm += (w.x - rearAxleX) / wheels.length;
  }
  // Bicycle-model start: tan(mean heading) / wheelbase.
  let k = xm > 0 ? Math.tan(mean) / xm : 0;
  let lo = -Infinity;
  let hi = Infinity;
  for (let i = 0; i < 60; i++) {
    slipSum(wheels, rearAxleX, k, sd);
    const s = sd[0];
    const d = sd[1];
    if (s === 0) return k;
    if (s > 0) hi = Math.min(hi, k);
    else lo = Math.max(lo, k);
    let next = d > 0 ? k - s / d : NaN;
    if (!(next > lo && next < hi)) {
      // Newton left the bracket: bisect, or step out until the root is bracketed.
      if (Number.isFinite(lo) && Number.isFinite(hi)) next = (lo + hi) / 2;
      else if (Number.isFinite(lo)) next = lo + Math.max(1e-6, Math.abs(lo));
      else next = hi - Math.max(1e-6, Math.abs(hi));
    }
    if (Math.abs(next - k) <= 1e-15 * Math.max(1, Math.abs(k)) + 1e-18) return next;
    k = next;
  }
  return k;
}

function slipOf(w: PlanWheel, k: number, rearAxleX: number): WheelSlip {
  const beta = Math.atan2(k * (w.x - rearAxleX), 1 - k * w.y);
  const slipDeg = (beta - w.heading) * RAD;
  return { slipDeg, scrubMPerKm: scrubMPerKm(slipDeg) };
}

export function slipMeasures(left: PlanWheel, right: PlanWheel, rearAxleX: number): SlipMeasures {
  const k = balancedCurvature([left, right], rearAxleX);
  const l = slipOf(left, k, rearAxleX);
  const r = slipOf(right, k, rearAxleX);
  const worstSlipDeg = Math.max(Math.abs(l.slipDeg), Math.abs(r.slipDeg));
  if (Math.abs(k) < STRAIGHT_CURVATURE) {
    return { turnCentreMm: null, turnRadiusMm: null, left: l, right: r, worstSlipDeg, reason: 'straight ahead: the turn centre is at infinity' };
  }
  return { turnCentreMm: { x: rearAxleX, y: 1 / k }, turnRadiusMm: Math.abs(1 / k), left: l, right: r, worstSlipDeg };
}
