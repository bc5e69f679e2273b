// `--hold suspension` on `tiltbench pose` and `tiltbench sweep`: steering only, with the
// wishbones or members held at design. The numbers themselves are checked against an outside
// construction in test/core/analysis/holdSuspension.test.ts; here: the option reaches the
// solver in both commands (the outer joints stay at design, both commands agree pose by pose),
// and what it cannot take is refused with exit 2 and a message naming the option.
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { main } from '../../core/cli/main';
import type { CliIo } from '../../core/cli/io';

const ROOT = join(__dirname, '..', '..');
const SWIFT = join(ROOT, 'assets', 'designs', 'swift-parallelogram-trike.tiltsheet');
const HERON = join(ROOT, 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet');

async function run(argv: string[]) {
  const io = {
    stdout: '',
    stderr: '',
    isTty: false,
    out(t: string) {
      io.stdout += t;
    },
    err(t: string) {
      io.stderr += t;
    },
  } satisfies CliIo & { stdout: string; stderr: string };
  const code = await main(argv, io);
  return { code, out: io.stdout, err: io.stderr };
}

type Xyz = { x: number; y: number; z: number };
const far = (a: Xyz, b: Xyz) => Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);

describe('tiltbench pose --hold suspension', () => {
  it('keeps the outer joints at design while the wheels steer, and says so', async () => {
    const design = JSON.parse(readFileSync(HERON, 'utf8'));
    const held = await run(['pose', HERON, '--steer', '18', '--hold', 'suspension', '--json']);
    expect(held.code, held.err).toBe(0);
    const j = JSON.parse(held.out);
    expect(j.mode.hold).toBe('suspension');
    const lower = design.frontEnd.lower.outerJoint; // right side, mirrored to the left
    expect(far(j.points['frontEnd.lower.outerJoint.right'], lower)).toBeLessThan(1e-8);
    expect(far(j.points['frontEnd.lower.outerJoint.left'], { ...lower, y: -lower.y })).toBeLessThan(1e-8);
    expect(Math.abs(j.wheels.left.steerDeg)).toBeGreaterThan(5);
    // Free on the ground the same steer moves the suspension: the joint leaves its design place.
    const free = JSON.parse((await run(['pose', HERON, '--steer', '18', '--json'])).out);
    expect(far(free.points['frontEnd.lower.outerJoint.right'], lower)).toBeGreaterThan(1e-3);
    const text = await run(['pose', HERON, '--steer', '18', '--hold', 'suspension']);
    expect(text.out).toContain('suspension held at its design position');
  });

  it('refuses lean, speed, travel, heave and ground contact with it, and any other hold (exit 2)', async () => {
    for (const extra of [['--lean', '5'], ['--speed', '20'], ['--travel', '10'], ['--travel-left', '5'], ['--heave', '3'], ['--on-ground']]) {
      const r = await run(['pose', SWIFT, '--steer', '10', '--hold', 'suspension', ...extra]);
      expect(r.code, extra.join(' ')).toBe(2);
      expect(r.err).toContain(`it takes no ${extra[0]}`);
    }
    const other = await run(['pose', SWIFT, '--steer', '10', '--hold', 'wheels']);
    expect(other.code).toBe(2);
    expect(other.err).toContain('option --hold: expected suspension, found "wheels"');
  });
});

describe('tiltbench sweep --hold suspension', () => {
  it('sweeps the handlebar with the suspension held: each row agrees with pose --hold suspension', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'tb-hold-')), 'held.json');
    const r = await run(['sweep', SWIFT, '--steer', '-20:20:10', '--hold', 'suspension', '--out', file]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('suspension held at its design position');
    const doc = JSON.parse(readFileSync(file, 'utf8'));
    expect(doc.hold).toBe('suspension');
    const col = (name: string) => doc.columns.findIndex((c: { name: string }) => c.name === name);
    const [hb, left, right] = [col('handlebarDeg'), col('left.steerDeg'), col('right.steerDeg')];
    expect(Math.min(hb, left, right)).toBeGreaterThanOrEqual(0);
    expect(doc.rows).toHaveLength(5);
    for (const row of doc.rows) {
      const pose = JSON.parse((await run(['pose', SWIFT, '--steer', String(row[hb]), '--hold', 'suspension', '--json'])).out);
      // The sweep rounds to 1e-6 in its file.
      expect(Math.abs(row[left] - pose.wheels.left.steerDeg), `handlebar ${row[hb]}`).toBeLessThan(1e-6);
      expect(Math.abs(row[right] - pose.wheels.right.steerDeg), `handlebar ${row[hb]}`).toBeLessThan(1e-6);
    }
  });

  it('refuses lean, travel and contact with it (exit 2)', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'tb-hold-')), 'x.csv');
    for (const extra of [['--lean', '0:10:5'], ['--travel', '-10:10:10'], ['--contact', 'ground']]) {
      const r = await run(['sweep', SWIFT, '--steer', '-10:10:10', '--hold', 'suspension', '--out', file, ...extra]);
      expect(r.code, extra.join(' ')).toBe(2);
      expect(r.err).toContain(`it takes no ${extra[0]}`);
    }
  });
});
