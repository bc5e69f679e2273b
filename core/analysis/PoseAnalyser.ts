/**
 * Every measure of one solved pose, as plain data. Built once per mechanism (it finds the
 * bodies, points and clearance pairs it needs), then `analyse()` reads the mechanism's
 * current state after each solve. It never changes the mechanism or the solver.
 *
 * The measures that need other poses (local steering ratio, self-steer, steering-ratio change,
 * front lift) are filled in by relativeMeasures.ts from the poses the pose engine or a sweep
 * has; until then they are null with a reason.
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { Vec3 } from '../mechanism/MechanismGraph';
import type { CompiledMechanism } from '../solver/CompiledMechanism';
import type { SolveResult } from '../solver/PoseSolver';
import type {
  FailedPose,
  JointArticulation,
  PoseAnalysis,
  PoseInputsReport,
  SolverReport,
  SteeringMeasures,
  WheelAlignment,
} from './analysisTypes';
import { wheelAlignment } from './alignment';
import { ackermann, straightAheadDeg, type PlanWheel } from './ackermann';
import { clearancePairs, measureClearances, type ClearancePair } from './clearance';
import { articulation, tieRodArticulation } from './jointArticulation';
import { GeometryReader, type PoseGeometry, type SideGeometry } from './poseGeometry';
import { slipMeasures } from './scrub';
import { designSign, overallSteeringRatio, rawTransmission, transmissionDeg } from './steeringLinkage';
import { suspensionGeometry } from './suspensionGeometry';
import { applyJudgement, noChecks } from './poseVerdict';
import { turningCircle, turningCircleWithinFourWheelSlip, turningCircleWithinSlip, type PlanTyre } from './turningCircle';
import { fourWheelTurnCentre, rearWheelAlignment, type RearPairMeasures } from './rearPair';
import type { WheelRef } from '../mechanism/MechanismGraph';
import { RAD, normalize, sub } from './vec3';
import { wheelHeading } from '../mechanism/wheelAxis';
import { LEAN_IDS } from '../mechanism/templates/leanLinkage';

export interface AnalyserOptions {
  /** Write human-readable findings for measures outside tolerance or in the warning band (default true). */
  findings?: boolean;
}


const JOINT_ORDER = ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const;
const SIDE_ORDER: readonly Side[] = ['left', 'right'];

export function solverReport(r: SolveResult): SolverReport {
  const out: SolverReport = { status: r.status, residualMm: r.residualMm, iterations: r.iterations, message: r.message };
  if (r.culprit) out.culprit = r.culprit;
  return out;
}

export function inputsReport(m: CompiledMechanism): PoseInputsReport {
  const i = m.currentInputs;
  // Only a mechanism steered by a wheel angle reports an input (the handlebar) from a solved joint.
  const reported: Partial<PoseInputsReport> = reportsAnyInput(m) ? m.reportedInputs() : NONE_REPORTED;
  return {
    leanDeg: reported.leanDeg ?? i.leanDeg,
    handlebarDeg: reported.handlebarDeg ?? i.handlebarDeg,
    heaveMm: reported.heaveMm ?? i.heaveMm,
    travelRightMm: reported.travelRightMm ?? i.travelRightMm,
    travelLeftMm: reported.travelLeftMm ?? i.travelLeftMm,
    wheelAngleDeg: reported.wheelAngleDeg ?? i.wheelAngleDeg,
  };
}

const NONE_REPORTED: Partial<PoseInputsReport> = {};
const reportsCache = new WeakMap<CompiledMechanism, boolean>();

function reportsAnyInput(m: CompiledMechanism): boolean {
  let r = reportsCache.get(m);
  if (r === undefined) {
    r = m.graph.joints.some((j) => j.reportsInput !== undefined);
    reportsCache.set(m, r);
  }
  return r;
}

/** A pose the solver did not reach: the inputs asked for and why, no measures. */
export function failedPose(inputs: PoseInputsReport, r: SolveResult): FailedPose {
  return { inputs, solver: solverReport(r), status: 'broken' };
}

/**
 * Front lift of pose `a` relative to `ref` (straight ahead, same lean and travel): heave
 * change + mean suspension travel taken up - mean contact-height change, mm. The suspension
 * travel is the lower joint's travel change scaled by the wheel-per-joint ratio at `a` (1 if
 * unknown), so a ratio that drifts with steer only enters to second order.
 */
