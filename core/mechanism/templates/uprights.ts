/**
 * The uprights: each hangs on its lower outer joint (spherical) and closes its loop at the
 * upper outer joint (coincident with the upper wishbone or member). Drawn as the kingpin
 * tube, a spindle to the wheel centre and a steering arm, with the steering axis line.
 */

import type { ResolvedDesign, Side } from '../../design/types';
import type { DrawingPointRef } from '../drawingLayout';
import type { OuterJoints, Suspension } from './frontSuspension';
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
  const out: Uprights = {
    body: { right: -1, left: -1 },
    outerJoints: {} as OuterJoints,
    steeringArmJoint: {} as Record<Side, DrawingPointRef>,
    spindle: { right: '', left: '' },
  };
  for (const side of SIDES) {
    const lowerJ = fe.lower.outerJoint[side];
    const upperJ = fe.upper.outerJoint[side];
    const u = b.addBody(`${side}.upright`, `${side} upright`, {
      kind: 'spherical',
      parent: suspension.carrier[side].lower,
      origin: v(lowerJ),
      axis: [0, 0, 1],
    });
    const closure = b.addConstraint({
      kind: 'coincident',
      id: `${side}.upperOuterJoint`,
      label: `${side} upper outer joint (${carrierWord} to upright)`,
      bodyA: u,
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
    const kingpin = b.tube(`${side}.upright`, { label: `${side} upright`, part: 'upright', a: upper, b: lower, radius: 12 });
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

    b.shows({ kind: 'constraint', constraint: closure }, kingpin);
    b.shows({ kind: 'joint', joint: 'upperOuter', side }, upperJoint);
    b.shows({ kind: 'joint', joint: 'lowerOuter', side }, lowerJoint);
    b.shows({ kind: 'joint', joint: 'tieRodOuter', side }, armJoint);
    b.shows({ kind: 'clearance', part: 'steeringArm', side }, steeringArm);
    b.shows({ kind: 'transmission', link: 'steeringArm', side }, steeringArm);
  }
  return out;
}
