/**
 * Issue 14, item 1: no exit 70 (internal error) on valid input or on a full disk.
 * - `check` on a design whose envelope reaches a wide lean, where a steering limit has no
 *   road-wheel angles, prints "-" for them (it crashed formatting null);
 * - an unknown option to `validate` is bad input (exit 2) naming it;
 * - a full disk under standard output (/dev/full, which fails every write with ENOSPC) or
 *   under a sweep's file (outputs.test.ts) is exit 74 with the reason in words.
 */
import { closeSync, openSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { HERON, run, spawnCli, tempDir, writeDesign } from './cliHarness';

describe('valid input never ends in an internal error', () => {
  it('check at a wide lean prints a steering limit without road-wheel angles as "-", text and JSON', async () => {
    const dir = tempDir();
    // 60 deg of lean and handlebar: at the outer leans a limit is met before any wheel angle is known.
    const wide = writeDesign(dir, 'wide.tiltsheet', HERON, (d) => {
      d.envelope.leanDeg = 60;
      d.envelope.handlebarDeg = 60;
    });
    const steps = ['--lean-step', '5', '--steer-step', '5', '--travel-step', '50'];
    const text = await run(['check', wide, ...steps]);
    expect(text.code, text.err).toBe(1);
    expect(text.out).toMatch(/left turn (none|-?\d+\.\d) /);
    const json = await run(['check', wide, ...steps, '--json']);
    expect(json.code, json.err).toBe(1);
    const limits = (JSON.parse(json.out) as { limits: { left: { leftWheelDeg: number | null } }[] }).limits;
    // The case that crashed: a limit reached with no wheel angle to print.
    expect(limits.some((l) => l.left.leftWheelDeg === null)).toBe(true);
  }, 60_000);

  it('validate with an unknown option exits 2 naming it, with the usage', async () => {
    const r = await run(['validate', '--bogus', HERON]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/unknown option --bogus/);
    expect(r.err).toMatch(/usage:/);
  });
});

describe('a full disk is exit 74 in words, never an internal error', () => {
  it('standard output on /dev/full: exit 74, "no space left", no stack trace', () => {
    const full = openSync('/dev/full', 'w');
    try {
      for (const args of [['validate', HERON], ['pose', HERON, '--json']]) {
        const r = spawnCli(args, 30_000, { stdio: ['ignore', full, 'pipe'] });
        expect(r.code, r.err).toBe(74);
        expect(r.err).toMatch(/cannot write the standard output: no space left on the device \(ENOSPC\)/);
        expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
      }
    } finally {
      closeSync(full);
    }
  }, 60_000);
});
