/**
 * `tiltbench report` on a leaning rear pair (the Plover) has a rear-pair sheet: each rear
 * wheel's camber and toe against lean, and the four-wheel turn centre with every wheel's slip
 * angle in turns. Read back with a general-purpose HTML parser (jsdom) and compared with
 * `tiltbench pose --json` (analysis.rear) at the same poses. Other rears have no such sheet.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { JSDOM } from 'jsdom';
import { beforeAll, describe, expect, it } from 'vitest';
import { DESIGNS, run, WREN } from './cliHarness';

const PLOVER = join(DESIGNS, 'plover-tilting-quad.tiltsheet');

function cellValue(doc: Document, field: string): number {
  const el = doc.querySelector(`[data-field="${field}"]`);
  expect(el, `no cell ${field}`).not.toBeNull();
  return Number(el!.getAttribute('data-value') ?? NaN);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- JSON read back
async function rearAt(lean: number, handlebar: number): Promise<any> {
  const r = await run(['pose', PLOVER, '--lean', String(lean), '--steer', String(handlebar), '--json']);
  expect(r.code, r.err).toBe(0);
  return JSON.parse(r.out).analysis.rear;
}

describe('report: leaning rear pair sheet, read back', () => {
  let doc: Document;
  let wrenDoc: Document;

  beforeAll(async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-report-rear-'));
    const out = join(dir, 'plover.html');
    const r = await run(['report', PLOVER, '--out', out, '--lean-step', '5', '--steer-step', '5', '--map-step', '5']);
    expect(r.code, r.err).toBe(0);
    doc = new JSDOM(readFileSync(out, 'utf8')).window.document;
    const wrenOut = join(dir, 'wren.html');
    const w = await run(['report', WREN, '--out', wrenOut, '--steer-step', '5', '--map-step', '5']);
    expect(w.code, w.err).toBe(0);
    wrenDoc = new JSDOM(readFileSync(wrenOut, 'utf8')).window.document;
  }, 240_000);

  it('is there on the Plover only', () => {
    expect(doc.querySelectorAll('#rear-pair-lean tbody tr').length).toBe(5);
    expect(doc.querySelectorAll('#rear-pair-turns tbody tr').length).toBe(6);
    expect(wrenDoc.querySelector('#rear-pair-sheet')).toBeNull();
    expect(doc.querySelector('#lean-linkage-sheet')).toBeNull();
  });

  it('rear camber and toe against lean equal pose --json', async () => {
    for (const lean of [-30, 15, 30]) {
      const rear = await rearAt(lean, 0);
      const k = `rear.lean.${lean.toFixed(1)}`;
      for (const side of ['left', 'right'] as const) {
        expect(cellValue(doc, `${k}.${side}.camberDeg`)).toBeCloseTo(rear[side].camberDeg, 6);
        expect(cellValue(doc, `${k}.${side}.camberToFrameDeg`)).toBeCloseTo(rear[side].camberToFrameDeg, 6);
        expect(cellValue(doc, `${k}.${side}.toeDeg`)).toBeCloseTo(rear[side].toeDeg, 6);
      }
    }
  }, 120_000);

  it('the four-wheel turn centre and slips equal pose --json in each turn', async () => {
    for (const [lean, bar] of [[0, 30], [0, -15], [15, -15]]) {
      const tc = (await rearAt(lean, bar)).turnCentre;
      const k = `rear.turn.${lean.toFixed(1)}.${bar.toFixed(1)}`;
      expect(cellValue(doc, `${k}.centreYM`)).toBeCloseTo(tc.centreMm.y / 1000, 6);
      expect(cellValue(doc, `${k}.lineSpreadMm`)).toBeCloseTo(tc.lineSpreadMm, 6);
      expect(cellValue(doc, `${k}.slip.frontLeftDeg`)).toBeCloseTo(tc.slipDeg.frontLeftDeg, 6);
      expect(cellValue(doc, `${k}.slip.rearRightDeg`)).toBeCloseTo(tc.slipDeg.rearRightDeg, 6);
      expect(cellValue(doc, `${k}.worstSlipDeg`)).toBeCloseTo(tc.worstSlipDeg, 6);
      // A left turn (handlebar +) has its centre on the left (y > 0), a right turn on the right.
      expect(Math.sign(cellValue(doc, `${k}.centreYM`))).toBe(Math.sign(bar));
    }
  }, 120_000);
});
