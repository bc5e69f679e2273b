/**
 * Sweep rows: every measure of a pose as one flat row, with a column list (name and unit)
 * that depends only on the design (its clearance pairs), so every row of a sweep lines up.
 * Values are numbers, strings or null; `notes` says why any value of the row is null.
 */

import type { ResolvedDesign, Side } from '../design/types';
import type { PoseAnalysis } from './analysisTypes';
import { clearancePairs } from './clearance';
import type { SweepCell } from './sweep';

export type CellValue = number | string | null;

export interface Column {
  name: string;
  unit: string;
  get(cell: SweepCell): CellValue;
}

type A = PoseAnalysis;

function measure(name: string, unit: string, get: (a: A) => CellValue): Column {
  return { name, unit, get: (c) => (c.ok ? get(c.analysis) : null) };
}

const SIDES: readonly Side[] = ['left', 'right'];
const JOINTS = ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'] as const;

/** Why values of a pose are null: "where: reason" for each part that gave a reason. */
export function nullReasons(a: A): string {
  const out: string[] = [];
  const add = (where: string, why: string | undefined) => {
    if (why) out.push(`${where}: ${why}`);
  };
  add('left wheel', a.wheels.left.reason);
  add('right wheel', a.wheels.right.reason);
  add('steering', a.steering.reason);
  add('local ratio', a.steering.localRatioReason);
  add('ackermann', a.ackermann.reason);
  add('slip', a.slip.reason);
  add('turning circle', a.turningCircle.reason);
  add('left suspension', a.suspension.left.reason);
  add('right suspension', a.suspension.right.reason);
  add('roll centre', a.suspension.reason);
  add('front lift', a.suspension.frontLiftReason);
  add('self-steer', a.selfSteer.reason);
  add('ratio change', a.steering.ratioChangeReason);
  return out.join('; ');
}

/** One wheel's columns: alignment, slip, suspension, transmission and tie-rod spin. */
function sideColumns(s: Side): Column[] {
  const w = (a: A) => a.wheels[s];
  return [
    measure(`${s}.steerDeg`, 'deg', (a) => w(a).steerDeg),
    measure(`${s}.toeDeg`, 'deg', (a) => w(a).toeDeg),
    measure(`${s}.selfSteerDeg`, 'deg', (a) => a.selfSteer[`${s}Deg`]),
    measure(`${s}.camberDeg`, 'deg', (a) => w(a).camberDeg),
    measure(`${s}.camberToFrameDeg`, 'deg', (a) => w(a).camberToFrameDeg),
    measure(`${s}.camberFrontViewDeg`, 'deg', (a) => w(a).camberFrontViewDeg),
    measure(`${s}.casterDeg`, 'deg', (a) => w(a).casterDeg),
    measure(`${s}.kpiDeg`, 'deg', (a) => w(a).kpiDeg),
    measure(`${s}.casterToFrameDeg`, 'deg', (a) => w(a).casterToFrameDeg),
    measure(`${s}.kpiToFrameDeg`, 'deg', (a) => w(a).kpiToFrameDeg),
    measure(`${s}.trailMm`, 'mm', (a) => w(a).trailMm),
    measure(`${s}.scrubRadiusMm`, 'mm', (a) => w(a).scrubRadiusMm),
    measure(`${s}.casterOffsetMm`, 'mm', (a) => w(a).casterOffsetMm),
    measure(`${s}.kingpinOffsetAtCentreMm`, 'mm', (a) => w(a).kingpinOffsetAtCentreMm),
    measure(`${s}.spindleLengthMm`, 'mm', (a) => w(a).spindleLengthMm),
    measure(`${s}.travelMm`, 'mm', (a) => w(a).travelMm),
    measure(`${s}.centreXMm`, 'mm', (a) => w(a).centreMm.x),
    measure(`${s}.centreYMm`, 'mm', (a) => w(a).centreMm.y),
    measure(`${s}.centreZMm`, 'mm', (a) => w(a).centreMm.z),
    measure(`${s}.contactXMm`, 'mm', (a) => w(a).contactPatchMm.x),
    measure(`${s}.contactYMm`, 'mm', (a) => w(a).contactPatchMm.y),
    measure(`${s}.contactZMm`, 'mm', (a) => w(a).contactPatchMm.z),
    measure(`${s}.slipDeg`, 'deg', (a) => a.slip[s].slipDeg),
    measure(`${s}.scrubMPerKm`, 'm/km', (a) => a.slip[s].scrubMPerKm),
    measure(`${s}.instantCentreYMm`, 'mm', (a) => a.suspension[s].instantCentreMm?.y ?? null),
    measure(`${s}.instantCentreZMm`, 'mm', (a) => a.suspension[s].instantCentreMm?.z ?? null),
    measure(`${s}.swingArmMm`, 'mm', (a) => a.suspension[s].swingArmMm),
    measure(`${s}.motionRatio`, '', (a) => a.suspension[s].motionRatio),
    measure(`${s}.steeringArmTransmissionDeg`, 'deg', (a) => a.steering.steeringArmTransmissionDeg[s]),
    measure(`${s}.linkageTransmissionDeg`, 'deg', (a) => a.steering.linkageTransmissionDeg[s]),
    measure(`${s}.tieRodSpinDeg`, 'deg', (a) => a.tieRodSpinDeg[s]),
  ];
}

