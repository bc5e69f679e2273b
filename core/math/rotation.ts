/**
 * Rotation helpers on column-major 3x3 matrices (the gl-matrix `mat3` layout), working
 * on any indexable array at an offset so the solver can keep every body's pose in one
 * preallocated Float64Array. Allocation-free: the output comes first and is returned.
 */

export type Mat3Like = { [index: number]: number; length: number };

/**
 * Rodrigues' formula: rotation by the vector (wx, wy, wz) (axis times angle, radians).
 * R = I + sin(t)/t K + (1 - cos(t))/t^2 K^2, with K the cross-product matrix.
 * Writes a column-major matrix at out[o..o+8].
 */
export function rotationFromVector(out: Mat3Like, o: number, wx: number, wy: number, wz: number): Mat3Like {
  const w = vectorScratch;
  w[0] = wx;
  w[1] = wy;
  w[2] = wz;
  return rotationFromVectorAt(out, o, w, 0);
}
const vectorScratch = new Float64Array(3);

/**
 * The same, reading the vector from w[wo..wo+2]. The solver's loops call this form: a call
 * V8 does not inline boxes every number argument on the heap, an array does not.
 */
export function rotationFromVectorAt(out: Mat3Like, o: number, w: Mat3Like, wo: number): Mat3Like {
  const wx = w[wo], wy = w[wo + 1], wz = w[wo + 2];
  const t2 = wx * wx + wy * wy + wz * wz;
  let a: number;
  let b: number;
  if (t2 < 1e-2) {
    // Below 0.1 rad (every solver step and predictor move) the Taylor series of sin(t)/t and
    // (1 - cos t)/t^2 to t^8 is exact to rounding (next terms t^10/11! and t^10/12!, under
    // 3e-18) and cheaper than sin and cos; it also keeps full precision for tiny angles.
    a = 1 - (t2 / 6) * (1 - (t2 / 20) * (1 - (t2 / 42) * (1 - t2 / 72)));
    b = 0.5 * (1 - (t2 / 12) * (1 - (t2 / 30) * (1 - (t2 / 56) * (1 - t2 / 90))));
  } else {
    const t = Math.sqrt(t2);
    a = Math.sin(t) / t;
    b = (1 - Math.cos(t)) / t2;
  }
  // column-major: out[o + col*3 + row]
  out[o + 0] = 1 - b * (wy * wy + wz * wz);
  out[o + 1] = a * wz + b * wx * wy;
  out[o + 2] = -a * wy + b * wx * wz;
  out[o + 3] = -a * wz + b * wx * wy;
  out[o + 4] = 1 - b * (wx * wx + wz * wz);
  out[o + 5] = a * wx + b * wy * wz;
  out[o + 6] = a * wy + b * wx * wz;
  out[o + 7] = -a * wx + b * wy * wz;
  out[o + 8] = 1 - b * (wx * wx + wy * wy);
  return out;
}

/** Rotation by `angle` radians about the unit axis (ax, ay, az). Axis must be unit length. */
export function rotationAboutAxis(out: Mat3Like, o: number, ax: number, ay: number, az: number, angle: number): Mat3Like {
  return rotationFromVector(out, o, ax * angle, ay * angle, az * angle);
}

/** out = a * b for column-major 3x3 matrices at offsets. `out` must not alias a or b. */
export function multiplyMat3(out: Mat3Like, o: number, a: Mat3Like, ao: number, b: Mat3Like, bo: number): Mat3Like {
  for (let c = 0; c < 3; c++) {
    const b0 = b[bo + c * 3];
    const b1 = b[bo + c * 3 + 1];
    const b2 = b[bo + c * 3 + 2];
    out[o + c * 3] = a[ao] * b0 + a[ao + 3] * b1 + a[ao + 6] * b2;
    out[o + c * 3 + 1] = a[ao + 1] * b0 + a[ao + 4] * b1 + a[ao + 7] * b2;
    out[o + c * 3 + 2] = a[ao + 2] * b0 + a[ao + 5] * b1 + a[ao + 8] * b2;
  }
  return out;
}

/** Angle (radians) of the rotation a * b^T between two rotation matrices. */
export function angleBetweenRotations(a: Mat3Like, ao: number, b: Mat3Like, bo: number): number {
  // trace(a b^T) = sum_ij a_ij b_ij
  let tr = 0;
  for (let i = 0; i < 9; i++) tr += a[ao + i] * b[bo + i];
  const c = Math.min(1, Math.max(-1, (tr - 1) / 2));
  return Math.acos(c);
}

/** Re-orthonormalise a rotation matrix in place (Gram-Schmidt on columns) to stop drift. */
export function orthonormalize(m: Mat3Like, o: number): void {
  let x0 = m[o], x1 = m[o + 1], x2 = m[o + 2];
  let n = Math.sqrt(x0 * x0 + x1 * x1 + x2 * x2);
  x0 /= n; x1 /= n; x2 /= n;
  let y0 = m[o + 3], y1 = m[o + 4], y2 = m[o + 5];
  const d = x0 * y0 + x1 * y1 + x2 * y2;
  y0 -= d * x0; y1 -= d * x1; y2 -= d * x2;
  n = Math.sqrt(y0 * y0 + y1 * y1 + y2 * y2);
  y0 /= n; y1 /= n; y2 /= n;
  m[o] = x0; m[o + 1] = x1; m[o + 2] = x2;
  m[o + 3] = y0; m[o + 4] = y1; m[o + 5] = y2;
  m[o + 6] = x1 * y2 - x2 * y1;
  m[o + 7] = x2 * y0 - x0 * y2;
  m[o + 8] = x0 * y1 - x1 * y0;
}

export const DEG = Math.PI / 180;

/**
 * Rotation vector (axis times angle) of a column-major rotation matrix: the inverse of
 * `rotationFromVector` for angles below pi. Writes out[0..2].
 */
export function vectorFromRotation(out: Mat3Like, m: Mat3Like, o: number): Mat3Like {
  // skew part: (R21 - R12, R02 - R20, R10 - R01) / 2 = sin(t) * axis; column-major R_rc = m[o + c*3 + r]
  const sx = (m[o + 5] - m[o + 7]) / 2;
  const sy = (m[o + 6] - m[o + 2]) / 2;
  const sz = (m[o + 1] - m[o + 3]) / 2;
  const c = Math.min(1, Math.max(-1, (m[o] + m[o + 4] + m[o + 8] - 1) / 2));
  const s2 = sx * sx + sy * sy + sz * sz;
  let k: number;
  if (s2 < 4e-4 && c > 0) {
    // Below 0.02 rad, t / sin(t) = asin(s)/s = 1 + s^2/6 + 3s^4/40 + 5s^6/112 + 35s^8/1152
    // (Maclaurin series of arcsin) is exact to rounding (next term 63 s^10/2816 < 3e-19).
    k = 1 + s2 * (1 / 6 + s2 * (3 / 40 + s2 * (5 / 112 + s2 * (35 / 1152))));
  } else {
    const s = Math.sqrt(s2);
    const t = Math.atan2(s, c);
    k = s < 1e-12 ? 1 + (t * t) / 6 : t / s;
  }
  out[0] = sx * k;
  out[1] = sy * k;
  out[2] = sz * k;
  return out;
}
