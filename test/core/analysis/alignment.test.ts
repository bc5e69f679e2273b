import { describe, it, expect } from 'vitest';
import { demo, demoDoc, kingpinTrike, resolveDoc, solveAnalyse, type Doc } from './helpers';

const DEG = Math.PI / 180;
type V = [number, number, number];

/** Rodrigues rotation of v about unit k by t (written out here, independent of the code). */
function rotate(v: V, k: V, t: number): V {
  const c = Math.cos(t);
  const s = Math.sin(t);
  const kv = k[0] * v[0] + k[1] * v[1] + k[2] * v[2];
  const kx: V = [k[1] * v[2] - k[2] * v[1], k[2] * v[0] - k[0] * v[2], k[0] * v[1] - k[1] * v[0]];
  return [v[0] * c + kx[0] * s + k[0] * kv * (1 - c), v[1] * c + kx[1] * s + k[1] * kv * (1 - c), v[2] * c + kx[2] * s + k[2] * kv * (1 - c)];
}

describe('steering-axis geometry at design', () => {
  it('caster, KPI, trail and scrub radius of the Heron demo match a hand construction from its hardpoints', () => {
    const d = demoDoc('heron-tilting-velomobile');
    const U = d.frontEnd.upper.outerJoint; // right side
    const L = d.frontEnd.lower.outerJoint;
    const k = [U.x - L.x, U.y - L.y, U.z - L.z];
    const caster = Math.atan2(-k[0], k[2]) / DEG; // top rearward positive
    const kpi = Math.atan2(k[1], k[2]) / DEG; // right wheel: inward is +y
    const gx = L.x - (k[0] * L.z) / k[2];
    const gy = L.y - (k[1] * L.z) / k[2];
    // Contact patch of an upright wheel straight ahead: under the wheel centre.
    const trail = gx - d.upright.wheelCentre.x; // axis ground point ahead of the patch
    const scrub = gy - d.upright.wheelCentre.y; // axis ground point inboard (+y for the right wheel)
    const { analysis: a } = solveAnalyse(demo('heron-tilting-velomobile'), {});
    for (const side of ['left', 'right'] as const) {
      const w = a.wheels[side];
      expect(w.casterDeg).toBeCloseTo(caster, 9);
      expect(w.kpiDeg).toBeCloseTo(kpi, 9);
      expect(w.casterToFrameDeg).toBeCloseTo(caster, 9);
      expect(w.trailMm!).toBeCloseTo(trail, 9);
      expect(w.scrubRadiusMm!).toBeCloseTo(scrub, 9);
      expect(w.travelMm).toBeCloseTo(0, 9);
    }
    expect(caster).toBeGreaterThan(0); // the demo has positive caster, KPI, trail and scrub
    expect(kpi).toBeGreaterThan(0);
    expect(trail).toBeGreaterThan(0);
    expect(scrub).toBeGreaterThan(0);
  });

  it('leaning moves the contact patch round the crown and tilts camber to ground but not to frame (Heron, lean 20)', () => {
    const { analysis: a } = solveAnalyse(demo('heron-tilting-velomobile'), { leanDeg: 20 });
    // Positive lean lowers the right side: the right wheel's top goes outward (to the right).
    expect(a.wheels.right.camberDeg).toBeGreaterThan(15);
    expect(a.wheels.left.camberDeg).toBeLessThan(-15);
    expect(Math.abs(a.wheels.right.camberToFrameDeg)).toBeLessThan(5);
    // Contact centre of the right tyre moves outward of the wheel centre as it leans out.
    expect(a.wheels.right.contactPatchMm.y).toBeGreaterThan(a.wheels.right.centreMm.y);
    expect(a.wheels.right.contactPatchMm.z).toBeCloseTo(0, 6);
  });
});

