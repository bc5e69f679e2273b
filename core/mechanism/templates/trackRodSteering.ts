/**
 * A one-piece track rod (`steering.kind: "trackRod"`): one rod with a ball joint at each end
 * joins the two steering arms (`upright.steeringArmJoint`), the Ackermann trapezoid. It is a
 * link of fixed length between the two uprights (one row); it has no body, so its spin about
 * its own line, which no joint stops, is no unknown of the solve.
 *
 * The handlebar turns the uprights either
 * - through a drag link (`drive.kind: "dragLink"`): a steering column hung on the frame (driven
 *   one degree per handlebar degree) whose arm pulls a second arm on one upright;
 * - directly (`drive.kind: "knuckle"`): the handlebar is fixed to one upright, so the handlebar
 *   angle is that upright's rotation about its kingpin (the revolute joint between yoke and
 *   upright, kingpinYoke.ts; validation refuses ball-joint uprights here); or
 * - through a centre lever (`drive.kind: "centreLever"`): a lever on the steering column pulls a
 *   joint on the rod through a short link. The rod is then a body: hung on the right upright by
 *   a universal joint at the right steering-arm joint (two revolutes across the rod's line, so
 *   the rod has no spin of its own to leave free) and closed on the left steering-arm joint (3
 *   rows). Two unknowns and two rows more than the distance row, the same motion; the short
 *   link's joint lies on the rod's line (validation), where the spin a real rod has would not
 *   move it.
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
  const rod = addTrackRod(b, design, uprights, drive.kind === 'centreLever');
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
  if (drive.kind === 'centreLever') {
    addCentreLever(b, design, drive, frame, rod, handlebar);
    return [drive.pivot.x, 0, Math.max(drive.pivot.z, topZ) + HANDLEBAR_RISE_MM];
  }
  addDragLink(b, design, drive, frame, uprights, handlebar);
  return [drive.columnPivot.x, 0, Math.max(drive.columnPivot.z, topZ) + HANDLEBAR_RISE_MM];
}

const unit3 = (p: Vec3): Vec3 => {
  const n = Math.hypot(p[0], p[1], p[2]) || 1;
  return [p[0] / n, p[1] / n, p[2] / n];
};
const cross3 = (a: Vec3, c: Vec3): Vec3 => [a[1] * c[2] - a[2] * c[1], a[2] * c[0] - a[0] * c[2], a[0] * c[1] - a[1] * c[0]];

/** The rod as a body on a universal joint at the right steering-arm joint; returns the rod's body. */
function addRodBody(b: MechanismBuilder, design: ResolvedDesign, uprights: Uprights): number {
  const arm = design.upright.steeringArmJoint;
  const d = unit3([arm.left.x - arm.right.x, arm.left.y - arm.right.y, arm.left.z - arm.right.z]);
  // First cross pin across the rod (horizontal where the rod is not vertical), the second across both.
  const first = Math.hypot(...cross3(d, [0, 0, 1])) > 1e-6 ? unit3(cross3(d, [0, 0, 1])) : unit3(cross3(d, [1, 0, 0]));
  const second = unit3(cross3(d, first));
  const cross = b.addBody('trackRodCross', 'track rod cross', { kind: 'revolute', parent: uprights.body.right, origin: v(arm.right), axis: first });
  return b.addBody('trackRod', 'track rod', { kind: 'revolute', parent: cross, origin: v(arm.right), axis: second });
}

