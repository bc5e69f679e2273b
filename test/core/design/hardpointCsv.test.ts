/**
 * Hardpoint tables (core/design/hardpointCsv.ts): export, exact round trip, edits, and import
 * errors that name line and column.
 *
 * The CSV reading rules checked here are RFC 4180's (comma separated, double-quoted fields with
 * "" for a quote); the row count and the values are checked against an enumeration written
 * here, independently of the module: every {x, y, z} object in the design that is not a
 * direction, sided ones counted once per side with y mirrored for the left (types.ts: a single
 * value is the right side, mirrored y -> -y).
 */
import { readFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exportHardpointCsv, hardpointIds, importHardpointCsv } from '../../../core/design/hardpointCsv';
import { parseDesignText, validateDesign } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';
import { clone, loadDemos } from '../reliability/demoDesigns';
import { nearDesignArb } from '../reliability/designArbitraries';

const demos = loadDemos();
const heron = demos[0].design;
const FROZEN = parseDesignText(readFileSync(new URL('../../fixtures/fuzz-format-1.tiltsheet', import.meta.url), 'utf8'), 'fuzz-format-1.tiltsheet');
if (!FROZEN.ok) throw new Error('the frozen sample does not load');
const frozen = FROZEN.design;

const DIRECTIONS = new Set(['axis', 'pivotAxis', 'columnAxis', 'studAxis']);

/** Hardpoints found by walking the design's plain data: [id, x, y, z]. */
function enumerate(d: DesignFile): [string, number, number, number][] {
  const out: [string, number, number, number][] = [];
  const isVec = (v: unknown): v is { x: number; y: number; z: number } =>
    typeof v === 'object' && v !== null && typeof (v as { z?: unknown }).z === 'number' && typeof (v as { x?: unknown }).x === 'number';
  const walk = (v: unknown, path: string[]) => {
    if (typeof v !== 'object' || v === null || Array.isArray(v)) return;
    const key = path[path.length - 1];
    if (DIRECTIONS.has(key)) return;
    const o = v as Record<string, unknown>;
    if (isVec(o)) {
      out.push([path.join('.'), o.x, o.y, o.z]);
      return;
    }
    if ('right' in o && 'left' in o && isVec(o.right)) {
      out.push([[...path, 'right'].join('.'), (o.right as { x: number }).x, (o.right as { y: number }).y, (o.right as { z: number }).z]);
      const l = o.left as { x: number; y: number; z: number };
      out.push([[...path, 'left'].join('.'), l.x, l.y, l.z]);
      return;
    }
    for (const [k, child] of Object.entries(o)) walk(child, [...path, k]);
  };
  // Single points of sided fields: the walk above sees them as plain vectors; split them.
  walk(d, []);
  const sided = new Set(['frontPivot', 'rearPivot', 'outerJoint', 'steeringArmJoint', 'wheelCentre', 'tieRodJoint', 'frameMount', 'armMount']);
  // The lean linkage's sided points are its link and arm joints; its mounts are centre points.
  const leanSided = new Set(['linkJoint', 'armJoint']);
  return out.flatMap(([id, x, y, z]) => {
    const last = id.split('.').pop()!;
    if (!(id.startsWith('leanLinkage.') ? leanSided : sided).has(last)) return [[id, x, y, z] as [string, number, number, number]];
    return [
      [`${id}.right`, x, y, z] as [string, number, number, number],
      [`${id}.left`, x, y === 0 ? 0 : -y, z] as [string, number, number, number],
    ];
  });
}

/** Exact JSON, telling -0 from 0. */
const exact = (v: unknown) => JSON.stringify(v, (_, x) => (Object.is(x, -0) ? '-0' : x));

/** The rows of a table as [id, x, y, z], the id being point and side as enumerate() writes it. */
function rowsOf(csv: string): string[][] {
  return csv
    .trimEnd()
    .split('\n')
    .slice(1)
    .map((l) => l.split(','))
    .map(([point, side, ...xyz]) => [side === 'centre' ? point : `${point}.${side}`, ...xyz]);
}

