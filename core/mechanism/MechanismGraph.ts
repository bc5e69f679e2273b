/**
 * A mechanism as plain data: rigid bodies hung on a spanning tree of joints, plus the
 * constraints that close the loops (cut joints, links, ground contact) and the drivers
 * that set the inputs. Layout templates build these graphs; the pose solver compiles any
 * graph, so a new layout is data, not a new solver.
 *
 * Every point and axis is written in design coordinates (the pose at which all joint
 * coordinates are zero). A body's pose maps design coordinates to world coordinates.
 */

import type { DrawingLayout } from './drawingLayout';

export type Vec3 = [number, number, number];

/** Named inputs of a pose, in the units of the user interface (degrees, millimetres). */
export type InputName =
  | 'leanDeg'
  | 'heaveMm'
  | 'handlebarDeg'
  | 'travelRightMm'
  | 'travelLeftMm'
  | 'wheelAngleDeg';

export const INPUT_NAMES: readonly InputName[] = [
  'leanDeg',
  'heaveMm',
  'handlebarDeg',
  'travelRightMm',
  'travelLeftMm',
  'wheelAngleDeg',
];

export type PoseInputs = Record<InputName, number>;

export function zeroInputs(): PoseInputs {
  return { leanDeg: 0, heaveMm: 0, handlebarDeg: 0, travelRightMm: 0, travelLeftMm: 0, wheelAngleDeg: 0 };
}

/** coordinate = gain * input (gain converts the input's unit to radians or mm). */
export interface InputBinding {
  input: InputName;
  gain: number;
}

export type TreeJointKind = 'revolute' | 'prismatic' | 'spherical';

export interface TreeJoint {
  id: string;
  label: string;
  kind: TreeJointKind;
  /** Parent body index, or -1 for the ground. Must come before the child in `bodies`. */
  parent: number;
  child: number;
  /** Centre of rotation (revolute, spherical), design coordinates, mm. */
  origin: Vec3;
  /** Unit axis (revolute, prismatic), design coordinates. */
  axis: Vec3;
  /** A driven joint's coordinate follows an input; otherwise it is solved. */
  driver?: InputBinding;
  /** A solved joint whose value is reported as an input (handlebar when steering by wheel). */
  reportsInput?: InputBinding;
}

export interface Body {
  id: string;
  label: string;
}

interface ConstraintBase {
  id: string;
  /** Human words naming the loop or joint, used in solver messages. */
  label: string;
}

/** Point A on body A coincides with point B on body B: a spherical cut joint (3 rows). */
export interface CoincidentConstraint extends ConstraintBase {
  kind: 'coincident';
  bodyA: number;
  pointA: Vec3;
  bodyB: number;
  pointB: Vec3;
}

/** A rigid link with a ball joint at each end: |A - B| = length (1 row). */
export interface DistanceConstraint extends ConstraintBase {
  kind: 'distance';
  bodyA: number;
  pointA: Vec3;
  bodyB: number;
  pointB: Vec3;
  length: number;
}

/** The wheel's lowest tyre point (torus of the crown) touches the ground plane z = 0. */
export interface GroundContactConstraint extends ConstraintBase {
  kind: 'groundContact';
  body: number;
  wheelCentre: Vec3;
  /** Unit spin axis at design. */
  spinAxis: Vec3;
  rollingRadius: number;
  crownRadius: number;
}

/** A point's height in a reference body's frame equals its design height plus an input. */
export interface PointHeightConstraint extends ConstraintBase {
  kind: 'pointHeight';
  body: number;
  point: Vec3;
  refBody: number;
  target: InputBinding;
}

/** A wheel's heading (ISO 8855 yaw of its rolling direction) equals an input. */
export interface WheelHeadingConstraint extends ConstraintBase {
  kind: 'wheelHeading';
  body: number;
  /** Unit spin axis at design, pointing to the vehicle's left (+y). */
  spinAxis: Vec3;
  target: InputBinding;
}

/**
 * The mean lateral position (y) of two wheels' lowest tyre points is zero: both tyres scrub
 * sideways equally, so the frame's lateral place comes out of the solve (a lean linkage whose
 * frame may shift sideways). Each wheel as in GroundContactConstraint.
 */
export interface MeanContactYConstraint extends ConstraintBase {
  kind: 'meanContactY';
  bodyA: number;
  centreA: Vec3;
  spinAxisA: Vec3;
  bodyB: number;
  centreB: Vec3;
  spinAxisB: Vec3;
  rollingRadius: number;
  crownRadius: number;
}

export type Constraint =
  | CoincidentConstraint
  | MeanContactYConstraint
  | DistanceConstraint
  | GroundContactConstraint
  | PointHeightConstraint
  | WheelHeadingConstraint;

/** A named hardpoint carried by a body, for reports and drawing. */
export interface NamedPoint {
  id: string;
  label: string;
  body: number;
  design: Vec3;
}

/** A road wheel carried by a body. */
export interface WheelRef {
  side: 'left' | 'right';
  body: number;
  centre: Vec3;
  /** Unit spin axis at design, pointing left (+y). */
  spinAxis: Vec3;
  rollingRadius: number;
  crownRadius: number;
  tyreWidth: number;
}

/** A link with a ball joint at each end, drawn and measured but not a tree body. */
export interface LinkRef {
  id: string;
  label: string;
  bodyA: number;
  pointA: Vec3;
  bodyB: number;
  pointB: Vec3;
}

export interface MechanismGraph {
  name: string;
  bodies: Body[];
  /** One joint per body, in body order: joints[i].child === i. */
  joints: TreeJoint[];
  constraints: Constraint[];
  points: NamedPoint[];
  wheels: WheelRef[];
  /**
   * Rear wheels carried by bodies of their own (a leaning rear pair), each held on the ground
   * by a contact constraint. Left out when the rear wheels are fixed in the frame: `wheels`
   * stays the two front wheels, which every front-end analysis reads.
   */
  rearWheels?: WheelRef[];
  links: LinkRef[];
  /** Index of the body that is the vehicle frame (lean and heave act on it). */
  frameBody: number;
  /**
   * How to draw the mechanism, from the template that built it (`drawingLayout.ts`). Graphs
   * built by hand (tests) may leave it out; the solver never reads it.
   */
  drawing?: DrawingLayout;
}
