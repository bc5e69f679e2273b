/**
 * Manufacturing tolerances of the hardpoints: a +- band in mm per point and axis, and how a
 * built vehicle's errors are drawn from it.
 *
 * Every point of every side is made separately, so each side's point and each axis gets its
 * own independent error (mirrored pairs do not move together here). Two distributions:
 *
 *   normal   the band is 3 standard deviations (sigma = band / 3): 99.73 % of parts inside it
 *   uniform  every error in -band..band equally likely (sigma = band / sqrt 3)
 */

import type { DesignFile } from '../design/types';
import { AXES, studyCoordinates, type Axis, type StudyCoordinate } from './studyCoordinates';
import type { SeededRandom } from './seededRandom';
import { StudyInputError } from './studyPoses';

export type Distribution = 'normal' | 'uniform';

export const DISTRIBUTION_WORDS: Record<Distribution, string> = {
  normal: 'normal, the band being 3 standard deviations (99.73 % of parts inside it)',
  uniform: 'uniform over the band (standard deviation = band / sqrt 3)',
};

/** Largest band accepted, mm: beyond it the errors are a different design, not a tolerance. */
export const MAX_BAND_MM = 5;

export interface ToleranceBands {
  /** +- band of every hardpoint coordinate, mm. */
  defaultMm: number;
  /**
   * Bands of particular points, mm: by field path (both sides, 'frontEnd.lower.outerJoint') or
   * with a side ('upright.wheelCentre.right'); a number for all three axes or one per axis.
   */
  points?: Record<string, number | Partial<Record<Axis, number>>>;
}

export interface ToleranceCoordinate {
  coordinate: StudyCoordinate;
  bandMm: number;
  sigmaMm: number;
}

export function sigmaOf(bandMm: number, distribution: Distribution): number {
  return distribution === 'normal' ? bandMm / 3 : bandMm / Math.sqrt(3);
}

function checkBand(value: unknown, where: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0 || value > MAX_BAND_MM) {
    throw new StudyInputError(`${where}: a band is a number of mm from 0 to ${MAX_BAND_MM}, found ${JSON.stringify(value)}`);
  }
  return value;
}

/** Each side's coordinates with their bands (those with a band of 0 left out); unknown points refused. */
export function toleranceCoordinates(file: DesignFile, bands: ToleranceBands, distribution: Distribution): ToleranceCoordinate[] {
  const coords = studyCoordinates(file, 'each');
  checkBand(bands.defaultMm, 'the band');
  const points = bands.points ?? {};
  const known = new Set(coords.flatMap((c) => [c.key, c.side === 'left' || c.side === 'right' ? `${c.key}.${c.side}` : c.key]));
  for (const [key, value] of Object.entries(points)) {
    if (!known.has(key)) throw new StudyInputError(`"${key}" is not a hardpoint of this design`);
    if (typeof value === 'number') checkBand(value, key);
    else if (typeof value === 'object' && value !== null) {
      for (const [axis, v] of Object.entries(value)) {
        if (!(AXES as readonly string[]).includes(axis)) throw new StudyInputError(`${key}: "${axis}" is not an axis (x, y or z)`);
        checkBand(v, `${key} ${axis}`);
      }
    } else throw new StudyInputError(`${key}: expected a band in mm or one per axis, found ${JSON.stringify(value)}`);
  }
  const bandOf = (entry: number | Partial<Record<Axis, number>> | undefined, axis: Axis): number | undefined =>
    typeof entry === 'number' ? entry : entry?.[axis];
  const out: ToleranceCoordinate[] = [];
  for (const c of coords) {
    const sided = c.side === 'left' || c.side === 'right' ? points[`${c.key}.${c.side}`] : undefined;
    const bandMm = bandOf(sided, c.axis) ?? bandOf(points[c.key], c.axis) ?? bands.defaultMm;
    if (bandMm > 0) out.push({ coordinate: c, bandMm, sigmaMm: sigmaOf(bandMm, distribution) });
  }
  return out;
}

/** One built vehicle's errors, mm, in the order of the coordinates (drawn in that order, so a seed reproduces them). */
export function drawErrors(coords: readonly ToleranceCoordinate[], distribution: Distribution, rng: SeededRandom, out: Float64Array): Float64Array {
  for (let i = 0; i < coords.length; i++) {
    out[i] = distribution === 'normal' ? coords[i].sigmaMm * rng.normal() : coords[i].bandMm * (2 * rng.uniform() - 1);
  }
  return out;
}
