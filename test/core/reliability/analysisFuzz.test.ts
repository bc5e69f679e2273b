/**
 * Issue 5, no NaN or Infinity in any output: the analysis modules in core/analysis run on
 * fuzzed designs (the same families as designFuzz.test.ts, fewer of them, since each pose is
 * analysed in full and each design is swept).
 *
 * - PoseAnalyser.analyse on every pose the solver reached: never throws; every number in the
 *   PoseAnalysis is finite (a value that cannot be given must be null with a reason, as
 *   analysisTypes.ts promises).
 * - runSweep / envelopeMap / checkDesign on a coarse grid over the design's envelope, curves
 *   (two kinds per design, in turn) and steerLimits: never throw; every cell is either analysed
 *   (finite numbers) or failed with the solver's named status and message; counts add up.
 *
 * Another developer is adding analysis modules: the last test reads core/analysis and fails
 * for any module that nothing here reaches (directly or through the modules it imports), so a
 * new module gets added to this fuzz when it appears.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import type { ResolvedDesign } from '../../../core/design/types';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { PoseAnalyser } from '../../../core/analysis/PoseAnalyser';
import { runSweep, envelopeAxes, type SweepAxes } from '../../../core/analysis/sweep';
import { envelopeMap } from '../../../core/analysis/envelopeMap';
import { checkDesign } from '../../../core/analysis/designCheck';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { solveSinglePose } from '../../../core/analysis/solveSinglePose';
import { curve, CURVE_KINDS } from '../../../core/analysis/curves';
import { steerLimits } from '../../../core/analysis/limits';
import { runRideSweep } from '../../../core/analysis/rideSweep';
import { cellRow, nullReasons, poseColumns } from '../../../core/analysis/poseColumns';
import { loadDemos } from './demoDesigns';
import { nearDesignArb, plausibleDesignArb, wildDesignArb, type GeneratedDesign } from './designArbitraries';
import { NAMED_STATUSES, nonFiniteIn } from './poseChecks';
import { FigureTally, fuzzSeed, runs } from './fuzzFigures';

const tally = new FigureTally('analysis');
afterAll(() => tally.write());

/** Modules this file calls directly; everything they import is reached too. */
const ENTRY_MODULES = ['PoseAnalyser', 'sweep', 'envelopeMap', 'designCheck', 'poseSnapshot', 'solveSinglePose', 'curves', 'limits', 'poseColumns', 'rideSweep'];
const SWEEPERS = ['runSweep', 'envelopeMap', 'checkDesign', 'curve', 'steerLimits'] as const;

function accepted(g: GeneratedDesign): ResolvedDesign | undefined {
  const v = validateDesign(g.design);
  tally.design(v.ok, v.ok ? undefined : v.issues[0]?.path);
  return v.ok ? resolveDesign(v.design) : undefined;
}

function analysePoses(design: ResolvedDesign, label: string): string[] {
  const problems: string[] = [];
  const solver = new PoseSolver(buildMechanism(design));
  const analyser = new PoseAnalyser(design, solver.mechanism, { findings: true });
  const lean = design.vehicle.tilting ? design.envelope.leanDeg : 0;
  const hb = design.envelope.handlebarDeg;
  const poses: Partial<PoseInputs>[] = [{}, { handlebarDeg: hb / 2 }, { leanDeg: lean, handlebarDeg: hb }, { leanDeg: -lean, handlebarDeg: -hb }, { handlebarDeg: 170 }];
  for (const p of poses) {
    const inputs = { ...zeroInputs(), ...p };
    const t0 = performance.now();
    const result = solver.solve(inputs);
    tally.solve(result.status, performance.now() - t0, () => `${label} ${JSON.stringify(p)}`);
    if (!NAMED_STATUSES.includes(result.status)) problems.push(`${label}: unnamed status ${result.status}`);
    const reached = takeSnapshot(solver.mechanism).inputs.handlebarDeg === inputs.handlebarDeg;
    if (!(result.status === 'converged' || (result.status === 'singular' && reached))) continue;
    try {
      const a = analyser.analyse(result);
      problems.push(...nonFiniteIn(a, 'analysis').map((x) => `${label} ${JSON.stringify(p)}: ${x}`));
      // Findings are words: they must not print a non-number either.
      for (const f of a.findings) if (nonFiniteIn(f).length > 0) problems.push(`${label}: finding "${f}"`);
    } catch (e) {
      problems.push(`${label} ${JSON.stringify(p)}: analyse threw: ${(e as Error).stack}`);
    }
  }
  return problems;
}

