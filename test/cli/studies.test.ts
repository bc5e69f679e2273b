// The study commands: sensitivity and tolerance. Text in words (no identifiers), JSON, the
// caution, progress on a terminal only, exit codes 0 / 1 / 2 as the help texts state.
import { describe, it, expect } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../core/cli/main';
import type { CliIo } from '../../core/cli/io';
import { SAFETY_CAUTION } from '../../core/cli/io';

const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');
const SWIFT = join(DESIGNS, 'swift-parallelogram-trike.tiltsheet');
const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');

async function run(argv: string[], isTty = false) {
  const io = { out: '', err: '' };
  const cli: CliIo = { isTty, out: (t) => (io.out += t), err: (t) => (io.err += t) };
  const code = await main(argv, cli);
  return { code, out: io.out, err: io.err };
}

/** camelCase tokens (program identifiers) in a text meant for a person. */
const identifiers = (text: string) => [...text.matchAll(/\b[a-z]+[A-Z][A-Za-z0-9]*\b/g)].map((m) => m[0]);

describe('tiltbench sensitivity', () => {
  const TWO_POSES = ['--poses', '20,-5;-10,5'];

  it('prints the ranked rates in words with the caution; progress only on a terminal', async () => {
    const r = await run(['sensitivity', HERON, ...TWO_POSES, '--top', '3']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/central differences of the full solve: each coordinate moved \+-0\.5 mm/);
    expect(r.out).toMatch(/poses: 2 given/);
    expect(r.out).toMatch(/^ {3}1\. move the .+ 1 mm (up|forward|outward|to the left): worst self-steer/m);
    expect(r.out).toMatch(/spring arm mounts \(both sides\) +up +0\.0000 deg/);
    expect(r.out).toContain(SAFETY_CAUTION);
    expect(identifiers(r.out)).toEqual([]);
    expect(r.err).toBe('');
    const tty = await run(['sensitivity', HERON, '--poses', '20,-5', '--each-side', '--step', '1'], true);
    expect(tty.code).toBe(0);
    expect(tty.err).toMatch(/sensitivity \[#+\.*\] +\d+% \d+\/\d+ designs/);
    expect(tty.out).toMatch(/each side of a pair moves alone/);
    expect(tty.out).toMatch(/right upright steering arm joint/);
  }, 60_000);

  it('writes JSON with every rate per pose, the step and the caution', async () => {
    const r = await run(['sensitivity', HERON, ...TWO_POSES, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.tiltbench).toBe('sensitivity');
    expect(j.design).toBe(HERON);
    expect(j.stepMm).toBe(0.5);
    expect(j.halfStepMm).toBe(0.25);
    expect(j.caution).toBe(SAFETY_CAUTION);
    expect(j.poses).toHaveLength(2);
    const c = j.coordinates.find((x: { coordinate: { id: string } }) => x.coordinate.id === 'upright.steeringArmJoint:z');
    expect(c.perPose).toHaveLength(2);
    expect(c.perPose[0]).toHaveLength(j.quantities.length);
    expect(typeof c.objectives.selfSteer.perMm).toBe('number');
    for (const q of j.quantities) expect(identifiers(q.label)).toEqual([]);
  }, 60_000);

  it('exit 1 when a moved copy cannot be assembled at a study pose, and says so', async () => {
    // The kingpin parallelogram closes only while its members stay parallel: moving an outer
    // joint 0.5 mm leaves its upper joint a fraction of a micrometre from closing when leaned.
    const r = await run(['sensitivity', SWIFT, '--poses', '-35,15']);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/moved copies could not be assembled at every pose/);
    expect(identifiers(r.out)).toEqual([]);
  }, 60_000);

  it('exit 2 for bad input, naming the option', async () => {
    const cases: [string[], RegExp][] = [
      [['sensitivity', HERON, '--step', '0'], /--step: expected more than 0 and at most 5 mm/],
      [['sensitivity', HERON, '--step', '6'], /--step/],
      [['sensitivity', HERON, '--poses', '20'], /--poses, pose 1 "20"/],
      [['sensitivity', HERON, '--poses', '1,2;x,3'], /pose 2 "x,3"/],
      [['sensitivity', HERON, '--top', '2.5'], /--top: expected a whole number/],
      [['sensitivity', WREN, '--poses', '10,0'], /does not tilt/],
      [['sensitivity', join(DESIGNS, 'no-such.tiltsheet')], /no such file/],
      [['sensitivity'], /expected one design file/],
    ];
    for (const [argv, message] of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err, argv.join(' ')).toMatch(message);
    }
  }, 60_000);
});

describe('tiltbench tolerance', () => {
  it('prints the spread in words with the seed, distribution and caution; exit 0 when at least 95 % are within', async () => {
    const r = await run(['tolerance', WREN, '--samples', '30', '--band', '0.1', '--poses', '0,2;0,-2']);
    expect(r.code, r.out + r.err).toBe(0);
    expect(r.out).toMatch(/Monte Carlo with the full solve/);
    expect(r.out).toMatch(/band \+-0\.1 mm \(\d+ coordinates\), normal, the band being 3 standard deviations/);
    expect(r.out).toMatch(/seed 1\b/);
    expect(r.out).toMatch(/samples: 30 asked, 30 done, 30 measured, 0 could not be assembled/);
    expect(r.out).toMatch(/histogram of worst slip angle \(toe mismatch\) over the poses/);
    expect(r.out).toMatch(/what drives the spread/);
    expect(r.out).toMatch(/^at each pose:/m);
    expect(r.out).toContain(SAFETY_CAUTION);
    expect(identifiers(r.out)).toEqual([]);
    expect(r.err).toBe('');
  }, 60_000);

  it('exit 1 when fewer than 95 % of the samples keep every tolerance; the same seed gives the same JSON', async () => {
    const argv = ['tolerance', HERON, '--samples', '2000', '--seed', '77', '--method', 'first-order', '--poses', '20,-5;-10,5', '--json'];
    const a = await run(argv);
    const b = await run(argv);
    expect(a.code).toBe(1); // the Heron's slip is far outside its tolerance at lean 20 deg
    const ja = JSON.parse(a.out);
    const jb = JSON.parse(b.out);
    expect({ ...ja, elapsedMs: null }).toEqual({ ...jb, elapsedMs: null });
    expect(ja.seed).toBe(77);
    expect(ja.withinAll).toBeLessThan(0.95);
    expect(ja.caution).toBe(SAFETY_CAUTION);
    const slip = ja.overPoses.find((s: { id: string }) => s.id === 'slip');
    expect(slip.summary.histogram.counts.reduce((x: number, y: number) => x + y, 0)).toBe(2000);
    expect(slip.drivers[0].point).toMatch(/^(left|right) /);
  }, 60_000);

  it('exit 1 and says so when samples cannot be assembled; progress on a terminal', async () => {
    const r = await run(['tolerance', SWIFT, '--samples', '3', '--band', '0.3', '--poses', '-35,15'], true);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/samples that could not be assembled \(first few\):\n {2}sample \d+: /);
    expect(r.err).toMatch(/tolerance \[#+\.*\] +\d+% \d+\/\d+ steps/);
    expect(identifiers(r.out)).toEqual([]);
  }, 60_000);

  it('exit 2 for bad input, naming the option and the limit', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-tol-'));
    const unknown = join(dir, 'unknown.json');
    writeFileSync(unknown, JSON.stringify({ 'upright.nose': 0.2 }));
    const broken = join(dir, 'broken.json');
    writeFileSync(broken, '{ "upright.wheelCentre": ');
    const cases: [string[], RegExp][] = [
      [['tolerance', HERON, '--samples', 'many'], /--samples: expected a whole number of samples from 1 to 20000, found "many"/],
      [['tolerance', HERON, '--samples', '20001'], /from 1 to 20000/],
      [['tolerance', HERON, '--samples', '0', '--method', 'first-order'], /from 1 to 1000000/],
      [['tolerance', HERON, '--samples', '10', '--seed', '-1'], /--seed/],
      [['tolerance', HERON, '--samples', '10', '--band', '6'], /--band: expected more than 0 and at most 5 mm/],
      [['tolerance', HERON, '--samples', '10', '--distribution', 'cauchy'], /expected normal or uniform, found "cauchy"/],
      [['tolerance', HERON, '--samples', '10', '--method', 'guess'], /expected monte-carlo or first-order/],
      [['tolerance', HERON, '--samples', '10', '--bands', join(dir, 'none.json')], /cannot read.*no such file/],
      [['tolerance', HERON, '--samples', '10', '--bands', broken], /is not JSON/],
      [['tolerance', HERON, '--samples', '10', '--bands', unknown], /"upright\.nose" is not a hardpoint of this design/],
    ];
    for (const [argv, message] of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err, argv.join(' ')).toMatch(message);
    }
  }, 60_000);
});
