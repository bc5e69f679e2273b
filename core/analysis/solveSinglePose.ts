/**
 * One pose for the `pose` command: the pose engine solves it from the design pose with
 * continuation (so the design's assembly branch is kept), measures and judges it, with the
 * relative measures from the poses beside it; this module reports the result as plain data
 * and as text.
 */

import type { ResolvedDesign } from '../design/types';
import type { PoseMode } from '../mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs } from '../mechanism/MechanismGraph';
import { xyz } from './vec3';
import type { SolveResult } from '../solver/PoseSolver';
import type { PoseSnapshot } from './poseSnapshot';
import type { PoseAnalysis, PoseInputsReport } from './analysisTypes';
import { PoseEngine, type EnginePose } from './PoseEngine';
import { solveRide, type RideFigures } from './ridePose';
import { buildMechanism } from '../mechanism/templates/buildMechanism';
import { PoseSolver } from '../solver/PoseSolver';
import { formatPoseAnalysis } from './formatPoseAnalysis';
import { ANALYSIS_DEFINITIONS } from './definitions';
import { formatLeanLinkage, leanLinkageMeasures, type LeanLinkageMeasures } from './leanLinkageMeasures';

export { LOCAL_RATIO_STEP_DEG } from './PoseEngine';

/**
 * A pose to solve: the front-end mode and the six inputs, as the report echoes them; with
 * `speedKmh` the lean is found from the balanced turn instead (ridePose.ts).
 */
export type PoseRequest = PoseMode & PoseInputsReport & { speedKmh?: number };

/** A request the design cannot take (the CLI exits 2 on it). */
export class PoseRequestError extends Error {}

/** Where the linkage stopped closing, for a pose past the steering limit. */
export interface LimitReport {
  /** The last pose reached on the way to the request: its handlebar and road-wheel angles. */
  handlebarDeg: number;
  leftWheelDeg: number;
  rightWheelDeg: number;
  /** The loop that would not close beyond it, in words. */
  loop: string | null;
  /**
   * Least misclosure at the requested inputs themselves: the largest loop gap a least-squares
   * fit of every loop leaves there (started from the design pose, no continuation), mm.
   */
  misclosureAtRequestMm: number | null;
}

export type RideReport = RideFigures;

export interface WheelReport {
  toeDeg: number;
  camberDeg: number;
  camberToFrameDeg: number;
  steerDeg: number;
  centreMm: { x: number; y: number; z: number };
  contactPointMm: { x: number; y: number; z: number };
}

export interface PoseReport {
  status: SolveResult['status'];
  residualMm: number | null;
  iterations: number;
  message: string;
  culprit?: string;
  mode: PoseMode;
  inputs: PoseInputs;
  wheels?: { left: WheelReport; right: WheelReport };
  points?: Record<string, { x: number; y: number; z: number }>;
  /** Every analysis measure of the pose (see analysisTypes.ts), when it was solved. */
  analysis?: PoseAnalysis;
  /** Sign conventions and definitions of the measures. */
  definitions?: typeof ANALYSIS_DEFINITIONS;
  /** With a speed: the balanced lean found and how well it balances. */
  ride?: RideReport;
  /** With a lean linkage on the ground: its roll axis, spring, rocker and stops (leanLinkageMeasures.ts). */
  leanLinkage?: LeanLinkageMeasures;
  /** Why a design with a lean linkage has no such measures at this pose. */
  leanLinkageReason?: string;
  /** When the request was not reached: where the linkage stopped closing. */
  limit?: LimitReport;
}

/** The lean-linkage measures are those of the linkage on the ground (its spring travel and frame place). */
export const LEAN_LINKAGE_OFF_GROUND =
  'the lean-linkage measures (roll axis, spring, rocker and stops) are found with the tyres on the ground and the suspension free; this pose sets the wheel travel or holds the suspension';

export function requestInputs(r: PoseRequest): PoseInputs {
  return {
    ...zeroInputs(),
    leanDeg: r.leanDeg,
    handlebarDeg: r.handlebarDeg,
    heaveMm: r.heaveMm,
    travelRightMm: r.travelRightMm,
    travelLeftMm: r.travelLeftMm,
    wheelAngleDeg: r.wheelAngleDeg,
  };
}