describe('exportHardpointCsv', () => {
  it('writes the header and one row per hardpoint, both sides of a mirrored point', () => {
    const csv = exportHardpointCsv(heron);
    expect(csv.split('\n')[0]).toBe('point,side,x_mm,y_mm,z_mm');
    expect(csv.endsWith('\n')).toBe(true);
    const rows = rowsOf(csv).map(([id, x, y, z]) => [id, Number(x), Number(y), Number(z)]);
    const expected = enumerate(heron);
    expect(new Map(rows.map((r) => [r[0], r.slice(1)]))).toEqual(new Map(expected.map((r) => [r[0], r.slice(1)])));
    expect(rows.map((r) => r[0])).toContain('frontEnd.upper.outerJoint.right');
    expect(rows.find((r) => r[0] === 'upright.wheelCentre.left')).toEqual(['upright.wheelCentre.left', 0, 400, 245]);
  });

  it('lists every hardpoint of every demo and of the frozen sample (two-sided fields, drag link, spring)', () => {
    for (const d of [...demos.map((x) => x.design), frozen]) {
      const ids = rowsOf(exportHardpointCsv(d)).map((r) => r[0]);
      expect(ids.sort()).toEqual(enumerate(d).map((r) => r[0]).sort());
      expect(hardpointIds(d).sort()).toEqual(ids);
    }
    expect(hardpointIds(frozen)).toContain('steering.input.columnArmJoint');
  });

  it('matches the stored table of the frozen sample (a format change must not move a hardpoint)', () => {
    const stored = readFileSync(new URL('../../fixtures/fuzz-format-1.hardpoints.csv', import.meta.url), 'utf8');
    expect(exportHardpointCsv(frozen)).toBe(stored);
  });
});

describe('importHardpointCsv: round trip and edits', () => {
  it('gives back the identical design for the demos and the frozen sample', () => {
    for (const d of [...demos.map((x) => x.design), frozen]) {
      const back = importHardpointCsv(d, exportHardpointCsv(d), 'table.csv');
      expect(back.ok).toBe(true);
      if (back.ok) expect(exact(back.design)).toBe(exact(d));
    }
  });

  it('gives back the identical design for perturbed designs, -0 and shortest-form numbers included (property)', () => {
    fc.assert(
      fc.property(nearDesignArb(demos), (g) => {
        if (!validateDesign(g.design).ok) return;
        const back = importHardpointCsv(g.design, exportHardpointCsv(g.design), 'table.csv');
        expect(back.ok).toBe(true);
        if (back.ok) expect(exact(back.design)).toBe(exact(g.design));
      }),
      { numRuns: 300, seed: 4242 },
    );
    const d = clone(heron);
    d.upright.wheelCentre = { x: -0, y: -400.00000000000006, z: 245.1 + 1e-13 };
    const back = importHardpointCsv(d, exportHardpointCsv(d), 'table.csv');
    expect(back.ok && exact(back.design)).toBe(exact(d));
  });

  it('changes only the edited point; a one-sided edit writes both sides out', () => {
    const csv = exportHardpointCsv(heron).replace('upright.wheelCentre,left,0,400,245', 'upright.wheelCentre,left,1.5,401,244');
    const r = importHardpointCsv(heron, csv, 'table.csv');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const want = clone(heron);
    want.upright.wheelCentre = { right: { x: 0, y: -400, z: 245 }, left: { x: 1.5, y: 401, z: 244 } };
    expect(r.design).toEqual(want);
  });

  it('keeps a mirrored point mirrored when both sides move alike', () => {
    const csv = exportHardpointCsv(heron)
      .replace('upright.wheelCentre,right,0,-400,245', 'upright.wheelCentre,right,2,-405,250')
      .replace('upright.wheelCentre,left,0,400,245', 'upright.wheelCentre,left,2,405,250');
    const r = importHardpointCsv(heron, csv, 'table.csv');
    expect(r.ok && r.design.upright.wheelCentre).toEqual({ x: 2, y: -405, z: 250 });
  });

  it('reads rows in any order, CRLF line ends, a BOM, blank lines, spaces, quoted fields and an upper-case header', () => {
    const rows = exportHardpointCsv(heron).trimEnd().split('\n');
    const [header, ...body] = rows;
    const shuffled = [header.toUpperCase(), '', ...body.reverse().map((l, i) => (i % 3 === 0 ? l.split(',').map((f) => ` "${f}" `).join(',') : l.replace(/,/g, ' , ')))];
    const r = importHardpointCsv(heron, `\uFEFF${shuffled.join('\r\n')}\r\n\r\n`, 'table.csv');
    expect(r.ok, r.ok ? '' : r.issues.map((i) => i.message).join('\n')).toBe(true);
    if (r.ok) expect(exact(r.design)).toBe(exact(heron));
  });

  it('does not change the design it is given', () => {
    const d = clone(heron);
    const before = exact(d);
    importHardpointCsv(d, exportHardpointCsv(d).replace(',-60,310', ',-61,311'), 'table.csv');
    importHardpointCsv(d, 'garbage', 'table.csv');
    expect(exact(d)).toBe(before);
  });
});