export function frontLift(a: PoseAnalysis, ref: PoseAnalysis): number {
  let taken = 0;
  for (const s of SIDE_ORDER) {
    const sa = a.suspension[s];
    taken += (sa.wheelPerJointTravel ?? 1) * (sa.jointTravelMm - ref.suspension[s].jointTravelMm);
  }
  const contact = (a.wheels.left.contactPatchMm.z + a.wheels.right.contactPatchMm.z - ref.wheels.left.contactPatchMm.z - ref.wheels.right.contactPatchMm.z) / 2;
  return a.frameHeaveMm - ref.frameHeaveMm + taken / 2 - contact;
}


function planWheel(w: WheelAlignment, gs: SideGeometry): PlanWheel {
  return { x: w.contactPatchMm.x, y: w.contactPatchMm.y, heading: wheelHeading(gs.spinAxis[0], gs.spinAxis[1]) };
}

export const NO_NEIGHBOURS = 'the local ratio needs a neighbouring pose along the handlebar';
export const NO_DRAG_LINK = 'the design has no drag link';
export const NO_LIFT_REFERENCE = 'front lift needs the straight-ahead pose at the same lean and travel';
export const NO_STRAIGHT = 'self-steer needs the straight-ahead poses at this lean and travel and upright';

export class PoseAnalyser {
  readonly design: ResolvedDesign;
  readonly mechanism: CompiledMechanism;
  readonly reader: GeometryReader;
  readonly pairs: ClearancePair[];
  private readonly findings: boolean;
  private readonly armSign: Record<Side, number>;
  private readonly linkSign: Record<Side, number>;
  private readonly dragSign: number;
  private readonly tieAxisDesign: Record<Side, Vec3>;
  private readonly rear: PlanTyre[];
  /** A leaning rear pair's wheels (the graph's `rearWheels`), left then right; null for a rear fixed in the frame. */
  private readonly rearWheels: { left: WheelRef; right: WheelRef } | null;
  private readonly pivotWorld: Vec3 = [0, 0, 0];
  private readonly lowerJointZ: { left: number; right: number };
  /** Straight-ahead threshold of the inner road-wheel angle (ackermann.ts), degrees. */
  private readonly straightDeg: number;
  /** With a lean linkage: its rocker and carrier bodies (leanLinkage.ts); null otherwise. */
  private readonly lean: { rocker: number; carrier: number; stopDeg: number; frameMount: Vec3; carrierMount: Vec3 } | null;

  constructor(design: ResolvedDesign, mechanism: CompiledMechanism, options: AnalyserOptions = {}) {
    this.design = design;
    this.mechanism = mechanism;
    this.reader = new GeometryReader(design, mechanism.graph);
    this.pairs = clearancePairs(design);
    this.findings = options.findings ?? true;
    // Design-pose transmission signs, from the design points (the design pose is world = design).
    const st = design.steering;
    const steerAxis = this.reader.designSteerAxis;
    const axisPoint: Vec3 = steerPivot(st) ?? [0, 0, 0];
    const kind = st.kind === 'rack' ? 'prismatic' : 'revolute';
    const arm = {} as Record<Side, number>;
    const link = {} as Record<Side, number>;
    const tie = {} as Record<Side, Vec3>;
    for (const side of ['left', 'right'] as Side[]) {
      const r = this.reader.designSide(side);
      arm[side] = designSign(rawTransmission(r.armJoint, r.innerJoint, r.lowerJoint, normalize(sub(r.upperJoint, r.lowerJoint)), 'revolute'));
      tie[side] = normalize(sub(r.armJoint, r.innerJoint));
    }
    for (const side of ['left', 'right'] as Side[]) {
      const r = this.reader.designSide(side);
      // A track rod's far end is on the other steering arm: the lever there is the other upright.
      link[side] = st.kind === 'trackRod' ? arm[side === 'right' ? 'left' : 'right'] : designSign(rawTransmission(r.innerJoint, r.armJoint, axisPoint, steerAxis, kind));
    }
    this.armSign = arm;
    this.linkSign = link;
    this.tieAxisDesign = tie;
    this.straightDeg = straightAheadDeg(design.upright.staticToeDeg);
    this.lowerJointZ = { left: design.frontEnd.lower.outerJoint.left.z, right: design.frontEnd.lower.outerJoint.right.z };
    const rt = design.wheels.rear;
    const rearTyre = (y: number): PlanTyre => ({ x: -design.vehicle.wheelbaseMm, y, heading: 0, rollingRadiusMm: rt.rollingRadiusMm, widthMm: rt.tyreWidthMm });
    const rw = mechanism.graph.rearWheels;
    const rwl = rw?.find((w) => w.side === 'left');
    const rwr = rw?.find((w) => w.side === 'right');
    this.rearWheels = rwl && rwr ? { left: rwl, right: rwr } : null;
    this.rear = design.vehicle.rear.kind === 'pair' ? [rearTyre(design.vehicle.rear.trackMm / 2), rearTyre(-design.vehicle.rear.trackMm / 2)] : [rearTyre(0)];
    const drag = this.reader.designDragLink;
    const driven = drivenLever(design, null);
    const rocker = mechanism.graph.bodies.findIndex((b) => b.id === LEAN_IDS.rocker);
    const l = design.leanLinkage;
    this.lean =
      l && rocker >= 0
        ? {
            rocker,
            carrier: mechanism.graph.bodies.findIndex((b) => b.id === LEAN_IDS.carrier),
            stopDeg: l.rocker.stopDeg,
            frameMount: [l.carrier.frameMount.x, l.carrier.frameMount.y, l.carrier.frameMount.z],
            carrierMount: [l.carrier.carrierMount.x, l.carrier.carrierMount.y, l.carrier.carrierMount.z],
          }
        : null;
    this.dragSign = drag ? designSign(rawTransmission(drag.crankArm, drag.columnArm, driven?.point ?? axisPoint, driven?.axis ?? steerAxis, 'revolute')) : 1;
  }

