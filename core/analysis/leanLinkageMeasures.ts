/**
 * What a balance-beam lean linkage (design block `leanLinkage`) does at one pose on the ground:
 * the frame's roll axis, the spring's length and motion ratio, the rocker angle and its stop
 * margin, the lean at each stop and the actuator's length. Each needs poses beside the one
 * asked for (lean +/- d, spring travel +/- h, the rocker driven to a stop), solved here by a
 * solver of its own from the design pose with continuation, so the caller's solver is untouched.
 *
 * Numbers are right or absent with a reason: a pose beside that will not close leaves its
 * measure null and says so.
 */

import type { ResolvedDesign } from '../design/types';
import { zeroInputs, type PoseInputs } from '../mechanism/MechanismGraph';
import { bodyIndex, buildMechanism, type PoseMode } from '../mechanism/templates/buildMechanism';
import { LEAN_IDS } from '../mechanism/templates/leanLinkage';
import { PoseSolver } from '../solver/PoseSolver';

/** Lean step either side for the roll axis and the spring's change with lean, degrees. */
export const ROLL_AXIS_STEP_DEG = 0.05;
/** Spring-travel step either side for the motion ratio, mm. */
export const MOTION_RATIO_STEP_MM = 0.5;
/**
 * Below this inclination to the ground the roll axis is taken as parallel to it and its ground
 * point is absent: at 0.1 deg an axis 300 mm up meets the ground 170 m away, far outside any
 * vehicle (common practice, no source).
 */
export const PARALLEL_LIMIT_DEG = 0.1;

const DEG = Math.PI / 180;
type V3 = [number, number, number];

export interface RollAxisMeasures {
  /** Height of the axis where it crosses the front axle's plane (x = 0), mm; null with a reason. */
  heightAtAxleMm: number | null;
  /** Lateral position (y) of the axis at x = 0, mm. */
  lateralAtAxleMm: number | null;
  /** Inclination to the ground, positive when the axis rises toward the front, degrees. */
  inclinationDeg: number;
  /** Where the axis meets the ground (x), mm; null when it runs parallel to the ground. */
  groundPointXMm: number | null;
  groundPointReason?: string;
  reason?: string;
}

export interface LeanLinkageMeasures {
  /** The lean the frame has (solved in the tilt-lock mode), degrees. */
  leanDeg: number;
  springLengthMm: number;
  /** Spring compression from design (-heaveMm on the ground), mm. */
  springTravelMm: number;
  /** Spring compression per mm of mean wheel-centre bump relative to the frame, lean and handlebar held. */
  motionRatio: number | null;
  motionRatioReason?: string;
  /** Spring length change per degree of lean, spring travel held, mm/deg. */
  springPerLeanMmPerDeg: number | null;
  springPerLeanReason?: string;
  rollAxis: RollAxisMeasures | null;
  rollAxisReason?: string;
  /** Rocker rotation relative to the carrier, right-handed about the rocker axis, degrees. */
  rockerDeg: number;
  stopDeg: number;
  /** stop - |rocker angle|: negative past a stop, degrees. */
  stopMarginDeg: number;
  /** The frame lean when the rocker sits at +stop and at -stop (same handlebar and spring travel). */
  leanAtStopDeg: { positive: number | null; negative: number | null };
  leanAtStopReason?: string;
  /** Length of the lean actuator or tilt lock, mm; null without one. */
  actuatorLengthMm: number | null;
}

