/**
 * A mechanism graph compiled for fast solving: the joint tree's forward kinematics
 * (KinematicTree, which this class extends) plus the loop closures, their residuals and
 * their analytic Jacobian, all on preallocated Float64Arrays. This is the least-squares
 * problem the Levenberg-Marquardt solver works on.
 *
 * Jacobian columns come from the screw of each unknown: a rotation with world axis w about
 * world point o moves a world point P with velocity w x (P - o); a slide moves it along
 * its axis.
 */

import type { LeastSquaresProblem } from './levenbergMarquardt';
import type { MechanismGraph } from '../mechanism/MechanismGraph';
import { KIND_PRISMATIC, KIND_SPHERICAL, KinematicTree } from './KinematicTree';
import { C_COINCIDENT, C_DISTANCE, C_GROUND, C_HEADING, C_HEIGHT, C_MEAN_Y, compileConstraint, type CompiledConstraint } from './compiledConstraint';

/** Heading residuals (radians) are scaled by this length so every row reads in mm. */
export const HEADING_RESIDUAL_MM_PER_RAD = 1000;

export class CompiledMechanism extends KinematicTree implements LeastSquaresProblem {
  readonly nResiduals: number;
  private readonly constraints: CompiledConstraint[];
  /** Per unknown: world axis, world origin, whether it rotates. */
  private readonly varAxis: Float64Array;
  private readonly varOrigin: Float64Array;
  private readonly varRot: Uint8Array;
  // Scratch for constraint evaluation.
  private readonly pa = new Float64Array(3);
  private readonly pb = new Float64Array(3);
  private readonly dir = new Float64Array(3);

  constructor(graph: MechanismGraph) {
    super(graph);
    const nb = this.nBodies;
    this.varAxis = new Float64Array(3 * this.nVars);
    this.varOrigin = new Float64Array(3 * this.nVars);
    this.varRot = new Uint8Array(this.nVars);
    let row = 0;
    this.constraints = graph.constraints.map((c) => {
      const cc = compileConstraint(c, row, nb);
      row += cc.rows;
      return cc;
    });
    this.nResiduals = row;
  }

  /** World screw axis and origin of every unknown, from the current body poses. */
  private screwAxes(): void {
    const { rot, trans, parent, kind, origin, axis } = this;
    for (let b = 0; b < this.nBodies; b++) {
      const k = kind[b];
      const p = parent[b];
      const ox = origin[3 * b], oy = origin[3 * b + 1], oz = origin[3 * b + 2];
      const v0 = this.firstVar[b];
      if (v0 >= 0) {
        // World position of the joint origin (fixed in the parent).
        let wx = ox, wy = oy, wz = oz;
        if (p >= 0) {
          const po = 9 * p;
          wx = rot[po] * ox + rot[po + 3] * oy + rot[po + 6] * oz + trans[3 * p];
          wy = rot[po + 1] * ox + rot[po + 4] * oy + rot[po + 7] * oz + trans[3 * p + 1];
          wz = rot[po + 2] * ox + rot[po + 5] * oy + rot[po + 8] * oz + trans[3 * p + 2];
        }
        const count = k === KIND_SPHERICAL ? 3 : 1;
        for (let s = 0; s < count; s++) {
          const v = v0 + s;
          let ax: number, ay: number, az: number;
          if (k === KIND_SPHERICAL) {
            // delta applied in the parent's frame: world axis = column s of the parent's rotation
            if (p >= 0) {
              ax = rot[9 * p + 3 * s];
              ay = rot[9 * p + 3 * s + 1];
              az = rot[9 * p + 3 * s + 2];
            } else {
              ax = s === 0 ? 1 : 0;
              ay = s === 1 ? 1 : 0;
              az = s === 2 ? 1 : 0;
            }
          } else if (p >= 0) {
            const po = 9 * p;
            const x = axis[3 * b], y = axis[3 * b + 1], z = axis[3 * b + 2];
            ax = rot[po] * x + rot[po + 3] * y + rot[po + 6] * z;
            ay = rot[po + 1] * x + rot[po + 4] * y + rot[po + 7] * z;
            az = rot[po + 2] * x + rot[po + 5] * y + rot[po + 8] * z;
          } else {
            ax = axis[3 * b];
            ay = axis[3 * b + 1];
            az = axis[3 * b + 2];
          }
          this.varAxis[3 * v] = ax;
          this.varAxis[3 * v + 1] = ay;
          this.varAxis[3 * v + 2] = az;
          this.varOrigin[3 * v] = wx;
          this.varOrigin[3 * v + 1] = wy;
          this.varOrigin[3 * v + 2] = wz;
          this.varRot[v] = k === KIND_PRISMATIC ? 0 : 1;
        }
      }
    }
  }

