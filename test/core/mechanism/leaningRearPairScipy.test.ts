/**
 * Cross-check of the leaning rear pair against an independent formulation solved with SciPy
 * (scipy.optimize.least_squares, method 'trf'; test/scipy/solve_rear_pair.py), on the Plover
 * demo. The Python model takes only the frame's pose from our solve (the rear pair does not
 * move the frame: it has no pitch, and the front sets its height and lean) and shares no code
 * or unknowns with ours: each rear upright is a free rigid body (6 parameters), plus the
 * carrier's slide and the two member angles, with the constraints written from the physical
 * description. Rear joints, wheel centres, spin axes and tyre contact points must agree to
 * 1e-6 mm (and 1e-9 for the axes).
 *
 * Needs /usr/bin/python3 with SciPy (Debian package python3-scipy); without it this test fails
 * with a message saying what to install.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseDesignText } from '../../../core/design/validateDesign';
import { leaningRearSides, resolveDesign } from '../../../core/design/resolveDesign';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { report } from '../solver/report';

const PYTHON = '/usr/bin/python3';
const SCRIPT = fileURLToPath(new URL('../../scipy/solve_rear_pair.py', import.meta.url));
const DEMO = fileURLToPath(new URL('../../../assets/designs/plover-tilting-quad.tiltsheet', import.meta.url));

const POSES = [
  { leanDeg: 0, handlebarDeg: 0 },
  { leanDeg: 0, handlebarDeg: 25 },
  { leanDeg: 15, handlebarDeg: 0 },
  { leanDeg: -25, handlebarDeg: 0 },
  { leanDeg: 20, handlebarDeg: 10 },
  { leanDeg: 30, handlebarDeg: -15 },
  { leanDeg: -10, handlebarDeg: 20 },
  { leanDeg: -30, handlebarDeg: -30 },
];

type V3 = [number, number, number];
interface PyPose {
  maxResidual: number;
  points: Record<string, V3>;
  wheels: Record<'left' | 'right', { centre: V3; spinAxis: V3; contactPoint: V3 }>;
}

const v = (p: { x: number; y: number; z: number }): V3 => [p.x, p.y, p.z];
const dist = (a: ArrayLike<number>, b: ArrayLike<number>) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('leaning rear pair: SciPy cross-check of the Plover', () => {
  it('rear joints, wheel centres, spin axes and contacts agree with an independent least_squares solve', () => {
    const probe = spawnSync(PYTHON, ['-c', 'import scipy, numpy'], { encoding: 'utf8' });
    if (probe.error || probe.status !== 0) throw new Error(`needs ${PYTHON} with SciPy: apt-get install python3-scipy (${probe.error?.message ?? probe.stderr})`);
    const parsed = parseDesignText(readFileSync(DEMO, 'utf8'), DEMO);
    if (!parsed.ok) throw new Error('demo does not load');
    const design = resolveDesign(parsed.design);
    if (design.vehicle.rear.kind !== 'leaningPair') throw new Error('not a leaning pair');
    const r = leaningRearSides(design.vehicle.rear);
    const graph = buildMechanism(design);
    const solver = new PoseSolver(graph);
    const ours: { snap: ReturnType<typeof takeSnapshot>; axes: Record<'left' | 'right', V3> }[] = [];
    const frames: { rotation: number[][]; translation: V3 }[] = [];
    for (const p of POSES) {
      const res = solver.solve({ ...zeroInputs(), ...p }, false);
      expect(res.status, res.message).toBe('converged');
      const snap = takeSnapshot(solver.mechanism);
      const f = snap.bodies[graph.frameBody];
      frames.push({ rotation: [0, 1, 2].map((i) => [f.rotation[i], f.rotation[3 + i], f.rotation[6 + i]]), translation: f.translation });
      const axes = {} as Record<'left' | 'right', V3>;
      for (const w of graph.rearWheels!) {
        const a: V3 = [0, 0, 0];
        solver.mechanism.worldDirection(w.body, w.spinAxis, a);
        axes[w.side] = a;
      }
      ours.push({ snap, axes });
    }
    const doc = {
      upper: { pivot: v(r.upper.pivot), axis: v(r.upper.pivotAxis), outer: { left: v(r.upper.outerJoint.left), right: v(r.upper.outerJoint.right) } },
      lower: { pivot: v(r.lower.pivot), axis: v(r.lower.pivotAxis), outer: { left: v(r.lower.outerJoint.left), right: v(r.lower.outerJoint.right) } },
      wheelCentre: { left: v(r.wheelCentre.left), right: v(r.wheelCentre.right) },
      rolling: design.wheels.rear.rollingRadiusMm,
      crown: design.wheels.rear.crownRadiusMm,
      poses: frames,
    };
    const run = spawnSync(PYTHON, [SCRIPT], { input: JSON.stringify(doc), encoding: 'utf8', timeout: 120_000 });
    expect(run.status, run.stderr).toBe(0);
    const py = JSON.parse(run.stdout) as PyPose[];
    let worstPoint = 0;
    let worstAxis = 0;
    py.forEach((pp, i) => {
      const what = `lean ${POSES[i].leanDeg}, handlebar ${POSES[i].handlebarDeg}`;
      expect(pp.maxResidual, `${what}: SciPy residual`).toBeLessThan(1e-9);
      for (const [id, at] of Object.entries(pp.points)) {
        const d = dist(ours[i].snap.points[id], at);
        worstPoint = Math.max(worstPoint, d);
        expect(d, `${what}: ${id}`).toBeLessThan(1e-6);
      }
      for (const side of ['left', 'right'] as const) {
        const a = ours[i].axes[side];
        const d = dist(a, pp.wheels[side].spinAxis);
        worstAxis = Math.max(worstAxis, d);
        expect(d, `${what}: ${side} rear spin axis`).toBeLessThan(1e-9);
        // our contact: the wheel centre and axis through the same lowest-point rule as the analysis reports
        const c = ours[i].snap.points[`vehicle.rear.wheelCentre.${side}`];
        expect(Math.abs(pp.wheels[side].contactPoint[2]), `${what}: SciPy's ${side} contact height`).toBeLessThan(1e-6);
        expect(dist(c, pp.wheels[side].centre)).toBeLessThan(1e-6);
      }
    });
    // Negative control: SciPy starts from the rear pair moved rigidly with the frame; at a lean that
    // start is far from the answer, so agreement is the solve's, not the start's.
    const i20 = POSES.findIndex((p) => p.leanDeg === 20);
    const f = frames[i20];
    const w = r.wheelCentre.left;
    const start = [0, 1, 2].map((k) => f.rotation[k][0] * w.x + f.rotation[k][1] * w.y + f.rotation[k][2] * w.z + f.translation[k]);
    expect(dist(start, ours[i20].snap.points['vehicle.rear.wheelCentre.left'])).toBeGreaterThan(10);
    report('leaning rear pair vs SciPy: worst point distance (mm)', worstPoint);
    report('leaning rear pair vs SciPy: worst spin-axis difference', worstAxis);
  }, 120_000);
});