/** A grid of 3 values per axis over the envelope (coarse: this is about robustness, not resolution). */
function coarseAxes(design: ResolvedDesign): SweepAxes {
  const e = design.envelope;
  const three = (h: number) => (h > 0 ? [-h, 0, h] : [0]);
  return {
    leanDeg: design.vehicle.tilting ? three(e.leanDeg) : [0],
    handlebarDeg: three(e.handlebarDeg),
    travelMm: design.frontEnd.kind === 'centrePivot' ? [0] : [-e.reboundMm, 0, e.bumpMm].filter((x, i, a) => a.indexOf(x) === i),
  };
}

function sweepProblems(design: ResolvedDesign, label: string, which: number): string[] {
  const problems: string[] = [];
  try {
    if (which === 0) {
      const axes = coarseAxes(design);
      const columns = poseColumns(design);
      const hasDragLink = design.steering.kind === 'bellCrank' && design.steering.input.kind === 'dragLink';
      let cells = 0;
      const summary = runSweep(design, axes, { findings: true }, (c) => {
        cells++;
        // The flat row a sweep file gets: finite numbers, strings, or null with a reason.
        const row = cellRow(columns, c);
        if (row.length !== columns.length) problems.push(`row of ${row.length} values for ${columns.length} columns`);
        problems.push(...nonFiniteIn(row, `row ${c.leanDeg}/${c.handlebarDeg}/${c.travelMm}`));
        // (No drag link: its transmission column is null by definition, analysisTypes.ts.)
        const unexplained = columns.filter((k, i) => row[i] === null && !(k.name === 'steering.dragLinkTransmissionDeg' && !hasDragLink));
        if (c.ok && unexplained.length > 0 && nullReasons(c.analysis) === '') problems.push(`row ${c.leanDeg}/${c.handlebarDeg}/${c.travelMm}: null values with no reason (${unexplained.map((k) => k.name).slice(0, 5).join(', ')})`);
        if (c.ok) problems.push(...nonFiniteIn(c.analysis, `cell ${c.leanDeg}/${c.handlebarDeg}/${c.travelMm}`));
        else if (!NAMED_STATUSES.includes(c.failure.solver.status) || c.failure.solver.message === '') problems.push(`failed cell without a named status: ${JSON.stringify(c.failure.solver)}`);
        else problems.push(...nonFiniteIn(c.failure, 'failed cell'));
      });
      tally.data.sweepPosesSolved += summary.solves;
      if (cells !== summary.poses || summary.solved + summary.failed !== summary.poses) problems.push(`sweep counted ${cells} cells, summary ${JSON.stringify(summary)}`);
    } else if (which === 1) {
      const map = envelopeMap(design, coarseAxes(design), { contact: 'travel' });
      tally.data.sweepPosesSolved += map.summary.solves;
      problems.push(...nonFiniteIn(map.cells, 'envelope map'));
      if (map.cells.some((c) => c === undefined)) problems.push('envelope map has an empty cell');
    } else if (which === 2) {
      const steps = { leanDeg: Math.max(1, design.envelope.leanDeg / 2), handlebarDeg: Math.max(1, design.envelope.handlebarDeg / 2), travelMm: 1000 };
      const check = checkDesign(design, { steps });
      tally.data.sweepPosesSolved += check.summary.solves;
      problems.push(...nonFiniteIn(check, 'design check'));
      expect(envelopeAxes(design, steps).handlebarDeg.length).toBeGreaterThan(0);
    } else if (which === 3) {
      // Two curve kinds per design, in turn, on 5 values of the swept input.
      const kinds = [CURVE_KINDS[count % CURVE_KINDS.length], CURVE_KINDS[(count + 4) % CURVE_KINDS.length]];
      for (const kind of kinds) {
        // Seven values over the design's range (the default is one per degree: slow for a fuzz).
        const e = design.envelope;
        const span = kind === 'bumpSteer' || kind === 'camberTravel' ? Math.max(e.bumpMm, e.reboundMm, 10) : kind.endsWith('Lean') || kind === 'leanSteer' ? Math.max(e.leanDeg, 1) : Math.max(e.handlebarDeg, 1);
        const values = [-1, -2 / 3, -1 / 3, 0, 1 / 3, 2 / 3, 1].map((f) => (kind === 'ackermann' ? Math.abs(f) : f) * span);
        const c = curve(design, kind, { values: design.vehicle.tilting || !(kind.endsWith('Lean') || kind === 'leanSteer') ? values : [0] });
        tally.data.sweepPosesSolved += c.input.values.length;
        problems.push(...nonFiniteIn(c, `curve ${kind}`));
        for (const f of c.failures) if (!NAMED_STATUSES.includes(f.status as never) || f.message === '') problems.push(`curve ${kind}: failure without a named status ${JSON.stringify(f)}`);
        for (const s of c.series) if (s.values.length !== c.input.values.length) problems.push(`curve ${kind}: series ${s.id} has ${s.values.length} values for ${c.input.values.length} inputs`);
      }
    } else {
      const lean = design.vehicle.tilting ? design.envelope.leanDeg : 0;
      const limits = steerLimits(design, lean > 0 ? [0, lean] : [0], { stepDeg: 5, maxHandlebarDeg: 120, toleranceDeg: 0.5 });
      problems.push(...nonFiniteIn(limits, 'steer limits'));
    }
  } catch (e) {
    problems.push(`${SWEEPERS[which]} threw: ${(e as Error).stack}`);
  }
  return problems.map((p) => `${label}: ${p}`);
}

