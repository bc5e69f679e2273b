/**
 * The posed world geometry the analysis measures: every joint, axis and part end of both
 * sides, read from a compiled mechanism after a solve. `GeometryReader` finds bodies and
 * design points once per mechanism; `read()` then costs a few dozen matrix-vector products.
 *
 * Bodies (the template's ids): frame, `${side}.upright`, `${side}.upperWishbone` /
 * `${side}.lowerWishbone` or `upperMember` / `lowerMember`, and the steering body that
 * carries the tie rods' inner joints (bell crank, rack or steering column); with a kingpin
 * upright also `${side}.yoke`, which carries the outer joints' studs (kingpinYoke.ts).
 *
 * A one-piece track rod (trackRodSteering.ts) is read as each side's tie rod, from this side's
 * steering arm to the other side's: the inner joint is the far end, on the other upright (its
 * stud along joints.tieRodInner's direction for that side). The steering body is then the
 * steering column of a drag link, the centre lever, or the upright the handlebar is fixed to;
 * the drag link's driven lever is that upright turning about its steering axis, and a centre
 * lever's short link is read as a drag link taken at the lever.
 */

import type { ResolvedDesign, Side, Vec3Mm } from '../design/types';
import type { MechanismGraph, Vec3 } from '../mechanism/MechanismGraph';
import { bodyIndex } from '../mechanism/templates/buildMechanism';
import type { CompiledMechanism } from '../solver/CompiledMechanism';
import { addScaled, dot, normalize, sub } from './vec3';

const v = (p: Vec3Mm): Vec3 => [p.x, p.y, p.z];

export interface SideGeometry {
  side: Side;
  upperJoint: Vec3;
  lowerJoint: Vec3;
  armJoint: Vec3;
  innerJoint: Vec3;
  wheelCentre: Vec3;
  /** Unit spin axis, pointing left. */
  spinAxis: Vec3;
  /** Wishbone (or member) pivot axes: a point and a unit direction each. */
  upperPivot: Vec3;
  upperPivotAxis: Vec3;
  lowerPivot: Vec3;
  lowerPivotAxis: Vec3;
  /** Inner end of each arm's capsule: midpoint of the inner pivots (split) or the centre pivot. */
  upperArmInner: Vec3;
  lowerArmInner: Vec3;
  /** Split wishbones: each wishbone's two inner pivots (the frame rail it mounts on). */
  upperRail: [Vec3, Vec3] | null;
  lowerRail: [Vec3, Vec3] | null;
  /** Foot of the steering-arm joint on the steering axis (the arm's capsule starts there). */
  armFoot: Vec3;
  /** Foot of the inner tie-rod joint on the crank or lever axis; null for a rack. */
  crankFoot: Vec3 | null;
  springFrame: Vec3 | null;
  springArm: Vec3 | null;
  /** World directions of each joint's stud (fixed in the stud body) and housing (fixed in the other body). */
  upperStud: Vec3;
  upperHousing: Vec3;
  lowerStud: Vec3;
  lowerHousing: Vec3;
  /** Tie-rod ends: stud directions now; the housings ride on the rod (see jointArticulation.ts). */
  tieOuterStud: Vec3;
  tieInnerStud: Vec3;
}

export interface PoseGeometry {
  /** Frame's axes in the world (columns of its rotation) and its origin. */
  frameX: Vec3;
  frameY: Vec3;
  frameUp: Vec3;
  frameOrigin: Vec3;
  /** Unit axis of the steering body (crank or lever axis, or the rack's slide direction). */
  steerAxis: Vec3;
  steerKind: 'revolute' | 'prismatic';
  /** Drag link: crank input arm joint, its foot on the crank axis, and the column arm joint. */
  dragLink: { crankArm: Vec3; crankFoot: Vec3; columnArm: Vec3 } | null;
  left: SideGeometry;
  right: SideGeometry;
}

interface SideRefs {
  upright: number;
  /** The body holding the outer joints' studs: the upright, or with a kingpin its yoke. */
  outerStudBody: number;
  upperCarrier: number;
  lowerCarrier: number;
  upperJoint: Vec3;
  lowerJoint: Vec3;
  armJoint: Vec3;
  /** The body carrying the inner joint: the steering body, or with a track rod the other upright. */
  innerBody: number;
  innerJoint: Vec3;
  wheelCentre: Vec3;
  spinAxis: Vec3;
  upperPivot: Vec3;
  upperPivotAxis: Vec3;
  lowerPivot: Vec3;
  lowerPivotAxis: Vec3;
  upperArmInner: Vec3;
  lowerArmInner: Vec3;
  upperRail: [Vec3, Vec3] | null;
  lowerRail: [Vec3, Vec3] | null;
  armFoot: Vec3;
  crankFoot: Vec3 | null;
  springFrame: Vec3 | null;
  springArm: Vec3 | null;
  springBody: number;
  studUpper: Vec3;
  studLower: Vec3;
  studTieOuter: Vec3;
  studTieInner: Vec3;
}