describe('camber change with steer (Milliken and Milliken, Race Car Vehicle Dynamics, 1995)', () => {
  // A design whose steering axis passes through the wheel centre: holding wheel travel
  // (contact 'travel'), steering then rotates the upright purely about the fixed axis, so
  // the wheel's spin axis follows a rotation about the inclined axis exactly.
  const casterDeg = 8;
  const kpiDeg = 12;
  function inclinedAxisDesign(): Doc {
    const d = kingpinTrike({ armInward: 20 });
    const tc = Math.tan(casterDeg * DEG);
    const tk = Math.tan(kpiDeg * DEG);
    // Right side, written once and mirrored. Axis direction (-tan caster, +tan KPI, 1): top
    // rearward and inward (+y is inward on the right). Through the wheel centre (0, -380, 230).
    const at = (z: number) => ({ x: -tc * (z - 230), y: -380 + tk * (z - 230), z });
    d.frontEnd.upper.outerJoint = at(330);
    d.frontEnd.lower.outerJoint = at(140);
    d.upright.steeringArmJoint = { x: -72, y: -345, z: 200 };
    return d;
  }

  it('follows the exact rotation about an axis with caster and KPI, and the small-angle form at small steer', () => {
    const design = resolveDoc(inclinedAxisDesign());
    const k0: V = [-Math.tan(casterDeg * DEG), -Math.tan(kpiDeg * DEG), 1]; // left wheel: inward is -y
    const n = Math.hypot(...k0);
    const k: V = [k0[0] / n, k0[1] / n, k0[2] / n];
    const a0: V = [0, 1, 0]; // left wheel spin axis (outward), zero toe and camber
    const heading = (t: number) => Math.atan2(-rotate(a0, k, t)[0], rotate(a0, k, t)[1]);
    const camberExact = (t: number) => -Math.asin(rotate(a0, k, t)[2]) / DEG; // left wheel: top out = -a_z
    const nu = casterDeg * DEG;
    const lambda = kpiDeg * DEG;
    // Small-angle form: camber ~ caster * theta + KPI * theta^2 / 2 (left wheel, theta > 0 = steer left).
    const camberSmall = (t: number) => (nu * t + (lambda * t * t) / 2) / DEG;
    let largeAngleGap = 0; // relative
    for (const steer of [2, 5, 15, 30, 40]) {
      const { analysis: a } = solveAnalyse(design, { wheelAngleDeg: steer }, { contact: 'travel', steerBy: 'leftWheel' });
      // Rotation about the axis that gives this heading (bisection on the exact relation).
      let lo = 0;
      let hi = 60 * DEG;
      for (let i = 0; i < 80; i++) {
        const mid = (lo + hi) / 2;
        if (heading(mid) < steer * DEG) lo = mid;
        else hi = mid;
      }
      const theta = (lo + hi) / 2;
      expect(a.wheels.left.steerDeg).toBeCloseTo(steer, 9);
      expect(a.wheels.left.camberDeg).toBeCloseTo(camberExact(theta), 7);
      // The small-angle form drops terms of order angle^2 relative (axis tilts as tangents,
      // sin theta as theta): within 4 % up to 5 degrees of steer.
      const relative = Math.abs(a.wheels.left.camberDeg - camberSmall(theta)) / Math.abs(a.wheels.left.camberDeg);
      if (steer <= 5) expect(relative).toBeLessThan(0.04);
      else largeAngleGap = Math.max(largeAngleGap, relative);
      // Caster and KPI of the axis stay as built (the wishbones do not move).
      expect(a.wheels.left.casterDeg).toBeCloseTo(casterDeg, 6);
      expect(a.wheels.left.kpiDeg).toBeCloseTo(kpiDeg, 6);
      expect(a.wheels.left.spindleLengthMm).toBeCloseTo(0, 6);
    }
    // Negative control: at large steer the small-angle form is visibly off (about 10 % at 40
    // degrees), so the comparison above can tell the two apart.
    expect(largeAngleGap).toBeGreaterThan(0.06);
  });

  it('the inner wheel gains positive camber and the outer negative with caster (directional check)', () => {
    const { analysis: a } = solveAnalyse(resolveDoc(inclinedAxisDesign()), { wheelAngleDeg: 25 }, { contact: 'travel', steerBy: 'leftWheel' });
    expect(a.wheels.left.camberDeg).toBeGreaterThan(2); // inner (left turn)
    expect(a.wheels.right.camberDeg).toBeLessThan(0); // outer
  });
});

describe('camber: the wheel plane itself, and its front-view projection beside it', () => {
  it('steered about a vertical axis, the true camber stays put while the front-view projection follows tan(p) = tan(camber) / cos(steer)', () => {
    // A wheel of camber g turned by d about the vertical: its spin axis is the design axis
    // rotated about z, so its inclination from the ground normal stays g; its trace in the
    // front-view (y-z) plane leans by atan(tan g / cos d) (plane geometry of the rotated axis,
    // written out here from the Rodrigues rotation above).
    const doc = kingpinTrike({ armInward: 20 });
    doc.upright.staticCamberDeg = 2;
    const design = resolveDoc(doc);
    for (const steer of [0, 15, 30]) {
      const { analysis: a } = solveAnalyse(design, { wheelAngleDeg: steer }, { contact: 'travel', steerBy: 'leftWheel' });
      const w = a.wheels.left;
      const g = 2 * DEG;
      const axis = rotate([0, Math.cos(g), -Math.sin(g)], [0, 0, 1], w.steerDeg * DEG);
      const projected = Math.atan2(-axis[2], Math.hypot(axis[1])) / DEG;
      expect(w.camberDeg).toBeCloseTo(2, 7);
      expect(w.camberFrontViewDeg!).toBeCloseTo(projected, 7);
      expect(w.camberFrontViewDeg!).toBeCloseTo(Math.atan(Math.tan(g) / Math.cos(w.steerDeg * DEG)) / DEG, 7);
    }
  });
});
