/**
 * The balance-beam (rocker) lean linkage (design block `leanLinkage`): a carrier on a slide in
 * the frame along the spring's line, a rocker on a revolute joint in the carrier, and a push
 * link per side (a distance row) from the rocker to that side's wishbone. With the tyres on the
 * ground the spring travel drives the carrier through heaveMm, + = spring extension (the sign of
 * a frame heave: every caller that sets heave = -wheel travel then compresses the spring in
 * bump), so pure lean turns
 * the rocker and leaves the spring's length alone; with the wheels' travel given (or the
 * suspension held) the carrier and rocker are solved from the wishbones. In the tilt-lock pose
 * mode (`leanBy: 'rocker'`) the rocker angle is the input and the frame's lean is solved.
 *
 * The frame's own lateral and vertical place is set in buildMechanism.ts (leanLinkageFrame).
 */

import type { ResolvedDesign, ResolvedLeanLinkage } from '../../design/types';
import type { InputBinding } from '../MechanismGraph';
import type { Suspension } from './frontSuspension';
import type { Uprights } from './uprights';
import type { PoseMode } from './buildMechanism';
import { DEG, dist, SIDES, sub, v, type MechanismBuilder } from './mechanismBuilder';

/** Body and point ids the lean-linkage analysis reads. */
export const LEAN_IDS = {
  carrier: 'leanCarrier',
  rocker: 'leanRocker',
  lateral: 'lateralSlide',
  frameMount: 'leanLinkage.carrier.frameMount',
  carrierMount: 'leanLinkage.carrier.carrierMount',
  actuatorFrame: 'leanLinkage.actuator.frameMount',
  actuatorRocker: 'leanLinkage.actuator.rockerMount',
} as const;

/** Whether the pose mode lets the tyres set the frame's place (ground contact, suspension free). */
export function onGround(mode: PoseMode): boolean {
  return mode.contact === 'ground' && mode.hold !== 'suspension';
}

/** The carrier's slide direction: from its spring mount toward the frame's (a positive slide compresses the spring). */
export function carrierAxis(l: ResolvedLeanLinkage): [number, number, number] {
  const d = sub(l.carrier.frameMount, l.carrier.carrierMount);
  const n = Math.hypot(d[0], d[1], d[2]);
  return [d[0] / n, d[1] / n, d[2] / n];
}

export function addLeanLinkage(b: MechanismBuilder, design: ResolvedDesign, frame: number, suspension: Suspension, mode: PoseMode): void {
  const l = design.leanLinkage;
  if (!l) return;
  const ground = onGround(mode);
  const carrierDriver: { driver?: InputBinding } = ground ? { driver: { input: 'heaveMm', gain: -1 } } : {};
  const carrier = b.addBody(LEAN_IDS.carrier, 'lean linkage carrier', {
    kind: 'prismatic',
    parent: frame,
    origin: v(l.carrier.carrierMount),
    axis: carrierAxis(l),
    ...carrierDriver,
  });
  const rockerDriver: { driver?: InputBinding } = mode.leanBy === 'rocker' ? { driver: { input: 'leanDeg', gain: DEG } } : {};
  const rocker = b.addBody(LEAN_IDS.rocker, 'rocker', {
    kind: 'revolute',
    parent: carrier,
    origin: v(l.rocker.pivot),
    axis: v(l.rocker.axis),
    ...rockerDriver,
  });

  const frameMount = b.addPoint(LEAN_IDS.frameMount, 'spring mount on the frame', frame, l.carrier.frameMount);
  const carrierMount = b.addPoint(LEAN_IDS.carrierMount, 'spring mount on the carrier', carrier, l.carrier.carrierMount);
  const pivot = b.addPoint('leanLinkage.rocker.pivot', 'rocker pivot', rocker, l.rocker.pivot);
  b.jointAt(frameMount, 'spring mount on the frame', 10);
  b.jointAt(carrierMount, 'spring mount on the carrier', 10);
  b.jointAt(pivot, 'rocker pivot', 12);
  b.tube('lean.spring', { label: 'lean linkage spring', part: 'spring', a: frameMount, b: carrierMount, radius: 16 });
  b.tube('lean.carrier', { label: 'lean linkage carrier', part: 'frame', a: carrierMount, b: pivot, radius: 10 });

  const on = l.pushLinks.on;
  for (const side of SIDES) {
    const arm = suspension.carrier[side][on];
    const joint = b.addPoint(`leanLinkage.rocker.linkJoint.${side}`, `rocker link joint, ${side}`, rocker, l.rocker.linkJoint[side]);
    const armJoint = b.addPoint(`leanLinkage.pushLinks.armJoint.${side}`, `push link joint on the ${on} wishbone, ${side}`, arm, l.pushLinks.armJoint[side]);
    b.jointAt(joint, `rocker link joint, ${side}`, 9);
    b.jointAt(armJoint, `push link wishbone joint, ${side}`, 9);
    b.tube(`lean.rocker.${side}`, { label: `rocker, ${side} arm`, part: 'steering', a: pivot, b: joint, radius: 11 });
    const link = b.addConstraint({
      kind: 'distance',
      id: `${side}.pushLink`,
      label: `${side} push link`,
      bodyA: rocker,
      pointA: v(l.rocker.linkJoint[side]),
      bodyB: arm,
      pointB: v(l.pushLinks.armJoint[side]),
      length: dist(l.rocker.linkJoint[side], l.pushLinks.armJoint[side]),
    });
    b.links.push({ id: `${side}.pushLink`, label: `${side} push link`, bodyA: rocker, pointA: v(l.rocker.linkJoint[side]), bodyB: arm, pointB: v(l.pushLinks.armJoint[side]) });
    const tube = b.tube(`lean.pushLink.${side}`, { label: `push link, ${side}`, part: 'tieRod', a: joint, b: armJoint, radius: 7 });
    b.shows({ kind: 'constraint', constraint: link }, tube);
  }
  if (l.actuator) {
    const fm = b.addPoint(LEAN_IDS.actuatorFrame, 'lean actuator mount on the frame', frame, l.actuator.frameMount);
    const rm = b.addPoint(LEAN_IDS.actuatorRocker, 'lean actuator mount on the rocker', rocker, l.actuator.rockerMount);
    b.jointAt(fm, 'lean actuator frame mount', 8);
    b.jointAt(rm, 'lean actuator rocker mount', 8);
    b.tube('lean.actuator', { label: 'lean actuator', part: 'spring', a: fm, b: rm, radius: 9 });
  }
}

/** Both front tyres scrub sideways equally: the mean y of their lowest points is 0 (ground mode only). */
export function addMeanContactRow(b: MechanismBuilder, design: ResolvedDesign, uprights: Uprights, mode: PoseMode): void {
  if (!design.leanLinkage || !onGround(mode)) return;
  const right = b.wheels.find((w) => w.side === 'right')!;
  const left = b.wheels.find((w) => w.side === 'left')!;
  const id = b.addConstraint({
    kind: 'meanContactY',
    id: 'frame.meanContactY',
    label: 'frame lateral place (mean tyre contact y = 0)',
    bodyA: uprights.body.right,
    centreA: right.centre,
    spinAxisA: right.spinAxis,
    bodyB: uprights.body.left,
    centreB: left.centre,
    spinAxisB: left.spinAxis,
    rollingRadius: design.wheels.front.rollingRadiusMm,
    crownRadius: design.wheels.front.crownRadiusMm,
  });
  // Both tyres stand for it (they are the drawn parts addFrontWheels named `tyre.<side>`).
  b.shows({ kind: 'constraint', constraint: id }, 'tyre.right', 'tyre.left');
}
