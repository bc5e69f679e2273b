/**
 * tiltbench on the balance-beam lean linkage demo (Pipit): validate, pose (text and JSON, with
 * the lean-linkage measures), the tilt-lock mode (--lean-by rocker --rocker DEG) and check run
 * and end with their documented exit codes; bad requests are refused naming the option.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { SAFETY_CAUTION } from '../../core/cli/io';

const SPAWN_TIMEOUT_MS = 60_000;
const BIN = join(__dirname, '..', '..', 'bin', 'tiltbench.mjs');
const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const PIPIT = join(DESIGNS, 'pipit-balance-beam-trike.tiltsheet');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');

function run(args: string[]) {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: SPAWN_TIMEOUT_MS });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe('tiltbench on a lean linkage', () => {
  it('pose --json reports the lean-linkage measures, finite or null with a reason', () => {
    const r = run(['pose', PIPIT, '--lean', '10', '--steer', '5', '--json']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).not.toMatch(/NaN|Infinity/);
    const j = JSON.parse(r.out);
    const l = j.leanLinkage;
    expect(l.springLengthMm).toBeCloseTo(200, 9);
    expect(l.rockerDeg).toBeLessThan(-5);
    expect(l.stopMarginDeg).toBeCloseTo(l.stopDeg - Math.abs(l.rockerDeg), 12);
    expect(l.motionRatio).toBeGreaterThan(0.3);
    expect(Math.abs(l.springPerLeanMmPerDeg)).toBeLessThan(1e-9);
    expect(l.rollAxis.heightAtAxleMm).toEqual(expect.any(Number));
    expect(l.rollAxis.groundPointXMm === null ? l.rollAxis.groundPointReason : 'number').toBeTruthy();
    expect(l.actuatorLengthMm).toEqual(expect.any(Number));
    expect(j.definitions.rollAxis).toMatch(/screw axis/);
    expect(j.caution).toBe(SAFETY_CAUTION);
  }, SPAWN_TIMEOUT_MS);

  it('pose text names the lean linkage lines and the caution', () => {
    const r = run(['pose', PIPIT, '--lean', '20']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('lean linkage (balance beam');
    expect(r.out).toMatch(/stop margin \d+\.\d{3} deg/);
    expect(r.out).toContain('frame roll axis: height');
    expect(r.out).toContain(SAFETY_CAUTION);
  }, SPAWN_TIMEOUT_MS);

  it('--lean-by rocker drives the rocker and reports the solved lean', () => {
    const r = run(['pose', PIPIT, '--lean-by', 'rocker', '--rocker', '10', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.leanLinkage.rockerDeg).toBeCloseTo(10, 9);
    expect(j.inputs.leanDeg).toBeCloseTo(j.leanLinkage.leanDeg, 9);
    expect(j.inputs.leanDeg).toBeLessThan(-5);
  }, SPAWN_TIMEOUT_MS);

  it('refuses the tilt lock on a design without a lean linkage, an unknown --lean-by and --rocker alone (exit 2)', () => {
    const a = run(['pose', HERON, '--lean-by', 'rocker', '--rocker', '5']);
    expect(a.code).toBe(2);
    expect(a.err).toContain('lean linkage (leanLinkage)');
    const b = run(['pose', PIPIT, '--lean-by', 'sideways']);
    expect(b.code).toBe(2);
    expect(b.err).toContain('option --lean-by: expected rocker or frame, found "sideways"');
    const c = run(['pose', PIPIT, '--rocker', '5']);
    expect(c.code).toBe(2);
    expect(c.err).toContain('--rocker needs --lean-by rocker');
  }, SPAWN_TIMEOUT_MS);

  it('check runs over the envelope and ends with a verdict exit code (the Pipit passes in its operating region, as its notes say)', () => {
    const r = run(['check', PIPIT]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('operating region');
    expect(r.out).toContain(SAFETY_CAUTION);
    // The JSON's verdicts agree with the exit code, item by item: every operating-region item
    // within or close, the self-steer and slip worsts inside their tolerances (0.25 and 1 deg).
    const j = JSON.parse(run(['check', PIPIT, '--json']).out) as {
      passed: boolean;
      operating: { passed: boolean; items: { id: string; worst: number | null; verdict: string }[] };
    };
    expect(j.passed).toBe(true);
    expect(j.operating.items.length).toBeGreaterThan(30);
    for (const it of j.operating.items) expect(['within', 'close'], it.id).toContain(it.verdict);
    const worst = (id: string) => Math.abs(j.operating.items.find((it) => it.id === id)?.worst ?? NaN);
    expect(worst('selfSteer.left')).toBeLessThanOrEqual(0.25);
    expect(worst('selfSteer.right')).toBeLessThanOrEqual(0.25);
  }, SPAWN_TIMEOUT_MS * 2);
});

describe('tiltbench pose on a lean linkage off the ground', () => {
  it('says why there are no lean-linkage measures with the wheel travel set', () => {
    const r = run(['pose', PIPIT, '--travel', '10', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.leanLinkage).toBeUndefined();
    expect(j.leanLinkageReason).toMatch(/tyres on the ground/);
  }, SPAWN_TIMEOUT_MS);
});
