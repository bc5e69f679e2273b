/**
 * What the viewport draws for a design, as data: tubes between points, joints, lines, wheels.
 * Points are named mechanism points (moved by the solver) or design points fixed in a body
 * (placed with that body's pose). Pure reshaping of the design; positions come from core.
 */
import type { ResolvedDesign, Side, Vec3Mm } from '../../core/design/types';
import { PART_COLOUR } from '../model/severity';

export type Vec3 = [number, number, number];
export type PointRef = { named: string } | { body: string; design: Vec3 };

export type PartClass = 'frame' | 'wishbone' | 'upright' | 'steering' | 'tieRod' | 'spring' | 'handlebar';

export interface TubeSpec {
  id: string;
  label: string;
  a: PointRef;
  b: PointRef;
  radius: number;
  colour: string;
  part: PartClass;
  /** The loop-closing constraint this part stands for (coloured when it cannot close). */
  constraintId?: string;
}

export interface JointSpec {
  /** Mechanism point id, which is also the hardpoint row id. */
  id: string;
  label: string;
  radius: number;
  at: PointRef;
}

export interface AxisLineSpec {
  id: string;
  label: string;
  /** Drawn from `a` through `b` and on down to the ground. */
  a: PointRef;
  b: PointRef;
  toGround: boolean;
  colour: string;
}

export interface RearWheelSpec {
  id: string;
  centre: Vec3;
  rollingRadius: number;
  crownRadius: number;
  width: number;
}

export interface Topology {
  tubes: TubeSpec[];
  joints: JointSpec[];
  axisLines: AxisLineSpec[];
  rearWheels: RearWheelSpec[];
  /** Plan outline of the body, drawn on the frame just above the ground. */
  outline: Vec3[];
  /** Where the symbolic handlebar sits, in the frame. */
  handlebarAt: Vec3;
  front: { rollingRadius: number; crownRadius: number; width: number };
}

const v = (p: Vec3Mm): Vec3 => [p.x, p.y, p.z];
const mid = (a: Vec3Mm, b: Vec3Mm): Vec3 => [(a.x + b.x) / 2, (a.y + b.y) / 2, (a.z + b.z) / 2];
const named = (id: string): PointRef => ({ named: id });
const onBody = (body: string, p: Vec3Mm | Vec3): PointRef => ({ body, design: Array.isArray(p) ? p : v(p) });

const SIDES: readonly Side[] = ['right', 'left'];

