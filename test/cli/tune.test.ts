// The tune command: a plan with errors is refused naming its field (or line:column for JSON
// syntax); the output is never the design or the plan; a tuned or proposed design is written
// whole and reads back as a valid design; exit codes as the help text states.
import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync, existsSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runTuneCommand } from '../../core/cli/commands/tune';
import type { CliIo } from '../../core/cli/io';
import { SAFETY_CAUTION } from '../../core/cli/io';
import { parseDesignText } from '../../core/design/validateDesign';

const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const WREN = join(DESIGNS, 'wren-rack-trike.tiltsheet');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');

async function run(argv: string[]) {
  const io = { out: '', err: '' };
  const cli: CliIo = { isTty: false, out: (t) => (io.out += t), err: (t) => (io.err += t) };
  const code = await runTuneCommand(argv, cli);
  return { code, out: io.out, err: io.err };
}

const tmp = () => mkdtempSync(join(tmpdir(), 'tiltbench-tune-'));

const PLAN = {
  variables: [{ id: 'steering.tieRodJoint:z', rangeMm: [-10, 10] }],
  objectives: [{ measure: 'slip' }],
  poses: [
    { leanDeg: 0, handlebarDeg: 40, travelMm: 0 },
    { leanDeg: 0, handlebarDeg: -40, travelMm: 20 },
  ],
  starts: 1,
  maxIterations: 6,
};

describe('tiltbench tune', () => {
  it('tunes by a plan and writes a valid design with the caution and a before/after table', async () => {
    const dir = tmp();
    const plan = join(dir, 'plan.json');
    writeFileSync(plan, JSON.stringify(PLAN));
    const out = join(dir, 'tuned.tiltsheet');
    const r = await run([WREN, '--plan', plan, '--out', out]);
    expect([0, 1]).toContain(r.code);
    expect(r.out).toMatch(/objectives and constraints over the poses \(before -> after\)/);
    expect(r.out).toMatch(/worst slip angle \(toe mismatch\)/);
    expect(r.out).toContain(SAFETY_CAUTION);
    const parsed = parseDesignText(readFileSync(out, 'utf8'), out);
    expect(parsed.ok).toBe(true);
    // Nothing but the output is left in the folder (the temporary file was renamed).
    expect(readdirSync(dir).sort()).toEqual(['plan.json', 'tuned.tiltsheet']);
  }, 60_000);

  it('refuses a plan with errors, naming the field or the line and column, and writes nothing', async () => {
    const dir = tmp();
    const out = join(dir, 'tuned.tiltsheet');
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...PLAN, objectives: [{ measure: 'toe' }] }));
    const r = await run([WREN, '--plan', bad, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/objectives\[0\]\.measure: expected one of/);
    const syntax = join(dir, 'syntax.json');
    writeFileSync(syntax, '{\n  "variables": [,]\n}');
    const s = await run([WREN, '--plan', syntax, '--out', out]);
    expect(s.code).toBe(2);
    expect(s.err).toMatch(/syntax\.json:2:\d+: invalid JSON/);
    expect(existsSync(out)).toBe(false);
  });

  it('never writes over the design or the plan', async () => {
    const dir = tmp();
    const design = join(dir, 'd.tiltsheet');
    const text = readFileSync(WREN, 'utf8');
    writeFileSync(design, text);
    const plan = join(dir, 'plan.json');
    writeFileSync(plan, JSON.stringify(PLAN));
    expect((await run([design, '--plan', plan, '--out', design])).code).toBe(2);
    expect((await run([design, '--plan', plan, '--out', plan])).code).toBe(2);
    expect((await run([design, '--suggest', 'tie-rods', '--out', join(dir, '.', 'd.tiltsheet')])).code).toBe(2);
    expect(readFileSync(design, 'utf8')).toBe(text);
  });

  it('lists the variables a plan may name, and shows and writes the geometric proposals', async () => {
    const list = await run([HERON, '--list-variables']);
    expect(list.code).toBe(0);
    expect(list.out).toMatch(/steering\.tieRodJoint:z +bell crank tie rod joints \(both sides\), up/);
    expect(list.out).toMatch(/tieRod\.length\.left +tie-rod length, left, longer/);
    const dir = tmp();
    const out = join(dir, 'proposed.tiltsheet');
    const s = await run([HERON, '--suggest', 'tie-rods', '--out', out]);
    expect(s.code).toBe(0);
    expect(s.out).toMatch(/tie rods on the instant-centre lines/);
    expect(s.out).toMatch(/worst self-steer +\d+\.\d+ deg +\d+\.\d+ deg/);
    const parsed = parseDesignText(readFileSync(out, 'utf8'), out);
    expect(parsed.ok).toBe(true);
    if (parsed.ok) expect(parsed.design.notes).toMatch(/Proposal applied/);
  }, 60_000);

  it('bad arguments exit 2 with the usage', async () => {
    expect((await run([WREN])).code).toBe(2);
    expect((await run([WREN, '--plan', 'x.json'])).code).toBe(2);
    expect((await run([WREN, '--suggest', 'sideways', '--out', 'x.tiltsheet'])).code).toBe(2);
    expect((await run([WREN, '--plan', 'p.json', '--out', 'o.tiltsheet', '--jacobian', 'magic'])).err).toMatch(/--jacobian: expected secant or difference/);
  });
});
