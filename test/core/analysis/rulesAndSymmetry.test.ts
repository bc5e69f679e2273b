import { describe, it, expect } from 'vitest';
import { mirrorY } from '../../../core/design/resolveDesign';
import { demoDoc, parallelTrike, resolveDoc, solveAnalyse, type Doc } from './helpers';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';

/** Toe of both wheels at a lean, handlebar held at 0, tyres on the ground. */
function toeAtLean(doc: Doc, lean: number): { left: number; right: number } {
  const { analysis: a } = solveAnalyse(resolveDoc(doc), { leanDeg: lean });
  return { left: a.wheels.left.toeDeg, right: a.wheels.right.toeDeg };
}

describe('directional rules of the trade (common practice, no source)', () => {
  it('tie rod equal and parallel to equal parallel wishbones: no toe change with lean (control)', () => {
    const t = toeAtLean(parallelTrike({ armX: -70, rackY: -150 }), 20);
    expect(Math.abs(t.left)).toBeLessThan(1e-6);
    expect(Math.abs(t.right)).toBeLessThan(1e-6);
  });

  it('a shorter tie rod gives toe-out with lean for rearward arms, toe-in for forward arms; a longer one the opposite', () => {
    for (const lean of [15, -15]) {
      const shortRear = toeAtLean(parallelTrike({ armX: -70, rackY: -170 }), lean);
      const shortFwd = toeAtLean(parallelTrike({ armX: 70, rackY: -170 }), lean);
      const longRear = toeAtLean(parallelTrike({ armX: -70, rackY: -130 }), lean);
      const longFwd = toeAtLean(parallelTrike({ armX: 70, rackY: -130 }), lean);
      for (const side of ['left', 'right'] as const) {
        expect(shortRear[side]).toBeLessThan(-0.05); // toe-out
        expect(shortFwd[side]).toBeGreaterThan(0.05); // toe-in
        expect(longRear[side]).toBeGreaterThan(0.05);
        expect(longFwd[side]).toBeLessThan(-0.05);
      }
    }
  });

  it('the same holds for bump steer (wheel travel relative to the frame)', () => {
    const bump = (doc: Doc, t: number) => solveAnalyse(resolveDoc(doc), { travelLeftMm: t, travelRightMm: t }, { contact: 'travel' }).analysis.wheels.left.toeDeg;
    for (const t of [30, -30]) {
      expect(Math.abs(bump(parallelTrike({ rackY: -150 }), t))).toBeLessThan(1e-6);
      expect(bump(parallelTrike({ armX: -70, rackY: -170 }), t)).toBeLessThan(-0.05);
      expect(bump(parallelTrike({ armX: 70, rackY: -170 }), t)).toBeGreaterThan(0.05);
    }
  });

  it('a bell crank with a larger pivot-to-joint offset or a smaller joint spacing gives less toe change with steer', () => {
    // The fixture's crank turns about a vertical axis: pivot (-40, 0, 250), joints at
    // x = -80, y = +-60: offset 40 mm, spacing 120 mm. At the same inner road-wheel angle,
    // the toe change with steer is the difference of the two road-wheel angles.
    const base = (): Doc => {
      const d = demoDoc('heron-tilting-velomobile');
      d.steering = {
        kind: 'bellCrank',
        pivot: { x: -35, y: 0, z: 200 },
        axis: { x: 0, y: 0, z: 1 },
        tieRodJoint: { x: -75, y: -60, z: 200 },
        input: { kind: 'ratio', crankDegPerHandlebarDeg: 1 },
      };
      d.upright.steeringArmJoint = { x: -75, y: -345, z: 200 };
      return d;
    };
    const toeChange = (d: Doc) => {
      const { analysis: a } = solveAnalyse(resolveDoc(d), { wheelAngleDeg: 20 }, { steerBy: 'leftWheel' });
      return a.wheels.left.steerDeg - a.wheels.right.steerDeg; // inner minus outer: toe-out with steer
    };
    const b = toeChange(base());
    const offset = base();
    offset.steering.pivot.x = 5; // offset 80 mm
    const spacing = base();
    spacing.steering.tieRodJoint.y = -40; // spacing 80 mm
    expect(b).toBeGreaterThan(0.5); // rearward arms: the joints drawing together add toe-out
    expect(Math.abs(toeChange(offset))).toBeLessThan(Math.abs(b));
    expect(Math.abs(toeChange(spacing))).toBeLessThan(Math.abs(b));
  });
});

