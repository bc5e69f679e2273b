/**
 * Layout templates: turn a resolved design into a mechanism graph for one pose mode.
 *
 * Tree: ground -> heave slide (z) -> frame (roll about the x axis through the origin, the
 * lean) -> wishbones or centre members (revolute) -> uprights (spherical at the lower outer
 * joint); the steering body (crank, rack or column) hangs on the frame. Loops are closed by
 * coincident upper joints, tie-rod lengths, a drag link where there is one, and either
 * ground contact or a travel driver per wheel.
 */

import type { MechanismGraph, TreeJoint, Constraint, NamedPoint, WheelRef, LinkRef, Vec3, InputBinding } from '../MechanismGraph';
import type { ResolvedDesign, Side, Vec3Mm } from '../../design/types';
import { wheelSpinAxisAtDesign } from '../wheelAxis';

export interface PoseMode {
  /** 'ground': each wheel touches the ground; 'travel': wheel-centre travel is an input. */
  contact: 'ground' | 'travel';
  /** Steer by handlebar angle, or by a target road-wheel angle of one wheel. */
  steerBy: 'handlebar' | 'leftWheel' | 'rightWheel';
}

export const DEFAULT_MODE: PoseMode = { contact: 'ground', steerBy: 'handlebar' };

const DEG = Math.PI / 180;
const SIDE_WORD: Record<Side, string> = { right: 'right', left: 'left' };

const v = (p: Vec3Mm): Vec3 => [p.x, p.y, p.z];
const sub = (a: Vec3Mm, b: Vec3Mm): Vec3 => [a.x - b.x, a.y - b.y, a.z - b.z];
const dist = (a: Vec3Mm, b: Vec3Mm) => Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);

/** Index of a named body in a graph, for analysis and drawing. */
export function bodyIndex(graph: MechanismGraph, id: string): number {
  const i = graph.bodies.findIndex((b) => b.id === id);
  if (i < 0) throw new Error(`mechanism "${graph.name}" has no body "${id}"`);
  return i;
}

