/**
 * `tiltbench report` on a lean-linkage design (the Pipit) has a lean-linkage sheet: the rocker
 * angle, stop margin, spring and actuator lengths and the roll axis against lean, the spring
 * length, motion ratio and wheel travel against spring travel, and the lean at the stops. Read
 * back with a general-purpose HTML parser (jsdom) and compared with `tiltbench pose --json`
 * (its leanLinkage block) at the same poses. A design without a lean linkage has no such sheet.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { JSDOM } from 'jsdom';
import { beforeAll, describe, expect, it } from 'vitest';
import { DESIGNS, HERON, run } from './cliHarness';

const PIPIT = join(DESIGNS, 'pipit-balance-beam-trike.tiltsheet');

/** The exact value a numeric cell carries (data-value), NaN when absent. */
function cellValue(doc: Document, field: string): number {
  const el = doc.querySelector(`[data-field="${field}"]`);
  expect(el, `no cell ${field}`).not.toBeNull();
  return Number(el!.getAttribute('data-value') ?? NaN);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- JSON read back
async function poseJson(args: string[]): Promise<any> {
  const r = await run(['pose', PIPIT, ...args, '--json']);
  expect(r.code, r.err).toBe(0);
  return JSON.parse(r.out);
}

describe('report: lean-linkage sheet, read back', () => {
  let doc: Document;
  let heronDoc: Document;

  beforeAll(async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-report-lean-'));
    const out = join(dir, 'pipit.html');
    const r = await run(['report', PIPIT, '--out', out, '--lean-step', '5', '--steer-step', '5', '--map-step', '5']);
    expect(r.code, r.err).toBe(0);
    doc = new JSDOM(readFileSync(out, 'utf8')).window.document;
    const heronOut = join(dir, 'heron.html');
    const h = await run(['report', HERON, '--out', heronOut, '--lean-step', '5', '--steer-step', '5', '--map-step', '5']);
    expect(h.code, h.err).toBe(0);
    heronDoc = new JSDOM(readFileSync(heronOut, 'utf8')).window.document;
  }, 240_000);

  it('the sheet is there on the Pipit, with the caution in the report, and absent on the Heron', () => {
    expect(doc.querySelector('#lean-linkage-sheet h2')?.textContent).toBe('Lean linkage (balance beam)');
    expect(doc.querySelectorAll('#lean-linkage-lean tbody tr').length).toBe(5);
    expect(doc.querySelectorAll('#lean-linkage-travel tbody tr').length).toBe(5);
    expect(doc.body.textContent).toMatch(/design aid/);
    expect(heronDoc.querySelector('#lean-linkage-sheet')).toBeNull();
  });

  it('against lean: each figure equals pose --json at that lean', async () => {
    for (const lean of [-25, 12.5, 25]) {
      const p = await poseJson(['--lean', String(lean)]);
      const l = p.leanLinkage;
      const k = `lean.${lean.toFixed(1)}`;
      expect(cellValue(doc, `${k}.rockerDeg`)).toBeCloseTo(l.rockerDeg, 6);
      expect(cellValue(doc, `${k}.stopMarginDeg`)).toBeCloseTo(l.stopMarginDeg, 6);
      expect(cellValue(doc, `${k}.springLengthMm`)).toBeCloseTo(l.springLengthMm, 6);
      expect(cellValue(doc, `${k}.actuatorLengthMm`)).toBeCloseTo(l.actuatorLengthMm, 6);
      expect(cellValue(doc, `${k}.rollAxis.heightAtAxleMm`)).toBeCloseTo(l.rollAxis.heightAtAxleMm, 6);
      expect(cellValue(doc, `${k}.rollAxis.lateralAtAxleMm`)).toBeCloseTo(l.rollAxis.lateralAtAxleMm, 6);
    }
    // The rocker turns against the lean and the spring holds (the layout's point): both signs seen.
    expect(cellValue(doc, 'lean.25.0.rockerDeg') * cellValue(doc, 'lean.-25.0.rockerDeg')).toBeLessThan(0);
  }, 120_000);

  it('against spring travel: spring length, motion ratio and wheel travel equal pose --json at that heave', async () => {
    for (const t of [-10, 7.5, 15]) {
      const p = await poseJson(['--heave', String(-t)]);
      const l = p.leanLinkage;
      const k = `travel.${t.toFixed(1)}`;
      expect(l.springTravelMm).toBeCloseTo(t, 6);
      expect(cellValue(doc, `${k}.springLengthMm`)).toBeCloseTo(l.springLengthMm, 6);
      expect(cellValue(doc, `${k}.motionRatio`)).toBeCloseTo(l.motionRatio, 6);
      expect(cellValue(doc, `${k}.wheelTravelMm`)).toBeCloseTo(p.analysis.wheels.left.travelMm, 6);
    }
  }, 120_000);

  it('the lean at the stops equals pose --json upright', async () => {
    const p = await poseJson(['--lean', '0']);
    expect(cellValue(doc, 'leanAtStop.positive')).toBeCloseTo(p.leanLinkage.leanAtStopDeg.positive, 6);
    expect(cellValue(doc, 'leanAtStop.negative')).toBeCloseTo(p.leanLinkage.leanAtStopDeg.negative, 6);
  }, 60_000);
});
