/**
 * The lean-linkage measures (leanLinkageMeasures.ts) against closed forms computed here from
 * the posed points, independently of the finite differences the tool uses:
 * - motion ratio by virtual work / instant centres on a planar layout (every pivot axis along x,
 *   outer joints and wheel centre at x = 0, vertical steering axis, so the front view is exact):
 *   W. F. and D. L. Milliken, Race Car Vehicle Dynamics, SAE 1995, ch. 17 (installation ratio
 *   and the front-view instant centre);
 * - roll centre by the front-view construction of the same chapter: each side's line from the
 *   tyre contact point through the wishbones' instant centre; the frame's roll centre is where
 *   they meet (Kennedy's theorem of three centres; at zero lean the symmetric design's tyres do
 *   not slide sideways, so each upright turns about its contact point relative to the ground);
 * - the spring length change over a spring-travel sweep equals the reported motion ratio
 *   integrated over the mean wheel travel (trapezoid rule), on the Pipit demo.
 */
import { describe, expect, it } from 'vitest';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { validateDesign } from '../../../core/design/validateDesign';
import type { DesignFile, ResolvedDesign } from '../../../core/design/types';
import { buildMechanism, type PoseMode } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { leanLinkageMeasures, rollAxis } from '../../../core/analysis/leanLinkageMeasures';
import { pipitDoc } from '../mechanism/pipitDemo';

const GROUND: PoseMode = { contact: 'ground', steerBy: 'handlebar' };
const inputs = (p: Partial<PoseInputs>): PoseInputs => ({ ...zeroInputs(), ...p });
type P = [number, number, number];

/** The Pipit made planar in the front view: outer joints and wheel centre at x = 0, steering axis vertical. */
function resolveDoc(d: DesignFile): ResolvedDesign {
  const v = validateDesign(d);
  if (!v.ok) throw new Error(v.issues.map((i) => i.message).join('\n'));
  return resolveDesign(v.design);
}

function planarDoc(): DesignFile {
  const d = pipitDoc();
  if (d.frontEnd.kind !== 'splitWishbones') throw new Error('expected split wishbones');
  d.frontEnd.upper.outerJoint = { x: 0, y: -330, z: 330 };
  d.frontEnd.lower.outerJoint = { x: 0, y: -330, z: 150 };
  d.upright.wheelCentre = { x: 0, y: -400, z: 245 };
  // On the lower wishbone's line from its pivots (y -60, z 140) to its outer joint, at y = -200.
  d.leanLinkage!.pushLinks.armJoint = { x: 0, y: -200, z: 140 + (10 * 140) / 270 };
  const v = validateDesign(d);
  if (!v.ok) throw new Error(v.issues.map((i) => i.message).join('\n'));
  return d;
}

function posed(solver: PoseSolver): Map<string, P> {
  const m = solver.mechanism;
  const out = new Map<string, P>();
  for (const p of m.graph.points) {
    const w: P = [0, 0, 0];
    m.worldPoint(p.body, p.design, w);
    out.set(p.id, w);
  }
  return out;
}

/** Where the y-z lines a1-a2 and b1-b2 meet (front view). */
function meet(a1: P, a2: P, b1: P, b2: P): [number, number] {
  const [ay, az] = [a2[1] - a1[1], a2[2] - a1[2]];
  const [by, bz] = [b2[1] - b1[1], b2[2] - b1[2]];
  const den = ay * bz - az * by;
  const t = ((b1[1] - a1[1]) * bz - (b1[2] - a1[2]) * by) / den;
  return [a1[1] + t * ay, a1[2] + t * az];
}

