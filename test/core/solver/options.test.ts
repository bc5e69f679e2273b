/**
 * Solver options are checked up front: an unusable value ends every solve with
 * 'invalid-input' and a message naming the option and the value found, before any work is
 * done, instead of showing up later as a "dead centre" (maxStepDeg 0 split the input change
 * into infinitely many pieces), a stall (a negative tolerance can never be met) or "no
 * convergence in 0 iterations". The rules are the options' own definitions (a tolerance or
 * step size must be a finite positive length or angle, an iteration cap a whole number of at
 * least one, a pivot-ratio threshold inside the ratio's range [0, 1)), as in the option
 * checks of mature least-squares solvers; common practice, no source beyond that.
 */
import { describe, expect, it } from 'vitest';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { DEFAULT_SOLVER_OPTIONS, PoseSolver, solverOptionsProblem, type PoseSolverOptions } from '../../../core/solver/PoseSolver';
import { LevenbergMarquardt, lmOptionsProblem, type LeastSquaresProblem } from '../../../core/solver/levenbergMarquardt';
import { takeSnapshot } from '../../../core/analysis/poseSnapshot';
import { demoDesign } from './designs';

const heron = demoDesign('heron-tilting-velomobile');
const target = { ...zeroInputs(), leanDeg: 10, handlebarDeg: 5 };

/** One bad value per row: the option, the value, how the value reads in the message. */
const BAD: Array<[keyof PoseSolverOptions, unknown, string]> = [
  ['maxStepDeg', 0, '0'],
  ['maxStepDeg', -4, '-4'],
  ['maxStepDeg', NaN, 'NaN'],
  ['maxStepDeg', Infinity, 'Infinity'],
  ['maxStepMm', 0, '0'],
  ['maxStepMm', -20, '-20'],
  ['toleranceMm', 0, '0'],
  ['toleranceMm', -1e-9, '-1e-9'],
  ['toleranceMm', NaN, 'NaN'],
  ['toleranceMm', Infinity, 'Infinity'],
  ['maxIterations', 0, '0'],
  ['maxIterations', -5, '-5'],
  ['maxIterations', 2.5, '2.5'],
  ['maxIterations', Infinity, 'Infinity'],
  ['maxBisections', -1, '-1'],
  ['maxBisections', 1.5, '1.5'],
  ['assemblyGapMm', -1e-6, '-0.000001'],
  ['assemblyGapMm', NaN, 'NaN'],
  ['singularPivotRatio', -1, '-1'],
  ['singularPivotRatio', 1, '1'],
  ['singularPivotRatio', NaN, 'NaN'],
  ['toleranceMm', undefined, 'undefined'],
  ['maxStepDeg', '4', '"4"'],
];

describe('solverOptionsProblem', () => {
  it('passes the defaults and edge values that are usable', () => {
    expect(solverOptionsProblem(DEFAULT_SOLVER_OPTIONS)).toBeUndefined();
    expect(solverOptionsProblem({ ...DEFAULT_SOLVER_OPTIONS, maxBisections: 0, assemblyGapMm: 0, singularPivotRatio: 0, maxIterations: 1 })).toBeUndefined();
  });

  for (const [name, value, shown] of BAD) {
    it(`${name} = ${shown}: names the option and the value`, () => {
      const problem = solverOptionsProblem({ ...DEFAULT_SOLVER_OPTIONS, [name]: value });
      expect(problem).toBeDefined();
      expect(problem).toContain(`solver option ${name} is ${shown};`);
    });
  }

  it('an option the solver does not know is named', () => {
    expect(solverOptionsProblem({ ...DEFAULT_SOLVER_OPTIONS, maxStepDegree: 4 })).toMatch(/^solver option maxStepDegree is not one the pose solver knows/);
  });
});

