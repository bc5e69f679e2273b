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
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { Vec3 } from '../mechanism/MechanismGraph';
import type { ClearanceResult } from './analysisTypes';
import type { PoseGeometry, SideGeometry } from './poseGeometry';
import { segmentCircleDistance, segmentSegmentDistance } from './distance3';
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

/** The pairs a design has (frame rails only with split wishbones; crank arm or rack by steering kind). */
export function clearancePairs(design: ResolvedDesign): ClearancePair[] {
  const split = design.frontEnd.kind === 'splitWishbones';
  const rack = design.steering.kind === 'rack';
  const has = (p: PartName) => {
    if (p === 'upperRail' || p === 'lowerRail') return split;
    if (p === 'crankArm') return !rack;
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
