/**
 * Issue 5, bad files: thousands of design files mutated and truncated from the demos
 * (fileMutations.ts: byte flips, truncation, deleted, duplicated and retyped keys, huge
 * numbers, deep nesting, odd key names, invalid UTF-8, byte-order marks, line endings, stray
 * characters), read with parseDesignText as the app and the CLI read them.
 *
 * Each file is loaded whole or refused:
 * - loaded: the design is the document in the file, all of it (deep-equal to JSON.parse of the
 *   text, nothing dropped, nothing defaulted), it passes validateDesign again, resolves, and
 *   its design pose solves to a named status;
 * - refused: at least one issue; every message starts with the file name and names a field
 *   (`path: ...`), or a line and column (`file:line:column: invalid JSON`) that lie inside the
 *   text, or says the whole document is wrong; a JSON syntax position agrees with the one
 *   Node's JSON.parse reports whenever Node reports one.
 * Never a throw, and each file is read in well under a second.
 *
 * Outside reference: Node's own JSON.parse (V8, RFC 8259 JSON) decides what parses, and where
 * it reports a position, the line and column we give must be that position (counted here
 * independently), except where our message deliberately points elsewhere: the opening quote of
 * a string never closed, the backslash of a bad escape, the start of a bad word.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { parseDesignText, validateDesign, type DesignIssue } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { loadDemos } from './demoDesigns';
import { fileCaseArb, mutateText, type FileCase } from './fileMutations';
import { NAMED_STATUSES } from './poseChecks';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';

const tally = new FigureTally('files');
afterAll(() => tally.write());

const FILE = 'fuzzed.tiltsheet';
const READ_LIMIT_MS = 1000;

/** Line and column (1-based) of a character offset, counted here independently of the code under test. */
function positionOf(text: string, offset: number): { line: number; column: number } {
  const before = text.slice(0, offset);
  const lines = before.split(/\r\n|\n|\r/);
  return { line: lines.length, column: lines[lines.length - 1].length + 1 };
}

/** The problems with one issue of a refused file. */
function issueProblems(issue: DesignIssue, text: string): string[] {
  const p: string[] = [];
  const m = issue.message;
  if (typeof m !== 'string' || !m.startsWith(`${FILE}:`)) return [`message does not start with the file name: ${JSON.stringify(m)}`];
  const rest = m.slice(FILE.length + 1);
  if (issue.line !== undefined || issue.column !== undefined) {
    const { line, column } = issue;
    if (!Number.isInteger(line) || !Number.isInteger(column) || line! < 1 || column! < 1) p.push(`bad position ${line}:${column}`);
    if (!rest.startsWith(`${line}:${column}: `)) p.push(`message does not give ${line}:${column}: ${m}`);
    const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
    if (line! > lines.length || column! > lines[line! - 1].length + 1) p.push(`position ${line}:${column} is outside the text (${lines.length} lines)`);
  } else if (issue.path !== '') {
    if (!rest.startsWith(` ${issue.path}:`)) p.push(`message does not start with its field ${issue.path}: ${m}`);
  } else if (!/^ (\(document\): expected|the file is empty|invalid JSON)/.test(rest)) {
    p.push(`names no field, line or column: ${m}`);
  }
  return p;
}

