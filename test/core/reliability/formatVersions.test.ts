/**
 * Issue 5, format versions: a file from a newer Tiltbench gets a clear refusal; an older one
 * is migrated, and the migration is tested.
 *
 * The format is at version 1 and DESIGN_MIGRATIONS is empty, so the mechanism is tested as it
 * stands, and a contract is written down that every migration must meet (checkMigrationTable).
 * The contract runs over the real table (with nothing to do today) and is itself tested
 * against deliberately broken tables, to show it would catch a broken migration. The frozen
 * format-1 sample (test/fixtures/fuzz-format-1.tiltsheet, with its hardpoint table
 * fuzz-format-1.hardpoints.csv) is the file a future migration from format 1 must carry over
 * without moving a hardpoint.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DESIGN_MIGRATIONS,
  migrateDesign,
  parseDesignText,
  validateDesign,
  type DesignMigration,
} from '../../../core/design/validateDesign';
import { DESIGN_FORMAT_KEY, DESIGN_FORMAT_VERSION } from '../../../core/design/types';
import { exportHardpointCsv } from '../../../core/design/hardpointCsv';
import { clone } from './demoDesigns';

/** The first format Tiltbench published: files of this format and later must always open. */
const FIRST_PUBLISHED_FORMAT = 1;

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/${name}`, import.meta.url), 'utf8');
const FROZEN: Record<number, { text: string; hardpoints: string }> = {
  1: { text: fixture('fuzz-format-1.tiltsheet'), hardpoints: fixture('fuzz-format-1.hardpoints.csv') },
};

function deepFreeze<T>(v: T): T {
  if (typeof v === 'object' && v !== null) {
    Object.values(v).forEach(deepFreeze);
    Object.freeze(v);
  }
  return v;
}

type Runner = (doc: Record<string, unknown>) => ReturnType<typeof migrateDesign>;

/**
 * What migrating one frozen sample must give (a list of problems, empty = fine): no throw, its
 * input untouched (it is deep-frozen, so a write throws), a design that passes validateDesign,
 * the format it came from reported, the same result on a second run, and exactly the
 * hardpoints recorded beside the sample.
 */
function checkSample(from: number, sample: { text: string; hardpoints: string }, run: Runner, current: number): string[] {
  const problems: string[] = [];
  const doc = JSON.parse(sample.text) as Record<string, unknown>;
  if (doc[DESIGN_FORMAT_KEY] !== from) return [`sample of format ${from} says ${String(doc[DESIGN_FORMAT_KEY])}`];
  const input = deepFreeze(clone(doc));
  let first: ReturnType<typeof migrateDesign>;
  let second: ReturnType<typeof migrateDesign>;
  try {
    first = run(input);
    second = run(deepFreeze(clone(doc)));
  } catch (e) {
    return [`format ${from}: migration threw: ${(e as Error).message}`];
  }
  if (!first.ok) return [`format ${from}: refused: ${first.issues.map((i) => i.message).join('; ')}`];
  if (from === current ? first.json !== input : first.migratedFrom !== from) problems.push(`format ${from}: not passed through, or migratedFrom wrong (${String(first.ok && first.migratedFrom)})`);
  if (!second.ok || JSON.stringify(second.json) !== JSON.stringify(first.json)) problems.push(`format ${from}: a second migration gives a different design`);
  const checked = validateDesign(first.json);
  if (!checked.ok) return [...problems, `format ${from}: the migrated design is not valid: ${checked.issues.map((i) => i.message).join('; ')}`];
  if (exportHardpointCsv(checked.design) !== sample.hardpoints) problems.push(`format ${from}: the migration moved hardpoints (the table differs from the one recorded with the sample)`);
  return problems;
}

/**
 * What every migration table must satisfy: keys are whole formats older than the current one;
 * the chain from the first published format to the current one has no gap and a frozen sample
 * for each format; and every sample passes checkSample through migrateDesign.
 */
export function checkMigrationTable(
  table: Readonly<Record<number, DesignMigration>>,
  current: number,
  samples: Record<number, { text: string; hardpoints: string }>,
  firstPublished = FIRST_PUBLISHED_FORMAT,
): string[] {
  const problems: string[] = [];
  for (const key of Object.keys(table)) {
    const from = Number(key);
    if (!Number.isInteger(from) || from < 0 || from >= current) problems.push(`migration key ${key} is not a format older than ${current}`);
  }
  for (let v = firstPublished; v < current; v++) {
    if (!table[v]) problems.push(`no migration from format ${v}: files of format ${v} (published) could not be opened`);
    if (!samples[v]) problems.push(`no frozen sample of format ${v} to test its migration with`);
  }
  if (current === DESIGN_FORMAT_VERSION) {
    for (const [key, sample] of Object.entries(samples)) problems.push(...checkSample(Number(key), sample, (doc) => migrateDesign(doc, table), current));
  }
  return problems;
}

describe('files from a newer Tiltbench', () => {
  it('are refused with one clear message naming both formats, whatever else the file holds (property)', () => {
    const newer = fc.oneof(fc.integer({ min: DESIGN_FORMAT_VERSION + 1, max: 1_000_000 }), fc.constantFrom(2 ** 53, 1e300, Number.MAX_SAFE_INTEGER));
    const rest = fc.dictionary(fc.string({ maxLength: 12 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 6 });
    fc.assert(
      fc.property(newer, rest, (version, others) => {
        const doc = { ...others, [DESIGN_FORMAT_KEY]: version };
        const r = parseDesignText(JSON.stringify(doc), 'future.tiltsheet');
        expect(r.ok).toBe(false);
        if (r.ok) return;
        expect(r.issues).toHaveLength(1);
        expect(r.issues[0].path).toBe(DESIGN_FORMAT_KEY);
        expect(r.issues[0].message).toBe(
          `future.tiltsheet: tiltsheet: this design was made by a newer Tiltbench (format ${version}); this build reads format ${DESIGN_FORMAT_VERSION}. Update Tiltbench to open it.`,
        );
      }),
      { numRuns: 300, seed: 77 },
    );
  });

  it('a newer format written as 2.0 or 2e0 is the same format 2 (JSON numbers)', () => {
    for (const text of ['2.0', '2e0', '20e-1']) {
      const r = parseDesignText(`{"tiltsheet": ${text}}`, 'f.tiltsheet');
      expect(!r.ok && r.issues[0].message).toContain('newer Tiltbench (format 2)');
    }
  });
});

describe('files from an older format, and version values that are not formats', () => {
  it('format 0 (never published, no conversion) is refused naming the format', () => {
    const doc = { ...JSON.parse(FROZEN[1].text), tiltsheet: 0 };
    const r = parseDesignText(JSON.stringify(doc), 'old.tiltsheet');
    expect(!r.ok && r.issues.map((i) => i.message)).toEqual([
      'old.tiltsheet: tiltsheet: format 0 is not supported; this build reads format 1 and has no conversion from format 0',
    ]);
  });

  it('any other value is a field error naming tiltsheet (property)', () => {
    const notAFormat = fc.oneof(
      fc.integer({ min: -1_000_000, max: -1 }),
      fc.double({ noNaN: true }).filter((x) => !Number.isInteger(x)),
      fc.string(),
      fc.constantFrom(null, true, false, [], {}, [1], { v: 1 }),
    );
    fc.assert(
      fc.property(notAFormat, (version) => {
        const doc = { ...JSON.parse(FROZEN[1].text), tiltsheet: version };
        const r = parseDesignText(JSON.stringify(doc), 'odd.tiltsheet');
        expect(r.ok).toBe(false);
        if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(DESIGN_FORMAT_KEY);
      }),
      { numRuns: 300, seed: 78 },
    );
  });
});

describe('the migration contract', () => {
  it('holds for the real table: DESIGN_MIGRATIONS against the frozen samples of every published format', () => {
    expect(checkMigrationTable(DESIGN_MIGRATIONS, DESIGN_FORMAT_VERSION, FROZEN)).toEqual([]);
  });

  it('the frozen format-1 sample opens in this build and its hardpoints are the ones recorded', () => {
    const r = parseDesignText(FROZEN[1].text, 'fuzz-format-1.tiltsheet');
    expect(r.ok).toBe(true);
    if (r.ok) expect(exportHardpointCsv(r.design)).toBe(FROZEN[1].hardpoints);
  });

  // A made-up future: format 2 is current, and format 1 files (the frozen sample) migrate to it.
  // Format 2 renamed "name" to "title" and keeps the wheelbase in metres. This build's validator
  // reads format 1, so the runner maps format 2 back with a test-only inverse before judging; the
  // step under test is what a developer would add to DESIGN_MIGRATIONS[1].
  const TWO = 2;
  const toTwo: DesignMigration = (doc) => {
    const { name, vehicle, ...rest } = doc as { name: string; vehicle: Record<string, unknown> };
    const { wheelbaseMm, ...v } = vehicle;
    return { ...rest, tiltsheet: TWO, title: name, vehicle: { ...v, wheelbaseM: (wheelbaseMm as number) / 1000 } };
  };
  const backToOne = (doc: Record<string, unknown>): Record<string, unknown> => {
    const { title, vehicle, ...rest } = doc as { title: unknown; vehicle: Record<string, unknown> };
    const { wheelbaseM, ...v } = vehicle ?? {};
    return { ...rest, tiltsheet: 1, name: title, vehicle: { ...v, wheelbaseMm: typeof wheelbaseM === 'number' ? Math.round(wheelbaseM * 1e12) / 1e9 : wheelbaseM } };
  };
  /** migrateDesign's loop for a world at format 2, with the step under test, judged as format 1. */
  const runInWorldTwo = (step: DesignMigration): Runner => (doc) => {
    const out = step(doc);
    if (out[DESIGN_FORMAT_KEY] !== TWO) throw new Error(`design migration from format 1 did not produce format ${TWO}`);
    return { ok: true, json: backToOne(out), migratedFrom: 1 };
  };
  const contractInWorldTwo = (step: DesignMigration) => checkSample(1, FROZEN[1], runInWorldTwo(step), TWO);

  it('accepts a correct migration (the made-up format 2)', () => {
    expect(contractInWorldTwo(toTwo)).toEqual([]);
  });

  const broken: [string, DesignMigration, RegExp][] = [
    ['changes its input', (doc) => Object.assign(doc, { tiltsheet: TWO }), /migration threw/],
    ['forgets to set the new format', (doc) => ({ ...toTwo(doc), tiltsheet: 1 }), /did not produce format 2/],
    ['drops a required section', (doc) => { const { upright: _u, ...rest } = toTwo(doc); void _u; return rest; }, /not valid: upright: required field missing/],
    ['moves a hardpoint', (doc) => { const t = toTwo(doc) as { steering: { pivot: { z: number } } }; return { ...t, steering: { ...t.steering, pivot: { ...t.steering.pivot, z: t.steering.pivot.z + 1 } } }; }, /moved hardpoints/],
    ['converts units wrongly (mm where metres belong)', (doc) => { const t = toTwo(doc) as { vehicle: Record<string, unknown> }; return { ...t, vehicle: { ...t.vehicle, wheelbaseM: 1100 } }; }, /not valid: vehicle\.wheelbaseMm/],
    ['is not deterministic', (() => { let n = 0; return (doc: Record<string, unknown>) => ({ ...toTwo(doc), notes: `run ${n++}` }); })(), /second migration gives a different design/],
  ];
  for (const [what, step, says] of broken) {
    it(`catches a migration that ${what}`, () => {
      expect(contractInWorldTwo(step).join('\n')).toMatch(says);
    });
  }

  it('catches a table with a gap, a bad key, or a missing sample (checkMigrationTable)', () => {
    const ok: DesignMigration = (d) => ({ ...d, tiltsheet: (d.tiltsheet as number) + 1 });
    expect(checkMigrationTable({ 1: ok }, 3, FROZEN)).toEqual(expect.arrayContaining(['no migration from format 2: files of format 2 (published) could not be opened', 'no frozen sample of format 2 to test its migration with']));
    expect(checkMigrationTable({ 1.5: ok } as Record<number, DesignMigration>, 2, FROZEN)).toContain('migration key 1.5 is not a format older than 2');
    expect(checkMigrationTable({}, 2, FROZEN)).toContain('no migration from format 1: files of format 1 (published) could not be opened');
    // and through migrateDesign itself: a step that forgets the format fails loudly
    expect(() => migrateDesign(JSON.parse(FROZEN[1].text), { 1: (d) => ({ ...d }) })).not.toThrow(); // current: no step runs
    expect(() => migrateDesign({ ...JSON.parse(FROZEN[1].text), tiltsheet: 0 }, { 0: (d) => ({ ...d }) })).toThrow('did not produce format 1');
  });

  it('runs the steps in order, from the file format up (a chain 0 -> 1 with a made-up format 0)', () => {
    const seen: number[] = [];
    const table: Record<number, DesignMigration> = {
      0: (d) => (seen.push(0), { ...d, tiltsheet: 1, name: `${d.name as string} (from 0)` }),
    };
    const r = migrateDesign(deepFreeze({ ...JSON.parse(FROZEN[1].text), tiltsheet: 0 }), table);
    expect(seen).toEqual([0]);
    expect(r.ok && r.migratedFrom).toBe(0);
    expect(r.ok && validateDesign(r.json).ok).toBe(true);
  });
});
