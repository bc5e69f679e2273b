/**
 * What the analysis returns for one solved pose: plain, serialisable data (no class
 * instances, no NaN). A value that cannot be given is null, and the object that holds it
 * says why in its `reason`. Lengths in mm, angles in degrees; every sign is defined in
 * docs/conventions.md ("Analysis measures") and repeated in the field's comment.
 */

import type { JointKind, Joints, Side } from '../design/types';
import type { SolveStatus } from '../solver/PoseSolver';
import type { XyzMm } from './vec3';
import type { RearPairMeasures } from './rearPair';
import type { CheckKind, Verdict } from './tolerance';
import type { FindingSubject } from './poseVerdict';

export interface XyMm {
  x: number;
  y: number;
}

/** Front-view point: lateral y and height z, mm. */
export interface YzMm {
  y: number;
  z: number;
}

export interface PoseInputsReport {
  leanDeg: number;
  handlebarDeg: number;
  heaveMm: number;
  travelRightMm: number;
  travelLeftMm: number;
  wheelAngleDeg: number;
}

export interface WheelAlignment {
  side: Side;
  /** Road-wheel angle: ISO 8855 heading of the wheel about the ground normal, positive left. */
  steerDeg: number;
  /** Toe to the vehicle's x axis, toe-in positive. */
  toeDeg: number;
  /**
   * Camber to the ground normal, top outward positive: the inclination of the wheel plane itself
   * from the ground normal (not its front-view projection), whatever the steer.
   */
  camberDeg: number;
  /** Camber to the frame's z axis, top outward positive (the same inclination, to the frame). */
  camberToFrameDeg: number;
  /**
   * The wheel plane's front-view (y-z) projection against the ground normal, top outward
   * positive: what a front-view drawing shows; equals camberDeg straight ahead and differs
   * with steer. Null when the wheel plane is the front-view plane (steered 90 deg).
   */
  camberFrontViewDeg: number | null;
  /** Caster in side view of the vehicle (x-z plane, ground frame), top rearward positive. */
  casterDeg: number;
  /** Kingpin inclination in front view (y-z plane, ground frame), top inward positive. */
  kpiDeg: number;
  /** The same two angles in the frame's axes (what a drawing of the leaned frame shows). */
  casterToFrameDeg: number;
  kpiToFrameDeg: number;
  /** Mechanical trail along the wheel's heading on the ground: contact patch behind the axis's ground point positive. */
  trailMm: number | null;
  /** Scrub radius (kingpin offset at ground) across the wheel: axis ground point inboard of the contact patch positive. */
  scrubRadiusMm: number | null;
  /** Caster offset at wheel-centre height along the heading: axis ahead of the wheel centre positive. */
  casterOffsetMm: number | null;
  /** Kingpin offset at wheel-centre height across the wheel: axis inboard of the wheel centre positive. */
  kingpinOffsetAtCentreMm: number | null;
  /** Shortest distance from the wheel centre to the steering axis. */
  spindleLengthMm: number;
  /** Wheel-centre travel relative to the frame (frame z), bump (wheel up) positive. */
  travelMm: number;
  centreMm: XyzMm;
  /** Centre of the tyre contact: the tyre's lowest point; it moves round the crown as the wheel leans. */
  contactPatchMm: XyzMm;
  /** Where the steering axis meets the ground plane. */
  axisGroundPointMm: XyzMm | null;
  reason?: string;
}

export interface SteeringMeasures {
  handlebarDeg: number;
  leftWheelDeg: number;
  rightWheelDeg: number;
  /** Mean of the two road-wheel angles, positive left. */
  meanWheelDeg: number;
  /** Overall steering ratio: handlebar angle / mean road-wheel angle. */
  overallRatio: number | null;
  /** Local ratio: d(handlebar) / d(mean road-wheel angle), from neighbouring poses. */
  localRatio: number | null;
  localRatioReason?: string;
  /**
   * Steering-ratio change with lean and travel: 100 (local ratio upright / local ratio here - 1),
   * the upright pose having zero lean and travel and the same handlebar. Positive: the road
   * wheels turn more per handlebar degree than upright (quicker steering).
   */
  ratioChangePct: number | null;
  ratioChangeReason?: string;
  /**
   * Transmission angles, degrees: asin of the cosine between a link's line and the
   * velocity of the joint it drives; 90 is ideal, 0 is dead centre. Signed: positive on the
   * design's side of dead centre, zero or negative once a dead centre is reached or passed.
   */
  steeringArmTransmissionDeg: { left: number; right: number };
  /** At the crank, lever or rack end of each tie rod. */
  linkageTransmissionDeg: { left: number; right: number };
  /** At the crank's input arm when a drag link turns the crank; null otherwise. */
  dragLinkTransmissionDeg: number | null;
  dragLinkTransmissionReason?: string;
  reason?: string;
}