  /** Every measure of the pose the mechanism is in now (after a converged or singular solve). */
  /**
   * `judge: false` leaves the verdict for relativeMeasures.ts to make once the neighbouring
   * poses are in (a sweep judges every cell that way; judging twice cost it a few per cent).
   */
  analyse(result: SolveResult, judge = true): PoseAnalysis {
    const m = this.mechanism;
    const d = this.design;
    m.forward();
    const g = this.reader.read(m);
    const frame = { x: g.frameX, y: g.frameY, up: g.frameUp, origin: g.frameOrigin };
    const tyre = d.wheels.front;
    const left = wheelAlignment(g.left, tyre, frame, d.upright.wheelCentre.left.z);
    const right = wheelAlignment(g.right, tyre, frame, d.upright.wheelCentre.right.z);
    const inputs = inputsReport(m);
    const pl = planWheel(left, g.left);
    const pr = planWheel(right, g.right);
    // A leaning rear pair: its tyres where the solve put them (the rear axle line through their contact centres).
    const rearPair = this.rearPair(g.frameUp, pl, pr);
    const rearX = rearPair ? (rearPair.left.contactPatchMm.x + rearPair.right.contactPatchMm.x) / 2 : -d.vehicle.wheelbaseMm;
    const ack = ackermann(pl, pr, rearX, this.straightDeg);
    const slip = slipMeasures(pl, pr, rearX);
    const tcFront = turningCircleWithinSlip(turningCircle({
      left: { x: pl.x, y: pl.y, heading: pl.heading, rollingRadiusMm: tyre.rollingRadiusMm, widthMm: tyre.tyreWidthMm },
      right: { x: pr.x, y: pr.y, heading: pr.heading, rollingRadiusMm: tyre.rollingRadiusMm, widthMm: tyre.tyreWidthMm },
      rear: rearPair ? this.rearTyres(rearPair) : this.rear,
      rearAxleX: rearX,
      bodyOutline: d.vehicle.bodyOutline,
      straightAheadDeg: this.straightDeg,
    }), slip.worstSlipDeg, d.tolerances.slipDeg);
    const tc = rearPair ? turningCircleWithinFourWheelSlip(tcFront, rearPair.turnCentre.worstSlipDeg, d.tolerances.slipDeg) : tcFront;

    const steering = this.steering(g, inputs, left.steerDeg, right.steerDeg);
    const { joints, spin } = this.joints(g);
    const clearances = measureClearances(g, d, this.pairs, tyre);
    const susp = suspensionGeometry(
      g,
      { left: [left.contactPatchMm.x, left.contactPatchMm.y, left.contactPatchMm.z], right: [right.contactPatchMm.x, right.contactPatchMm.y, right.contactPatchMm.z] },
      { split: d.frontEnd.kind === 'splitWishbones', springOn: d.spring ? d.spring.on : null, lowerJointZ: this.lowerJointZ },
    );

    let jointMargin = Infinity;
    for (const j of joints) jointMargin = Math.min(jointMargin, j.marginDeg);
    let clearance = Infinity;
    for (const c of clearances) clearance = Math.min(clearance, c.distanceMm);
    const transmission = Math.min(
      steering.steeringArmTransmissionDeg.left,
      steering.steeringArmTransmissionDeg.right,
      steering.linkageTransmissionDeg.left,
      steering.linkageTransmissionDeg.right,
      steering.dragLinkTransmissionDeg ?? Infinity,
    );

    const analysis: PoseAnalysis = {
      inputs,
      frameHeaveMm: g.frameOrigin[2],
      solver: solverReport(result),
      wheels: { left, right },
      steering,
      ackermann: ack,
      slip,
      turningCircle: tc,
      joints,
      tieRodSpinDeg: spin,
      clearances,
      suspension: {
        left: susp.left,
        right: susp.right,
        rollCentreMm: susp.rollCentreMm,
        frontLiftMm: null,
        frontLiftReason: NO_LIFT_REFERENCE,
        reason: susp.reason,
      },
      selfSteer: { leftDeg: null, rightDeg: null, reason: NO_STRAIGHT },
      worst: { slipDeg: slip.worstSlipDeg, selfSteerDeg: null, ratioChangePct: null, jointMarginDeg: jointMargin, clearanceMm: clearance, transmissionDeg: transmission },
      status: 'within',
      checks: noChecks(),
      findings: [],
      findingSubjects: [],
    };
    if (this.lean) analysis.leanLinkage = this.leanState();
    if (rearPair) analysis.rear = rearPair;
    // Judged on what one pose gives; relativeMeasures.ts judges again once the neighbours are known.
    return judge ? applyJudgement(analysis, d.tolerances, this.findings) : analysis;
  }


