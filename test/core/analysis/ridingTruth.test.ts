// Riding truth: a tilting vehicle judged where it is ridden, and numbers at the edges that
// are right or absent with their reason.
//
// Outside references:
// - Steady-turn balance of a leaning vehicle, tan(lean) = v^2 / (g R) (point mass; V. Cossalter,
//   Motorcycle Dynamics, 2nd ed., 2006, steady turning: from memory), with standard gravity
//   g = 9.80665 m/s^2 (3rd CGPM, 1901; ISO 80000-3).
// - Ackermann geometry and the turning circle: T. D. Gillespie, Fundamentals of Vehicle
//   Dynamics, 1992, low-speed turning; SAE J695.
import { describe, it, expect } from 'vitest';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { solveRide } from '../../../core/analysis/ridePose';
import { balancedLeanDeg, balancedSpeedKmh, inRidingRegion, regionWords, STANDARD_GRAVITY } from '../../../core/analysis/ridingRegion';
import { steerLimits } from '../../../core/analysis/limits';
import { runSweep } from '../../../core/analysis/sweep';
import { demo, demoDoc, resolveDoc, solveAnalyse } from './helpers';

const DEG = Math.PI / 180;

describe('the balanced turn', () => {
  it('the ride input finds the lean of the closed-form balance, tan(lean) = v^2 / (g R), at three speeds and two handlebar angles', () => {
    const design = demo('heron-tilting-velomobile');
    for (const handlebarDeg of [4, -6]) {
      for (const speedKmh of [10, 15, 20]) {
        const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
        const ride = solveRide(engine, speedKmh, { ...zeroInputs(), handlebarDeg }, false);
        const a = ride.pose.analysis!;
        expect(a).not.toBeNull();
        // The closed form, from the turn radius of the pose the linkage reached.
        const R = a.slip.turnRadiusMm! / 1000;
        const v = speedKmh / 3.6;
        const expected = Math.atan((v * v) / (9.80665 * R)) / DEG;
        const intoTurn = handlebarDeg > 0 ? -1 : 1; // a left turn leans left: negative lean (ISO 8855 roll)
        expect(ride.leanDeg).toBeCloseTo(intoTurn * expected, 5);
        expect(Math.abs(ride.balanceResidualDeg!)).toBeLessThan(1e-5);
        expect(ride.lateralG!).toBeCloseTo((v * v) / (9.80665 * R), 9);
        expect(a.inputs.leanDeg).toBe(ride.leanDeg);
      }
    }
    expect(STANDARD_GRAVITY).toBe(9.80665);
  });

  it('past the lean limit the ride input stops at the limit and says the balance is not reached there', () => {
    const design = demo('heron-tilting-velomobile');
    const ride = solveRide(new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' }), 45, { ...zeroInputs(), handlebarDeg: 3 }, false);
    expect(Math.abs(ride.leanDeg)).toBe(design.riding.maxLeanDeg);
    expect(Math.abs(ride.balanceResidualDeg!)).toBeGreaterThan(1);
    expect(ride.notes.join(' ')).toMatch(/no balance within the lean limit/);
  });

  it('balanced lean and balanced speed invert each other; straight ahead balances upright', () => {
    const turn = { side: 'left' as const, radiusMm: 12_000 };
    const lean = balancedLeanDeg(25, turn);
    expect(lean).toBeLessThan(0);
    expect(balancedSpeedKmh(lean, turn)!).toBeCloseTo(25, 9);
    expect(balancedSpeedKmh(-lean, turn)).toBeNull(); // leaning out of the turn balances at no speed
    expect(balancedLeanDeg(40, { side: 'straight' })).toBe(0);
  });

  it('the operating region: balanced leans over the riding speeds, widened by the band, cut by the lean and grip limits', () => {
    const riding = { minKmh: 10, maxKmh: 30, maxLeanDeg: 30, transientBandDeg: 3, gripG: 0.8 };
    const turn = { side: 'right' as const, radiusMm: 20_000 };
    const lo = Math.atan((10 / 3.6) ** 2 / (9.80665 * 20)) / DEG;
    const hi = Math.atan((30 / 3.6) ** 2 / (9.80665 * 20)) / DEG;
    expect(inRidingRegion(lo - 2.9, turn, riding, true).inside).toBe(true);
    expect(inRidingRegion(lo - 3.1, turn, riding, true).inside).toBe(false);
    expect(inRidingRegion(hi + 2.9, turn, riding, true).inside).toBe(true);
    expect(inRidingRegion(hi + 3.1, turn, riding, true).inside).toBe(false);
    expect(inRidingRegion(-lo, turn, riding, true).inside).toBe(false); // countersteer: leaning out of the turn
    expect(regionWords(inRidingRegion(31, { side: 'straight' }, riding, true), 31, riding)).toMatch(/lean limit/);
    // So tight that even the lowest speed needs more than the grip: v^2 / R > 0.8 g at 10 km/h.
    const tight = { side: 'left' as const, radiusMm: 900 };
    expect((10 / 3.6) ** 2 / (9.80665 * 0.9)).toBeGreaterThan(0.8);
    expect(regionWords(inRidingRegion(-10, tight, riding, true), -10, riding)).toMatch(/too tight/);
    expect(regionWords(inRidingRegion(-lo, turn, riding, true), -lo, riding)).toMatch(/balanced turn here leans/);
    // A vehicle that does not lean rides at lean 0 only.
    expect(inRidingRegion(0, turn, riding, false).inside).toBe(true);
  });

  it('a sweep marks countersteer corners as outside the region and balanced poses as inside', () => {
    const design = demo('heron-tilting-velomobile');
    const cells: { lean: number; bar: number; inside: boolean }[] = [];
    runSweep(design, { leanDeg: [-20, 0, 20], handlebarDeg: [-10, 0, 10], travelMm: [0] }, {}, (c) => cells.push({ lean: c.leanDeg, bar: c.handlebarDeg, inside: c.region.inside }));
    const at = (lean: number, bar: number) => cells.find((c) => c.lean === lean && c.bar === bar)!.inside;
    expect(at(20, 10)).toBe(false); // leaning right while steering left
    expect(at(-20, -10)).toBe(false);
    expect(at(0, 0)).toBe(true);
    expect(at(20, 0)).toBe(false); // 20 deg of lean going straight is past the 5 deg band
  });
});

describe('self-steer and the steering-ratio change', () => {
  it('self-steer is the road-wheel angle at zero handlebar, here minus upright, whatever the handlebar (independent cold solves)', () => {
    const design = demo('heron-tilting-velomobile');
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    const a = engine.solve({ ...zeroInputs(), leanDeg: 15, handlebarDeg: 6 }).analysis!;
    const straight = solveAnalyse(design, { leanDeg: 15 }).analysis;
    const upright = solveAnalyse(design, {}).analysis;
    expect(a.selfSteer.leftDeg!).toBeCloseTo(straight.wheels.left.steerDeg - upright.wheels.left.steerDeg, 8);
    expect(a.selfSteer.rightDeg!).toBeCloseTo(straight.wheels.right.steerDeg - upright.wheels.right.steerDeg, 8);
  });

  it('the ratio change compares road-wheel degrees per handlebar degree here with upright at the same handlebar (independent cold solves)', () => {
    const design = demo('swift-parallelogram-trike');
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    const a = engine.solve({ ...zeroInputs(), leanDeg: -20, handlebarDeg: 8 }).analysis!;
    const mean = (lean: number, bar: number) => solveAnalyse(design, { leanDeg: lean, handlebarDeg: bar }).analysis.steering.meanWheelDeg;
    const gain = (lean: number) => (mean(lean, 8.25) - mean(lean, 7.75)) / 0.5;
    expect(a.steering.ratioChangePct!).toBeCloseTo(100 * (gain(-20) / gain(0) - 1), 6);
    expect(Math.abs(a.steering.ratioChangePct!)).toBeGreaterThan(0.1); // a real change to compare, not 0 = 0
  });
});

describe('numbers at the edges', () => {
  it('Ackermann and turning circle are null with "straight ahead" when static toe alone turns the wheels; present at 5 deg', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    doc.upright.staticToeDeg = 0.4;
    const design = resolveDoc(doc);
    for (const bar of [0, 0.3, -0.3]) {
      const a = solveAnalyse(design, { handlebarDeg: bar }).analysis;
      expect(a.ackermann.percent).toBeNull();
      expect(a.ackermann.reason).toMatch(/straight ahead/);
      expect(a.turningCircle.turningDiameterMm).toBeNull();
      expect(a.turningCircle.reason).toMatch(/straight ahead/);
    }
    const turning = solveAnalyse(design, { handlebarDeg: 5 }).analysis;
    expect(Math.abs(turning.ackermann.innerDeg!)).toBeGreaterThan(1);
    expect(turning.ackermann.percent).not.toBeNull();
    expect(turning.turningCircle.turningDiameterMm).not.toBeNull();
    // Gillespie's relation, cot(outer) - cot(inner) = t / L, bounds a sane percentage: the
    // figure is a few tens to a few hundred percent, not thousands.
    expect(Math.abs(turning.ackermann.percent!)).toBeLessThan(1000);
  });

  it('a mirror-symmetric design reports mirror-symmetric steering limits and statuses', () => {
    const doc = demoDoc('heron-tilting-velomobile');
    doc.joints.tieRodInner.ratedDeg = 16;
    const design = resolveDoc(doc);
    const limits = steerLimits(design, [-12, 0, 12], { stepDeg: 2, maxHandlebarDeg: 80, toleranceDeg: 0.01 });
    for (const l of limits) {
      const mirror = limits.find((m) => m.leanDeg === -l.leanDeg)!;
      expect(l.left.kinds).toEqual(mirror.right.kinds);
      expect(l.left.handlebarDeg!).toBeCloseTo(-mirror.right.handlebarDeg!, 6);
      expect(l.left.leftWheelDeg!).toBeCloseTo(-mirror.right.rightWheelDeg!, 5);
      expect(l.left.detail!.replace(/left|right/g, 'side')).toBe(mirror.right.detail!.replace(/left|right/g, 'side'));
    }
  });
});