export interface AckermannMeasures {
  turn: 'left' | 'right' | 'straight';
  innerSide: Side | null;
  /** Road-wheel angles as magnitudes in the direction of the turn (outer negative if it steers the other way). */
  innerDeg: number | null;
  outerDeg: number | null;
  /** Outer angle that puts both wheels' axis lines through one point on the rear axle line. */
  idealOuterDeg: number | null;
  /** outer - ideal outer: positive = outer steers more than ideal (less Ackermann, relative toe-in). */
  errorDeg: number | null;
  /** Adopted: 100 (inner - outer) / (inner - ideal outer), at the same inner angle. */
  percent: number | null;
  /** Shown beside it: 100 (cot outer - cot inner) / (cot ideal outer - cot inner), the effective-wheelbase form. */
  percentCot: number | null;
  /** The inner wheel's axis line met with the rear axle line (ground plane). */
  referenceCentreMm: XyMm | null;
  reason?: string;
}

export interface WheelSlip {
  /** ISO 8855 slip angle: from the wheel's heading to its contact centre's path velocity, anticlockwise (from above) positive. */
  slipDeg: number;
  /** Sideways scrub per distance travelled: 1000 tan(slip), m/km, signed like the slip. */
  scrubMPerKm: number;
}

export interface SlipMeasures {
  /** Kinematic turn centre on the rear axle line where the front slip angles are equal and opposite. */
  turnCentreMm: XyMm | null;
  /** Distance from the turn centre to the rear axle's centre, mm. */
  turnRadiusMm: number | null;
  left: WheelSlip;
  right: WheelSlip;
  /** Largest |slip| of the two front wheels. */
  worstSlipDeg: number;
  reason?: string;
}

export interface TurningCircle {
  outerSide: Side | null;
  /** SAE J695 turning diameter: twice the radius to the outer front tyre's contact centre. */
  turningDiameterMm: number | null;
  /** Kerb to kerb: to the outer edge of the outer front tyre's tread (turning diameter + tread width). */
  kerbToKerbMm: number | null;
  /** Wall to wall: smallest circle about the same centre enclosing the body outline and every tyre's plan-view outline. */
  wallToWallMm: number | null;
  /** What the wall-to-wall figure encloses: 'body outline and wheels' or 'wheels only' (no outline in the design). */
  wallToWallFrom: string | null;
  /** Turn centre used: the outer wheel's axis line met with the rear axle line (the outer wheel rolls without slip). */
  centreMm: XyMm | null;
  reason?: string;
}

export type JointName = keyof Joints;

export interface JointArticulation {
  joint: JointName;
  side: Side;
  kind: JointKind;
  /** Angle between the housing's axis and the stud or bolt axis. */
  articulationDeg: number;
  ratedDeg: number;
  /** rated - articulation; negative = over its rating. */
  marginDeg: number;
}

export interface ClearanceResult {
  /** Pair id, e.g. 'tieRod-lowerArm'. */
  pair: string;
  side: Side;
  /** Surface-to-surface distance of the two modelled parts; negative = they intersect. */
  distanceMm: number;
}

export interface SideSuspension {
  /** Front-view instant centre of the upright relative to the frame (world y-z at the contact patch's x). */
  instantCentreMm: YzMm | null;
  /** Front-view swing-arm length: contact patch to the instant centre. */
  swingArmMm: number | null;
  /** Spring (or damper) length change per wheel-centre travel (frame z), steering held; null without a spring. */
  motionRatio: number | null;
  /**
   * The lower outer joint's travel relative to the frame (frame z, up positive): the
   * suspension's own position, which turning the upright about its steering axis (through
   * this joint) does not change.
   */
  jointTravelMm: number;
  /** Wheel-centre travel per lower-joint travel, steering held (velocity ratio); null at a dead centre. */
  wheelPerJointTravel: number | null;
  reason?: string;
}

