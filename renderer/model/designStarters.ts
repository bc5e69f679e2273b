/**
 * Starting blocks when the user switches the layout, the steering kind or the crank input,
 * or adds a spring. Each keeps the points the new block shares with the old one (outer
 * joints, tie-rod joints) and puts new points at plain offsets from them, for the user to
 * move. Pure reshaping of the design document.
 */
import { resolveDesign } from '../../core/design/resolveDesign';
import type { DesignFile, FrontEnd, Steering, CrankInput, LeanLinkage, SpringMount, Vec3Mm } from '../../core/design/types';

const p = (x: number, y: number, z: number): Vec3Mm => ({ x, y, z });

export function starterFrontEnd(d: DesignFile, kind: FrontEnd['kind']): FrontEnd {
  const r = resolveDesign(d);
  const fe = r.frontEnd;
  if (kind === fe.kind) return d.frontEnd;
  if (kind === 'centrePivot' && fe.kind === 'splitWishbones') {
    const member = (level: 'upper' | 'lower') => {
      const w = fe[level];
      const x = Math.round((w.frontPivot.right.x + w.rearPivot.right.x) / 2);
      return { pivot: p(x, 0, w.frontPivot.right.z), pivotAxis: p(1, 0, 0), outerJoint: d.frontEnd[level].outerJoint };
    };
    return { kind: 'centrePivot', upper: member('upper'), lower: member('lower') };
  }
  if (kind === 'splitWishbones' && fe.kind === 'centrePivot') {
    const wishbone = (level: 'upper' | 'lower') => {
      const m = fe[level];
      return { frontPivot: p(m.pivot.x + 100, -60, m.pivot.z), rearPivot: p(m.pivot.x - 100, -60, m.pivot.z), outerJoint: d.frontEnd[level].outerJoint };
    };
    return { kind: 'splitWishbones', upper: wishbone('upper'), lower: wishbone('lower') };
  }
  return d.frontEnd;
}

export function starterSteering(d: DesignFile, kind: Steering['kind']): Steering {
  if (kind === d.steering.kind) return d.steering;
  const r = resolveDesign(d);
  if (kind === 'trackRod') return { kind: 'trackRod', drive: starterDragLinkToUpright(r) };
  // From a track rod (no inner joints): the tie rods' inner ends 60 % of the way in from the steering arms.
  const arm = r.upright.steeringArmJoint.right;
  const fromArm = p(arm.x, Math.round(arm.y * 0.4 * 10) / 10, arm.z);
  const tie = r.steering.kind === 'trackRod' ? fromArm : r.steering.tieRodJoint.right;
  const keep = d.steering.kind === 'trackRod' ? fromArm : d.steering.tieRodJoint;
  if (kind === 'rack') return { kind: 'rack', axis: p(0, -1, 0), tieRodJoint: keep, mmPerHandlebarDeg: 0.5 };
  const pivot = p(tie.x + 40, 0, tie.z);
  if (kind === 'direct') return { kind: 'direct', pivot, axis: p(0, 0, 1), tieRodJoint: keep };
  return { kind: 'bellCrank', pivot, axis: p(0, 0, 1), tieRodJoint: keep, input: { kind: 'ratio', crankDegPerHandlebarDeg: 1 } };
}

/** A track rod's drive: a handlebar on the left upright, a centre lever over the rod's middle, or a drag link (below). */
export function starterTrackRodDrive(d: DesignFile, kind: 'dragLink' | 'knuckle' | 'centreLever'): Extract<Steering, { kind: 'trackRod' }>['drive'] {
  if (kind === 'knuckle') return { kind: 'knuckle', upright: 'left' };
  const r = resolveDesign(d);
  if (kind === 'dragLink') return starterDragLinkToUpright(r);
  // A lever on a vertical column 60 mm behind the rod's middle, its arm forward over it, the short link down to the middle.
  const a = r.upright.steeringArmJoint;
  const m = p((a.right.x + a.left.x) / 2, (a.right.y + a.left.y) / 2, (a.right.z + a.left.z) / 2);
  return { kind: 'centreLever', pivot: p(m.x - 60, m.y - 80, m.z + 40), axis: p(0, 0, 1), leverJoint: p(m.x, m.y - 80, m.z + 40), trackRodJoint: m };
}

