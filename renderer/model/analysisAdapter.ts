/**
 * The one place the workbench calls core's kinematics and analysis. Everything the readouts,
 * warnings, colours, charts and the heat map show comes from core (the pose solver, the
 * pose snapshot for drawing, PoseAnalyser for every measure, the tolerance judges for every
 * verdict); this module only reshapes core's results into rows, labels and part conditions.
 */
import type { ResolvedDesign, Side } from '../../core/design/types';
import { buildMechanism, type PoseMode } from '../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type MechanismGraph, type PoseInputs } from '../../core/mechanism/MechanismGraph';
import { PoseSolver, type SolveStatus } from '../../core/solver/PoseSolver';
import { takeSnapshot, type PoseSnapshot } from '../../core/analysis/poseSnapshot';
import { NO_LIFT_REFERENCE, NO_NEIGHBOURS, PoseAnalyser, frontLift, type ToeReference } from '../../core/analysis/PoseAnalyser';
import { localSteeringRatio } from '../../core/analysis/steeringLinkage';
import { LOCAL_RATIO_STEP_DEG } from '../../core/analysis/solveSinglePose';
import type { PoseAnalysis, PoseStatus } from '../../core/analysis/analysisTypes';
import { judgeAbs, judgeClearance, judgeJoint, judgeTransmission, type Verdict } from '../../core/analysis/tolerance';
import { worse, type Severity } from './severity';
import { toCoreInputs, type Contact, type PoseUi } from './poseInputs';

export type Unit = 'mm' | 'deg' | '%' | 'm/km' | 'mm/mm' | 'deg/deg' | '';

export interface ReadoutCell {
  value: number | null;
  severity?: Severity;
}

export interface ReadoutRow {
  id: string;
  label: string;
  unit: Unit;
  digits: number;
  cells: ReadoutCell[];
  /** Shown instead of the numbers when every cell is null. */
  missing?: string;
  hint?: string;
}

export interface ReadoutTable {
  id: string;
  title: string;
  /** Column heads; one column means a plain list. */
  columns: string[];
  rows: ReadoutRow[];
}

export interface Alert {
  severity: Severity;
  text: string;
}

export type OutcomeStatus = SolveStatus | 'invalid-design';

export interface PoseOutcome {
  status: OutcomeStatus;
  /** Whether the requested pose was reached (converged or singular). */
  reached: boolean;
  message: string;
  culprit?: string;
  /**
   * The pose drawn: the requested one; the last good one when the request failed; or the
   * hardpoints as entered (design pose, loops not closed) when no pose has closed yet.
   */
  snapshot: PoseSnapshot | null;
  shown: 'requested' | 'last-good' | 'as-entered' | 'none';
  /** Every measure of core's PoseAnalyser for the requested pose; null when not reached. */
  analysis: PoseAnalysis | null;
  /** The pose's status against the design's tolerances (core's), or cannot-assemble. */
  poseStatus: PoseStatus | null;
  tables: ReadoutTable[];
  alerts: Alert[];
  /**
   * Condition of each checked part: 'tyre.<side>', 'joint.<point id>', 'tube.<tube id>',
   * 'constraint.<constraint id>'.
   */
  parts: Record<string, Severity>;
  iterations: number;
  residualMm: number | null;
  solveMs: number;
}

/** Which mechanism body carries each named point, and where it sits at design. */
export interface MechanismLayout {
  bodies: string[];
  points: Record<string, { body: string; design: [number, number, number] }>;
  links: { id: string; label: string }[];
  constraints: { id: string; label: string }[];
}

export function layoutOf(graph: MechanismGraph): MechanismLayout {
  const points: MechanismLayout['points'] = {};
  for (const p of graph.points) points[p.id] = { body: graph.bodies[p.body].id, design: [p.design[0], p.design[1], p.design[2]] };
  return {
    bodies: graph.bodies.map((b) => b.id),
    points,
    links: graph.links.map((l) => ({ id: l.id, label: l.label })),
    constraints: graph.constraints.map((c) => ({ id: c.id, label: c.label })),
  };
}

export function verdictSeverity(v: Verdict): Severity {
  return v === 'pass' ? 'within' : v === 'warning' ? 'close' : 'over';
}

