/**
 * Issue 5, bad files, hardpoint tables: thousands of tables exported from the demos and
 * from perturbed designs, then damaged (rows deleted, duplicated, swapped; fields swapped,
 * added, quoted; numbers replaced by huge, odd or non-numbers; ids misspelt; plus the byte-
 * and text-level damage of fileMutations.ts), read back with importHardpointCsv.
 *
 * Each table is applied whole or refused: a table that is applied gives a valid design that
 * differs from the original in hardpoints only; a refused one has issues whose messages start
 * with the file name and give a line and column inside the text (or name the hardpoint that
 * has no row). Never a throw, never the input design changed.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { exportHardpointCsv, hardpointIds, hardpointTable, importHardpointCsv } from '../../../core/design/hardpointCsv';
import { validateDesign } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';
import { clone, loadDemos } from './demoDesigns';
import { perturbationArb, perturbDesign, fixTyres } from './designArbitraries';
import { mutationArb, mutateBytes, type Mutation } from './fileMutations';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';

const tally = new FigureTally('csv');
afterAll(() => tally.write());

const FILE = 'hardpoints.csv';

type RowOp =
  | { kind: 'deleteRow'; pick: number }
  | { kind: 'duplicateRow'; pick: number; changed: boolean }
  | { kind: 'swapRows'; a: number; b: number }
  | { kind: 'swapFields'; pick: number; a: number; b: number }
  | { kind: 'extraField'; pick: number; text: string }
  | { kind: 'setField'; pick: number; field: number; text: string }
  | { kind: 'quote'; pick: number }
  | { kind: 'renameId'; pick: number; how: 'dropSide' | 'typo' | 'case' | 'spaces' };

const ODD_VALUES = ['1e400', '-1e400', '1e-400', '-0', '+5', '.5', '5.', '1e3', '20001', '-20001', '1e5', '0x1A', 'NaN', 'Infinity', '', ' ', '12mm', '1,5', '"5"', '١٢', '\u00a05', '5\u0000', '9007199254740993'];

const rowOpArb: fc.Arbitrary<RowOp> = fc.oneof(
  fc.record({ kind: fc.constant('deleteRow' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('duplicateRow' as const), pick: fc.nat(), changed: fc.boolean() }),
  fc.record({ kind: fc.constant('swapRows' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('swapFields' as const), pick: fc.nat(), a: fc.nat({ max: 4 }), b: fc.nat({ max: 4 }) }),
  fc.record({ kind: fc.constant('extraField' as const), pick: fc.nat(), text: fc.constantFrom('', '0', 'x') }),
  fc.record({ kind: fc.constant('setField' as const), pick: fc.nat(), field: fc.integer({ min: 1, max: 4 }), text: fc.oneof(fc.constantFrom(...ODD_VALUES, 'centre', 'LEFT', 'center'), fc.double({ min: -30000, max: 30000, noNaN: true }).map(String)) }),
  fc.record({ kind: fc.constant('quote' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('renameId' as const), pick: fc.nat(), how: fc.constantFrom('dropSide' as const, 'typo' as const, 'case' as const, 'spaces' as const) }),
);

function applyRowOps(csv: string, ops: RowOp[]): string {
  const lines = csv.trimEnd().split('\n');
  const rows = lines.slice(1);
  for (const op of ops) {
    if (rows.length === 0) break;
    const i = 'pick' in op ? op.pick % rows.length : 0;
    const fields = rows[i].split(',');
    switch (op.kind) {
      case 'deleteRow':
        rows.splice(i, 1);
        break;
      case 'duplicateRow':
        rows.splice(i, 0, op.changed ? rows[i].replace(/,([^,]*)$/, ',1') : rows[i]);
        break;
      case 'swapRows': {
        const a = op.a % rows.length;
        const b = op.b % rows.length;
        [rows[a], rows[b]] = [rows[b], rows[a]];
        break;
      }
      case 'swapFields':
        [fields[op.a], fields[op.b]] = [fields[op.b], fields[op.a]];
        rows[i] = fields.join(',');
        break;
      case 'extraField':
        rows[i] = `${rows[i]},${op.text}`;
        break;
      case 'setField':
        fields[op.field] = op.text;
        rows[i] = fields.join(',');
        break;
      case 'quote':
        rows[i] = fields.map((f) => `"${f.replace(/"/g, '""')}"`).join(',');
        break;
      case 'renameId':
        // Columns: point, side, x_mm, y_mm, z_mm.
        if (op.how === 'dropSide') fields[1] = '';
        else fields[0] = op.how === 'typo' ? fields[0].replace('Joint', 'joint') : op.how === 'case' ? fields[0].toUpperCase() : ` ${fields[0]} `;
        rows[i] = fields.join(',');
        break;
    }
  }
  return [lines[0], ...rows].join('\n') + '\n';
}

/** A design with its hardpoints blanked: what an import may not change. */
function withoutHardpoints(d: DesignFile): unknown {
  const copy = clone(d) as unknown as Record<string, unknown>;
  for (const id of hardpointIds(d)) {
    const parts = id.split('.');
    let v = copy;
    for (const k of parts.slice(0, -1)) v = (v?.[k] ?? {}) as Record<string, unknown>;
    const last = parts[parts.length - 1];
    // A mirrored field may become two-sided (or back): blank the whole field.
    if (last === 'right' || last === 'left') {
      let parent = copy;
      for (const k of parts.slice(0, -2)) parent = parent[k] as Record<string, unknown>;
      parent[parts[parts.length - 2]] = 'hardpoint';
    } else {
      v[last] = 'hardpoint';
    }
  }
  return copy;
}