const X_AXIS: Vec3 = [1, 0, 0];
const Y_AXIS: Vec3 = [0, 1, 0];
const Z_AXIS: Vec3 = [0, 0, 1];
const ORIGIN: Vec3 = [0, 0, 0];

function lineFoot(p: Vec3, o: Vec3, axis: Vec3): Vec3 {
  const u = normalize(axis);
  return addScaled(o, u, dot(sub(p, o), u));
}

/** What a side's geometry is read from: bodies, design points and directions in their bodies. */
function sideRefs(design: ResolvedDesign, graph: MechanismGraph, side: Side, steerBody: number): SideRefs {
  const fe = design.frontEnd;
  const st = design.steering;
  const upright = bodyIndex(graph, `${side}.upright`);
  // A kingpin upright turns in its yoke; the outer joints hold the yoke, so they do not see the steering.
  const yoke = graph.bodies.findIndex((b) => b.id === `${side}.yoke`);
  const split = fe.kind === 'splitWishbones';
  const upperCarrier = bodyIndex(graph, split ? `${side}.upperWishbone` : 'upperMember');
  const lowerCarrier = bodyIndex(graph, split ? `${side}.lowerWishbone` : 'lowerMember');
  const U = v(fe.upper.outerJoint[side]);
  const L = v(fe.lower.outerJoint[side]);
  const A = v(design.upright.steeringArmJoint[side]);
  const far: Side = side === 'right' ? 'left' : 'right';
  const I = v(st.kind === 'trackRod' ? design.upright.steeringArmJoint[far] : st.tieRodJoint[side]);
  const innerBody = st.kind === 'trackRod' ? bodyIndex(graph, `${far}.upright`) : steerBody;
  let upperPivot: Vec3, upperPivotAxis: Vec3, lowerPivot: Vec3, lowerPivotAxis: Vec3;
  let upperArmInner: Vec3, lowerArmInner: Vec3;
  let upperRail: [Vec3, Vec3] | null = null;
  let lowerRail: [Vec3, Vec3] | null = null;
  if (fe.kind === 'splitWishbones') {
    const uf = v(fe.upper.frontPivot[side]), ur = v(fe.upper.rearPivot[side]);
    const lf = v(fe.lower.frontPivot[side]), lr = v(fe.lower.rearPivot[side]);
    upperPivot = uf;
    upperPivotAxis = normalize(sub(uf, ur));
    lowerPivot = lf;
    lowerPivotAxis = normalize(sub(lf, lr));
    upperArmInner = [(uf[0] + ur[0]) / 2, (uf[1] + ur[1]) / 2, (uf[2] + ur[2]) / 2];
    lowerArmInner = [(lf[0] + lr[0]) / 2, (lf[1] + lr[1]) / 2, (lf[2] + lr[2]) / 2];
    upperRail = [uf, ur];
    lowerRail = [lf, lr];
  } else {
    upperPivot = v(fe.upper.pivot);
    upperPivotAxis = normalize(v(fe.upper.pivotAxis));
    lowerPivot = v(fe.lower.pivot);
    lowerPivotAxis = normalize(v(fe.lower.pivotAxis));
    upperArmInner = upperPivot;
    lowerArmInner = lowerPivot;
  }
  const wheel = graph.wheels.find((w) => w.side === side);
  if (!wheel) throw new Error(`mechanism "${graph.name}" has no ${side} wheel`);
  const crankFoot = st.kind === 'rack' || st.kind === 'trackRod' ? null : lineFoot(I, v(st.pivot), v(st.axis));
  const spring = design.spring;
  const j = design.joints;
  return {
    upright,
    outerStudBody: yoke >= 0 ? yoke : upright,
    upperCarrier,
    lowerCarrier,
    upperJoint: U,
    lowerJoint: L,
    armJoint: A,
    innerBody,
    innerJoint: I,
    wheelCentre: wheel.centre,
    spinAxis: wheel.spinAxis,
    upperPivot,
    upperPivotAxis,
    lowerPivot,
    lowerPivotAxis,
    upperArmInner,
    lowerArmInner,
    upperRail,
    lowerRail,
    armFoot: lineFoot(A, L, sub(U, L)),
    crankFoot,
    springFrame: spring ? v(spring.frameMount[side]) : null,
    springArm: spring ? v(spring.armMount[side]) : null,
    springBody: spring ? (spring.on === 'upper' ? upperCarrier : lowerCarrier) : -1,
    studUpper: normalize(v(j.upperOuter.studAxis[side])),
    studLower: normalize(v(j.lowerOuter.studAxis[side])),
    studTieOuter: normalize(v(j.tieRodOuter.studAxis[side])),
    studTieInner: normalize(v(j.tieRodInner.studAxis[st.kind === 'trackRod' ? far : side])),
  };
}