/** Core's pose status as a condition level. */
export function statusSeverity(s: PoseStatus): Severity {
  if (s === 'within') return 'within';
  if (s === 'warning') return 'close';
  if (s === 'cannot-assemble') return 'broken';
  return 'over';
}

const JOINT_POINT: Record<string, (side: Side) => string> = {
  upperOuter: (s) => `frontEnd.upper.outerJoint.${s}`,
  lowerOuter: (s) => `frontEnd.lower.outerJoint.${s}`,
  tieRodOuter: (s) => `upright.steeringArmJoint.${s}`,
  tieRodInner: (s) => `steering.tieRodJoint.${s}`,
};

const JOINT_LABEL: Record<string, string> = {
  upperOuter: 'Upper outer joint',
  lowerOuter: 'Lower outer joint',
  tieRodOuter: 'Tie rod, outer end',
  tieRodInner: 'Tie rod, inner end',
};

const PART_LABEL: Record<string, string> = {
  upperArm: 'upper arm',
  lowerArm: 'lower arm',
  upperRail: 'upper frame rail',
  lowerRail: 'lower frame rail',
  tieRod: 'tie rod',
  steeringArm: 'steering arm',
  crankArm: 'crank arm',
  rack: 'rack',
  tyre: 'tyre',
};

/** Viewport tubes (or the tyre) standing for a clearance part of core's model. */
export function tubesOfPart(part: string, side: Side, split: boolean): string[] {
  switch (part) {
    case 'upperArm':
      return split ? [`${side}.upper.front`, `${side}.upper.rear`] : [`upperMember.${side}`];
    case 'lowerArm':
      return split ? [`${side}.lower.front`, `${side}.lower.rear`] : [`lowerMember.${side}`];
    case 'upperRail':
      return [`frame.${side}.upperRail`];
    case 'lowerRail':
      return [`frame.${side}.lowerRail`];
    case 'tieRod':
      return [`${side}.tieRod`];
    case 'steeringArm':
      return [`${side}.steeringArm`];
    case 'crankArm':
      return [`crank.${side}`];
    case 'rack':
      return ['rack'];
    default:
      return [];
  }
}

/**
 * A solver for one design and contact mode, warm-started from pose to pose, with core's
 * analyser on its mechanism. A second solver finds the reference pose of the toe error
 * (zero lean and travel, same handlebar). Rebuilt when the design or the contact changes.
 */
export class PoseSession {
  readonly design: ResolvedDesign;
  readonly contact: Contact;
  readonly layout: MechanismLayout;
  private readonly solver: PoseSolver;
  private readonly analyser: PoseAnalyser;
  private readonly reference: PoseSolver;
  /** Neighbours along the handlebar (local steering ratio) and straight ahead (front lift). */
  private readonly ratio: { solver: PoseSolver; analyser: PoseAnalyser; warm: boolean };
  private readonly straight: { solver: PoseSolver; analyser: PoseAnalyser; warm: boolean };
  private hasGood = false;
  private hasGoodReference = false;

  constructor(design: ResolvedDesign, contact: Contact) {
    this.design = design;
    this.contact = contact;
    const mode: PoseMode = { contact, steerBy: 'handlebar' };
    const graph = buildMechanism(design, mode);
    this.layout = layoutOf(graph);
    this.solver = new PoseSolver(graph);
    this.analyser = new PoseAnalyser(design, this.solver.mechanism, { findings: true });
    this.reference = new PoseSolver(buildMechanism(design, mode));
    const aux = () => {
      const solver = new PoseSolver(buildMechanism(design, mode));
      return { solver, analyser: new PoseAnalyser(design, solver.mechanism, { findings: false }), warm: false };
    };
    this.ratio = aux();
    this.straight = aux();
  }

  /** Solve and analyse a neighbouring pose with an auxiliary solver; null when it does not close. */
  private auxAt(aux: { solver: PoseSolver; analyser: PoseAnalyser; warm: boolean }, inputs: PoseInputs): PoseAnalysis | null {
    const r = aux.solver.solve(inputs, aux.warm);
    if (r.status !== 'converged') return null;
    aux.warm = true;
    return aux.analyser.analyse(r);
  }

