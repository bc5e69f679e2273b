/**
 * Clearances between parts, modelled simply:
 *   - capsules (a segment swept by a radius from design.parts):
 *       upperArm / lowerArm  wishbone or member: midpoint of the inner pivots (split) or the
 *                            centre pivot, to the outer joint (wishboneTubeRadiusMm);
 *       upperRail / lowerRail the frame tube a split wishbone mounts on: through its two inner
 *                            pivots (wishboneTubeRadiusMm);
 *       tieRod               inner joint to steering-arm joint (tieRodRadiusMm);
 *       steeringArm          the point of the steering axis nearest the arm joint, to the arm
 *                            joint (steeringArmRadiusMm);
 *       crankArm             crank or lever axis to its tie-rod joint (steeringArmRadiusMm), or
 *       rack                 the rack bar between its two tie-rod joints (steeringArmRadiusMm);
 *   - the tyre as a torus: its crown circle (radius rolling - crown, in the wheel plane) swept
 *     by the crown radius (the same torus the ground contact uses; sidewalls are not modelled).
 * The distance reported is surface to surface: negative where the modelled parts intersect.
 * Distances are exact (distance3.ts): closed form for two segments, the real roots of a
 * quartic for a segment and the tyre's crown circle.
 * Pairs (per side): the tie rod against the wishbones and frame rails, the steering arm
 * against the wishbones, and the tyre against the wishbones, frame rails, tie rod and the
 * crank arm or rack. Parts sharing a joint (tie rod and steering arm, say) are not paired.
 * Across the vehicle: the left tyre against the right one (`tyreToTyreDistance`), which
 * catches sides mirrored into each other, and wheels that meet when steered or leaned.
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { Vec3 } from '../mechanism/MechanismGraph';
import type { ClearanceResult, WheelAlignment } from './analysisTypes';
import type { PoseGeometry, SideGeometry } from './poseGeometry';
import { segmentCircleDistance, segmentSegmentDistance } from './distance3';
import { addScaled, cross, DEG, dot, norm, normalize, scale, sub, type XyzMm } from './vec3';

const tuple = (p: XyzMm): Vec3 => [p.x, p.y, p.z];
import type { ClearancePartName } from '../mechanism/drawingLayout';

/** The parts the clearance checks model: the names the drawing layout colours them by. */
export type PartName = ClearancePartName;

export interface ClearancePair {
  /** e.g. 'tieRod-lowerArm' */
  id: string;
  side: Side;
  a: PartName;
  b: PartName;
}

const PAIRS: readonly [PartName, PartName][] = [
  ['tieRod', 'upperArm'],
  ['tieRod', 'lowerArm'],
  ['tieRod', 'upperRail'],
  ['tieRod', 'lowerRail'],
  ['steeringArm', 'upperArm'],
  ['steeringArm', 'lowerArm'],
  ['tyre', 'upperArm'],
  ['tyre', 'lowerArm'],
  ['tyre', 'upperRail'],
  ['tyre', 'lowerRail'],
  ['tyre', 'tieRod'],
  ['tyre', 'crankArm'],
  ['tyre', 'rack'],
];

/** The pairs a design has (frame rails only with split wishbones; crank arm or rack by steering kind, neither with a track rod). */
export function clearancePairs(design: ResolvedDesign): ClearancePair[] {
  const split = design.frontEnd.kind === 'splitWishbones';
  const rack = design.steering.kind === 'rack';
  // A one-piece track rod has no crank arms (its drag link is not modelled as a capsule).
  const trackRod = design.steering.kind === 'trackRod';
  const has = (p: PartName) => {
    if (p === 'upperRail' || p === 'lowerRail') return split;
    if (p === 'crankArm') return !rack && !trackRod;
    if (p === 'rack') return rack;
    return true;
  };
  const out: ClearancePair[] = [];
  for (const side of ['left', 'right'] as Side[]) {
    for (const [a, b] of PAIRS) if (has(a) && has(b)) out.push({ id: `${a}-${b}`, side, a, b });
  }
  return out;
}

interface Capsule {
  p0: Vec3;
  p1: Vec3;
  r: number;
}

function capsuleOf(part: Exclude<PartName, 'tyre'>, g: SideGeometry, pose: PoseGeometry, design: ResolvedDesign): Capsule | null {
  const parts = design.parts;
  switch (part) {
    case 'upperArm':
      return { p0: g.upperArmInner, p1: g.upperJoint, r: parts.wishboneTubeRadiusMm };
    case 'lowerArm':
      return { p0: g.lowerArmInner, p1: g.lowerJoint, r: parts.wishboneTubeRadiusMm };
    case 'upperRail':
      return g.upperRail ? { p0: g.upperRail[0], p1: g.upperRail[1], r: parts.wishboneTubeRadiusMm } : null;
    case 'lowerRail':
      return g.lowerRail ? { p0: g.lowerRail[0], p1: g.lowerRail[1], r: parts.wishboneTubeRadiusMm } : null;
    case 'tieRod':
      return { p0: g.innerJoint, p1: g.armJoint, r: parts.tieRodRadiusMm };
    case 'steeringArm':
      return { p0: g.armFoot, p1: g.armJoint, r: parts.steeringArmRadiusMm };
    case 'crankArm':
      return g.crankFoot ? { p0: g.crankFoot, p1: g.innerJoint, r: parts.steeringArmRadiusMm } : null;
    case 'rack':
      return { p0: pose.right.innerJoint, p1: pose.left.innerJoint, r: parts.steeringArmRadiusMm };
  }
}

