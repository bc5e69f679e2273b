/**
 * A mechanism graph compiled for fast solving: forward kinematics over the joint tree,
 * loop-closure residuals and their analytic Jacobian, all on preallocated Float64Arrays.
 *
 * Coordinates: a revolute or prismatic joint has one coordinate (radians, mm); a spherical
 * joint keeps a rotation matrix S and is stepped on its manifold, S <- exp(delta) S with
 * delta in the parent's frame, so there is no gimbal singularity. Driven joints follow
 * inputs and are not unknowns.
 *
 * Jacobian columns come from the screw of each unknown: a rotation with world axis w about
 * world point o moves a world point P with velocity w x (P - o); a slide moves it along
 * its axis.
 */

import { rotationAboutAxis, rotationFromVectorAt, multiplyMat3, orthonormalize, vectorFromRotation } from '../math/rotation';
import type { LeastSquaresProblem } from './levenbergMarquardt';
import { INPUT_NAMES, type Constraint, type MechanismGraph, type PoseInputs, type Vec3 } from '../mechanism/MechanismGraph';

const KIND_REVOLUTE = 0;
const KIND_PRISMATIC = 1;
const KIND_SPHERICAL = 2;

const C_COINCIDENT = 0;
const C_DISTANCE = 1;
const C_GROUND = 2;
const C_HEIGHT = 3;
const C_HEADING = 4;

/** Heading residuals (radians) are scaled by this length so every row reads in mm. */
export const HEADING_RESIDUAL_MM_PER_RAD = 1000;

interface CompiledConstraint {
  code: number;
  row: number;
  rows: number;
  bodyA: number;
  pA: Float64Array;
  bodyB: number;
  pB: Float64Array;
  length: number;
  rolling: number;
  crown: number;
  gain: number;
  inputIndex: number;
  label: string;
}

export class CompiledMechanism implements LeastSquaresProblem {
  readonly graph: MechanismGraph;
  readonly nBodies: number;
  readonly nVars: number;
  readonly nResiduals: number;
  /** Body poses: rotation (column-major 3x3) and translation, design -> world. */
  readonly rot: Float64Array;
  readonly trans: Float64Array;
  /** One coordinate per body's joint (revolute angle, prismatic slide); unused for spherical. */
  readonly coord: Float64Array;
  /** Spherical joints' rotation matrices, 9 per body (identity for others). */
  readonly sph: Float64Array;

  private readonly parent: Int32Array;
  private readonly kind: Int32Array;
  private readonly origin: Float64Array;
  private readonly axis: Float64Array;
  /** First unknown of each body's joint, or -1 when driven. */
  private readonly firstVar: Int32Array;
  private readonly varJoint: Int32Array;
  private readonly varSub: Int32Array;
  /** Per unknown: world axis, world origin, whether it rotates. */
  private readonly varAxis: Float64Array;
  private readonly varOrigin: Float64Array;
  private readonly varRot: Uint8Array;
  /** Unknowns that move each body: chainVars[chainStart[b] .. chainStart[b+1]). */
  private readonly chainStart: Int32Array;
  private readonly chainVars: Int32Array;
  private readonly constraints: CompiledConstraint[];
  private readonly jointRot: Float64Array;
  /** Inputs in INPUT_NAMES order (typed, so the hot loops index instead of keying by name). */
  private readonly inputVec = new Float64Array(INPUT_NAMES.length);
  private readonly drivenIndex: Int32Array;
  private readonly drivenGain: Float64Array;

  /** 1 for a body no unknown moves: its pose follows from the inputs alone. */
  private readonly inputOnly: Uint8Array;
  /** Whether those bodies' poses match the current inputs (cleared whenever inputs or state are set). */
  private inputPosesValid = false;
  /** The angle each revolute joint's cached rotation in jointRot was made for. */
  private readonly rotCoord: Float64Array;
  private readonly savedCoord: Float64Array;
  private readonly savedSph: Float64Array;
  private readonly scratch = new Float64Array(9);