/** Reads the lean-linkage state of a solver's mechanism after a solve. */
class Reader {
  readonly frame: number;
  readonly carrier: number;
  readonly rocker: number;
  readonly uprights: number[];
  constructor(readonly solver: PoseSolver, readonly design: ResolvedDesign) {
    const g = solver.mechanism.graph;
    this.frame = g.frameBody;
    this.carrier = bodyIndex(g, LEAN_IDS.carrier);
    this.rocker = bodyIndex(g, LEAN_IDS.rocker);
    this.uprights = g.wheels.map((w) => w.body);
  }
  private world(body: number, p: { x: number; y: number; z: number }): V3 {
    const out: V3 = [0, 0, 0];
    this.solver.mechanism.worldPoint(body, [p.x, p.y, p.z], out);
    return out;
  }
  springLength(): number {
    const l = this.design.leanLinkage!;
    return dist(this.world(this.frame, l.carrier.frameMount), this.world(this.carrier, l.carrier.carrierMount));
  }
  actuatorLength(): number | null {
    const a = this.design.leanLinkage!.actuator;
    return a ? dist(this.world(this.frame, a.frameMount), this.world(this.rocker, a.rockerMount)) : null;
  }
  rockerDeg(): number {
    return this.solver.mechanism.coord[this.rocker] / DEG;
  }
  /** Frame lean from its joint, degrees. */
  leanDeg(): number {
    return this.solver.mechanism.coord[this.frame] / DEG;
  }
  framePose(): { r: number[]; t: V3 } {
    const m = this.solver.mechanism;
    const o = 9 * this.frame;
    return { r: Array.from(m.rot.subarray(o, o + 9)), t: [m.trans[3 * this.frame], m.trans[3 * this.frame + 1], m.trans[3 * this.frame + 2]] };
  }
  /** Mean height of the wheel centres in the frame's design axes (bump positive), mm. */
  meanWheelHeightInFrame(): number {
    const m = this.solver.mechanism;
    const { r, t } = this.framePose();
    let sum = 0;
    for (const w of m.graph.wheels) {
      const p: V3 = [0, 0, 0];
      m.worldPoint(w.body, w.centre, p);
      // z axis of the frame is column 2 of its rotation.
      sum += r[6] * (p[0] - t[0]) + r[7] * (p[1] - t[1]) + r[8] * (p[2] - t[2]);
    }
    return sum / m.graph.wheels.length;
  }
}

const dist = (a: V3, b: V3) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

/**
 * The lean-linkage measures at `inputs` (leanDeg is the frame's lean; in the tilt-lock mode,
 * the rocker angle) in `mode`; null for a design without a lean linkage or a pose off the
 * ground (the spring travel and frame place then are not the linkage's own).
 */
export function leanLinkageMeasures(design: ResolvedDesign, mode: PoseMode, inputs: PoseInputs): LeanLinkageMeasures | null {
  const l = design.leanLinkage;
  if (!l || design.frontEnd.kind !== 'splitWishbones' || mode.contact !== 'ground' || mode.hold === 'suspension') return null;
  const frameMode: PoseMode = { contact: 'ground', steerBy: mode.steerBy };
  let lean = inputs.leanDeg;
  if (mode.leanBy === 'rocker') {
    const locked = new Reader(new PoseSolver(buildMechanism(design, { ...frameMode, leanBy: 'rocker' })), design);
    if (!locked.solver.solve(inputs).reached) return null;
    lean = locked.leanDeg();
  }
  const base: PoseInputs = { ...zeroInputs(), ...inputs, leanDeg: lean };
  const at = new Reader(new PoseSolver(buildMechanism(design, frameMode)), design);
  if (!at.solver.solve(base).reached) return null;
  const springLengthMm = at.springLength();
  const rockerDeg = at.rockerDeg();
  const actuatorLengthMm = at.actuatorLength();
  const centre = at.framePose();
  const out: LeanLinkageMeasures = {
    leanDeg: lean,
    springLengthMm,
    springTravelMm: dist([l.carrier.frameMount.x, l.carrier.frameMount.y, l.carrier.frameMount.z], [l.carrier.carrierMount.x, l.carrier.carrierMount.y, l.carrier.carrierMount.z]) - springLengthMm,
    motionRatio: null,
    springPerLeanMmPerDeg: null,
    rollAxis: null,
    rockerDeg,
    stopDeg: l.rocker.stopDeg,
    stopMarginDeg: l.rocker.stopDeg - Math.abs(rockerDeg),
    leanAtStopDeg: { positive: null, negative: null },
    actuatorLengthMm,
  };

  // Lean +/- d, spring travel held: the roll axis and the spring's change with lean.
  const d = ROLL_AXIS_STEP_DEG;
  const lo = at.solver.solve({ ...base, leanDeg: lean - d }).reached ? { pose: at.framePose(), spring: at.springLength() } : null;
  const hi = at.solver.solve({ ...base, leanDeg: lean + d }).reached ? { pose: at.framePose(), spring: at.springLength() } : null;
  if (lo && hi) {
    out.springPerLeanMmPerDeg = (hi.spring - lo.spring) / (2 * d);
    out.rollAxis = rollAxis(lo.pose, centre, hi.pose, 2 * d * DEG);
  } else {
    const why = `the linkage does not close at lean ${lean.toFixed(2)} +/- ${d} deg`;
    out.springPerLeanReason = why;
    out.rollAxisReason = why;
  }

  // Spring travel +/- h, lean and handlebar held: the motion ratio.
  const h = MOTION_RATIO_STEP_MM;
  const zLo = at.solver.solve({ ...base, heaveMm: base.heaveMm - h }).reached ? { z: at.meanWheelHeightInFrame(), s: at.springLength() } : null;
  const zHi = at.solver.solve({ ...base, heaveMm: base.heaveMm + h }).reached ? { z: at.meanWheelHeightInFrame(), s: at.springLength() } : null;
  if (zLo && zHi && Math.abs(zHi.z - zLo.z) > 1e-9) {
    out.motionRatio = -(zHi.s - zLo.s) / (zHi.z - zLo.z);
  } else {
    out.motionRatioReason = zLo && zHi ? 'the wheels do not move with the spring here' : `the linkage does not close at spring travel ${base.heaveMm.toFixed(1)} +/- ${h} mm`;
  }

  // The rocker driven to each stop, the frame's lean solved.
  const stops = new Reader(new PoseSolver(buildMechanism(design, { ...frameMode, leanBy: 'rocker' })), design);
  const leanAt = (rocker: number): number | null => {
    stops.solver.reset();
    return stops.solver.solve({ ...base, leanDeg: rocker }).reached ? stops.leanDeg() : null;
  };
  out.leanAtStopDeg = { positive: leanAt(l.rocker.stopDeg), negative: leanAt(-l.rocker.stopDeg) };
  if (out.leanAtStopDeg.positive === null || out.leanAtStopDeg.negative === null) {
    out.leanAtStopReason = 'the linkage does not close with the rocker at that stop (the other inputs held)';
  }
  return out;
}