/**
 * The body the handlebar turns that the analysis measures the linkage against: the body
 * carrying the right tie rod's inner joint; with a track rod, the drag link's steering column
 * or the upright the handlebar is fixed to.
 */
function steeringBody(design: ResolvedDesign, graph: MechanismGraph): number {
  const st = design.steering;
  if (st.kind === 'trackRod') {
    const drive = st.drive;
    return bodyIndex(graph, drive.kind === 'dragLink' ? 'column' : drive.kind === 'centreLever' ? 'lever' : `${drive.upright}.upright`);
  }
  const tie = graph.links.find((l) => l.id === 'right.tieRod');
  if (!tie) throw new Error(`mechanism "${graph.name}" has no right tie rod`);
  return tie.bodyB;
}

/** The reader's scratch, shaped once so each read only overwrites numbers. */
function emptyGeometry(sides: Record<Side, SideRefs>, steerKind: 'revolute' | 'prismatic', dragLink: boolean): PoseGeometry {
  const v3 = (): Vec3 => [0, 0, 0];
  const side = (sd: Side): SideGeometry => {
    const r = sides[sd];
    return {
      side: sd,
      upperJoint: v3(),
      lowerJoint: v3(),
      armJoint: v3(),
      innerJoint: v3(),
      wheelCentre: v3(),
      spinAxis: v3(),
      upperPivot: v3(),
      upperPivotAxis: v3(),
      lowerPivot: v3(),
      lowerPivotAxis: v3(),
      upperArmInner: v3(),
      lowerArmInner: v3(),
      upperRail: r.upperRail ? [v3(), v3()] : null,
      lowerRail: r.lowerRail ? [v3(), v3()] : null,
      armFoot: v3(),
      crankFoot: r.crankFoot ? v3() : null,
      springFrame: r.springFrame ? v3() : null,
      springArm: r.springArm ? v3() : null,
      upperStud: v3(),
      upperHousing: v3(),
      lowerStud: v3(),
      lowerHousing: v3(),
      tieOuterStud: v3(),
      tieInnerStud: v3(),
    };
  };
  return {
    frameX: v3(),
    frameY: v3(),
    frameUp: v3(),
    frameOrigin: v3(),
    steerAxis: v3(),
    steerKind,
    dragLink: dragLink ? { crankArm: v3(), crankFoot: v3(), columnArm: v3() } : null,
    left: side('left'),
    right: side('right'),
  };
}

export class GeometryReader {
  readonly graph: MechanismGraph;
  readonly frame: number;
  readonly steerBody: number;
  private readonly sides: Record<Side, SideRefs>;
  private readonly steerAxisDesign: Vec3;
  private readonly steerKind: 'revolute' | 'prismatic';
  private readonly drag: { crankBody: number; columnBody: number; crankArm: Vec3; crankFoot: Vec3; columnArm: Vec3 } | null;
  private readonly scratch: PoseGeometry;

  constructor(design: ResolvedDesign, graph: MechanismGraph) {
    this.graph = graph;
    this.frame = graph.frameBody;
    this.steerBody = steeringBody(design, graph);
    const steerJoint = graph.joints[this.steerBody];
    this.steerKind = steerJoint.kind === 'prismatic' ? 'prismatic' : 'revolute';
    this.steerAxisDesign = normalize(steerJoint.axis);
    const st = design.steering;
    this.sides = { left: sideRefs(design, graph, 'left', this.steerBody), right: sideRefs(design, graph, 'right', this.steerBody) };
    if (st.kind === 'trackRod' && st.drive.kind === 'dragLink') {
      const side = st.drive.upright;
      const crankArm = v(st.drive.uprightArmJoint);
      const lower = v(design.frontEnd.lower.outerJoint[side]);
      this.drag = {
        crankBody: bodyIndex(graph, `${side}.upright`),
        columnBody: this.steerBody,
        crankArm,
        crankFoot: lineFoot(crankArm, lower, sub(v(design.frontEnd.upper.outerJoint[side]), lower)),
        columnArm: v(st.drive.columnArmJoint),
      };
    } else if (st.kind === 'trackRod' && st.drive.kind === 'centreLever') {
      // The short link read as a drag link whose driving lever is the centre lever (its transmission is taken there).
      const leverJoint = v(st.drive.leverJoint);
      this.drag = {
        crankBody: this.steerBody,
        columnBody: bodyIndex(graph, 'trackRod'),
        crankArm: leverJoint,
        crankFoot: lineFoot(leverJoint, v(st.drive.pivot), v(st.drive.axis)),
        columnArm: v(st.drive.trackRodJoint),
      };
    } else if (st.kind === 'bellCrank' && st.input.kind === 'dragLink') {
      const columnBody = bodyIndex(graph, 'column');
      const crankArm = v(st.input.crankArmJoint);
      this.drag = {
        crankBody: this.steerBody,
        columnBody,
        crankArm,
        crankFoot: lineFoot(crankArm, v(st.pivot), v(st.axis)),
        columnArm: v(st.input.columnArmJoint),
      };
    } else {
      this.drag = null;
    }
    this.scratch = emptyGeometry(this.sides, this.steerKind, this.drag !== null);
  }