/** A vertical column on the centre line whose arm pulls an arm 80 mm ahead of and 60 mm inboard of the right kingpin's middle. */
function starterDragLinkToUpright(r: ReturnType<typeof resolveDesign>): Extract<Steering, { kind: 'trackRod' }>['drive'] {
  const up = r.frontEnd.upper.outerJoint.right;
  const lo = r.frontEnd.lower.outerJoint.right;
  const m = p(Math.round((up.x + lo.x) / 2), Math.round((up.y + lo.y) / 2), Math.round((up.z + lo.z) / 2));
  return { kind: 'dragLink', upright: 'right', columnPivot: p(m.x, 0, m.z + 100), columnAxis: p(0, 0, 1), columnArmJoint: p(m.x + 80, 0, m.z), uprightArmJoint: p(m.x + 80, m.y + 60, m.z) };
}

export function starterCrankInput(d: DesignFile, kind: CrankInput['kind']): CrankInput | null {
  const s = d.steering;
  if (s.kind !== 'bellCrank') return null;
  if (kind === s.input.kind) return s.input;
  if (kind === 'ratio') return { kind: 'ratio', crankDegPerHandlebarDeg: 1 };
  // The handlebar on an upright needs a kingpin upright; the validator says so if it is not one.
  if (kind === 'knuckle') return { kind: 'knuckle', upright: 'left' };
  // An arm on the crank and one on a vertical column behind it, joined by a drag link.
  const side = Math.abs(s.axis.y) > 0.9 * Math.hypot(s.axis.x, s.axis.y, s.axis.z) ? p(0, 0, 60) : p(0, -60, 0);
  const column = p(s.pivot.x - 250, 0, s.pivot.z + 150);
  return {
    kind: 'dragLink',
    columnPivot: column,
    columnAxis: p(0, 0, 1),
    columnArmJoint: p(column.x, -60, column.z),
    crankArmJoint: p(s.pivot.x + side.x, s.pivot.y + side.y, s.pivot.z + side.z),
  };
}

export function starterSpring(d: DesignFile): SpringMount {
  const r = resolveDesign(d);
  const outer = r.frontEnd.lower.outerJoint.right;
  const inner = r.frontEnd.kind === 'splitWishbones' ? r.frontEnd.lower.frontPivot.right : r.frontEnd.lower.pivot;
  const upperZ = r.frontEnd.upper.outerJoint.right.z;
  const midY = Math.round((outer.y + inner.y) / 2);
  return { on: 'lower', frameMount: p(Math.round(outer.x), Math.min(-1, Math.round(inner.y) - 10), Math.round(upperZ + 50)), armMount: p(Math.round(outer.x), midY, Math.round(inner.z + 10)) };
}

/**
 * A balance-beam lean linkage to start from (split wishbones): push links straight up from a
 * point 45 % of the way out along each lower wishbone to a rocker 150 mm above the upper outer
 * joints, on a carrier sliding up toward a frame mount 200 mm higher (the spring), stops at
 * 30 deg. Plain numbers for the user to move; null for centre-pivot members.
 */
export function starterLeanLinkage(d: DesignFile): LeanLinkage | null {
  const r = resolveDesign(d);
  const fe = r.frontEnd;
  if (fe.kind !== 'splitWishbones') return null;
  const w = fe.lower;
  const inner = p((w.frontPivot.right.x + w.rearPivot.right.x) / 2, (w.frontPivot.right.y + w.rearPivot.right.y) / 2, (w.frontPivot.right.z + w.rearPivot.right.z) / 2);
  const outer = w.outerJoint.right;
  const t = 0.45;
  const arm = p(Math.round(inner.x + t * (outer.x - inner.x)), Math.round(inner.y + t * (outer.y - inner.y)), Math.round(inner.z + t * (outer.z - inner.z)));
  const top = Math.round(Math.max(fe.upper.outerJoint.right.z, fe.upper.frontPivot.right.z, fe.upper.rearPivot.right.z) + 150);
  return {
    carrier: { frameMount: p(arm.x, 0, top + 230), carrierMount: p(arm.x, 0, top + 30) },
    rocker: { pivot: p(arm.x, 0, top), axis: p(1, 0, 0), linkJoint: p(arm.x, arm.y, top), stopDeg: 30 },
    pushLinks: { on: 'lower', armJoint: arm },
  };
}

