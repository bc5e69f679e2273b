/**
 * One pose, start to finish: build the mechanism for the requested mode, solve from the
 * design pose with continuation (so the design's assembly branch is kept), and report the
 * result as plain data and as text, with every analysis measure (PoseAnalyser).
 *
 * The measures that need other poses come from a few extra solves with a second solver
 * (steer by handlebar, same contact), each from the design pose: the reference pose for the
 * toe error (zero lean and travel, same handlebar), the handlebar +-0.25 deg either side for
 * the local steering ratio, and straight ahead at the same lean and travel for the front lift.
 */

import type { ResolvedDesign } from '../design/types';
import { buildMechanism, type PoseMode } from '../mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs, type Vec3 } from '../mechanism/MechanismGraph';
import { PoseSolver, type SolveResult } from '../solver/PoseSolver';
import { takeSnapshot, type PoseSnapshot } from './poseSnapshot';
import type { PoseAnalysis, PoseInputsReport } from './analysisTypes';
import { PoseAnalyser, frontLift, type ToeReference } from './PoseAnalyser';
import { localSteeringRatio } from './steeringLinkage';
import { formatPoseAnalysis } from './formatPoseAnalysis';
import { ANALYSIS_DEFINITIONS } from './definitions';

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

/** Half the handlebar step used for the local steering ratio, degrees. */
export const LOCAL_RATIO_STEP_DEG = 0.25;

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
  const solver = new PoseSolver(buildMechanism(design, mode));
  const inputs = requestInputs(request);
  const result = solver.solve(inputs, false);
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
  const snapshot = takeSnapshot(solver.mechanism);
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
  report.analysis = analyseSinglePose(design, mode, solver, result);
  report.definitions = ANALYSIS_DEFINITIONS;
  return { result, snapshot, report, text: poseText(design, report, result) };
}

/** The analysis of the pose `solver` has just solved, with the extra solves its neighbour measures need. */
function analyseSinglePose(design: ResolvedDesign, mode: PoseMode, solver: PoseSolver, result: SolveResult): PoseAnalysis {
  const here = { ...solver.mechanism.currentInputs, ...solver.mechanism.reportedInputs() };
  const aux = new PoseSolver(buildMechanism(design, { contact: mode.contact, steerBy: 'handlebar' }));
  const auxAnalyser = new PoseAnalyser(design, aux.mechanism, { findings: false });
  const at = (patch: Partial<PoseInputs>): PoseAnalysis | null => {
    const r = aux.solve({ ...here, wheelAngleDeg: 0, ...patch }, false);
    return r.reached ? auxAnalyser.analyse(r) : null;
  };
  const ref = at({ leanDeg: 0, heaveMm: 0, travelLeftMm: 0, travelRightMm: 0 });
  const toeRef: ToeReference = ref
    ? { leftDeg: ref.wheels.left.toeDeg, rightDeg: ref.wheels.right.toeDeg }
    : { reason: 'the reference pose (zero lean and travel, same handlebar) could not be solved' };
  const analysis = new PoseAnalyser(design, solver.mechanism).analyse(result, toeRef);
  const lo = at({ handlebarDeg: here.handlebarDeg - LOCAL_RATIO_STEP_DEG });
  const hi = at({ handlebarDeg: here.handlebarDeg + LOCAL_RATIO_STEP_DEG });
  const st = analysis.steering;
  if (lo && hi) {
    st.localRatio = localSteeringRatio(lo.steering.handlebarDeg, lo.steering.meanWheelDeg, hi.steering.handlebarDeg, hi.steering.meanWheelDeg);
    st.localRatioReason = st.localRatio === null ? 'the road wheels did not turn between the neighbouring poses' : undefined;
  } else {
    st.localRatioReason = `a pose ${LOCAL_RATIO_STEP_DEG} deg of handlebar either side could not be solved`;
  }
  const straight = here.handlebarDeg === 0 && mode.steerBy === 'handlebar' ? analysis : at({ handlebarDeg: 0 });
  const su = analysis.suspension;
  if (straight) {
    su.frontLiftMm = frontLift(analysis, straight);
    su.frontLiftReason = undefined;
  } else {
    su.frontLiftReason = 'the straight-ahead pose at this lean and travel could not be solved';
  }
  return analysis;
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
