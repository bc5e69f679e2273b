/**
 * Per-wheel alignment of a posed upright: toe, camber (to ground and to frame), caster,
 * kingpin inclination, trail, scrub radius, caster and kingpin offsets at the wheel centre,
 * spindle length, wheel travel, wheel centre and contact patch.
 *
 * Conventions (docs/conventions.md): ISO 8855 axes; caster top rearward positive and KPI
 * top inward positive, both projected angles (side view x-z, front view y-z) as SAE J670
 * defines them. Trail, scrub radius and the offsets are measured in the wheel's ground
 * axes (ISO 8855 wheel axis system): along the wheel's heading on the ground and across it.
 */

import type { Side } from '../design/types';
import type { Vec3 } from '../mechanism/MechanismGraph';
import { camberFromAxis, toeFromHeading, wheelHeading } from '../mechanism/wheelAxis';
import { tyreLowestPoint } from './poseSnapshot';
import type { WheelAlignment } from './analysisTypes';
import type { SideGeometry } from './poseGeometry';
import { RAD, cross, dot, norm, normalize, sub, xyz, type XyzMm } from './vec3';

export interface TyreShape {
  rollingRadiusMm: number;
  crownRadiusMm: number;
}

/** Steering axis of a posed upright: unit direction pointing up (lower to upper joint). */
export function steeringAxisDirection(g: SideGeometry): Vec3 {
  const k = normalize(sub(g.upperJoint, g.lowerJoint));
  return k[2] >= 0 ? k : [-k[0], -k[1], -k[2]];
}

/** +1 for the left wheel (outward is +y), -1 for the right. */
export const outwardSign = (side: Side): number => (side === 'left' ? 1 : -1);

/** Caster (top rearward positive) and KPI (top inward positive) of an axis k in axes (x, y, up), radians. */
export function casterAndKpi(side: Side, k: Vec3, x: Vec3 = [1, 0, 0], y: Vec3 = [0, 1, 0], up: Vec3 = [0, 0, 1]): { caster: number; kpi: number } {
  const kx = dot(k, x);
  const ky = dot(k, y);
  const kz = dot(k, up);
  return { caster: Math.atan2(-kx, kz), kpi: Math.atan2(-outwardSign(side) * ky, kz) };
}

export function wheelAlignment(
  g: SideGeometry,
  tyre: TyreShape,
  frame: { x: Vec3; y: Vec3; up: Vec3; origin: Vec3 },
  designCentreZ: number,
): WheelAlignment {
  const side = g.side;
  const a = g.spinAxis;
  const heading = wheelHeading(a[0], a[1]);
  const ch = Math.cos(heading);
  const sh = Math.sin(heading);
  // wheel's ground axes: h along the heading, inward across it
  const h: Vec3 = [ch, sh, 0];
  const s = outwardSign(side);
  const inward: Vec3 = [s * sh, -s * ch, 0];
  const k = steeringAxisDirection(g);
  const ground = casterAndKpi(side, k);
  const inFrame = casterAndKpi(side, k, frame.x, frame.y, frame.up);
  const C = g.wheelCentre;
  const contact = tyreLowestPoint(C, a, tyre.rollingRadiusMm, tyre.crownRadiusMm);
  const L = g.lowerJoint;
  const toCentre = sub(C, L);
  const spindle = norm(cross(toCentre, k));
  const travel = dot(sub(C, frame.origin), frame.up) - designCentreZ;

  const steerDeg = heading * RAD;
  const toeDeg = toeFromHeading(side, heading) * RAD;
  const camberDeg = camberFromAxis(side, a[0], a[1], a[2]) * RAD;
  const camberToFrameDeg = camberFromAxis(side, a[0], a[1], a[2], frame.up) * RAD;
  // The front-view projection: the wheel plane's trace in the y-z plane, perpendicular there to
  // the spin axis projected onto it (equal to the camber when the wheel points straight ahead).
  const ayz = Math.hypot(a[1], a[2]);
  const camberFrontViewDeg = ayz > 1e-12 ? camberFromAxis(side, 0, a[1] / ayz, a[2] / ayz) * RAD : null;
  // The axis meets the ground only if it is not horizontal (a near-horizontal axis would
  // put its ground point kilometres away: no meaningful trail or scrub).
  let trailMm: number | null = null;
  let scrubRadiusMm: number | null = null;
  let casterOffsetMm: number | null = null;
  let kingpinOffsetAtCentreMm: number | null = null;
  let axisGroundPointMm: XyzMm | null = null;
  const meetsGround = k[2] >= 1e-6;
  if (meetsGround) {
    const G: Vec3 = [L[0] - (k[0] * L[2]) / k[2], L[1] - (k[1] * L[2]) / k[2], 0];
    const t = (C[2] - L[2]) / k[2];
    const atCentreHeight: Vec3 = [L[0] + k[0] * t, L[1] + k[1] * t, C[2]];
    const gc = sub(G, contact);
    const ac = sub(atCentreHeight, C);
    trailMm = dot(gc, h);
    scrubRadiusMm = dot(gc, inward);
    casterOffsetMm = dot(ac, h);
    kingpinOffsetAtCentreMm = dot(ac, inward);
    axisGroundPointMm = xyz(G);
  }
  // One object literal in one field order (object spread is slow in V8 and changes shapes).
  const out: WheelAlignment = {
    side,
    steerDeg,
    toeDeg,
    camberDeg,
    camberToFrameDeg,
    camberFrontViewDeg,
    casterDeg: ground.caster * RAD,
    kpiDeg: ground.kpi * RAD,
    casterToFrameDeg: inFrame.caster * RAD,
    kpiToFrameDeg: inFrame.kpi * RAD,
    trailMm,
    scrubRadiusMm,
    casterOffsetMm,
    kingpinOffsetAtCentreMm,
    spindleLengthMm: spindle,
    travelMm: travel,
    centreMm: xyz(C),
    contactPatchMm: xyz(contact),
    axisGroundPointMm,
  };
  if (!meetsGround) out.reason = 'the steering axis is horizontal: it does not meet the ground';
  return out;
}