describe('mirror symmetry', () => {
  /** The Heron made asymmetric (left steering arm moved), and its mirror image (y -> -y, sides swapped). */
  function asymmetricPair(): { doc: Doc; mirrored: Doc } {
    const doc = demoDoc('heron-tilting-velomobile');
    const right = { x: -75, y: -341.4, z: 200 };
    const left = { x: -70, y: 338, z: 206 };
    doc.upright.steeringArmJoint = { right, left };
    doc.upright.staticToeDeg = { right: 0.3, left: -0.2 };
    doc.upright.staticCamberDeg = { right: 0.5, left: 1 };
    const mirrored = demoDoc('heron-tilting-velomobile');
    mirrored.upright.steeringArmJoint = { right: mirrorY(left), left: mirrorY(right) };
    mirrored.upright.staticToeDeg = { right: -0.2, left: 0.3 };
    mirrored.upright.staticCamberDeg = { right: 1, left: 0.5 };
    return { doc, mirrored };
  }

  it('mirrored hardpoints at mirrored inputs give equal magnitudes, left and right swapped, with the documented signs', () => {
    const { doc, mirrored } = asymmetricPair();
    for (const [lean, bar] of [
      [10, 15],
      [-20, 5],
      [0, -25],
    ]) {
      const a: PoseAnalysis = solveAnalyse(resolveDoc(doc), { leanDeg: lean, handlebarDeg: bar }).analysis;
      const m: PoseAnalysis = solveAnalyse(resolveDoc(mirrored), { leanDeg: -lean, handlebarDeg: -bar }).analysis;
      for (const [s, o] of [
        ['left', 'right'],
        ['right', 'left'],
      ] as const) {
        const w = a.wheels[s];
        const v = m.wheels[o];
        // Per-side conventions (toe-in, camber top-out, caster, KPI inward, trail, scrub inboard) keep their sign.
        for (const key of ['toeDeg', 'camberDeg', 'camberToFrameDeg', 'casterDeg', 'kpiDeg', 'trailMm', 'scrubRadiusMm', 'spindleLengthMm', 'travelMm'] as const) {
          expect(v[key]!).toBeCloseTo(w[key]!, 7);
        }
        // Yaw-like quantities change sign in a mirror.
        expect(v.steerDeg).toBeCloseTo(-w.steerDeg, 7);
        expect(m.slip[o].slipDeg).toBeCloseTo(-a.slip[s].slipDeg, 7);
        expect(v.contactPatchMm.y).toBeCloseTo(-w.contactPatchMm.y, 6);
        expect(m.suspension[o].motionRatio!).toBeCloseTo(a.suspension[s].motionRatio!, 7);
        for (const j of a.joints.filter((x) => x.side === s)) {
          const mj = m.joints.find((x) => x.side === o && x.joint === j.joint)!;
          expect(mj.articulationDeg).toBeCloseTo(j.articulationDeg, 6);
        }
        for (const c of a.clearances.filter((x) => x.side === s)) {
          expect(m.clearances.find((x) => x.side === o && x.pair === c.pair)!.distanceMm).toBeCloseTo(c.distanceMm, 5);
        }
      }
      if (a.ackermann.percent !== null) {
        expect(m.ackermann.percent!).toBeCloseTo(a.ackermann.percent, 5);
        expect(m.ackermann.innerSide).toBe(a.ackermann.innerSide === 'left' ? 'right' : 'left');
        expect(m.turningCircle.turningDiameterMm!).toBeCloseTo(a.turningCircle.turningDiameterMm!, 5);
      }
      // A roll centre given on one side of the mirror is given on the other (or neither, near parallel).
      if (a.suspension.rollCentreMm === null) expect(m.suspension.rollCentreMm).toBeNull();
      else {
        expect(m.suspension.rollCentreMm!.y).toBeCloseTo(-a.suspension.rollCentreMm.y, 4);
        expect(m.suspension.rollCentreMm!.z).toBeCloseTo(a.suspension.rollCentreMm.z, 4);
      }
      expect(m.inputs.handlebarDeg).toBe(-a.inputs.handlebarDeg);
    }
  });

  it('negative control: without swapping the sides the asymmetric design does not match its mirror', () => {
    const { doc } = asymmetricPair();
    const a = solveAnalyse(resolveDoc(doc), { leanDeg: 10, handlebarDeg: 15 }).analysis;
    const m = solveAnalyse(resolveDoc(doc), { leanDeg: -10, handlebarDeg: -15 }).analysis;
    expect(Math.abs(m.wheels.right.toeDeg - a.wheels.left.toeDeg)).toBeGreaterThan(0.01);
  });
});
