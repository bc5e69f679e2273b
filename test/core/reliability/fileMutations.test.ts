/**
 * The mutator the file and CLI fuzz tests use puts each bad value in one place of one
 * document: a value placed twice is two copies, a later mutation of one copy leaves the other
 * alone, nothing leaks into the next case, and the internal placeholder never reaches the text.
 */
import { describe, expect, it } from 'vitest';
import { mutateText, type FileCase, type Mutation } from './fileMutations';

const caseOf = (mutations: Mutation[]): FileCase => ({ base: 0, indent: 0, mutations });

describe('mutateText', () => {
  it('copies a value it places twice, so a later mutation changes one place only', () => {
    // One object, as fast-check's constantFrom hands it to every case.
    const shared = { x: 1, y: 2, z: 3 };
    const base = '{"a": 1, "b": 2}';
    // Paths in order: a; then a, a.x, a.y, a.z, b; then a, a.x, ..., b, b.x, ...
    const mutations: Mutation[] = [
      { kind: 'retype', pick: 0, value: shared },
      { kind: 'retype', pick: 4, value: shared },
      { kind: 'hugeNumber', pick: 1, text: '1e400' },
    ];
    const text = mutateText(base, caseOf(mutations));
    expect(text).toBe('{"a":{"x":1e400,"y":2,"z":3},"b":{"x":1,"y":2,"z":3}}');
    expect(text).not.toContain('MUTATION');
    // The constant itself is untouched, so the next case starts from the same value.
    expect(shared).toEqual({ x: 1, y: 2, z: 3 });
    expect(mutateText(base, caseOf([{ kind: 'retype', pick: 0, value: shared }]))).toBe('{"a":{"x":1,"y":2,"z":3},"b":2}');
  });

  it('gives a copy of a value still to be damaged the value it had before, not the damage twice', () => {
    const text = mutateText('{"a": 7}', caseOf([
      { kind: 'hugeNumber', pick: 0, text: '-1e400' },
      { kind: 'oddKey', pick: 0, key: 'b' },
    ]));
    expect(text).toBe('{"a":-1e400,"b":7}');
    const nested = mutateText('{"a": [1]}', caseOf([
      { kind: 'nest', pick: 1, depth: 2, bracket: 'array' },
      { kind: 'oddKey', pick: 0, key: 'c' },
    ]));
    expect(nested).toBe('{"a":[[[1]]],"c":[1]}');
    expect(nested.match(/\[\[\[/g)?.length).toBe(1);
  });
});
