/**
 * Issue 5 through the command line: the `tiltbench` commands (core/cli/main.ts, run in
 * process with a captured CliIo) on fuzzed design files and fuzzed arguments.
 *
 * Every run exits with a documented code: 0 done, 1 the job ran and found a failure, 2 bad
 * input; never 70 (main's "internal error": an exception escaped a command). On exit 2 for a
 * bad file every stderr line names the file and a field or a line and column; JSON output
 * parses and holds only finite numbers (JSON.stringify would turn a NaN into null silently,
 * so nulls are allowed only where the format documents them); text output prints no NaN.
 */
import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main, COMMANDS } from '../../../core/cli/main';
import { parseDesignText } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { solveSinglePose } from '../../../core/analysis/solveSinglePose';
import type { CliIo } from '../../../core/cli/io';
import { loadDemos } from './demoDesigns';
import { fileCaseArb, mutateText } from './fileMutations';
import { nonFiniteIn } from './poseChecks';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';

const tally = new FigureTally('cli');
let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tiltbench-cli-fuzz-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
  tally.write();
});

async function run(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => void (out += t), err: (t) => void (err += t), isTty: false };
  const code = await main(argv, io);
  return { code, out, err };
}

const DOCUMENTED_EXITS = [0, 1, 2];

/**
 * CLI JSON must parse and hold only finite numbers. JSON.stringify writes NaN and Infinity as
 * null, so the report the command prints is also rebuilt in process (solveSinglePose on the
 * same file and inputs) and checked before it is stringified.
 */
function jsonProblems(text: string, where: string): string[] {
  try {
    return nonFiniteIn(JSON.parse(text), where);
  } catch (e) {
    return [`${where}: --json output does not parse: ${(e as Error).message}`];
  }
}

