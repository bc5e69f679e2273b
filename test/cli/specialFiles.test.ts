/**
 * Issue 14, item 3: an input that is not a regular file is refused before it is read, and a
 * regular file is read with a hard byte cap. /dev/zero reports a size of 0 (so a size check
 * passes) and never ends; a named pipe blocks its reader until something writes to it. Both
 * are run in a child process with a time limit: the old reader grew without bound or waited.
 * The byte cap itself: readInputFile.test.ts.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, symlinkSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HERON, run, spawnCli, tempDir } from './cliHarness';

const LIMIT_MS = 10_000;

function fifo(dir: string, name: string): string {
  const path = join(dir, name);
  execFileSync('mkfifo', [path]);
  return path;
}

describe('special files as inputs', () => {
  it('/dev/zero, a link to it and a named pipe as the design: exit 2 at once, saying what it is', () => {
    const dir = tempDir();
    const link = join(dir, 'zero.tiltsheet');
    symlinkSync('/dev/zero', link);
    const pipe = fifo(dir, 'pipe.tiltsheet');
    for (const [path, says] of [['/dev/zero', /is a device, not a regular file/], [link, /is a device, not a regular file/], [pipe, /is a named pipe, not a regular file/]] as const) {
      for (const command of ['validate', 'check']) {
        const r = spawnCli([command, path], LIMIT_MS + 5000);
        expect(r.signal, `${command} ${path} still running after ${LIMIT_MS + 5000} ms`).toBeNull();
        expect(r.code, `${command} ${path}: ${r.err}`).toBe(2);
        expect(r.err).toContain(`${path}: `);
        expect(r.err).toMatch(says);
      }
    }
  }, 120_000);

  it('a bands file that is a pipe or a device: exit 2 naming --bands', () => {
    const dir = tempDir();
    const pipe = fifo(dir, 'bands.json');
    for (const path of [pipe, '/dev/zero']) {
      const r = spawnCli(['tolerance', HERON, '--samples', '1', '--bands', path], LIMIT_MS + 5000);
      expect(r.signal, `--bands ${path} still running`).toBeNull();
      expect(r.code, r.err).toBe(2);
      expect(r.err).toMatch(/option --bands: .* (named pipe|device), not a regular file/);
    }
  }, 60_000);

  it('a folder, a missing file and a link loop: exit 2 in words', async () => {
    const dir = tempDir();
    const folder = join(dir, 'folder.tiltsheet');
    mkdirSync(folder);
    const loop = join(dir, 'loop.tiltsheet');
    symlinkSync(loop, loop);
    for (const [path, says] of [[folder, /is a folder, not a file/], [join(dir, 'none.tiltsheet'), /cannot read: no such file/], [loop, /cannot read: too many symbolic links/]] as const) {
      const r = await run(['validate', path]);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(says);
    }
  });
});
