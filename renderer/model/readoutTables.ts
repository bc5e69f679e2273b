/**
 * Core's measures of one pose as the readout tables, alerts and part conditions the panels and
 * the viewport show. Every verdict is core's (tolerance.ts, judged by the engine); this module
 * picks numbers and words out of the analysis and never judges anything itself.
 */
import type { ResolvedDesign, Side } from '../../core/design/types';
import type { PoseAnalysis, WheelAlignment } from '../../core/analysis/analysisTypes';
import { NOT_WHILE_PLAYING } from '../../core/analysis/PoseEngine';
import { judgeClearance, judgeJoint, judgeLeanStop, judgeRatioChange, judgeSelfSteer, judgeSlip, judgeTransmission, type Verdict } from '../../core/analysis/tolerance';
import { JOINT_WORDS, PART_WORDS } from '../../core/analysis/words';
import type { SolveStatus } from '../../core/solver/PoseSolver';
import { drawingPartsFor, type ClearancePartName, type DrawingCheck, type DrawingLayout, type DrawingPointRef } from '../../core/mechanism/drawingLayout';
import type { FindingSubject } from '../../core/analysis/poseVerdict';
import type { PoseSnapshot } from '../../core/analysis/poseSnapshot';
import { worse, type Severity } from './severity';
import type { Alert, MechanismLayout, PoseOutcome, ReadoutCell, ReadoutRow, ReadoutTable, Unit } from './analysisAdapter';
import { objectiveOfPoseFinding } from './findings';

const capitalise = (s: string) => (s ? `${s[0].toUpperCase()}${s.slice(1)}` : s);

/** Playback skips the poses beside this one; say so briefly. */
const playingWords = (reason: string) => (reason === NOT_WHILE_PLAYING ? 'not found while playing' : reason);

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

/** What every table builder shares: the analysis, the tolerances and the part marker. */
interface TableContext {
  design: ResolvedDesign;
  a: PoseAnalysis;
  tol: ResolvedDesign['tolerances'];
  /** Colour the drawn parts that stand for a check (the drawing layout says which). */
  markCheck: (check: DrawingCheck, s: Severity) => void;
}

const SIDES = ['left', 'right'] as const;

/** Both wheels' values of a measure, each judged by core's judge when one is given. */
function bothSides(a: PoseAnalysis, f: (w: WheelAlignment, s: Side) => number | null | undefined, judge?: (v: number) => Verdict): ReadoutCell[] {
  return SIDES.map((s) => {
    const v = f(a.wheels[s], s);
    return c(v, judge && v !== null && v !== undefined ? judge(v) : undefined);
  });
}

