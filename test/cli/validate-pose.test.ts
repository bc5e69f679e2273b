import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';

// Each test spawns the CLI (tsx start-up included), which is slow on a loaded machine.
const SPAWN_TIMEOUT_MS = 60_000;
const BIN = join(__dirname, '..', '..', 'bin', 'tiltbench.mjs');
const DEMO = join(__dirname, '..', '..', 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet');

function run(args: string[]) {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: 60000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe('tiltbench validate', () => {
  it('accepts every bundled demo with exit 0', () => {
    for (const f of ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike', 'linnet-track-rod-trike', 'finch-knuckle-steered-trike', 'plover-tilting-quad', 'pipit-balance-beam-trike']) {
      const r = run(['validate', join(__dirname, '..', '..', 'assets', 'designs', `${f}.tiltsheet`)]);
      expect(r.code, r.err).toBe(0);
      expect(r.out).toContain('valid');
    }
  }, SPAWN_TIMEOUT_MS);

  it('rejects a bad field with exit 2 and names the file, field path, unit and value', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-cli-'));
    const doc = JSON.parse(readFileSync(DEMO, 'utf8'));
    doc.frontEnd.lower.outerJoint.z = 'twelve';
    const file = join(dir, 'broken.tiltsheet');
    writeFileSync(file, JSON.stringify(doc));
    const r = run(['validate', file]);
    expect(r.code).toBe(2);
    expect(r.err).toContain('broken.tiltsheet');
    expect(r.err).toContain('frontEnd.lower.outerJoint.z');
    expect(r.err).toContain('mm');
    expect(r.err).toContain('twelve');
  }, SPAWN_TIMEOUT_MS);

  it('reports a missing file and a JSON syntax error with line and column', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-cli-'));
    expect(run(['validate', join(dir, 'nope.tiltsheet')]).code).toBe(2);
    const file = join(dir, 'syntax.tiltsheet');
    writeFileSync(file, '{\n  "tiltsheet": 1,\n  "name": "x",,\n}');
    const r = run(['validate', file]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/syntax\.tiltsheet:3:15: invalid JSON/); // file:line:column
  }, SPAWN_TIMEOUT_MS);
});

describe('tiltbench pose', () => {
  it('solves the bundled demo without a design argument and prints the documented JSON', () => {
    const r = run(['pose', '--lean', '10', '--steer', '5', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.status).toBe('converged');
    expect(j.residualMm).toBeLessThan(1e-9);
    for (const side of ['left', 'right']) {
      expect(Number.isFinite(j.wheels[side].toeDeg)).toBe(true);
      expect(Number.isFinite(j.wheels[side].camberDeg)).toBe(true);
    }
    expect(Object.keys(j.points).length).toBeGreaterThan(10);
    // Ground contact is the default: the lowest tyre points sit on z = 0.
    expect(Math.abs(j.wheels.left.contactPointMm.z)).toBeLessThan(1e-6);
    expect(Math.abs(j.wheels.right.contactPointMm.z)).toBeLessThan(1e-6);
  }, SPAWN_TIMEOUT_MS);

  it('positive handlebar turns both wheels left (ISO 8855 yaw), and the text output carries the caution', () => {
    const j = JSON.parse(run(['pose', DEMO, '--steer', '10', '--json']).out);
    expect(j.wheels.left.steerDeg).toBeGreaterThan(1);
    expect(j.wheels.right.steerDeg).toBeGreaterThan(1);
    const t = run(['pose', DEMO, '--steer', '10']);
    expect(t.out).toContain('CAUTION');
    expect(t.out).toContain('left wheel centre'); // hardpoints by their labels, not their ids
  }, SPAWN_TIMEOUT_MS);

  it('holds travel relative to the frame with --travel', () => {
    const j = JSON.parse(run(['pose', DEMO, '--travel', '20', '--json']).out);
    expect(j.mode.contact).toBe('travel');
    // wheel centre design z 245 + 20 mm at zero lean
    expect(j.wheels.left.centreMm.z).toBeCloseTo(265, 6);
  }, SPAWN_TIMEOUT_MS);

  it('exits 1 with the culprit named when the linkage cannot be assembled', () => {
    const r = run(['pose', DEMO, '--travel', '400', '--json']);
    expect(r.code).toBe(1);
    const j = JSON.parse(r.out);
    expect(j.status).toBe('cannot-assemble');
    expect(j.culprit).toBeTruthy();
    expect(j.message).toContain(j.culprit);
  }, SPAWN_TIMEOUT_MS);

  it('exits 2 for bad options and names the option and unit', () => {
    const r = run(['pose', '--lean', 'abc']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--lean');
    expect(r.err).toContain('degrees');
    expect(run(['pose', '--bogus', '1']).code).toBe(2);
    expect(run(['pose', '--travel', '5', '--on-ground']).code).toBe(2);
  }, SPAWN_TIMEOUT_MS);
});
