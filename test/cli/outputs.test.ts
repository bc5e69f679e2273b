/**
 * Issue 14, item 4: every output file is whole or absent. A sweep's file goes through a
 * temporary file in the same folder, renamed over the target at the end; it is never one of
 * the inputs (by name, hard link or symbolic link); Ctrl-C, SIGTERM and a full disk leave the
 * old file as it was and no temporary file; SIGKILL leaves the old file and a temporary file
 * the next write removes. Signals and pipes need a child process (time-limited). A full disk:
 * outputFile.test.ts.
 */
import { chmodSync, existsSync, linkSync, lstatSync, mkdirSync, readdirSync, readFileSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HERON, run, spawnCli, startCli, tempDir } from './cliHarness';

const OLD = 'old,content\n';
/** A sweep of about 50,000 poses: several seconds, long enough to be interrupted. */
const LONG_SWEEP = ['--lean', '-25:25:0.2', '--steer', '-25:25:0.5', '--travel', '0:20:20'];
const SHORT_SWEEP = ['--lean', '0:10:10', '--steer', '-10:10:10'];

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('an output is never an input', () => {
  it('sweep --out onto the design itself, a hard link to it or a link to it: exit 2, the design unchanged', async () => {
    const dir = tempDir();
    // A design may be named .json: then --out can name it.
    const design = join(dir, 'design.json');
    const text = readFileSync(HERON, 'utf8');
    writeFileSync(design, text);
    const hard = join(dir, 'hard.csv');
    linkSync(design, hard);
    const soft = join(dir, 'soft.csv');
    symlinkSync(design, soft);
    for (const out of [design, hard, soft]) {
      for (const extra of [SHORT_SWEEP, ['--speed', '10:20:10', '--steer', '0:10:10']]) {
        const r = await run(['sweep', design, ...extra, '--out', out]);
        expect(r.code, `${out}: ${r.err}`).toBe(2);
        expect(r.err).toMatch(/--out .*: is the design given as input; write the result to another file/);
      }
    }
    expect(readFileSync(design, 'utf8')).toBe(text);
    expect(lstatSync(soft).isSymbolicLink()).toBe(true);
  });

  it('a folder, a missing folder or a named pipe as --out: exit 2 at once', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'folder.csv'));
    for (const [out, says] of [[join(dir, 'folder.csv'), /is a folder; name a file/], [join(dir, 'no', 'such', 'x.csv'), /the folder .* cannot be used: it does not exist/]] as const) {
      const r = await run(['sweep', HERON, ...SHORT_SWEEP, '--out', out]);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(says);
    }
    const pipe = join(dir, 'pipe.csv');
    execFileSync('mkfifo', [pipe]);
    // Opened for writing, a pipe with no reader blocks for ever: a child process, time-limited.
    const r = spawnCli(['sweep', HERON, ...SHORT_SWEEP, '--out', pipe], 15_000);
    expect(r.signal, 'still running after 15 s').toBeNull();
    expect(r.code, r.err).toBe(2);
    expect(r.err).toMatch(/exists and is not a regular file/);
  }, 30_000);
});

describe('written whole or not at all', () => {
  it('a finished sweep replaces the file whole, keeps its permissions, and writes through a link', async () => {
    const dir = tempDir();
    const real = join(dir, 'real.csv');
    writeFileSync(real, OLD);
    chmodSync(real, 0o640);
    const link = join(dir, 'link.csv');
    symlinkSync(real, link);
    const r = await run(['sweep', HERON, ...SHORT_SWEEP, '--out', link]);
    expect(r.code, r.err).toBe(0);
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    const lines = readFileSync(real, 'utf8').trim().split('\n');
    expect(lines.length).toBe(1 + 2 * 3);
    expect(lines[0]).toMatch(/^leanDeg,handlebarDeg,travelMm,/);
    expect(statSync(real).mode & 0o777).toBe(0o640);
    expect(readdirSync(dir).sort()).toEqual(['link.csv', 'real.csv']);
  });

  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    it(`${signal} during a sweep: exit ${signal === 'SIGINT' ? 130 : 143}, the old file as it was, no temporary file`, async () => {
      const dir = tempDir();
      const out = join(dir, 'out.csv');
      writeFileSync(out, OLD);
      const { child, done } = startCli(['sweep', HERON, ...LONG_SWEEP, '--out', out]);
      // Wait until the sweep is writing (its temporary file has rows), then interrupt it.
      const t0 = Date.now();
      while (Date.now() - t0 < 15_000 && !readdirSync(dir).some((f) => f.endsWith('.partial') && statSync(join(dir, f)).size > 100_000)) await sleep(50);
      child.kill(signal);
      const end = await Promise.race([done, sleep(15_000).then(() => null)]);
      if (end === null) child.kill('SIGKILL');
      expect(end, 'did not stop within 15 s of the signal').not.toBeNull();
      expect(end!.code, end!.err).toBe(signal === 'SIGINT' ? 130 : 143);
      expect(end!.err).toMatch(/stopped by .*; .*out\.csv is as it was/);
      expect(readFileSync(out, 'utf8')).toBe(OLD);
      expect(readdirSync(dir)).toEqual(['out.csv']);
    }, 40_000);
  }

  it('SIGKILL during a sweep: the old file as it was; the next write to it removes the temporary file left', async () => {
    const dir = tempDir();
    const out = join(dir, 'out.csv');
    writeFileSync(out, OLD);
    const { child, done } = startCli(['sweep', HERON, ...LONG_SWEEP, '--out', out]);
    const t0 = Date.now();
    while (Date.now() - t0 < 15_000 && !readdirSync(dir).some((f) => f.endsWith('.partial') && statSync(join(dir, f)).size > 100_000)) await sleep(50);
    child.kill('SIGKILL');
    await done;
    expect(readFileSync(out, 'utf8')).toBe(OLD);
    const left = readdirSync(dir).filter((f) => f !== 'out.csv');
    expect(left).toHaveLength(1);
    expect(left[0]).toMatch(/^\.out\.csv\.\d+-[0-9a-f]{12}\.partial$/);
    const again = await run(['sweep', HERON, ...SHORT_SWEEP, '--out', out]);
    expect(again.code, again.err).toBe(0);
    expect(readdirSync(dir)).toEqual(['out.csv']);
    expect(existsSync(join(dir, left[0]))).toBe(false);
  }, 40_000);
});