describe('importHardpointCsv: refusals name line and column', () => {
  const good = exportHardpointCsv(heron);
  const lines = good.split('\n');
  const lineOf = (prefix: string) => lines.findIndex((l) => l.startsWith(prefix)) + 1;
  const refuse = (csv: string) => {
    const r = importHardpointCsv(heron, csv, 'table.csv');
    expect(r.ok).toBe(false);
    return r.ok ? [] : r.issues;
  };
  const PIVOT = 'steering.pivot,centre,-75,0,107';

  it('a header with an unknown column, at that column; a header missing one, at its end', () => {
    const [unknown] = refuse(good.replace('point,side,x_mm,y_mm,z_mm', 'point,side,x,y_mm,z_mm'));
    expect(unknown).toMatchObject({ line: 1, column: 12 });
    expect(unknown.message).toBe('table.csv:1:12: column 3 of the header is "x", not a column of the hardpoint table; expected point,side,x_mm,y_mm,z_mm (and optionally note)');
    const [missing] = refuse(good.replace('point,side,x_mm,y_mm,z_mm', 'point,side,x_mm,y_mm'));
    expect(missing).toMatchObject({ line: 1, column: 21 });
    expect(missing.message).toMatch(/the header has no z_mm column/);
    const [twice] = refuse(good.replace('point,side,x_mm,y_mm,z_mm', 'point,side,x_mm,y_mm,z_mm,X_MM'));
    expect(twice.message).toBe('table.csv:1:27: the header names x_mm twice (columns 3 and 6)');
  });

  it('a row with too few or too many fields (a decimal comma splits a number)', () => {
    const n = lineOf('steering.pivot,');
    const [few] = refuse(good.replace(PIVOT, 'steering.pivot,centre,-75,0'));
    expect(few).toMatchObject({ line: n, column: 28 });
    const [many] = refuse(good.replace(PIVOT, `${PIVOT},5`));
    expect(many.message).toBe(`table.csv:${n}:32: expected 5 fields (as in the header), found 6`);
  });

  it('a number that is not one, naming the point, the side and the axis', () => {
    const n = lineOf('steering.pivot,');
    for (const bad of ['abc', '', 'NaN', 'Infinity', '0x10', '1e400', '12mm', '1,5']) {
      const issues = refuse(good.replace(PIVOT, `steering.pivot,centre,-75,"${bad}",107`));
      expect(issues[0].line).toBe(n);
      expect(issues[0].message).toBe(`table.csv:${n}:27: steering.pivot (centre) y_mm: expected a number in mm, found ${bad === '' ? 'nothing' : JSON.stringify(bad)}`);
    }
  });

  it('an unknown point, and a point given with its old side suffix, named with the fix', () => {
    const n = lineOf('upright.wheelCentre,right');
    const [unknown] = refuse(good.replace('upright.wheelCentre,right', 'upright.wheelCenter,right'));
    expect(unknown).toMatchObject({ line: n, column: 1 });
    expect(unknown.message).toBe(`table.csv:${n}:1: "upright.wheelCenter" is not a hardpoint of this design`);
    const [suffixed] = refuse(good.replace('upright.wheelCentre,right', 'upright.wheelCentre.right,right'));
    expect(suffixed.message).toContain('give the point as upright.wheelCentre and the side as right');
  });

  it('a wrong side: centre for a point of each side, a side for a single point, a word that is no side', () => {
    const n = lineOf('upright.wheelCentre,right');
    const [centre] = refuse(good.replace('upright.wheelCentre,right', 'upright.wheelCentre,centre'));
    expect(centre).toMatchObject({ line: n, column: 21 });
    expect(centre.message).toBe(`table.csv:${n}:21: upright.wheelCentre side: expected right or left (this point is on each side), found "centre"`);
    const [single] = refuse(good.replace(PIVOT, 'steering.pivot,left,-75,0,107'));
    expect(single.message).toMatch(/steering\.pivot side: expected centre \(this point is a single one on the centre line\), found "left"/);
    const [word] = refuse(good.replace('upright.wheelCentre,right', 'upright.wheelCentre,starboard'));
    expect(word.message).toMatch(/found "starboard"$/);
  });

  it('a point listed twice, with the first line', () => {
    const n = lineOf('steering.pivot,');
    const issues = refuse(`${good}${PIVOT}\n`);
    expect(issues.map((i) => i.message)).toEqual([`table.csv:${lines.length}:1: steering.pivot (centre) is listed twice (first on line ${n})`]);
  });

  it('a table cut short: every missing point named, nothing applied', () => {
    const cut = lines.slice(0, 10).join('\n');
    const issues = refuse(cut);
    expect(issues.map((i) => i.path)).toEqual(hardpointIds(heron).slice(9));
    expect(issues.every((i) => i.line === 10 && /no row for this hardpoint/.test(i.message))).toBe(true);
  });

  it('an unclosed quote and a stray quote, at their column', () => {
    const n = lineOf('steering.pivot,');
    expect(refuse(good.replace(PIVOT, 'steering.pivot,centre,"-75,0,107'))[0]).toMatchObject({ line: n, column: 23 });
    expect(refuse(good.replace(PIVOT, 'steering.pivot,centre,-7"5,0,107'))[0]).toMatchObject({ line: n, column: 25 });
  });

  it('an empty table', () => {
    expect(refuse('\n\n')[0].message).toMatch(/^table\.csv:1:1: the table is empty/);
  });

  it('values that make the design invalid: the row to fix and the field', () => {
    const n = lineOf('frontEnd.upper.rearPivot,right');
    const coincident = good
      .replace('frontEnd.upper.rearPivot,right,-100,-60,310', 'frontEnd.upper.rearPivot,right,110,-60,310')
      .replace('frontEnd.upper.rearPivot,left,-100,60,310', 'frontEnd.upper.rearPivot,left,110,60,310');
    const [issue] = refuse(coincident);
    expect(issue.path).toBe('frontEnd.upper.rearPivot');
    expect(issue.message).toMatch(new RegExp(`^table\\.csv:${n}:1: frontEnd\\.upper\\.rearPivot: is 0 mm from frontEnd\\.upper\\.frontPivot`));
    const far = good.replace(PIVOT, 'steering.pivot,centre,-75,0,10000000');
    const [tooFar] = refuse(far);
    expect(tooFar).toMatchObject({ path: 'steering.pivot.z', line: lineOf('steering.pivot,') });
  });
});

