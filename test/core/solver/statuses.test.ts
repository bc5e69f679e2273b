/**
 * How the pose solver ends: named statuses, no NaN escaping, bounded work, recovery after a
 * failure, continuity (no silent branch flip) up to a dead centre, and warm = cold.
 *
 * References: stopping rules of Levenberg-Marquardt (K. Madsen, H. B. Nielsen, O. Tingleff,
 * Methods for Non-Linear Least Squares Problems, DTU 2004, sec. 3.2; J. J. More, 1978): every
 * iteration evaluates the residual at most twice (the trial, and the restore after a rejected
 * step) and the loop stops after kmax iterations. The thresholds for "continuous" below are
 * common practice, no source.
 */
import { describe, it, expect } from 'vitest';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver, type SolveResult } from '../../../core/solver/PoseSolver';
import { takeSnapshot, type PoseSnapshot } from '../../../core/analysis/poseSnapshot';
import { INPUT_NAMES, zeroInputs, type MechanismGraph, type PoseInputs } from '../../../core/mechanism/MechanismGraph';
import { demoDesign } from './designs';
import { report } from './report';

const heron = demoDesign('heron-tilting-velomobile');

const inputs = (p: Partial<PoseInputs>): PoseInputs => ({ ...zeroInputs(), ...p });

function labelOf(g: MechanismGraph, id: string): string {
  const c = g.constraints.find((k) => k.id === id);
  if (!c) throw new Error(`no constraint ${id}`);
  return c.label;
}

/** Every number anywhere in a value is finite (null allowed). */
function allFinite(x: unknown): boolean {
  if (x === null || x === undefined) return true;
  if (typeof x === 'number') return Number.isFinite(x);
  if (Array.isArray(x)) return x.every(allFinite);
  if (typeof x === 'object') return Object.values(x as Record<string, unknown>).every(allFinite);
  return true;
}

/** Largest distance between the same named points of two snapshots, mm. */
function pointGap(a: PoseSnapshot, b: PoseSnapshot): number {
  let d = 0;
  for (const id of Object.keys(a.points)) {
    const p = a.points[id];
    const q = b.points[id];
    d = Math.max(d, Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]));
  }
  for (const side of ['left', 'right'] as const) {
    const p = a.wheels[side].contactPoint;
    const q = b.wheels[side].contactPoint;
    d = Math.max(d, Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]));
  }
  return d;
}

function maxResidualNow(solver: PoseSolver): number {
  const r = new Float64Array(solver.mechanism.nResiduals);
  solver.mechanism.residuals(r);
  let m = 0;
  for (const x of r) m = Math.max(m, Math.abs(x));
  return m;
}

/** Work bounds from the LM algorithm (Madsen et al. 2004, Algorithm 3.16). */
function expectBoundedWork(res: SolveResult, solver: PoseSolver): void {
  const { maxIterations, maxBisections } = solver.options;
  if (res.status === 'converged' || res.status === 'singular') {
    // each continuation sub-step runs one LM of at most maxIterations
    expect(res.iterations).toBeLessThanOrEqual(maxIterations * Math.max(1, res.substeps));
    expect(res.evaluations).toBeLessThanOrEqual((2 * maxIterations + 2) * Math.max(1, res.substeps));
    // sub-steps: the input span over the step size, doubled at most maxBisections times (plus retries)
    expect(res.substeps).toBeLessThanOrEqual(200 * 2 ** maxBisections);
  } else {
    // A failure reports the whole attempt: every sub-step and bisection retry, each one LM
    // run of at most maxIterations.
    expect(res.substeps).toBeGreaterThanOrEqual(1);
    expect(res.iterations).toBeLessThanOrEqual(maxIterations * res.substeps);
    expect(res.evaluations).toBeLessThanOrEqual((2 * maxIterations + 2) * res.substeps);
  }
}

