/**
 * Knuckle-mounted steering joined by tie rods (steering.input.kind "knuckle" on a bell crank):
 * the handlebar is fixed to the left upright, its tie rod turns an idler crank on the frame,
 * and the crank's other tie rod turns the right upright.
 *
 * With vertical kingpins, a vertical crank axis, every steering joint at one height and the
 * suspension held, the linkage is two planar four-bars in series in the plan view: (left arm
 * about its kingpin, left tie rod, crank's left arm about the crank pivot), then (crank's right
 * arm, right tie rod, right arm about its kingpin). Each four-bar's output angle for its input
 * angle is the closed-form position solution (the intersection of two circles; R. L. Norton,
 * Design of Machinery, position analysis of the fourbar, as planarFourBar.ts writes it). The 3D
 * solve must give the left road-wheel angle equal to the handlebar (to solver precision) and the
 * right one equal to the chained closed form to 1e-6 deg, at three handlebar angles.
 * A negative control: the chained answer differs from the handlebar angle by over a degree.
 */
import { describe, expect, it } from 'vitest';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile, ResolvedDesign, Vec3Mm } from '../../../core/design/types';
import { rockerAngle, wrapRad } from '../reliability/planarFourBar';
import { report } from '../solver/report';

const DEG = Math.PI / 180;
const P = (x: number, y: number, z: number): Vec3Mm => ({ x, y, z });
type P2 = [number, number];

// Invented planar layout: kingpins 700 mm apart, arms of 110 mm turned 17 deg inward, a crank
// 60 mm behind the arm joints with arms reaching 60 mm forward and 140 mm to each side.
const H = 350;
const ARM = 110;
const BETA = 17 * DEG;
const Z = 240;
const ARM_X = -ARM * Math.cos(BETA);
const ARM_Y = H - ARM * Math.sin(BETA);
const CRANK: P2 = [ARM_X - 60, 0];
const CRANK_ARM: P2 = [60, 140];

function designFile(): DesignFile {
  const joint = { kind: 'ballJoint' as const, ratedDeg: 40, studAxis: P(0, 0, 1) };
  const file: DesignFile = {
    tiltsheet: 1,
    name: 'planar knuckle steering with tie rods',
    vehicle: { wheelbaseMm: 1100, tilting: false, rear: { kind: 'single' } },
    frontEnd: {
      kind: 'splitWishbones',
      upper: { frontPivot: P(100, -150, 330), rearPivot: P(-100, -150, 330), outerJoint: P(0, -H, 330) },
      lower: { frontPivot: P(100, -150, 150), rearPivot: P(-100, -150, 150), outerJoint: P(0, -H, 150) },
    },
    upright: { steeringAxis: 'kingpin', steeringArmJoint: P(ARM_X, -ARM_Y, Z), wheelCentre: P(0, -410, 240), staticToeDeg: 0, staticCamberDeg: 0 },
    steering: {
      kind: 'bellCrank',
      pivot: P(CRANK[0], CRANK[1], Z),
      axis: P(0, 0, 1),
      tieRodJoint: P(CRANK[0] + CRANK_ARM[0], -CRANK_ARM[1], Z),
      input: { kind: 'knuckle', upright: 'left' },
    },
    wheels: { front: { rollingRadiusMm: 240, tyreWidthMm: 40, crownRadiusMm: 20 }, rear: { rollingRadiusMm: 300, tyreWidthMm: 40, crownRadiusMm: 20 } },
    joints: { upperOuter: joint, lowerOuter: joint, tieRodOuter: joint, tieRodInner: joint },
    envelope: { leanDeg: 0, handlebarDeg: 40, bumpMm: 0, reboundMm: 0 },
  };
  return file;
}

function design(): ResolvedDesign {
  const checked = validateDesign(designFile());
  if (!checked.ok) throw new Error(checked.issues.map((i) => i.message).join('; '));
  return resolveDesign(checked.design);
}

/**
 * Output turn of a four-bar (input link tip A0 about O2, output link tip B0 about O4, coupler
 * A0-B0) for an input turn, on the design's branch: planarFourBar's closed form in a frame with
 * x' from O2 to O4 (a proper rotation, so turns read the same in both frames).
 */
function outputTurn(O2: P2, A0: P2, O4: P2, B0: P2, inputTurn: number): number {
  const g = Math.atan2(O4[1] - O2[1], O4[0] - O2[0]);
  const local = (p: P2, o: P2): number => Math.atan2(p[1] - o[1], p[0] - o[0]) - g;
  const f = { a: Math.hypot(A0[0] - O2[0], A0[1] - O2[1]), b: Math.hypot(A0[0] - B0[0], A0[1] - B0[1]), c: Math.hypot(B0[0] - O4[0], B0[1] - O4[1]), d: Math.hypot(O4[0] - O2[0], O4[1] - O2[1]) };
  const theta0 = local(A0, O2);
  const phi0 = local(B0, O4);
  const branch = ([1, -1] as const).find((s) => Math.abs(wrapRad(rockerAngle(f, theta0, s)! - phi0)) < 1e-9);
  if (!branch) throw new Error('design angle on neither branch');
  const phi = rockerAngle(f, theta0 + inputTurn, branch);
  if (phi === null) throw new Error('the four-bar does not close');
  return wrapRad(phi - phi0);
}

/** Right road-wheel angle for a left one (degrees), through the crank: two four-bars in series. */
function rightWheelDeg(leftDeg: number): number {
  const leftKingpin: P2 = [0, H];
  const rightKingpin: P2 = [0, -H];
  const crankTurn = outputTurn(leftKingpin, [ARM_X, ARM_Y], CRANK, [CRANK[0] + CRANK_ARM[0], CRANK_ARM[1]], leftDeg * DEG);
  return outputTurn(CRANK, [CRANK[0] + CRANK_ARM[0], -CRANK_ARM[1]], rightKingpin, [ARM_X, -ARM_Y], crankTurn) / DEG;
}

describe('knuckle-mounted steering with tie rods through an idler crank', () => {
  it('left wheel = handlebar; right wheel = two four-bars in series (closed form), at three angles', () => {
    const solver = new PoseSolver(buildMechanism(design(), { contact: 'ground', steerBy: 'handlebar', hold: 'suspension' }));
    let worst = 0;
    for (const hb of [8, 20, 32]) {
      const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
      expect(res.status, `handlebar ${hb}: ${res.message}`).toBe('converged');
      expect(res.residualMm!).toBeLessThan(1e-9);
      const w = takeSnapshot(solver.mechanism).wheels;
      expect(Math.abs(w.left.steerDeg - hb)).toBeLessThan(1e-9);
      const want = rightWheelDeg(hb);
      worst = Math.max(worst, Math.abs(w.right.steerDeg - want));
      expect(Math.abs(w.right.steerDeg - want), `handlebar ${hb}: ${w.right.steerDeg} against ${want}`).toBeLessThan(1e-6);
    }
    report('knuckle steering with tie rods: worst right-wheel difference from the chained four-bars (deg)', worst);
  });

  it('negative control: the chained closed form is not simply the handlebar angle', () => {
    expect(Math.abs(rightWheelDeg(32) - 32)).toBeGreaterThan(1);
  });

  it('refuses a handlebar on an upright with ball joints, naming steering.input.kind', () => {
    const file = designFile();
    file.upright.steeringAxis = 'ballJoints';
    const r = validateDesign(file);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.message).join('\n')).toContain('steering.input.kind: expected "ratio" or "dragLink", or upright.steeringAxis "kingpin"');
  });
});