  /**
   * The posed geometry; `m` must be the mechanism this reader was built for, after forward().
   * The result is this reader's own scratch, overwritten by the next read: read it, copy
   * what must outlive the call (the analysis output always copies), do not keep it.
   */
  read(m: CompiledMechanism): PoseGeometry {
    const f = this.frame;
    const g = this.scratch;
    m.worldDirection(f, X_AXIS, g.frameX);
    m.worldDirection(f, Y_AXIS, g.frameY);
    m.worldDirection(f, Z_AXIS, g.frameUp);
    m.worldPoint(f, ORIGIN, g.frameOrigin);
    m.worldDirection(this.graph.joints[this.steerBody].parent, this.steerAxisDesign, g.steerAxis);
    const d = this.drag;
    if (d && g.dragLink) {
      m.worldPoint(d.crankBody, d.crankArm, g.dragLink.crankArm);
      m.worldPoint(d.crankBody, d.crankFoot, g.dragLink.crankFoot);
      m.worldPoint(d.columnBody, d.columnArm, g.dragLink.columnArm);
    }
    this.readSide(m, this.sides.left, g.left);
    this.readSide(m, this.sides.right, g.right);
    return g;
  }

  private readSide(m: CompiledMechanism, r: SideRefs, o: SideGeometry): void {
    const u = r.upright;
    const f = this.frame;
    const sb = this.steerBody;
    m.worldPoint(u, r.upperJoint, o.upperJoint);
    m.worldPoint(u, r.lowerJoint, o.lowerJoint);
    m.worldPoint(u, r.armJoint, o.armJoint);
    m.worldPoint(r.innerBody, r.innerJoint, o.innerJoint);
    m.worldPoint(u, r.wheelCentre, o.wheelCentre);
    m.worldDirection(u, r.spinAxis, o.spinAxis);
    m.worldPoint(f, r.upperPivot, o.upperPivot);
    m.worldDirection(f, r.upperPivotAxis, o.upperPivotAxis);
    m.worldPoint(f, r.lowerPivot, o.lowerPivot);
    m.worldDirection(f, r.lowerPivotAxis, o.lowerPivotAxis);
    m.worldPoint(f, r.upperArmInner, o.upperArmInner);
    m.worldPoint(f, r.lowerArmInner, o.lowerArmInner);
    if (r.upperRail && o.upperRail) {
      m.worldPoint(f, r.upperRail[0], o.upperRail[0]);
      m.worldPoint(f, r.upperRail[1], o.upperRail[1]);
    }
    if (r.lowerRail && o.lowerRail) {
      m.worldPoint(f, r.lowerRail[0], o.lowerRail[0]);
      m.worldPoint(f, r.lowerRail[1], o.lowerRail[1]);
    }
    m.worldPoint(u, r.armFoot, o.armFoot);
    if (r.crankFoot && o.crankFoot) m.worldPoint(sb, r.crankFoot, o.crankFoot);
    if (r.springFrame && o.springFrame) m.worldPoint(f, r.springFrame, o.springFrame);
    if (r.springArm && o.springArm) m.worldPoint(r.springBody, r.springArm, o.springArm);
    m.worldDirection(r.outerStudBody, r.studUpper, o.upperStud);
    m.worldDirection(r.upperCarrier, r.studUpper, o.upperHousing);
    m.worldDirection(r.outerStudBody, r.studLower, o.lowerStud);
    m.worldDirection(r.lowerCarrier, r.studLower, o.lowerHousing);
    m.worldDirection(u, r.studTieOuter, o.tieOuterStud);
    m.worldDirection(r.innerBody, r.studTieInner, o.tieInnerStud);
  }

  /** Design-pose (unposed) values, for the design-side sign of transmission angles. */
  designSide(s: Side): SideRefs {
    return this.sides[s];
  }

  get designSteerAxis(): Vec3 {
    return this.steerAxisDesign;
  }

  get designDragLink(): { crankArm: Vec3; crankFoot: Vec3; columnArm: Vec3 } | null {
    return this.drag ? { crankArm: this.drag.crankArm, crankFoot: this.drag.crankFoot, columnArm: this.drag.columnArm } : null;
  }
}

export type { SideRefs };