  /**
   * worldPoint and worldDirection for the solver's own loops. Kept apart from the public pair
   * on purpose: callers elsewhere pass plain arrays, and type feedback shared with them made
   * the residual and Jacobian code polymorphic and about an eighth slower.
   */
  private place(b: number, p: Float64Array, out: Float64Array): void {
    if (b < 0) {
      out[0] = p[0];
      out[1] = p[1];
      out[2] = p[2];
      return;
    }
    const { rot, trans } = this;
    const o = 9 * b;
    const x = p[0], y = p[1], z = p[2];
    out[0] = rot[o] * x + rot[o + 3] * y + rot[o + 6] * z + trans[3 * b];
    out[1] = rot[o + 1] * x + rot[o + 4] * y + rot[o + 7] * z + trans[3 * b + 1];
    out[2] = rot[o + 2] * x + rot[o + 5] * y + rot[o + 8] * z + trans[3 * b + 2];
  }

  private turn(b: number, d: Float64Array, out: Float64Array): void {
    if (b < 0) {
      out[0] = d[0];
      out[1] = d[1];
      out[2] = d[2];
      return;
    }
    const { rot } = this;
    const o = 9 * b;
    const x = d[0], y = d[1], z = d[2];
    out[0] = rot[o] * x + rot[o + 3] * y + rot[o + 6] * z;
    out[1] = rot[o + 1] * x + rot[o + 4] * y + rot[o + 7] * z;
    out[2] = rot[o + 2] * x + rot[o + 5] * y + rot[o + 8] * z;
  }

  residuals(r: Float64Array): boolean {
    this.forward();
    const { pa, pb, dir } = this;
    const constraints = this.constraints;
    for (let ci = 0; ci < constraints.length; ci++) {
      const c = constraints[ci];
      const i = c.row;
      switch (c.code) {
        case C_COINCIDENT:
          this.place(c.bodyA, c.pA, pa);
          this.place(c.bodyB, c.pB, pb);
          r[i] = pa[0] - pb[0];
          r[i + 1] = pa[1] - pb[1];
          r[i + 2] = pa[2] - pb[2];
          break;
        case C_DISTANCE:
          this.place(c.bodyA, c.pA, pa);
          this.place(c.bodyB, c.pB, pb);
          {
            const dx = pa[0] - pb[0], dy = pa[1] - pb[1], dz = pa[2] - pb[2];
            r[i] = Math.sqrt(dx * dx + dy * dy + dz * dz) - c.length;
          }
          break;
        case C_GROUND: {
          this.place(c.bodyA, c.pA, pa);
          this.turn(c.bodyA, c.pB, dir);
          const s = Math.sqrt(Math.max(0, 1 - dir[2] * dir[2]));
          r[i] = pa[2] - (c.rolling - c.crown) * s - c.crown;
          break;
        }
        case C_HEIGHT: {
          this.place(c.bodyA, c.pA, pa);
          r[i] = this.heightInBody(c.bodyB, pa) - (c.pA[2] + c.gain * this.inputVec[c.inputIndex]);
          break;
        }
        case C_HEADING: {
          this.turn(c.bodyA, c.pB, dir);
          const psi = Math.atan2(-dir[0], dir[1]);
          r[i] = wrapAngle(psi - c.gain * this.inputVec[c.inputIndex]) * HEADING_RESIDUAL_MM_PER_RAD;
          break;
        }
        case C_MEAN_Y:
          r[i] = 0.5 * (this.contactY(c.bodyA, c.pA, c.pB, c.rolling - c.crown) + this.contactY(c.bodyB, c.pC, c.pD, c.rolling - c.crown));
          break;
      }
    }
    for (let k = 0; k < this.nResiduals; k++) if (!Number.isFinite(r[k])) return false;
    return true;
  }

