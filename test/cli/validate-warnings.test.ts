/**
 * `tiltbench validate` in process (runValidate with a captured io): warnings exit 0 with a
 * labelled line, and argument mistakes exit 2 with the usage instead of an internal error.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runValidate } from '../../core/cli/commands/validate';

const DEMO = join(__dirname, '..', '..', 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet');

async function validate(argv: string[]) {
  let out = '';
  let err = '';
  const code = await runValidate(argv, { out: (t) => (out += t), err: (t) => (err += t), isTty: false });
  return { code, out, err };
}

function designWithCentreZ(dz: number): string {
  const doc = JSON.parse(readFileSync(DEMO, 'utf8'));
  doc.upright.wheelCentre.z += dz;
  const file = join(mkdtempSync(join(tmpdir(), 'tb-validate-')), 'low.tiltsheet');
  writeFileSync(file, JSON.stringify(doc, null, 2));
  return file;
}

describe('tiltbench validate: warnings', () => {
  it('a wheel centre 5 mm below its tyre height: exit 0, one labelled warning naming the file, the field and what the pose does', async () => {
    const file = designWithCentreZ(-5);
    const r = await validate([file]);
    expect(r.code).toBe(0);
    expect(r.out).toBe(`${file}: valid (${JSON.parse(readFileSync(file, 'utf8')).name})\n`);
    const lines = r.err.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0].startsWith(`warning: ${file}: upright.wheelCentre.z: the wheel centre is 5 mm below`)).toBe(true);
    expect(lines[0]).toContain('the wheel sits 5 mm higher against the frame');
  });

  it('the demo as shipped: no warning (negative control)', async () => {
    const r = await validate([DEMO]);
    expect(r).toMatchObject({ code: 0, err: '' });
  });
});

describe('tiltbench validate: arguments', () => {
  it('an unknown option exits 2 naming it, with the usage', async () => {
    const r = await validate([DEMO, '--strict']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('tiltbench validate: unknown option --strict');
    expect(r.err).toContain('usage:');
  });

  it('no file or two files exit 2 saying how many were given', async () => {
    expect((await validate([])).err).toContain('expected one design file, found 0');
    const two = await validate([DEMO, DEMO]);
    expect(two.code).toBe(2);
    expect(two.err).toContain('expected one design file, found 2');
  });
});