describe('the older four-column table (side as a suffix of the point)', () => {
  it('the stored four-column table of the frozen sample still imports to the identical design', () => {
    const old = readFileSync(new URL('../../fixtures/fuzz-format-1.hardpoints-4col.csv', import.meta.url), 'utf8');
    expect(old.split('\n')[0]).toBe('point,x_mm,y_mm,z_mm');
    const r = importHardpointCsv(frozen, old, 'old.csv');
    expect(r.ok, r.ok ? '' : r.issues.map((i) => i.message).join('\n')).toBe(true);
    if (r.ok) expect(exact(r.design)).toBe(exact(frozen));
    // Negative control: the same table with one number changed gives another design.
    const moved = importHardpointCsv(frozen, old.replace('steering.pivot,-75,0,107', 'steering.pivot,-76,0,107'), 'old.csv');
    expect(moved.ok && exact(moved.design) !== exact(frozen)).toBe(true);
  });

  it('refuses an old-form row without its side suffix, naming the sided ids', () => {
    const old = readFileSync(new URL('../../fixtures/fuzz-format-1.hardpoints-4col.csv', import.meta.url), 'utf8');
    const r = importHardpointCsv(frozen, old.replace('upright.wheelCentre.right,', 'upright.wheelCentre,'), 'old.csv');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0].message).toContain('(this design has upright.wheelCentre.right, upright.wheelCentre.left)');
  });
});

