/**
 * `tiltbench hardpoints`: the hardpoint table out as CSV and back in as a new design.
 * Outside references: RFC 4180 (one record per line, a header, commas, CRLF accepted), read by
 * Python's standard `csv` module, a general-purpose CSV reader outside this project.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run, HERON, SWIFT, WREN } from './cliHarness';
import { parseDesignText } from '../../core/design/validateDesign';

const folder = () => mkdtempSync(join(tmpdir(), 'tiltbench-hardpoints-'));

/** The rows of a CSV file as Python's csv module reads them (RFC 4180 dialect "excel"). */
function pythonRows(path: string): string[][] {
  const script = 'import csv, json, sys\nwith open(sys.argv[1], newline="") as f:\n    print(json.dumps(list(csv.reader(f))))';
  return JSON.parse(execFileSync('python3', ['-c', script, path], { encoding: 'utf8' })) as string[][];
}

describe('tiltbench hardpoints', () => {
  it.each([HERON, SWIFT, WREN])('out and back in gives the identical design (%s)', async (design) => {
    const dir = folder();
    const csv = join(dir, 'table.csv');
    const back = join(dir, 'back.tiltsheet');
    const out = await run(['hardpoints', design, '--out', csv]);
    expect(out.code, out.err).toBe(0);
    expect(out.out).toMatch(/wrote \d+ hardpoints/);
    const inn = await run(['hardpoints', design, '--in', csv, '--out', back]);
    expect(inn.code, inn.err).toBe(0);
    const original = parseDesignText(readFileSync(design, 'utf8'), design);
    const again = parseDesignText(readFileSync(back, 'utf8'), back);
    expect(original.ok && again.ok).toBe(true);
    if (original.ok && again.ok) expect(again.design).toEqual(original.design);
  });

  it('a general-purpose CSV reader (Python csv) reads the table to the same values', async () => {
    const dir = folder();
    const csv = join(dir, 'table.csv');
    expect((await run(['hardpoints', SWIFT, '--out', csv])).code).toBe(0);
    const rows = pythonRows(csv);
    expect(rows[0]).toEqual(['point', 'side', 'x_mm', 'y_mm', 'z_mm']);
    const ours = readFileSync(csv, 'utf8').trimEnd().split('\n').slice(1);
    expect(rows.length - 1).toBe(ours.length);
    for (const [i, row] of rows.slice(1).entries()) {
      expect(row).toHaveLength(5);
      const [point, side, ...xyz] = ours[i].split(',');
      expect(row.slice(0, 2)).toEqual([point, side]);
      expect(['right', 'left', 'centre']).toContain(row[1]);
      expect(row.slice(2).map(Number)).toEqual(xyz.map(Number));
      expect(row.slice(2).every((v) => Number.isFinite(Number(v)))).toBe(true);
    }
  });

  it('an edited table (CRLF line ends, as a spreadsheet saves) moves exactly the point edited', async () => {
    const dir = folder();
    const csv = join(dir, 'table.csv');
    const edited = join(dir, 'edited.tiltsheet');
    await run(['hardpoints', WREN, '--out', csv]);
    const lines = readFileSync(csv, 'utf8').trimEnd().split('\n');
    const [point, side, x, y, z] = lines[1].split(',');
    lines[1] = [point, side, String(Number(x) + 5), y, z].join(',');
    writeFileSync(csv, lines.join('\r\n') + '\r\n');
    const r = await run(['hardpoints', WREN, '--in', csv, '--out', edited]);
    expect(r.code, r.err).toBe(0);
    await run(['hardpoints', edited, '--out', join(dir, 'again.csv')]);
    const again = readFileSync(join(dir, 'again.csv'), 'utf8').trimEnd().split('\n');
    expect(again[1]).toBe([point, side, String(Number(x) + 5), y, z].join(','));
    // Negative control: every other row is unchanged, so the check above would see a wrong row.
    expect(again.slice(2)).toEqual(lines.slice(2));
  });

  it('a malformed table is refused whole with line and column, and nothing is written', async () => {
    const dir = folder();
    const csv = join(dir, 'table.csv');
    const target = join(dir, 'new.tiltsheet');
    await run(['hardpoints', WREN, '--out', csv]);
    const lines = readFileSync(csv, 'utf8').trimEnd().split('\n');
    const cases: [string[], RegExp][] = [
      [[lines[0], lines[1].replace(/,[^,]*$/, ',12mm'), ...lines.slice(2)], /table\.csv:2:\d+: /],
      [[lines[0], 'no.such.point,centre,1,2,3', ...lines.slice(1)], /table\.csv:2:1: /],
      [[lines[0], ...lines.slice(2)], /table\.csv/],
      [[lines[0], lines[1], lines[1], ...lines.slice(2)], /table\.csv:3:\d+: /],
    ];
    for (const [rows, says] of cases) {
      writeFileSync(csv, rows.join('\n') + '\n');
      const r = await run(['hardpoints', WREN, '--in', csv, '--out', target]);
      expect(r.code, r.err).toBe(2);
      expect(r.err).toMatch(says);
      expect(r.err).toMatch(/nothing was written/);
      expect(existsSync(target)).toBe(false);
    }
  });

  it('never writes over its inputs and says what it needs', async () => {
    const dir = folder();
    const design = join(dir, 'd.tiltsheet');
    writeFileSync(design, readFileSync(WREN));
    const csv = join(dir, 't.csv');
    await run(['hardpoints', design, '--out', csv]);
    const before = readFileSync(design, 'utf8');
    const overDesign = await run(['hardpoints', design, '--in', csv, '--out', design]);
    expect(overDesign.code).toBe(2);
    expect(overDesign.err).toMatch(/is the design given as input/);
    expect(readFileSync(design, 'utf8')).toBe(before);
    const noOut = await run(['hardpoints', design]);
    expect(noOut.code).toBe(2);
    expect(noOut.err).toMatch(/--out TABLE\.csv/);
    const wrongKind = await run(['hardpoints', design, '--in', csv, '--out', join(dir, 'x.csv')]);
    expect(wrongKind.code).toBe(2);
    expect(wrongKind.err).toMatch(/\.tiltsheet file/);
  });
});