function wheelTable({ design, a, tol, markCheck }: TableContext): ReadoutTable {
  const both = (f: (w: WheelAlignment, s: Side) => number | null | undefined, judge?: (v: number) => Verdict) => bothSides(a, f, judge);
  const slipJudge = (v: number) => judgeSlip(v, tol);
  for (const side of SIDES) markCheck({ kind: 'clearance', part: 'tyre', side }, slipJudge(a.slip[side].slipDeg));
  return {
    id: 'wheel',
    title: 'Per wheel',
    columns: ['Left', 'Right'],
    rows: [
      row('toe', 'Toe (toe-in +)', 'deg', 3, both((w) => w.toeDeg)),
      row('selfSteer', 'Self-steer (lean and bump steer, left +)', 'deg', 3, both((_w, s) => a.selfSteer[`${s}Deg`], (v) => judgeSelfSteer(v, tol)), {
        hint: `road-wheel angle at zero handlebar here, minus upright; tolerance ${tol.selfSteerDeg} deg`,
        ...(a.selfSteer.reason ? { missing: playingWords(a.selfSteer.reason) } : {}),
      }),
      row('slip', 'Slip angle (toe mismatch)', 'deg', 2, both((_w, s) => a.slip[s].slipDeg, slipJudge), { hint: `ISO 8855 slip angle about the common turn centre; tolerance ${tol.slipDeg} deg` }),
      row('scrub', 'Sideways scrub', 'm/km', 1, both((_w, s) => a.slip[s].scrubMPerKm)),
      row('steer', 'Road-wheel angle (left +)', 'deg', 2, both((w) => w.steerDeg)),
      row('camberGround', 'Camber to ground (top out +)', 'deg', 2, both((w) => w.camberDeg)),
      row('camberFrame', 'Camber to frame', 'deg', 2, both((w) => w.camberToFrameDeg)),
      row('camberFront', 'Camber, front-view projection', 'deg', 2, both((w) => w.camberFrontViewDeg), { hint: 'the wheel plane as a front-view drawing shows it; the camber rows above are the plane\'s true inclination' }),
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
  };
}

/** Joints: articulation against rating, judged by core; the joints drawn take the colour. */
function jointTable({ a, tol, markCheck }: TableContext): ReadoutTable {
  const rows: ReadoutRow[] = [];
  for (const name of ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const) {
    const bySide = (s: Side) => a.joints.find((j) => j.joint === name && j.side === s);
    const cells = SIDES.map((s) => {
      const j = bySide(s);
      if (!j) return c(null);
      const sev = judgeJoint(j.articulationDeg, j.ratedDeg, tol);
      markCheck({ kind: 'joint', joint: name, side: s }, sev);
      return c(j.articulationDeg, sev);
    });
    const rated = bySide('left')?.ratedDeg ?? bySide('right')?.ratedDeg;
    rows.push(row(`joint-${name}`, `${capitalise(JOINT_WORDS[name])} (rated ${rated} deg)`, 'deg', 1, cells, { hint: `articulation; the margin required is ${tol.jointMarginDeg} deg` }));
    rows.push(row(`margin-${name}`, '  margin', 'deg', 1, SIDES.map((s) => c(bySide(s)?.marginDeg))));
  }
  return { id: 'joints', title: 'Joint articulation', columns: ['Left', 'Right'], rows };
}

/** Clearances, judged by core; the parts concerned take the colour. */
function clearanceTable({ a, tol, markCheck }: TableContext): ReadoutTable {
  const pairIds = [...new Set(a.clearances.map((k) => k.pair))];
  const rows = pairIds.map((pair) => {
    const [pa, pb] = pair.split('-') as [keyof typeof PART_WORDS, keyof typeof PART_WORDS];
    const cells = SIDES.map((s) => {
      const k = a.clearances.find((x) => x.pair === pair && x.side === s);
      if (!k) return c(null);
      const sev = judgeClearance(k.distanceMm, tol);
      if (sev !== 'within') for (const part of [pa, pb]) markCheck({ kind: 'clearance', part, side: s }, sev);
      return c(k.distanceMm, sev);
    });
    return row(`clear-${pair}`, capitalise(`${PART_WORDS[pa] ?? pa} to ${PART_WORDS[pb] ?? pb}`), 'mm', 1, cells);
  });
  for (const s of SIDES) {
    if (judgeTransmission(a.steering.steeringArmTransmissionDeg[s]) === 'over') markCheck({ kind: 'transmission', link: 'steeringArm', side: s }, 'over');
    if (judgeTransmission(a.steering.linkageTransmissionDeg[s]) === 'over') markCheck({ kind: 'transmission', link: 'linkage', side: s }, 'over');
  }
  return { id: 'clearance', title: `Clearances (required ${tol.clearanceMm} mm)`, columns: ['Left', 'Right'], rows };
}

/** A lean linkage's rocker and spring (core's PoseAnalysis.leanLinkage), judged by core's stop verdict; none without one. */
function leanLinkageRows(a: PoseAnalysis, design: ResolvedDesign): ReadoutRow[] {
  const l = a.leanLinkage;
  const stop = design.leanLinkage?.rocker.stopDeg;
  if (!l || stop === undefined) return [];
  return [
    row('rocker', 'Rocker angle (to its carrier)', 'deg', 2, [c(l.rockerDeg, judgeLeanStop(Math.abs(l.rockerDeg), stop))], { hint: `right-handed about the rocker axis; stops at ±${stop} deg` }),
    row('leanStopMargin', 'Lean stop margin', 'deg', 2, [c(l.stopMarginDeg)], { hint: 'stop − |rocker angle|' }),
    row('springLength', 'Spring length (lean linkage)', 'mm', 1, [c(l.springLengthMm)], { hint: 'between the frame and carrier mounts; lean holds it' }),
  ];
}

/** A leaning rear pair's wheels and core's four-wheel turn centre; none for another rear. */
function rearPairRows(a: PoseAnalysis, tol: ResolvedDesign['tolerances']): ReadoutRow[] {
  const r = a.rear;
  if (!r) return [];
  const t = r.turnCentre;
  const none = t.reason ? { missing: t.reason } : {};
  return [
    row('rearCamberLeft', 'Rear camber to ground, left (top out +)', 'deg', 2, [c(r.left.camberDeg)]),
    row('rearCamberRight', 'Rear camber to ground, right (top out +)', 'deg', 2, [c(r.right.camberDeg)]),
    row('rearToeLeft', 'Rear toe, left (toe-in +)', 'deg', 2, [c(r.left.toeDeg)]),
    row('rearToeRight', 'Rear toe, right (toe-in +)', 'deg', 2, [c(r.right.toeDeg)]),
    row('fourWheelCentreX', 'Four-wheel turn centre x', 'mm', 0, [c(t.centreMm?.x)], { ...none, hint: 'least-squares point of the four wheels\u2019 axis lines' }),
    row('fourWheelCentreY', 'Four-wheel turn centre y', 'mm', 0, [c(t.centreMm?.y)], none),
    row('fourWheelSlip', 'Worst slip of the four wheels', 'deg', 2, [c(t.worstSlipDeg, t.worstSlipDeg === null ? undefined : judgeSlip(t.worstSlipDeg, tol))], {
      ...none,
      hint: `ISO 8855 slip to the four-wheel turn centre; tolerance ${tol.slipDeg} deg`,
    }),
  ];
}

function overallTable({ a, tol, design }: TableContext): ReadoutTable {
  const st = a.steering;
  const ack = a.ackermann;
  const tc = a.turningCircle;
  const sp = a.suspension;
  return {
    id: 'overall',
    title: 'Steering and vehicle',
    columns: ['Value'],
    rows: [
      row('lean', 'Lean (right side down +)', 'deg', 2, [c(a.inputs.leanDeg)]),
      row('handlebar', 'Handlebar (left +)', 'deg', 2, [c(st.handlebarDeg)]),
      row('frameHeave', 'Frame heave', 'mm', 1, [c(a.frameHeaveMm)]),
      ...leanLinkageRows(a, design),
      row('meanWheel', 'Mean road-wheel angle', 'deg', 2, [c(st.meanWheelDeg)]),
      row('ratio', 'Overall steering ratio', 'deg/deg', 2, [c(st.overallRatio)], st.reason ? { missing: st.reason } : {}),
      row('localRatio', 'Local steering ratio', 'deg/deg', 2, [c(st.localRatio)], { missing: playingWords(st.localRatioReason ?? '—') }),
      row('ratioChange', 'Steering-ratio change from upright', '%', 1, [c(st.ratioChangePct, st.ratioChangePct === null ? undefined : judgeRatioChange(st.ratioChangePct, tol))], {
        missing: playingWords(st.ratioChangeReason ?? '—'),
        hint: `road-wheel degrees per handlebar degree here against upright at the same handlebar; tolerance ${tol.ratioChangePct} %`,
      }),
      row('ackPercent', 'Ackermann (adopted: angle difference)', '%', 1, [c(ack.percent)], ack.reason ? { missing: ack.reason } : { hint: '100 (inner − outer) / (inner − ideal outer)' }),
      row('ackPercentCot', 'Ackermann (cotangent form)', '%', 1, [c(ack.percentCot)], ack.reason ? { missing: ack.reason } : {}),
      row('ackInner', 'Inner wheel angle', 'deg', 2, [c(ack.innerDeg)], ack.reason ? { missing: ack.reason } : {}),
      row('ackOuter', 'Outer wheel angle', 'deg', 2, [c(ack.outerDeg)], ack.reason ? { missing: ack.reason } : {}),
      row('ackIdeal', 'Ideal outer angle', 'deg', 2, [c(ack.idealOuterDeg)], ack.reason ? { missing: ack.reason } : {}),
      row('ackError', 'Ackermann error (outer − ideal)', 'deg', 2, [c(ack.errorDeg)], ack.reason ? { missing: ack.reason } : { hint: 'toe mismatch in the plan view; the slip angles carry the verdict' }),
      row('turnCentreX', 'Turn centre x', 'mm', 0, [c(a.slip.turnCentreMm?.x)], a.slip.reason ? { missing: a.slip.reason } : {}),
      row('turnCentreY', 'Turn centre y', 'mm', 0, [c(a.slip.turnCentreMm?.y)], a.slip.reason ? { missing: a.slip.reason } : {}),
      row('turnRadius', 'Turn radius (rear axle centre)', 'mm', 0, [c(a.slip.turnRadiusMm)], a.slip.reason ? { missing: a.slip.reason } : {}),
      ...rearPairRows(a, tol),
      row('turningDiameter', 'Turning diameter (SAE J695, outer wheel)', 'mm', 0, [c(tc.turningDiameterMm)], tc.reason ? { missing: tc.reason } : {}),
      row('kerbToKerb', 'Kerb to kerb', 'mm', 0, [c(tc.kerbToKerbMm)], tc.reason ? { missing: tc.reason } : {}),
      row('wallToWall', `Wall to wall${tc.wallToWallFrom ? ` (${tc.wallToWallFrom})` : ''}`, 'mm', 0, [c(tc.wallToWallMm)], tc.reason ? { missing: tc.reason } : {}),
      row('rollCentreY', 'Roll centre y', 'mm', 0, [c(sp.rollCentreMm?.y)], sp.reason ? { missing: sp.reason } : {}),
      row('rollCentreZ', 'Roll centre height', 'mm', 0, [c(sp.rollCentreMm?.z)], sp.reason ? { missing: sp.reason } : {}),
      row('frontLift', 'Front lift with steer', 'mm', 1, [c(sp.frontLiftMm)], { missing: playingWords(sp.frontLiftReason ?? '—') }),
      row('dragLink', 'Drag link transmission', 'deg', 1, [c(st.dragLinkTransmissionDeg)], st.dragLinkTransmissionDeg === null ? { missing: 'no drag link' } : {}),
      row('worstSlip', 'Worst slip', 'deg', 2, [c(a.worst.slipDeg, judgeSlip(a.worst.slipDeg, tol))]),
      row('worstJoint', 'Least joint margin', 'deg', 1, [c(Number.isFinite(a.worst.jointMarginDeg) ? a.worst.jointMarginDeg : null)]),
      row('worstClearance', 'Least clearance', 'mm', 1, [c(Number.isFinite(a.worst.clearanceMm) ? a.worst.clearanceMm : null)]),
    ],
  };
}

function solverTable(r: Raw): ReadoutTable {
  return {
    id: 'solver',
    title: 'Solver',
    columns: ['Value'],
    rows: [
      row('residual', 'Largest residual', 'mm', 12, [c(r.residualMm)]),
      row('iterations', 'Iterations', '', 0, [c(r.iterations)]),
      row('solveMs', 'Solve and analysis time', '', 2, [c(r.solveMs)], { hint: 'milliseconds, this pose' }),
    ],
  };
}

/** The drawing's checks that stand for what a finding is about. */
export function subjectChecks(subject: FindingSubject): DrawingCheck[] {
  switch (subject.kind) {
    case 'joint':
      return [{ kind: 'joint', joint: subject.joint, side: subject.side }];
    case 'clearance':
      // A clearance pair is named 'partA-partB' (core/analysis/clearance.ts).
      return subject.pair.split('-').map((part) => ({ kind: 'clearance', part: part as ClearancePartName, side: subject.side }));
    case 'wheel':
      return [{ kind: 'clearance', part: 'tyre', side: subject.side }];
    case 'deadCentre':
      return (['right', 'left'] as const).flatMap((side) => [
        { kind: 'transmission' as const, link: 'steeringArm' as const, side },
        { kind: 'transmission' as const, link: 'linkage' as const, side },
      ]);
    case 'steering':
      return [];
  }
}

const samePoint = (a: DrawingPointRef, b: DrawingPointRef) => 'point' in a && 'point' in b && a.point === b.point;

/**
 * A hardpoint that shows what a finding is about: a drawn joint among the parts of its checks,
 * else a joint at an end of one of its tubes; null when the drawing has none (the overall
 * steering ratio, a tyre alone).
 */
export function subjectHardpoint(drawing: DrawingLayout, subject: FindingSubject): string | null {
  const parts = new Set(subjectChecks(subject).flatMap((c) => drawingPartsFor(drawing, c)));
  const joint = drawing.joints.find((j) => parts.has(j.id));
  if (joint) return joint.hardpoint;
  for (const t of drawing.tubes) {
    if (!parts.has(t.id)) continue;
    const end = drawing.joints.find((j) => samePoint(j.at, t.a) || samePoint(j.at, t.b));
    if (end) return end.hardpoint;
  }
  return null;
}

export function describePose(design: ResolvedDesign, layout: MechanismLayout, drawing: DrawingLayout, r: Raw): PoseOutcome {
  const alerts: Alert[] = [];
  const parts: Record<string, Severity> = {};
  // The drawing (core's layout template) says which drawn parts stand for each check.
  const markCheck = (check: DrawingCheck, s: Severity) => {
    for (const id of drawingPartsFor(drawing, check)) parts[id] = worse(parts[id] ?? 'none', s);
  };
  if (!r.reached) {
    alerts.push({ severity: 'broken', text: `The linkage cannot reach this pose: ${r.message}.` });
    const blamed = r.culprit ? layout.constraints.find((k) => k.label === r.culprit) : undefined;
    if (blamed) markCheck({ kind: 'constraint', constraint: blamed.id }, 'broken');
  } else if (r.status === 'singular') {
    alerts.push({ severity: 'close', text: `Near a dead centre: ${r.message}.` });
  }
  const a = r.analysis;
  const tables: ReadoutTable[] = [];
  if (a) {
    const ctx: TableContext = { design, a, tol: design.tolerances, markCheck };
    tables.push(wheelTable(ctx), jointTable(ctx), clearanceTable(ctx), overallTable(ctx));
    a.findings.forEach((f, i) => {
      const m = /^(over|close): (.*)$/.exec(f);
      const subject = a.findingSubjects[i];
      const hardpoint = subject ? subjectHardpoint(drawing, subject) : null;
      const objective = objectiveOfPoseFinding(subject, f);
      alerts.push({ severity: m?.[1] === 'over' ? 'over' : 'close', text: m ? capitalise(m[2]) : f, ...(hardpoint ? { hardpoint } : {}), ...(objective ? { objective } : {}) });
    });
  }
  tables.push(solverTable(r));
  return {
    status: r.status,
    reached: r.reached,
    message: r.message,
    ...(r.culprit ? { culprit: r.culprit } : {}),
    snapshot: r.snapshot,
    shown: r.shown,
    analysis: a,
    poseStatus: a ? a.status : r.reached ? null : 'broken',
    tables,
    alerts,
    parts,
    iterations: r.iterations,
    residualMm: r.residualMm,
    solveMs: r.solveMs,
  };
}