describe('invalid input', () => {
  for (const name of INPUT_NAMES) {
    for (const bad of [NaN, Infinity, -Infinity]) {
      it(`${name} = ${bad} -> 'invalid-input', nothing non-finite out, solver still usable`, () => {
        const solver = new PoseSolver(buildMechanism(heron));
        const ok = solver.solve(inputs({ leanDeg: 10, handlebarDeg: 5 }));
        expect(ok.status).toBe('converged');
        const before = takeSnapshot(solver.mechanism);
        const res = solver.solve(inputs({ leanDeg: 10, handlebarDeg: 5, [name]: bad }));
        expect(res.status).toBe('invalid-input');
        expect(res.residualMm).toBeNull();
        expect(allFinite(res)).toBe(true);
        expect(res.message).toContain(name);
        expect(res.iterations).toBe(0);
        // the mechanism was not touched: same pose, no NaN
        const after = takeSnapshot(solver.mechanism);
        expect(allFinite(after)).toBe(true);
        expect(pointGap(before, after)).toBe(0);
        // and the next good pose solves warm
        const next = solver.solve(inputs({ leanDeg: 12, handlebarDeg: 5 }));
        expect(next.status).toBe('converged');
        expect(allFinite(takeSnapshot(solver.mechanism))).toBe(true);
      });
    }
  }
});

describe('a linkage that cannot close', () => {
  it("travel far beyond reach -> 'cannot-assemble' naming the wheel-travel constraint", () => {
    const graph = buildMechanism(heron, { contact: 'travel', steerBy: 'handlebar' });
    const solver = new PoseSolver(graph);
    const res = solver.solve(inputs({ travelRightMm: 400 }));
    expect(res.status).toBe('cannot-assemble');
    expect(res.culprit).toBe(labelOf(graph, 'right.travel'));
    expect(res.message).toContain(res.culprit!);
    expect(res.residualMm!).toBeGreaterThan(solver.options.assemblyGapMm);
    expect(allFinite(res)).toBe(true);
    expectBoundedWork(res, solver);
  });

  for (const contact of ['travel', 'ground'] as const) {
    for (const length of [60, 150]) {
      // The loop plainly cannot close: the arm end and the crank joint are 280 mm apart. (This
      // once ended 'singular', "passes a dead centre ... (0 % of the way)", when a branch jump
      // was flagged for steps LM had not converged on; only a converged step is checked now.)
      it(`right tie rod far too short (${length} mm, ${contact}) -> 'cannot-assemble' naming the tie rod`, () => {
        const g = buildMechanism(heron, { contact, steerBy: 'handlebar' });
        const graph: MechanismGraph = { ...g, constraints: g.constraints.map((c) => (c.id === 'right.tieRod' ? { ...c, length } : c)) };
        const solver = new PoseSolver(graph);
        const res = solver.solve(zeroInputs());
        expect(allFinite(res)).toBe(true);
        expectBoundedWork(res, solver);
        expect(res.culprit).toBe(labelOf(graph, 'right.tieRod'));
        expect(res.status, res.message).toBe('cannot-assemble');
      });
    }
  }

  it('after a failure, the next reachable pose solves warm, equal to a cold solve', () => {
    const graph = buildMechanism(heron, { contact: 'travel', steerBy: 'handlebar' });
    const solver = new PoseSolver(graph);
    expect(solver.solve(inputs({ travelRightMm: 20, handlebarDeg: 5 })).status).toBe('converged');
    const bad = solver.solve(inputs({ travelRightMm: 400, handlebarDeg: 5 }));
    expect(bad.status).toBe('cannot-assemble');
    const target = inputs({ travelRightMm: 30, travelLeftMm: -10, handlebarDeg: 8 });
    const warm = solver.solve(target);
    expect(warm.status).toBe('converged');
    expect(warm.residualMm!).toBeLessThan(1e-9);
    const warmSnap = takeSnapshot(solver.mechanism);
    const cold = new PoseSolver(graph);
    expect(cold.solve(target, false).status).toBe('converged');
    expect(pointGap(warmSnap, takeSnapshot(cold.mechanism))).toBeLessThan(1e-9);
  });

  // Regression: PoseSolver.finishFailure used to restore the last good coordinates but leave the
  // partly reached inputs applied, so the mechanism (what a snapshot shows after a failure) was
  // neither the last good pose nor any closed pose (a 268 mm gap in this very case).
  it('after a failure the mechanism holds the last good pose, closed, with its inputs', () => {
    const graph = buildMechanism(heron, { contact: 'travel', steerBy: 'handlebar' });
    const solver = new PoseSolver(graph);
    const good = inputs({ travelRightMm: 20 });
    expect(solver.solve(good).status).toBe('converged');
    const goodSnap = takeSnapshot(solver.mechanism);
    const bad = solver.solve(inputs({ travelRightMm: 400 }));
    expect(bad.status).toBe('cannot-assemble');
    expect(solver.inputs).toEqual(good);
    expect(solver.mechanism.currentInputs).toEqual(good);
    expect(maxResidualNow(solver)).toBeLessThan(1e-9);
    expect(pointGap(goodSnap, takeSnapshot(solver.mechanism))).toBeLessThan(1e-9);
  });
});

