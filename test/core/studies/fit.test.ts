/**
 * Fit to a built vehicle (core/studies/fit.ts, measurementCsv.ts).
 * - Recovery: synthetic measurements made with hardpoints moved by known amounts (solved by the
 *   pose engine on the moved design) are fitted from the unmoved design; the fit must find the
 *   moves. A least-squares fit of exact data recovers the parameters exactly up to the solver's
 *   tolerance (any textbook on least squares; Numerical Recipes 15.4).
 * - The eigen-decomposition against SciPy (numpy.linalg.eigh, Debian python3-scipy/numpy).
 * - What the data cannot see: on the Wren the upper wishbone's pivots lie on a line along x, so
 *   sliding the front pivot along x moves no part (Euclid: a hinge is defined by its axis line).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseDesignText } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { DesignFile } from '../../../core/design/types';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { studyPoseInputs, type StudyPose } from '../../../core/studies/studyPoses';
import { resolveVariable } from '../../../core/studies/tunePlan';
import { applyTuneOffsets } from '../../../core/studies/tuneVariables';
import { FitInputError, runFit, symmetricEigen } from '../../../core/studies/fit';
import { readMeasurementCsv, type Measurement } from '../../../core/studies/measurementCsv';

const WREN = join(__dirname, '..', '..', '..', 'assets', 'designs', 'wren-rack-trike.tiltsheet');

function wren(): DesignFile {
  const r = parseDesignText(readFileSync(WREN, 'utf8'), WREN);
  if (!r.ok) throw new Error('demo does not load');
  return r.design;
}

const variable = (file: DesignFile, id: string) => resolveVariable(file, { id, rangeMm: [-20, 20] }, id);

/** Measurements of a design, solved by a pose engine of its own: toe and camber of both wheels. */
function measure(file: DesignFile): Measurement[] {
  const engine = new PoseEngine(resolveDesign(file), { contact: 'ground', steerBy: 'handlebar' }, { findings: false });
  const out: Measurement[] = [];
  for (const handlebarDeg of [-20, -10, 0, 10, 20]) {
    for (const travelMm of [-20, 0, 20]) {
      const pose: StudyPose = { leanDeg: 0, handlebarDeg, travelMm };
      const a = engine.solve(studyPoseInputs(pose)).analysis!;
      for (const side of ['left', 'right'] as const) {
        out.push({ line: out.length + 2, pose, side, quantity: 'toe_deg', value: a.wheels[side].toeDeg, weight: 1 });
        out.push({ line: out.length + 2, pose, side, quantity: 'camber_deg', value: a.wheels[side].camberDeg, weight: 1 });
      }
    }
  }
  return out;
}

