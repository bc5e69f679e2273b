/**
 * Bench-only adapter: the pose solver's unknowns as one flat parameter vector, so a
 * general-purpose least-squares routine (which knows nothing of rotation manifolds) can
 * drive a CompiledMechanism.
 *
 * Layout, in body order (the order CompiledMechanism numbers its unknowns): one entry per
 * solved revolute or prismatic joint (radians, mm), three per spherical joint: the rotation
 * vector theta with S = exp(theta^), i.e. applied to the design state (S = I at theta = 0).
 * Driven joints are not parameters; they follow the mechanism's current inputs.
 *
 * Jacobian: CompiledMechanism differentiates a spherical joint with respect to a left
 * increment, S <- exp(delta^) S. For the flat parameters, exp((theta + d)^) is
 * exp((J_l(theta) d)^) exp(theta^) to first order, with J_l the left Jacobian of SO(3), so
 * the parameter columns are the mechanism's columns times J_l(theta).
 */

import type { CompiledMechanism } from '../../core/solver/CompiledMechanism';
import { rotationFromVector, vectorFromRotation } from '../../core/math/rotation';

export class FlatParameters {
  readonly mechanism: CompiledMechanism;
  /** Number of flat parameters (equals mechanism.nVars). */
  readonly nParams: number;
  readonly nResiduals: number;
  /** Per body: first parameter, or -1 when the joint is driven. */
  private readonly firstParam: Int32Array;
  private readonly spherical: Uint8Array;
  private readonly coordBuf: Float64Array;
  private readonly sphBuf: Float64Array;
  private readonly jacBuf: Float64Array;
  private readonly rBuf: Float64Array;
  private readonly w = new Float64Array(3);

  constructor(mechanism: CompiledMechanism) {
    this.mechanism = mechanism;
    const joints = mechanism.graph.joints;
    const nb = mechanism.nBodies;
    this.firstParam = new Int32Array(nb);
    this.spherical = new Uint8Array(nb);
    let k = 0;
    for (let b = 0; b < nb; b++) {
      const j = joints[b];
      this.spherical[b] = j.kind === 'spherical' ? 1 : 0;
      if (j.driver) {
        this.firstParam[b] = -1;
      } else {
        this.firstParam[b] = k;
        k += j.kind === 'spherical' ? 3 : 1;
      }
    }
    if (k !== mechanism.nVars) {
      throw new Error(`flat parameter layout has ${k} entries but the mechanism has ${mechanism.nVars} unknowns`);
    }
    this.nParams = k;
    this.nResiduals = mechanism.nResiduals;
    this.coordBuf = new Float64Array(nb);
    this.sphBuf = new Float64Array(9 * nb);
    for (let b = 0; b < nb; b++) rotationFromVector(this.sphBuf, 9 * b, 0, 0, 0);
    this.jacBuf = new Float64Array(mechanism.nResiduals * mechanism.nVars);
    this.rBuf = new Float64Array(mechanism.nResiduals);
  }

  /** Set the mechanism's state from a flat parameter vector (driven joints follow the inputs). */
  set(p: ArrayLike<number>): void {
    // Only the spherical joints' rotations and the solved coordinates change; every other
    // entry of the buffers was set once in the constructor (identity rotations, zero
    // coordinates that setState overwrites for driven joints), so the general path pays no
    // more per evaluation than it must.
    const { coordBuf, sphBuf, firstParam, spherical } = this;
    for (let b = 0; b < firstParam.length; b++) {
      const k = firstParam[b];
      if (k < 0) continue;
      if (spherical[b]) rotationFromVector(sphBuf, 9 * b, p[k], p[k + 1], p[k + 2]);
      else coordBuf[b] = p[k];
    }
    this.mechanism.setState(coordBuf, sphBuf);
  }

  /** Flat parameters of the mechanism's current state. */
  get(out: number[] | Float64Array): void {
    const m = this.mechanism;
    const { firstParam, spherical, w } = this;
    for (let b = 0; b < firstParam.length; b++) {
      const k = firstParam[b];
      if (k < 0) continue;
      if (spherical[b]) {
        vectorFromRotation(w, m.sph, 9 * b);
        out[k] = w[0];
        out[k + 1] = w[1];
        out[k + 2] = w[2];
      } else {
        out[k] = m.coord[b];
      }
    }
  }

  /** Residuals at p (mm); false if any is not finite. */
  residuals(p: ArrayLike<number>, r: Float64Array): boolean {
    this.set(p);
    return this.mechanism.residuals(r);
  }

  /** Largest |residual| at p, mm. */
  maxResidual(p: ArrayLike<number>): number {
    if (!this.residuals(p, this.rBuf)) return Infinity;
    let s = 0;
    for (let i = 0; i < this.rBuf.length; i++) s = Math.max(s, Math.abs(this.rBuf[i]));
    return s;
  }

  /** Row-major nResiduals x nParams Jacobian of the residuals with respect to p. */
  jacobian(p: ArrayLike<number>, jac: Float64Array): void {
    const m = this.mechanism;
    this.set(p);
    m.residuals(this.rBuf);
    const mj = this.jacBuf;
    m.jacobian(mj);
    const n = this.nParams;
    const rows = this.nResiduals;
    jac.set(mj);
    const { firstParam, spherical } = this;
    for (let b = 0; b < firstParam.length; b++) {
      const k = firstParam[b];
      if (k < 0 || !spherical[b]) continue;
      const tx = p[k], ty = p[k + 1], tz = p[k + 2];
      const t2 = tx * tx + ty * ty + tz * tz;
      // J_l = I + c1 K + c2 K^2, K = theta^
      let c1: number, c2: number;
      if (t2 < 1e-8) {
        c1 = 0.5 - t2 / 24;
        c2 = 1 / 6 - t2 / 120;
      } else {
        const t = Math.sqrt(t2);
        c1 = (1 - Math.cos(t)) / t2;
        c2 = (t - Math.sin(t)) / (t2 * t);
      }
      // K (row-major): [[0,-tz,ty],[tz,0,-tx],[-ty,tx,0]]; K^2 = theta theta^T - t2 I
      const jl = [
        1 + c2 * (tx * tx - t2), -c1 * tz + c2 * tx * ty, c1 * ty + c2 * tx * tz,
        c1 * tz + c2 * ty * tx, 1 + c2 * (ty * ty - t2), -c1 * tx + c2 * ty * tz,
        -c1 * ty + c2 * tz * tx, c1 * tx + c2 * tz * ty, 1 + c2 * (tz * tz - t2),
      ];
      for (let i = 0; i < rows; i++) {
        const o = i * n + k;
        const a0 = mj[o], a1 = mj[o + 1], a2 = mj[o + 2];
        for (let s = 0; s < 3; s++) jac[o + s] = a0 * jl[s] + a1 * jl[3 + s] + a2 * jl[6 + s];
      }
    }
  }
}