describe('sweep of the Heron bell crank past its dead centre', () => {
  for (const contact of ['ground', 'travel'] as const) {
    for (const dir of [1, -1]) {
      it(`${contact}, handlebar 0 -> ${dir * 150} deg: continuous, then stops with a named failure`, () => {
        const solver = new PoseSolver(buildMechanism(heron, { contact, steerBy: 'handlebar' }));
        const stepDeg = 0.5;
        let prev = takeSnapshot(solver.mechanism);
        let lastGood = 0;
        let firstFailure: SolveResult | undefined;
        let convergedAfterFailure = 0;
        let worstJump = 0;
        for (let k = 1; k * stepDeg <= 150; k++) {
          const hb = dir * k * stepDeg;
          const res = solver.solve(inputs({ handlebarDeg: hb }));
          expect(allFinite(res)).toBe(true);
          expectBoundedWork(res, solver);
          if (res.status === 'converged') {
            if (firstFailure) {
              convergedAfterFailure++;
              continue;
            }
            expect(res.residualMm!).toBeLessThan(1e-9);
            const snap = takeSnapshot(solver.mechanism);
            // Continuity between neighbouring converged poses: common practice, no source.
            // Near the dead centre the wheel angle grows like sqrt(distance to it), so a 0.5 deg
            // handlebar step may move a wheel a few degrees; a flip of the steering arm and tie
            // rod to their other assembly moves it by tens of degrees.
            for (const side of ['left', 'right'] as const) {
              const jump = Math.abs(snap.wheels[side].steerDeg - prev.wheels[side].steerDeg);
              worstJump = Math.max(worstJump, jump);
              expect(jump, `${side} wheel at handlebar ${hb}`).toBeLessThan(8);
            }
            // The inner wheel keeps turning the way the handlebar turns (positive handlebar:
            // left turn, ISO 8855 heading positive). The outer wheel may peak and turn back
            // near the dead centre, so it is not checked.
            const inner = dir > 0 ? 'left' : 'right';
            expect(Math.sign(snap.wheels[inner].steerDeg - prev.wheels[inner].steerDeg), `inner wheel at ${hb}`).toBe(dir);
            prev = snap;
            lastGood = hb;
          } else if (!firstFailure) {
            firstFailure = res;
          }
        }
        report(`Heron sweep ${contact} ${dir > 0 ? '+' : '-'}: last converged handlebar (deg)`, lastGood);
        report(`Heron sweep ${contact} ${dir > 0 ? '+' : '-'}: largest wheel-angle step per 0.5 deg (deg)`, worstJump);
        report(`Heron sweep ${contact} ${dir > 0 ? '+' : '-'}: first failure`, `${firstFailure?.status}: ${firstFailure?.message}`);
        // It went well past the design envelope (25 deg) before stopping ...
        expect(Math.abs(lastGood)).toBeGreaterThan(heron.envelope.handlebarDeg + 10);
        // ... stopped with a named status that says why ...
        expect(firstFailure, 'the sweep never failed: it must stop at the dead centre').toBeDefined();
        expect(['singular', 'cannot-assemble']).toContain(firstFailure!.status);
        expect(firstFailure!.culprit).toMatch(/tie rod/);
        // ... and never came back converged on some other assembly further on.
        expect(convergedAfterFailure).toBe(0);
        expect(worstJump).toBeGreaterThan(0.5); // the check above is not vacuous
      });
    }
  }
});

