/**
 * Side-by-side speed of the whole envelope sweep with every measure (core/analysis/sweep.ts's
 * runSweep: solve, measure, the measures that need neighbouring poses, the verdicts) in two
 * copies of core/, in one process, timed turn about:
 *
 *   npx tsx test/bench/compareEnvelope.ts BEFORE_CORE_DIR [AFTER_CORE_DIR]
 *
 * AFTER defaults to this checkout's core/. Each copy reads and resolves the demo file with its
 * own design module (a copy from before a format change still reads the demos), sweeps the
 * same grid (lean x handlebar x travel over the envelope), and every timed pass starts from a
 * collected heap; the order alternates A B, B A so a drift in the machine's speed lands on
 * both. Prints each pass's ratio and the median (after / before: below 1 is faster).
 */

import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { collectGarbage, median, startClock } from './measure';

interface Axes {
  leanDeg: number[];
  handlebarDeg: number[];
  travelMm: number[];
}
type RunSweep = (design: unknown, axes: Axes, options: object, onCell: (c: unknown) => void) => { poses: number; solved: number };

interface Copy {
  label: string;
  runSweep: RunSweep;
  designs: Record<string, unknown>;
}

const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike'];
const PASSES = Number(process.env.COMPARE_PASSES ?? 6);

async function load(label: string, dir: string): Promise<Copy> {
  const at = (p: string) => pathToFileURL(resolve(dir, p)).href;
  const sweep = (await import(at('analysis/sweep.ts'))) as { runSweep: RunSweep };
  const validate = (await import(at('design/validateDesign.ts'))) as { parseDesignText(t: string, f: string): { ok: boolean; design?: unknown } };
  const res = (await import(at('design/resolveDesign.ts'))) as { resolveDesign(d: unknown): unknown };
  const designs: Record<string, unknown> = {};
  const root = fileURLToPath(new URL('../../assets/designs/', import.meta.url));
  for (const name of DEMOS) {
    const file = `${root}${name}.tiltsheet`;
    const parsed = validate.parseDesignText(readFileSync(file, 'utf8'), file);
    if (!parsed.ok) throw new Error(`${label}: cannot read ${name}`);
    designs[name] = res.resolveDesign(parsed.design);
  }
  return { label, runSweep: sweep.runSweep, designs };
}

function grid(name: string): Axes {
  const span = (half: number, n: number) => Array.from({ length: 2 * n + 1 }, (_, i) => (half * (i - n)) / n);
  return { leanDeg: span(25, 15), handlebarDeg: span(25, 12), travelMm: name.startsWith('heron') ? [-20, 0, 20] : [0] };
}

function timeOne(copy: Copy, name: string): number {
  collectGarbage();
  const clock = startClock();
  let cells = 0;
  copy.runSweep(copy.designs[name], grid(name), { contact: 'ground' }, () => cells++);
  // CPU time: the helpers of a busy machine take wall time from both copies unevenly.
  const { cpuMs } = clock();
  if (cells === 0) throw new Error('no cells');
  return cpuMs;
}

async function mainRun(): Promise<void> {
  const beforeDir = process.argv[2];
  if (!beforeDir) throw new Error('usage: compareEnvelope.ts BEFORE_CORE_DIR [AFTER_CORE_DIR]');
  const afterDir = process.argv[3] ?? fileURLToPath(new URL('../../core/', import.meta.url));
  const before = await load('before', beforeDir);
  const after = await load('after', afterDir);
  for (const name of DEMOS) {
    // Warm both (JIT) before timing.
    timeOne(before, name);
    timeOne(after, name);
    const ratios: number[] = [];
    for (let p = 0; p < PASSES; p++) {
      const order = p % 2 === 0 ? [before, after] : [after, before];
      const t: Record<string, number> = {};
      for (const c of order) t[c.label] = timeOne(c, name);
      ratios.push(t.after / t.before);
      console.log(`${name} pass ${p + 1}: before ${t.before.toFixed(0)} ms, after ${t.after.toFixed(0)} ms of CPU, ratio ${(t.after / t.before).toFixed(3)}`);
    }
    console.log(`${name}: median after/before ${median(ratios).toFixed(3)} (below 1: faster)`);
  }
}

await mainRun();
