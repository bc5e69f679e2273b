/**
 * The tilting quadricycle demo (leaning rear pair) through the `tiltbench` command: validate,
 * pose (text and JSON) and check. The rear camber against the lean is the parallelogram's
 * (opposite sides stay parallel: Euclid; Norton, Design of Machinery, the parallelogram
 * four-bar): the rear uprights stay parallel to the frame, so camber to the ground = lean.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

const SPAWN_TIMEOUT_MS = 120_000;
const BIN = join(__dirname, '..', '..', 'bin', 'tiltbench.mjs');
const PLOVER = join(__dirname, '..', '..', 'assets', 'designs', 'plover-tilting-quad.tiltsheet');

function run(args: string[]) {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: 90_000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe('tiltbench on the tilting quadricycle demo', () => {
  it('validate: valid, exit 0', () => {
    const r = run(['validate', PLOVER]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('valid');
  }, SPAWN_TIMEOUT_MS);

  it('pose --json: rear tyres on the ground, rear camber = lean, toe 0, a four-wheel turn centre with slips', () => {
    const r = run(['pose', PLOVER, '--lean', '20', '--steer', '25', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.status).toBe('converged');
    expect(j.residualMm).toBeLessThan(1e-9);
    const rear = j.analysis.rear;
    expect(Math.abs(rear.right.camberDeg - 20)).toBeLessThan(1e-9);
    expect(Math.abs(rear.left.camberDeg + 20)).toBeLessThan(1e-9);
    for (const side of ['left', 'right']) {
      expect(Math.abs(rear[side].toeDeg)).toBeLessThan(1e-9);
      expect(Math.abs(rear[side].contactPatchMm.z)).toBeLessThan(1e-9);
    }
    // the rear points are in the pose's hardpoint list
    expect(j.points['vehicle.rear.wheelCentre.left']).toBeDefined();
    const t = rear.turnCentre;
    expect(t.centreMm.y).toBeGreaterThan(0); // a left turn turns about a point on the left
    expect(Object.keys(t.slipDeg).sort()).toEqual(['frontLeftDeg', 'frontRightDeg', 'rearLeftDeg', 'rearRightDeg']);
    expect(r.out).toContain('design aid');
  }, SPAWN_TIMEOUT_MS);

  it('pose (text): the rear pair and the four-wheel turn centre in words, no "-0" in the rear section', () => {
    const r = run(['pose', PLOVER, '--lean', '-20', '--steer', '0']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('leaning rear pair');
    expect(r.out).toMatch(/camber to ground \(deg, top out \+\)\s+20\.000\s+-20\.000/);
    expect(r.out).toMatch(/four-wheel turn centre: - \(straight ahead/);
    const rearSection = r.out.slice(r.out.indexOf('leaning rear pair'), r.out.indexOf('four-wheel turn centre'));
    expect(rearSection).toContain('contact patch');
    expect(rearSection).not.toMatch(/-0\.0+(?![0-9])/);
  }, SPAWN_TIMEOUT_MS);

  it('check: exit 0 (the operating region passes), the caution printed', () => {
    const r = run(['check', PLOVER]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('RESULT (operating region): PASS');
    expect(r.out).toContain('design aid');
  }, SPAWN_TIMEOUT_MS);
});