  constructor(graph: MechanismGraph) {
    this.graph = graph;
    const nb = graph.bodies.length;
    this.nBodies = nb;
    if (graph.joints.length !== nb) throw new Error(`mechanism "${graph.name}": expected one joint per body`);
    this.rot = new Float64Array(9 * nb);
    this.trans = new Float64Array(3 * nb);
    this.coord = new Float64Array(nb);
    this.sph = new Float64Array(9 * nb);
    this.jointRot = new Float64Array(9 * nb);
    this.rotCoord = new Float64Array(nb).fill(NaN);
    this.parent = new Int32Array(nb);
    this.kind = new Int32Array(nb);
    this.origin = new Float64Array(3 * nb);
    this.axis = new Float64Array(3 * nb);
    this.drivenIndex = new Int32Array(nb).fill(-1);
    this.drivenGain = new Float64Array(nb);
    this.firstVar = new Int32Array(nb);
    const varJoint: number[] = [];
    const varSub: number[] = [];
    for (let b = 0; b < nb; b++) {
      const j = graph.joints[b];
      if (j.child !== b) throw new Error(`mechanism "${graph.name}": joint "${j.id}" must carry body ${b}`);
      if (j.parent >= b) throw new Error(`mechanism "${graph.name}": joint "${j.id}" has its parent after its child`);
      this.parent[b] = j.parent;
      this.kind[b] = j.kind === 'revolute' ? KIND_REVOLUTE : j.kind === 'prismatic' ? KIND_PRISMATIC : KIND_SPHERICAL;
      this.origin.set(j.origin, 3 * b);
      const n = Math.hypot(j.axis[0], j.axis[1], j.axis[2]);
      if (j.kind !== 'spherical' && !(n > 0)) throw new Error(`mechanism "${graph.name}": joint "${j.label}" has a zero-length axis`);
      if (n > 0) this.axis.set([j.axis[0] / n, j.axis[1] / n, j.axis[2] / n], 3 * b);
      setIdentity(this.sph, 9 * b);
      if (j.kind === 'spherical' && j.driver) throw new Error(`mechanism "${graph.name}": a spherical joint cannot be driven`);
      if (j.driver) {
        this.drivenIndex[b] = INPUT_NAMES.indexOf(j.driver.input);
        this.drivenGain[b] = j.driver.gain;
        if (this.drivenIndex[b] < 0) throw new Error(`mechanism "${graph.name}": joint "${j.label}" is driven by an unknown input "${j.driver.input}"`);
      }
      if (j.driver) {
        this.firstVar[b] = -1;
      } else {
        this.firstVar[b] = varJoint.length;
        const count = j.kind === 'spherical' ? 3 : 1;
        for (let s = 0; s < count; s++) {
          varJoint.push(b);
          varSub.push(s);
        }
      }
    }
    this.nVars = varJoint.length;
    this.varJoint = Int32Array.from(varJoint);
    this.varSub = Int32Array.from(varSub);
    this.varAxis = new Float64Array(3 * this.nVars);
    this.varOrigin = new Float64Array(3 * this.nVars);
    this.varRot = new Uint8Array(this.nVars);

    // Chains of unknowns from each body to the ground.
    const chains: number[][] = [];
    for (let b = 0; b < nb; b++) {
      const own: number[] = [];
      if (this.firstVar[b] >= 0) {
        const count = this.kind[b] === KIND_SPHERICAL ? 3 : 1;
        for (let s = 0; s < count; s++) own.push(this.firstVar[b] + s);
      }
      const p = this.parent[b];
      chains.push(p >= 0 ? own.concat(chains[p]) : own);
    }
    this.chainStart = new Int32Array(nb + 2);
    const flat: number[] = [];
    for (let b = 0; b < nb; b++) {
      this.chainStart[b] = flat.length;
      flat.push(...chains[b]);
    }
    this.chainStart[nb] = flat.length;
    this.chainStart[nb + 1] = flat.length; // the ground (-1 mapped to nb) has no unknowns
    this.chainVars = Int32Array.from(flat);
    this.inputOnly = Uint8Array.from({ length: nb }, (_, b) => (this.chainStart[b] === this.chainStart[b + 1] ? 1 : 0));

    let row = 0;
    this.constraints = graph.constraints.map((c) => {
      const cc = compileConstraint(c, row, nb);
      row += cc.rows;
      return cc;
    });
    this.nResiduals = row;
    this.savedCoord = new Float64Array(nb);
    this.savedSph = new Float64Array(9 * nb);
    this.resetToDesign();
  }

  /** All coordinates to the design pose (zero), spherical joints to identity. */
  resetToDesign(): void {
    this.coord.fill(0);
    for (let b = 0; b < this.nBodies; b++) setIdentity(this.sph, 9 * b);
    this.applyInputVector(this.inputVec);
  }