export function poseColumns(design: ResolvedDesign): Column[] {
  const cols: Column[] = [
    { name: 'leanDeg', unit: 'deg', get: (c) => c.leanDeg },
    { name: 'handlebarDeg', unit: 'deg', get: (c) => c.handlebarDeg },
    { name: 'travelMm', unit: 'mm', get: (c) => c.travelMm },
    { name: 'status', unit: '', get: (c) => (c.ok ? c.analysis.status : 'broken') },
    { name: 'solverStatus', unit: '', get: (c) => (c.ok ? c.analysis.solver.status : c.failure.solver.status) },
    { name: 'residualMm', unit: 'mm', get: (c) => (c.ok ? c.analysis.solver.residualMm : c.failure.solver.residualMm) },
    measure('frameHeaveMm', 'mm', (a) => a.frameHeaveMm),
  ];
  for (const s of SIDES) cols.push(...sideColumns(s));
  cols.push(
    measure('steering.meanWheelDeg', 'deg', (a) => a.steering.meanWheelDeg),
    measure('steering.overallRatio', '', (a) => a.steering.overallRatio),
    measure('steering.localRatio', '', (a) => a.steering.localRatio),
    measure('steering.ratioChangePct', '%', (a) => a.steering.ratioChangePct),
    measure('steering.dragLinkTransmissionDeg', 'deg', (a) => a.steering.dragLinkTransmissionDeg),
    measure('ackermann.turn', '', (a) => a.ackermann.turn),
    measure('ackermann.innerDeg', 'deg', (a) => a.ackermann.innerDeg),
    measure('ackermann.outerDeg', 'deg', (a) => a.ackermann.outerDeg),
    measure('ackermann.idealOuterDeg', 'deg', (a) => a.ackermann.idealOuterDeg),
    measure('ackermann.errorDeg', 'deg', (a) => a.ackermann.errorDeg),
    measure('ackermann.percent', '%', (a) => a.ackermann.percent),
    measure('ackermann.percentCot', '%', (a) => a.ackermann.percentCot),
    measure('turnCentre.yMm', 'mm', (a) => a.slip.turnCentreMm?.y ?? null),
    measure('turnRadiusMm', 'mm', (a) => a.slip.turnRadiusMm),
    measure('turningCircle.turningDiameterMm', 'mm', (a) => a.turningCircle.turningDiameterMm),
    measure('turningCircle.kerbToKerbMm', 'mm', (a) => a.turningCircle.kerbToKerbMm),
    measure('turningCircle.wallToWallMm', 'mm', (a) => a.turningCircle.wallToWallMm),
    measure('rollCentre.yMm', 'mm', (a) => a.suspension.rollCentreMm?.y ?? null),
    measure('rollCentre.zMm', 'mm', (a) => a.suspension.rollCentreMm?.z ?? null),
    measure('frontLiftMm', 'mm', (a) => a.suspension.frontLiftMm),
  );
  // Joints and clearances keep a fixed order (PoseAnalyser writes them in this order).
  let k = 0;
  for (const s of SIDES) {
    for (const name of JOINTS) {
      const i = k++;
      cols.push(measure(`joint.${name}.${s}.articulationDeg`, 'deg', (a) => a.joints[i].articulationDeg));
      cols.push(measure(`joint.${name}.${s}.marginDeg`, 'deg', (a) => a.joints[i].marginDeg));
    }
  }
  clearancePairs(design).forEach((p, i) => cols.push(measure(`clearance.${p.id}.${p.side}.mm`, 'mm', (a) => a.clearances[i].distanceMm)));
  cols.push(
    measure('worst.slipDeg', 'deg', (a) => a.worst.slipDeg),
    measure('worst.selfSteerDeg', 'deg', (a) => a.worst.selfSteerDeg),
    measure('worst.jointMarginDeg', 'deg', (a) => a.worst.jointMarginDeg),
    measure('worst.clearanceMm', 'mm', (a) => a.worst.clearanceMm),
    measure('worst.transmissionDeg', 'deg', (a) => a.worst.transmissionDeg),
    { name: 'notes', unit: '', get: (c) => (c.ok ? nullReasons(c.analysis) : c.failure.solver.message) },
  );
  return cols;
}

export function cellRow(columns: readonly Column[], cell: SweepCell): CellValue[] {
  const out: CellValue[] = new Array(columns.length);
  for (let i = 0; i < columns.length; i++) out[i] = columns[i].get(cell);
  return out;
}
