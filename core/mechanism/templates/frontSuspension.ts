/**
 * The front suspension's bodies: a wishbone per side and level (split wishbones), or one
 * member per level pivoting at the centre (centre-pivot parallelogram), each on a revolute
 * joint in the frame; with their pivot points and the frame tubes they mount on. Held (the
 * pose mode's `hold: 'suspension'`), each of those joints stays at its design angle.
 */

import type { ResolvedDesign, Side } from '../../design/types';
import type { DrawingPointRef } from '../drawingLayout';
import type { InputBinding } from '../MechanismGraph';
import { SIDES, sub, v, type MechanismBuilder } from './mechanismBuilder';

export type Level = 'upper' | 'lower';
export const LEVELS: readonly Level[] = ['upper', 'lower'];

type SplitFrontEnd = Extract<ResolvedDesign['frontEnd'], { kind: 'splitWishbones' }>;
type CentreFrontEnd = Extract<ResolvedDesign['frontEnd'], { kind: 'centrePivot' }>;

/** Per side and level, what the arms reach out to (the outer joints, once the uprights exist). */
export type OuterJoints = Record<Side, Record<Level, DrawingPointRef>>;

export interface Suspension {
  /** Per side, the body carrying each level's outer joint (the lower one carries the upright). */
  carrier: Record<Side, Record<Level, number>>;
  /** Draws the arms from their inner pivots out to the outer joints. */
  drawArms(outer: OuterJoints): void;
}

/**
 * A joint held at its design angle: driven at zero gain, so its coordinate is 0 whatever the
 * input (the graph has no fixed joint kind, and a driven joint is no unknown for the solver).
 */
type Hold = { driver?: InputBinding };
const HELD: Hold = { driver: { input: 'heaveMm', gain: 0 } };

export function addFrontSuspension(b: MechanismBuilder, design: ResolvedDesign, frame: number, held = false): Suspension {
  const fe = design.frontEnd;
  const radius = design.parts.wishboneTubeRadiusMm;
  const hold: Hold = held ? HELD : {};
  return fe.kind === 'splitWishbones' ? addSplitWishbones(b, fe, frame, radius, hold) : addCentreMembers(b, fe, frame, radius, hold);
}

function addSplitWishbones(b: MechanismBuilder, fe: SplitFrontEnd, frame: number, radius: number, hold: Hold): Suspension {
  const carrier = { right: { upper: -1, lower: -1 }, left: { upper: -1, lower: -1 } };
  const pivots = new Map<string, { front: DrawingPointRef; rear: DrawingPointRef }>();
  for (const side of SIDES) {
    for (const level of LEVELS) {
      const w = fe[level];
      const label = `${side} ${level} wishbone`;
      const body = b.addBody(`${side}.${level}Wishbone`, label, {
        kind: 'revolute',
        parent: frame,
        origin: v(w.frontPivot[side]),
        axis: sub(w.frontPivot[side], w.rearPivot[side]),
        ...hold,
      });
      const front = b.addPoint(`frontEnd.${level}.frontPivot.${side}`, `${label} front pivot`, body, w.frontPivot[side]);
      const rear = b.addPoint(`frontEnd.${level}.rearPivot.${side}`, `${label} rear pivot`, body, w.rearPivot[side]);
      b.jointAt(front, `${level} wishbone front pivot, ${side}`, 11);
      b.jointAt(rear, `${level} wishbone rear pivot, ${side}`, 11);
      carrier[side][level] = body;
      pivots.set(`${side}.${level}`, { front, rear });
    }
  }
  drawSplitFrame(b, fe, frame, radius * 0.8);
  return {
    carrier,
    drawArms(outer) {
      for (const side of SIDES) {
        for (const level of LEVELS) {
          const { front, rear } = pivots.get(`${side}.${level}`)!;
          const label = `${side} ${level} wishbone`;
          const legs = [
            b.tube(`${side}.${level}.front`, { label: `${label}, front leg`, part: 'wishbone', a: front, b: outer[side][level], radius }),
            b.tube(`${side}.${level}.rear`, { label: `${label}, rear leg`, part: 'wishbone', a: rear, b: outer[side][level], radius }),
          ];
          b.shows({ kind: 'clearance', part: level === 'upper' ? 'upperArm' : 'lowerArm', side }, ...legs);
        }
      }
    },
  };
}

/** The frame rails the wishbones pivot on, and the frame box between them. */
function drawSplitFrame(b: MechanismBuilder, fe: SplitFrontEnd, frame: number, radius: number): void {
  const at = (p: Parameters<MechanismBuilder['onBody']>[1]) => b.onBody(frame, p);
  for (const side of SIDES) {
    for (const level of LEVELS) {
      const rail = b.tube(`frame.${side}.${level}Rail`, {
        label: `${side} ${level} frame rail`,
        part: 'frame',
        a: at(fe[level].frontPivot[side]),
        b: at(fe[level].rearPivot[side]),
        radius,
      });
      b.shows({ kind: 'clearance', part: level === 'upper' ? 'upperRail' : 'lowerRail', side }, rail);
    }
    b.tube(`frame.${side}.front`, { label: `frame, ${side} front post`, part: 'frame', a: at(fe.upper.frontPivot[side]), b: at(fe.lower.frontPivot[side]), radius });
    b.tube(`frame.${side}.rear`, { label: `frame, ${side} rear post`, part: 'frame', a: at(fe.upper.rearPivot[side]), b: at(fe.lower.rearPivot[side]), radius });
  }
  for (const level of LEVELS) {
    for (const end of ['frontPivot', 'rearPivot'] as const) {
      b.tube(`frame.${level}.${end}`, {
        label: `frame, ${level} cross tube at the ${end === 'frontPivot' ? 'front' : 'rear'} pivots`,
        part: 'frame',
        a: at(fe[level][end].right),
        b: at(fe[level][end].left),
        radius,
      });
    }
  }
}

function addCentreMembers(b: MechanismBuilder, fe: CentreFrontEnd, frame: number, radius: number, hold: Hold): Suspension {
  const carrier = { right: { upper: -1, lower: -1 }, left: { upper: -1, lower: -1 } };
  const members = new Map<Level, { body: number; pivot: DrawingPointRef }>();
  for (const level of LEVELS) {
    const m = fe[level];
    const body = b.addBody(`${level}Member`, `${level} centre member`, {
      kind: 'revolute',
      parent: frame,
      origin: v(m.pivot),
      axis: v(m.pivotAxis),
      ...hold,
    });
    const pivot = b.addPoint(`frontEnd.${level}.pivot`, `${level} member centre pivot`, body, m.pivot);
    b.jointAt(pivot, `${level} member centre pivot`, 14);
    for (const side of SIDES) carrier[side][level] = body;
    members.set(level, { body, pivot });
  }
  b.tube('frame.post', { label: 'frame post between the member pivots', part: 'frame', a: b.onBody(frame, fe.upper.pivot), b: b.onBody(frame, fe.lower.pivot), radius: radius * 0.8 });
  return {
    carrier,
    // Each member reaches its outer joints as drawn on the member (the upright meets it there).
    drawArms() {
      for (const level of LEVELS) {
        const { body, pivot } = members.get(level)!;
        for (const side of SIDES) {
          const arm = b.tube(`${level}Member.${side}`, {
            label: `${level} centre member, ${side} arm`,
            part: 'wishbone',
            a: pivot,
            b: b.onBody(body, fe[level].outerJoint[side]),
            radius,
          });
          b.shows({ kind: 'clearance', part: level === 'upper' ? 'upperArm' : 'lowerArm', side }, arm);
        }
      }
    },
  };
}