describe('an outside reader and odd tables', () => {
  // csv-parse (npm, csv-parse/sync), a general-purpose RFC 4180 parser, reads our export.
  it('csv-parse reads every demo table to the same points, sides and values as the design', () => {
    for (const d of [...demos.map((x) => x.design), frozen]) {
      const records = parse(exportHardpointCsv(d), { columns: true, skip_empty_lines: true }) as Record<string, string>[];
      const expected = enumerate(d);
      expect(records).toHaveLength(expected.length);
      const got = new Map(records.map((r) => [r.side === 'centre' ? r.point : `${r.point}.${r.side}`, [Number(r.x_mm), Number(r.y_mm), Number(r.z_mm)]]));
      expect(got).toEqual(new Map(expected.map(([id, x, y, z]) => [id, [x, y, z]])));
      expect(records.every((r) => ['right', 'left', 'centre'].includes(r.side))).toBe(true);
    }
    expect((parse(exportHardpointCsv(frozen), { columns: true }) as Record<string, string>[]).some((r) => r.side === 'centre')).toBe(true);
  });

  it('a table edited by hand: columns reordered, odd case, a note column with commas, quotes and a line break', () => {
    const records = parse(exportHardpointCsv(heron), { columns: true }) as Record<string, string>[];
    const note = (i: number) => (i % 4 === 0 ? '"checked, on the jig ""A"""' : i % 4 === 1 ? '"two\nlines"' : i % 4 === 2 ? '' : 'plain');
    const body = records.map((r, i) => [r.z_mm, `"${r.point}"`, r.side.toUpperCase(), note(i), r.x_mm, r.y_mm].join(','));
    const csv = ['Z_mm,Point,SIDE,Note,x_MM,y_mm', ...body].join('\r\n') + '\r\n';
    // The outside reader agrees that this is one record per hardpoint with six fields.
    const again = parse(csv, { columns: true }) as Record<string, string>[];
    expect(again).toHaveLength(records.length);
    expect(again[0].Note).toBe('checked, on the jig "A"');
    expect(again[1].Note).toBe('two\nlines');
    const r = importHardpointCsv(heron, csv, 'table.csv');
    expect(r.ok, r.ok ? '' : r.issues.map((i) => i.message).join('\n')).toBe(true);
    if (r.ok) expect(exact(r.design)).toBe(exact(heron));
  });

  it('after a quoted line break, errors still give the right line', () => {
    const csv = exportHardpointCsv(heron).replace('point,side,x_mm,y_mm,z_mm', 'point,side,x_mm,y_mm,z_mm,note');
    const rows = csv.trimEnd().split('\n');
    const withNotes = [rows[0], ...rows.slice(1).map((l, i) => `${l},${i === 0 ? '"a\nb\nc"' : ''}`)];
    // Row 3 of the table (after the three-line note) has a bad number.
    withNotes[3] = withNotes[3].replace(/,([^,]*),$/, ',12mm,');
    const r = importHardpointCsv(heron, withNotes.join('\n') + '\n', 'table.csv');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ line: 6 });
  });
});
