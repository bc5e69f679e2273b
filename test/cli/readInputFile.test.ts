/**
 * Issue 14, item 3: the reader of every CLI input file stops at its byte cap whatever size the
 * file reports, and refuses by size before reading when the size is known.
 */
import { statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readInputFile } from '../../core/cli/readInputFile';
import { tempDir } from './cliHarness';

describe('the byte cap holds whatever size a file reports', () => {
  it('a /proc file reports 0 bytes yet holds more: the read stops at the cap', () => {
    expect(statSync('/proc/self/status').size).toBe(0); // the premise: the size says nothing
    const capped = readInputFile('/proc/self/status', 64, 'status');
    expect(capped).toEqual({ ok: false, message: '/proc/self/status: the file holds more than 64 bytes; a status is at most 64 bytes' });
    const whole = readInputFile('/proc/self/status', 1 << 20, 'status');
    expect(whole.ok && whole.text.startsWith('Name:')).toBe(true);
  });

  it('a file of exactly the cap is read; one byte more is refused by its size', () => {
    const dir = tempDir();
    const path = join(dir, 'f.json');
    writeFileSync(path, 'x'.repeat(100));
    expect(readInputFile(path, 100, 'file')).toEqual({ ok: true, text: 'x'.repeat(100) });
    expect(readInputFile(path, 99, 'file')).toEqual({ ok: false, message: `${path}: the file is 100 bytes; a file is at most 99 bytes` });
  });
});
