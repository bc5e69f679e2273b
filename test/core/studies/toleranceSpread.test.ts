// Tolerance spread: repeatable with a seed, linear in the band for small bands, and in agreement
// with the first-order estimate from the sensitivity,
//   sigma_q^2 = sum_i (dq/dx_i sigma_i)^2
// (propagation of independent errors to first order; e.g. J. R. Taylor, An Introduction to
// Error Analysis, 2nd ed., 1997, chapter 3: from memory).
import { describe, it, expect } from 'vitest';
import { demoDoc } from '../analysis/helpers';
import { runToleranceSpread, type Spread, type ToleranceReport } from '../../../core/studies/toleranceSpread';
import { drawErrors, toleranceCoordinates } from '../../../core/studies/toleranceBands';
import { seededRandom } from '../../../core/studies/seededRandom';
import { StudyInputError, type StudyPose } from '../../../core/studies/studyPoses';

const heron = demoDoc('heron-tilting-velomobile');
const POSES: StudyPose[] = [
  { leanDeg: 20, handlebarDeg: -5, travelMm: 0 },
  { leanDeg: -10, handlebarDeg: 5, travelMm: 0 },
];

const spreadOf = (r: ToleranceReport, id: string): Spread => [...r.overPoses, ...r.atPoses].find((s) => s.id === id)!;
const withoutTimes = (r: ToleranceReport) => ({ ...r, elapsedMs: null });
/** Quantities at the first pose the checks below compare. */
const AT_POSE = ['selfSteer.left@0', 'selfSteer.right@0', 'slip.left@0', 'leastJointMargin@0'];

