/**
 * Pose inputs as vectors: the pose solver reads the input record by name once and then works
 * on a Float64Array in INPUT_NAMES order, so its loops index instead of keying by name. Here
 * are that reading and the small geometry of input space the solver and its predictor use
 * (steps along a line, reversing, lying beyond a point). All allocation-free except where a
 * function returns a record or a string for output.
 */

import { INPUT_NAMES, type PoseInputs } from '../mechanism/MechanismGraph';

export const N_INPUTS = INPUT_NAMES.length;

/** Which inputs are angles (stepped in degrees) rather than lengths (mm). */
export const INPUT_IS_DEG: readonly boolean[] = INPUT_NAMES.map((n) => n.endsWith('Deg'));

// readInputs reads the record in this order by name; keep them in step with INPUT_NAMES.
if (INPUT_NAMES.join() !== 'leanDeg,heaveMm,handlebarDeg,travelRightMm,travelLeftMm,wheelAngleDeg') {
  throw new Error('inputVector: INPUT_NAMES order changed; update readInputs()');
}

/** Copy an input record into a vector in INPUT_NAMES order (by name, once per solve). */
export function readInputs(out: Float64Array, inputs: PoseInputs): void {
  out[0] = inputs.leanDeg;
  out[1] = inputs.heaveMm;
  out[2] = inputs.handlebarDeg;
  out[3] = inputs.travelRightMm;
  out[4] = inputs.travelLeftMm;
  out[5] = inputs.wheelAngleDeg;
}

/**
 * Whether the step a -> b and the step b -> target point the same way; if so, out receives
 * the length of a -> b and the ratio |b -> target| / |a -> b| (a typed array, not a new
 * object, so the predictor allocates nothing).
 */
export function collinearStep(a: Float64Array, b: Float64Array, target: Float64Array, out: Float64Array): boolean {
  let dot = 0;
  let n1 = 0;
  let n2 = 0;
  for (let k = 0; k < N_INPUTS; k++) {
    const s1 = b[k] - a[k];
    const s2 = target[k] - b[k];
    dot += s1 * s2;
    n1 += s1 * s1;
    n2 += s2 * s2;
  }
  if (!(n1 > 0) || !(n2 > 0) || dot < 0.9999 * Math.sqrt(n1 * n2)) return false;
  out[0] = Math.sqrt(n1);
  out[1] = Math.sqrt(n2 / n1);
  return true;
}

/** Whether `target` lies on the ray from `origin` through `failed`, at or past it. */
export function liesBeyond(origin: Float64Array, failed: Float64Array, target: Float64Array): boolean {
  let dot = 0;
  let nf = 0;
  let nt = 0;
  for (let k = 0; k < N_INPUTS; k++) {
    const f = failed[k] - origin[k];
    const t = target[k] - origin[k];
    dot += f * t;
    nf += f * f;
    nt += t * t;
  }
  return nf > 0 && dot >= 0.9999 * Math.sqrt(nf * nt) && nt >= nf;
}

/** How far back toward `prev` the target lies from `good`: |target - good| / |prev - good|. */
export function backFraction(good: Float64Array, prev: Float64Array, target: Float64Array): number {
  let n1 = 0;
  let n2 = 0;
  for (let k = 0; k < N_INPUTS; k++) {
    const d1 = good[k] - prev[k];
    const d2 = target[k] - good[k];
    n1 += d1 * d1;
    n2 += d2 * d2;
  }
  return Math.sqrt(n2 / n1);
}

/** Whether the target lies back along the step prev -> good (the two steps antiparallel). */
export function reverses(good: Float64Array, prev: Float64Array, target: Float64Array): boolean {
  let dot = 0;
  let n1 = 0;
  let n2 = 0;
  for (let k = 0; k < N_INPUTS; k++) {
    const d1 = good[k] - prev[k];
    const d2 = target[k] - good[k];
    dot += d1 * d2;
    n1 += d1 * d1;
    n2 += d2 * d2;
  }
  return n1 > 0 && n2 > 0 && dot <= -0.9999 * Math.sqrt(n1 * n2);
}

export function inputDistance(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < N_INPUTS; k++) s += (b[k] - a[k]) * (b[k] - a[k]);
  return Math.sqrt(s);
}

export function sameVector(a: Float64Array, b: Float64Array): boolean {
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}

/** out = a + s (b - a), exactly b at s >= 1. */
export function interpolateInputs(out: Float64Array, a: Float64Array, b: Float64Array, s: number): void {
  for (let k = 0; k < N_INPUTS; k++) out[k] = s >= 1 ? b[k] : a[k] + (b[k] - a[k]) * s;
}

/** The input record of a vector (allocates: for output). */
export function vectorToInputs(v: Float64Array): PoseInputs {
  const out = {} as PoseInputs;
  for (let k = 0; k < N_INPUTS; k++) out[INPUT_NAMES[k]] = v[k];
  return out;
}

/** The inputs in words, for messages. */
export function describeInputs(v: Float64Array): string {
  const t = vectorToInputs(v);
  return `lean ${t.leanDeg.toFixed(1)} deg, handlebar ${t.handlebarDeg.toFixed(1)} deg, heave ${t.heaveMm.toFixed(1)} mm, travel R/L ${t.travelRightMm.toFixed(1)}/${t.travelLeftMm.toFixed(1)} mm`;
}