  /** Set the inputs: driven coordinates follow them, constraint targets read them. */
  applyInputs(inputs: PoseInputs): void {
    const v = this.inputVec;
    for (let k = 0; k < INPUT_NAMES.length; k++) v[k] = inputs[INPUT_NAMES[k]];
    this.applyInputVector(v);
  }

  /** The same from a vector in INPUT_NAMES order (the pose solver's internal form). */
  applyInputVector(v: ArrayLike<number>): void {
    const iv = this.inputVec;
    if (v !== iv) for (let k = 0; k < iv.length; k++) iv[k] = v[k];
    this.inputPosesValid = false;
    const { drivenIndex, drivenGain, coord } = this;
    for (let b = 0; b < this.nBodies; b++) {
      const k = drivenIndex[b];
      if (k >= 0) coord[b] = drivenGain[b] * iv[k];
    }
  }

  /** The current inputs as a record (allocates: for output, not for inner loops). */
  get currentInputs(): Readonly<PoseInputs> {
    const out = {} as PoseInputs;
    for (let k = 0; k < INPUT_NAMES.length; k++) out[INPUT_NAMES[k]] = this.inputVec[k];
    return out;
  }

  /**
   * Forward kinematics: every body's pose from the joint coordinates. Bodies that no unknown
   * moves (the frame, a steering column driven by the handlebar) depend on the inputs alone,
   * so they are recomputed only after the inputs (or the whole state) were set.
   */
  forward(): void {
    const { rot, trans, coord, sph, jointRot, parent, kind, origin, axis, inputOnly } = this;
    const skipInputOnly = this.inputPosesValid;
    for (let b = 0; b < this.nBodies; b++) {
      if (skipInputOnly && inputOnly[b] === 1) continue;
      const k = kind[b];
      const o = 9 * b;
      const p = parent[b];
      const po = 9 * p;
      if (k === KIND_PRISMATIC) {
        // Joint motion: a slide along the axis, no rotation.
        const sl = coord[b];
        const tj0 = axis[3 * b] * sl, tj1 = axis[3 * b + 1] * sl, tj2 = axis[3 * b + 2] * sl;
        if (p < 0) {
          setIdentity(rot, o);
          trans[3 * b] = tj0;
          trans[3 * b + 1] = tj1;
          trans[3 * b + 2] = tj2;
        } else {
          for (let i = 0; i < 9; i++) rot[o + i] = rot[po + i];
          placeOffset(trans, b, rot, po, trans, p, tj0, tj1, tj2);
        }
        continue;
      }
      // Joint rotation J about the joint origin, in the parent's design frame: the cached
      // revolute rotation (remade only when its angle changed) or the spherical state.
      let J = sph;
      if (k === KIND_REVOLUTE) {
        J = jointRot;
        if (this.rotCoord[b] !== coord[b]) {
          rotationAboutAxis(jointRot, o, axis[3 * b], axis[3 * b + 1], axis[3 * b + 2], coord[b]);
          this.rotCoord[b] = coord[b];
        }
      }
      const ox = origin[3 * b], oy = origin[3 * b + 1], oz = origin[3 * b + 2];
      // rotation about the origin: t = o - J o
      const tj0 = ox - (J[o] * ox + J[o + 3] * oy + J[o + 6] * oz);
      const tj1 = oy - (J[o + 1] * ox + J[o + 4] * oy + J[o + 7] * oz);
      const tj2 = oz - (J[o + 2] * ox + J[o + 5] * oy + J[o + 8] * oz);
      if (p < 0) {
        for (let i = 0; i < 9; i++) rot[o + i] = J[o + i];
        trans[3 * b] = tj0;
        trans[3 * b + 1] = tj1;
        trans[3 * b + 2] = tj2;
      } else {
        // rot and J hold other bodies' blocks at these offsets: no aliasing.
        multiplyMat3(rot, o, rot, po, J, o);
        placeOffset(trans, b, rot, po, trans, p, tj0, tj1, tj2);
      }
    }
    this.inputPosesValid = true;
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

  /** World position of a design point carried by body b. */
  worldPoint(b: number, p: ArrayLike<number>, out: Float64Array | number[], oo = 0): void {
    if (b < 0) {
      out[oo] = p[0];
      out[oo + 1] = p[1];
      out[oo + 2] = p[2];
      return;
    }
    const { rot, trans } = this;
    const o = 9 * b;
    const x = p[0], y = p[1], z = p[2];
    out[oo] = rot[o] * x + rot[o + 3] * y + rot[o + 6] * z + trans[3 * b];
    out[oo + 1] = rot[o + 1] * x + rot[o + 4] * y + rot[o + 7] * z + trans[3 * b + 1];
    out[oo + 2] = rot[o + 2] * x + rot[o + 5] * y + rot[o + 8] * z + trans[3 * b + 2];
  }

  /** World direction of a design direction carried by body b. */
  worldDirection(b: number, d: ArrayLike<number>, out: Float64Array | number[], oo = 0): void {
    if (b < 0) {
      out[oo] = d[0];
      out[oo + 1] = d[1];
      out[oo + 2] = d[2];
      return;
    }
    const { rot } = this;
    const o = 9 * b;
    const x = d[0], y = d[1], z = d[2];
    out[oo] = rot[o] * x + rot[o + 3] * y + rot[o + 6] * z;
    out[oo + 1] = rot[o + 1] * x + rot[o + 4] * y + rot[o + 7] * z;
    out[oo + 2] = rot[o + 2] * x + rot[o + 5] * y + rot[o + 8] * z;
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

  // Scratch for constraint evaluation.
  private readonly pa = new Float64Array(3);
  private readonly pb = new Float64Array(3);
  private readonly dir = new Float64Array(3);

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
      }
    }
    for (let k = 0; k < this.nResiduals; k++) if (!Number.isFinite(r[k])) return false;
    return true;
  }

  /** z coordinate of world point w in body f's design frame. */
  private heightInBody(f: number, w: Float64Array): number {
    if (f < 0) return w[2];
    const o = 9 * f;
    return this.rot[o + 6] * (w[0] - this.trans[3 * f]) + this.rot[o + 7] * (w[1] - this.trans[3 * f + 1]) + this.rot[o + 8] * (w[2] - this.trans[3 * f + 2]);
  }

  jacobian(jac: Float64Array): void {
    const n = this.nVars;
    this.screwAxes();
    jac.fill(0);
    const { pa, pb, dir, chainStart, chainVars, varAxis: A, varOrigin: O, varRot } = this;
    const nb = this.nBodies;
    const constraints = this.constraints;
    for (let ci = 0; ci < constraints.length; ci++) {
      const c = constraints[ci];
      const i = c.row;
      switch (c.code) {
        case C_COINCIDENT:
        case C_DISTANCE: {
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
          break;
        }
        case C_GROUND: {
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
          break;
        }
        case C_HEIGHT: {
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
          break;
        }
        case C_HEADING: {
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
          break;
        }
      }
    }
  }

  step(h: Float64Array): void {
    const { coord, sph, scratch, kind, firstVar } = this;
    for (let b = 0; b < this.nBodies; b++) {
      const v = firstVar[b];
      if (v < 0) continue;
      if (kind[b] === KIND_SPHERICAL) {
        const o = 9 * b;
        rotationFromVectorAt(scratch, 0, h, v);
        const tmp = this.tmp9;
        multiplyMat3(tmp, 0, scratch, 0, sph, o);
        for (let i = 0; i < 9; i++) sph[o + i] = tmp[i];
        orthonormalize(sph, o);
      } else {
        coord[b] += h[v];
      }
    }
  }
  private readonly tmp9 = new Float64Array(9);

  save(): void {
    this.savedCoord.set(this.coord);
    this.savedSph.set(this.sph);
  }

  restore(): void {
    this.inputPosesValid = false;
    this.coord.set(this.savedCoord);
    this.sph.set(this.savedSph);
  }

  /** Copy the solvable state (coordinates and spherical rotations) out or in. */
  getState(coordOut: Float64Array, sphOut: Float64Array): void {
    coordOut.set(this.coord);
    sphOut.set(this.sph);
  }

  setState(coordIn: ArrayLike<number>, sphIn: ArrayLike<number>): void {
    this.coord.set(coordIn);
    this.sph.set(sphIn);
    this.applyInputVector(this.inputVec);
  }

  /**
   * The unknowns as one flat vector in the solver's variable order: the coordinate of each
   * solved revolute or prismatic joint, and for a spherical joint the rotation vector of its
   * rotation (axis times angle, from the design orientation; a smooth chart while the joint
   * turns less than half a revolution, which a ball joint in a suspension always does). The
   * pose solver's predictor extrapolates these.
   */
  getUnknowns(out: Float64Array): void {
    const { coord, sph, kind, firstVar, pa } = this;
    for (let b = 0; b < this.nBodies; b++) {
      const v = firstVar[b];
      if (v < 0) continue;
      if (kind[b] === KIND_SPHERICAL) {
        vectorFromRotation(pa, sph, 9 * b);
        out[v] = pa[0];
        out[v + 1] = pa[1];
        out[v + 2] = pa[2];
      } else {
        out[v] = coord[b];
      }
    }
  }

  /** Set the unknowns from a flat vector laid out as getUnknowns writes it. */
  setUnknowns(x: Float64Array): void {
    const { coord, sph, kind, firstVar } = this;
    for (let b = 0; b < this.nBodies; b++) {
      const v = firstVar[b];
      if (v < 0) continue;
      if (kind[b] === KIND_SPHERICAL) rotationFromVectorAt(sph, 9 * b, x, v);
      else coord[b] = x[v];
    }
  }

  /**
   * Whether any unknown turned by more than limitRad between a stored state and the current
   * one: the test continuation uses to spot a branch jump. A revolute joint compares angles; a
   * spherical joint's turn exceeds the limit when the cosine of its angle, from the trace of
   * S_ref^T S, is below cos(limit) (no arc cosine needed).
   */
  changeExceeds(coordRef: Float64Array, sphRef: Float64Array, limitRad: number): boolean {
    const { coord, sph, kind, firstVar } = this;
    const cosLimit = limitRad < Math.PI ? Math.cos(limitRad) : -1;
    for (let b = 0; b < this.nBodies; b++) {
      if (firstVar[b] < 0) continue;
      if (kind[b] === KIND_SPHERICAL) {
        if (limitRad >= Math.PI) continue;
        const o = 9 * b;
        let tr = 0;
        for (let i = 0; i < 9; i++) tr += sph[o + i] * sphRef[o + i];
        if ((tr - 1) / 2 < cosLimit) return true;
      } else if (kind[b] === KIND_REVOLUTE && Math.abs(coord[b] - coordRef[b]) > limitRad) {
        return true;
      }
    }
    return false;
  }

  /**
   * Move the unknowns from the current state x0 along the line to another state x1:
   * x <- x0 + l (x1 - x0) (l = 1 reaches x1, l = -1 mirrors it about x0). Rotations use
   * rotation vectors relative to the current rotation, which is accurate for the small spans
   * of a sweep. Driven coordinates are left to the inputs. (The sweep predictor extrapolates
   * through more poses with getUnknowns / setUnknowns.)
   */
  extrapolate(c1: Float64Array, s1: Float64Array, l: number): void {
    const { coord, sph, kind, firstVar, tmp9, scratch } = this;
    const w = this.pa;
    for (let b = 0; b < this.nBodies; b++) {
      if (firstVar[b] < 0) continue;
      if (kind[b] === KIND_SPHERICAL) {
        const o = 9 * b;
        relativeRotationVector(w, s1, sph, o, tmp9);
        w[0] *= l;
        w[1] *= l;
        w[2] *= l;
        rotationFromVectorAt(scratch, 0, w, 0);
        multiplyMat3(tmp9, 0, scratch, 0, sph, o);
        for (let i = 0; i < 9; i++) sph[o + i] = tmp9[i];
        orthonormalize(sph, o);
      } else {
        coord[b] += l * (c1[b] - coord[b]);
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
      const cols = new Set<number>([...chain(c.bodyA), ...(c.code === C_COINCIDENT || c.code === C_DISTANCE || c.code === C_HEIGHT ? chain(c.bodyB) : [])]);
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

  /** Value reported for an input by a solved joint (e.g. the handlebar when steering by wheel). */
  reportedInputs(): Partial<PoseInputs> {
    const out: Partial<PoseInputs> = {};
    this.graph.joints.forEach((j, b) => {
      if (j.reportsInput && j.reportsInput.gain !== 0) out[j.reportsInput.input] = this.coord[b] / j.reportsInput.gain;
    });
    return out;
  }
}

function compileConstraint(c: Constraint, row: number, nb: number): CompiledConstraint {
  const base: CompiledConstraint = {
    code: 0,
    row,
    rows: 1,
    bodyA: -1,
    pA: new Float64Array(3),
    bodyB: -1,
    pB: new Float64Array(3),
    length: 0,
    rolling: 0,
    crown: 0,
    gain: 0,
    inputIndex: -1,
    label: c.label,
  };
  const checkBody = (b: number) => {
    if (!(b >= -1 && b < nb)) throw new Error(`constraint "${c.label}" names body ${b}, which does not exist`);
    return b;
  };
  switch (c.kind) {
    case 'coincident':
      base.code = C_COINCIDENT;
      base.rows = 3;
      base.bodyA = checkBody(c.bodyA);
      base.pA.set(c.pointA);
      base.bodyB = checkBody(c.bodyB);
      base.pB.set(c.pointB);
      break;
    case 'distance':
      base.code = C_DISTANCE;
      base.bodyA = checkBody(c.bodyA);
      base.pA.set(c.pointA);
      base.bodyB = checkBody(c.bodyB);
      base.pB.set(c.pointB);
      base.length = c.length;
      break;
    case 'groundContact':
      base.code = C_GROUND;
      base.bodyA = checkBody(c.body);
      base.pA.set(c.wheelCentre);
      base.pB.set(unit(c.spinAxis));
      base.rolling = c.rollingRadius;
      base.crown = c.crownRadius;
      break;
    case 'pointHeight':
      base.code = C_HEIGHT;
      base.bodyA = checkBody(c.body);
      base.pA.set(c.point);
      base.bodyB = checkBody(c.refBody);
      base.gain = c.target.gain;
      base.inputIndex = INPUT_NAMES.indexOf(c.target.input);
      break;
    case 'wheelHeading':
      base.code = C_HEADING;
      base.bodyA = checkBody(c.body);
      base.pB.set(unit(c.spinAxis));
      base.gain = c.target.gain;
      base.inputIndex = INPUT_NAMES.indexOf(c.target.input);
      break;
  }
  return base;
}

/** Rotation vector of other * current^T (the rotation taking the current state to another). */
function relativeRotationVector(out: Float64Array, other: Float64Array, current: Float64Array, o: number, tmp: Float64Array): void {
  // (other current^T)_rc = sum_k other_rk current_ck, column-major m_rc = m[o + c*3 + r]:
  // row r of a matrix is (m[o + r], m[o + 3 + r], m[o + 6 + r]).
  const a0 = other[o], a1 = other[o + 1], a2 = other[o + 2];
  const a3 = other[o + 3], a4 = other[o + 4], a5 = other[o + 5];
  const a6 = other[o + 6], a7 = other[o + 7], a8 = other[o + 8];
  const b0 = current[o], b1 = current[o + 1], b2 = current[o + 2];
  const b3 = current[o + 3], b4 = current[o + 4], b5 = current[o + 5];
  const b6 = current[o + 6], b7 = current[o + 7], b8 = current[o + 8];
  for (let c = 0; c < 3; c++) {
    const c0 = c === 0 ? b0 : c === 1 ? b1 : b2;
    const c1 = c === 0 ? b3 : c === 1 ? b4 : b5;
    const c2 = c === 0 ? b6 : c === 1 ? b7 : b8;
    tmp[c * 3] = a0 * c0 + a3 * c1 + a6 * c2;
    tmp[c * 3 + 1] = a1 * c0 + a4 * c1 + a7 * c2;
    tmp[c * 3 + 2] = a2 * c0 + a5 * c1 + a8 * c2;
  }
  vectorFromRotation(out, tmp, 0);
}

function unit(v: Vec3): Vec3 {
  const n = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / n, v[1] / n, v[2] / n];
}

/** out[3b..] = R_p t + t_p: a translation in the parent's frame carried into the world. */
function placeOffset(out: Float64Array, b: number, rot: Float64Array, po: number, trans: Float64Array, p: number, t0: number, t1: number, t2: number): void {
  out[3 * b] = rot[po] * t0 + rot[po + 3] * t1 + rot[po + 6] * t2 + trans[3 * p];
  out[3 * b + 1] = rot[po + 1] * t0 + rot[po + 4] * t1 + rot[po + 7] * t2 + trans[3 * p + 1];
  out[3 * b + 2] = rot[po + 2] * t0 + rot[po + 5] * t1 + rot[po + 8] * t2 + trans[3 * p + 2];
}

function setIdentity(m: Float64Array, o: number): void {
  m[o] = 1; m[o + 1] = 0; m[o + 2] = 0;
  m[o + 3] = 0; m[o + 4] = 1; m[o + 5] = 0;
  m[o + 6] = 0; m[o + 7] = 0; m[o + 8] = 1;
}

function wrapAngle(a: number): number {
  return a - 2 * Math.PI * Math.round(a / (2 * Math.PI));
}