describe('fit to a built vehicle', () => {
  it('recovers hardpoints moved by known amounts from measurements made with them', () => {
    const file = wren();
    const ids = ['steering.tieRodJoint.right:y', 'upright.steeringArmJoint.left:z', 'frontEnd.lower.outerJoint.right:z'];
    const truth = [1.5, -1.0, 2.0];
    const vars = ids.map((id) => variable(file, id));
    const built = applyTuneOffsets(file, vars, truth);
    const report = runFit(file, measure(built), vars);
    report.variables.forEach((v, j) => {
      expect(v.identifiable, v.words).toBe(true);
      expect(Math.abs(v.movedMm! - truth[j]), v.words).toBeLessThan(0.01);
    });
    expect(report.rmsBeforeDeg).toBeGreaterThan(0.01);
    expect(report.rmsAfterDeg).toBeLessThan(1e-4);
    for (const m of report.measurements) expect(Math.abs(m.residual!)).toBeLessThan(1e-3);
    // Negative control: fitting the unmoved design's own measurements moves nothing.
    const still = runFit(file, measure(file), vars);
    still.variables.forEach((v) => expect(Math.abs(v.movedMm!)).toBeLessThan(1e-4));
  }, 120_000);

  it('names a point the measurements cannot see and leaves it where it was', () => {
    const file = wren();
    const vars = [variable(file, 'steering.tieRodJoint.right:y'), variable(file, 'frontEnd.upper.frontPivot:x')];
    const built = applyTuneOffsets(file, vars, [1, 0]);
    const report = runFit(file, measure(built), vars);
    expect(report.variables[0].identifiable).toBe(true);
    expect(Math.abs(report.variables[0].movedMm! - 1)).toBeLessThan(0.01);
    expect(report.variables[1].identifiable).toBe(false);
    expect(report.variables[1].movedMm).toBeNull();
    expect(report.notes.join('\n')).toMatch(/upper wishbone front pivots.*cannot pin this point down/);
  }, 120_000);

  it('standard errors scale with the noise (first-order theory); too few measurements are refused', () => {
    const file = wren();
    const vars = [variable(file, 'steering.tieRodJoint.right:y')];
    const data = measure(applyTuneOffsets(file, vars, [1]));
    // Alternating +-e noise on every measurement: the standard error grows in proportion to e.
    const noisy = (e: number) => data.map((m, i) => ({ ...m, value: m.value + (i % 2 === 0 ? e : -e) }));
    const a = runFit(file, noisy(0.01), vars).variables[0].standardErrorMm!;
    const b = runFit(file, noisy(0.02), vars).variables[0].standardErrorMm!;
    expect(a).toBeGreaterThan(0);
    expect(b / a).toBeGreaterThan(1.8);
    expect(b / a).toBeLessThan(2.2);
    expect(() => runFit(file, data.slice(0, 2), vars)).toThrow(FitInputError);
    expect(() => runFit(file, data, [])).toThrow(/no variables/);
  }, 120_000);

  it('the eigen-decomposition agrees with numpy.linalg.eigh', () => {
    const a = [
      [4, 1, 0.5, 0],
      [1, 3, 0.2, 0.1],
      [0.5, 0.2, 2, 1e-3],
      [0, 0.1, 1e-3, 1e-9],
    ];
    const ours = symmetricEigen(a).values.sort((x, y) => x - y);
    const script = 'import json, sys, numpy\nprint(json.dumps(sorted(numpy.linalg.eigh(numpy.array(json.loads(sys.argv[1])))[0].tolist())))';
    const theirs = JSON.parse(execFileSync('python3', ['-c', script, JSON.stringify(a)], { encoding: 'utf8' })) as number[];
    ours.forEach((v, i) => expect(Math.abs(v - theirs[i])).toBeLessThan(1e-12));
  });
});

describe('measurement CSV', () => {
  const header = 'lean_deg,handlebar_deg,travel_mm,side,quantity,value,weight';
  it('reads rows, comments, quotes, CRLF and an empty weight', () => {
    const r = readMeasurementCsv(`# prototype, 3 Dec\r\n${header}\r\n0,10,0,left,toe_deg,0.25,2\r\n5,"0",-10,right,"camber_deg",-1.5,\r\n`, 'm.csv');
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.measurements).toHaveLength(2);
      expect(r.measurements[0]).toMatchObject({ line: 3, side: 'left', quantity: 'toe_deg', value: 0.25, weight: 2, pose: { leanDeg: 0, handlebarDeg: 10, travelMm: 0 } });
      expect(r.measurements[1]).toMatchObject({ line: 4, weight: 1, pose: { leanDeg: 5, handlebarDeg: 0, travelMm: -10 } });
    }
  });
  it.each([
    [`${header}\n0,10,0,middle,toe_deg,0.25,1\n`, /m\.csv:2:8: side: expected left or right/],
    [`${header}\n0,10,0,left,toe,0.25,1\n`, /m\.csv:2:13: quantity: expected one of/],
    [`${header}\n0,10mm,0,left,toe_deg,0.25,1\n`, /m\.csv:2:3: handlebar_deg: expected a number in deg/],
    [`${header}\n0,10,0,left,toe_deg\n`, /m\.csv:2:\d+: expected 7 fields/],
    [`lean_deg,handlebar_deg,travel_mm,side,quantity,valu\n`, /m\.csv:1:\d+: unknown column "valu"/],
    [`${header}\n`, /no measurements/],
    [`${header}\n0,10,0,left,toe_deg,"0.25,1\n`, /m\.csv:2:\d+: a quoted field is never closed/],
    [`${header}\n0,10,0,left,toe_deg,1e400,1\n`, /m\.csv:2:\d+: value: 1e400 is outside/],
  ])('refuses %j naming line and column', (text, says) => {
    const r = readMeasurementCsv(text, 'm.csv');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.join('\n')).toMatch(says);
  });
});
