import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, it, expect } from 'vitest';
import {
  DESIGN_MIGRATIONS,
  findJsonSyntaxError,
  lineAndColumn,
  migrateDesign,
  parseDesignText,
  validateDesign,
  type DesignIssue,
  type DesignMigration,
} from '../../../core/design/validateDesign';

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');

function issuesOf(text: string, fileName = 'trike.tiltsheet'): DesignIssue[] {
  const result = parseDesignText(text, fileName);
  if (result.ok) throw new Error('expected the text to be rejected');
  return result.issues;
}

/** Line and column (1-based) of the first occurrence of `needle`, found independently of the code under test. */
function positionOf(text: string, needle: string, offsetInNeedle = 0): { line: number; column: number } {
  const index = text.indexOf(needle);
  if (index < 0) throw new Error(`"${needle}" not in text`);
  const before = text.slice(0, index + offsetInNeedle).split('\n');
  return { line: before.length, column: before[before.length - 1].length + 1 };
}

describe('parseDesignText', () => {
  it('reads the minimal fixture', () => {
    const result = parseDesignText(FIXTURE_TEXT, 'minimal.tiltsheet');
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.design.name).toContain('split-wishbone');
  });

  it('reads a file that starts with a byte-order mark', () => {
    expect(parseDesignText(`\uFEFF${FIXTURE_TEXT}`, 'bom.tiltsheet').ok).toBe(true);
  });

  it('prefixes every validation message with the file name', () => {
    const json = JSON.parse(FIXTURE_TEXT);
    json.vehicle.wheelbaseMm = 'x';
    json.frontEnd.lower.outerJoint.z = '12a';
    json.envelope.colour = 'red';
    const issues = issuesOf(JSON.stringify(json, null, 2), 'my trike.tiltsheet');
    expect(issues.map((i) => i.message)).toEqual([
      'my trike.tiltsheet: vehicle.wheelbaseMm: expected a finite number in mm, found "x"',
      'my trike.tiltsheet: frontEnd.lower.outerJoint.z: expected a finite number in mm, found "12a"',
      'my trike.tiltsheet: envelope.colour: unknown field',
    ]);
  });
});

describe('parseDesignText: JSON syntax errors give line and column', () => {
  it('points at the bad character of an unquoted value', () => {
    const text = FIXTURE_TEXT.replace('"wheelbaseMm": 1050', '"wheelbaseMm": 10five0');
    const at = positionOf(text, '10five0', 2); // JSON reads 10, then stops at "f"
    const [issue] = issuesOf(text);
    expect(issue).toMatchObject({ path: '', line: at.line, column: at.column });
    expect(issue.message).toBe(`trike.tiltsheet:${at.line}:${at.column}: invalid JSON: expected ',' or '}' after a property value, found "five0"`);
  });

  it('points at a trailing comma where Node gives no position at all', () => {
    // V8 says: Unexpected token '}', ... is not valid JSON (no position).
    const text = '{\n  "tiltsheet": 1,\n  "name": }\n';
    expect(() => JSON.parse(text)).toThrow(/Unexpected token/);
    const [issue] = issuesOf(text);
    expect(issue.message).toBe('trike.tiltsheet:3:11: invalid JSON: expected a value, found "}"');
  });

  const cases: { what: string; text: string; line: number; column: number; says: string }[] = [
    { what: 'comma before }', text: '{\n  "a": 1,\n}', line: 3, column: 1, says: 'a comma before "}" is not allowed' },
    { what: 'comma before ]', text: '{"a": [1, 2,\n ]}', line: 2, column: 2, says: 'a comma before "]" is not allowed' },
    { what: 'missing colon', text: '{\n"a" 1}', line: 2, column: 5, says: "expected ':'" },
    { what: 'unclosed object', text: '{\n  "a": 1\n', line: 3, column: 1, says: 'found the end of the file' },
    { what: 'unclosed string', text: '{\n  "a": "abc\n}', line: 2, column: 12, says: 'line break or control character inside a string' },
    { what: 'string never closed at end', text: '{"a": "abc', line: 1, column: 7, says: 'never closed' },
    { what: 'single quotes', text: "{\n  'a': 1}", line: 2, column: 3, says: 'names need double quotes' },
    { what: 'a comment', text: '{\n  // note\n  "a": 1}', line: 2, column: 3, says: 'comments are not allowed' },
    { what: 'text after the document', text: '{}\n\nx', line: 3, column: 1, says: 'after the end of the JSON document' },
    { what: 'a bad escape', text: '{"a": "\\q"}', line: 1, column: 8, says: 'unknown escape \\q' },
    { what: 'a leading zero', text: '{"a": 012}', line: 1, column: 8, says: "expected ',' or '}'" },
    { what: 'a bare decimal point', text: '{"a": 1.}', line: 1, column: 9, says: 'a digit after the decimal point' },
    { what: 'Windows line endings', text: '{\r\n  "a": 1,\r\n  "b": tru\r\n}', line: 3, column: 8, says: 'expected a value, found "tru"' },
  ];
  for (const c of cases) {
    it(c.what, () => {
      expect(() => JSON.parse(c.text)).toThrow();
      const [issue] = issuesOf(c.text, 'f.tiltsheet');
      expect({ line: issue.line, column: issue.column }).toEqual({ line: c.line, column: c.column });
      expect(issue.message.startsWith(`f.tiltsheet:${c.line}:${c.column}: invalid JSON: `)).toBe(true);
      expect(issue.message).toContain(c.says);
    });
  }

  it('agrees with the position Node reports, where Node reports one', () => {
    const texts = ['{"a":1,}', '{"a" 1}', '{"a":1', '{\n  "a": 12a\n}', '[1,2]x', '{"a":"b\nc"}', '[1,]', '{"a":-}', '{"a":1e}'];
    for (const text of texts) {
      let message = '';
      try {
        JSON.parse(text);
      } catch (error) {
        message = (error as Error).message;
      }
      const position = /position (\d+)/.exec(message);
      if (!position) continue; // the engine gave none for this one
      expect({ text, offset: findJsonSyntaxError(text)?.offset }).toEqual({ text, offset: Number(position[1]) });
    }
  });

  it('finds an error exactly when JSON.parse fails (property test)', () => {
    const token = fc.constantFrom('{', '}', '[', ']', ',', ':', '"a"', '"b\\n"', '1', '-2.5e3', '0', 'true', 'null', ' ', '\n', '"', 'x', '01', '1.', "'");
    fc.assert(
      fc.property(fc.array(token, { maxLength: 14 }), (tokens) => {
        const text = tokens.join('');
        let parses = true;
        try {
          JSON.parse(text);
        } catch {
          parses = false;
        }
        expect(findJsonSyntaxError(text) === undefined).toBe(parses);
      }),
      { numRuns: 3000 },
    );
  });

  it('reports an empty file plainly', () => {
    expect(issuesOf('  \n', 'empty.tiltsheet')[0].message).toBe('empty.tiltsheet: the file is empty; expected a JSON design');
  });

  it('counts lines and columns from 1', () => {
    expect(lineAndColumn('ab\ncd', 0)).toEqual({ line: 1, column: 1 });
    expect(lineAndColumn('ab\ncd', 4)).toEqual({ line: 2, column: 2 });
    expect(lineAndColumn('ab\r\ncd', 4)).toEqual({ line: 2, column: 1 });
  });
});

