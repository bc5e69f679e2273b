/**
 * On a lean-linkage design with the tyres on the ground the check's travel axis is the spring's
 * travel (the heave input drives the carrier), not wheel travel: it is named "spring travel"
 * wherever a travel value is printed (check text and JSON, the envelope map's subtitle, the
 * report's limits sheet), and plain "travel" stays on other designs.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { computeMap } from '../../core/report/chartSweeps';
import { heatMapOption } from '../../core/report/charts/heatMapOptions';
import type { DesignFile } from '../../core/design/types';

const SPAWN_TIMEOUT_MS = 60_000;
const BIN = join(__dirname, '..', '..', 'bin', 'tiltbench.mjs');
const DESIGNS = join(__dirname, '..', '..', 'assets', 'designs');
const PIPIT = join(DESIGNS, 'pipit-balance-beam-trike.tiltsheet');
const HERON = join(DESIGNS, 'heron-tilting-velomobile.tiltsheet');

function run(args: string[]) {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', timeout: SPAWN_TIMEOUT_MS });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

describe('travel axis of the check on a lean linkage', () => {
  it('the Pipit check names its travel as spring travel, and its values are spring travel, not wheel travel', () => {
    const j = JSON.parse(run(['check', PIPIT, '--json']).out) as {
      travelAxis: { kind: string; name: string; note: string | null };
      axes: { travelMm: number[] };
      info: string[];
    };
    expect(j.travelAxis.kind).toBe('spring');
    expect(j.travelAxis.name).toBe('spring travel');
    expect(j.info.join('\n')).toContain('spring travel (compression +');

    // The axis's largest value, set as a pose the way the sweep sets it (heave = -travel), is
    // that much spring compression (core's lean-linkage measure) and about twice as much
    // travel at the wheel centres: printing it as wheel travel would be wrong.
    const t = Math.max(...j.axes.travelMm);
    expect(t).toBeGreaterThan(0);
    const p = JSON.parse(run(['pose', PIPIT, '--heave', String(-t), '--json']).out) as {
      leanLinkage: { springTravelMm: number };
      analysis: { wheels: { left: { travelMm: number } } };
    };
    expect(p.leanLinkage.springTravelMm).toBeCloseTo(t, 6);
    expect(p.analysis.wheels.left.travelMm).toBeGreaterThan(1.5 * t);

    const text = run(['check', PIPIT]).out;
    expect(text).toContain('x spring travel (compression +) ');
    expect(text).toContain('where (lean, handlebar, spring travel)');
    expect(text).not.toContain('where (lean, handlebar, travel)');
    const firsts = text.match(/first exceeded at [-\d., ]+[^;\n]*/g) ?? [];
    expect(firsts.length).toBeGreaterThan(0); // the full rectangle has items over
    for (const f of firsts) expect(f).toContain('(lean, handlebar, spring travel)');
  }, SPAWN_TIMEOUT_MS * 3);

  it('the Heron (no lean linkage) keeps wheel travel and its plain words', () => {
    const j = JSON.parse(run(['check', HERON, '--json', '--travel-step', '35', '--lean-step', '5', '--steer-step', '5']).out) as {
      travelAxis: { kind: string; name: string; note: string | null };
    };
    expect(j.travelAxis).toEqual({ kind: 'wheel', name: 'travel', note: null });
    const text = run(['check', HERON, '--travel-step', '35', '--lean-step', '5', '--steer-step', '5']).out;
    expect(text).toContain('where (lean, handlebar, travel)');
    expect(text).not.toContain('spring travel');
  }, SPAWN_TIMEOUT_MS * 2);

  it("the envelope map's subtitle says spring travel on the Pipit and travel on the Heron", () => {
    const title = (file: string) => {
      const design = JSON.parse(readFileSync(file, 'utf8')) as DesignFile;
      const map = computeMap({ design, angleStepDeg: 12.5, travelMm: 0 });
      const opt = heatMapOption(map, 'status') as { title: { subtext: string }[] };
      return opt.title[0].subtext;
    };
    expect(title(PIPIT)).toContain('spring travel 0 mm');
    const heron = title(HERON);
    expect(heron).toContain('travel 0 mm');
    expect(heron).not.toContain('spring');
  }, SPAWN_TIMEOUT_MS);
});
