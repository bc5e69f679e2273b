/**
 * Duplicate keys in a design file. RFC 8259 (The JSON Data Interchange Format, section 4)
 * says names within an object SHOULD be unique and that parsers differ on what they do with
 * repeats; JavaScript's JSON.parse keeps the last one (ECMA-262's JSON.parse creates the
 * properties in order, so a later one overwrites: from memory, and confirmed by the first
 * test below). The reader must refuse such a
 * file and say where the repeat is, instead of loading whichever came last.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { findDuplicateKeys } from '../../../core/design/readJsonText';
import { parseDesignText } from '../../../core/design/validateDesign';

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');

describe('findDuplicateKeys', () => {
  it('confirms what it guards against: JSON.parse keeps the last of two equal keys', () => {
    expect(JSON.parse('{"a": 1, "a": 2}')).toEqual({ a: 2 });
  });

  it('finds a repeat at any depth, with its path and the second position', () => {
    const text = '{\n  "a": {"b": [1, {"c": 1, "d": 2, "c": 3}]},\n  "e": 1,\n  "e": 2\n}';
    expect(findDuplicateKeys(text)).toEqual([
      { path: 'a.b[1].c', key: 'c', offset: text.lastIndexOf('"c"') },
      { path: 'e', key: 'e', offset: text.lastIndexOf('"e"') },
    ]);
  });

  it('treats escaped and plain spellings of a name as the same name, as JSON.parse does', () => {
    expect(Object.keys(JSON.parse('{"ab": 1, "a\\u0062": 2}'))).toEqual(['ab']);
    expect(findDuplicateKeys('{"ab": 1, "a\\u0062": 2}').map((d) => d.key)).toEqual(['ab']);
  });

  it('is not fooled by strings that look like keys, by braces inside strings, or by equal keys in different objects', () => {
    expect(findDuplicateKeys('{"a": "a", "b": ["a", "a"], "c": {"a": 1}, "d": {"a": "}{\\"a\\":"}}')).toEqual([]);
  });

  it('finds nothing in any JSON.stringify output (property test)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (v) => {
        expect(findDuplicateKeys(JSON.stringify(v, null, 1))).toEqual([]);
      }),
      { numRuns: 300 },
    );
  });
});

describe('parseDesignText with a repeated key', () => {
  it('refuses the file and names the field, its line and column', () => {
    // Paste a second wheelbase after the first, as a hand edit might.
    const text = FIXTURE_TEXT.replace(/("wheelbaseMm":\s*[-0-9.e]+)/, '$1, "wheelbaseMm": 1234');
    expect(text).not.toBe(FIXTURE_TEXT);
    const result = parseDesignText(text, 'trike.tiltsheet');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toHaveLength(1);
    const issue = result.issues[0];
    expect(issue.path).toBe('vehicle.wheelbaseMm');
    const index = text.indexOf('"wheelbaseMm": 1234');
    const before = text.slice(0, index).split('\n');
    expect(issue.line).toBe(before.length);
    expect(issue.column).toBe(before[before.length - 1].length + 1);
    expect(issue.message).toBe(`trike.tiltsheet:${issue.line}:${issue.column}: vehicle.wheelbaseMm: "wheelbaseMm" is given twice in the same object; keep one and delete the other`);
  });

  it('still reads the unedited fixture', () => {
    expect(parseDesignText(FIXTURE_TEXT, 'minimal.tiltsheet').ok).toBe(true);
  });
});
