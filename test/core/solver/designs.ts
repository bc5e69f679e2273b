/**
 * Invented test designs as ResolvedDesign objects (both sides spelled out), for the solver
 * tests. Nothing here is a reference value: the geometry is made up, and every check compares
 * against something computed outside the project's code.
 */
import { readFileSync } from 'node:fs';
import type { ResolvedDesign, Vec3Mm, PerSide } from '../../../core/design/types';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { DEFAULT_PART_SIZES, DEFAULT_RIDING, DEFAULT_TOLERANCES } from '../../../core/design/types';

export const P = (x: number, y: number, z: number): Vec3Mm => ({ x, y, z });

/** A right-side point and its mirror (y -> -y) on the left. */
export function mirrored(p: Vec3Mm): PerSide<Vec3Mm> {
  return { right: { ...p }, left: { x: p.x, y: -p.y, z: p.z } };
}

export interface SplitLayout {
  name: string;
  /** Right-side hardpoints; the left side mirrors them. */
  upperFront: Vec3Mm;
  upperRear: Vec3Mm;
  upperOuter: Vec3Mm;
  lowerFront: Vec3Mm;
  lowerRear: Vec3Mm;
  lowerOuter: Vec3Mm;
  steeringArm: Vec3Mm;
  wheelCentre: Vec3Mm;
  staticToeDeg?: number;
  staticCamberDeg?: number;
  steering: ResolvedDesign['steering'];
  rollingRadiusMm: number;
  crownRadiusMm?: number;
}

export function splitDesign(l: SplitLayout): ResolvedDesign {
  const stud = mirrored(P(0, 0, 1));
  const joint = { kind: 'ballJoint' as const, ratedDeg: 25, studAxis: stud };
  return {
    name: l.name,
    notes: '',
    vehicle: { wheelbaseMm: 1100, tilting: true, rear: { kind: 'single' } },
    frontEnd: {
      kind: 'splitWishbones',
      upper: { frontPivot: mirrored(l.upperFront), rearPivot: mirrored(l.upperRear), outerJoint: mirrored(l.upperOuter) },
      lower: { frontPivot: mirrored(l.lowerFront), rearPivot: mirrored(l.lowerRear), outerJoint: mirrored(l.lowerOuter) },
    },
    upright: {
      steeringAxis: 'ballJoints',
      steeringArmJoint: mirrored(l.steeringArm),
      wheelCentre: mirrored(l.wheelCentre),
      staticToeDeg: { right: l.staticToeDeg ?? 0, left: l.staticToeDeg ?? 0 },
      staticCamberDeg: { right: l.staticCamberDeg ?? 0, left: l.staticCamberDeg ?? 0 },
    },
    steering: l.steering,
    wheels: {
      front: { rollingRadiusMm: l.rollingRadiusMm, tyreWidthMm: 40, crownRadiusMm: l.crownRadiusMm ?? 20 },
      rear: { rollingRadiusMm: 330, tyreWidthMm: 40, crownRadiusMm: 20 },
    },
    joints: { upperOuter: joint, lowerOuter: joint, tieRodOuter: joint, tieRodInner: joint },
    envelope: { leanDeg: 45, handlebarDeg: 40, bumpMm: 100, reboundMm: 100 },
    // as resolveDesign fills it: the lean limit defaults to the envelope's lean
    riding: { ...DEFAULT_RIDING, maxLeanDeg: 45 },
    tolerances: { ...DEFAULT_TOLERANCES },
    parts: { ...DEFAULT_PART_SIZES },
  };
}

/** A rack sliding along y with its tie-rod joints at the given right-side point (mirrored). */
export function rack(rightJoint: Vec3Mm, mmPerHandlebarDeg = 1): ResolvedDesign['steering'] {
  return { kind: 'rack', axis: P(0, 1, 0), tieRodJoint: mirrored(rightJoint), mmPerHandlebarDeg };
}


/** A demo design from assets/designs, validated and resolved. */
export function demoDesign(name: 'heron-tilting-velomobile' | 'swift-parallelogram-trike' | 'wren-rack-trike'): ResolvedDesign {
  const text = readFileSync(new URL(`../../../assets/designs/${name}.tiltsheet`, import.meta.url), 'utf8');
  const v = validateDesign(JSON.parse(text), `${name}.tiltsheet`);
  if (!v.ok) throw new Error(`demo design ${name} does not validate: ${JSON.stringify(v.issues)}`);
  return resolveDesign(v.design);
}