  /** The leaning rear pair's wheels and the four-wheel turn centre; null for a rear fixed in the frame. */
  private rearPair(frameUp: Vec3, fl: PlanWheel, fr: PlanWheel): RearPairMeasures | null {
    const rw = this.rearWheels;
    if (!rw) return null;
    const left = rearWheelAlignment(this.mechanism, rw.left, frameUp);
    const right = rearWheelAlignment(this.mechanism, rw.right, frameUp);
    const plan = (a: typeof left): PlanWheel => ({ x: a.contactPatchMm.x, y: a.contactPatchMm.y, heading: a.steerDeg / RAD });
    return { left, right, turnCentre: fourWheelTurnCentre(fl, fr, plan(left), plan(right), this.straightDeg) };
  }

  /** The rear pair's tyres in plan, for the turning circle's wall-to-wall figure. */
  private rearTyres(r: RearPairMeasures): PlanTyre[] {
    const t = this.design.wheels.rear;
    return [r.left, r.right].map((a) => ({ x: a.contactPatchMm.x, y: a.contactPatchMm.y, heading: a.steerDeg / RAD, rollingRadiusMm: t.rollingRadiusMm, widthMm: t.tyreWidthMm }));
  }

  /** The rocker angle from its joint, the spring between its posed mounts. */
  private leanState(): PoseAnalysis['leanLinkage'] {
    const l = this.lean!;
    const m = this.mechanism;
    const rockerDeg = m.coord[l.rocker] * RAD;
    const a: Vec3 = [0, 0, 0];
    const b: Vec3 = [0, 0, 0];
    m.worldPoint(m.graph.frameBody, l.frameMount, a);
    m.worldPoint(l.carrier, l.carrierMount, b);
    return { rockerDeg, stopMarginDeg: l.stopDeg - Math.abs(rockerDeg), springLengthMm: Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) };
  }

  private steering(g: PoseGeometry, inputs: PoseInputsReport, leftDeg: number, rightDeg: number): SteeringMeasures {
    const mean = (leftDeg + rightDeg) / 2;
    const st = this.design.steering;
    const axisPoint = this.pivotWorld;
    const pivot = steerPivot(st);
    if (pivot) this.mechanism.worldPoint(this.reader.frame, pivot, axisPoint);
    const dl = g.dragLink;
    const driven = drivenLever(this.design, g);
    const ratio = overallSteeringRatio(inputs.handlebarDeg, mean);
    const out: SteeringMeasures = {
      handlebarDeg: inputs.handlebarDeg,
      leftWheelDeg: leftDeg,
      rightWheelDeg: rightDeg,
      meanWheelDeg: mean,
      overallRatio: ratio,
      localRatio: null,
      steeringArmTransmissionDeg: { left: this.armTransmission(g.left), right: this.armTransmission(g.right) },
      linkageTransmissionDeg: { left: this.linkTransmission(g, 'left'), right: this.linkTransmission(g, 'right') },
      dragLinkTransmissionDeg: dl
        ? transmissionDeg(rawTransmission(dl.crankArm, dl.columnArm, driven?.point ?? axisPoint, driven?.axis ?? g.steerAxis, 'revolute'), this.dragSign)
        : null,
      localRatioReason: NO_NEIGHBOURS,
      ratioChangePct: null,
      ratioChangeReason: NO_NEIGHBOURS,
    };
    if (!dl) out.dragLinkTransmissionReason = NO_DRAG_LINK;
    if (ratio === null) out.reason = 'straight ahead: no overall ratio';
    return out;
  }

  private armTransmission(gs: SideGeometry): number {
    const k = normalize(sub(gs.upperJoint, gs.lowerJoint));
    return transmissionDeg(rawTransmission(gs.armJoint, gs.innerJoint, gs.lowerJoint, k, 'revolute'), this.armSign[gs.side]);
  }

  private linkTransmission(g: PoseGeometry, s: Side): number {
    if (this.design.steering.kind === 'trackRod') {
      // The track rod's far end turns the other upright about its steering axis.
      const far = g[s === 'right' ? 'left' : 'right'];
      const k = normalize(sub(far.upperJoint, far.lowerJoint));
      return transmissionDeg(rawTransmission(g[s].innerJoint, g[s].armJoint, far.lowerJoint, k, 'revolute'), this.linkSign[s]);
    }
    return transmissionDeg(rawTransmission(g[s].innerJoint, g[s].armJoint, this.pivotWorld, g.steerAxis, g.steerKind), this.linkSign[s]);
  }

  private joints(g: PoseGeometry): { joints: JointArticulation[]; spin: { left: number; right: number } } {
    const d = this.design;
    const out: JointArticulation[] = [];
    const spin = { left: 0, right: 0 };
    for (const side of SIDE_ORDER) {
      const gs = g[side];
      const refs = this.reader.designSide(side);
      const tie = tieRodArticulation({
        axisDesign: this.tieAxisDesign[side],
        axisNow: normalize(sub(gs.armJoint, gs.innerJoint)),
        outerStudDesign: refs.studTieOuter,
        innerStudDesign: refs.studTieInner,
        outerStudNow: gs.tieOuterStud,
        innerStudNow: gs.tieInnerStud,
      });
      spin[side] = tie.spinRad * RAD;
      const values: Record<(typeof JOINT_ORDER)[number], number> = {
        upperOuter: articulation(gs.upperStud, gs.upperHousing),
        lowerOuter: articulation(gs.lowerStud, gs.lowerHousing),
        tieRodOuter: tie.outerRad,
        tieRodInner: tie.innerRad,
      };
      for (const name of JOINT_ORDER) {
        const spec = d.joints[name];
        const deg = values[name] * RAD;
        out.push({ joint: name, side, kind: spec.kind, articulationDeg: deg, ratedDeg: spec.ratedDeg, marginDeg: spec.ratedDeg - deg });
      }
    }
    return { joints: out, spin };
  }
}

