/**
 * Analysis overhead bench: the full envelope (91 lean x 61 handlebar x 9 travel = 49,959
 * poses) solved with every measure, beside the same envelope solved by the solver alone.
 *
 *   - everyMeasureHookFor(): a PoseHook for run.ts's envelope table ("with every measure"):
 *     the complete PoseAnalyser measure set after each solve of its timed loop.
 *   - benchEnvelope(): times the real thing, core/analysis/sweep.ts's runSweep (one solver,
 *     serpentine, reference pass, neighbour measures, every measure per pose), against a bare
 *     serpentine of the same solver mode over the same grid, median of timed passes after a
 *     warm-up pass. Target: under 2 s per envelope with every measure on one core.
 *
 * Run alone: npx tsx test/bench/envelope.ts [design-name ...]
 */

import { pathToFileURL } from 'node:url';
import os from 'node:os';
import type { ResolvedDesign } from '../../core/design/types';
import { buildMechanism } from '../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../core/solver/PoseSolver';
import { PoseAnalyser } from '../../core/analysis/PoseAnalyser';
import { runSweep, type SweepAxes, type SweepContact } from '../../core/analysis/sweep';
import { linspace, loadDemoDesign, TILTING_DEMOS, type PoseHook } from './measure';

/** The target for the full envelope with every measure, seconds. */
export const ENVELOPE_TARGET_S = 2;

/** A hook computing every per-pose measure after each solve; it reads the mechanism and changes nothing. */
export function everyMeasureHookFor(design: ResolvedDesign, solver: PoseSolver): PoseHook {
  const analyser = new PoseAnalyser(design, solver.mechanism, { findings: false });
  let sink = 0;
  return (_m, _inputs, result) => {
    if (result.status === 'converged' || result.status === 'singular') sink += analyser.analyse(result).worst.slipDeg;
    if (sink === -1) console.log(sink); // keep the work observable to the optimiser
  };
}

/** The envelope grid: 91 lean x 61 handlebar over the design's envelope, 9 travel -40..40 mm. */
export function envelopeAxes91(design: ResolvedDesign, nLean = 91, nSteer = 61, nTravel = 9, travelMm = 40): SweepAxes {
  return {
    leanDeg: linspace(-design.envelope.leanDeg, design.envelope.leanDeg, nLean),
    handlebarDeg: linspace(-design.envelope.handlebarDeg, design.envelope.handlebarDeg, nSteer),
    travelMm: linspace(-travelMm, travelMm, nTravel),
  };
}

/** Serpentine over the grid with one solver and no analysis: the solver-only figure. */
interface Timed {
  ms: number;
  cpuMs: number;
  failed: number;
}

function solverOnly(design: ResolvedDesign, axes: SweepAxes, contact: SweepContact): Timed {
  const solver = new PoseSolver(buildMechanism(design, { contact, steerBy: 'handlebar' }));
  const input = zeroInputs();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  let failed = 0;
  let row = 0;
  let first = true;
  const nL = axes.leanDeg.length;
  const nS = axes.handlebarDeg.length;
  for (let ti = 0; ti < axes.travelMm.length; ti++) {
    const t = axes.travelMm[ti];
    for (let lk = 0; lk < nL; lk++) {
      input.leanDeg = axes.leanDeg[ti % 2 === 0 ? lk : nL - 1 - lk];
      const forward = row++ % 2 === 0;
      for (let sk = 0; sk < nS; sk++) {
        input.handlebarDeg = axes.handlebarDeg[forward ? sk : nS - 1 - sk];
        if (contact === 'ground') input.heaveMm = -t;
        else input.travelLeftMm = input.travelRightMm = t;
        const r = solver.solve(input, !first);
        first = false;
        if (r.status !== 'converged' && r.status !== 'singular') failed++;
      }
    }
  }
  const c = process.cpuUsage(c0);
  return { ms: performance.now() - t0, cpuMs: (c.user + c.system) / 1000, failed };
}

