/**
 * Stated limits on every pose input and grid the CLI takes, refused up front (exit 2, the
 * limit named) instead of running without end: the solver reaches a pose by continuation in
 * sub-steps of at most 4 deg or 20 mm from the design pose, so `--steer 1e300` would ask for
 * about 1e299 of them. Each limit is far past anything a vehicle does (a road vehicle's lean
 * stays under 60 deg, a steering wheel turns under two turns each way, wheel travel is a few
 * hundred mm) and keeps one pose to a few hundred sub-steps.
 */
import { ArgError, numberOption, rangeOption, type ParsedArgs } from './args';

export interface InputLimit {
  /** The largest magnitude accepted. */
  most: number;
  unit: string;
}

export const POSE_INPUT_LIMITS = {
  leanDeg: { most: 90, unit: 'degrees' },
  handlebarDeg: { most: 1080, unit: 'degrees' },
  wheelAngleDeg: { most: 180, unit: 'degrees' },
  travelMm: { most: 1000, unit: 'mm' },
  heaveMm: { most: 1000, unit: 'mm' },
  speedKmh: { most: 400, unit: 'km/h' },
} as const satisfies Record<string, InputLimit>;

/** The limits in words, for help texts. */
export const POSE_LIMITS_HELP =
  `Limits: lean within +-${POSE_INPUT_LIMITS.leanDeg.most} deg, handlebar within +-${POSE_INPUT_LIMITS.handlebarDeg.most} deg (three turns), ` +
  `road-wheel angle within +-${POSE_INPUT_LIMITS.wheelAngleDeg.most} deg, travel and heave within +-${POSE_INPUT_LIMITS.travelMm.most} mm, ` +
  `speed at most ${POSE_INPUT_LIMITS.speedKmh.most} km/h; beyond them the input is refused (exit 2).`;

/** Most poses one `sweep` or `check` grid may hold (solved at about 20,000 poses a second). */
export const MAX_GRID_POSES = 1_000_000;

/** Throw an ArgError naming the option and the limit when |value| is past it. */
export function requireWithin(value: number, limit: InputLimit, what: string): number {
  if (!(Math.abs(value) <= limit.most)) {
    throw new ArgError(`${what}: ${value} ${limit.unit} is past the limit of ${limit.most} ${limit.unit} each way`);
  }
  return value;
}

/** A number option within its limit (the fallback when absent). */
export function limitedOption(args: ParsedArgs, name: string, limit: InputLimit, fallback: number): number {
  return requireWithin(numberOption(args, name, limit.unit, fallback), limit, `option --${name}`);
}

/** A range option `A:B:STEP` whose every value is within the limit. */
export function limitedRange(args: ParsedArgs, name: string, limit: InputLimit): number[] | undefined {
  const values = rangeOption(args, name, limit.unit);
  if (values) for (const v of values) requireWithin(v, limit, `option --${name}`);
  return values;
}

/** Refuse a grid larger than MAX_GRID_POSES, saying how to make it smaller. */
export function requireGridSize(poses: number, what: string, remedy: string): void {
  if (!(poses <= MAX_GRID_POSES)) {
    throw new ArgError(`${what} has ${poses.toLocaleString('en-GB')} poses; at most ${MAX_GRID_POSES.toLocaleString('en-GB')} are taken: ${remedy}`);
  }
}
