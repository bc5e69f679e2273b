/**
 * `tiltbench fit`: measurements as CSV made from a design with a hardpoint moved by a known
 * amount (solved by the pose engine), fitted from the unmoved design; bad input refused with its
 * line and column, never written over an input. The recovery itself is checked against exact
 * least squares in test/core/studies/fit.test.ts.
 */
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run, WREN } from './cliHarness';
import { parseDesignText } from '../../core/design/validateDesign';
import { resolveDesign } from '../../core/design/resolveDesign';
import { PoseEngine } from '../../core/analysis/PoseEngine';
import { studyPoseInputs } from '../../core/studies/studyPoses';
import { resolveVariable } from '../../core/studies/tunePlan';
import { applyTuneOffsets } from '../../core/studies/tuneVariables';

function measurementCsv(movedMm: number): string {
  const r = parseDesignText(readFileSync(WREN, 'utf8'), WREN);
  if (!r.ok) throw new Error('demo does not load');
  const v = resolveVariable(r.design, { id: 'steering.tieRodJoint.left:y', rangeMm: [-5, 5] }, 'id');
  const engine = new PoseEngine(resolveDesign(applyTuneOffsets(r.design, [v], [movedMm])), { contact: 'ground', steerBy: 'handlebar' }, { findings: false });
  const rows = ['# made by the test from the Wren with the left rack end joint moved outward', 'lean_deg,handlebar_deg,travel_mm,side,quantity,value,weight'];
  for (const h of [-15, 0, 15]) {
    for (const t of [-20, 20]) {
      const a = engine.solve(studyPoseInputs({ leanDeg: 0, handlebarDeg: h, travelMm: t })).analysis!;
      for (const side of ['left', 'right'] as const) rows.push(`0,${h},${t},${side},toe_deg,${a.wheels[side].toeDeg},1`);
    }
  }
  return rows.join('\n') + '\n';
}

describe('tiltbench fit', () => {
  it('finds a moved point from measurements and writes the fitted design', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-fit-'));
    const csv = join(dir, 'm.csv');
    writeFileSync(csv, measurementCsv(2));
    const out = join(dir, 'fitted.tiltsheet');
    const r = await run(['fit', WREN, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y,frontEnd.upper.frontPivot:x', '--out', out, '--json']);
    expect(r.code, r.err).toBe(0);
    const report = JSON.parse(r.out) as { variables: { movedMm: number | null; identifiable: boolean }[]; notes: string[] };
    expect(Math.abs(report.variables[0].movedMm! - 2)).toBeLessThan(0.01);
    expect(report.variables[1].identifiable).toBe(false);
    const fitted = parseDesignText(readFileSync(out, 'utf8'), out);
    expect(fitted.ok).toBe(true);
    const text = await run(['fit', WREN, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y', '--out', out]);
    expect(text.code, text.err).toBe(0);
    expect(text.out).toMatch(/left rack end joint, outward\s+2\.00\d/);
    expect(text.out).toMatch(/CAUTION/);
  }, 120_000);

  it('refuses bad measurements with line and column, unknown ids, and output over an input', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-fit-'));
    const csv = join(dir, 'm.csv');
    const out = join(dir, 'fitted.tiltsheet');
    writeFileSync(csv, 'lean_deg,handlebar_deg,travel_mm,side,quantity,value\n0,0,0,left,toe_deg,zero\n');
    let r = await run(['fit', WREN, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y', '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/m\.csv:2:\d+: value: expected a number/);
    expect(existsSync(out)).toBe(false);
    writeFileSync(csv, measurementCsv(1));
    r = await run(['fit', WREN, '--measurements', csv, '--vary', 'no.such:x', '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/"no\.such:x" is not a hardpoint coordinate/);
    r = await run(['fit', WREN, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y', '--out', csv.replace('.csv', '.tiltsheet')]);
    expect(r.code).toBe(0);
    const copy = join(dir, 'd.tiltsheet');
    writeFileSync(copy, readFileSync(WREN));
    r = await run(['fit', copy, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y', '--out', copy]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/is the design given as input/);
    writeFileSync(csv, 'lean_deg,handlebar_deg,travel_mm,side,quantity,value\n5,0,0,left,toe_deg,0\n0,0,0,left,toe_deg,0\n0,1,0,left,toe_deg,0\n');
    r = await run(['fit', WREN, '--measurements', csv, '--vary', 'steering.tieRodJoint.left:y', '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/does not tilt/);
    expect(existsSync(out)).toBe(false);
  }, 120_000);
});
