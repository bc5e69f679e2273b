/**
 * The joint tree of a mechanism graph, compiled to flat Float64Arrays: the solvable state
 * (one coordinate per revolute or prismatic joint, a rotation matrix per spherical joint),
 * forward kinematics from it to every body's pose, and the ways the solver moves the state
 * (a step of the unknowns, saving and restoring, the unknowns as one flat vector for the
 * predictor, extrapolation along a sweep, the branch-jump test). Loop closures (residuals
 * and their Jacobian) are CompiledMechanism's, which extends this class.
 *
 * Coordinates: a revolute or prismatic joint has one coordinate (radians, mm); a spherical
 * joint keeps a rotation matrix S and is stepped on its manifold, S <- exp(delta) S with
 * delta in the parent's frame, so there is no gimbal singularity. Driven joints follow
 * inputs and are not unknowns.
 */

import { rotationAboutAxis, rotationFromVectorAt, multiplyMat3, orthonormalize, vectorFromRotation } from '../math/rotation';
import { INPUT_NAMES, type MechanismGraph, type PoseInputs } from '../mechanism/MechanismGraph';

export const KIND_REVOLUTE = 0;
export const KIND_PRISMATIC = 1;
export const KIND_SPHERICAL = 2;

export class KinematicTree {
  readonly graph: MechanismGraph;
  readonly nBodies: number;
  readonly nVars: number;
  /** Body poses: rotation (column-major 3x3) and translation, design -> world. */
  readonly rot: Float64Array;
  readonly trans: Float64Array;
  /** One coordinate per body's joint (revolute angle, prismatic slide); unused for spherical. */
  readonly coord: Float64Array;
  /** Spherical joints' rotation matrices, 9 per body (identity for others). */
  readonly sph: Float64Array;

  protected readonly parent: Int32Array;
  protected readonly kind: Int32Array;
  protected readonly origin: Float64Array;
  protected readonly axis: Float64Array;
  /** First unknown of each body's joint, or -1 when driven. */
  protected readonly firstVar: Int32Array;
  /** Unknowns that move each body: chainVars[chainStart[b] .. chainStart[b+1]); the ground is body nBodies + 1. */
  protected readonly chainStart: Int32Array;
  protected readonly chainVars: Int32Array;
  private readonly jointRot: Float64Array;
  /** Inputs in INPUT_NAMES order (typed, so the hot loops index instead of keying by name). */
  protected readonly inputVec = new Float64Array(INPUT_NAMES.length);
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
  private readonly tmp9 = new Float64Array(9);
  /** Scratch rotation vector for getUnknowns and extrapolate. */
  private readonly rotationVector = new Float64Array(3);

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
    let nVars = 0;
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
        this.firstVar[b] = nVars;
        nVars += j.kind === 'spherical' ? 3 : 1;
      }
    }
    this.nVars = nVars;

    const chains = unknownChains(this.parent, this.kind, this.firstVar);
    this.chainStart = chains.start;
    this.chainVars = chains.vars;
    this.inputOnly = Uint8Array.from({ length: nb }, (_, b) => (this.chainStart[b] === this.chainStart[b + 1] ? 1 : 0));
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

  /** Apply an increment of the unknowns: a spherical joint turns by exp(delta) on its manifold. */
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
    const { coord, sph, kind, firstVar } = this;
    const pa = this.rotationVector;
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
    const w = this.rotationVector;
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

  /** Value reported for an input by a solved joint (e.g. the handlebar when steering by wheel). */
  reportedInputs(): Partial<PoseInputs> {
    const out: Partial<PoseInputs> = {};
    this.graph.joints.forEach((j, b) => {
      if (j.reportsInput && j.reportsInput.gain !== 0) out[j.reportsInput.input] = this.coord[b] / j.reportsInput.gain;
    });
    return out;
  }
}

/**
 * For each body, the unknowns that move it: its own joint's, then its parent's chain, down to
 * the ground. Flattened: body b's are vars[start[b] .. start[b + 1]); the ground (body -1,
 * looked up as nb + 1) has none.
 */
function unknownChains(parent: Int32Array, kind: Int32Array, firstVar: Int32Array): { start: Int32Array; vars: Int32Array } {
  const nb = parent.length;
  const chains: number[][] = [];
  for (let b = 0; b < nb; b++) {
    const own: number[] = [];
    if (firstVar[b] >= 0) {
      const count = kind[b] === KIND_SPHERICAL ? 3 : 1;
      for (let s = 0; s < count; s++) own.push(firstVar[b] + s);
    }
    const p = parent[b];
    chains.push(p >= 0 ? own.concat(chains[p]) : own);
  }
  // Two entries past the bodies: a ground lookup (index nb + 1) reads start[nb + 1] and start[nb + 2].
  const start = new Int32Array(nb + 3);
  const flat: number[] = [];
  for (let b = 0; b < nb; b++) {
    start[b] = flat.length;
    flat.push(...chains[b]);
  }
  start[nb] = flat.length;
  start[nb + 1] = flat.length;
  start[nb + 2] = flat.length;
  return { start, vars: Int32Array.from(flat) };
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