  /**
   * y of a wheel's lowest tyre point: centre + k d, d the unit downward direction in the wheel
   * plane, (a_z a - z) / sqrt(1 - a_z^2), whose y is a_z a_y / s (the crown's -r z adds no y).
   */
  private contactY(b: number, centre: Float64Array, axis: Float64Array, k: number): number {
    const { pa, dir } = this;
    this.place(b, centre, pa);
    this.turn(b, axis, dir);
    const s = Math.sqrt(Math.max(1e-300, 1 - dir[2] * dir[2]));
    return pa[1] + (k * dir[2] * dir[1]) / s;
  }

  /** z coordinate of world point w in body f's design frame. */
  private heightInBody(f: number, w: Float64Array): number {
    if (f < 0) return w[2];
    const o = 9 * f;
    return this.rot[o + 6] * (w[0] - this.trans[3 * f]) + this.rot[o + 7] * (w[1] - this.trans[3 * f + 1]) + this.rot[o + 8] * (w[2] - this.trans[3 * f + 2]);
  }

  /**
   * The analytic Jacobian at the state of the last residuals() call: each unknown's screw
   * (world axis and origin, from screwAxes) applied to the points and directions every
   * constraint row reads, one method per constraint kind.
   */
  jacobian(jac: Float64Array): void {
    const n = this.nVars;
    this.screwAxes();
    jac.fill(0);
    const constraints = this.constraints;
    for (let ci = 0; ci < constraints.length; ci++) {
      const c = constraints[ci];
      switch (c.code) {
        case C_COINCIDENT:
        case C_DISTANCE:
          this.pointRowsJacobian(c, jac, n);
          break;
        case C_GROUND:
          this.groundRowJacobian(c, jac, n);
          break;
        case C_HEIGHT:
          this.heightRowJacobian(c, jac, n);
          break;
        case C_HEADING:
          this.headingRowJacobian(c, jac, n);
          break;
        case C_MEAN_Y:
          this.contactYJacobian(c.row, c.bodyA, c.pA, c.pB, c.rolling - c.crown, jac, n);
          this.contactYJacobian(c.row, c.bodyB, c.pC, c.pD, c.rolling - c.crown, jac, n);
          break;
      }
    }
  }

  /** Rows of a coincident joint (three, one per world axis) or a link length (one, along the link). */
  private pointRowsJacobian(c: CompiledConstraint, jac: Float64Array, n: number): void {
    const { pa, pb, chainStart, chainVars, varAxis: A, varOrigin: O, varRot } = this;
    const nb = this.nBodies;
    const i = c.row;
    this.place(c.bodyA, c.pA, pa);
    this.place(c.bodyB, c.pB, pb);
    let ux = 0, uy = 0, uz = 0;
    if (c.code === C_DISTANCE) {
      ux = pa[0] - pb[0];
      uy = pa[1] - pb[1];
      uz = pa[2] - pb[2];
      const l = Math.sqrt(ux * ux + uy * uy + uz * uz);
      if (l > 0) {
        ux /= l; uy /= l; uz /= l;
      }
    }
    for (let side = 0; side < 2; side++) {
      const b = side === 0 ? c.bodyA : c.bodyB;
      const p = side === 0 ? pa : pb;
      const sign = side === 0 ? 1 : -1;
      const cb = b < 0 ? nb + 1 : b;
      for (let k = chainStart[cb]; k < chainStart[cb + 1]; k++) {
        const v = chainVars[k];
        let vx: number, vy: number, vz: number;
        if (varRot[v]) {
          const dx = p[0] - O[3 * v], dy = p[1] - O[3 * v + 1], dz = p[2] - O[3 * v + 2];
          vx = A[3 * v + 1] * dz - A[3 * v + 2] * dy;
          vy = A[3 * v + 2] * dx - A[3 * v] * dz;
          vz = A[3 * v] * dy - A[3 * v + 1] * dx;
        } else {
          vx = A[3 * v]; vy = A[3 * v + 1]; vz = A[3 * v + 2];
        }
        if (c.code === C_COINCIDENT) {
          jac[i * n + v] += sign * vx;
          jac[(i + 1) * n + v] += sign * vy;
          jac[(i + 2) * n + v] += sign * vz;
        } else {
          jac[i * n + v] += sign * (ux * vx + uy * vy + uz * vz);
        }
      }
    }
  }