export interface TyreTorus {
  rollingRadiusMm: number;
  crownRadiusMm: number;
}

export function measureClearances(pose: PoseGeometry, design: ResolvedDesign, pairs: readonly ClearancePair[], tyre: TyreTorus): ClearanceResult[] {
  const out: ClearanceResult[] = [];
  for (const pr of pairs) {
    const g = pose[pr.side];
    const b = capsuleOf(pr.b as Exclude<PartName, 'tyre'>, g, pose, design);
    if (!b) continue;
    let d: number;
    if (pr.a === 'tyre') {
      const core = segmentCircleDistance(b.p0, b.p1, g.wheelCentre, g.spinAxis, tyre.rollingRadiusMm - tyre.crownRadiusMm);
      d = core - tyre.crownRadiusMm - b.r;
    } else {
      const a = capsuleOf(pr.a, g, pose, design);
      if (!a) continue;
      d = segmentSegmentDistance(a.p0, a.p1, b.p0, b.p1) - a.r - b.r;
    }
    out.push({ pair: pr.id, side: pr.side, distanceMm: d });
  }
  return out;
}

/** The core circle of a tyre's torus in the world: centre, unit normal (the spin axis), radius. */
export interface CrownCircle {
  centre: Vec3;
  normal: Vec3;
  radius: number;
}

/**
 * A wheel's crown circle from what the pose analysis reports of it: the wheel centre, the
 * contact point (the torus's lowest point: `radius` down the wheel plane's steepest line from the
 * centre, then the crown radius straight down) and the heading (the wheel plane's horizontal
 * line). The spin axis is the normal to those two in-plane directions.
 */
export function crownCircleOf(w: WheelAlignment, tyre: TyreTorus): CrownCircle {
  const centre = tuple(w.centreMm);
  const radius = tyre.rollingRadiusMm - tyre.crownRadiusMm;
  const heading: Vec3 = [Math.cos(w.steerDeg * DEG), Math.sin(w.steerDeg * DEG), 0];
  // A ball-shaped tyre (crown = rolling radius) has no plane: any normal serves a circle of radius 0.
  if (!(radius > 1e-9)) return { centre, normal: [0, 1, 0], radius: 0 };
  const down = scale(addScaled(sub(tuple(w.contactPatchMm), centre), [0, 0, 1], tyre.crownRadiusMm), 1 / radius);
  return { centre, normal: normalize(cross(heading, down)), radius };
}

/** Distance from a point to a circle (exact: the nearest circle point lies toward the point's foot on the plane). */
function pointCircleDistance(p: Vec3, c: CrownCircle): number {
  const q = sub(p, c.centre);
  const h = dot(q, c.normal);
  const rho = norm(addScaled(q, c.normal, -h));
  return Math.hypot(h, rho - c.radius);
}

/** Circle samples before refining; neighbouring minima of two wheel-sized circles are far wider apart. */
const CIRCLE_SAMPLES = 72;

/**
 * Surface distance between two tyres of the same section (tori around their crown circles):
 * the least distance between the circles minus twice the crown radius; negative where they
 * intersect. The circle distance is the least over circle A of the exact point-to-circle
 * distance to B, sampled every 5 degrees and refined by golden-section search around each of
 * the three lowest samples.
 */
export function tyreToTyreDistance(a: CrownCircle, b: CrownCircle, crownRadiusMm: number): number {
  if (a.radius === 0) return pointCircleDistance(a.centre, b) - 2 * crownRadiusMm;
  // Two unit vectors spanning A's plane.
  const seed: Vec3 = Math.abs(a.normal[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const u = normalize(cross(a.normal, seed));
  const v = cross(a.normal, u);
  const at = (t: number): number =>
    pointCircleDistance(addScaled(addScaled(a.centre, u, a.radius * Math.cos(t)), v, a.radius * Math.sin(t)), b);
  const step = (2 * Math.PI) / CIRCLE_SAMPLES;
  const samples = Array.from({ length: CIRCLE_SAMPLES }, (_, i) => ({ t: i * step, d: at(i * step) }));
  samples.sort((p, q) => p.d - q.d);
  let best = samples[0].d;
  const golden = (Math.sqrt(5) - 1) / 2;
  for (const start of samples.slice(0, 3)) {
    let lo = start.t - step;
    let hi = start.t + step;
    let x1 = hi - golden * (hi - lo);
    let x2 = lo + golden * (hi - lo);
    let f1 = at(x1);
    let f2 = at(x2);
    for (let k = 0; k < 40; k++) {
      if (f1 < f2) {
        hi = x2;
        x2 = x1;
        f2 = f1;
        x1 = hi - golden * (hi - lo);
        f1 = at(x1);
      } else {
        lo = x1;
        x1 = x2;
        f1 = f2;
        x2 = lo + golden * (hi - lo);
        f2 = at(x2);
      }
    }
    best = Math.min(best, f1, f2);
  }
  return best - 2 * crownRadiusMm;
}