export function buildMechanism(design: ResolvedDesign, mode: PoseMode = DEFAULT_MODE): MechanismGraph {
  const bodies: MechanismGraph['bodies'] = [];
  const joints: TreeJoint[] = [];
  const constraints: Constraint[] = [];
  const points: NamedPoint[] = [];
  const wheels: WheelRef[] = [];
  const links: LinkRef[] = [];
  const addBody = (id: string, label: string, joint: Omit<TreeJoint, 'child' | 'id' | 'label'>) => {
    const index = bodies.length;
    bodies.push({ id, label });
    joints.push({ ...joint, id: `${id}.joint`, label: `${label} joint`, child: index });
    return index;
  };
  const point = (id: string, label: string, body: number, p: Vec3Mm) => points.push({ id, label, body, design: v(p) });

  const fe = design.frontEnd;
  const centre = fe.kind === 'centrePivot';
  const heaveFree = centre && mode.contact === 'ground';
  const heave = addBody('heave', 'heave slide', {
    kind: 'prismatic',
    parent: -1,
    origin: [0, 0, 0],
    axis: [0, 0, 1],
    ...(heaveFree ? {} : { driver: { input: 'heaveMm', gain: 1 } }),
  });
  const frame = addBody('frame', 'frame', {
    kind: 'revolute',
    parent: heave,
    origin: [0, 0, 0],
    axis: [1, 0, 0],
    driver: { input: 'leanDeg', gain: DEG },
  });

  // Suspension: per side, the body carrying the upper joint and the body carrying the upright.
  const upperCarrier: Record<Side, number> = { right: -1, left: -1 };
  const lowerCarrier: Record<Side, number> = { right: -1, left: -1 };
  if (fe.kind === 'splitWishbones') {
    for (const side of ['right', 'left'] as Side[]) {
      for (const level of ['upper', 'lower'] as const) {
        const w = fe[level];
        const label = `${SIDE_WORD[side]} ${level} wishbone`;
        const b = addBody(`${side}.${level}Wishbone`, label, {
          kind: 'revolute',
          parent: frame,
          origin: v(w.frontPivot[side]),
          axis: sub(w.frontPivot[side], w.rearPivot[side]),
        });
        point(`frontEnd.${level}.frontPivot.${side}`, `${label} front pivot`, b, w.frontPivot[side]);
        point(`frontEnd.${level}.rearPivot.${side}`, `${label} rear pivot`, b, w.rearPivot[side]);
        if (level === 'upper') upperCarrier[side] = b;
        else lowerCarrier[side] = b;
      }
    }
  } else {
    for (const level of ['upper', 'lower'] as const) {
      const mbr = fe[level];
      const b = addBody(`${level}Member`, `${level} centre member`, {
        kind: 'revolute',
        parent: frame,
        origin: v(mbr.pivot),
        axis: v(mbr.pivotAxis),
      });
      point(`frontEnd.${level}.pivot`, `${level} member centre pivot`, b, mbr.pivot);
      for (const side of ['right', 'left'] as Side[]) {
        if (level === 'upper') upperCarrier[side] = b;
        else lowerCarrier[side] = b;
      }
    }
  }

  // Uprights hang on their lower outer joint; the upper joint closes the loop.
  const upright: Record<Side, number> = { right: -1, left: -1 };
  for (const side of ['right', 'left'] as Side[]) {
    const lowerJ = fe.lower.outerJoint[side];
    const upperJ = fe.upper.outerJoint[side];
    const u = addBody(`${side}.upright`, `${SIDE_WORD[side]} upright`, {
      kind: 'spherical',
      parent: lowerCarrier[side],
      origin: v(lowerJ),
      axis: [0, 0, 1],
    });
    upright[side] = u;
    constraints.push({
      kind: 'coincident',
      id: `${side}.upperOuterJoint`,
      label: `${SIDE_WORD[side]} upper outer joint (${centre ? 'upper member' : 'upper wishbone'} to upright)`,
      bodyA: u,
      pointA: v(upperJ),
      bodyB: upperCarrier[side],
      pointB: v(upperJ),
    });
    point(`frontEnd.upper.outerJoint.${side}`, `${side} upper outer joint`, u, upperJ);
    point(`frontEnd.lower.outerJoint.${side}`, `${side} lower outer joint`, u, lowerJ);
    point(`upright.steeringArmJoint.${side}`, `${side} steering arm joint`, u, design.upright.steeringArmJoint[side]);
    point(`upright.wheelCentre.${side}`, `${side} wheel centre`, u, design.upright.wheelCentre[side]);
  }

  // Steering mechanism.
  const st = design.steering;
  const steerByWheel = mode.steerBy !== 'handlebar';
  const handlebar = (gain: number): Pick<TreeJoint, 'driver' | 'reportsInput'> =>
    steerByWheel ? { reportsInput: { input: 'handlebarDeg', gain } } : { driver: { input: 'handlebarDeg', gain } };
  let steerBody: number;
  let steerLabel: string;
  if (st.kind === 'bellCrank') {
    steerLabel = 'bell crank';
    if (st.input.kind === 'ratio') {
      steerBody = addBody('bellCrank', 'bell crank', {
        kind: 'revolute',
        parent: frame,
        origin: v(st.pivot),
        axis: v(st.axis),
        ...handlebar(st.input.crankDegPerHandlebarDeg * DEG),
      });
    } else {
      const inp = st.input;
      const column = addBody('column', 'steering column', {
        kind: 'revolute',
        parent: frame,
        origin: v(inp.columnPivot),
        axis: v(inp.columnAxis),
        ...handlebar(DEG),
      });
      steerBody = addBody('bellCrank', 'bell crank', { kind: 'revolute', parent: frame, origin: v(st.pivot), axis: v(st.axis) });
      constraints.push({
        kind: 'distance',
        id: 'dragLink',
        label: 'drag link (column arm to crank arm)',
        bodyA: column,
        pointA: v(inp.columnArmJoint),
        bodyB: steerBody,
        pointB: v(inp.crankArmJoint),
        length: dist(inp.columnArmJoint, inp.crankArmJoint),
      });
      links.push({ id: 'dragLink', label: 'drag link', bodyA: column, pointA: v(inp.columnArmJoint), bodyB: steerBody, pointB: v(inp.crankArmJoint) });
      point('steering.input.columnPivot', 'steering column pivot', column, inp.columnPivot);
      point('steering.input.columnArmJoint', 'column arm joint', column, inp.columnArmJoint);
      point('steering.input.crankArmJoint', 'crank input arm joint', steerBody, inp.crankArmJoint);
    }
    point('steering.pivot', 'bell crank pivot', steerBody, st.pivot);
  } else if (st.kind === 'rack') {
    steerLabel = 'rack';
    steerBody = addBody('rack', 'rack', {
      kind: 'prismatic',
      parent: frame,
      origin: [0, 0, 0],
      axis: v(st.axis),
      ...handlebar(st.mmPerHandlebarDeg),
    });
  } else {
    steerLabel = 'steering lever';
    steerBody = addBody('column', 'steering column', {
      kind: 'revolute',
      parent: frame,
      origin: v(st.pivot),
      axis: v(st.axis),
      ...handlebar(DEG),
    });
    point('steering.pivot', 'steering column pivot', steerBody, st.pivot);
  }

  for (const side of ['right', 'left'] as Side[]) {
    const arm = design.upright.steeringArmJoint[side];
    const inner = st.tieRodJoint[side];
    constraints.push({
      kind: 'distance',
      id: `${side}.tieRod`,
      label: `${SIDE_WORD[side]} tie rod (steering arm to ${steerLabel})`,
      bodyA: upright[side],
      pointA: v(arm),
      bodyB: steerBody,
      pointB: v(inner),
      length: dist(arm, inner),
    });
    links.push({ id: `${side}.tieRod`, label: `${side} tie rod`, bodyA: upright[side], pointA: v(arm), bodyB: steerBody, pointB: v(inner) });
    point(`steering.tieRodJoint.${side}`, `${side} tie rod inner joint`, steerBody, inner);
  }

  // Wheels, and what fixes each wheel's travel.
  const tyre = design.wheels.front;
  for (const side of ['right', 'left'] as Side[]) {
    const centreP = design.upright.wheelCentre[side];
    const spin = wheelSpinAxisAtDesign(side, design.upright.staticToeDeg[side], design.upright.staticCamberDeg[side]);
    wheels.push({
      side,
      body: upright[side],
      centre: v(centreP),
      spinAxis: spin,
      rollingRadius: tyre.rollingRadiusMm,
      crownRadius: tyre.crownRadiusMm,
      tyreWidth: tyre.tyreWidthMm,
    });
    if (mode.contact === 'ground') {
      constraints.push({
        kind: 'groundContact',
        id: `${side}.groundContact`,
        label: `${SIDE_WORD[side]} tyre on the ground`,
        body: upright[side],
        wheelCentre: v(centreP),
        spinAxis: spin,
        rollingRadius: tyre.rollingRadiusMm,
        crownRadius: tyre.crownRadiusMm,
      });
    } else if (!(centre && side === 'left')) {
      // A centre-pivot parallelogram couples the sides: the right wheel's travel sets both.
      const target: InputBinding = { input: side === 'right' ? 'travelRightMm' : 'travelLeftMm', gain: 1 };
      constraints.push({
        kind: 'pointHeight',
        id: `${side}.travel`,
        label: `${SIDE_WORD[side]} wheel travel`,
        body: upright[side],
        point: v(centreP),
        refBody: frame,
        target,
      });
    }
  }
  if (steerByWheel) {
    const side: Side = mode.steerBy === 'leftWheel' ? 'left' : 'right';
    constraints.push({
      kind: 'wheelHeading',
      id: `${side}.wheelAngle`,
      label: `${SIDE_WORD[side]} road-wheel angle target`,
      body: upright[side],
      spinAxis: wheels.find((w) => w.side === side)!.spinAxis,
      target: { input: 'wheelAngleDeg', gain: DEG },
    });
  }

  return { name: design.name, bodies, joints, constraints, points, wheels, links, frameBody: frame };
}
