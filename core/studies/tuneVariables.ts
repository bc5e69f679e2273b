/**
 * A design with a tuning plan's variables moved: hardpoint coordinates through
 * offsetDesignFile (studyCoordinates.ts), then tie-rod lengths, each by moving the rod's inner
 * joint (on the crank, lever or rack: `steering.tieRodJoint`) along the rod's line from its
 * outer joint (`upright.steeringArmJoint`), positive away from it (a longer rod). The line is
 * taken after the coordinate moves, so a plan that moves the inner joint and lengthens the rod
 * does both.
 *
 * Bounds: the optimiser works in unbounded variables u and maps them into each range by
 *   x = lo + (hi - lo) (1 + sin u) / 2
 * (a smooth transform: every u gives a design inside the ranges, and the map is smooth, so
 * Levenberg-Marquardt needs no bound handling of its own).
 */

import type { DesignFile } from '../design/types';
import { isTwoSided, resolveSidedVec } from '../design/resolveDesign';
import { offsetDesignFile } from './studyCoordinates';
import type { ResolvedVariable } from './tunePlan';

/** Offsets (mm) of the variables applied to a copy of the design; the input is not changed. */
export function applyTuneOffsets(file: DesignFile, variables: readonly ResolvedVariable[], offsetsMm: ArrayLike<number>): DesignFile {
  const coords = variables.flatMap((v) => (v.kind === 'coordinate' ? [v.coordinate] : []));
  const coordOffsets = variables.flatMap((v, i) => (v.kind === 'coordinate' ? [offsetsMm[i]] : []));
  let out = coords.length > 0 ? offsetDesignFile(file, coords, coordOffsets) : (JSON.parse(JSON.stringify(file)) as DesignFile);
  variables.forEach((v, i) => {
    if (v.kind === 'tieRodLength' && offsetsMm[i] !== 0) out = lengthenTieRods(out, v.side, offsetsMm[i]);
  });
  return out;
}

function lengthenTieRods(file: DesignFile, side: 'both' | 'left' | 'right', dMm: number): DesignFile {
  // The plan refuses a tie-rod length for a track rod (tunePlan.ts); nothing to lengthen here.
  if (file.steering.kind === 'trackRod') return file;
  const inner = resolveSidedVec(file.steering.tieRodJoint);
  const outer = resolveSidedVec(file.upright.steeringArmJoint);
  for (const s of side === 'both' ? (['right', 'left'] as const) : [side]) {
    const a = outer[s];
    const b = inner[s];
    const len = Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
    if (!(len > 0)) continue;
    const k = dMm / len;
    inner[s] = { x: b.x + (b.x - a.x) * k, y: b.y + (b.y - a.y) * k, z: b.z + (b.z - a.z) * k };
  }
  // A mirrored point stays written once when both rods change alike; one side alone breaks the mirror.
  file.steering.tieRodJoint = side === 'both' && !isTwoSided(file.steering.tieRodJoint) ? inner.right : inner;
  return file;
}

/** Offset inside [lo, hi] from an unbounded variable. */
export function boundedOffset(u: number, lo: number, hi: number): number {
  return lo + ((hi - lo) * (1 + Math.sin(u))) / 2;
}

/** d(offset)/du. */
export function boundedSlope(u: number, lo: number, hi: number): number {
  return ((hi - lo) * Math.cos(u)) / 2;
}

/** The unbounded variable of an offset inside [lo, hi] (the branch with |u| <= pi/2). */
export function unboundedOf(x: number, lo: number, hi: number): number {
  const s = (2 * (x - lo)) / (hi - lo) - 1;
  return Math.asin(Math.min(1, Math.max(-1, s)));
}
