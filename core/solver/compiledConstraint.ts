/**
 * Loop closures compiled for the residual and Jacobian loops: one flat record per constraint
 * of the mechanism graph, its kind as a small integer (a switch on it stays monomorphic where
 * a switch on the graph's string kinds would not), its first residual row and its data.
 */

import { INPUT_NAMES, type Constraint, type Vec3 } from '../mechanism/MechanismGraph';

export const C_COINCIDENT = 0;
export const C_DISTANCE = 1;
export const C_GROUND = 2;
export const C_HEIGHT = 3;
export const C_HEADING = 4;
export const C_MEAN_Y = 5;

/** Every constraint kind in one shape (unused fields stay zero), so the loops see one hidden class. */
export interface CompiledConstraint {
  code: number;
  row: number;
  rows: number;
  bodyA: number;
  pA: Float64Array;
  bodyB: number;
  pB: Float64Array;
  /** Second wheel's centre and spin axis (mean contact y only). */
  pC: Float64Array;
  pD: Float64Array;
  length: number;
  rolling: number;
  crown: number;
  gain: number;
  inputIndex: number;
  label: string;
}

/** Compile one constraint starting at residual row `row`; throws if it names a body that does not exist. */
export function compileConstraint(c: Constraint, row: number, nb: number): CompiledConstraint {
  const base: CompiledConstraint = {
    code: 0,
    row,
    rows: 1,
    bodyA: -1,
    pA: new Float64Array(3),
    bodyB: -1,
    pB: new Float64Array(3),
    pC: new Float64Array(3),
    pD: new Float64Array(3),
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
    case 'meanContactY':
      base.code = C_MEAN_Y;
      base.bodyA = checkBody(c.bodyA);
      base.pA.set(c.centreA);
      base.pB.set(unit(c.spinAxisA));
      base.bodyB = checkBody(c.bodyB);
      base.pC.set(c.centreB);
      base.pD.set(unit(c.spinAxisB));
      base.rolling = c.rollingRadius;
      base.crown = c.crownRadius;
      break;
  }
  return base;
}

function unit(v: Vec3): Vec3 {
  const n = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / n, v[1] / n, v[2] / n];
}
