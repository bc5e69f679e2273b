/**
 * Issue 14, items 1 and 4: a sweep's file on a full disk. The file-system calls are swapped for
 * ones whose writes fail with ENOSPC after 100 kB (a real full disk needs a mount): exit 74 with
 * the reason in words, the old file as it was, no temporary file left.
 */
import * as nodeFs from 'node:fs';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CliIo } from '../../core/cli/io';
import { checkOutputPath, type OutputFs } from '../../core/cli/outputFile';
import { writeTableFile } from '../../core/cli/commands/sweepFile';
import { tempDir } from './cliHarness';

describe('a full disk while writing a sweep', () => {
  it("a sweep's file on a full disk: exit 74, the old file as it was, no temporary file left", async () => {
    const dir = tempDir();
    const target = join(dir, 'out.csv');
    writeFileSync(target, 'old,result\n');
    let written = 0;
    // The disk fills after 100 kB.
    const fullAfter: OutputFs = {
      ...nodeFs,
      writeSync: ((fd: number, buffer: Buffer, offset: number, length: number) => {
        if (written + length > 100_000) throw Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' });
        written += length;
        return nodeFs.writeSync(fd, buffer, offset, length);
      }) as OutputFs['writeSync'],
    };
    let err = '';
    const io: CliIo = { out: () => {}, err: (t) => void (err += t), isTty: false };
    const result = await writeTableFile(
      io,
      'sweep',
      checkOutputPath(target, '--out', []),
      { format: 'csv', columns: [{ name: 'a' }, { name: 'b' }], head: {} },
      async (table, between) => {
        for (let i = 0; i < 20_000; i++) {
          table.row([i, 'a row of some length']);
          if (i % 1000 === 0) await between();
        }
        return { rows: 20_000 };
      },
      fullAfter,
    );
    expect(result).toEqual({ exit: 74 });
    expect(err).toMatch(/cannot write .*out\.csv: no space left on the device \(ENOSPC\); .*out\.csv is as it was/);
    expect(readFileSync(target, 'utf8')).toBe('old,result\n');
    expect(readdirSync(dir)).toEqual(['out.csv']);
    expect(existsSync(target)).toBe(true);
  });
});