/**
 * The frame's screw axis relative to the ground from poses a parameter step `span` apart either
 * side of `mid`: the finite screw (Chasles) of the displacement from the first pose to the last,
 * which for a motion about a fixed line is that line and otherwise approaches the instantaneous
 * screw axis at the middle pose as the step shrinks. Relative rotation R = R+ R-^T with angle t
 * about u (from its skew part, 2 sin t u), translation c = t+ - R t-; the axis point nearest the
 * origin is p = (c_perp + cot(t/2) u x c_perp) / 2, c_perp the part of c across u. `mid` is
 * unused by the formula; it is kept so a caller passes the three poses it solved.
 */
export function rollAxis(lo: { r: number[]; t: V3 }, mid: { r: number[]; t: V3 }, hi: { r: number[]; t: V3 }, span: number): RollAxisMeasures {
  void mid;
  void span;
  // R(row, col) = r[3 col + row] (column-major).
  const at = (r: number[], row: number, col: number) => r[3 * col + row];
  const rel = (row: number, col: number) => {
    let s = 0;
    for (let k = 0; k < 3; k++) s += at(hi.r, row, k) * at(lo.r, col, k);
    return s;
  };
  const trace = rel(0, 0) + rel(1, 1) + rel(2, 2);
  const skew: V3 = [rel(2, 1) - rel(1, 2), rel(0, 2) - rel(2, 0), rel(1, 0) - rel(0, 1)];
  const sn = Math.hypot(skew[0], skew[1], skew[2]);
  const angle = Math.atan2(sn / 2, (trace - 1) / 2);
  if (!(sn > 0) || !(angle > 0)) return { heightAtAxleMm: null, lateralAtAxleMm: null, inclinationDeg: 0, groundPointXMm: null, reason: 'the frame does not turn between the poses' };
  const u0: V3 = [skew[0] / sn, skew[1] / sn, skew[2] / sn];
  // c = t+ - R t-
  const c: V3 = [0, 0, 0];
  for (let row = 0; row < 3; row++) c[row] = hi.t[row] - (rel(row, 0) * lo.t[0] + rel(row, 1) * lo.t[1] + rel(row, 2) * lo.t[2]);
  const along = c[0] * u0[0] + c[1] * u0[1] + c[2] * u0[2];
  const cp: V3 = [c[0] - along * u0[0], c[1] - along * u0[1], c[2] - along * u0[2]];
  const cot = 1 / Math.tan(angle / 2);
  const ux: V3 = [u0[1] * cp[2] - u0[2] * cp[1], u0[2] * cp[0] - u0[0] * cp[2], u0[0] * cp[1] - u0[1] * cp[0]];
  const p: V3 = [(cp[0] + cot * ux[0]) / 2, (cp[1] + cot * ux[1]) / 2, (cp[2] + cot * ux[2]) / 2];
  const u: V3 = u0[0] < 0 ? [-u0[0], -u0[1], -u0[2]] : u0;
  const inclinationDeg = Math.atan2(u[2], Math.hypot(u[0], u[1])) / DEG;
  const out: RollAxisMeasures = { heightAtAxleMm: null, lateralAtAxleMm: null, inclinationDeg, groundPointXMm: null };
  if (u[0] > 1e-9) {
    const s = -p[0] / u[0];
    out.heightAtAxleMm = p[2] + s * u[2];
    out.lateralAtAxleMm = p[1] + s * u[1];
  } else {
    out.reason = 'the roll axis runs across the vehicle (no crossing of the front axle plane)';
  }
  if (Math.abs(inclinationDeg) >= PARALLEL_LIMIT_DEG) {
    const s = -p[2] / u[2];
    out.groundPointXMm = p[0] + s * u[0];
  } else {
    out.groundPointReason = `parallel to the ground (inclined less than ${PARALLEL_LIMIT_DEG} deg)`;
  }
  return out;
}

