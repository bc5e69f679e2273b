/**
 * The one-piece track rod (steering.kind "trackRod"), checked against planar kinematics.
 *
 * With vertical kingpins (zero caster and KPI), level steering arms and the suspension held,
 * the trapezoid is a planar four-bar in the plan view: ground link the kingpin spacing d, each
 * steering arm of length r a crank about its kingpin, the track rod the coupler b. Its outer
 * angle for a given inner angle is then the four-bar's closed-form position solution (the
 * intersection of two circles; R. L. Norton, Design of Machinery, position analysis of the
 * fourbar, as test/core/reliability/planarFourBar.ts writes it), and the pair of angles must
 * satisfy Freudenstein's equation K1 cos(phi) - K2 cos(theta) + K3 = cos(theta - phi), with
 * K1 = d/a, K2 = d/c, K3 = (a^2 - b^2 + c^2 + d^2) / (2 a c) (F. Freudenstein, "Approximate
 * synthesis of four-bar linkages", Trans. ASME 77, 1955). The full 3D solve, steered by the
 * inner (left) road-wheel angle, must give that outer angle to 1e-6 deg at three inner angles,
 * for the three drives (drag link to one upright; handlebar on one upright; centre lever with a
 * short link to the rod, where the rod is a body on a universal joint).
 *
 * A negative control: the parallel-arm layout (arms straight back, b = d) gives equal angles,
 * and the Ackermann layout's outer angle differs from it by more than a degree at 30 deg, so
 * a solve that ignored the trapezoid's angle would fail.
 */
import { describe, expect, it } from 'vitest';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile, ResolvedDesign, TrackRodDrive, Vec3Mm } from '../../../core/design/types';
import { rockerAngle, wrapRad, type FourBar } from '../reliability/planarFourBar';
import { report } from '../solver/report';

const DEG = Math.PI / 180;
const P = (x: number, y: number, z: number): Vec3Mm => ({ x, y, z });

/** Invented planar trapezoid: kingpins 700 mm apart, arms of 110 mm, each turned inward by beta. */
const HALF_TRACK = 350;
const ARM = 110;
const ARM_Z = 240;

function planarDesign(betaDeg: number, drive: TrackRodDrive): ResolvedDesign {
  const b = betaDeg * DEG;
  const joint = { kind: 'ballJoint' as const, ratedDeg: 40, studAxis: P(0, 0, 1) };
  const file: DesignFile = {
    tiltsheet: 1,
    name: `planar trapezoid, arms ${betaDeg} deg in`,
    vehicle: { wheelbaseMm: 1100, tilting: false, rear: { kind: 'single' } },
    frontEnd: {
      kind: 'splitWishbones',
      upper: { frontPivot: P(100, -150, 330), rearPivot: P(-100, -150, 330), outerJoint: P(0, -HALF_TRACK, 330) },
      lower: { frontPivot: P(100, -150, 150), rearPivot: P(-100, -150, 150), outerJoint: P(0, -HALF_TRACK, 150) },
    },
    upright: {
      steeringAxis: 'kingpin',
      // rearward and inward (+y on the right side) by beta
      steeringArmJoint: P(-ARM * Math.cos(b), -HALF_TRACK + ARM * Math.sin(b), ARM_Z),
      wheelCentre: P(0, -410, 240),
      staticToeDeg: 0,
      staticCamberDeg: 0,
    },
    steering: { kind: 'trackRod', drive },
    wheels: { front: { rollingRadiusMm: 240, tyreWidthMm: 40, crownRadiusMm: 20 }, rear: { rollingRadiusMm: 300, tyreWidthMm: 40, crownRadiusMm: 20 } },
    joints: { upperOuter: joint, lowerOuter: joint, tieRodOuter: joint, tieRodInner: joint },
    envelope: { leanDeg: 0, handlebarDeg: 60, bumpMm: 0, reboundMm: 0 },
  };
  const checked = validateDesign(file);
  if (!checked.ok) throw new Error(checked.issues.map((i) => i.message).join('; '));
  return resolveDesign(checked.design);
}

const DRIVES: { name: string; drive: TrackRodDrive }[] = [
  { name: 'drag link to the right upright', drive: { kind: 'dragLink', upright: 'right', columnPivot: P(40, 0, 330), columnAxis: P(0, 0, 1), columnArmJoint: P(90, 0, 300), uprightArmJoint: P(90, -320, 300) } },
  { name: 'handlebar on the left upright', drive: { kind: 'knuckle', upright: 'left' } },
  // A lever on a vertical column 60 mm behind the rod, its arm reaching forward over the rod, the short link down to the rod's middle.
  {
    name: 'centre lever and short link',
    drive: { kind: 'centreLever', pivot: P(-ARM * Math.cos(17 * DEG) - 60, -100, 280), axis: P(0, 0, 1), leverJoint: P(-ARM * Math.cos(17 * DEG), -100, 280), trackRodJoint: P(-ARM * Math.cos(17 * DEG), 0, ARM_Z) },
  },
];

/**
 * The trapezoid as planarFourBar's four-bar. Its frame: x' from the left kingpin (O2) to the
 * right one (O4), i.e. world -y; y' = z x x' = world +x; a turn about z is the same turn in
 * both frames, so a road-wheel angle (positive left) adds to the link angles directly.
 */
