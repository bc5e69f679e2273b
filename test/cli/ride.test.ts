// The ride input on the command line: `pose --speed` and `sweep --speed` find the lean at
// which the turn balances, tan(lean) = v^2 / (g R), g = 9.80665 m/s^2 (standard gravity,
// ISO 80000-3; the balance of a leaning vehicle in a steady turn: V. Cossalter, Motorcycle
// Dynamics, 2nd ed., 2006, from memory).
import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { main } from '../../core/cli/main';
import type { CliIo } from '../../core/cli/io';

const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');
const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');

async function run(argv: string[]) {
  const io: CliIo & { out_: string; err_: string } = {
    out_: '',
    err_: '',
    isTty: false,
    out(t: string) {
      io.out_ += t;
    },
    err(t: string) {
      io.err_ += t;
    },
  };
  const code = await main(argv, io);
  return { code, out: io.out_, err: io.err_ };
}

describe('the ride input on the command line', () => {
  it('pose --speed reports the balanced lean of the closed form, the residual and the lateral g', async () => {
    const r = await run(['pose', HERON, '--speed', '18', '--steer', '5', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const R = j.analysis.slip.turnRadiusMm / 1000;
    const v = 18 / 3.6;
    const lean = -Math.atan((v * v) / (9.80665 * R)) * (180 / Math.PI); // a left turn leans left
    expect(j.ride.leanDeg).toBeCloseTo(lean, 5);
    expect(j.inputs.leanDeg).toBe(j.ride.leanDeg);
    expect(Math.abs(j.ride.balanceResidualDeg)).toBeLessThan(1e-5);
    expect(j.ride.lateralG).toBeCloseTo((v * v) / (9.80665 * R), 6);
    const text = await run(['pose', HERON, '--speed', '18', '--steer', '5']);
    expect(text.out).toMatch(/ride: 18 km\/h, lean -?\d+\.\d+ deg \(right side down \+; balanced\)/);
  });

  it('sweep --speed writes the same balanced poses row by row, and refuses a lean beside a speed', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'tb-ride-')), 'ride.json');
    const r = await run(['sweep', HERON, '--speed', '10:20:10', '--steer', '-4:4:4', '--out', file]);
    expect(r.code).toBe(0);
    const j = JSON.parse(readFileSync(file, 'utf8'));
    const col = (name: string) => j.columns.findIndex((c: { name: string }) => c.name === name);
    expect(j.rows.length).toBe(6);
    const row = j.rows.find((x: number[]) => x[col('speedKmh')] === 20 && x[col('handlebarDeg')] === 4);
    const single = JSON.parse((await run(['pose', HERON, '--speed', '20', '--steer', '4', '--json'])).out);
    expect(row[col('leanDeg')]).toBeCloseTo(single.ride.leanDeg, 4);
    expect(row[col('left.steerDeg')]).toBeCloseTo(single.analysis.wheels.left.steerDeg, 4);
    expect((await run(['sweep', HERON, '--speed', '10:20:10', '--lean', '0:5:5', '--steer', '0:1:1', '--out', file])).code).toBe(2);
    expect((await run(['pose', HERON, '--speed', '10', '--lean', '5'])).code).toBe(2);
    expect((await run(['pose', HERON, '--speed', '-3'])).code).toBe(2);
  });

  it('a design that does not lean rides upright and still reports the lateral g', async () => {
    const j = JSON.parse((await run(['pose', WREN, '--speed', '15', '--steer', '10', '--json'])).out);
    expect(j.ride.leanDeg).toBe(0);
    expect(j.ride.lateralG).toBeGreaterThan(0);
    expect(j.ride.notes.join(' ')).toMatch(/does not lean/);
  });
});
