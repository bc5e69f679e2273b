/**
 * Rotation helpers (core/math/rotation.ts) checked against two independent libraries:
 * three.js (Matrix4.makeRotationAxis, Quaternion.setFromAxisAngle) and gl-matrix
 * (quat.setAxisAngle + mat3.fromQuat, mat3.multiply). Both libraries store matrices
 * column-major, like our helpers; three's Matrix4 is 4x4, so its rotation block is
 * elements[0..2], [4..6], [8..10].
 */
import { describe, it, expect } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { mat3, quat } from 'gl-matrix';
import {
  rotationFromVector,
  rotationAboutAxis,
  multiplyMat3,
  orthonormalize,
  vectorFromRotation,
  angleBetweenRotations,
} from '../../../core/math/rotation';
import { report } from '../solver/report';

/** Small seeded PRNG (mulberry32) so a failure can be replayed. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function randomUnit(r: () => number): [number, number, number] {
  // uniform on the sphere
  const z = 2 * r() - 1;
  const phi = 2 * Math.PI * r();
  const s = Math.sqrt(1 - z * z);
  return [s * Math.cos(phi), s * Math.sin(phi), z];
}

/** 3x3 rotation block of a three.js Matrix4, column-major. */
function threeBlock(m: Matrix4): number[] {
  const e = m.elements;
  return [e[0], e[1], e[2], e[4], e[5], e[6], e[8], e[9], e[10]];
}

