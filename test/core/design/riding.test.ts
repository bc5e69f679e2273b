/**
 * The optional riding block (issue 9): speed range, lean limit, transient band, grip. Absent
 * or partial, it resolves with the defaults (common practice, no source: see DEFAULT_RIDING);
 * bad values are refused with the field's path, the unit expected and the value found.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { resolveDesign, unresolveDesign } from '../../../core/design/resolveDesign';
import { DEFAULT_RIDING, type DesignFile } from '../../../core/design/types';
import { validateDesign, type DesignIssue } from '../../../core/design/validateDesign';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Doc = any;

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');
const minimal = (): Doc => JSON.parse(FIXTURE_TEXT);

function accepted(json: Doc): DesignFile {
  const result = validateDesign(json);
  if (!result.ok) throw new Error(result.issues.map((i) => i.message).join('\n'));
  return result.design;
}

function issuesOf(json: Doc): DesignIssue[] {
  const result = validateDesign(json, 'trike.tiltsheet');
  if (result.ok) throw new Error('expected the design to be refused');
  return result.issues;
}

describe('riding: defaults', () => {
  it('a design without the block resolves with every default, the lean limit from the envelope', () => {
    const json = minimal();
    expect(json.riding).toBeUndefined();
    const r = resolveDesign(accepted(json));
    expect(r.riding).toEqual({ ...DEFAULT_RIDING, maxLeanDeg: json.envelope.leanDeg });
    // The documented defaults themselves (DEFAULT_RIDING's comment), so a silent change shows.
    expect(DEFAULT_RIDING).toEqual({ minKmh: 5, maxKmh: 45, transientBandDeg: 5, gripG: 0.8 });
  });

  it('fills only the values a partial block leaves out', () => {
    const json = minimal();
    json.riding = { maxKmh: 30, gripG: 0.6 };
    expect(resolveDesign(accepted(json)).riding).toEqual({ minKmh: 5, maxKmh: 30, maxLeanDeg: 35, transientBandDeg: 5, gripG: 0.6 });
  });

  it('a vehicle that does not tilt accepts a lean limit and ignores it', () => {
    const json = minimal();
    json.vehicle.tilting = false;
    json.envelope.leanDeg = 0;
    json.riding = { maxLeanDeg: 30 };
    expect(resolveDesign(accepted(json)).riding.maxLeanDeg).toBe(0);
  });

  it('writes back only what differs from the defaults, and round-trips', () => {
    const json = minimal();
    json.riding = { minKmh: 8, maxLeanDeg: 35 }; // 35 is the envelope's lean: a default
    const r = resolveDesign(accepted(json));
    const back = unresolveDesign(r);
    expect(back.riding).toEqual({ minKmh: 8 });
    expect(resolveDesign(back)).toEqual(r);
    expect(unresolveDesign(resolveDesign(accepted(minimal()))).riding).toBeUndefined();
  });
});

describe('riding: refused values name the field, the unit and the value', () => {
  const cases: { what: string; riding: Record<string, unknown>; path: string; contains: string[] }[] = [
    { what: 'a zero speed', riding: { minKmh: 0 }, path: 'riding.minKmh', contains: ['km/h', 'greater than 0', 'found 0'] },
    { what: 'a negative speed', riding: { maxKmh: -10 }, path: 'riding.maxKmh', contains: ['km/h', 'found -10'] },
    { what: 'a speed given as text', riding: { maxKmh: '40' }, path: 'riding.maxKmh', contains: ['a finite number in km/h', 'found "40"'] },
    { what: 'no grip', riding: { gripG: 0 }, path: 'riding.gripG', contains: ['in g', 'greater than 0', 'found 0'] },
    { what: 'more grip than a road tyre has', riding: { gripG: 1.6 }, path: 'riding.gripG', contains: ['at most 1.5', 'found 1.6'] },
    { what: 'a negative band', riding: { transientBandDeg: -1 }, path: 'riding.transientBandDeg', contains: ['degrees', 'found -1'] },
    { what: 'a lean limit past the envelope', riding: { maxLeanDeg: 40 }, path: 'riding.maxLeanDeg', contains: ['at most envelope.leanDeg (35 degrees)', 'found 40'] },
    { what: 'a range upside down', riding: { minKmh: 30, maxKmh: 20 }, path: 'riding.maxKmh', contains: ['above riding.minKmh (30 km/h)', 'found 20'] },
    { what: 'a top speed under the default lowest', riding: { maxKmh: 3 }, path: 'riding.maxKmh', contains: ['above riding.minKmh (5 km/h, the default)', 'found 3'] },
    { what: 'a lowest speed over the default top', riding: { minKmh: 50 }, path: 'riding.minKmh', contains: ['below riding.maxKmh (45 km/h, the default)', 'found 50'] },
    { what: 'a misspelt field', riding: { maxKph: 40 }, path: 'riding.maxKph', contains: ['unknown field', 'did you mean "maxKmh"'] },
  ];
  for (const c of cases) {
    it(c.what, () => {
      const json = minimal();
      json.riding = c.riding;
      const issues = issuesOf(json);
      expect(issues.map((i) => i.path)).toEqual([c.path]);
      expect(issues[0].message.startsWith(`trike.tiltsheet: ${c.path}: `)).toBe(true);
      for (const part of c.contains) expect(issues[0].message).toContain(part);
    });
  }

  it('equal bounds are refused too (a range needs two speeds), but a valid range passes (negative control)', () => {
    const json = minimal();
    json.riding = { minKmh: 20, maxKmh: 20 };
    expect(issuesOf(json).map((i) => i.path)).toEqual(['riding.maxKmh']);
    json.riding = { minKmh: 20, maxKmh: 20.5, maxLeanDeg: 35, transientBandDeg: 0, gripG: 1.5 };
    expect(validateDesign(json).ok).toBe(true);
  });
});
