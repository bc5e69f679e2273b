/**
 * A kingpin upright (`upright.steeringAxis: "kingpin"`): the upright turns on a kingpin bolt
 * in a yoke (the knuckle carrier), and the yoke, not the upright, is what the wishbones or
 * members hold at their outer joints. So the outer joints move with the suspension only and
 * never see the steering; the steering is the revolute joint between yoke and upright.
 *
 * Tree, per side:  lower carrier -> yoke cross -> yoke -> upright
 *   yoke cross  revolute at the lower outer joint about the lower carrier's own pivot axis a;
 *   yoke        revolute at the lower outer joint about b = k x a (unit), across both;
 *   upright     revolute at the lower outer joint about the kingpin axis k (lower to upper joint).
 * The upper outer joint closes the loop on the yoke (coincident with the upper carrier; the
 * template adds it).
 *
 * Why a cross at the lower joint and a ball at the upper one. A yoke hung on two balls could
 * spin freely about the kingpin axis (the line through them), which no real yoke does: it is
 * held by pivots (trunnions) whose bolts run along the members' pivot axes. But a pivot at each
 * end over-constrains the yoke unless the upper and lower pivot axes are parallel (a planar
 * four-bar); split wishbones with converging or anti-dive pivot axes would jam. The lower joint
 * as a universal joint (the cross: a fixed in the carrier, b fixed in the yoke) and the upper as
 * a ball removes exactly the yoke's spin: the cross blocks rotation about a x b, which has a
 * component |k x a| along the kingpin axis. Where the members' pivot axes are parallel this
 * moves like two trunnions: turning about b would tilt the upper joint out of the upper
 * member's plane of motion, so the cross's second pivot stays at its design angle.
 */

import type { Side } from '../../design/types';
import type { Vec3 } from '../MechanismGraph';
import type { MechanismBuilder } from './mechanismBuilder';

export interface KingpinUpright {
  /** The yoke: the body the outer joints hold (upper closure and both articulations). */
  yoke: number;
  /** The upright: carries the steering arm and the wheel, turns in the yoke about the kingpin. */
  upright: number;
}

/** Below this |k x a| the kingpin is taken as parallel to the lower pivot axis. */
const PARALLEL_SINE = 1e-9;

const unit = (p: Vec3): Vec3 | null => {
  const n = Math.hypot(p[0], p[1], p[2]);
  return n > 0 ? [p[0] / n, p[1] / n, p[2] / n] : null;
};
const cross = (a: Vec3, c: Vec3): Vec3 => [a[1] * c[2] - a[2] * c[1], a[2] * c[0] - a[0] * c[2], a[0] * c[1] - a[1] * c[0]];

/** Adds the yoke cross, the yoke and the upright of one side; `lower`/`upper` are the outer joints. */
export function addKingpinUpright(b: MechanismBuilder, side: Side, lowerCarrier: number, lower: Vec3, upper: Vec3): KingpinUpright {
  const a = unit(b.joints[lowerCarrier].axis) ?? [1, 0, 0];
  // Validation refuses coincident outer joints; a hand-built design still gets a valid graph.
  const k = unit([upper[0] - lower[0], upper[1] - lower[1], upper[2] - lower[2]]) ?? [0, 0, 1];
  // A kingpin parallel to the lower pivot axis leaves the yoke's spin free whatever the cross
  // does; any axis across a keeps the graph valid and the solve then reports it singular.
  const across = Math.hypot(...cross(k, a)) > PARALLEL_SINE ? cross(k, a) : cross(a, Math.abs(a[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0]);
  const bAxis = unit(across)!;
  const crossBody = b.addBody(`${side}.yokeCross`, `${side} kingpin yoke cross`, {
    kind: 'revolute',
    parent: lowerCarrier,
    origin: lower,
    axis: a,
  });
  const yoke = b.addBody(`${side}.yoke`, `${side} kingpin yoke`, { kind: 'revolute', parent: crossBody, origin: lower, axis: bAxis });
  const upright = b.addBody(`${side}.upright`, `${side} upright`, { kind: 'revolute', parent: yoke, origin: lower, axis: k });
  return { yoke, upright };
}