  /** Row of a tyre-on-ground contact: the lowest point of the tyre moves with the wheel centre and with the spin axis tilting. */
  private groundRowJacobian(c: CompiledConstraint, jac: Float64Array, n: number): void {
    const { pa, dir, chainStart, chainVars, varAxis: A, varOrigin: O, varRot } = this;
    const nb = this.nBodies;
    const i = c.row;
    this.place(c.bodyA, c.pA, pa);
    this.turn(c.bodyA, c.pB, dir);
    const s = Math.sqrt(Math.max(1e-300, 1 - dir[2] * dir[2]));
    const k2 = (c.rolling - c.crown) * dir[2] / s;
    const cb = c.bodyA < 0 ? nb + 1 : c.bodyA;
    for (let k = chainStart[cb]; k < chainStart[cb + 1]; k++) {
      const v = chainVars[k];
      if (varRot[v]) {
        const dx = pa[0] - O[3 * v], dy = pa[1] - O[3 * v + 1];
        const vz = A[3 * v] * dy - A[3 * v + 1] * dx;
        // d(a_z) = (w x a)_z
        const daz = A[3 * v] * dir[1] - A[3 * v + 1] * dir[0];
        jac[i * n + v] += vz + k2 * daz;
      } else {
        jac[i * n + v] += A[3 * v + 2];
      }
    }
  }

  /** Row of a point-height driver: the point's height in a reference body's frame, both of which may move. */
  private heightRowJacobian(c: CompiledConstraint, jac: Float64Array, n: number): void {
    const { pa, chainStart, chainVars, varAxis: A, varOrigin: O, varRot } = this;
    const nb = this.nBodies;
    const i = c.row;
    this.place(c.bodyA, c.pA, pa);
    const f = c.bodyB;
    // the reference body's z axis and origin in the world
    let zx = 0, zy = 0, zz = 1, ox = 0, oy = 0, oz = 0;
    if (f >= 0) {
      zx = this.rot[9 * f + 6]; zy = this.rot[9 * f + 7]; zz = this.rot[9 * f + 8];
      ox = this.trans[3 * f]; oy = this.trans[3 * f + 1]; oz = this.trans[3 * f + 2];
    }
    // Moving the point: z_f . v(P)
    const cb = c.bodyA < 0 ? nb + 1 : c.bodyA;
    for (let k = chainStart[cb]; k < chainStart[cb + 1]; k++) {
      const v = chainVars[k];
      let vx: number, vy: number, vz: number;
      if (varRot[v]) {
        const dx = pa[0] - O[3 * v], dy = pa[1] - O[3 * v + 1], dz = pa[2] - O[3 * v + 2];
        vx = A[3 * v + 1] * dz - A[3 * v + 2] * dy;
        vy = A[3 * v + 2] * dx - A[3 * v] * dz;
        vz = A[3 * v] * dy - A[3 * v + 1] * dx;
      } else {
        vx = A[3 * v]; vy = A[3 * v + 1]; vz = A[3 * v + 2];
      }
      jac[i * n + v] += zx * vx + zy * vy + zz * vz;
    }
    // Moving the reference frame: -z_f . v(O_f) + (w x z_f) . (P - O_f); shared
    // ancestors cancel against the term above, as they must.
    const cf = f < 0 ? nb + 1 : f;
    for (let k = chainStart[cf]; k < chainStart[cf + 1]; k++) {
      const v = chainVars[k];
      let vx: number, vy: number, vz: number;
      let t = 0;
      if (varRot[v]) {
        const ax = A[3 * v], ay = A[3 * v + 1], az = A[3 * v + 2];
        const dx = ox - O[3 * v], dy = oy - O[3 * v + 1], dz = oz - O[3 * v + 2];
        vx = ay * dz - az * dy;
        vy = az * dx - ax * dz;
        vz = ax * dy - ay * dx;
        const wzx = ay * zz - az * zy, wzy = az * zx - ax * zz, wzz = ax * zy - ay * zx;
        t = wzx * (pa[0] - ox) + wzy * (pa[1] - oy) + wzz * (pa[2] - oz);
      } else {
        vx = A[3 * v]; vy = A[3 * v + 1]; vz = A[3 * v + 2];
      }
      jac[i * n + v] += -(zx * vx + zy * vy + zz * vz) + t;
    }
  }

