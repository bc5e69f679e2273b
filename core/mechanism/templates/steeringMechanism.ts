/**
 * The steering: a bell crank (turned at a fixed ratio, or by a drag link from a column), a
 * rack, or a lever on the column, hung on the frame; and a tie rod per side from it to the
 * upright's steering arm. The handlebar either drives the steering body's joint or, when a
 * road-wheel angle is the input, is solved and reported.
 */

import type { ResolvedDesign, Side, Vec3Mm } from '../../design/types';
import type { Vec3 } from '../MechanismGraph';
import type { DrawingPointRef } from '../drawingLayout';
import type { PoseMode } from './buildMechanism';
import type { Uprights } from './uprights';
import { DEG, dist, SIDES, v, type HandlebarBinding, type MechanismBuilder } from './mechanismBuilder';
import { addTrackRodSteering } from './trackRodSteering';

/** The steering kinds with tie rods from a steering body (the track rod is trackRodSteering.ts). */
type Steering = Exclude<ResolvedDesign['steering'], { kind: 'trackRod' }>;
type BellCrank = Extract<Steering, { kind: 'bellCrank' }>;

/** Height of the symbolic handlebar above the highest of the steering and the upper joints, mm. */
const HANDLEBAR_RISE_MM = 150;
/** A rack has no pivot to sit over: the handlebar sits this far behind its right end, mm. */
const HANDLEBAR_BEHIND_RACK_MM = 150;

/** The steering body the tie rods pull on, and what it drew. */
interface SteeringBody {
  body: number;
  /** Named in tie-rod messages: "tie rod (steering arm to bell crank)". */
  word: string;
  /** The pivot point drawn in the frame's middle (crank or lever), if any. */
  pivot: DrawingPointRef | null;
  /** What the symbolic handlebar sits over (frame design coordinates; z null: only the upper joints). */
  handlebarX: number;
  handlebarZ: number | null;
}

/** Adds the steering and the tie rods; returns where the symbolic handlebar sits in the frame. */
export function addSteering(b: MechanismBuilder, design: ResolvedDesign, frame: number, uprights: Uprights, mode: PoseMode): Vec3 {
  const st = design.steering;
  if (st.kind === 'trackRod') return addTrackRodSteering(b, design, st.drive, frame, uprights, mode);
  const handlebar: HandlebarBinding = (gain) =>
    mode.steerBy !== 'handlebar' ? { reportsInput: { input: 'handlebarDeg', gain } } : { driver: { input: 'handlebarDeg', gain } };
  const steer =
    st.kind === 'bellCrank'
      ? st.input.kind === 'knuckle'
        ? addIdlerCrank(b, st, st.input.upright, frame, uprights, handlebar)
        : addBellCrank(b, design, st, frame, handlebar)
      : st.kind === 'rack'
        ? addRack(b, st, frame, handlebar)
        : addLever(b, st, frame, handlebar);
  addTieRods(b, design, steer, uprights);
  if (steer.pivot) drawPivotAxis(b, st as Exclude<Steering, { kind: 'rack' }>, steer);
  const fe = design.frontEnd;
  const topZ = Math.max(fe.upper.outerJoint.right.z, fe.upper.outerJoint.left.z);
  return [steer.handlebarX, 0, Math.max(steer.handlebarZ ?? topZ, topZ) + HANDLEBAR_RISE_MM];
}