describe('PoseSolver with unusable options', () => {
  for (const [name, value, shown] of BAD) {
    it(`${name} = ${shown}: every solve ends 'invalid-input' naming it, nothing moved`, () => {
      const solver = new PoseSolver(buildMechanism(heron), { [name]: value } as Partial<PoseSolverOptions>);
      const before = takeSnapshot(solver.mechanism);
      for (const warm of [true, false]) {
        const res = solver.solve(target, warm);
        expect(res.status).toBe('invalid-input');
        expect(res.reached).toBe(false);
        expect(res.residualMm).toBeNull();
        expect(res.iterations).toBe(0);
        expect(res.evaluations).toBe(0);
        expect(res.message).toContain(`solver option ${name} is ${shown};`);
        expect(res.message).not.toMatch(/dead centre/);
      }
      // the mechanism still holds the design pose
      expect(takeSnapshot(solver.mechanism)).toEqual(before);
    });
  }

  it('negative control: the same design and inputs with usable options converge', () => {
    const solver = new PoseSolver(buildMechanism(heron), { maxStepDeg: 1, toleranceMm: 1e-10, maxBisections: 0 });
    expect(solver.solve(target).status).toBe('converged');
  });

  it('the options in force cannot be changed behind the check', () => {
    const solver = new PoseSolver(buildMechanism(heron));
    expect(() => {
      (solver.options as PoseSolverOptions).maxStepDeg = 0;
    }).toThrow(TypeError);
    expect(solver.options.maxStepDeg).toBe(DEFAULT_SOLVER_OPTIONS.maxStepDeg);
  });
});

/** r(x) = x - 3 in one unknown, counting residual evaluations. */
function lineProblem(): LeastSquaresProblem & { x: number; calls: number } {
  let saved = 0;
  return {
    nVars: 1,
    nResiduals: 1,
    x: 0,
    calls: 0,
    residuals(r) {
      this.calls++;
      r[0] = this.x - 3;
      return true;
    },
    jacobian(j) {
      j[0] = 1;
    },
    step(h) {
      this.x += h[0];
    },
    save() {
      saved = this.x;
    },
    restore() {
      this.x = saved;
    },
  };
}

describe('LevenbergMarquardt options', () => {
  const good = { tolerance: 1e-12, maxIterations: 20, tau: 1e-3 };
  const bad: Array<[string, object, string]> = [
    ['tolerance', { tolerance: 0 }, 'tolerance is 0;'],
    ['tolerance', { tolerance: -1 }, 'tolerance is -1;'],
    ['tolerance', { tolerance: NaN }, 'tolerance is NaN;'],
    ['maxIterations', { maxIterations: 0 }, 'maxIterations is 0;'],
    ['maxIterations', { maxIterations: 1.5 }, 'maxIterations is 1.5;'],
    ['tau', { tau: 0 }, 'tau is 0;'],
    ['tau', { tau: Infinity }, 'tau is Infinity;'],
  ];
  for (const [name, change, words] of bad) {
    it(`${JSON.stringify(change)}: 'invalid-input' naming ${name}, nothing evaluated`, () => {
      const opts = { ...good, ...change };
      expect(lmOptionsProblem(opts)).toContain(words);
      const p = lineProblem();
      const out = new LevenbergMarquardt(p).solve(opts);
      expect(out.ending).toBe('invalid-input');
      expect(out.problem).toContain(`LM option ${words}`);
      expect(out.evaluations).toBe(0);
      expect(p.calls).toBe(0);
      expect(p.x).toBe(0);
    });
  }

  it('negative control: usable options solve the line problem to x = 3', () => {
    expect(lmOptionsProblem(good)).toBeUndefined();
    const p = lineProblem();
    const out = new LevenbergMarquardt(p).solve(good);
    expect(out.ending).toBe('converged');
    expect(out.problem).toBe('');
    // the exact root of x - 3, to the requested tolerance
    expect(Math.abs(p.x - 3)).toBeLessThan(good.tolerance);
  });
});
