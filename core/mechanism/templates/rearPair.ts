/**
 * A leaning rear pair (`vehicle.rear.kind: "leaningPair"`, a tilting quadricycle): the rear
 * wheels lean with the frame through their own members and are not steered.
 *
 * Tree: frame -> rear carrier (prismatic along the frame's z: the rear spring's travel, solved)
 * -> upper and lower rear members (revolute about their pivot axes, on the carrier) -> a rear
 * upright per side (revolute on the lower member at its outer joint, about the lower member's
 * pivot axis, so it cannot turn about a vertical axis: no steer), closed at the upper member's
 * outer joint (coincident). Each rear tyre is held on the ground in every pose mode (travel mode
 * and a held front suspension included): the frame has no pitch, so with the front setting the
 * frame's height and lean, the carrier's slide and the members' rotation are the two unknowns
 * that put both rear tyres on the ground.
 *
 * The rear wheels are the graph's `rearWheels` (the front wheels stay `wheels`). Static toe and
 * camber are 0: the spin axis is along y at design.
 */

import type { ResolvedDesign, Side, Vec3Mm } from '../../design/types';
import { leaningRearSides } from '../../design/resolveDesign';
import type { Vec3 } from '../MechanismGraph';
import { SIDES, v, type MechanismBuilder } from './mechanismBuilder';

export type RearLevel = 'upper' | 'lower';
const REAR_LEVELS: readonly RearLevel[] = ['upper', 'lower'];

/** The spin axis of a rear wheel at design: along +y (the mechanism's convention, pointing left). */
export const REAR_SPIN_AXIS: Vec3 = [0, 1, 0];

function unit(p: Vec3Mm): Vec3 {
  const n = Math.hypot(p.x, p.y, p.z);
  return [p.x / n, p.y / n, p.z / n];
}

/** Adds the leaning rear pair's bodies, loops, rear wheels and drawing; nothing for another rear. */
export function addLeaningRearPair(b: MechanismBuilder, design: ResolvedDesign, frame: number): void {
  const rear = design.vehicle.rear;
  if (rear.kind !== 'leaningPair') return;
  const r = leaningRearSides(rear);
  const tyre = design.wheels.rear;
  const radius = design.parts.wishboneTubeRadiusMm;

  const carrier = b.addBody('rear.carrier', 'rear carrier', { kind: 'prismatic', parent: frame, origin: v(r.lower.pivot), axis: [0, 0, 1] });
  b.tube('rear.carrierPost', { label: 'rear carrier post between the member pivots', part: 'frame', a: b.onBody(carrier, r.upper.pivot), b: b.onBody(carrier, r.lower.pivot), radius: radius * 0.8 });
  b.tube('rear.carrierSlide', { label: 'rear carrier slide in the frame', part: 'frame', a: b.onBody(frame, r.lower.pivot), b: b.onBody(frame, r.upper.pivot), radius: radius * 1.2 });

  const member = {} as Record<RearLevel, number>;
  for (const level of REAR_LEVELS) {
    const m = r[level];
    const body = b.addBody(`rear.${level}Member`, `${level} rear member`, { kind: 'revolute', parent: carrier, origin: v(m.pivot), axis: unit(m.pivotAxis) });
    const pivot = b.addPoint(`vehicle.rear.${level}.pivot`, `${level} rear member centre pivot`, body, m.pivot);
    b.jointAt(pivot, `${level} rear member centre pivot`, 14);
    for (const side of SIDES) {
      b.tube(`rear.${level}Member.${side}`, { label: `${level} rear member, ${side} arm`, part: 'wishbone', a: pivot, b: b.onBody(body, m.outerJoint[side]), radius });
    }
    member[level] = body;
  }

  const lowerAxis = unit(r.lower.pivotAxis);
  for (const side of SIDES) {
    const lowerJ = r.lower.outerJoint[side];
    const upperJ = r.upper.outerJoint[side];
    const centre = r.wheelCentre[side];
    const upright = b.addBody(`${side}.rearUpright`, `${side} rear upright`, { kind: 'revolute', parent: member.lower, origin: v(lowerJ), axis: lowerAxis });
    const closure = b.addConstraint({
      kind: 'coincident',
      id: `${side}.rearUpperOuterJoint`,
      label: `${side} rear upper outer joint (upper rear member to rear upright)`,
      bodyA: upright,
      pointA: v(upperJ),
      bodyB: member.upper,
      pointB: v(upperJ),
    });
    const upper = b.addPoint(`vehicle.rear.upper.outerJoint.${side}`, `${side} rear upper outer joint`, upright, upperJ);
    const lower = b.addPoint(`vehicle.rear.lower.outerJoint.${side}`, `${side} rear lower outer joint`, upright, lowerJ);
    const wheelCentre = b.addPoint(`vehicle.rear.wheelCentre.${side}`, `${side} rear wheel centre`, upright, centre);
    const uprightTube = b.tube(`${side}.rearUpright`, { label: `${side} rear upright`, part: 'upright', a: upper, b: lower, radius: 12 });
    const stub = b.tube(`${side}.rearStubAxle`, {
      label: `${side} rear stub axle`,
      part: 'upright',
      a: b.onBody(upright, [(upperJ.x + lowerJ.x) / 2, (upperJ.y + lowerJ.y) / 2, centre.z]),
      b: wheelCentre,
      radius: 10,
    });
    b.jointAt(upper, `rear upper outer joint, ${side}`, 13);
    b.jointAt(lower, `rear lower outer joint, ${side}`, 13);
    b.jointAt(wheelCentre, `rear wheel centre, ${side}`, 9);
    b.shows({ kind: 'constraint', constraint: closure }, uprightTube);

    b.rearWheels.push({
      side,
      body: upright,
      centre: v(centre),
      spinAxis: [...REAR_SPIN_AXIS],
      rollingRadius: tyre.rollingRadiusMm,
      crownRadius: tyre.crownRadiusMm,
      tyreWidth: tyre.tyreWidthMm,
    });
    b.drawing.rearWheels.push({
      id: `rearWheel.${side}`,
      label: `${side} rear tyre`,
      body: b.bodyId(upright),
      centre: v(centre),
      spinAxis: [...REAR_SPIN_AXIS],
      rollingRadius: tyre.rollingRadiusMm,
      crownRadius: tyre.crownRadiusMm,
      width: tyre.tyreWidthMm,
    });
    const contact = b.addConstraint({
      kind: 'groundContact',
      id: `${side}.rearGroundContact`,
      label: `${side} rear tyre on the ground`,
      body: upright,
      wheelCentre: v(centre),
      spinAxis: [...REAR_SPIN_AXIS],
      rollingRadius: tyre.rollingRadiusMm,
      crownRadius: tyre.crownRadiusMm,
    });
    b.shows({ kind: 'constraint', constraint: contact }, stub);
  }
}

/** The rear side a wheel of `rearWheels` is on, in table order (left first, as the front). */
export const REAR_SIDE_ORDER: readonly Side[] = ['left', 'right'];
