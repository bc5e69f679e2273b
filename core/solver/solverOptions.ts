/**
 * The pose solver's options, their defaults, and the check every set of options passes before
 * a solve uses it. Like the option checks of mature least-squares solvers, the check runs up
 * front and names the option and the value found, so a zero step size or a negative tolerance
 * is reported as what it is instead of surfacing later as a "dead centre" or a stall.
 */

export interface PoseSolverOptions {
  /** Converged when every residual is below this, mm. */
  toleranceMm: number;
  maxIterations: number;
  /** Largest input change per continuation sub-step. */
  maxStepDeg: number;
  maxStepMm: number;
  /** Sub-steps are halved at most this many times when a step fails or jumps. */
  maxBisections: number;
  /** A residual left above this at a stationary point means the loop cannot close. */
  assemblyGapMm: number;
  /** Below this scaled pivot ratio (about 1/cond(J)^2) the pose is called singular. */
  singularPivotRatio: number;
}

export const DEFAULT_SOLVER_OPTIONS: Readonly<PoseSolverOptions> = Object.freeze({
  toleranceMm: 1e-9,
  maxIterations: 60,
  maxStepDeg: 4,
  maxStepMm: 20,
  maxBisections: 8,
  assemblyGapMm: 1e-6,
  singularPivotRatio: 1e-20,
});

/** What each option must be: a predicate on the value and the words for it. */
interface OptionRule {
  ok: (v: number) => boolean;
  must: string;
}

const positive: OptionRule = { ok: (v) => Number.isFinite(v) && v > 0, must: 'a finite number above 0' };
const nonNegative: OptionRule = { ok: (v) => Number.isFinite(v) && v >= 0, must: 'a finite number, 0 or more' };
const countFromOne: OptionRule = { ok: (v) => Number.isInteger(v) && v >= 1, must: 'a whole number, 1 or more' };
const countFromZero: OptionRule = { ok: (v) => Number.isInteger(v) && v >= 0, must: 'a whole number, 0 or more' };
// The scaled pivot ratio lies in [0, 1]; a threshold of 1 or more would call every pose singular.
const pivotRatio: OptionRule = { ok: (v) => Number.isFinite(v) && v >= 0 && v < 1, must: 'a number from 0 up to (not including) 1' };

const RULES: Readonly<Record<keyof PoseSolverOptions, OptionRule & { unit: string }>> = {
  toleranceMm: { ...positive, unit: ' (mm)' },
  maxIterations: { ...countFromOne, unit: '' },
  maxStepDeg: { ...positive, unit: ' (deg)' },
  maxStepMm: { ...positive, unit: ' (mm)' },
  maxBisections: { ...countFromZero, unit: '' },
  assemblyGapMm: { ...nonNegative, unit: ' (mm)' },
  singularPivotRatio: { ...pivotRatio, unit: '' },
};

function shown(v: unknown): string {
  return typeof v === 'string' ? JSON.stringify(v) : String(v);
}

/**
 * The first problem with a complete set of pose-solver options, in words naming the option,
 * the value found and what it must be; undefined when they are all usable. Pure: it only reads.
 */
export function solverOptionsProblem(options: Readonly<Record<string, unknown>>): string | undefined {
  for (const name of Object.keys(RULES) as Array<keyof PoseSolverOptions>) {
    const v = options[name];
    const rule = RULES[name];
    if (typeof v !== 'number' || !rule.ok(v)) {
      return `solver option ${name} is ${shown(v)}; it must be ${rule.must}${rule.unit}`;
    }
  }
  for (const name of Object.keys(options)) {
    if (!(name in RULES)) return `solver option ${name} is not one the pose solver knows (known: ${Object.keys(RULES).join(', ')})`;
  }
  return undefined;
}
