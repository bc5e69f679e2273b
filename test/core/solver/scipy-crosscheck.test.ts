/**
 * Cross-check of the whole pose solver against an independent formulation solved with SciPy
 * (scipy.optimize.least_squares, method 'trf'; test/scipy/solve_design.py): the Heron demo
 * (split wishbones, bell crank turned by a fixed ratio, both tyres on the ground as tori).
 * The Python model shares no code and no unknowns with ours: it treats each upright as a
 * free rigid body (6 parameters) plus two wishbone angles per side, and writes the
 * constraints from the physical description. Every hardpoint, both wheel centres, spin axes
 * and tyre contact points must agree to 1e-6 mm.
 *
 * Needs /usr/bin/python3 with SciPy (Debian package python3-scipy). Without it this test
 * FAILS on purpose, with a message saying what to install; it does not skip.
 */
import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { demoDesign } from './designs';
import { report } from './report';

const PYTHON = '/usr/bin/python3';
const SCRIPT = fileURLToPath(new URL('../../scipy/solve_design.py', import.meta.url));

type V3 = [number, number, number];
interface PyPose {
  ok: boolean;
  maxResidual: number;
  points: Record<string, V3>;
  wheels: Record<'left' | 'right', { centre: V3; spinAxis: V3; contactPoint: V3 }>;
}

const POSES: Array<{ leanDeg: number; handlebarDeg: number }> = [
  { leanDeg: 0, handlebarDeg: 0 },
  { leanDeg: 0, handlebarDeg: 12 },
  { leanDeg: 0, handlebarDeg: -25 },
  { leanDeg: 15, handlebarDeg: 0 },
  { leanDeg: -25, handlebarDeg: 0 },
  { leanDeg: 20, handlebarDeg: 10 },
  { leanDeg: 25, handlebarDeg: -15 },
  { leanDeg: -10, handlebarDeg: 20 },
  { leanDeg: -20, handlebarDeg: -20 },
  { leanDeg: 7.5, handlebarDeg: 3.3 },
];

function requireScipy(): void {
  const probe = spawnSync(PYTHON, ['-c', 'import scipy, numpy; print(scipy.__version__)'], { encoding: 'utf8' });
  if (probe.error || probe.status !== 0) {
    throw new Error(
      `The SciPy cross-check needs ${PYTHON} with SciPy: install the Debian package python3-scipy ` +
        `(apt-get install python3-scipy; CI installs it). Probe said: ${probe.error?.message ?? probe.stderr}`,
    );
  }
}

const dist = (a: ArrayLike<number>, b: ArrayLike<number>) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('pose solver against an independent SciPy least_squares formulation (Heron demo)', () => {
  it('agrees on every hardpoint, wheel centre, spin axis and contact point to 1e-6 mm', { timeout: 120_000 }, () => {
    requireScipy();
    const design = demoDesign('heron-tilting-velomobile');
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-scipy-'));
    let py: { poses: PyPose[]; scipy: string };
    try {
      const job = join(dir, 'job.json');
      writeFileSync(job, JSON.stringify({ design, poses: POSES }));
      const run = spawnSync(PYTHON, [SCRIPT, job], { encoding: 'utf8', timeout: 110_000 });
      expect(run.error, String(run.error)).toBeUndefined();
      expect(run.status, run.stderr).toBe(0);
      py = JSON.parse(run.stdout);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    expect(py.poses).toHaveLength(POSES.length);

    const graph = buildMechanism(design, { contact: 'ground', steerBy: 'handlebar' });
    const solver = new PoseSolver(graph);
    let worstPoint = 0;
    let worstWheel = 0;
    let worstAxis = 0;
    POSES.forEach((pose, i) => {
      const ref = py.poses[i];
      const tag = `lean ${pose.leanDeg}, handlebar ${pose.handlebarDeg}`;
      expect(ref.ok, `SciPy did not close the loops at ${tag}: ${ref.maxResidual}`).toBe(true);
      // both start from the design pose and follow the inputs in small steps: same branch
      const res = solver.solve({ ...zeroInputs(), ...pose }, false);
      expect(res.status, `${tag}: ${res.message}`).toBe('converged');
      expect(res.residualMm!).toBeLessThan(1e-9);
      const snap = takeSnapshot(solver.mechanism);
      // the same set of hardpoints on both sides
      expect(Object.keys(snap.points).sort()).toEqual(Object.keys(ref.points).sort());
      for (const id of Object.keys(snap.points)) {
        const d = dist(snap.points[id], ref.points[id]);
        worstPoint = Math.max(worstPoint, d);
        expect(d, `${id} at ${tag}`).toBeLessThan(1e-6);
      }
      for (const side of ['left', 'right'] as const) {
        const w = snap.wheels[side];
        const r = ref.wheels[side];
        const dc = dist(w.centre, r.centre);
        const dp = dist(w.contactPoint, r.contactPoint);
        const da = dist(w.spinAxis, r.spinAxis);
        worstWheel = Math.max(worstWheel, dc, dp);
        worstAxis = Math.max(worstAxis, da);
        expect(dc, `${side} wheel centre at ${tag}`).toBeLessThan(1e-6);
        expect(dp, `${side} contact point at ${tag}`).toBeLessThan(1e-6);
        expect(da, `${side} spin axis at ${tag}`).toBeLessThan(1e-9);
        // both on the ground
        expect(Math.abs(r.contactPoint[2])).toBeLessThan(1e-9);
      }
    });
    // the poses were not trivial: some wheel moved far from design
    report(`SciPy ${py.scipy}: max hardpoint diff (mm)`, worstPoint);
    report('SciPy: max wheel centre / contact point diff (mm)', worstWheel);
    report('SciPy: max spin-axis diff', worstAxis);
    const c0 = design.upright.wheelCentre.left;
    const moved = dist(py.poses[POSES.length - 2].wheels.left.centre, [c0.x, c0.y, c0.z]);
    expect(moved).toBeGreaterThan(20);
    expect(worstPoint).toBeLessThan(1e-6);
    expect(worstWheel).toBeLessThan(1e-6);
    expect(worstAxis).toBeLessThan(1e-9);
  });
});