  /** Row of a wheel-heading driver: the heading of the spin axis's ground projection, scaled to mm. */
  private headingRowJacobian(c: CompiledConstraint, jac: Float64Array, n: number): void {
    const { dir, chainStart, chainVars, varAxis: A, varRot } = this;
    const nb = this.nBodies;
    const i = c.row;
    this.turn(c.bodyA, c.pB, dir);
    const den = dir[0] * dir[0] + dir[1] * dir[1];
    const cb = c.bodyA < 0 ? nb + 1 : c.bodyA;
    for (let k = chainStart[cb]; k < chainStart[cb + 1]; k++) {
      const v = chainVars[k];
      if (!varRot[v]) continue;
      const ax = A[3 * v], ay = A[3 * v + 1], az = A[3 * v + 2];
      const dax = ay * dir[2] - az * dir[1];
      const day = az * dir[0] - ax * dir[2];
      jac[i * n + v] += ((-dir[1] * dax + dir[0] * day) / den) * HEADING_RESIDUAL_MM_PER_RAD;
    }
  }

  /**
   * Half the derivative of one wheel's contact y (contactY) into row i: the centre moves with
   * the screw's velocity, the axis turns by w x a; d/da_y = k a_z / s, d/da_z = k a_y / s^3.
   */
  private contactYJacobian(i: number, b: number, centre: Float64Array, axis: Float64Array, k: number, jac: Float64Array, n: number): void {
    const { pa, dir, chainStart, chainVars, varAxis: A, varOrigin: O, varRot } = this;
    this.place(b, centre, pa);
    this.turn(b, axis, dir);
    const s2 = Math.max(1e-300, 1 - dir[2] * dir[2]);
    const s = Math.sqrt(s2);
    const gy = (k * dir[2]) / s;
    const gz = (k * dir[1]) / (s * s2);
    const cb = b < 0 ? this.nBodies + 1 : b;
    for (let q = chainStart[cb]; q < chainStart[cb + 1]; q++) {
      const v = chainVars[q];
      if (varRot[v]) {
        const ax = A[3 * v], ay = A[3 * v + 1], az = A[3 * v + 2];
        const dx = pa[0] - O[3 * v], dz = pa[2] - O[3 * v + 2];
        const vy = az * dx - ax * dz;
        const day = az * dir[0] - ax * dir[2];
        const daz = ax * dir[1] - ay * dir[0];
        jac[i * n + v] += 0.5 * (vy + gy * day + gz * daz);
      } else {
        jac[i * n + v] += 0.5 * A[3 * v + 1];
      }
    }
  }

  /** Columns each residual row can touch: the unknowns in the chains of its bodies. */
  jacobianPattern(): Int32Array[] {
    const nb = this.nBodies;
    const rows: Int32Array[] = [];
    const chain = (b: number): number[] => {
      const c = b < 0 ? nb + 1 : b;
      return Array.from(this.chainVars.subarray(this.chainStart[c], this.chainStart[c + 1]));
    };
    for (const c of this.constraints) {
      const cols = new Set<number>([...chain(c.bodyA), ...(c.code === C_COINCIDENT || c.code === C_DISTANCE || c.code === C_HEIGHT || c.code === C_MEAN_Y ? chain(c.bodyB) : [])]);
      const arr = Int32Array.from([...cols].sort((x, y) => x - y));
      for (let k = 0; k < c.rows; k++) rows.push(arr);
    }
    return rows;
  }

  /** Label of the constraint owning a residual row. */
  constraintLabelOfRow(row: number): string {
    for (const c of this.constraints) if (row >= c.row && row < c.row + c.rows) return c.label;
    return 'unknown constraint';
  }
}

function wrapAngle(a: number): number {
  return a - 2 * Math.PI * Math.round(a / (2 * Math.PI));
}