function addBellCrank(b: MechanismBuilder, design: ResolvedDesign, st: BellCrank, frame: number, handlebar: HandlebarBinding): SteeringBody {
  let body: number;
  let handlebarAt: Vec3Mm = st.pivot;
  if (st.input.kind === 'ratio') {
    body = b.addBody('bellCrank', 'bell crank', {
      kind: 'revolute',
      parent: frame,
      origin: v(st.pivot),
      axis: v(st.axis),
      ...handlebar(st.input.crankDegPerHandlebarDeg * DEG),
    });
  } else {
    // The knuckle input is built by addIdlerCrank, never here.
    const inp = st.input as Extract<BellCrank['input'], { kind: 'dragLink' }>;
    const column = addColumn(b, frame, inp.columnPivot, inp.columnAxis, handlebar);
    body = b.addBody('bellCrank', 'bell crank', { kind: 'revolute', parent: frame, origin: v(st.pivot), axis: v(st.axis) });
    const dragLink = b.addConstraint({
      kind: 'distance',
      id: 'dragLink',
      label: 'drag link (column arm to crank arm)',
      bodyA: column,
      pointA: v(inp.columnArmJoint),
      bodyB: body,
      pointB: v(inp.crankArmJoint),
      length: dist(inp.columnArmJoint, inp.crankArmJoint),
    });
    b.links.push({ id: dragLink, label: 'drag link', bodyA: column, pointA: v(inp.columnArmJoint), bodyB: body, pointB: v(inp.crankArmJoint) });
    const columnPivot = b.addPoint('steering.input.columnPivot', 'steering column pivot', column, inp.columnPivot);
    const columnArm = b.addPoint('steering.input.columnArmJoint', 'column arm joint', column, inp.columnArmJoint);
    const crankArm = b.addPoint('steering.input.crankArmJoint', 'crank input arm joint', body, inp.crankArmJoint);
    handlebarAt = inp.columnPivot;

    b.tube('column', { label: 'steering column arm', part: 'steering', a: columnPivot, b: columnArm, radius: 9 });
    const link = b.tube('dragLink', { label: 'drag link', part: 'tieRod', a: columnArm, b: crankArm, radius: design.parts.tieRodRadiusMm });
    b.jointAt(columnPivot, 'steering column pivot', 13);
    b.jointAt(columnArm, 'column arm joint', 12);
    b.jointAt(crankArm, 'crank input arm joint', 12);
    b.shows({ kind: 'constraint', constraint: dragLink }, link);
    // The crank's input arm is drawn once its pivot point exists (below).
    const pivot = b.addPoint('steering.pivot', 'bell crank pivot', body, st.pivot);
    b.tube('crankInput', { label: 'crank input arm', part: 'steering', a: pivot, b: crankArm, radius: 9 });
    return { body, word: 'bell crank', pivot, handlebarX: handlebarAt.x, handlebarZ: handlebarAt.z };
  }
  const pivot = b.addPoint('steering.pivot', 'bell crank pivot', body, st.pivot);
  return { body, word: 'bell crank', pivot, handlebarX: handlebarAt.x, handlebarZ: handlebarAt.z };
}

/**
 * Knuckle-mounted steering with tie rods: the handlebar drives the chosen upright's own joint
 * (yoke to upright, about its kingpin, kingpinYoke.ts; validation refuses ball-joint uprights),
 * and the crank is an idler on the frame that the tie rods turn.
 */
function addIdlerCrank(b: MechanismBuilder, st: BellCrank, side: Side, frame: number, uprights: Uprights, handlebar: HandlebarBinding): SteeringBody {
  const u = uprights.body[side];
  const joint = b.joints[u];
  if (joint.kind !== 'revolute') throw new Error(`a handlebar on the ${side} upright needs a kingpin upright (found a ${joint.kind} joint)`);
  b.joints[u] = { ...joint, ...handlebar(DEG) };
  const body = b.addBody('bellCrank', 'bell crank', { kind: 'revolute', parent: frame, origin: v(st.pivot), axis: v(st.axis) });
  const pivot = b.addPoint('steering.pivot', 'bell crank pivot', body, st.pivot);
  return { body, word: 'bell crank', pivot, handlebarX: joint.origin[0], handlebarZ: null };
}

function addRack(b: MechanismBuilder, st: Extract<Steering, { kind: 'rack' }>, frame: number, handlebar: HandlebarBinding): SteeringBody {
  const body = b.addBody('rack', 'rack', {
    kind: 'prismatic',
    parent: frame,
    origin: [0, 0, 0],
    axis: v(st.axis),
    ...handlebar(st.mmPerHandlebarDeg),
  });
  return { body, word: 'rack', pivot: null, handlebarX: st.tieRodJoint.right.x - HANDLEBAR_BEHIND_RACK_MM, handlebarZ: null };
}