/** The frame point on the steering body's axis (crank, lever, column or centre-lever pivot); none for a rack or a handlebar on an upright. */
function steerPivot(st: ResolvedDesign['steering']): Vec3 | null {
  if (st.kind === 'rack') return null;
  if (st.kind === 'trackRod') {
    const drive = st.drive;
    if (drive.kind === 'dragLink') return [drive.columnPivot.x, drive.columnPivot.y, drive.columnPivot.z];
    return drive.kind === 'centreLever' ? [drive.pivot.x, drive.pivot.y, drive.pivot.z] : null;
  }
  return [st.pivot.x, st.pivot.y, st.pivot.z];
}

/**
 * The lever a track rod's drag link turns: the driven upright about its steering axis (lower
 * outer joint, unit axis to the upper one), posed (`g`) or at design (null); null for the other
 * layouts, whose drag link turns the bell crank about the steering body's axis.
 */
function drivenLever(design: ResolvedDesign, g: PoseGeometry | null): { point: Vec3; axis: Vec3 } | null {
  const st = design.steering;
  if (st.kind !== 'trackRod' || st.drive.kind !== 'dragLink') return null;
  const side = st.drive.upright;
  const lower: Vec3 = g ? g[side].lowerJoint : [design.frontEnd.lower.outerJoint[side].x, design.frontEnd.lower.outerJoint[side].y, design.frontEnd.lower.outerJoint[side].z];
  const upper: Vec3 = g ? g[side].upperJoint : [design.frontEnd.upper.outerJoint[side].x, design.frontEnd.upper.outerJoint[side].y, design.frontEnd.upper.outerJoint[side].z];
  return { point: lower, axis: normalize(sub(upper, lower)) };
}
