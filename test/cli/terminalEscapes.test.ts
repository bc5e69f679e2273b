/**
 * Issue 14, item 6: what the CLI echoes from a file or an argument cannot drive the terminal,
 * and cannot flood it. A design whose name holds escape sequences (retitle the window, clear
 * the screen, recolour, a one-byte C1 CSI, a right-to-left override) goes through every
 * command and output mode: no raw control character reaches stdout or stderr, the name is
 * printed escaped (\u001b), and JSON output still parses to the exact name. A file with a
 * thousand problems prints a stated number and "and N more"; a 5,000-character key or option
 * value is echoed cut to a stated length.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCompareCommand } from '../../core/cli/commands/compare';
import { HERON, RAW_CONTROL, run, runCommand, tempDir, writeDesign } from './cliHarness';

const HOSTILE_NAME = 'Evil \u001b]0;retitled\u0007\u001b[2J\u001b[31m red \u009b1m c1 \u202eoverride\u202c end';

/** Every command and output mode that prints the design's name, with small, quick settings. */
function commands(design: string, other: string, dir: string): string[][] {
  return [
    ['validate', design],
    ['pose', design, '--lean', '5', '--steer', '5'],
    ['pose', design, '--lean', '5', '--steer', '5', '--json'],
    ['check', design, '--lean-step', '25', '--steer-step', '25', '--travel-step', '100'],
    ['check', design, '--lean-step', '25', '--steer-step', '25', '--travel-step', '100', '--json'],
    ['sweep', design, '--lean', '0:10:10', '--steer', '0:10:10', '--out', join(dir, 's.csv')],
    ['sweep', design, '--lean', '0:10:10', '--steer', '0:10:10', '--out', join(dir, 's.json')],
    ['sweep', design, '--speed', '10:20:10', '--steer', '5:10:5', '--out', join(dir, 'r.csv')],
    ['sensitivity', design, '--poses', '5,5', '--top', '2'],
    ['sensitivity', design, '--poses', '5,5', '--json'],
    ['tolerance', design, '--samples', '2', '--poses', '5,5'],
    ['tolerance', design, '--samples', '2', '--poses', '5,5', '--json'],
    ['compare', design, other, '--poses', '5,5'],
    ['compare', design, other, '--poses', '5,5', '--json'],
  ];
}

describe('control characters from a file or an argument are printed escaped', () => {
  it('a design name with escape sequences, through every command and output mode', async () => {
    const dir = tempDir();
    const design = writeDesign(dir, 'evil.tiltsheet', HERON, (d) => (d.name = HOSTILE_NAME));
    for (const argv of commands(design, HERON, dir)) {
      // compare is not in main's command list yet: run as main would run it.
      const r = argv[0] === 'compare' ? await runCommand(runCompareCommand, argv.slice(1)) : await run(argv);
      const label = argv.slice(0, 1).concat(argv.slice(2)).join(' ');
      expect([0, 1], `${label}: ${r.err}`).toContain(r.code);
      expect(RAW_CONTROL.test(r.out), `${label}: raw control character on stdout`).toBe(false);
      expect(RAW_CONTROL.test(r.err), `${label}: raw control character on stderr`).toBe(false);
      if (argv.includes('--json')) {
        // JSON keeps the exact name (escaped the JSON way), where the report has one.
        const json = JSON.parse(r.out) as { name?: string };
        if (['check', 'sensitivity', 'tolerance'].includes(argv[0])) expect(json.name, label).toBe(HOSTILE_NAME);
      } else if (!['sweep', 'compare'].includes(argv[0])) {
        expect(r.out, label).toContain('Evil \\u001b]0;retitled\\u0007\\u001b[2J');
        expect(r.out, label).toContain('\\u009b1m c1 \\u202eoverride');
      }
    }
  }, 120_000);

  it('control characters in a path, an option name and an option value', async () => {
    const dir = tempDir();
    const odd = join(dir, 'odd\u001b[31m.tiltsheet');
    const cases: string[][] = [
      ['validate', odd],
      ['pose', HERON, '--lean', '1\u001b[2J'],
      ['pose', HERON, '--\u001b]0;x\u0007'],
      ['sweep', HERON, '--lean', '0:1\u009b:1', '--out', join(dir, 'x.csv')],
      ['nonsense\u001b[2J'],
    ];
    for (const argv of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(RAW_CONTROL.test(r.err), `${JSON.stringify(argv)}: ${JSON.stringify(r.err.slice(0, 200))}`).toBe(false);
      expect(r.err).toMatch(/\\u001b|\\u009b/);
    }
  });
});

describe('echoes are capped', () => {
  it('a file with 1,000 problems prints 40 and "and N more"; the count line gives them all', async () => {
    const dir = tempDir();
    const keys = Array.from({ length: 1000 }, (_, i) => `"k${i}": 1, "k${i}": 2`).join(', ');
    const file = join(dir, 'many.tiltsheet');
    writeFileSync(file, `{${keys}}`);
    const r = await run(['validate', file]);
    expect(r.code).toBe(2);
    const lines = r.err.trimEnd().split('\n');
    expect(lines.filter((l) => l.includes('is given twice'))).toHaveLength(40);
    expect(r.err).toContain('... and 960 more problems (the first 40 are shown)');
    expect(lines[lines.length - 1]).toBe(`${file}: 1000 problems; the design was not loaded`);
  });

  it('a 5,000-character key and a 5,000-character option value are echoed by their ends', async () => {
    const dir = tempDir();
    const key = 'k'.repeat(5000);
    const file = writeDesign(dir, 'longkey.tiltsheet', HERON, (d) => ((d as unknown as Record<string, unknown>)[key] = 1));
    const v = await run(['validate', file]);
    expect(v.code).toBe(2);
    for (const line of v.err.trimEnd().split('\n')) expect(line.length, line.slice(0, 80)).toBeLessThanOrEqual(400);
    expect(v.err).toMatch(/characters left out/);
    expect(v.err).toMatch(/unknown field/); // the reason at the end survives the cut
    const p = await run(['pose', HERON, '--lean', 'x'.repeat(5000)]);
    expect(p.code).toBe(2);
    const first = p.err.split('\n')[0];
    expect(first.length).toBeLessThanOrEqual(200);
    expect(first).toMatch(/^tiltbench pose: option --lean: expected a number in degrees, found "x+ \[\.\.\. \d+ characters left out \.\.\.\] x+"$/);
  });
});