export function buildTopology(d: ResolvedDesign): Topology {
  const tubes: TubeSpec[] = [];
  const axisLines: AxisLineSpec[] = [];
  const joints: JointSpec[] = [];
  const parts = d.parts;
  const tube = (t: Omit<TubeSpec, 'colour'> & { colour?: string }) =>
    tubes.push({ colour: PART_COLOUR[t.part === 'handlebar' ? 'steering' : t.part], ...t });
  const joint = (id: string, label: string, radius = 13, at: PointRef = named(id)) => joints.push({ id, label, radius, at });
  const fe = d.frontEnd;
  const frameR = parts.wishboneTubeRadiusMm * 0.8;

  // Front end.
  if (fe.kind === 'splitWishbones') {
    for (const side of SIDES) {
      for (const level of ['upper', 'lower'] as const) {
        const base = `frontEnd.${level}`;
        const label = `${side} ${level} wishbone`;
        tube({ id: `${side}.${level}.front`, label, a: named(`${base}.frontPivot.${side}`), b: named(`${base}.outerJoint.${side}`), radius: parts.wishboneTubeRadiusMm, part: 'wishbone' });
        tube({ id: `${side}.${level}.rear`, label, a: named(`${base}.rearPivot.${side}`), b: named(`${base}.outerJoint.${side}`), radius: parts.wishboneTubeRadiusMm, part: 'wishbone' });
        joint(`${base}.frontPivot.${side}`, `${label} front pivot`, 11);
        joint(`${base}.rearPivot.${side}`, `${label} rear pivot`, 11);
      }
      // Frame rails the wishbones pivot on, and the frame box between them.
      for (const level of ['upper', 'lower'] as const) {
        tube({ id: `frame.${side}.${level}Rail`, label: `${side} ${level} frame rail`, a: onBody('frame', fe[level].frontPivot[side]), b: onBody('frame', fe[level].rearPivot[side]), radius: frameR, part: 'frame' });
      }
      tube({ id: `frame.${side}.front`, label: 'frame', a: onBody('frame', fe.upper.frontPivot[side]), b: onBody('frame', fe.lower.frontPivot[side]), radius: frameR, part: 'frame' });
      tube({ id: `frame.${side}.rear`, label: 'frame', a: onBody('frame', fe.upper.rearPivot[side]), b: onBody('frame', fe.lower.rearPivot[side]), radius: frameR, part: 'frame' });
    }
    for (const level of ['upper', 'lower'] as const) {
      for (const end of ['frontPivot', 'rearPivot'] as const) {
        tube({ id: `frame.${level}.${end}`, label: 'frame', a: onBody('frame', fe[level][end].right), b: onBody('frame', fe[level][end].left), radius: frameR, part: 'frame' });
      }
    }
  } else {
    for (const level of ['upper', 'lower'] as const) {
      const m = fe[level];
      const body = `${level}Member`;
      for (const side of SIDES) {
        tube({ id: `${level}Member.${side}`, label: `${level} centre member`, a: named(`frontEnd.${level}.pivot`), b: onBody(body, m.outerJoint[side]), radius: parts.wishboneTubeRadiusMm, part: 'wishbone' });
      }
      joint(`frontEnd.${level}.pivot`, `${level} member centre pivot`, 14);
    }
    tube({ id: 'frame.post', label: 'frame', a: onBody('frame', fe.upper.pivot), b: onBody('frame', fe.lower.pivot), radius: frameR, part: 'frame' });
  }

  // Uprights, spindles, steering arms.
  for (const side of SIDES) {
    const up = fe.upper.outerJoint[side];
    const lo = fe.lower.outerJoint[side];
    const body = `${side}.upright`;
    const kingpinMid = mid(up, lo);
    tube({ id: `${side}.upright`, label: `${side} upright`, a: named(`frontEnd.upper.outerJoint.${side}`), b: named(`frontEnd.lower.outerJoint.${side}`), radius: 12, part: 'upright', constraintId: `${side}.upperOuterJoint` });
    tube({ id: `${side}.spindle`, label: `${side} spindle`, a: onBody(body, kingpinMid), b: named(`upright.wheelCentre.${side}`), radius: 10, part: 'upright', constraintId: `${side}.groundContact` });
    tube({ id: `${side}.steeringArm`, label: `${side} steering arm`, a: onBody(body, kingpinMid), b: named(`upright.steeringArmJoint.${side}`), radius: parts.steeringArmRadiusMm, part: 'upright' });
    tube({ id: `${side}.tieRod`, label: `${side} tie rod`, a: named(`steering.tieRodJoint.${side}`), b: named(`upright.steeringArmJoint.${side}`), radius: parts.tieRodRadiusMm, part: 'tieRod', constraintId: `${side}.tieRod` });
    axisLines.push({ id: `${side}.steeringAxis`, label: `${side} steering axis`, a: named(`frontEnd.upper.outerJoint.${side}`), b: named(`frontEnd.lower.outerJoint.${side}`), toGround: true, colour: PART_COLOUR.axis });
    joint(`frontEnd.upper.outerJoint.${side}`, `${side} upper outer joint`, 15);
    joint(`frontEnd.lower.outerJoint.${side}`, `${side} lower outer joint`, 15);
    joint(`upright.steeringArmJoint.${side}`, `${side} tie rod outer joint`, 12);
    joint(`upright.wheelCentre.${side}`, `${side} wheel centre`, 9);
    joint(`steering.tieRodJoint.${side}`, `${side} tie rod inner joint`, 12);
  }

  // Steering mechanism.
  const st = d.steering;
  let handlebarAt: Vec3;
  const topZ = Math.max(fe.upper.outerJoint.right.z, fe.upper.outerJoint.left.z);
  if (st.kind === 'rack') {
    tube({ id: 'rack', label: 'rack', a: named('steering.tieRodJoint.right'), b: named('steering.tieRodJoint.left'), radius: 11, part: 'steering' });
    const r = st.tieRodJoint.right;
    handlebarAt = [r.x - 150, 0, topZ + 150];
  } else {
    const pivotLabel = st.kind === 'bellCrank' ? 'bell crank' : 'steering lever';
    for (const side of SIDES) {
      tube({ id: `crank.${side}`, label: pivotLabel, a: named('steering.pivot'), b: named(`steering.tieRodJoint.${side}`), radius: 9, part: 'steering' });
    }
    joint('steering.pivot', `${pivotLabel} pivot`, 13);
    const body = st.kind === 'bellCrank' ? 'bellCrank' : 'column';
    const ax = st.axis;
    const n = Math.hypot(ax.x, ax.y, ax.z) || 1;
    const k = 90 / n;
    axisLines.push({
      id: 'steering.axis',
      label: `${pivotLabel} axis`,
      a: onBody(body, [st.pivot.x - ax.x * k, st.pivot.y - ax.y * k, st.pivot.z - ax.z * k]),
      b: onBody(body, [st.pivot.x + ax.x * k, st.pivot.y + ax.y * k, st.pivot.z + ax.z * k]),
      toGround: false,
      colour: PART_COLOUR.axis,
    });
    handlebarAt = [st.pivot.x, 0, Math.max(st.pivot.z, topZ) + 150];
    if (st.kind === 'bellCrank' && st.input.kind === 'dragLink') {
      const inp = st.input;
      tube({ id: 'column', label: 'steering column arm', a: named('steering.input.columnPivot'), b: named('steering.input.columnArmJoint'), radius: 9, part: 'steering' });
      tube({ id: 'dragLink', label: 'drag link', a: named('steering.input.columnArmJoint'), b: named('steering.input.crankArmJoint'), radius: parts.tieRodRadiusMm, part: 'tieRod', constraintId: 'dragLink' });
      tube({ id: 'crankInput', label: 'crank input arm', a: named('steering.pivot'), b: named('steering.input.crankArmJoint'), radius: 9, part: 'steering' });
      joint('steering.input.columnPivot', 'steering column pivot', 13);
      joint('steering.input.columnArmJoint', 'column arm joint', 12);
      joint('steering.input.crankArmJoint', 'crank input arm joint', 12);
      handlebarAt = [inp.columnPivot.x, 0, Math.max(inp.columnPivot.z, topZ) + 150];
    }
  }

  // Spring or damper.
  if (d.spring) {
    const sp = d.spring;
    for (const side of SIDES) {
      const armBody = fe.kind === 'splitWishbones' ? `${side}.${sp.on}Wishbone` : `${sp.on}Member`;
      tube({ id: `${side}.spring`, label: `${side} spring`, a: onBody('frame', sp.frameMount[side]), b: onBody(armBody, sp.armMount[side]), radius: 16, part: 'spring' });
      joint(`spring.frameMount.${side}`, `${side} spring frame mount`, 10, onBody('frame', sp.frameMount[side]));
      joint(`spring.armMount.${side}`, `${side} spring arm mount`, 10, onBody(armBody, sp.armMount[side]));
    }
  }

  // Frame spine to the rear wheel(s).
  const L = d.vehicle.wheelbaseMm;
  const rr = d.wheels.rear.rollingRadiusMm;
  const frontX = fe.kind === 'splitWishbones' ? (fe.lower.frontPivot.right.x + fe.lower.rearPivot.right.x) / 2 : fe.lower.pivot.x;
  const frontZ = fe.kind === 'splitWishbones' ? fe.lower.frontPivot.right.z : fe.lower.pivot.z;
  const rearWheels: RearWheelSpec[] = [];
  const rearTyre = { rollingRadius: rr, crownRadius: d.wheels.rear.crownRadiusMm, width: d.wheels.rear.tyreWidthMm };
  if (d.vehicle.rear.kind === 'single') {
    rearWheels.push({ id: 'rear', centre: [-L, 0, rr], ...rearTyre });
    tube({ id: 'frame.spine', label: 'frame', a: onBody('frame', [frontX, 0, frontZ]), b: onBody('frame', [-L, 0, rr]), radius: frameR * 1.3, part: 'frame' });
  } else {
    const half = d.vehicle.rear.trackMm / 2;
    rearWheels.push({ id: 'rear.right', centre: [-L, -half, rr], ...rearTyre }, { id: 'rear.left', centre: [-L, half, rr], ...rearTyre });
    tube({ id: 'frame.spine', label: 'frame', a: onBody('frame', [frontX, 0, frontZ]), b: onBody('frame', [-L, 0, rr]), radius: frameR * 1.3, part: 'frame' });
    tube({ id: 'frame.rearAxle', label: 'frame', a: onBody('frame', [-L, -half, rr]), b: onBody('frame', [-L, half, rr]), radius: frameR, part: 'frame' });
  }

  const outline: Vec3[] = (d.vehicle.bodyOutline ?? []).map((p) => [p.x, p.y, 4]);
  return {
    tubes,
    joints,
    axisLines,
    rearWheels,
    outline,
    handlebarAt,
    front: { rollingRadius: d.wheels.front.rollingRadiusMm, crownRadius: d.wheels.front.crownRadiusMm, width: d.wheels.front.tyreWidthMm },
  };
}