  /**
   * The two measures that need neighbouring poses, the way core's solveSinglePose finds them:
   * the local steering ratio from the handlebar a quarter degree either side, the front lift
   * against straight ahead at the same lean and travel.
   */
  private neighbours(inputs: PoseInputs, a: PoseAnalysis): PoseAnalysis {
    const h = inputs.handlebarDeg;
    const lo = this.auxAt(this.ratio, { ...inputs, handlebarDeg: h - LOCAL_RATIO_STEP_DEG });
    const hi = this.auxAt(this.ratio, { ...inputs, handlebarDeg: h + LOCAL_RATIO_STEP_DEG });
    const steering = { ...a.steering };
    if (lo && hi) {
      steering.localRatio = localSteeringRatio(lo.steering.handlebarDeg, lo.steering.meanWheelDeg, hi.steering.handlebarDeg, hi.steering.meanWheelDeg);
      steering.localRatioReason = steering.localRatio === null ? 'the road wheels did not turn between the neighbouring poses' : undefined;
    } else {
      steering.localRatioReason = `a pose ${LOCAL_RATIO_STEP_DEG} deg of handlebar either side could not be solved`;
    }
    const straight = h === 0 ? a : this.auxAt(this.straight, { ...inputs, handlebarDeg: 0 });
    const suspension = { ...a.suspension };
    if (straight) {
      suspension.frontLiftMm = frontLift(a, straight);
      suspension.frontLiftReason = undefined;
    } else {
      suspension.frontLiftReason = 'the straight-ahead pose at this lean and travel could not be solved';
    }
    return { ...a, steering, suspension };
  }

  private toeReference(pose: PoseUi): ToeReference {
    const inputs = toCoreInputs({ ...pose, leanDeg: 0, heaveMm: 0, travelLeftMm: 0, travelRightMm: 0 });
    const r = this.reference.solve(inputs, this.hasGoodReference);
    if (!r.reached) {
      return { reason: `the reference pose (zero lean and travel, handlebar ${pose.handlebarDeg} deg) could not be solved: ${r.message}` };
    }
    this.hasGoodReference = true;
    const w = takeSnapshot(this.reference.mechanism).wheels;
    return { leftDeg: w.left.toeDeg, rightDeg: w.right.toeDeg };
  }

  /**
   * Solve a pose. With `detail` (default) the measures that need neighbouring poses are found
   * too (three more solves); playback leaves them out to keep each frame short.
   */
  solve(pose: PoseUi, detail = true): PoseOutcome {
    const t0 = performance.now();
    const inputs = toCoreInputs(pose);
    const result = this.solver.solve(inputs, this.hasGood);
    const reached = result.reached;
    let analysis: PoseAnalysis | null = null;
    if (reached) {
      this.hasGood = true;
      const moved = pose.leanDeg !== 0 || inputs.heaveMm !== 0 || inputs.travelLeftMm !== 0 || inputs.travelRightMm !== 0;
      // At zero lean and travel the pose is its own reference (toe error zero by definition).
      const ref = moved ? this.toeReference(pose) : undefined;
      analysis = this.analyser.analyse(result, ref);
      if (!moved) analysis = withOwnReference(analysis);
      if (detail) analysis = this.neighbours(inputs, analysis);
    }
    // After a failure the solver holds its last good pose; draw that one (never a broken one).
    // With none yet, draw the hardpoints as entered.
    let shown: PoseOutcome['shown'] = reached ? 'requested' : 'last-good';
    const m = this.solver.mechanism;
    if (!reached && !this.hasGood) {
      m.applyInputs(zeroInputs());
      m.resetToDesign();
      shown = 'as-entered';
    }
    const snapshot = takeSnapshot(m);
    const solveMs = performance.now() - t0;
    return describePose(this.design, this.layout, {
      status: result.status,
      reached,
      message: result.message,
      culprit: result.culprit,
      snapshot,
      shown,
      analysis,
      iterations: result.iterations,
      residualMm: result.residualMm,
      solveMs,
    });
  }
}

