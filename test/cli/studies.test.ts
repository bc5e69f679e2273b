// The study commands: sensitivity and tolerance. Text in words (no identifiers), JSON, the
// caution, progress on a terminal only, exit codes 0 / 1 / 2 as the help texts state.
import { describe, it, expect } from 'vitest';
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