describe('format versions', () => {
  function withVersion(version: unknown): string {
    const json = JSON.parse(FIXTURE_TEXT);
    json.tiltsheet = version;
    return JSON.stringify(json);
  }

  it('refuses a file from a newer Tiltbench with a clear message', () => {
    const issues = issuesOf(withVersion(2), 'future.tiltsheet');
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe('tiltsheet');
    expect(issues[0].message).toBe(
      'future.tiltsheet: tiltsheet: this design was made by a newer Tiltbench (format 2); this build reads format 1. Update Tiltbench to open it.',
    );
  });

  it('gives the same message from validateDesign, even if the rest of the newer file looks nothing like format 1', () => {
    const result = validateDesign({ tiltsheet: 7, somethingNew: {} });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((i) => i.message)).toEqual([expect.stringContaining('made by a newer Tiltbench (format 7); this build reads format 1')]);
  });

  it('refuses format 0, for which this build has no conversion', () => {
    expect(DESIGN_MIGRATIONS).toEqual({});
    const issues = issuesOf(withVersion(0), 'old.tiltsheet');
    expect(issues.map((i) => i.message)).toEqual([
      'old.tiltsheet: tiltsheet: format 0 is not supported; this build reads format 1 and has no conversion from format 0',
    ]);
  });

  it('says a JSON file without the format key is not a design', () => {
    const issues = issuesOf('{"name": "shopping list"}', 'list.json');
    expect(issues.map((i) => i.message)).toEqual([
      'list.json: tiltsheet: missing; this is not a Tiltbench design (a design starts with "tiltsheet": 1)',
    ]);
  });

  it('leaves a format value that is not a version number to the schema check', () => {
    expect(issuesOf(withVersion('1')).map((i) => i.message)).toEqual(['trike.tiltsheet: tiltsheet: expected 1, found "1"']);
    expect(issuesOf(withVersion(1.5)).map((i) => i.path)).toEqual(['tiltsheet']);
  });

  describe('the migration mechanism, with a fake format 0', () => {
    // A made-up format 0 that called the name "title" and the wheelbase "wheelbase" (in metres).
    const fakeSteps: Record<number, DesignMigration> = {
      0: (doc) => {
        const { title, vehicle, ...rest } = doc as { title: string; vehicle: { wheelbase: number } & Record<string, unknown> };
        const { wheelbase, ...vehicleRest } = vehicle;
        return { ...rest, tiltsheet: 1, name: title, vehicle: { ...vehicleRest, wheelbaseMm: wheelbase * 1000 } };
      },
    };

    function formatZero(): Record<string, unknown> {
      const json = JSON.parse(FIXTURE_TEXT);
      const { name, vehicle, ...rest } = json;
      const { wheelbaseMm, ...vehicleRest } = vehicle;
      return { ...rest, tiltsheet: 0, title: name, vehicle: { ...vehicleRest, wheelbase: wheelbaseMm / 1000 } };
    }

    it('upgrades step by step to a valid format 1 design, without changing its input', () => {
      const old = formatZero();
      const snapshot = JSON.stringify(old);
      const migrated = migrateDesign(old, fakeSteps);
      expect(migrated.ok).toBe(true);
      if (!migrated.ok) return;
      expect(migrated.migratedFrom).toBe(0);
      expect(JSON.stringify(old)).toBe(snapshot);
      expect(migrated.json).toEqual(JSON.parse(FIXTURE_TEXT));
      expect(validateDesign(migrated.json).ok).toBe(true);
    });

    it('passes a current document through untouched', () => {
      const current = JSON.parse(FIXTURE_TEXT);
      const migrated = migrateDesign(current, fakeSteps);
      expect(migrated).toEqual({ ok: true, json: current });
      if (migrated.ok) expect(migrated.json).toBe(current);
    });

    it('fails loudly when a migration step forgets to set the new format', () => {
      const broken: Record<number, DesignMigration> = { 0: (doc) => ({ ...doc }) };
      expect(() => migrateDesign(formatZero(), broken)).toThrow('did not produce format 1');
    });
  });
});