/** The analysis at zero lean and travel with the toe error its own reference gives: zero. */
function withOwnReference(a: PoseAnalysis): PoseAnalysis {
  return { ...a, toeError: { leftDeg: 0, rightDeg: 0 }, worst: { ...a.worst, toeErrorDeg: 0 } };
}

interface Raw {
  status: SolveStatus;
  reached: boolean;
  message: string;
  culprit: string | undefined;
  snapshot: PoseSnapshot;
  shown: PoseOutcome['shown'];
  analysis: PoseAnalysis | null;
  iterations: number;
  residualMm: number | null;
  solveMs: number;
}

const row = (id: string, label: string, unit: Unit, digits: number, cells: ReadoutCell[], extra: Partial<ReadoutRow> = {}): ReadoutRow => ({
  id,
  label,
  unit,
  digits,
  cells,
  ...extra,
});
const c = (value: number | null | undefined, severity?: Severity): ReadoutCell => (severity ? { value: value ?? null, severity } : { value: value ?? null });

function describePose(design: ResolvedDesign, layout: MechanismLayout, r: Raw): PoseOutcome {
  const alerts: Alert[] = [];
  const parts: Record<string, Severity> = {};
  const mark = (key: string, s: Severity) => {
    parts[key] = worse(parts[key] ?? 'none', s);
  };
  if (!r.reached) {
    alerts.push({ severity: 'broken', text: `The linkage cannot reach this pose: ${r.message}.` });
    const blamed = r.culprit ? layout.constraints.find((k) => k.label === r.culprit) : undefined;
    if (blamed) parts[`constraint.${blamed.id}`] = 'broken';
  } else if (r.status === 'singular') {
    alerts.push({ severity: 'close', text: `Near a dead centre: ${r.message}.` });
  }
  const a = r.analysis;
  const tol = design.tolerances;
  const tables: ReadoutTable[] = [];
  if (a) {
    const split = design.frontEnd.kind === 'splitWishbones';
    const L = a.wheels.left;
    const R = a.wheels.right;
    const both = (f: (w: typeof L, s: Side) => number | null | undefined, judge?: (v: number) => Verdict): ReadoutCell[] =>
      (['left', 'right'] as const).map((s) => {
        const v = f(s === 'left' ? L : R, s);
        return c(v, judge && v !== null && v !== undefined ? verdictSeverity(judge(v)) : undefined);
      });
    const toeJudge = (v: number) => judgeAbs(v, tol.toeErrorDeg);
    const slipJudge = (v: number) => judgeAbs(v, tol.slipDeg);
    for (const side of ['left', 'right'] as const) mark(`tyre.${side}`, verdictSeverity(slipJudge(a.slip[side].slipDeg)));

    const toeErr = (s: Side) => (s === 'left' ? a.toeError.leftDeg : a.toeError.rightDeg);
    tables.push({
      id: 'wheel',
      title: 'Per wheel',
      columns: ['Left', 'Right'],
      rows: [
        row('toe', 'Toe (toe-in +)', 'deg', 3, both((w) => w.toeDeg)),
        row('toeError', 'Toe error (lean + bump steer)', 'deg', 3, both((_w, s) => toeErr(s), toeJudge), {
          hint: `road-wheel angle change from zero lean and travel at the same handlebar; tolerance ${tol.toeErrorDeg} deg`,
          ...(a.toeError.reason ? { missing: a.toeError.reason } : {}),
        }),
        row('slip', 'Slip angle (scrub)', 'deg', 2, both((_w, s) => a.slip[s].slipDeg, slipJudge), { hint: `ISO 8855 slip angle; tolerance ${tol.slipDeg} deg` }),
        row('scrub', 'Sideways scrub', 'm/km', 1, both((_w, s) => a.slip[s].scrubMPerKm)),
        row('steer', 'Road-wheel angle (left +)', 'deg', 2, both((w) => w.steerDeg)),
        row('camberGround', 'Camber to ground (top out +)', 'deg', 2, both((w) => w.camberDeg)),
        row('camberFrame', 'Camber to frame', 'deg', 2, both((w) => w.camberToFrameDeg)),
        row('caster', 'Caster (top rearward +)', 'deg', 2, both((w) => w.casterDeg)),
        row('kpi', 'Kingpin inclination (top in +)', 'deg', 2, both((w) => w.kpiDeg)),
        row('casterFrame', 'Caster to frame', 'deg', 2, both((w) => w.casterToFrameDeg)),
        row('kpiFrame', 'KPI to frame', 'deg', 2, both((w) => w.kpiToFrameDeg)),
        row('trail', 'Mechanical trail', 'mm', 1, both((w) => w.trailMm)),
        row('scrubRadius', 'Scrub radius (axis inboard +)', 'mm', 1, both((w) => w.scrubRadiusMm)),
        row('casterOffset', 'Caster offset at centre', 'mm', 1, both((w) => w.casterOffsetMm)),
        row('kingpinOffset', 'Kingpin offset at centre', 'mm', 1, both((w) => w.kingpinOffsetAtCentreMm)),
        row('spindle', 'Spindle length', 'mm', 1, both((w) => w.spindleLengthMm)),
        row('travel', 'Wheel travel (bump +)', 'mm', 1, both((w) => w.travelMm)),
        row('centreX', 'Wheel centre x', 'mm', 1, both((w) => w.centreMm.x)),
        row('centreY', 'Wheel centre y', 'mm', 1, both((w) => w.centreMm.y)),
        row('centreZ', 'Wheel centre z', 'mm', 1, both((w) => w.centreMm.z)),
        row('contactX', 'Contact patch x', 'mm', 1, both((w) => w.contactPatchMm.x)),
        row('contactY', 'Contact patch y', 'mm', 1, both((w) => w.contactPatchMm.y)),
        row('contactZ', 'Contact patch z', 'mm', 1, both((w) => w.contactPatchMm.z)),
        row('armTransmission', 'Steering arm transmission', 'deg', 1, both((_w, s) => a.steering.steeringArmTransmissionDeg[s], (v) => judgeTransmission(v)), {
          hint: '90 is ideal, 0 is dead centre',
        }),
        row('linkTransmission', 'Linkage transmission', 'deg', 1, both((_w, s) => a.steering.linkageTransmissionDeg[s], (v) => judgeTransmission(v))),
        row('icY', 'Instant centre y', 'mm', 0, both((_w, s) => a.suspension[s].instantCentreMm?.y)),
        row('icZ', 'Instant centre z', 'mm', 0, both((_w, s) => a.suspension[s].instantCentreMm?.z)),
        row('swingArm', 'Front-view swing arm', 'mm', 0, both((_w, s) => a.suspension[s].swingArmMm)),
        row('motionRatio', 'Spring motion ratio', 'mm/mm', 3, both((_w, s) => a.suspension[s].motionRatio), design.spring ? {} : { missing: 'no spring in the design' }),
        row('tieRodSpin', 'Tie rod spin about its axis', 'deg', 1, both((_w, s) => a.tieRodSpinDeg[s])),
      ],
    });

    // Joints: articulation against rating, judged by core.
    const jointRows: ReadoutRow[] = [];
    for (const name of ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner']) {
      const js = a.joints.filter((j) => j.joint === name);
      const bySide = (s: Side) => js.find((j) => j.side === s);
      const cells = (['left', 'right'] as const).map((s) => {
        const j = bySide(s);
        if (!j) return c(null);
        const sev = verdictSeverity(judgeJoint(j.articulationDeg, j.ratedDeg, tol));
        mark(`joint.${JOINT_POINT[name](s)}`, sev);
        return c(j.articulationDeg, sev);
      });
      const rated = bySide('left')?.ratedDeg ?? bySide('right')?.ratedDeg;
      jointRows.push(row(`joint-${name}`, `${JOINT_LABEL[name]} (rated ${rated} deg)`, 'deg', 1, cells, { hint: `articulation; the margin required is ${tol.jointMarginDeg} deg` }));
      jointRows.push(row(`margin-${name}`, '  margin', 'deg', 1, (['left', 'right'] as const).map((s) => c(bySide(s)?.marginDeg))));
    }
    tables.push({ id: 'joints', title: 'Joint articulation', columns: ['Left', 'Right'], rows: jointRows });

    // Clearances, judged by core; the parts concerned take the colour.
    const pairIds = [...new Set(a.clearances.map((k) => k.pair))];
    const clearRows = pairIds.map((pair) => {
      const [pa, pb] = pair.split('-');
      const cells = (['left', 'right'] as const).map((s) => {
        const k = a.clearances.find((x) => x.pair === pair && x.side === s);
        if (!k) return c(null);
        const sev = verdictSeverity(judgeClearance(k.distanceMm, tol));
        if (sev !== 'within') {
          for (const part of [pa, pb]) {
            if (part === 'tyre') mark(`tyre.${s}`, sev);
            for (const t of tubesOfPart(part, s, split)) mark(`tube.${t}`, sev);
          }
        }
        return c(k.distanceMm, sev);
      });
      return row(`clear-${pair}`, `${PART_LABEL[pa] ?? pa} to ${PART_LABEL[pb] ?? pb}`, 'mm', 1, cells);
    });
    tables.push({ id: 'clearance', title: `Clearances (required ${tol.clearanceMm} mm)`, columns: ['Left', 'Right'], rows: clearRows });
    for (const s of ['left', 'right'] as const) {
      if (judgeTransmission(a.steering.steeringArmTransmissionDeg[s]) === 'fail') mark(`tube.${s}.steeringArm`, 'over');
      if (judgeTransmission(a.steering.linkageTransmissionDeg[s]) === 'fail') mark(`tube.crank.${s}`, 'over');
    }

    const st = a.steering;
    const ack = a.ackermann;
    const tc = a.turningCircle;
    const sp = a.suspension;
    tables.push({
      id: 'overall',
      title: 'Steering and vehicle',
      columns: ['Value'],
      rows: [
        row('lean', 'Lean (right side down +)', 'deg', 2, [c(a.inputs.leanDeg)]),
        row('handlebar', 'Handlebar (left +)', 'deg', 2, [c(st.handlebarDeg)]),
        row('frameHeave', 'Frame heave', 'mm', 1, [c(a.frameHeaveMm)]),
        row('meanWheel', 'Mean road-wheel angle', 'deg', 2, [c(st.meanWheelDeg)]),
        row('ratio', 'Overall steering ratio', 'deg/deg', 2, [c(st.overallRatio)], st.reason ? { missing: st.reason } : {}),
        row('localRatio', 'Local steering ratio', 'deg/deg', 2, [c(st.localRatio)], { missing: st.localRatioReason === NO_NEIGHBOURS ? 'not found while playing' : (st.localRatioReason ?? '—') }),
        row('ackPercent', 'Ackermann (adopted: angle difference)', '%', 1, [c(ack.percent)], ack.reason ? { missing: ack.reason } : { hint: '100 (inner − outer) / (inner − ideal outer)' }),
        row('ackPercentCot', 'Ackermann (cotangent form)', '%', 1, [c(ack.percentCot)], ack.reason ? { missing: ack.reason } : {}),
        row('ackInner', 'Inner wheel angle', 'deg', 2, [c(ack.innerDeg)], ack.reason ? { missing: ack.reason } : {}),
        row('ackOuter', 'Outer wheel angle', 'deg', 2, [c(ack.outerDeg)], ack.reason ? { missing: ack.reason } : {}),
        row('ackIdeal', 'Ideal outer angle', 'deg', 2, [c(ack.idealOuterDeg)], ack.reason ? { missing: ack.reason } : {}),
        row('ackError', 'Ackermann error (outer − ideal)', 'deg', 2, [c(ack.errorDeg, ack.errorDeg === null ? undefined : verdictSeverity(judgeAbs(ack.errorDeg, tol.toeErrorDeg)))], ack.reason ? { missing: ack.reason } : {}),
        row('turnCentreX', 'Turn centre x', 'mm', 0, [c(a.slip.turnCentreMm?.x)], a.slip.reason ? { missing: a.slip.reason } : {}),
        row('turnCentreY', 'Turn centre y', 'mm', 0, [c(a.slip.turnCentreMm?.y)], a.slip.reason ? { missing: a.slip.reason } : {}),
        row('turnRadius', 'Turn radius', 'mm', 0, [c(a.slip.turnRadiusMm)], a.slip.reason ? { missing: a.slip.reason } : {}),
        row('turningDiameter', 'Turning diameter (SAE J695)', 'mm', 0, [c(tc.turningDiameterMm)], tc.reason ? { missing: tc.reason } : {}),
        row('kerbToKerb', 'Kerb to kerb', 'mm', 0, [c(tc.kerbToKerbMm)], tc.reason ? { missing: tc.reason } : {}),
        row('wallToWall', `Wall to wall${tc.wallToWallFrom ? ` (${tc.wallToWallFrom})` : ''}`, 'mm', 0, [c(tc.wallToWallMm)], tc.reason ? { missing: tc.reason } : {}),
        row('rollCentreY', 'Roll centre y', 'mm', 0, [c(sp.rollCentreMm?.y)], sp.reason ? { missing: sp.reason } : {}),
        row('rollCentreZ', 'Roll centre height', 'mm', 0, [c(sp.rollCentreMm?.z)], sp.reason ? { missing: sp.reason } : {}),
        row('frontLift', 'Front lift with steer', 'mm', 1, [c(sp.frontLiftMm)], { missing: sp.frontLiftReason === NO_LIFT_REFERENCE ? 'not found while playing' : (sp.frontLiftReason ?? '—') }),
        row('dragLink', 'Drag link transmission', 'deg', 1, [c(st.dragLinkTransmissionDeg)], st.dragLinkTransmissionDeg === null ? { missing: 'no drag link' } : {}),
        row('worstSlip', 'Worst slip', 'deg', 2, [c(a.worst.slipDeg, verdictSeverity(judgeAbs(a.worst.slipDeg, tol.slipDeg)))]),
        row('worstJoint', 'Least joint margin', 'deg', 1, [c(Number.isFinite(a.worst.jointMarginDeg) ? a.worst.jointMarginDeg : null)]),
        row('worstClearance', 'Least clearance', 'mm', 1, [c(Number.isFinite(a.worst.clearanceMm) ? a.worst.clearanceMm : null)]),
      ],
    });
    for (const f of a.findings) {
      const m = /^(fail|warning): (.*)$/.exec(f);
      alerts.push({ severity: m?.[1] === 'fail' ? 'over' : 'close', text: m ? `${m[2][0].toUpperCase()}${m[2].slice(1)}` : f });
    }
  }
  tables.push({
    id: 'solver',
    title: 'Solver',
    columns: ['Value'],
    rows: [
      row('residual', 'Largest residual', 'mm', 12, [c(r.residualMm)]),
      row('iterations', 'Iterations', '', 0, [c(r.iterations)]),
      row('solveMs', 'Solve and analysis time', '', 2, [c(r.solveMs)], { hint: 'milliseconds, this pose' }),
    ],
  });
  return {
    status: r.status,
    reached: r.reached,
    message: r.message,
    ...(r.culprit ? { culprit: r.culprit } : {}),
    snapshot: r.snapshot,
    shown: r.shown,
    analysis: a,
    poseStatus: a ? a.status : r.reached ? null : 'cannot-assemble',
    tables,
    alerts,
    parts,
    iterations: r.iterations,
    residualMm: r.residualMm,
    solveMs: r.solveMs,
  };
}

/** The outcome shown while the design itself is invalid (nothing is solved). */
export function invalidDesignOutcome(issueCount: number): PoseOutcome {
  const message = `the design has ${issueCount} error${issueCount === 1 ? '' : 's'}; fix the marked fields`;
  return {
    status: 'invalid-design',
    reached: false,
    message,
    snapshot: null,
    shown: 'none',
    analysis: null,
    poseStatus: null,
    tables: [],
    alerts: [{ severity: 'broken', text: `Not solved: ${message}.` }],
    parts: {},
    iterations: 0,
    residualMm: null,
    solveMs: 0,
  };
}

/** Looks a readout up: table, row id and column (0 = left or the value, 1 = right). */
export function readout(o: PoseOutcome, rowId: string, column = 0): number | null {
  for (const t of o.tables) {
    const r = t.rows.find((x) => x.id === rowId);
    if (r) return r.cells[column]?.value ?? null;
  }
  return null;
}