/** The track rod: a distance row between the uprights, or (asBody) a rod body closed on the left arm; returns the body or -1. */
function addTrackRod(b: MechanismBuilder, design: ResolvedDesign, uprights: Uprights, asBody: boolean): number {
  const arm = design.upright.steeringArmJoint;
  const body = asBody ? addRodBody(b, design, uprights) : -1;
  const label = 'track rod (right steering arm to left steering arm)';
  const rod = asBody
    ? b.addConstraint({ kind: 'coincident', id: 'trackRod', label, bodyA: body, pointA: v(arm.left), bodyB: uprights.body.left, pointB: v(arm.left) })
    : b.addConstraint({
        kind: 'distance',
        id: 'trackRod',
        label,
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
  return body;
}

function addCentreLever(
  b: MechanismBuilder,
  design: ResolvedDesign,
  drive: Extract<TrackRodDrive, { kind: 'centreLever' }>,
  frame: number,
  rod: number,
  handlebar: HandlebarBinding,
): void {
  const lever = b.addBody('lever', 'centre lever', { kind: 'revolute', parent: frame, origin: v(drive.pivot), axis: v(drive.axis), ...handlebar(DEG) });
  const link = b.addConstraint({
    kind: 'distance',
    id: 'shortLink',
    label: 'short link (centre lever to track rod)',
    bodyA: lever,
    pointA: v(drive.leverJoint),
    bodyB: rod,
    pointB: v(drive.trackRodJoint),
    length: dist(drive.leverJoint, drive.trackRodJoint),
  });
  b.links.push({ id: link, label: 'short link', bodyA: lever, pointA: v(drive.leverJoint), bodyB: rod, pointB: v(drive.trackRodJoint) });
  const pivot = b.addPoint('steering.drive.pivot', 'centre lever pivot', lever, drive.pivot);
  const leverJoint = b.addPoint('steering.drive.leverJoint', 'centre lever joint', lever, drive.leverJoint);
  const onRod = b.addPoint('steering.drive.trackRodJoint', 'track rod joint of the short link', rod, drive.trackRodJoint);
  b.tube('lever', { label: 'centre lever', part: 'steering', a: pivot, b: leverJoint, radius: 9 });
  const linkTube = b.tube('shortLink', { label: 'short link', part: 'tieRod', a: leverJoint, b: onRod, radius: design.parts.tieRodRadiusMm });
  b.jointAt(pivot, 'centre lever pivot', 13);
  b.jointAt(leverJoint, 'centre lever joint', 12);
  b.jointAt(onRod, 'short link joint on the track rod', 12);
  b.shows({ kind: 'constraint', constraint: link }, linkTube);
  drawAxis(b, lever, drive.pivot, drive.axis, 'centre lever axis');
}

/** A short line either side of a pivot along its axis. */
function drawAxis(b: MechanismBuilder, body: number, p: Vec3Mm, ax: Vec3Mm, label: string): void {
  const k = 90 / (Math.hypot(ax.x, ax.y, ax.z) || 1);
  b.axisLine('steering.axis', label, b.onBody(body, [p.x - ax.x * k, p.y - ax.y * k, p.z - ax.z * k]), b.onBody(body, [p.x + ax.x * k, p.y + ax.y * k, p.z + ax.z * k]), false);
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
  const uprightArm = b.addPoint('steering.drive.uprightArmJoint', `${drive.upright} upright drag link arm joint`, u, drive.uprightArmJoint);

  const fe = design.frontEnd;
  const kingpinMid: Vec3Mm = (([x, y, z]) => ({ x, y, z }))(mid(fe.upper.outerJoint[drive.upright], fe.lower.outerJoint[drive.upright]));
  b.tube('column', { label: 'steering column arm', part: 'steering', a: pivot, b: columnArm, radius: 9 });
  const linkTube = b.tube('dragLink', { label: 'drag link', part: 'tieRod', a: columnArm, b: uprightArm, radius: design.parts.tieRodRadiusMm });
  b.tube('dragLinkArm', { label: `${drive.upright} drag link arm`, part: 'upright', a: b.onBody(u, kingpinMid), b: uprightArm, radius: design.parts.steeringArmRadiusMm });
  b.jointAt(pivot, 'steering column pivot', 13);
  b.jointAt(columnArm, 'column arm joint', 12);
  b.jointAt(uprightArm, `drag link arm joint, ${drive.upright}`, 12);
  b.shows({ kind: 'constraint', constraint: link }, linkTube);
  drawAxis(b, column, drive.columnPivot, drive.columnAxis, 'steering column axis');
}