describe('warm and cold solves agree', () => {
  for (const contact of ['ground', 'travel'] as const) {
    for (const toleranceMm of [undefined, 1e-10]) {
    it(`${contact}, ${toleranceMm ? `stopping tolerance ${toleranceMm} mm` : 'default options'}: poses reached along a warm path equal cold solves`, () => {
      const graph = buildMechanism(heron, { contact, steerBy: 'handlebar' });
      const opts = toleranceMm ? { toleranceMm } : {};
      const warm = new PoseSolver(graph, opts);
      const cold = new PoseSolver(graph, opts);
      const path: Array<Partial<PoseInputs>> = [
        { leanDeg: 5, handlebarDeg: 3 },
        { leanDeg: 15, handlebarDeg: 10 },
        { leanDeg: 20, handlebarDeg: -5 },
        { leanDeg: -10, handlebarDeg: -15 },
        { leanDeg: -20, handlebarDeg: 20, travelRightMm: 20, travelLeftMm: -15 },
        { leanDeg: 0, handlebarDeg: 25 },
        { leanDeg: 0, handlebarDeg: 0 },
      ];
      let worstGap = 0;
      for (const p of path) {
        const target = inputs(p);
        const w = warm.solve(target);
        expect(w.status, `warm ${JSON.stringify(p)}: ${w.message}`).toBe('converged');
        expect(w.residualMm!).toBeLessThan(warm.options.toleranceMm);
        const c = cold.solve(target, false);
        expect(c.status, `cold ${JSON.stringify(p)}: ${c.message}`).toBe('converged');
        expect(c.residualMm!).toBeLessThan(cold.options.toleranceMm);
        expectBoundedWork(w, warm);
        expectBoundedWork(c, cold);
        // Both stop once every residual is below the tolerance; a residual row of a coincident
        // joint IS a gap between two points, so two converged answers of the same branch may
        // differ by about the sum of their residuals (times a sensitivity near 1 here). With
        // the default 1e-9 mm stopping tolerance that can exceed 1e-9 mm; with 1e-10 it cannot.
        const allowed = toleranceMm ? 1e-9 : 1e-9 + 2 * (w.residualMm! + c.residualMm!);
        worstGap = Math.max(worstGap, pointGap(takeSnapshot(warm.mechanism), takeSnapshot(cold.mechanism)));
        expect(pointGap(takeSnapshot(warm.mechanism), takeSnapshot(cold.mechanism)), JSON.stringify(p)).toBeLessThan(allowed);
      }
      report(`warm vs cold ${contact}, ${toleranceMm ?? 'default'} tolerance: max point gap (mm)`, worstGap);
    });
    }
  }
});

describe('reached: whether the returned pose is the one asked for', () => {
  it('is true for a converged pose and false for every failure, which keeps the last good pose', () => {
    const solver = new PoseSolver(buildMechanism(heron, { contact: 'travel', steerBy: 'handlebar' }));
    const ok = solver.solve({ ...zeroInputs(), travelRightMm: 20, travelLeftMm: 20 });
    expect(ok.status).toBe('converged');
    expect(ok.reached).toBe(true);
    const far = solver.solve({ ...zeroInputs(), travelRightMm: 400, travelLeftMm: 400 });
    expect(far.status).toBe('cannot-assemble');
    expect(far.reached).toBe(false);
    // the mechanism still holds the last good pose, at its inputs
    expect(solver.mechanism.currentInputs.travelRightMm).toBe(20);
    const bad = solver.solve({ ...zeroInputs(), leanDeg: NaN });
    expect(bad.status).toBe('invalid-input');
    expect(bad.reached).toBe(false);
  });
});
