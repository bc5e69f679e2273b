/**
 * One pose for the `pose` command: the pose engine solves it from the design pose with
 * continuation (so the design's assembly branch is kept), measures and judges it, with the
 * relative measures from the poses beside it; this module reports the result as plain data
 * and as text.
 */

import type { ResolvedDesign } from '../design/types';
import type { PoseMode } from '../mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs, type Vec3 } from '../mechanism/MechanismGraph';
import type { SolveResult } from '../solver/PoseSolver';
import type { PoseSnapshot } from './poseSnapshot';
import type { PoseAnalysis, PoseInputsReport } from './analysisTypes';
import { PoseEngine } from './PoseEngine';
import { formatPoseAnalysis } from './formatPoseAnalysis';
import { ANALYSIS_DEFINITIONS } from './definitions';

export { LOCAL_RATIO_STEP_DEG } from './PoseEngine';

/** A pose to solve: the front-end mode and the six inputs, as the report echoes them. */
export type PoseRequest = PoseMode & PoseInputsReport;

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
}

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

const xyz = (v: Vec3) => ({ x: v[0], y: v[1], z: v[2] });

export function solveSinglePose(
  design: ResolvedDesign,
  request: PoseRequest,
): { result: SolveResult; snapshot?: PoseSnapshot; report: PoseReport; text: string } {
  const mode: PoseMode = { contact: request.contact, steerBy: request.steerBy };
  const engine = new PoseEngine(design, mode);
  const inputs = requestInputs(request);
  const pose = engine.solve(inputs);
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
  if (!result.reached) {
    return { result, report, text: `${design.name}\n${statusLine(result)}\n` };
  }
  const snapshot = pose.snapshot;
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
  return { result, snapshot, report, text: poseText(design, report, result) };
}

function statusLine(r: SolveResult): string {
  const res = r.residualMm === null ? 'n/a' : `${r.residualMm.toExponential(1)} mm`;
  return `status: ${r.status} (${r.message}); max residual ${res}; ${r.iterations} iterations`;
}

function poseText(design: ResolvedDesign, rep: PoseReport, r: SolveResult): string {
  const f = (x: number, d = 2) => x.toFixed(d).padStart(9);
  const i = rep.inputs;
  const lines = [
    `${design.name}`,
    `pose: lean ${i.leanDeg.toFixed(2)} deg, handlebar ${i.handlebarDeg.toFixed(2)} deg, ` +
      (rep.mode.contact === 'ground' ? 'tyres on the ground' : `travel R/L ${i.travelRightMm.toFixed(1)}/${i.travelLeftMm.toFixed(1)} mm`),
    statusLine(r),
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
  lines.push('hardpoint                                   x(mm)      y(mm)      z(mm)');
  for (const [id, p] of Object.entries(rep.points!)) {
    lines.push(`${id.padEnd(38)} ${f(p.x)}  ${f(p.y)}  ${f(p.z)}`);
  }
  return lines.join('\n') + '\n';
}
