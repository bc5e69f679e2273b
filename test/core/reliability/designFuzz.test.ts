/**
 * Issue 5, bad designs: property tests over generated designs near the demos (hardpoints
 * moved, ratios, radii, toe and camber changed, sides made asymmetric) and far from them
 * (vehicles of random proportions; uniformly random geometry inside the schema's bounds).
 *
 * For every design: validation either accepts it or rejects it with messages that name a
 * field. For every accepted design, every pose in posePlan (inside the envelope, at its
 * corners, far past it; tyres on the ground, wheel travel held, steering by road-wheel angle;
 * cold and warm starts) ends as `converged` or a named failure; nothing throws; the result,
 * the snapshot and the one-shot analysis hold no NaN or Infinity; each solve stays within its
 * iteration bound and under SOLVE_TIME_LIMIT_MS; and a converged pose really closes, checked
 * on the snapshot independently of the solver's residuals (poseChecks.closureProblems).
 *
 * fast-check runs with a fixed seed; FUZZ_RUNS scales the number of designs.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { loadDemos } from './demoDesigns';
import { nearDesignArb, plausibleDesignArb, wildDesignArb, type GeneratedDesign } from './designArbitraries';
import { exerciseDesign, installLmCounter, singlePoseProblems } from './poseChecks';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';

const tally = new FigureTally('designs');
let uninstall: () => void = () => {};
beforeAll(() => {
  uninstall = installLmCounter();
});
afterAll(() => {
  uninstall();
  tally.write();
});

let counter = 0;

/** The whole check for one generated design; throws with every problem listed. */
function checkDesign(g: GeneratedDesign): void {
  const index = counter++;
  const label = `${g.origin} (design ${index})`;
  let validated: ReturnType<typeof validateDesign>;
  try {
    validated = validateDesign(g.design);
  } catch (e) {
    throw new Error(`${label}: validateDesign threw: ${(e as Error).stack}\n${JSON.stringify(g.design)}`);
  }
  if (!validated.ok) {
    tally.design(false, validated.issues[0]?.path);
    // Rejected: every message names the field it is about.
    expect(validated.issues.length).toBeGreaterThan(0);
    for (const issue of validated.issues) {
      expect(issue.path, issue.message).not.toBe('');
      expect(issue.message.startsWith(`${issue.path}:`), issue.message).toBe(true);
    }
    return;
  }
  tally.design(true);
  const design = resolveDesign(validated.design);
  const problems = exerciseDesign(design, index, tally, label);
  if (index % 4 === 0) {
    const lean = design.vehicle.tilting ? design.envelope.leanDeg : 0;
    problems.push(
      ...singlePoseProblems(
        design,
        { contact: 'ground', steerBy: 'handlebar', leanDeg: lean, handlebarDeg: design.envelope.handlebarDeg, heaveMm: 0, travelRightMm: 0, travelLeftMm: 0, wheelAngleDeg: 0 },
        tally,
        `${label} solveSinglePose`,
      ),
    );
  }
  if (problems.length > 0) {
    throw new Error(`${problems.length} problem(s):\n${problems.slice(0, 12).join('\n')}\ndesign: ${JSON.stringify(g.design)}`);
  }
}

describe('fuzzed designs: every pose converges or fails by name, nothing escapes, nothing non-finite', () => {
  const demos = loadDemos();

  it('near the demos: moved hardpoints, scaled ratios and radii, asymmetric sides', () => {
    fc.assert(fc.property(nearDesignArb(demos), checkDesign), { numRuns: runs(800), seed: fuzzSeed(), endOnFailure: true });
  }, 300_000);

  it('far from the demos: vehicles of random proportions and layouts', () => {
    fc.assert(fc.property(plausibleDesignArb, checkDesign), { numRuns: runs(600), seed: fuzzSeed() + 1, endOnFailure: true });
  }, 300_000);

  it('far from the demos: geometry uniformly random inside the schema bounds (0.3 m to 11 m)', () => {
    fc.assert(fc.property(wildDesignArb, checkDesign), { numRuns: runs(600), seed: fuzzSeed() + 2, endOnFailure: true });
  }, 300_000);

  it('exercised what it claims: most families were accepted and solved, with converged poses and named failures', () => {
    // Guards the fuzz itself: a generator that only produced rejected designs, or a solver
    // that only failed, would make the properties above pass without testing anything.
    const d = tally.data;
    expect(d.designsFuzzed).toBeGreaterThanOrEqual(runs(2000));
    expect(d.designsAccepted / d.designsFuzzed).toBeGreaterThan(0.5);
    expect(d.statuses.converged ?? 0).toBeGreaterThan(d.posesSolved * 0.1);
    expect((d.statuses['cannot-assemble'] ?? 0) + (d.statuses['did-not-converge'] ?? 0) + (d.statuses.singular ?? 0)).toBeGreaterThan(0);
  });
});