export interface SuspensionGeometry {
  left: SideSuspension;
  right: SideSuspension;
  /** Front-view roll centre: the two contact-patch-to-instant-centre lines met (world y, z). */
  rollCentreMm: YzMm | null;
  /**
   * Front lift with steer: how far the front would rise, relative to the straight-ahead pose
   * at the same lean and travel, if the suspension held its position: heave change + mean
   * suspension travel taken up (lower-joint travel change x wheelPerJointTravel) - mean
   * contact-height change. Positive = steering lifts the front (the returning tendency KPI
   * and caster give).
   */
  frontLiftMm: number | null;
  frontLiftReason?: string;
  /** Why the roll centre is null. */
  reason?: string;
}

/**
 * Self-steer (lean steer and bump steer): road-wheel angle at zero handlebar, at this pose's
 * lean and travel, minus the road-wheel angle at zero handlebar, lean and travel. Positive left.
 * It depends on lean and travel only, not on the handlebar.
 */
export interface SelfSteer {
  leftDeg: number | null;
  rightDeg: number | null;
  reason?: string;
}

export interface WorstMeasures {
  slipDeg: number;
  /** Largest |self-steer| of the two wheels; null until the straight-ahead poses are known. */
  selfSteerDeg: number | null;
  /** Steering-ratio change; null until the neighbouring poses are known. */
  ratioChangePct: number | null;
  /** Smallest rated - articulation over every joint. */
  jointMarginDeg: number;
  /** Smallest clearance over every pair. */
  clearanceMm: number;
  /** Smallest transmission angle (dead-centre margin). */
  transmissionDeg: number;
}

export interface SolverReport {
  status: SolveStatus;
  residualMm: number | null;
  iterations: number;
  message: string;
  culprit?: string;
}

/** A balance-beam lean linkage's state at a pose (design block leanLinkage; see leanLinkageMeasures.ts for the rest). */
export interface LeanLinkageState {
  /** Rocker rotation relative to its carrier, right-handed about the rocker axis, degrees. */
  rockerDeg: number;
  /** The rocker's stop angle minus |rocker angle|: negative past a stop, degrees. */
  stopMarginDeg: number;
  /** Between the spring's frame and carrier mounts, mm. */
  springLengthMm: number;
}

export interface PoseAnalysis {
  inputs: PoseInputsReport;
  /** Frame origin height change (equals heaveMm where heave is an input; solved for a centre-pivot front end on the ground). */
  frameHeaveMm: number;
  /** With a lean linkage: the rocker and spring (absent otherwise). */
  leanLinkage?: LeanLinkageState;
  solver: SolverReport;
  wheels: { left: WheelAlignment; right: WheelAlignment };
  steering: SteeringMeasures;
  ackermann: AckermannMeasures;
  slip: SlipMeasures;
  turningCircle: TurningCircle;
  /** A leaning rear pair's wheels and the four-wheel turn centre (rearPair.ts); absent for other rears. */
  rear?: RearPairMeasures;
  joints: JointArticulation[];
  /** Tie-rod spin about its own axis chosen by the minimax treatment, relative to the shortest rotation from design. */
  tieRodSpinDeg: { left: number; right: number };
  clearances: ClearanceResult[];
  suspension: SuspensionGeometry;
  selfSteer: SelfSteer;
  worst: WorstMeasures;
  /** The pose's verdict: the worst of its checks (tolerance.ts is the judge). */
  status: Verdict;
  /** Each check's verdict; null where the measure is not known (no neighbouring pose). */
  checks: Record<CheckKind, Verdict | null>;
  /** Human words for each measure outside its tolerance or in its warning band. */
  findings: string[];
  /** What each finding is about, in the same order (poseVerdict.ts). */
  findingSubjects: FindingSubject[];
}

/** A pose the solver could not reach: no measures, never numbers made up. */
export interface FailedPose {
  inputs: PoseInputsReport;
  solver: SolverReport;
  status: 'broken';
}