function trapezoid(betaDeg: number): { f: FourBar; theta0: number; phi0: number } {
  const b = betaDeg * DEG;
  const d = 2 * HALF_TRACK;
  // left arm joint relative to the left kingpin: world (-r cos b, -r sin b) -> frame (r sin b, -r cos b)
  const theta0 = Math.atan2(-ARM * Math.cos(b), ARM * Math.sin(b));
  // right arm joint relative to the right kingpin: world (-r cos b, +r sin b) -> frame (-r sin b, -r cos b)
  const phi0 = Math.atan2(-ARM * Math.cos(b), -ARM * Math.sin(b));
  return { f: { a: ARM, b: d - 2 * ARM * Math.sin(b), c: ARM, d }, theta0, phi0 };
}

/** Outer (right) road-wheel angle for an inner (left) one, from the closed form, on the design's branch. */
function outerAngleDeg(betaDeg: number, innerDeg: number): number {
  const { f, theta0, phi0 } = trapezoid(betaDeg);
  const branch = ([1, -1] as const).find((s) => Math.abs(wrapRad(rockerAngle(f, theta0, s)! - phi0)) < 1e-9);
  if (!branch) throw new Error('design angle on neither branch');
  const phi = rockerAngle(f, theta0 + innerDeg * DEG, branch);
  if (phi === null) throw new Error('the trapezoid does not close');
  return wrapRad(phi - phi0) / DEG;
}

function freudensteinResidual(betaDeg: number, innerDeg: number, outerDeg: number): number {
  const { f, theta0, phi0 } = trapezoid(betaDeg);
  const th = theta0 + innerDeg * DEG;
  const ph = phi0 + outerDeg * DEG;
  const K1 = f.d / f.a;
  const K2 = f.d / f.c;
  const K3 = (f.a ** 2 - f.b ** 2 + f.c ** 2 + f.d ** 2) / (2 * f.a * f.c);
  return K1 * Math.cos(ph) - K2 * Math.cos(th) + K3 - Math.cos(th - ph);
}

const INNER_DEG = [8, 20, 32];
const BETA_DEG = 17;

describe('one-piece track rod: the planar trapezoid against the four-bar closed form', () => {
  for (const { name, drive } of DRIVES) {
    it(`${name}: outer angle = Norton's closed form and Freudenstein's equation holds, at three inner angles`, () => {
      const design = planarDesign(BETA_DEG, drive);
      const solver = new PoseSolver(buildMechanism(design, { contact: 'ground', steerBy: 'leftWheel', hold: 'suspension' }));
      let worst = 0;
      for (const inner of INNER_DEG) {
        const res = solver.solve({ ...zeroInputs(), wheelAngleDeg: inner }, false);
        expect(res.status, `${name}, inner ${inner}: ${res.message}`).toBe('converged');
        expect(res.residualMm!).toBeLessThan(1e-9);
        const snap = takeSnapshot(solver.mechanism);
        expect(Math.abs(snap.wheels.left.steerDeg - inner)).toBeLessThan(1e-9);
        const want = outerAngleDeg(BETA_DEG, inner);
        const got = snap.wheels.right.steerDeg;
        worst = Math.max(worst, Math.abs(got - want));
        expect(Math.abs(got - want), `inner ${inner}: outer ${got} against ${want}`).toBeLessThan(1e-6);
        expect(Math.abs(freudensteinResidual(BETA_DEG, inner, got))).toBeLessThan(1e-8);
        // Ackermann: the outer wheel turns less than the inner one
        expect(got).toBeLessThan(inner);
      }
      report(`track rod, ${name}: worst outer-angle difference from the four-bar closed form (deg)`, worst);
      expect(worst).toBeLessThan(1e-6);
    });
  }

  it('negative control: parallel arms steer both wheels alike, the trapezoid does not', () => {
    expect(Math.abs(outerAngleDeg(0, 30) - 30)).toBeLessThan(1e-9);
    expect(30 - outerAngleDeg(BETA_DEG, 30)).toBeGreaterThan(1);
    const design = planarDesign(0, DRIVES[1].drive);
    const solver = new PoseSolver(buildMechanism(design, { contact: 'ground', steerBy: 'leftWheel', hold: 'suspension' }));
    solver.solve({ ...zeroInputs(), wheelAngleDeg: 30 }, false);
    expect(Math.abs(takeSnapshot(solver.mechanism).wheels.right.steerDeg - 30)).toBeLessThan(1e-6);
  });

  it('handlebar on an upright: the handlebar angle is that upright\'s road-wheel angle (vertical kingpin)', () => {
    const design = planarDesign(BETA_DEG, DRIVES[1].drive);
    const solver = new PoseSolver(buildMechanism(design, { contact: 'ground', steerBy: 'handlebar', hold: 'suspension' }));
    for (const hb of [-25, 10, 30]) {
      const res = solver.solve({ ...zeroInputs(), handlebarDeg: hb }, false);
      expect(res.status).toBe('converged');
      const snap = takeSnapshot(solver.mechanism);
      expect(Math.abs(snap.wheels.left.steerDeg - hb)).toBeLessThan(1e-9);
      expect(Math.abs(snap.wheels.right.steerDeg - outerAngleDeg(BETA_DEG, hb))).toBeLessThan(1e-6);
    }
  });
});
