import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { main } from '../../core/cli/main';
import type { CliIo } from '../../core/cli/io';
import { SAFETY_CAUTION } from '../../core/cli/io';

const ROOT = join(__dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'tiltbench.mjs');
const DESIGNS = join(ROOT, 'assets', 'designs');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');
const SWIFT = join(DESIGNS, 'swift-parallelogram-trike.tiltsheet');
const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');

function capture(isTty = false): CliIo & { stdout: string; stderr: string } {
  const io = {
    stdout: '',
    stderr: '',
    isTty,
    out(t: string) {
      io.stdout += t;
    },
    err(t: string) {
      io.stderr += t;
    },
  };
  return io;
}

async function run(argv: string[], isTty = false) {
  const io = capture(isTty);
  const code = await main(argv, io);
  return { code, out: io.stdout, err: io.stderr };
}

const tmp = () => mkdtempSync(join(tmpdir(), 'tb-sweep-'));

describe('tiltbench sweep', () => {
  it('writes one CSV row per pose in grid order with every measure, and prints a summary with the caution', async () => {
    const file = join(tmp(), 'out.csv');
    const r = await run(['sweep', HERON, '--lean', '-10:10:10', '--steer', '-20:20:10', '--travel', '0:20:20', '--out', file]);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/30 poses/);
    expect(r.out).toContain(SAFETY_CAUTION);
    expect(r.err).toBe(''); // no progress bar off a terminal
    const lines = readFileSync(file, 'utf8').trim().split('\n');
    expect(lines.length).toBe(1 + 3 * 5 * 2);
    const head = lines[0].split(',');
    for (const col of ['leanDeg', 'handlebarDeg', 'travelMm', 'status', 'left.toeDeg', 'right.camberDeg', 'left.trailMm', 'ackermann.percent', 'left.slipDeg', 'turningCircle.kerbToKerbMm', 'joint.tieRodInner.right.articulationDeg', 'rollCentre.zMm', 'frontLiftMm', 'notes']) {
      expect(head).toContain(col);
    }
    const rows = lines.slice(1).map((l) => l.split(','));
    const li = head.indexOf('leanDeg');
    const si = head.indexOf('handlebarDeg');
    const ti = head.indexOf('travelMm');
    // grid order: travel, then lean, then handlebar, ascending
    const keys = rows.map((r2) => [Number(r2[ti]), Number(r2[li]), Number(r2[si])]);
    const sorted = [...keys].sort((a, b) => a[0] - b[0] || a[1] - b[1] || a[2] - b[2]);
    expect(keys).toEqual(sorted);
    expect(lines.join('\n')).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('writes JSON with columns, rows, definitions and the caution; failed poses keep their status and no numbers (exit 1)', async () => {
    const file = join(tmp(), 'out.json');
    const r = await run(['sweep', HERON, '--steer', '0:10:10', '--travel', '0:400:400', '--contact', 'travel', '--out', file]);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/2 poses could not be assembled/);
    const j = JSON.parse(readFileSync(file, 'utf8'));
    expect(j.caution).toBe(SAFETY_CAUTION);
    expect(j.definitions.ackermann).toMatch(/adopted/);
    expect(j.rows.length).toBe(4);
    const col = (name: string) => j.columns.findIndex((c: { name: string }) => c.name === name);
    const failed = j.rows.filter((row: unknown[]) => row[col('status')] === 'broken');
    expect(failed.length).toBe(2);
    for (const row of failed) {
      expect(row[col('left.toeDeg')]).toBeNull();
      expect(row[col('notes')]).toBeTruthy();
    }
    expect(j.summary.failed).toBe(2);
  });

  it('draws a progress bar on a terminal', async () => {
    const file = join(tmp(), 'out.csv');
    const r = await run(['sweep', SWIFT, '--lean', '-10:10:5', '--steer', '-10:10:5', '--out', file], true);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/\[#+.*\] +100% 25\/25 poses/);
  });

  it('exits 2 for bad input, naming the problem', async () => {
    const file = join(tmp(), 'out.csv');
    expect((await run(['sweep', HERON, '--steer', '0:10', '--out', file])).err).toMatch(/--steer.*A:B:STEP/);
    expect((await run(['sweep', HERON, '--steer', '0:10:1'])).code).toBe(2);
    const ext = await run(['sweep', HERON, '--out', join(tmp(), 'out.txt')]);
    expect(ext.code).toBe(2);
    expect(ext.err).toMatch(/\.csv or \.json/);
    const lean = await run(['sweep', WREN, '--lean', '0:10:5', '--out', file]);
    expect(lean.code).toBe(2);
    expect(lean.err).toMatch(/does not tilt/);
    expect((await run(['sweep', SWIFT, '--travel', '0:10:5', '--out', file])).err).toMatch(/centre-pivot/);
    expect((await run(['sweep', join(tmp(), 'missing.tiltsheet'), '--out', file])).code).toBe(2);
    expect((await run(['sweep', HERON, '--contact', 'air', '--out', file])).code).toBe(2);
    expect((await run(['sweep', HERON, '--lean', '0:1:0.0001', '--steer', '0:1:0.0001', '--out', file])).err).toMatch(/at most/);
  });
});

describe('tiltbench check', () => {
  it('prints the table of every tolerance, joint and clearance with worst value and where; exit 1 on the Heron demo', async () => {
    const r = await run(['check', HERON, '--lean-step', '12.5', '--steer-step', '12.5', '--travel-step', '35']);
    expect(r.code).toBe(1);
    for (const text of [
      'self-steer (lean and bump steer)',
      'steering-ratio change',
      'slip angle (toe mismatch)',
      'tie rod, inner end, right',
      'clearance tyre to lower arm, left',
      'dead-centre',
      'cannot be assembled',
      '== operating region',
      '== full rectangle',
      'riding: 5..45 km/h',
      'RESULT (operating region): FAIL',
      'turning circle',
      'continuous minimax',
      'steering limits',
      'lean   0.0  left turn',
    ]) {
      expect(r.out).toContain(text);
    }
    expect(r.out).toContain(SAFETY_CAUTION);
    // Full lean with full lock the same way is a countersteer the vehicle never rides: it is
    // a worst case of the full rectangle, not of the operating region.
    const [operating, full] = r.out.split('== full rectangle');
    expect(full).toMatch(/-25\.0, -25\.0, |25\.0, 25\.0, /);
    expect(operating).not.toMatch(/-25\.0, -25\.0, |(?<!-)25\.0, 25\.0, /);
    const whole = await run(['check', HERON, '--region', 'full', '--lean-step', '12.5', '--steer-step', '12.5', '--travel-step', '35']);
    expect(whole.out).toContain('RESULT (full rectangle): FAIL');
    expect(whole.out.indexOf('== full rectangle')).toBeLessThan(whole.out.indexOf('== operating region'));
    expect((await run(['check', HERON, '--region', 'some'])).code).toBe(2);
  });

  it('exits 0 when everything passes, and --json carries the items', async () => {
    const doc = JSON.parse(readFileSync(HERON, 'utf8'));
    doc.envelope = { leanDeg: 5, handlebarDeg: 5, bumpMm: 5, reboundMm: 5 };
    doc.tolerances = { selfSteerDeg: 2, ratioChangePct: 50, slipDeg: 2, jointMarginDeg: 3, clearanceMm: 10 };
    const file = join(tmp(), 'easy.tiltsheet');
    writeFileSync(file, JSON.stringify(doc));
    const r = await run(['check', file, '--lean-step', '2.5', '--steer-step', '2.5', '--travel-step', '5']);
    expect(r.code, r.out).toBe(0);
    expect(r.out).toContain('RESULT (operating region): PASS');
    const j = await run(['check', file, '--lean-step', '5', '--steer-step', '5', '--travel-step', '5', '--json']);
    expect(j.code).toBe(0);
    const report = JSON.parse(j.out);
    expect(report.passed).toBe(true);
    expect(report.caution).toBe(SAFETY_CAUTION);
    expect(report.items.find((i: { id: string }) => i.id === 'slip.left').where).toBeTruthy();
  });

  it('exits 2 for bad input', async () => {
    expect((await run(['check'])).code).toBe(2);
    expect((await run(['check', HERON, '--lean-step', '0'])).code).toBe(2);
    expect((await run(['check', join(tmp(), 'nope.tiltsheet')])).code).toBe(2);
    const bad = join(tmp(), 'bad.tiltsheet');
    writeFileSync(bad, '{ "tiltsheet": 1 }');
    expect((await run(['check', bad])).code).toBe(2);
  });

  it('runs from the installed command (spawned), exit code and caution included', () => {
    const r = spawnSync(process.execPath, [BIN, 'check', HERON, '--lean-step', '12.5', '--steer-step', '12.5'], { encoding: 'utf8', timeout: 60000 });
    expect(r.status).toBe(1);
    expect(r.stdout).toContain('RESULT (operating region):');
    expect(r.stdout).toContain('CAUTION');
  });
});

describe('tiltbench pose gains every measure', () => {
  it('--json carries the analysis with definitions, keeping the earlier fields', async () => {
    const r = await run(['pose', HERON, '--lean', '10', '--steer', '5', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.wheels.left.toeDeg).toBeCloseTo(j.analysis.wheels.left.toeDeg, 12);
    for (const key of ['wheels', 'steering', 'ackermann', 'slip', 'turningCircle', 'joints', 'clearances', 'suspension', 'selfSteer', 'worst', 'status', 'checks']) {
      expect(j.analysis[key]).toBeDefined();
    }
    expect(j.analysis.steering.localRatio).not.toBeNull();
    expect(j.analysis.suspension.frontLiftMm).not.toBeNull();
    expect(j.analysis.selfSteer.leftDeg).not.toBeNull();
    expect(j.analysis.steering.ratioChangePct).not.toBeNull();
    expect(j.definitions.tieRodSpin).toMatch(/minimax/);
    expect(r.out).not.toMatch(/NaN/);
  });

  it('the text output shows the measures', async () => {
    const r = await run(['pose', HERON, '--steer', '15']);
    for (const text of ['caster', 'KPI', 'trail', 'scrub radius', 'Ackermann', 'turning circle', 'roll centre', 'tie rod, inner end', 'tyre to lower arm', 'self-steer', 'steering-ratio change', 'verdict:']) {
      expect(r.out).toContain(text);
    }
  });
});
