/**
 * Issues 5 and 14 through the command line: every `tiltbench` command and output mode (run in
 * process with a captured CliIo) on the demos, on mutated demos, with fuzzed options, and on hostile paths.
 *
 * Every run holds the properties of cliRuns.ts: a documented exit code (0 or 1 the job ran, 2
 * refused with a message), never 70 or an exception, never over 10 s, no raw control
 * character printed, JSON that parses with finite numbers, text without NaN, and an output
 * file whole or as it was, no temporary file left. On exit 2 for a bad file every stderr line
 * names the file and a field or a line and column. The figures (tried, ran, refused, crashed,
 * hung) go to test-artifacts/fuzz-figures.json.
 */
import { execFileSync } from 'node:child_process';
import { linkSync, mkdtempSync, mkdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../../core/cli/main';
import { parseDesignText } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { solveSinglePose } from '../../../core/analysis/solveSinglePose';
import type { CliIo } from '../../../core/cli/io';
import { loadDemos } from './demoDesigns';
import { fileCaseArb, mutateText } from './fileMutations';
import { nonFiniteIn } from './poseChecks';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';
import { fuzzRun } from './cliRuns';
import { COMMAND_OPTIONS, COMMAND_SPECS, OPTION_VALUES, SMALL_DEFAULTS } from './cliSpecs';

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

  it('every command and output mode on the demos and on mutated demos', async () => {
    const problems: string[] = [];
    // Each mode on two demos, then on mutated files (one mode per file, in turn).
    for (let k = 0; k < COMMAND_SPECS.length; k++) {
      for (const d of [demos[k % demos.length], demos[(k + 1) % demos.length]]) {
        const spec = COMMAND_SPECS[k];
        const folder = mkdtempSync(join(dir, 'demo-'));
        const file = join(folder, d.file.split('/').pop()!);
        writeFileSync(file, d.text);
        const other = join(folder, 'other.tiltsheet');
        writeFileSync(other, demos[(k + 2) % demos.length].text);
        const { run: r, problems: found } = await fuzzRun(tally, spec.argv(file, folder, other), `${spec.mode} on ${d.file}`, d.design.name);
        problems.push(...found);
        if (r.code === 2 && !/tilt|centre-pivot|does not apply|--hold/.test(r.err)) problems.push(`${spec.mode} on ${d.file}: refused a demo: ${r.err.slice(0, 300)}`);
      }
    }
    const cases = fc.sample(fileCaseArb(demos.length), { numRuns: runs(160), seed: fuzzSeed() + 42 });
    for (let i = 0; i < cases.length; i++) {
      const c = cases[i];
      const spec = COMMAND_SPECS[i % COMMAND_SPECS.length];
      const folder = mkdtempSync(join(dir, 'm-'));
      const file = join(folder, 'fuzzed.tiltsheet');
      const text = mutateText(demos[c.base].text, c);
      writeFileSync(file, text);
      const other = join(folder, 'other.tiltsheet');
      writeFileSync(other, demos[(c.base + 1) % demos.length].text);
      const parsed = parseDesignText(text, file);
      const label = `${spec.mode} on ${demos[c.base].file} ${JSON.stringify(c.mutations).slice(0, 200)}`;
      const { run: r, problems: found } = await fuzzRun(tally, spec.argv(file, folder, other), label, parsed.ok ? parsed.design.name : undefined);
      problems.push(...found);
      if (!parsed.ok && r.code !== 2) problems.push(`${label}: the file does not load, yet exit ${r.code}`);
      if (!parsed.ok && r.code === 2) expectNamesFileAndPlace(r.err.split('\n').filter((l) => l.startsWith(file)).join('\n'), file, label);
    }
    expect(problems).toEqual([]);
  }, 300_000);
});

/** Arguments for a command: a few of its options (some twice), unknown ones, odd values. */
function optionListArb(command: string): fc.Arbitrary<string[]> {
  const known = Object.keys(COMMAND_OPTIONS[command]);
  const knownOne: fc.Arbitrary<string[]> =
    known.length === 0
      ? fc.constant(['--json'])
      : fc.constantFrom(...known).chain((name): fc.Arbitrary<string[]> => {
          const kind = COMMAND_OPTIONS[command][name];
          if (kind === null) return fc.constantFrom([`--${name}`], [`--${name}=yes`]);
          const value = fc.oneof({ weight: 5, arbitrary: OPTION_VALUES[kind] }, { weight: 1, arbitrary: OPTION_VALUES.hostile });
          return value.chain((v) => fc.constantFrom([`--${name}`, v], [`--${name}=${v}`]));
        });
  const odd: fc.Arbitrary<string[]> = fc.constantFrom(['--bogus'], ['--'], ['-x'], ['--LEAN', '5'], ['--\u001b[2J'], ['extra-positional'], [`--${'o'.repeat(3000)}`]);
  const one = fc.oneof({ weight: 6, arbitrary: knownOne }, { weight: 1, arbitrary: odd });
  return fc.array(one, { minLength: 0, maxLength: 4 }).map((parts) => parts.flat());
}