let count = 0;
function checkGenerated(g: GeneratedDesign): void {
  const index = count++;
  const design = accepted(g);
  if (!design) return;
  const label = `${g.origin} (design ${index})`;
  const problems = analysePoses(design, label);
  if (index % 2 === 0) problems.push(...sweepProblems(design, label, (index / 2) % SWEEPERS.length));
  if (problems.length > 0) throw new Error(`${problems.length} problem(s):\n${problems.slice(0, 10).join('\n')}\ndesign: ${JSON.stringify(g.design)}`);
}

describe('analysis outputs on fuzzed designs: finite numbers or null with a reason, never a throw', () => {
  const demos = loadDemos();

  it('every demo, in full', () => {
    for (const d of demos) {
      const design = resolveDesign(d.design);
      const problems = [...analysePoses(design, d.file), ...SWEEPERS.map((_, w) => sweepProblems(design, d.file, w)).flat()];
      expect(problems, problems.join('\n')).toEqual([]);
    }
  }, 120_000);

  it('near the demos', () => {
    fc.assert(fc.property(nearDesignArb(demos), checkGenerated), { numRuns: runs(150), seed: fuzzSeed() + 10, endOnFailure: true });
  }, 300_000);

  it('far from the demos', () => {
    fc.assert(fc.property(fc.oneof(plausibleDesignArb, wildDesignArb), checkGenerated), { numRuns: runs(150), seed: fuzzSeed() + 11, endOnFailure: true });
  }, 300_000);

  it('solveSinglePose reports finite numbers on the demos in every mode', () => {
    for (const d of demos) {
      const design = resolveDesign(d.design);
      for (const steerBy of ['handlebar', 'leftWheel', 'rightWheel'] as const) {
        for (const contact of ['ground', 'travel'] as const) {
          const lean = design.vehicle.tilting ? 10 : 0;
          const request = { contact, steerBy, leanDeg: lean, handlebarDeg: steerBy === 'handlebar' ? 10 : 0, wheelAngleDeg: 8, heaveMm: 0, travelRightMm: 5, travelLeftMm: -5 };
          const out = solveSinglePose(design, request);
          expect(nonFiniteIn(out.report), `${d.file} ${contact}/${steerBy}`).toEqual([]);
          expect(nonFiniteIn(out.text)).toEqual([]);
          // The ride input (a speed instead of a lean) likewise, one pose and a small ride sweep.
          const ride = solveSinglePose(design, { ...request, leanDeg: 0, speedKmh: 25 });
          expect(nonFiniteIn(ride.report), `${d.file} ${contact}/${steerBy} at 25 km/h`).toEqual([]);
          if (contact === 'ground' && steerBy === 'handlebar') {
            const cells: unknown[] = [];
            const summary = runRideSweep(design, { speedKmh: [0, 20, 60], handlebarDeg: [-20, 0, 20] }, {}, (c) => cells.push(c));
            expect(cells.length).toBe(summary.poses);
            expect(nonFiniteIn(cells, `${d.file} ride sweep`)).toEqual([]);
          }
        }
      }
    }
  });
});

describe('coverage of core/analysis', () => {
  it('every module in core/analysis is reached by this fuzz (add new entry modules to ENTRY_MODULES and a call above)', () => {
    const dir = fileURLToPath(new URL('../../../core/analysis', import.meta.url));
    const modules = readdirSync(dir).filter((f) => f.endsWith('.ts')).map((f) => f.slice(0, -3));
    const reached = new Set<string>();
    const visit = (name: string) => {
      if (reached.has(name) || !modules.includes(name)) return;
      reached.add(name);
      const text = readFileSync(join(dir, `${name}.ts`), 'utf8');
      for (const m of text.matchAll(/from '\.\/([\w.-]+)'/g)) visit(m[1]);
    };
    ENTRY_MODULES.forEach(visit);
    expect(modules.filter((m) => !reached.has(m)), 'modules in core/analysis that no fuzz test reaches').toEqual([]);
  });
});