export function solveSinglePose(
  design: ResolvedDesign,
  request: PoseRequest,
): { result: SolveResult; snapshot?: PoseSnapshot; report: PoseReport; text: string } {
  const mode: PoseMode = {
    contact: request.contact,
    steerBy: request.steerBy,
    ...(request.hold ? { hold: request.hold } : {}),
    ...(request.leanBy === 'rocker' ? { leanBy: 'rocker' as const } : {}),
  };
  if (mode.leanBy === 'rocker' && !(design.leanLinkage && design.frontEnd.kind === 'splitWishbones' && mode.contact === 'ground' && !mode.hold)) {
    throw new PoseRequestError('the rocker angle can drive the lean only for a design with a lean linkage (leanLinkage) and the tyres on the ground');
  }
  if (!design.vehicle.tilting && request.leanDeg !== 0 && mode.leanBy !== 'rocker') {
    throw new PoseRequestError(`the design does not tilt (vehicle.tilting is false): lean must be 0, found ${request.leanDeg} deg`);
  }
  const engine = new PoseEngine(design, mode);
  const inputs = requestInputs(request);
  let ride: RideReport | undefined;
  let pose: EnginePose;
  if (request.speedKmh !== undefined) {
    const { pose: solved, ...figures } = solveRide(engine, request.speedKmh, inputs);
    pose = solved;
    ride = figures;
    inputs.leanDeg = figures.leanDeg;
  } else {
    pose = engine.solve(inputs);
  }
  const result = pose.result;
  const report: PoseReport = {
    status: result.status,
    residualMm: result.residualMm,
    iterations: result.iterations,
    message: result.message,
    ...(result.culprit ? { culprit: result.culprit } : {}),
    mode,
    inputs,
  };
  if (ride) report.ride = ride;
  if (!result.reached) {
    if (pose.shown === 'last-good') report.limit = limitReport(design, mode, inputs, pose);
    return { result, report, text: failureText(design, report, result) };
  }
  const snapshot = pose.snapshot;
  const lean = leanLinkageMeasures(design, mode, inputs);
  if (lean) report.leanLinkage = lean;
  else if (design.leanLinkage) {
    report.leanLinkageReason = mode.contact === 'ground' && !mode.hold ? 'the pose did not close again from the design pose for the lean-linkage measures' : LEAN_LINKAGE_OFF_GROUND;
  }
  report.inputs = snapshot.inputs;
  const wheel = (w: PoseSnapshot['wheels']['left']): WheelReport => ({
    toeDeg: w.toeDeg,
    camberDeg: w.camberDeg,
    camberToFrameDeg: w.camberToFrameDeg,
    steerDeg: w.steerDeg,
    centreMm: xyz(w.centre),
    contactPointMm: xyz(w.contactPoint),
  });
  report.wheels = { left: wheel(snapshot.wheels.left), right: wheel(snapshot.wheels.right) };
  report.points = Object.fromEntries(Object.entries(snapshot.points).map(([k, p]) => [k, xyz(p)]));
  report.analysis = pose.analysis as PoseAnalysis;
  report.definitions = ANALYSIS_DEFINITIONS;
  const labels = Object.fromEntries(engine.graph.points.map((p) => [p.id, p.label]));
  return { result, snapshot, report, text: poseText(design, report, result, labels) };
}

function limitReport(design: ResolvedDesign, mode: PoseMode, inputs: PoseInputs, pose: EnginePose): LimitReport {
  const w = pose.snapshot.wheels;
  return {
    handlebarDeg: pose.snapshot.inputs.handlebarDeg,
    leftWheelDeg: w.left.steerDeg,
    rightWheelDeg: w.right.steerDeg,
    loop: pose.result.culprit ?? null,
    misclosureAtRequestMm: misclosureAt(design, mode, inputs),
  };
}

/** The largest loop gap a least-squares fit leaves at the inputs, from the design pose in one step. */
export function misclosureAt(design: ResolvedDesign, mode: PoseMode, inputs: PoseInputs): number | null {
  const direct = new PoseSolver(buildMechanism(design, mode), { maxStepDeg: 1e9, maxStepMm: 1e9, maxBisections: 0 });
  const r = direct.solve(inputs, false);
  return r.reached ? 0 : r.residualMm;
}

