/**
 * The pose solver's predictor along straight sweeps.
 *
 * (a) The least-squares extrapolation weights (degree 7 through 10 evenly spaced poses)
 *     against NumPy's polyfit/polyval (Debian python3-numpy, pulled in by python3-scipy): the
 *     same fit done by an independent library, applied to random data, must give the same
 *     extrapolated value. Also the defining property: a polynomial of degree 7 or less is
 *     reproduced exactly.
 * (b) Along the Heron demo's lean x steer serpentine, warm solves must keep converging to the
 *     1e-9 mm tolerance on the same branch as solves taken in small cold-started steps
 *     (the predictor only guesses; the corrector must still land on the same pose).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { leastSquaresExtrapolation, PoseSolver } from '../../../core/solver/PoseSolver';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { demoDesign } from './designs';
import { report } from './report';

const PYTHON = '/usr/bin/python3';

describe('least-squares extrapolation weights', () => {
  const w = leastSquaresExtrapolation(10, 7);

  it('reproduce every polynomial of degree 7 or less at t = 0 from t = -10..-1', () => {
    for (let p = 0; p <= 7; p++) {
      let s = 0;
      let scale = 0;
      for (let j = 0; j < 10; j++) {
        const t = j - 10;
        s += w[j] * t ** p;
        scale += Math.abs(w[j] * t ** p);
      }
      expect(Math.abs(s - (p === 0 ? 1 : 0)) / scale, `degree ${p}`).toBeLessThan(1e-14);
    }
    // negative control: degree 8 is not reproduced (the fit is of degree 7)
    let s8 = 0;
    for (let j = 0; j < 10; j++) s8 += w[j] * (j - 10) ** 8;
    expect(Math.abs(s8)).toBeGreaterThan(1);
  });

  it('agree with numpy.polyfit(deg=7) + polyval(0) on random data', () => {
    const data = Array.from({ length: 20 }, (_, r) => Array.from({ length: 10 }, (_, j) => Math.sin(1.7 * r + 0.37 * j * j) + 0.1 * j));
    const py = spawnSync(
      PYTHON,
      ['-c', 'import json,sys,numpy as np\nd=json.load(sys.stdin)\nt=np.arange(-10,0)\nprint(json.dumps([float(np.polyval(np.polyfit(t,np.array(y),7),0.0)) for y in d]))'],
      { input: JSON.stringify(data), encoding: 'utf8' },
    );
    if (py.status !== 0) throw new Error(`needs ${PYTHON} with NumPy (Debian: apt-get install python3-scipy): ${py.stderr || py.error}`);
    const want = JSON.parse(py.stdout) as number[];
    let worst = 0;
    data.forEach((y, r) => {
      const ours = y.reduce((s, v, j) => s + w[j] * v, 0);
      worst = Math.max(worst, Math.abs(ours - want[r]));
    });
    report('least-squares extrapolation vs numpy.polyfit, max abs diff', worst);
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('predictor along a sweep', () => {
  it('warm solves along the Heron serpentine match small-step cold solves on every pose', () => {
    const graph = buildMechanism(demoDesign('heron-tilting-velomobile'), { contact: 'ground', steerBy: 'handlebar' });
    const warm = new PoseSolver(graph);
    const check = new PoseSolver(graph);
    const inputs = zeroInputs();
    let worst = 0;
    let poses = 0;
    for (let row = 0; row <= 8; row++) {
      inputs.leanDeg = -20 + 5 * row;
      for (let k = 0; k <= 40; k++) {
        inputs.handlebarDeg = row % 2 === 0 ? -20 + k : 20 - k;
        const r = warm.solve(inputs);
        expect(r.status, JSON.stringify(inputs)).toBe('converged');
        expect(r.residualMm!).toBeLessThan(1e-9);
        // every fifth pose: an independent cold solve (continuation from the design pose)
        if (k % 5 === 0) {
          const c = check.solve(inputs, false);
          expect(c.status).toBe('converged');
          const a = new Float64Array(graph.bodies.length);
          const b = new Float64Array(graph.bodies.length);
          const sa = new Float64Array(9 * graph.bodies.length);
          const sb = new Float64Array(9 * graph.bodies.length);
          warm.mechanism.getState(a, sa);
          check.mechanism.getState(b, sb);
          for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
          for (let i = 0; i < sa.length; i++) worst = Math.max(worst, Math.abs(sa[i] - sb[i]));
          poses++;
        }
      }
    }
    report(`warm vs cold solves along the serpentine (${poses} poses), max state diff`, worst);
    expect(worst).toBeLessThan(1e-9);
  });
});