describe('lean-linkage measures against closed forms', () => {
  const planar: ResolvedDesign = resolveDesign(planarDoc());

  it('motion ratio = carrier speed / wheel-centre vertical speed from the lever arms (virtual work), at three spring travels', () => {
    const solver = new PoseSolver(buildMechanism(planar, GROUND));
    const slide: P = [0, 0, 1]; // the Pipit's carrier slides straight up toward the frame mount
    for (const travel of [-15, 0, 25]) {
      solver.solve(inputs({ heaveMm: travel }));
      const p = posed(solver);
      const P0 = p.get('frontEnd.lower.frontPivot.right')!;
      const Bl = p.get('frontEnd.lower.outerJoint.right')!;
      const Pu = p.get('frontEnd.upper.frontPivot.right')!;
      const Bu = p.get('frontEnd.upper.outerJoint.right')!;
      const W = p.get('upright.wheelCentre.right')!;
      const J = p.get('leanLinkage.pushLinks.armJoint.right')!;
      const R = p.get('leanLinkage.rocker.linkJoint.right')!;
      // Per unit lower-wishbone angular speed w about x: v(J) = x × (J - P0) = (0, -(Jz - Pz), Jy - Py).
      const vJ: P = [0, -(J[2] - P0[2]), J[1] - P0[1]];
      const l = Math.hypot(J[0] - R[0], J[1] - R[1], J[2] - R[2]);
      const u: P = [(J[0] - R[0]) / l, (J[1] - R[1]) / l, (J[2] - R[2]) / l];
      // A rigid push link: u . v(J) = u . v(R); the rocker does not turn in symmetric heave, so v(R) = v_c * slide.
      const vc = (u[0] * vJ[0] + u[1] * vJ[1] + u[2] * vJ[2]) / (u[0] * slide[0] + u[1] * slide[1] + u[2] * slide[2]);
      // The upright turns about the wishbones' instant centre I at w_u = w (Bl - P0).(Bl - I) / |Bl - I|^2.
      const [Iy, Iz] = meet(P0, Bl, Pu, Bu);
      const k = ((Bl[1] - P0[1]) * (Bl[1] - Iy) + (Bl[2] - P0[2]) * (Bl[2] - Iz)) / ((Bl[1] - Iy) ** 2 + (Bl[2] - Iz) ** 2);
      const vW = k * (W[1] - Iy);
      const closed = vc / vW;
      const m = leanLinkageMeasures(planar, GROUND, inputs({ heaveMm: travel }))!;
      expect(m.motionRatio).not.toBeNull();
      expect(Math.abs(m.motionRatio! - closed)).toBeLessThan(1e-6);
      expect(closed).toBeGreaterThan(0.3);
    }
  });

  it('roll centre height at zero lean = the front-view construction through the contact points and instant centres, at three spring travels', () => {
    const solver = new PoseSolver(buildMechanism(planar, GROUND));
    const heights: number[] = [];
    for (const travel of [-8, 0, 8]) {
      solver.solve(inputs({ heaveMm: travel }));
      const p = posed(solver);
      const [Iy, Iz] = meet(p.get('frontEnd.lower.frontPivot.right')!, p.get('frontEnd.lower.outerJoint.right')!, p.get('frontEnd.upper.frontPivot.right')!, p.get('frontEnd.upper.outerJoint.right')!);
      // The upright's instant centre relative to the ground. By symmetry at zero lean the two
      // lowest tyre points move sideways alike, so the mean-y row holds each still across; each
      // stays on the ground too. With zero toe the crown circle's centre K, straight above the
      // lowest point by the crown radius r, is a point of the upright (the wheel plane turns
      // only about x here), and it moves as that lowest point does: not at all in the front
      // view. So the upright turns about K relative to the ground, and about the wishbones'
      // instant centre relative to the frame; the frame's roll centre is on the line through
      // both (Kennedy), on the centre line by symmetry. For r -> 0, K is the contact point of
      // Milliken's construction. K is found from the posed wheel here, independently of the tool.
      const W = p.get('upright.wheelCentre.right')!;
      const wheel = solver.mechanism.graph.wheels.find((w) => w.side === 'right')!;
      const a = [0, 0, 0];
      solver.mechanism.worldDirection(wheel.body, wheel.spinAxis, a);
      const s = Math.sqrt(1 - a[2] * a[2]);
      const k = wheel.rollingRadius - wheel.crownRadius;
      const C: [number, number] = [W[1] + (k * a[2] * a[1]) / s, W[2] + (k * (a[2] * a[2] - 1)) / s];
      const closed = C[1] + ((Iz - C[1]) * (0 - C[0])) / (Iy - C[0]);
      const m = leanLinkageMeasures(planar, GROUND, inputs({ heaveMm: travel }))!;
      expect(m.rollAxis!.lateralAtAxleMm!).toBeCloseTo(0, 6);
      // 1e-3 mm: the tool's central step of 0.05 deg leaves an O(d^2) error (measured here: under
      // 6e-5 mm, shrinking 16-fold per halving of d twice), and the Heron steering's bump steer turns
      // the wheel plane off the front view as the wheel travels (toe 0.16 deg at 25 mm of spring
      // travel gave a 7e-3 mm gap, 0.02 deg at -15 mm 4e-4 mm; so the travels here stay within 8 mm).
      expect(Math.abs(m.rollAxis!.heightAtAxleMm! - closed)).toBeLessThan(1e-3);
      expect(m.rollAxis!.groundPointXMm).toBeNull();
      expect(m.rollAxis!.groundPointReason).toMatch(/parallel to the ground/);
      heights.push(closed);
    }
    // The three positions are different cases (the construction moves with heave).
    expect(Math.abs(heights[0] - heights[2])).toBeGreaterThan(1);
  });

  it('a parallelogram whose uprights lean with the frame rolls about the crown circles: roll centre at the crown radius r', () => {
    // Equal, parallel, level wishbones: the uprights stay parallel to the frame, each wishbone
    // pair's instant centre is at infinity along the level arms, so each side's line runs level
    // through its crown-circle centre, at height r; by symmetry the roll centre is on the centre
    // line, at height r: a circle rolling on a line turns about its contact point, and the
    // frame with the tyres' crowns about the crown centres' line (geometry, derived here).
    for (const crown of [20, 5]) {
      const d = planarDoc();
      if (d.frontEnd.kind !== 'splitWishbones') throw new Error('expected split wishbones');
      d.frontEnd.upper = { frontPivot: { x: 100, y: -60, z: 320 }, rearPivot: { x: -100, y: -60, z: 320 }, outerJoint: { x: 0, y: -330, z: 320 } };
      d.frontEnd.lower = { frontPivot: { x: 120, y: -60, z: 150 }, rearPivot: { x: -120, y: -60, z: 150 }, outerJoint: { x: 0, y: -330, z: 150 } };
      d.leanLinkage!.pushLinks.armJoint = { x: 0, y: -200, z: 150 };
      d.wheels.front.crownRadiusMm = crown;
      const r = resolveDoc(d);
      const m = leanLinkageMeasures(r, GROUND, inputs({}))!;
      // 1e-4 mm: the tool's finite step of 0.05 deg either side leaves about 1.2e-5 mm here (measured).
      expect(Math.abs(m.rollAxis!.heightAtAxleMm! - crown)).toBeLessThan(1e-4);
      expect(m.rollAxis!.lateralAtAxleMm!).toBeCloseTo(0, 6);
    }
  });

  it('the spring length change over a spring-travel sweep is the motion ratio integrated over the wheel travel (trapezoid rule)', () => {
    const design = resolveDesign(pipitDoc());
    for (const lean of [0, 15]) {
      const solver = new PoseSolver(buildMechanism(design, GROUND));
      const frame = solver.mechanism.graph.frameBody;
      const zs: number[] = [];
      const ratios: number[] = [];
      const springs: number[] = [];
      for (let s = -20; s <= 30 + 1e-9; s += 2.5) {
        solver.solve(inputs({ leanDeg: lean, heaveMm: s }));
        const m = solver.mechanism;
        const r = m.rot.subarray(9 * frame, 9 * frame + 9);
        const t = m.trans.subarray(3 * frame, 3 * frame + 3);
        let z = 0;
        for (const w of m.graph.wheels) {
          const c = [0, 0, 0];
          m.worldPoint(w.body, w.centre, c);
          z += (r[6] * (c[0] - t[0]) + r[7] * (c[1] - t[1]) + r[8] * (c[2] - t[2])) / 2;
        }
        zs.push(z);
        const measured = leanLinkageMeasures(design, GROUND, inputs({ leanDeg: lean, heaveMm: s }))!;
        ratios.push(measured.motionRatio!);
        springs.push(measured.springLengthMm);
      }
      let integral = 0;
      for (let i = 1; i < zs.length; i++) integral += ((ratios[i] + ratios[i - 1]) / 2) * (zs[i] - zs[i - 1]);
      const change = springs[springs.length - 1] - springs[0];
      expect(change).toBeCloseTo(50, 9); // heaveMm is spring extension on this layout
      // Compression (-change) = integral of the ratio over the bump; the trapezoid's own error is the tolerance.
      expect(Math.abs(-change - integral)).toBeLessThan(0.01);
    }
  });

  it('the roll axis of a pure rotation about a known inclined line is that line (three.js-free check of the screw formula)', () => {
    // Frame poses rotated about the line through q along n by -e, 0, +e (Rodrigues' formula, written out).
    const n: P = [Math.cos(0.1), 0, Math.sin(0.1)];
    const q: P = [0, 30, 250];
    const pose = (a: number) => {
      const c = Math.cos(a);
      const s = Math.sin(a);
      const r = new Array<number>(9);
      for (let col = 0; col < 3; col++) {
        const e: P = [col === 0 ? 1 : 0, col === 1 ? 1 : 0, col === 2 ? 1 : 0];
        const dot = n[0] * e[0] + n[1] * e[1] + n[2] * e[2];
        const cr: P = [n[1] * e[2] - n[2] * e[1], n[2] * e[0] - n[0] * e[2], n[0] * e[1] - n[1] * e[0]];
        for (let row = 0; row < 3; row++) r[3 * col + row] = e[row] * c + cr[row] * s + n[row] * dot * (1 - c);
      }
      // t = q - R q (the origin's image), so points on the line stay put.
      const t: P = [0, 0, 0];
      for (let row = 0; row < 3; row++) t[row] = q[row] - (r[row] * q[0] + r[3 + row] * q[1] + r[6 + row] * q[2]);
      return { r, t };
    };
    const e = 0.05 * (Math.PI / 180);
    const ra = rollAxis(pose(-e), pose(0), pose(e), 2 * e);
    expect(ra.inclinationDeg).toBeCloseTo(0.1 * (180 / Math.PI), 9);
    expect(ra.heightAtAxleMm!).toBeCloseTo(250, 6);
    expect(ra.lateralAtAxleMm!).toBeCloseTo(30, 6);
    expect(ra.groundPointXMm!).toBeCloseTo(-250 / Math.tan(0.1), 4);
  });
});