function failureText(design: ResolvedDesign, rep: PoseReport, r: SolveResult): string {
  const lines = [design.name, statusLine(r)];
  if (rep.ride) lines.push(...rideLines(rep.ride));
  const l = rep.limit;
  if (l) {
    lines.push(
      `steering limit: the linkage last closed at handlebar ${l.handlebarDeg.toFixed(2)} deg (road wheels left ${l.leftWheelDeg.toFixed(2)}, right ${l.rightWheelDeg.toFixed(2)} deg)` +
        (l.loop ? `; beyond it the ${l.loop} would not close` : ''),
      `misclosure at the requested pose: ${misclosureWords(l.misclosureAtRequestMm)}`,
    );
  }
  return lines.join('\n') + '\n';
}

function misclosureWords(mm: number | null): string {
  if (mm === null) return 'not found';
  if (mm === 0) return '0 mm: the loops close there, but on an assembly branch not reachable by turning continuously from the design pose';
  return `${mm.toFixed(3)} mm (largest loop gap of a least-squares fit there)`;
}

const balanced = (r: RideReport) => r.balanceResidualDeg !== null && Math.abs(r.balanceResidualDeg) < 1e-4;

function rideLines(r: RideReport): string[] {
  const f = (x: number | null, d: number, unit: string) => (x === null ? '-' : `${x.toFixed(d)} ${unit}`);
  return [
    `ride: ${r.speedKmh} km/h, lean ${r.leanDeg.toFixed(3)} deg (right side down +; ${balanced(r) ? 'balanced' : 'not balanced'}), balance residual ${f(r.balanceResidualDeg, 6, 'deg')}, ` +
      `lateral acceleration ${f(r.lateralG, 3, 'g')}, ${r.steps} lean-and-solve steps`,
    ...r.notes.map((n) => `  (ride: ${n})`),
  ];
}

function statusLine(r: SolveResult): string {
  const res = r.residualMm === null ? 'n/a' : `${r.residualMm.toExponential(1)} mm`;
  const where = r.reached ? 'largest residual' : 'largest residual at the last continuation step tried';
  return `solver: ${r.status} (${r.message}); ${where} ${res}; ${r.iterations} iterations`;
}

function poseText(design: ResolvedDesign, rep: PoseReport, r: SolveResult, labels: Record<string, string>): string {
  const f = (x: number, d = 2) => x.toFixed(d).padStart(9);
  const i = rep.inputs;
  const lines = [
    `${design.name}`,
    `pose: lean ${i.leanDeg.toFixed(2)} deg, handlebar ${i.handlebarDeg.toFixed(2)} deg, ` +
      (rep.mode.hold === 'suspension'
        ? 'suspension held at its design position (steering only)'
        : rep.mode.contact === 'ground'
          ? 'tyres on the ground'
          : `travel R/L ${i.travelRightMm.toFixed(1)}/${i.travelLeftMm.toFixed(1)} mm`),
    statusLine(r),
    ...(rep.ride ? rideLines(rep.ride) : []),
    '',
    'wheel      toe(deg)  steer(deg) camber-ground camber-frame   centre x,y,z (mm)',
  ];
  for (const side of ['left', 'right'] as const) {
    const w = rep.wheels![side];
    lines.push(
      `${side.padEnd(6)} ${f(w.toeDeg, 3)} ${f(w.steerDeg, 3)} ${f(w.camberDeg, 3)}     ${f(w.camberToFrameDeg, 3)}   ` +
        `${w.centreMm.x.toFixed(2)}, ${w.centreMm.y.toFixed(2)}, ${w.centreMm.z.toFixed(2)}`,
    );
  }
  lines.push('  (toe-in positive; steer = road-wheel angle, positive left; camber top-outward positive)', '');
  if (rep.analysis) lines.push(formatPoseAnalysis(rep.analysis, design));
  if (rep.leanLinkage) lines.push(formatLeanLinkage(rep.leanLinkage));
  else if (rep.leanLinkageReason) lines.push(`lean linkage: - (${rep.leanLinkageReason})`, '');
  lines.push('hardpoint                                   x(mm)      y(mm)      z(mm)');
  for (const [id, p] of Object.entries(rep.points!)) {
    lines.push(`${(labels[id] ?? id).padEnd(38)} ${f(p.x)}  ${f(p.y)}  ${f(p.z)}`);
  }
  return lines.join('\n') + '\n';
}