function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>, n = 9): number {
  let d = 0;
  for (let i = 0; i < n; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  return d;
}

// Angles: ordinary, tiny, both sides of the series branches (rotationFromVector below
// 0.1 rad, vectorFromRotation below 0.02 rad), zero, negative, and close to pi.
const SPECIAL_ANGLES = [0, 1e-14, 1e-10, 3e-7, 9.99e-7, 1.0001e-6, 1e-5, 1e-3, 0.0199, 0.0201, 0.05, 0.0999, 0.1001, 0.5, 1, 2, 3, Math.PI - 1e-3, Math.PI - 1e-6, Math.PI, -0.7, -0.0999, -Math.PI + 1e-4];

function cases(seed: number, count: number): Array<{ axis: [number, number, number]; angle: number }> {
  const r = rng(seed);
  const out: Array<{ axis: [number, number, number]; angle: number }> = [];
  for (const angle of SPECIAL_ANGLES) for (let k = 0; k < 6; k++) out.push({ axis: randomUnit(r), angle });
  for (let k = 0; k < count; k++) out.push({ axis: randomUnit(r), angle: (2 * r() - 1) * Math.PI });
  // coordinate axes too
  for (const axis of [[1, 0, 0], [0, 1, 0], [0, 0, 1], [0, 0, -1]] as [number, number, number][]) out.push({ axis, angle: 0.3 });
  return out;
}

describe('rotationAboutAxis / rotationFromVector against three.js', () => {
  it('matches Matrix4.makeRotationAxis and the matrix of Quaternion.setFromAxisAngle', () => {
    let worst = 0;
    for (const { axis, angle } of cases(1, 400)) {
      const ours = new Float64Array(12);
      rotationAboutAxis(ours, 3, axis[0], axis[1], axis[2], angle); // at an offset, as the solver uses it
      // reference 1: three.js Matrix4.makeRotationAxis (Rodrigues, three.js source)
      const m = new Matrix4().makeRotationAxis(new Vector3(...axis), angle);
      // reference 2: three.js quaternion -> matrix
      const q = new Quaternion().setFromAxisAngle(new Vector3(...axis), angle);
      const mq = new Matrix4().makeRotationFromQuaternion(q);
      const a = ours.subarray(3, 12);
      worst = Math.max(worst, maxDiff(a, threeBlock(m)), maxDiff(a, threeBlock(mq)));
      expect(maxDiff(a, threeBlock(m))).toBeLessThan(1e-15 * 8);
      expect(maxDiff(a, threeBlock(mq))).toBeLessThan(1e-15 * 8);
      // rotationFromVector with the same axis*angle
      const v = new Float64Array(9);
      rotationFromVector(v, 0, axis[0] * angle, axis[1] * angle, axis[2] * angle);
      expect(maxDiff(v, a)).toBe(0);
    }
    report('rotation vs three.js makeRotationAxis/quaternion, max element diff', worst);
    expect(worst).toBeLessThan(1e-15 * 8);
  });

  it('rotates a vector like Vector3.applyQuaternion (column-major layout, right-hand rule)', () => {
    const r = rng(2);
    for (let k = 0; k < 200; k++) {
      const axis = randomUnit(r);
      const angle = (2 * r() - 1) * Math.PI;
      const p = [r() * 2 - 1, r() * 2 - 1, r() * 2 - 1];
      const R = new Float64Array(9);
      rotationAboutAxis(R, 0, axis[0], axis[1], axis[2], angle);
      const ours = [
        R[0] * p[0] + R[3] * p[1] + R[6] * p[2],
        R[1] * p[0] + R[4] * p[1] + R[7] * p[2],
        R[2] * p[0] + R[5] * p[1] + R[8] * p[2],
      ];
      const ref = new Vector3(p[0], p[1], p[2]).applyQuaternion(new Quaternion().setFromAxisAngle(new Vector3(...axis), angle));
      expect(maxDiff(ours, [ref.x, ref.y, ref.z], 3)).toBeLessThan(1e-15 * 8);
    }
    // Right-hand rule, by hand (ISO 8855 sign conventions rest on it): +90 deg about z takes x to y.
    const Rz = new Float64Array(9);
    rotationAboutAxis(Rz, 0, 0, 0, 1, Math.PI / 2);
    expect(maxDiff([Rz[0], Rz[1], Rz[2]], [0, 1, 0], 3)).toBeLessThan(1e-16 * 4);
  });
});

describe('rotationFromVector against gl-matrix', () => {
  it('matches mat3.fromQuat(quat.setAxisAngle(...)) in double precision', () => {
    // gl-matrix allocates Float32Array by default; passing Float64Array outputs keeps doubles.
    let worst = 0;
    for (const { axis, angle } of cases(3, 400)) {
      const q = quat.setAxisAngle(new Float64Array(4) as unknown as quat, axis, angle);
      const ref = mat3.fromQuat(new Float64Array(9) as unknown as mat3, q);
      const ours = new Float64Array(9);
      rotationFromVector(ours, 0, axis[0] * angle, axis[1] * angle, axis[2] * angle);
      const d = maxDiff(ours, ref as unknown as Float64Array);
      worst = Math.max(worst, d);
      expect(d).toBeLessThan(1e-15 * 8);
    }
    report('rotationFromVector vs gl-matrix fromQuat, max element diff', worst);
    expect(worst).toBeLessThan(1e-15 * 8);
  });

  it('multiplyMat3 equals mat3.multiply (out = a * b, column-major), at offsets', () => {
    const r = rng(4);
    for (let k = 0; k < 200; k++) {
      const a = new Float64Array(20);
      const b = new Float64Array(20);
      for (let i = 0; i < 20; i++) {
        a[i] = 10 * (r() - 0.5);
        b[i] = 10 * (r() - 0.5);
      }
      const out = new Float64Array(14);
      multiplyMat3(out, 5, a, 2, b, 7);
      const ref = mat3.multiply(new Float64Array(9) as unknown as mat3, a.slice(2, 11) as unknown as mat3, b.slice(7, 16) as unknown as mat3);
      expect(maxDiff(out.subarray(5), ref as unknown as Float64Array)).toBeLessThan(1e-13);
    }
  });

  it('composition of two rotations matches quaternion product (quat.multiply)', () => {
    const r = rng(5);
    for (let k = 0; k < 100; k++) {
      const a1 = randomUnit(r), t1 = (2 * r() - 1) * Math.PI;
      const a2 = randomUnit(r), t2 = (2 * r() - 1) * Math.PI;
      const R1 = new Float64Array(9), R2 = new Float64Array(9), R = new Float64Array(9);
      rotationAboutAxis(R1, 0, a1[0], a1[1], a1[2], t1);
      rotationAboutAxis(R2, 0, a2[0], a2[1], a2[2], t2);
      multiplyMat3(R, 0, R1, 0, R2, 0);
      const q1 = quat.setAxisAngle(new Float64Array(4) as unknown as quat, a1, t1);
      const q2 = quat.setAxisAngle(new Float64Array(4) as unknown as quat, a2, t2);
      const q = quat.multiply(new Float64Array(4) as unknown as quat, q1, q2);
      const ref = mat3.fromQuat(new Float64Array(9) as unknown as mat3, q);
      expect(maxDiff(R, ref as unknown as Float64Array)).toBeLessThan(1e-14);
    }
  });
});

describe('vectorFromRotation', () => {
  it('inverts rotationFromVector for angles below pi (tiny angles included)', () => {
    let worstAway = 0; // angles <= pi - 1e-3
    let worstNearPi = 0; // pi - 1e-3 < angle < pi
    for (const { axis, angle } of cases(6, 400)) {
      const t = Math.abs(angle);
      if (t >= Math.PI) continue; // at pi the axis sign is ambiguous: not invertible
      const w = [axis[0] * angle, axis[1] * angle, axis[2] * angle];
      const R = new Float64Array(9);
      rotationFromVector(R, 0, w[0], w[1], w[2]);
      const back = new Float64Array(3);
      vectorFromRotation(back, R, 0);
      const d = maxDiff(back, w, 3);
      if (t <= Math.PI - 1e-3 + 1e-12) {
        worstAway = Math.max(worstAway, d);
        expect(d).toBeLessThan(1e-12);
        // relative precision for tiny angles
        if (t > 0) expect(Math.hypot(back[0] - w[0], back[1] - w[1], back[2] - w[2]) / t).toBeLessThan(1e-9);
      } else {
        worstNearPi = Math.max(worstNearPi, d);
        // The skew-symmetric part is sin(t) * axis: near pi the axis is recovered with a
        // relative error of about eps / sin(t). Bound: 100 eps / (pi - t).
        expect(d).toBeLessThan((100 * 2.2e-16) / (Math.PI - t) + 1e-12);
      }
    }
    report('vectorFromRotation round trip, angle <= pi - 1e-3, max abs diff (rad)', worstAway);
    report('vectorFromRotation round trip, pi - 1e-3 < angle < pi, max abs diff (rad)', worstNearPi);
    expect(worstAway).toBeLessThan(1e-12);
  });

  it('gives the three.js quaternion angle and axis', () => {
    const r = rng(7);
    for (let k = 0; k < 200; k++) {
      const axis = randomUnit(r);
      const angle = (2 * r() - 1) * (Math.PI - 1e-2);
      const m = new Matrix4().makeRotationAxis(new Vector3(...axis), angle);
      const back = new Float64Array(3);
      vectorFromRotation(back, threeBlock(m), 0);
      // three's Quaternion.setFromRotationMatrix (Shepperd's method): angle = 2 acos(w)
      const q = new Quaternion().setFromRotationMatrix(m);
      const s = Math.sign(q.w) || 1;
      const half = Math.atan2(Math.hypot(q.x, q.y, q.z), Math.abs(q.w));
      const f = half < 1e-12 ? 2 : (2 * half) / Math.sin(half);
      const ref = [s * q.x * f, s * q.y * f, s * q.z * f];
      expect(maxDiff(back, ref, 3)).toBeLessThan(1e-12);
    }
  });
});

describe('orthonormalize', () => {
  it('leaves an exact rotation (three.js) unchanged', () => {
    const r = rng(8);
    for (let k = 0; k < 100; k++) {
      const axis = randomUnit(r);
      const m = threeBlock(new Matrix4().makeRotationAxis(new Vector3(...axis), (2 * r() - 1) * Math.PI));
      const a = Float64Array.from(m);
      orthonormalize(a, 0);
      expect(maxDiff(a, m)).toBeLessThan(1e-15 * 8);
    }
  });

  it('turns a drifted rotation into a proper rotation close to it', () => {
    const r = rng(9);
    for (let k = 0; k < 100; k++) {
      const axis = randomUnit(r);
      const exact = threeBlock(new Matrix4().makeRotationAxis(new Vector3(...axis), (2 * r() - 1) * Math.PI));
      const noisy = new Float64Array(12);
      for (let i = 0; i < 9; i++) noisy[i + 3] = exact[i] + 1e-6 * (2 * r() - 1);
      orthonormalize(noisy, 3);
      const m = noisy.subarray(3);
      // R^T R = I, via gl-matrix: mat3.multiply(transpose(R), R)
      const rt = mat3.transpose(new Float64Array(9) as unknown as mat3, m as unknown as mat3);
      const rtr = mat3.multiply(new Float64Array(9) as unknown as mat3, rt, m as unknown as mat3);
      expect(maxDiff(rtr as unknown as Float64Array, [1, 0, 0, 0, 1, 0, 0, 0, 1])).toBeLessThan(1e-15 * 8);
      expect(Math.abs(mat3.determinant(m as unknown as mat3) - 1)).toBeLessThan(1e-14);
      // within the noise of the exact rotation
      expect(maxDiff(m, exact)).toBeLessThan(1e-5);
      expect(angleBetweenRotations(m, 0, Float64Array.from(exact), 0)).toBeLessThan(1e-5);
    }
  });
});

describe('angleBetweenRotations', () => {
  it('equals the angle of three.js Quaternion.angleTo', () => {
    const r = rng(10);
    for (let k = 0; k < 100; k++) {
      const a1 = randomUnit(r), a2 = randomUnit(r);
      const t1 = (2 * r() - 1) * Math.PI, t2 = (2 * r() - 1) * Math.PI;
      const q1 = new Quaternion().setFromAxisAngle(new Vector3(...a1), t1);
      const q2 = new Quaternion().setFromAxisAngle(new Vector3(...a2), t2);
      const R1 = threeBlock(new Matrix4().makeRotationFromQuaternion(q1));
      const R2 = threeBlock(new Matrix4().makeRotationFromQuaternion(q2));
      const ours = angleBetweenRotations(R1, 0, R2, 0);
      // acos loses precision near 0 and pi; compare away from those ends
      const ref = q1.angleTo(q2);
      if (ref > 1e-3 && ref < Math.PI - 1e-3) expect(Math.abs(ours - ref)).toBeLessThan(1e-9);
    }
  });
});
