/**
 * Side-by-side speed of the whole envelope sweep with every measure (core/analysis/sweep.ts's
 * runSweep: solve, measure, the measures that need neighbouring poses, the verdicts) in two
 * copies of core/:
 *
 *   npx tsx test/bench/compareEnvelope.ts BEFORE_CORE_DIR [AFTER_CORE_DIR]
 *
 * AFTER defaults to this checkout's core/. Each timing runs in a fresh process that loads one
 * copy only: two copies imported into one process share gl-matrix's module and V8's feedback
 * for it, and an A/A run there (the same core twice) showed the second-loaded copy 1.5-1.9x
 * slower, so in-process turns are no fair race for this sweep. The processes alternate before,
 * after, before, ... (COMPARE_ROUNDS rounds, default 4), each times the sweep three times after
 * a warm-up and reports its median; the script prints every process's figure and the ratio of
 * the medians (after / before: below 1 is faster). Each copy reads and resolves the demo file
 * with its own design module, so a copy from before a format change still reads the demos.
 * The grid is the solver bench's envelope: 91 lean x 61 handlebar x 9 travel, travel held.
 */

import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { median } from './measure';

const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike'];
const ROUNDS = Number(process.env.COMPARE_ROUNDS ?? 4);

type RunSweep = (design: unknown, axes: object, options: object, onCell: () => void) => unknown;

/** In a child process: time one copy's sweep of one demo, print the median wall time in ms. */
async function child(dir: string, name: string): Promise<void> {
  const at = (p: string) => pathToFileURL(resolve(dir, p)).href;
  const { runSweep } = (await import(at('analysis/sweep.ts'))) as { runSweep: RunSweep };
  const { parseDesignText } = (await import(at('design/validateDesign.ts'))) as { parseDesignText(t: string, f: string): { ok: boolean; design?: unknown } };
  const { resolveDesign } = (await import(at('design/resolveDesign.ts'))) as { resolveDesign(d: unknown): unknown };
  const file = fileURLToPath(new URL(`../../assets/designs/${name}.tiltsheet`, import.meta.url));
  const parsed = parseDesignText(readFileSync(file, 'utf8'), file);
  if (!parsed.ok) throw new Error(`cannot read ${name}`);
  const design = resolveDesign(parsed.design);
  const span = (half: number, n: number) => Array.from({ length: 2 * n + 1 }, (_, i) => (half * (i - n)) / n);
  const axes = { leanDeg: span(25, 45), handlebarDeg: span(25, 30), travelMm: span(40, 4) };
  runSweep(design, axes, { contact: 'travel' }, () => {}); // warm-up
  const times: number[] = [];
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    runSweep(design, axes, { contact: 'travel' }, () => {});
    times.push(performance.now() - t0);
  }
  console.log(median(times).toFixed(1));
}

function timeIn(dir: string, name: string): number {
  const script = fileURLToPath(import.meta.url);
  const out = execFileSync(process.execPath, ['--import', 'tsx', script, '--child', dir, name], { encoding: 'utf8' });
  return Number(out.trim().split('\n').pop());
}

async function mainRun(): Promise<void> {
  if (process.argv[2] === '--child') return child(process.argv[3], process.argv[4]);
  const beforeDir = process.argv[2];
  if (!beforeDir) throw new Error('usage: compareEnvelope.ts BEFORE_CORE_DIR [AFTER_CORE_DIR]');
  const afterDir = process.argv[3] ?? fileURLToPath(new URL('../../core/', import.meta.url));
  for (const name of DEMOS) {
    const before: number[] = [];
    const after: number[] = [];
    for (let r = 0; r < ROUNDS; r++) {
      before.push(timeIn(beforeDir, name));
      after.push(timeIn(afterDir, name));
    }
    const ratio = median(after) / median(before);
    console.log(`${name}: 49,959 poses with every measure, ms per sweep, one process each`);
    console.log(`  before ${before.map((t) => t.toFixed(0)).join(' ')}   after ${after.map((t) => t.toFixed(0)).join(' ')}`);
    console.log(`  median after/before ${ratio.toFixed(3)} (below 1: faster)`);
  }
}

await mainRun();