function addLever(b: MechanismBuilder, st: Extract<Steering, { kind: 'direct' }>, frame: number, handlebar: HandlebarBinding): SteeringBody {
  const body = addColumn(b, frame, st.pivot, st.axis, handlebar);
  const pivot = b.addPoint('steering.pivot', 'steering column pivot', body, st.pivot);
  return { body, word: 'steering lever', pivot, handlebarX: st.pivot.x, handlebarZ: st.pivot.z };
}

/** The steering column: turned by the handlebar, one degree per degree. */
function addColumn(b: MechanismBuilder, frame: number, pivot: Vec3Mm, axis: Vec3Mm, handlebar: HandlebarBinding): number {
  return b.addBody('column', 'steering column', { kind: 'revolute', parent: frame, origin: v(pivot), axis: v(axis), ...handlebar(DEG) });
}

function addTieRods(b: MechanismBuilder, design: ResolvedDesign, steer: SteeringBody, uprights: Uprights): void {
  const st = design.steering as Steering;
  const inner = new Map<string, DrawingPointRef>();
  for (const side of SIDES) {
    const arm = design.upright.steeringArmJoint[side];
    const joint = st.tieRodJoint[side];
    const rod = b.addConstraint({
      kind: 'distance',
      id: `${side}.tieRod`,
      label: `${side} tie rod (steering arm to ${steer.word})`,
      bodyA: uprights.body[side],
      pointA: v(arm),
      bodyB: steer.body,
      pointB: v(joint),
      length: dist(arm, joint),
    });
    b.links.push({ id: rod, label: `${side} tie rod`, bodyA: uprights.body[side], pointA: v(arm), bodyB: steer.body, pointB: v(joint) });
    const innerRef = b.addPoint(`steering.tieRodJoint.${side}`, `${side} tie rod inner joint`, steer.body, joint);
    inner.set(side, innerRef);

    const tube = b.tube(`${side}.tieRod`, {
      label: `${side} tie rod`,
      part: 'tieRod',
      a: innerRef,
      b: uprights.steeringArmJoint[side],
      radius: design.parts.tieRodRadiusMm,
    });
    const innerJoint = b.jointAt(innerRef, `tie rod inner joint, ${side}`, 12);
    b.shows({ kind: 'constraint', constraint: rod }, tube);
    b.shows({ kind: 'joint', joint: 'tieRodInner', side }, innerJoint);
    b.shows({ kind: 'clearance', part: 'tieRod', side }, tube);
    if (steer.pivot) {
      const crank = b.tube(`crank.${side}`, { label: `${steer.word}, ${side} arm`, part: 'steering', a: steer.pivot, b: innerRef, radius: 9 });
      b.shows({ kind: 'clearance', part: 'crankArm', side }, crank);
      b.shows({ kind: 'transmission', link: 'linkage', side }, crank);
    }
  }
  if (!steer.pivot) {
    const rack = b.tube('rack', { label: 'rack', part: 'steering', a: inner.get('right')!, b: inner.get('left')!, radius: 11 });
    for (const side of SIDES) b.shows({ kind: 'clearance', part: 'rack', side }, rack);
  }
}

/** The crank's or lever's pivot joint and its axis, a short line either side of the pivot. */
function drawPivotAxis(b: MechanismBuilder, st: Exclude<Steering, { kind: 'rack' }>, steer: SteeringBody): void {
  b.jointAt(steer.pivot!, `${steer.word} pivot`, 13);
  const ax = st.axis;
  const k = 90 / (Math.hypot(ax.x, ax.y, ax.z) || 1);
  const p = st.pivot;
  b.axisLine(
    'steering.axis',
    `${steer.word} axis`,
    b.onBody(steer.body, [p.x - ax.x * k, p.y - ax.y * k, p.z - ax.z * k]),
    b.onBody(steer.body, [p.x + ax.x * k, p.y + ax.y * k, p.z + ax.z * k]),
    false,
  );
}