describe('tiltbench with fuzzed options', () => {
  it('every command with a few of its options, odd values, unknown and repeated options', async () => {
    const demos = loadDemos();
    const folder = mkdtempSync(join(dir, 'opts-'));
    const files = demos.map((d, i) => {
      const f = join(folder, `demo${i}.tiltsheet`);
      writeFileSync(f, d.text);
      return f;
    });
    const commands = Object.keys(COMMAND_OPTIONS);
    const cases = fc.sample(
      fc.record({ command: fc.constantFrom(...commands), design: fc.nat({ max: files.length - 1 }), out: fc.constantFrom('csv', 'json', 'txt'), seed: fc.nat() }).chain((c) =>
        optionListArb(c.command).map((options) => ({ ...c, options })),
      ),
      { numRuns: runs(300), seed: fuzzSeed() + 43 },
    );
    const problems: string[] = [];
    for (const [i, c] of cases.entries()) {
      const given = new Set(c.options.filter((a) => a.startsWith('--')).map((a) => a.slice(2).split('=')[0]));
      const defaults = (SMALL_DEFAULTS[c.command] ?? []).reduce<string[]>((acc, a, k, all) => (a.startsWith('--') && !given.has(a.slice(2)) && !(c.command === 'sweep' && given.has('hold')) ? [...acc, a, all[k + 1]] : acc), []);
      const out = c.command === 'sweep' ? ['--out', join(folder, `out${i}.${c.out}`)] : [];
      const second = c.command === 'compare' ? [files[(c.design + 1) % files.length]] : [];
      const argv = [c.command, files[c.design], ...second, ...c.options, ...defaults, ...out];
      const { run: r, problems: found } = await fuzzRun(tally, argv, `options case ${i}`, demos[c.design].design.name);
      problems.push(...found);
      const names = c.options.filter((a) => a.startsWith('--') && a !== '--').map((a) => a.slice(2).split('=')[0]);
      if (new Set(names).size < names.length && r.code !== 2) problems.push(`options case ${i}: an option given twice, yet exit ${r.code}: ${argv.join(' ')}`);
    }
    expect(problems).toEqual([]);
  }, 300_000);
});

describe('tiltbench on hostile paths', () => {
  it('special files, links, long and odd names as inputs; the input, links, pipes and folders as outputs', async () => {
    const demos = loadDemos();
    const folder = mkdtempSync(join(dir, 'paths-'));
    const design = join(folder, 'design.json');
    writeFileSync(design, demos[0].text);
    const pipe = join(folder, 'pipe.tiltsheet');
    execFileSync('mkfifo', [pipe]);
    const outPipe = join(folder, 'pipe.csv');
    execFileSync('mkfifo', [outPipe]);
    const loop = join(folder, 'loop.tiltsheet');
    symlinkSync(loop, loop);
    const toZero = join(folder, 'zero.tiltsheet');
    symlinkSync('/dev/zero', toZero);
    const toNull = join(folder, 'null.csv');
    symlinkSync('/dev/null', toNull);
    const hard = join(folder, 'hard.csv');
    linkSync(design, hard);
    const soft = join(folder, 'soft.json');
    symlinkSync(design, soft);
    mkdirSync(join(folder, 'folder.csv'));
    const empty = join(folder, 'empty.tiltsheet');
    writeFileSync(empty, '');
    const big = join(folder, 'big.tiltsheet');
    writeFileSync(big, Buffer.alloc(6 * 1024 * 1024, 0x20));
    const escName = join(folder, 'odd\u001b[31m\u009b\u202e.tiltsheet');
    writeFileSync(escName, demos[1].text);
    const inputs = [pipe, loop, toZero, '/dev/zero', '/dev/null', '/proc/self/status', folder, empty, big, join(folder, 'none.tiltsheet'), join(folder, 'x'.repeat(5000)), escName, ''];
    const outputs = [design, hard, soft, outPipe, toNull, join(folder, 'folder.csv'), join(folder, 'no', 'such.csv'), join(folder, 'odd\u001b]0;t\u0007.csv'), join(folder, `${'y'.repeat(250)}.csv`), join(folder, `${'w'.repeat(300)}.csv`)];
    const problems: string[] = [];
    for (const spec of COMMAND_SPECS) {
      for (const input of inputs) {
        const { run: r, problems: found } = await fuzzRun(tally, spec.argv(input, folder, design), `${spec.mode} on ${JSON.stringify(input.slice(0, 80))}`);
        problems.push(...found);
        // Only the odd name holds a real design; every other input is refused.
        if (input !== escName && r.code !== 2) problems.push(`${spec.mode} on ${input.slice(0, 80)}: exit ${r.code}, expected 2`);
      }
    }
    for (const out of outputs) {
      for (const extra of [['--lean', '0:10:10', '--steer', '0:10:10'], ['--speed', '10:10:1', '--steer', '0:10:10']]) {
        const argv = ['sweep', design, ...extra, '--out', out];
        const { run: r, problems: found } = await fuzzRun(tally, argv, `sweep --out ${JSON.stringify(out.slice(-60))}`);
        problems.push(...found);
        // A name at the file system's 255-byte limit is written (its temporary file's name is cut); one
        // past the limit is refused.
        const fine = out.includes('odd') || out.includes('yyy');
        if (fine ? r.code !== 0 && r.code !== 1 : r.code !== 2) problems.push(`sweep --out ${out.slice(-60)}: exit ${r.code}: ${r.err.slice(0, 200)}`);
      }
    }
    expect(problems).toEqual([]);
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