function checkFile(text: string, label: string): void {
  const t0 = performance.now();
  let result: ReturnType<typeof parseDesignText>;
  try {
    result = parseDesignText(text, FILE);
  } catch (e) {
    throw new Error(`${label}: parseDesignText threw: ${(e as Error).stack}\ntext: ${JSON.stringify(text.slice(0, 400))}`);
  }
  const ms = performance.now() - t0;
  tally.file(result.ok);
  expect(ms, `${label}: read took ${ms} ms`).toBeLessThan(READ_LIMIT_MS);
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;

  if (result.ok) {
    // All of it: exactly the document in the file.
    expect(result.design, label).toEqual(JSON.parse(body));
    expect(validateDesign(result.design).ok, label).toBe(true);
    const design = resolveDesign(result.design);
    const t1 = performance.now();
    const solved = new PoseSolver(buildMechanism(design)).solve(zeroInputs(), false);
    tally.solve(solved.status, performance.now() - t1, () => `${label}: design pose of a loaded fuzzed file`);
    expect(NAMED_STATUSES).toContain(solved.status);
    return;
  }

  expect(result.issues.length, label).toBeGreaterThan(0);
  const problems = result.issues.flatMap((i) => issueProblems(i, text));
  // A key given twice is refused though JSON.parse accepts the text (it would keep the last):
  // the issue must point at a key's opening quote, in text that parses.
  const isRepeat = (i: { message: string }) => / is given twice in the same object;/.test(i.message);
  for (const repeat of result.issues.filter(isRepeat)) {
    let parses = true;
    try {
      JSON.parse(body);
    } catch {
      parses = false;
    }
    if (!parses) problems.push(`a repeated key reported in text JSON.parse refuses: ${repeat.message}`);
    const lines = body.split(/(?<=\r\n|\n|\r(?!\n))/);
    const offset = lines.slice(0, repeat.line! - 1).join('').length + repeat.column! - 1;
    if (body[offset] !== '"') problems.push(`repeated key reported at ${repeat.line}:${repeat.column}, which is not a quote`);
  }
  // Where Node's own parser gives a position for a syntax error, ours must agree.
  const syntax = result.issues.find((i) => i.line !== undefined && !isRepeat(i));
  if (syntax) {
    let engine: string | undefined;
    try {
      JSON.parse(body);
    } catch (e) {
      engine = (e as Error).message;
    }
    expect(engine, `${label}: a syntax issue for text that JSON.parse accepts`).toBeDefined();
    const at = /position (\d+)/.exec(engine ?? '');
    const lines = body.split(/(?<=\r\n|\n|\r(?!\n))/);
    const offset = lines.slice(0, syntax.line! - 1).join('').length + syntax.column! - 1;
    if (syntax.message.includes('never closed')) {
      // By design the position is the string's opening quote (Node gives the end of the text).
      if (body[offset] !== '"') problems.push(`"never closed" at ${syntax.line}:${syntax.column}, which is not a quote`);
    } else if (/unknown escape|\\u must be followed/.test(syntax.message)) {
      // By design the position is the backslash (Node gives the character after it, or later).
      const node = at ? Number(at[1]) : offset + 1;
      if (body[offset] !== '\\' || node <= offset || node > offset + 6) problems.push(`bad escape reported at ${syntax.line}:${syntax.column}, Node says position ${node}`);
    } else if (at) {
      const node = Number(at[1]);
      const want = positionOf(body, node);
      // Same token: ours may point at the start of the bad word ("tr-ue"), Node inside it.
      const sameToken = offset <= node && /^[^\s{}[\],:"]*$/.test(body.slice(offset, node));
      if (!sameToken && (want.line !== syntax.line || want.column !== syntax.column)) {
        problems.push(`syntax error at ${syntax.line}:${syntax.column}, Node says position ${at[1]} = ${want.line}:${want.column} (${engine})`);
      }
    }
  }
  expect(problems, `${label}\n${problems.join('\n')}\ntext: ${JSON.stringify(text.slice(0, 300))}`).toEqual([]);
}

describe('fuzzed design files: loaded whole or refused with field, line or column; never a throw', () => {
  const demos = loadDemos();

  it('mutated and truncated demos', () => {
    fc.assert(
      fc.property(fileCaseArb(demos.length), (c: FileCase) => {
        const text = mutateText(demos[c.base].text, c);
        checkFile(text, `${demos[c.base].file} with ${JSON.stringify(c.mutations).slice(0, 300)}`);
      }),
      { numRuns: runs(3000), seed: fuzzSeed() + 20, endOnFailure: true },
    );
  }, 300_000);

  it('every prefix of a demo file (truncation at each byte)', () => {
    const text = demos[0].text;
    const bytes = Buffer.from(text, 'utf8');
    const step = Math.max(1, Math.floor(bytes.length / runs(400)));
    for (let n = 0; n < bytes.length; n += step) checkFile(bytes.subarray(0, n).toString('utf8'), `${demos[0].file} cut at byte ${n}`);
  }, 120_000);

  it('hand-picked hard cases', () => {
    const good = demos[1].text;
    const cases: [string, string][] = [
      ['empty', ''],
      ['only a BOM', '\uFEFF'],
      ['only whitespace', ' \n\t\r\n'],
      ['null', 'null'],
      ['a number', '1'],
      ['a list', '[]'],
      ['a string', '"tiltsheet"'],
      ['an empty object', '{}'],
      ['BOM then the design', `\uFEFF${good}`],
      ['two BOMs', `\uFEFF\uFEFF${good}`],
      ['UTF-16 LE read as UTF-8', Buffer.from(`\uFEFF${good}`, 'utf16le').toString('utf8')],
      ['NUL bytes', good.replace('"name"', '"na\u0000me"')],
      ['a raw NUL outside strings', good.replace('{', '{\u0000')],
      ['nested 100000 deep in notes', good.replace('"notes": ', `"notes": ${'['.repeat(100000)}${']'.repeat(100000)}, "x": `)],
      ['nested 100000 deep, unclosed', `{"tiltsheet": 1, "a": ${'['.repeat(100000)}`],
      ['a 3 MB string', good.replace('"name": "', `"name": "${'x'.repeat(3_000_000)}`)],
      ['__proto__ at the top', good.replace('{', '{"__proto__": {"polluted": true},')],
      ['__proto__ inside a vector', good.replace('"pivotAxis": { "x": 1', '"pivotAxis": { "__proto__": {"w": 1}, "x": 1')],
      ['duplicate tiltsheet key', good.replace('"tiltsheet": 1,', '"tiltsheet": 2, "tiltsheet": 1,')],
      ['number 1e400', good.replace('"wheelbaseMm": 1050', '"wheelbaseMm": 1e400')],
      ['a lone surrogate escape', good.replace('"name": "', '"name": "\\uD800')],
      ['trailing garbage', `${good}\n}`],
      ['two documents', `${good}${good}`],
    ];
    for (const [what, text] of cases) checkFile(text, what);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  }, 120_000);

  it('nesting deeper than 512 does not hide the real syntax error (reported where Node finds it)', () => {
    // Valid JSON nested 600 deep (JSON.parse accepts it), then the file is cut short.
    const text = `{\n  "tiltsheet": 1,\n  "notes": ${'['.repeat(600)}${']'.repeat(600)},\n  "name": "x"`;
    let engine = '';
    try {
      JSON.parse(text);
    } catch (e) {
      engine = (e as Error).message;
    }
    expect(() => JSON.parse(`${text}}`)).not.toThrow(); // the nesting alone is fine
    const result = parseDesignText(text, FILE);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const at = /position (\d+)/.exec(engine);
    const want = at ? positionOf(text, Number(at[1])) : positionOf(text, text.length);
    expect({ line: result.issues[0].line, column: result.issues[0].column }, result.issues[0].message).toEqual(want);
  });
});
