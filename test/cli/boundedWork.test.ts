/**
 * Issue 14, item 2: bounded work. Every pose input and grid has a stated limit, refused up
 * front (exit 2 naming the limit, in seconds, not minutes), and a sweep writes its rows as it
 * goes instead of holding a whole layer. The commands that could run without end are run in a
 * child process with a time limit, so a regression fails instead of hanging the test run.
 */
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HERON, SWIFT, run, spawnCli, tempDir } from './cliHarness';

/** Far below the minutes the unbounded runs took, far above a refusal (a few hundred ms). */
const PROMPT_MS = 15_000;

describe('inputs past their stated limits are refused at once', () => {
  it('pose --steer 1e300 and --heave 1e12 (the Swift never returned): exit 2 naming the limit', () => {
    for (const [option, value, limit] of [['--steer', '1e300', /--steer: 1e\+300 degrees is past the limit of 1080 degrees/], ['--heave', '1e12', /--heave: 1000000000000 mm is past the limit of 1000 mm/]] as const) {
      const r = spawnCli(['pose', SWIFT, option, value], PROMPT_MS + 5000);
      expect(r.signal, `${option} ${value} was still running after ${PROMPT_MS + 5000} ms`).toBeNull();
      expect(r.code, r.err).toBe(2);
      expect(r.err).toMatch(limit);
      expect(r.ms).toBeLessThan(PROMPT_MS);
    }
  }, 60_000);

  it('inputs at the limits are poses (exit 0 or 1, promptly), and the limits are in the help', async () => {
    for (const args of [['--steer', '1080'], ['--steer', '-1080', '--lean', '-90'], ['--heave', '1000'], ['--travel', '-1000'], ['--wheel-angle', '180']]) {
      const r = await run(['pose', SWIFT, ...args, '--json']);
      expect([0, 1], `${args.join(' ')}: ${r.err}`).toContain(r.code);
      expect(r.ms, args.join(' ')).toBeLessThan(PROMPT_MS);
    }
    const help = await run(['pose', '--help']);
    expect(help.out).toMatch(/handlebar within \+-1080 deg/);
  }, 60_000);

  it('check --lean-step 0.001 (about 20 million poses) and 1e-9 ("Invalid array length"): exit 2 naming the grid limit', () => {
    for (const step of ['0.001', '1e-9']) {
      const r = spawnCli(['check', HERON, '--lean-step', step], PROMPT_MS + 5000);
      expect(r.signal, `--lean-step ${step} was still running`).toBeNull();
      expect(r.code, r.err).toBe(2);
      expect(r.err).toMatch(/the envelope grid at these steps has [\d,]+ poses; at most 1,000,000 are taken/);
      expect(r.ms).toBeLessThan(PROMPT_MS);
    }
  }, 60_000);

  it('a sweep grid past the limit and study poses past an input limit: exit 2 naming them', async () => {
    const dir = tempDir();
    const big = await run(['sweep', HERON, '--lean', '-25:25:0.05', '--steer', '-25:25:0.05', '--travel', '0:40:10', '--out', join(dir, 'big.csv')]);
    expect(big.code).toBe(2);
    expect(big.err).toMatch(/the grid has 5,010,005 poses; at most 1,000,000 are taken/);
    expect(readdirSync(dir)).toEqual([]);
    const study = await run(['sensitivity', HERON, '--poses', '0,5000']);
    expect(study.code).toBe(2);
    expect(study.err).toMatch(/--poses, pose 1, handlebar: 5000 degrees is past the limit of 1080 degrees/);
  });
});

describe('a sweep streams its rows', () => {
  it('rows reach the file while the sweep is still running (a single travel layer was held whole before)', async () => {
    const dir = tempDir();
    const out = join(dir, 'rows.csv');
    // One layer of 61 x 101 poses: the old code wrote nothing but the header until all were solved.
    const sweep = run(['sweep', HERON, '--lean', '-15:15:0.5', '--steer', '-25:25:0.5', '--out', out]);
    let finished = false;
    void sweep.then(() => (finished = true));
    let seenWhileRunning = 0;
    const poll = setInterval(() => {
      if (finished) return;
      for (const f of readdirSync(dir)) seenWhileRunning = Math.max(seenWhileRunning, statSync(join(dir, f)).size);
    }, 20);
    const r = await sweep;
    clearInterval(poll);
    expect(r.code, r.err).toBe(0);
    const total = statSync(out).size;
    // Well past the header (about 3 kB) before the end: at least a tenth of the rows.
    expect(seenWhileRunning, `largest file seen while running: ${seenWhileRunning} of ${total} bytes`).toBeGreaterThan(total / 10);
  }, 60_000);
});