/** The measures as lines of the `pose` text. */
export function formatLeanLinkage(m: LeanLinkageMeasures): string {
  // A value that rounds to zero prints as 0, never -0.000.
  const n = (x: number, digits: number) => (Math.abs(x) < 0.5 * 10 ** -digits ? 0 : x).toFixed(digits);
  const f = (x: number | null, digits: number, unit: string, reason?: string) => (x === null ? `- (${reason ?? 'not found'})` : `${n(x, digits)}${unit ? ` ${unit}` : ''}`);
  const ra = m.rollAxis;
  const axis = ra
    ? `height ${f(ra.heightAtAxleMm, 2, 'mm', ra.reason)}, lateral ${f(ra.lateralAtAxleMm, 2, 'mm', ra.reason)} at the front axle (x = 0), ` +
      `inclined ${n(ra.inclinationDeg, 3)} deg (rising forward +), meets the ground at x ${f(ra.groundPointXMm, 1, 'mm', ra.groundPointReason)}`
    : `- (${m.rollAxisReason ?? 'not found'})`;
  return [
    'lean linkage (balance beam; lean with the spring held, frame height and lateral place solved):',
    `  spring length ${m.springLengthMm.toFixed(2)} mm, spring compression ${n(m.springTravelMm, 2)} mm (the heave input of this layout is spring extension +)`,
    `  motion ratio ${f(m.motionRatio, 4, '', m.motionRatioReason)} (spring compression per mm of mean wheel-centre bump relative to the frame)`,
    `  spring length change with lean ${f(m.springPerLeanMmPerDeg, 6, 'mm/deg', m.springPerLeanReason)}`,
    `  rocker angle ${n(m.rockerDeg, 3)} deg (relative to its carrier), stops +/-${m.stopDeg.toFixed(1)} deg, stop margin ${m.stopMarginDeg.toFixed(3)} deg`,
    `  lean with the rocker at its stops: +${m.stopDeg.toFixed(1)} deg -> ${f(m.leanAtStopDeg.positive, 2, 'deg', m.leanAtStopReason)}, ` +
      `-${m.stopDeg.toFixed(1)} deg -> ${f(m.leanAtStopDeg.negative, 2, 'deg', m.leanAtStopReason)}`,
    `  lean actuator length ${f(m.actuatorLengthMm, 2, 'mm', 'no actuator in the design')}`,
    `  frame roll axis: ${axis}`,
    '',
  ].join('\n');
}