function expectNamesFileAndPlace(err: string, file: string, where: string): void {
  const lines = err
    .trimEnd()
    .split('\n')
    .filter((l) => l.trim() !== '' && !/problems?; the design was not loaded$/.test(l) && !/^\.\.\. and \d+ more problems? \(the first \d+ are shown\)$/.test(l))
    // A long message is printed by its two ends: judge it as if whole.
    .map((l) => l.replace(/ \[\.\.\. \d+ characters left out \.\.\.\] /, ''));
  expect(lines.length, where).toBeGreaterThan(0);
  for (const line of lines) {
    expect(line.startsWith(`${file}:`), `${where}: ${line}`).toBe(true);
    const rest = line.slice(file.length + 1);
    // file:line:column: ..., or file: field.path: ..., or a whole-file message
    // A field path as schemaDsl.formatPath writes it: name(.name | [index] | ["odd name"])*
    const field = /^ (\(document\)|[A-Za-z_$][\w$]*(\.[A-Za-z_$][\w$]*|\[\d+\]|\["(?:[^"\\]|\\.)*"\])*|\["(?:[^"\\]|\\.)*"\](\.[A-Za-z_$][\w$]*|\[\d+\]|\["(?:[^"\\]|\\.)*"\])*): /;
    expect(/^\d+:\d+: /.test(rest) || field.test(rest) || /^ (the file (is|holds)|cannot read|is (a|not a))/.test(rest), `${where}: ${line}`).toBe(true);
  }
}

describe('tiltbench on fuzzed design files', () => {
  const demos = loadDemos();

  it('validate and pose: documented exit codes, messages naming file and place, finite JSON', async () => {
    const cases = fc.sample(fileCaseArb(demos.length), { numRuns: runs(250), seed: fuzzSeed() + 40 });
    const args = fc.sample(fc.tuple(fc.integer({ min: -60, max: 60 }), fc.integer({ min: -180, max: 180 }), fc.boolean()), { numRuns: cases.length, seed: fuzzSeed() + 41 });
    let index = 0;
    for (const c of cases) {
      const text = mutateText(demos[c.base].text, c);
      const file = join(dir, `f${index}.tiltsheet`);
      writeFileSync(file, text);
      const label = `${demos[c.base].file} ${JSON.stringify(c.mutations).slice(0, 200)}`;
      const v = await run(['validate', file]);
      tally.file(v.code === 0);
      expect(v.code, `${label}\n${v.err}`).not.toBe(70);
      expect([0, 2], `${label}\n${v.err}`).toContain(v.code);
      if (v.code === 2) expectNamesFileAndPlace(v.err, file, label);
      const [lean, steer, travel] = args[index];
      const t0 = performance.now();
      // A design that does not tilt refuses a lean (exit 2, like sweep): ask it for none.
      const parsed = parseDesignText(text, file);
      const tilts = !parsed.ok || parsed.design.vehicle.tilting;
      const p = await run(['pose', file, '--lean', String(tilts ? lean : 0), '--steer', String(steer), ...(travel ? ['--travel', '20'] : []), '--json']);
      expect(DOCUMENTED_EXITS, `${label}\n${p.err}`).toContain(p.code);
      expect(p.code === 2, `${label}: validate said ${v.code}, pose ${p.code}`).toBe(v.code === 2);
      if (p.code !== 2) {
        const status = (JSON.parse(p.out) as { status: string }).status;
        tally.solve(status, performance.now() - t0, () => `${label}: tiltbench pose`);
        expect(jsonProblems(p.out, label)).toEqual([]);
        const loaded = parseDesignText(text, file);
        expect(loaded.ok).toBe(true);
        if (loaded.ok) {
          const request = { contact: travel ? 'travel' : 'ground', steerBy: 'handlebar', leanDeg: tilts ? lean : 0, handlebarDeg: steer, heaveMm: 0, travelRightMm: travel ? 20 : 0, travelLeftMm: travel ? 20 : 0, wheelAngleDeg: 0 } as const;
          const report = solveSinglePose(resolveDesign(loaded.design), request).report;
          expect(nonFiniteIn(report, 'report'), label).toEqual([]);
          expect(report.status).toBe(status);
        }
      }
      index++;
    }
  }, 300_000);

  it('pose text output and every other command on the demos and on broken files', async () => {
    const broken = join(dir, 'broken.tiltsheet');
    writeFileSync(broken, demos[0].text.slice(0, 500));
    const commands = Object.keys(COMMANDS);
    expect(commands).toEqual(expect.arrayContaining(['validate', 'pose']));
    for (const d of demos) {
      const file = join(dir, d.file.split('/').pop()!);
      writeFileSync(file, d.text);
      const text = await run(['pose', file, '--lean', '5', '--steer', '170']);
      expect(DOCUMENTED_EXITS).toContain(text.code);
      expect(nonFiniteIn(text.out)).toEqual([]);
      // Further commands (sweep, check, ...) as they appear: a coarse run each, on this demo and on a broken file.
      for (const name of commands.filter((n) => !['validate', 'pose'].includes(n))) {
        const extra = name === 'sweep' ? ['--lean', '0:10:10', '--steer', '-20:20:20', '--out', join(dir, `${name}.json`)] : name === 'check' ? ['--lean-step', '20', '--steer-step', '20', '--travel-step', '100', '--json'] : [];
        for (const target of [file, broken]) {
          const r = await run([name, target, ...extra]);
          expect(r.code, `${name} ${target}: ${r.err}`).not.toBe(70);
          expect(DOCUMENTED_EXITS, `${name} ${target}: ${r.err}`).toContain(r.code);
          if (target === broken) {
            expect(r.code).toBe(2);
            expectNamesFileAndPlace(r.err.split('\n').filter((l) => l.startsWith(broken)).join('\n'), broken, `${name} on a cut file`);
          } else if (name === 'check') {
            expect(jsonProblems(r.out, `${name} ${d.file}`)).toEqual([]);
          } else if (name === 'sweep' && existsSync(join(dir, `${name}.json`))) {
            expect(nonFiniteIn(JSON.parse(readFileSync(join(dir, `${name}.json`), 'utf8')))).toEqual([]);
          }
        }
      }
    }
  }, 300_000);
});

describe('tiltbench with odd arguments and odd paths', () => {
  it('exits 2 naming the option or the file, never 70', async () => {
    const demo = join(dir, 'demo.tiltsheet');
    writeFileSync(demo, loadDemos()[1].text);
    const folder = join(dir, 'a-folder.tiltsheet');
    mkdirSync(folder, { recursive: true });
    const huge = join(dir, 'huge.tiltsheet');
    writeFileSync(huge, Buffer.alloc(6 * 1024 * 1024, 0x20));
    const cases: [string[], RegExp][] = [
      [['pose', demo, '--lean', 'NaN'], /--lean/],
      [['pose', demo, '--lean', '1e400'], /--lean/],
      [['pose', demo, '--steer', ''], /--steer/],
      [['pose', demo, '--steer'], /--steer/],
      [['pose', demo, '--travel', '12mm'], /--travel/],
      [['pose', demo, '--wheel', 'middle', '--wheel-angle', '5'], /--wheel/],
      [['pose', demo, '--bogus'], /--bogus/],
      [['pose', demo, '--lean', '1e300'], /--lean: 1e\+300 degrees is past the limit of 90 degrees/],
      [['pose', demo, '--travel', '1e6'], /--travel: 1000000 mm is past the limit of 1000 mm/],
      [['pose', demo, demo], /at most one design/],
      [['validate'], /usage/],
      [['validate', join(dir, 'missing.tiltsheet')], /no such file/],
      [['validate', folder], /folder/],
      [['validate', huge], /bytes/],
      [['pose', folder, '--lean', '1'], /folder/],
      [['nonsense'], /unknown command/],
    ];
    for (const [argv, says] of cases) {
      const r = await run(argv);
      expect(r.code, `${argv.join(' ')}: ${r.err}`).toBe(2);
      expect(r.err, argv.join(' ')).toMatch(says);
    }
    // Inputs at their stated limits are poses, not bad input: a named status, exit 0 or 1.
    for (const argv of [['pose', demo, '--lean', '90'], ['pose', demo, '--steer', '-1e-300', '--json'], ['pose', demo, '--travel', '1000', '--json'], ['pose', demo, '--steer', '-1080', '--json']]) {
      const r = await run(argv);
      expect(DOCUMENTED_EXITS, `${argv.join(' ')}: ${r.err}`).toContain(r.code);
      expect(r.code, argv.join(' ')).not.toBe(2);
      if (argv.includes('--json')) expect(jsonProblems(r.out, argv.join(' '))).toEqual([]);
      else expect(nonFiniteIn(r.out)).toEqual([]);
    }
  }, 120_000);
});