describe('tolerance spread', () => {
  it('is repeatable with a seed and differs with another seed; the seed is recorded', () => {
    const run = (seed: number) => runToleranceSpread(heron, { samples: 12, seed, bands: { defaultMm: 0.2 }, poses: POSES });
    const a = run(5);
    const b = run(5);
    const c = run(6);
    expect(withoutTimes(b)).toEqual(withoutTimes(a));
    expect(a.seed).toBe(5);
    expect(spreadOf(c, 'selfSteer.left@0').summary!.mean).not.toBe(spreadOf(a, 'selfSteer.left@0').summary!.mean);
    expect(a.samplesMeasured).toBe(12);
  }, 60_000);

  it('its standard deviation scales linearly with the band for small bands (same seed: the same errors, scaled)', () => {
    const run = (band: number) => runToleranceSpread(heron, { samples: 40, seed: 3, bands: { defaultMm: band }, poses: POSES });
    const small = run(0.05);
    const double = run(0.1);
    for (const id of AT_POSE) {
      const ratio = spreadOf(double, id).summary!.std / spreadOf(small, id).summary!.std;
      // First order the ratio is exactly 2; curvature adds a part of order band x q''/q', which
      // on these quantities is a few parts in 10,000 at 0.1 mm (allow 0.25 %).
      expect(Math.abs(ratio - 2), `${id}: ${ratio}`).toBeLessThan(0.005);
    }
  }, 60_000);

  it('the Monte Carlo standard deviation agrees with the first-order estimate for a small band', () => {
    const N = 400;
    const r = runToleranceSpread(heron, { samples: N, seed: 17, bands: { defaultMm: 0.1 }, poses: POSES });
    expect(r.notAssembled).toBe(0);
    // The sample standard deviation of N normal values has a relative standard error of about
    // 1 / sqrt(2 (N - 1)) = 3.5 % (from memory, any statistics text); allow 15 % (about 4 of them).
    for (const id of AT_POSE) {
      const s = spreadOf(r, id);
      const ratio = s.summary!.std / s.firstOrderSigma!;
      expect(Math.abs(ratio - 1), `${id}: Monte Carlo ${s.summary!.std}, first order ${s.firstOrderSigma}`).toBeLessThan(0.15);
      // Negative control: had the band been read as the uniform distribution's (sigma = band / sqrt 3
      // instead of band / 3), the estimate would be off by sqrt 3 and the check above would fail.
      expect(Math.abs(s.summary!.std / (s.firstOrderSigma! * Math.sqrt(3)) - 1)).toBeGreaterThan(0.15);
      // The drivers are the terms of the same sum.
      expect(s.drivers.reduce((sum, d) => sum + d.sharePct, 0)).toBeLessThanOrEqual(100 + 1e-9);
      expect(s.drivers[0].sigma).toBeGreaterThanOrEqual(s.drivers[1].sigma);
    }
  }, 60_000);

  it('first-order sampling reproduces its own estimate; uniform bands are sqrt 3 wider in sigma and never exceeded', () => {
    const normal = runToleranceSpread(heron, { samples: 10_000, seed: 2, bands: { defaultMm: 0.1 }, poses: POSES, method: 'first-order' });
    const uniform = runToleranceSpread(heron, { samples: 10_000, seed: 2, bands: { defaultMm: 0.1 }, poses: POSES, method: 'first-order', distribution: 'uniform' });
    for (const id of AT_POSE.slice(0, 3)) {
      const n = spreadOf(normal, id);
      const u = spreadOf(uniform, id);
      // 10,000 samples: relative standard error of a standard deviation 0.7 %; allow 3 %.
      expect(Math.abs(n.summary!.std / n.firstOrderSigma! - 1), id).toBeLessThan(0.03);
      expect(Math.abs(u.summary!.std / u.firstOrderSigma! - 1), id).toBeLessThan(0.03);
      expect(u.firstOrderSigma! / n.firstOrderSigma!).toBeCloseTo(Math.sqrt(3), 10);
    }
    const coords = toleranceCoordinates(heron, { defaultMm: 0.1 }, 'uniform');
    const e = new Float64Array(coords.length);
    const rng = seededRandom(9);
    let largest = 0;
    for (let k = 0; k < 2000; k++) for (const v of drawErrors(coords, 'uniform', rng, e)) largest = Math.max(largest, Math.abs(v));
    expect(largest).toBeLessThanOrEqual(0.1);
    expect(largest).toBeGreaterThan(0.099);
  }, 60_000);

  it('bands per point and axis; a band of 0 leaves a point out; unknown points and bad bands refused', () => {
    const coords = toleranceCoordinates(heron, { defaultMm: 0.2, points: { 'spring.armMount': 0, 'upright.wheelCentre.right': { z: 0.5 } } }, 'normal');
    expect(coords.some((c) => c.coordinate.key === 'spring.armMount')).toBe(false);
    expect(coords.find((c) => c.coordinate.id === 'upright.wheelCentre.right:z')!.sigmaMm).toBeCloseTo(0.5 / 3, 12);
    expect(coords.find((c) => c.coordinate.id === 'upright.wheelCentre.left:z')!.bandMm).toBe(0.2);
    expect(() => toleranceCoordinates(heron, { defaultMm: 0.2, points: { 'upright.nose': 1 } }, 'normal')).toThrow(StudyInputError);
    expect(() => toleranceCoordinates(heron, { defaultMm: 0.2, points: { 'upright.wheelCentre': { w: 1 } as never } }, 'normal')).toThrow(/not an axis/);
    expect(() => toleranceCoordinates(heron, { defaultMm: 9 }, 'normal')).toThrow(/from 0 to 5/);
  });

  it('counts samples that cannot be assembled instead of measuring them, and stops when asked', () => {
    // The kingpin parallelogram closes only while its geometry stays exact (see the sensitivity CLI test).
    const swift = runToleranceSpread(demoDoc('swift-parallelogram-trike'), { samples: 4, seed: 1, bands: { defaultMm: 0.3 }, poses: [{ leanDeg: -35, handlebarDeg: 15, travelMm: 0 }] });
    expect(swift.notAssembled).toBeGreaterThan(0);
    expect(swift.samplesMeasured).toBe(4 - swift.notAssembled);
    expect(swift.notAssembledExamples[0]).toMatch(/^sample \d+: /);
    let calls = 0;
    const stopped = runToleranceSpread(heron, { samples: 50, seed: 1, bands: { defaultMm: 0.1 }, poses: POSES, onProgress: () => calls++, shouldStop: () => calls > 80 });
    expect(stopped.cancelled).toBe(true);
    expect(stopped.samplesDone).toBeLessThan(50);
  }, 60_000);

  it('first-order values over poses where moved copies could not be assembled are absent, with the reason, not a spread over the rest', () => {
    const pose: StudyPose = { leanDeg: -35, handlebarDeg: 15, travelMm: 0 };
    const r = runToleranceSpread(demoDoc('swift-parallelogram-trike'), { samples: 200, seed: 1, bands: { defaultMm: 0.3 }, method: 'first-order', poses: [pose, { leanDeg: 0, handlebarDeg: 0, travelMm: 0 }] });
    expect(r.rateFailures.length).toBeGreaterThan(0);
    expect(r.rateFailures[0]).toMatch(/cannot close|short of closure/);
    const selfSteer = r.overPoses.find((x) => x.id === 'selfSteer')!;
    expect(selfSteer.summary).toBeNull();
    expect(selfSteer.firstOrderSigma).toBeNull();
  }, 60_000);
});
