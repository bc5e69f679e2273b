/**
 * Cross-check of the balance-beam lean linkage against an independent formulation solved with
 * SciPy (scipy.optimize.least_squares, method 'trf'; test/scipy/solve_lean_linkage.py): the
 * Pipit demo (split wishbones, bell crank by a fixed ratio, tyres as tori on the ground, a
 * carrier slid by the spring travel, a rocker and two push links, the frame's sideways and
 * vertical place set by the mean-contact-y rule). The Python model shares no code with ours:
 * free rigid-body uprights, the frame's shift and the rocker angle as plain unknowns. Every
 * hardpoint (the lean linkage's included) must agree to 1e-6 mm and the rocker angle to 1e-6 deg
 * (measured: 3.5e-11 mm at most over the 125 points of five poses, SciPy 1.10.1).
 *
 * Needs /usr/bin/python3 with SciPy (Debian package python3-scipy): without it this FAILS
 * with a message saying what to install, as the other SciPy cross-check does.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { bodyIndex, buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { LEAN_IDS } from '../../../core/mechanism/templates/leanLinkage';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { pipitDoc } from '../mechanism/pipitDemo';
import { report } from './report';

const PYTHON = '/usr/bin/python3';
const SCRIPT = fileURLToPath(new URL('../../scipy/solve_lean_linkage.py', import.meta.url));

type V3 = [number, number, number];
interface PyPose {
  ok: boolean;
  maxResidual: number;
  points: Record<string, V3>;
  rockerDeg: number;
  frame: [number, number];
}

const POSES = [
  { leanDeg: 0, handlebarDeg: 0, heaveMm: 0 },
  { leanDeg: 15, handlebarDeg: 0, heaveMm: 0 },
  { leanDeg: -25, handlebarDeg: 10, heaveMm: 0 },
  { leanDeg: 20, handlebarDeg: -12, heaveMm: -10 },
  { leanDeg: 8, handlebarDeg: 5, heaveMm: 8 },
];

const dist = (a: ArrayLike<number>, b: ArrayLike<number>) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('lean linkage against an independent SciPy least_squares formulation (Pipit demo)', () => {
  it('agrees on every hardpoint and the rocker angle', { timeout: 120_000 }, () => {
    const probe = spawnSync(PYTHON, ['-c', 'import scipy, numpy'], { encoding: 'utf8' });
    if (probe.error || probe.status !== 0) throw new Error(`needs ${PYTHON} with SciPy: install python3-scipy (${probe.error?.message ?? probe.stderr})`);
    const design = resolveDesign(pipitDoc());
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-scipy-lean-'));
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
    const solver = new PoseSolver(buildMechanism(design));
    const rocker = bodyIndex(solver.mechanism.graph, LEAN_IDS.rocker);
    let worst = 0;
    let compared = 0;
    POSES.forEach((pose, i) => {
      const ref = py.poses[i];
      const tag = JSON.stringify(pose);
      expect(ref.ok, `SciPy did not close the loops at ${tag}: ${ref.maxResidual}`).toBe(true);
      const res = solver.solve({ ...zeroInputs(), ...pose }, false);
      expect(res.reached, `${tag}: ${res.message}`).toBe(true);
      const snap = takeSnapshot(solver.mechanism);
      for (const [id, p] of Object.entries(ref.points)) {
        const ours = snap.points[id];
        expect(ours, `${id} missing`).toBeDefined();
        const d = dist(ours, p);
        worst = Math.max(worst, d);
        compared++;
        expect(d, `${id} at ${tag}`).toBeLessThan(1e-6);
      }
      expect(solver.mechanism.coord[rocker] * (180 / Math.PI)).toBeCloseTo(ref.rockerDeg, 6);
    });
    report(`SciPy ${py.scipy}, lean linkage: max hardpoint diff (mm)`, worst);
    expect(compared).toBe(POSES.length * 25);
    // Not trivial: the frame moved sideways and the rocker turned.
    expect(Math.abs(py.poses[2].frame[0])).toBeGreaterThan(1);
    expect(Math.abs(py.poses[2].rockerDeg)).toBeGreaterThan(10);
    expect(worst).toBeLessThan(1e-6);
  });
});