function checkTable(design: DesignFile, csv: string, label: string): void {
  const before = JSON.stringify(design);
  let r: ReturnType<typeof importHardpointCsv>;
  const t0 = performance.now();
  try {
    r = importHardpointCsv(design, csv, FILE);
  } catch (e) {
    throw new Error(`${label}: importHardpointCsv threw ${(e as Error).stack}\ncsv: ${JSON.stringify(csv.slice(0, 300))}`);
  }
  expect(performance.now() - t0, label).toBeLessThan(1000);
  tally.file(r.ok);
  expect(JSON.stringify(design), `${label}: the input design was changed`).toBe(before);
  if (r.ok) {
    expect(validateDesign(r.design).ok, label).toBe(true);
    expect(withoutHardpoints(r.design), `${label}: more than hardpoints changed`).toEqual(withoutHardpoints(design));
    return;
  }
  expect(r.issues.length, label).toBeGreaterThan(0);
  const lineCount = csv.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/).length;
  const ids = new Set(hardpointIds(design));
  for (const issue of r.issues) {
    const where = `${label}: ${issue.message}`;
    expect(issue.message.startsWith(`${FILE}:`), where).toBe(true);
    if (issue.line !== undefined) {
      expect(issue.line >= 1 && issue.line <= lineCount, where).toBe(true);
      expect(Number.isInteger(issue.column) && issue.column! >= 1, where).toBe(true);
      expect(issue.message.startsWith(`${FILE}:${issue.line}:${issue.column}: `), where).toBe(true);
    } else {
      // Only an issue about a hardpoint may come without a line: it names it.
      expect([...ids].some((id) => issue.path.startsWith(id.replace(/\.(right|left)$/, ''))), where).toBe(true);
    }
  }
}

describe('fuzzed hardpoint tables: applied whole or refused with line and column; never a throw', () => {
  const demos = loadDemos();

  it('tables of the demos and of perturbed designs, damaged row by row and byte by byte', () => {
    const arb = fc.record({
      base: fc.nat({ max: demos.length - 1 }),
      perturb: fc.option(perturbationArb, { nil: undefined }),
      rowOps: fc.array(rowOpArb, { maxLength: 3 }),
      byteOps: fc.array(mutationArb.filter((m: Mutation) => ['flip', 'truncate', 'bytes', 'bom', 'lineEndings', 'insert'].includes(m.kind)), { maxLength: 2 }),
    });
    fc.assert(
      fc.property(arb, ({ base, perturb, rowOps, byteOps }) => {
        const original = demos[base].design;
        const design = perturb ? fixTyres(perturbDesign(original, perturb)) : original;
        if (!validateDesign(design).ok) return;
        let csv = applyRowOps(exportHardpointCsv(design), rowOps);
        csv = mutateBytes(csv, byteOps);
        checkTable(design, csv, `${demos[base].file} ${JSON.stringify({ rowOps, byteOps })}`);
      }),
      { numRuns: runs(2000), seed: fuzzSeed() + 30, endOnFailure: true },
    );
  }, 300_000);

  it('every prefix of a table (truncation at each character): refused until every row is there', () => {
    const design = demos[0].design;
    const csv = exportHardpointCsv(design);
    const last = hardpointTable(design).at(-1)!;
    for (let n = 0; n <= csv.length; n += Math.max(1, Math.floor(csv.length / runs(300)))) {
      const cut = csv.slice(0, n);
      checkTable(design, cut, `cut at ${n}`);
      const r = importHardpointCsv(design, cut, FILE);
      // Applied only with the last row present (a last number cut short is still a number).
      if (r.ok) expect(cut.includes(`${last.point},${last.side},`), `cut at ${n}`).toBe(true);
    }
  });
});
