/**
 * The uprights. With ball joints (`upright.steeringAxis: "ballJoints"`) each upright hangs on
 * its lower outer joint (spherical) and closes its loop at the upper outer joint (coincident
 * with the upper wishbone or member): the outer joints see every rotation of the upright,
 * steering included.
 *
 * With a kingpin (`"kingpin"`) the outer joints carry a yoke (kingpinYoke.ts) and the upright
 * turns in the yoke on a revolute joint about the kingpin axis, the line through the two outer
 * joints; the steering arm and the wheel are on the upright, so the outer joints do not see
 * the steering. Either way the upright's named points (outer joints, steering arm, wheel
 * centre) ride on the upright: the outer joints lie on the kingpin axis, so they sit at the
 * same place whether read on the yoke or on the upright.
 *
 * Drawn as the kingpin tube, a spindle to the wheel centre and a steering arm, with the
 * steering axis line.
 */

import type { ResolvedDesign, Side } from '../../design/types';
import type { DrawingPointRef } from '../drawingLayout';
import type { OuterJoints, Suspension } from './frontSuspension';
import { addKingpinUpright } from './kingpinYoke';
import { mid, SIDES, v, type MechanismBuilder } from './mechanismBuilder';

export interface Uprights {
  body: Record<Side, number>;
  outerJoints: OuterJoints;
  steeringArmJoint: Record<Side, DrawingPointRef>;
  /** The spindle tube of each side (it stands for what fixes that wheel's travel). */
  spindle: Record<Side, string>;
}

export function addUprights(b: MechanismBuilder, design: ResolvedDesign, suspension: Suspension): Uprights {
  const fe = design.frontEnd;
  const carrierWord = fe.kind === 'centrePivot' ? 'upper member' : 'upper wishbone';
  const kingpin = design.upright.steeringAxis === 'kingpin';
  const out: Uprights = {
    body: { right: -1, left: -1 },
    outerJoints: {} as OuterJoints,
    steeringArmJoint: {} as Record<Side, DrawingPointRef>,
    spindle: { right: '', left: '' },
  };
  for (const side of SIDES) {
    const lowerJ = fe.lower.outerJoint[side];
    const upperJ = fe.upper.outerJoint[side];
    // What the upper outer joint joins to the upper carrier: the yoke, or the upright itself.
    let u: number;
    let upperJoined: number;
    if (kingpin) {
      const k = addKingpinUpright(b, side, suspension.carrier[side].lower, v(lowerJ), v(upperJ));
      u = k.upright;
      upperJoined = k.yoke;
    } else {
      u = b.addBody(`${side}.upright`, `${side} upright`, {
        kind: 'spherical',
        parent: suspension.carrier[side].lower,
        origin: v(lowerJ),
        axis: [0, 0, 1],
      });
      upperJoined = u;
    }
    const closure = b.addConstraint({
      kind: 'coincident',
      id: `${side}.upperOuterJoint`,
      label: `${side} upper outer joint (${carrierWord} to ${kingpin ? 'kingpin yoke' : 'upright'})`,
      bodyA: upperJoined,
      pointA: v(upperJ),
      bodyB: suspension.carrier[side].upper,
      pointB: v(upperJ),
    });
    const upper = b.addPoint(`frontEnd.upper.outerJoint.${side}`, `${side} upper outer joint`, u, upperJ);
    const lower = b.addPoint(`frontEnd.lower.outerJoint.${side}`, `${side} lower outer joint`, u, lowerJ);
    const arm = b.addPoint(`upright.steeringArmJoint.${side}`, `${side} steering arm joint`, u, design.upright.steeringArmJoint[side]);
    const wheelCentre = b.addPoint(`upright.wheelCentre.${side}`, `${side} wheel centre`, u, design.upright.wheelCentre[side]);
    out.body[side] = u;
    out.outerJoints[side] = { upper, lower };
    out.steeringArmJoint[side] = arm;

    const kingpinMid = b.onBody(u, mid(upperJ, lowerJ));
    const kingpinTube = b.tube(`${side}.upright`, { label: `${side} upright`, part: 'upright', a: upper, b: lower, radius: 12 });
    out.spindle[side] = b.tube(`${side}.spindle`, { label: `${side} spindle`, part: 'upright', a: kingpinMid, b: wheelCentre, radius: 10 });
    const steeringArm = b.tube(`${side}.steeringArm`, {
      label: `${side} steering arm`,
      part: 'upright',
      a: kingpinMid,
      b: arm,
      radius: design.parts.steeringArmRadiusMm,
    });
    b.axisLine(`${side}.steeringAxis`, `${side} steering axis`, upper, lower, true);
    const upperJoint = b.jointAt(upper, `upper outer joint, ${side}`, 15);
    const lowerJoint = b.jointAt(lower, `lower outer joint, ${side}`, 15);
    const armJoint = b.jointAt(arm, `tie rod outer joint, ${side}`, 12);
    b.jointAt(wheelCentre, `wheel centre, ${side}`, 9);

    b.shows({ kind: 'constraint', constraint: closure }, kingpinTube);
    b.shows({ kind: 'joint', joint: 'upperOuter', side }, upperJoint);
    b.shows({ kind: 'joint', joint: 'lowerOuter', side }, lowerJoint);
    b.shows({ kind: 'joint', joint: 'tieRodOuter', side }, armJoint);
    b.shows({ kind: 'clearance', part: 'steeringArm', side }, steeringArm);
    b.shows({ kind: 'transmission', link: 'steeringArm', side }, steeringArm);
  }
  return out;
}
