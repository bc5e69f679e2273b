// Seeded solves (solveSeeds.ts): a moved copy of a design started from the original's solution
// of the same pose reaches the same pose as a solve from its own design position (the answer
// is unique on the branch, so both must agree to the solver's tolerance), in fewer iterations:
// the first Newton step from there is the implicit-function tangent of the change.
import { describe, it, expect } from 'vitest';
import { demoDoc, resolveDoc } from './helpers';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { SeedBook } from '../../../core/analysis/solveSeeds';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import type { PoseAnalysis } from '../../../core/analysis/analysisTypes';

const POSES = [
  { leanDeg: 20, handlebarDeg: -8 },
  { leanDeg: -12, handlebarDeg: 5 },
  { leanDeg: 0, handlebarDeg: 15 },
].map((p) => ({ ...zeroInputs(), ...p }));

function moved() {
  const doc = demoDoc('heron-tilting-velomobile');
  doc.upright.steeringArmJoint.z += 0.5;
  doc.steering.tieRodJoint.y -= 0.3;
  return resolveDoc(doc);
}

function run(engine: PoseEngine): { analyses: PoseAnalysis[]; iterations: number } {
  let iterations = 0;
  const analyses = POSES.map((p) => {
    const r = engine.solve(p);
    iterations += r.result.iterations;
    return r.analysis!;
  });
  return { analyses, iterations };
}

describe('seeded solves of a moved design', () => {
  const book = new SeedBook();
  run(new PoseEngine(resolveDoc(demoDoc('heron-tilting-velomobile')), { contact: 'ground', steerBy: 'handlebar' }, { findings: false, seeds: { record: book } }));
  const seeded = run(new PoseEngine(moved(), { contact: 'ground', steerBy: 'handlebar' }, { findings: false, seeds: { replay: book } }));
  const plain = run(new PoseEngine(moved(), { contact: 'ground', steerBy: 'handlebar' }, { findings: false }));

  it('records a seed for every solve the engine made (main, side and upright solvers)', () => {
    expect(book.size).toBeGreaterThan(POSES.length * 3);
  });

  it('reach the same poses and measures as solves from the design position', () => {
    for (let i = 0; i < POSES.length; i++) {
      const a = seeded.analyses[i];
      const b = plain.analyses[i];
      expect(a.wheels.left.toeDeg).toBeCloseTo(b.wheels.left.toeDeg, 7);
      expect(a.wheels.right.camberDeg).toBeCloseTo(b.wheels.right.camberDeg, 7);
      expect(a.selfSteer.leftDeg!).toBeCloseTo(b.selfSteer.leftDeg!, 7);
      expect(a.steering.ratioChangePct!).toBeCloseTo(b.steering.ratioChangePct!, 5);
    }
  });

  it('in fewer solver iterations', () => {
    expect(seeded.iterations).toBeLessThan(plain.iterations);
  });

  it('a seed of a mechanism of another shape is refused and the solve goes on from its own start', () => {
    const other = new SeedBook();
    run(new PoseEngine(resolveDoc(demoDoc('swift-parallelogram-trike')), { contact: 'ground', steerBy: 'handlebar' }, { findings: false, seeds: { record: other } }));
    const r = run(new PoseEngine(moved(), { contact: 'ground', steerBy: 'handlebar' }, { findings: false, seeds: { replay: other } }));
    expect(r.analyses.every((a) => a !== null)).toBe(true);
    expect(r.analyses[0].wheels.left.toeDeg).toBeCloseTo(plain.analyses[0].wheels.left.toeDeg, 7);
  });
});