function everyMeasure(design: ResolvedDesign, axes: SweepAxes, contact: SweepContact): Timed {
  let sink = 0;
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const s = runSweep(design, axes, { contact }, (c) => {
    if (c.ok) sink += c.analysis.worst.clearanceMm;
  });
  const ms = performance.now() - t0;
  const c = process.cpuUsage(c0);
  if (sink === -1) console.log(sink);
  return { ms, cpuMs: (c.user + c.system) / 1000, failed: s.failed };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

export interface EnvelopeBench {
  design: string;
  contact: SweepContact;
  poses: number;
  /** Median seconds per envelope (wall clock), and every timed pass. */
  solverOnlyS: number;
  everyMeasureS: number;
  /** The same in CPU seconds of this process (includes the garbage collector's threads). */
  solverOnlyCpuS: number;
  everyMeasureCpuS: number;
  solverOnlyPassesS: number[];
  everyMeasurePassesS: number[];
  /** Analysis overhead: every measure minus solver only, seconds and microseconds per pose. */
  overheadS: number;
  overheadUsPerPose: number;
  failed: number;
  meetsTarget: boolean;
}

export function benchEnvelope(design: ResolvedDesign, opts: { contact?: SweepContact; passes?: number; warmupPasses?: number } = {}): EnvelopeBench {
  const contact = opts.contact ?? 'travel';
  const passes = opts.passes ?? 3;
  const warm = opts.warmupPasses ?? 1;
  const axes = envelopeAxes91(design);
  if (contact === 'ground' && design.frontEnd.kind === 'centrePivot') axes.travelMm = [0];
  const poses = axes.leanDeg.length * axes.handlebarDeg.length * axes.travelMm.length;
  const solo: number[] = [];
  const full: number[] = [];
  const soloCpu: number[] = [];
  const fullCpu: number[] = [];
  let failed = 0;
  for (let p = 0; p < warm + passes; p++) {
    // Alternate the two so machine load falls on both alike.
    const a = solverOnly(design, axes, contact);
    const b = everyMeasure(design, axes, contact);
    failed = b.failed;
    if (p >= warm) {
      solo.push(a.ms / 1000);
      full.push(b.ms / 1000);
      soloCpu.push(a.cpuMs / 1000);
      fullCpu.push(b.cpuMs / 1000);
    }
  }
  const s = median(solo);
  const f = median(full);
  return {
    design: design.name,
    contact,
    poses,
    solverOnlyS: s,
    everyMeasureS: f,
    solverOnlyCpuS: median(soloCpu),
    everyMeasureCpuS: median(fullCpu),
    solverOnlyPassesS: solo,
    everyMeasurePassesS: full,
    overheadS: f - s,
    overheadUsPerPose: ((f - s) / poses) * 1e6,
    failed,
    meetsTarget: f < ENVELOPE_TARGET_S,
  };
}

export function formatEnvelopeBench(results: EnvelopeBench[]): string {
  const lines = ['design                                      contact  poses    solver only  every measure  overhead (us/pose)  target < 2 s   CPU s: solver / every measure'];
  for (const r of results) {
    lines.push(
      `${r.design.replace(/\s*\(demo\)\s*$/, '').padEnd(44)}${r.contact.padEnd(9)}${String(r.poses).padEnd(9)}` +
        `${r.solverOnlyS.toFixed(2).padStart(8)} s  ${r.everyMeasureS.toFixed(2).padStart(10)} s  ${r.overheadUsPerPose.toFixed(1).padStart(12)}        ` +
        `${r.meetsTarget ? 'PASS' : 'MISS'}           ${r.solverOnlyCpuS.toFixed(2)} / ${r.everyMeasureCpuS.toFixed(2)}` +
        `${r.failed ? `  (${r.failed} poses not assembled)` : ''}`,
    );
  }
  return lines.join('\n');
}

function main(): void {
  const names = process.argv.slice(2);
  const list = names.length ? names : [...TILTING_DEMOS];
  console.log(`Envelope with every measure -- node ${process.version}, ${os.cpus().length} CPU(s), load average ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  console.log('91 lean x 61 handlebar over the design envelope x 9 travel -40..40 mm; median of 3 timed passes after 1 warm-up.');
  const results: EnvelopeBench[] = [];
  for (const name of list) {
    const design = loadDemoDesign(name);
    results.push(benchEnvelope(design, { contact: 'travel' }));
    results.push(benchEnvelope(design, { contact: 'ground' }));
  }
  console.log(formatEnvelopeBench(results));
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
