/**
 * A one-piece track rod (`steering.kind: "trackRod"`): one rod with a ball joint at each end
 * joins the two steering arms (`upright.steeringArmJoint`), the Ackermann trapezoid. It is a
 * link of fixed length between the two uprights (one row); it has no body, so its spin about
 * its own line, which no joint stops, is no unknown of the solve.
 *
 * The handlebar turns the uprights either
 * - through a drag link (`drive.kind: "dragLink"`): a steering column hung on the frame (driven
 *   one degree per handlebar degree) whose arm pulls a second arm on one upright; or
 * - directly (`drive.kind: "knuckle"`): the handlebar is fixed to one upright, so the handlebar
 *   angle is that upright's rotation about its kingpin (the revolute joint between yoke and
 *   upright, kingpinYoke.ts; validation refuses ball-joint uprights here).
 *
 * The analysis reads the track rod as each side's tie rod, running from this side's steering
 * arm to the other side's: its inner joint is the far end (poseGeometry.ts).
 */

import type { ResolvedDesign, Side, TrackRodDrive, Vec3Mm } from '../../design/types';
import type { Vec3 } from '../MechanismGraph';
import type { PoseMode } from './buildMechanism';
import type { Uprights } from './uprights';
import { DEG, dist, mid, SIDES, v, type HandlebarBinding, type MechanismBuilder } from './mechanismBuilder';

/** Height of the symbolic handlebar above the upper outer joints, mm (as steeringMechanism.ts). */
const HANDLEBAR_RISE_MM = 150;

export const otherSide = (side: Side): Side => (side === 'right' ? 'left' : 'right');

/** Adds the track rod and its drive; returns where the symbolic handlebar sits in the frame. */
export function addTrackRodSteering(b: MechanismBuilder, design: ResolvedDesign, drive: TrackRodDrive, frame: number, uprights: Uprights, mode: PoseMode): Vec3 {
  const handlebar: HandlebarBinding = (gain) =>
    mode.steerBy !== 'handlebar' ? { reportsInput: { input: 'handlebarDeg', gain } } : { driver: { input: 'handlebarDeg', gain } };
  addTrackRod(b, design, uprights);
  const fe = design.frontEnd;
  const topZ = Math.max(fe.upper.outerJoint.right.z, fe.upper.outerJoint.left.z);
  if (drive.kind === 'knuckle') {
    // The upright's own joint (yoke to upright, about the kingpin from lower to upper joint).
    const u = uprights.body[drive.upright];
    const joint = b.joints[u];
    if (joint.kind !== 'revolute') throw new Error(`a handlebar on the ${drive.upright} upright needs a kingpin upright (found a ${joint.kind} joint)`);
    b.joints[u] = { ...joint, ...handlebar(DEG) };
    const upper = fe.upper.outerJoint[drive.upright];
    return [upper.x, 0, topZ + HANDLEBAR_RISE_MM];
  }
  addDragLink(b, design, drive, frame, uprights, handlebar);
  return [drive.columnPivot.x, 0, Math.max(drive.columnPivot.z, topZ) + HANDLEBAR_RISE_MM];
}

function addTrackRod(b: MechanismBuilder, design: ResolvedDesign, uprights: Uprights): void {
  const arm = design.upright.steeringArmJoint;
  const rod = b.addConstraint({
    kind: 'distance',
    id: 'trackRod',
    label: 'track rod (right steering arm to left steering arm)',
    bodyA: uprights.body.right,
    pointA: v(arm.right),
    bodyB: uprights.body.left,
    pointB: v(arm.left),
    length: dist(arm.right, arm.left),
  });
  b.links.push({ id: rod, label: 'track rod', bodyA: uprights.body.right, pointA: v(arm.right), bodyB: uprights.body.left, pointB: v(arm.left) });
  const tube = b.tube('trackRod', {
    label: 'track rod',
    part: 'tieRod',
    a: uprights.steeringArmJoint.right,
    b: uprights.steeringArmJoint.left,
    radius: design.parts.tieRodRadiusMm,
  });
  b.shows({ kind: 'constraint', constraint: rod }, tube);
  for (const side of SIDES) {
    // Each side's far end is the other side's steering-arm joint (drawn by uprights.ts).
    b.shows({ kind: 'joint', joint: 'tieRodInner', side }, `joint.upright.steeringArmJoint.${otherSide(side)}`);
    b.shows({ kind: 'clearance', part: 'tieRod', side }, tube);
    b.shows({ kind: 'transmission', link: 'linkage', side }, tube);
  }
}

function addDragLink(
  b: MechanismBuilder,
  design: ResolvedDesign,
  drive: Extract<TrackRodDrive, { kind: 'dragLink' }>,
  frame: number,
  uprights: Uprights,
  handlebar: HandlebarBinding,
): void {
  const u = uprights.body[drive.upright];
  const column = b.addBody('column', 'steering column', { kind: 'revolute', parent: frame, origin: v(drive.columnPivot), axis: v(drive.columnAxis), ...handlebar(DEG) });
  const link = b.addConstraint({
    kind: 'distance',
    id: 'dragLink',
    label: `drag link (column arm to ${drive.upright} upright)`,
    bodyA: column,
    pointA: v(drive.columnArmJoint),
    bodyB: u,
    pointB: v(drive.uprightArmJoint),
    length: dist(drive.columnArmJoint, drive.uprightArmJoint),
  });
  b.links.push({ id: link, label: 'drag link', bodyA: column, pointA: v(drive.columnArmJoint), bodyB: u, pointB: v(drive.uprightArmJoint) });
  const pivot = b.addPoint('steering.drive.columnPivot', 'steering column pivot', column, drive.columnPivot);
  const columnArm = b.addPoint('steering.drive.columnArmJoint', 'column arm joint', column, drive.columnArmJoint);
  const uprightArm = b.addPoint('steering.drive.uprightArmJoint', `${drive.upright} upright drag-link arm joint`, u, drive.uprightArmJoint);

  const fe = design.frontEnd;
  const kingpinMid: Vec3Mm = (([x, y, z]) => ({ x, y, z }))(mid(fe.upper.outerJoint[drive.upright], fe.lower.outerJoint[drive.upright]));
  b.tube('column', { label: 'steering column arm', part: 'steering', a: pivot, b: columnArm, radius: 9 });
  const linkTube = b.tube('dragLink', { label: 'drag link', part: 'tieRod', a: columnArm, b: uprightArm, radius: design.parts.tieRodRadiusMm });
  b.tube('dragLinkArm', { label: `${drive.upright} drag-link arm`, part: 'upright', a: b.onBody(u, kingpinMid), b: uprightArm, radius: design.parts.steeringArmRadiusMm });
  b.jointAt(pivot, 'steering column pivot', 13);
  b.jointAt(columnArm, 'column arm joint', 12);
  b.jointAt(uprightArm, `drag-link arm joint, ${drive.upright}`, 12);
  b.shows({ kind: 'constraint', constraint: link }, linkTube);
  const ax = drive.columnAxis;
  const k = 90 / (Math.hypot(ax.x, ax.y, ax.z) || 1);
  const p = drive.columnPivot;
  b.axisLine(
    'steering.axis',
    'steering column axis',
    b.onBody(column, [p.x - ax.x * k, p.y - ax.y * k, p.z - ax.z * k]),
    b.onBody(column, [p.x + ax.x * k, p.y + ax.y * k, p.z + ax.z * k]),
    false,
  );
}
