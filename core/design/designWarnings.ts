/**
 * Warnings: what a design may hold but will not behave as written. They never refuse a design;
 * `validate` prints them and still exits 0.
 *
 * - A wheel centre written at a height where the tyre does not touch the ground. The design
 *   pose (zero lean, handlebar and travel) puts each tyre on the ground, so the linkage moves to
 *   get there, and every measure at "design position" is taken in that moved pose, not at the
 *   written points.
 * - Centre-pivot members that do not form a parallelogram with the uprights in front view. Each
 *   member is one rigid piece spanning both sides, so the two sides' four-bar loops must turn
 *   alike: that needs the upper member's reach from its pivot to each outer joint to equal the
 *   lower member's (in y and z). Otherwise the linkage locks at design and cannot lean (plane
 *   kinematics of the parallelogram; common practice, no source).
 */
import type { DesignIssue } from './designIssue';
import { IssueList, sidePath } from './issueList';
import { leaningRearWarnings } from './rearPairChecks';
import { resolveDesign } from './resolveDesign';
import { roundForMessage } from './schemaDsl';
import { SIDES, type DesignFile } from './types';

/** Centre members whose front-view reaches differ by more than this are warned about, mm. */
export const PARALLELOGRAM_TOLERANCE_MM = 0.05;

/** A wheel centre more than this from its on-the-ground height is warned about. */
export const WHEEL_HEIGHT_TOLERANCE_MM = 1;

/**
 * Height of the wheel centre when the tyre touches level ground: the centre of the crown's
 * circle sits (rolling - crown) from the wheel centre in the wheel plane, tilted by the camber,
 * and the tread is `crown` below it (the ground-contact rule the solver closes).
 */
export function groundContactHeightMm(rollingRadiusMm: number, crownRadiusMm: number, camberDeg: number): number {
  return (rollingRadiusMm - crownRadiusMm) * Math.cos((camberDeg * Math.PI) / 180) + crownRadiusMm;
}

export function designWarnings(d: DesignFile): DesignIssue[] {
  const r = resolveDesign(d);
  const list = new IssueList();
  const tyre = r.wheels.front;
  for (const side of SIDES) {
    const camberDeg = r.upright.staticCamberDeg[side];
    const onGround = groundContactHeightMm(tyre.rollingRadiusMm, tyre.crownRadiusMm, camberDeg);
    const z = r.upright.wheelCentre[side].z;
    const gap = z - onGround;
    if (Math.abs(gap) <= WHEEL_HEIGHT_TOLERANCE_MM) continue;
    const path = `${sidePath(d.upright.wheelCentre, 'upright.wheelCentre', side)}.z`;
    const by = `${roundForMessage(Math.abs(gap))} mm`;
    const where = gap > 0 ? 'above' : 'below';
    const height = camberDeg === 0
      ? `wheels.front.rollingRadiusMm = ${tyre.rollingRadiusMm} mm`
      : `${roundForMessage(onGround)} mm with the rolling radius ${tyre.rollingRadiusMm} mm, crown radius ${tyre.crownRadiusMm} mm and ${camberDeg}° of static camber`;
    const moves = r.frontEnd.kind === 'centrePivot'
      ? `the frame ${gap > 0 ? 'sinks' : 'rises'} by about ${by} (the centre-pivot members turn too if the sides differ)`
      : `the wheel sits ${by} ${gap > 0 ? 'lower' : 'higher'} against the frame than written (its wishbones turn to put the tyre on the ground)`;
    list.add({
      path,
      message:
        `${path}: the wheel centre is ${by} ${where} the height at which the tyre touches the ground (${height}); ` +
        `the design pose puts the tyres on the ground, so at zero lean, handlebar and travel ${moves}, and every measure at design position is taken there`,
      expected: `within ${WHEEL_HEIGHT_TOLERANCE_MM} mm of ${roundForMessage(onGround)} mm`,
      found: `${z} mm`,
    }, side);
  }
  parallelogramWarning(d, list);
  leaningRearWarnings(d, list);
  return list.issues;
}

/** Centre-pivot members that are not a parallelogram with the uprights (front view): the linkage locks. */
function parallelogramWarning(d: DesignFile, list: IssueList): void {
  const r = resolveDesign(d);
  const fe = r.frontEnd;
  if (fe.kind !== 'centrePivot' || !r.vehicle.tilting) return;
  for (const side of SIDES) {
    const u = fe.upper.outerJoint[side];
    const l = fe.lower.outerJoint[side];
    const dy = u.y - fe.upper.pivot.y - (l.y - fe.lower.pivot.y);
    const dz = u.z - fe.upper.pivot.z - (l.z - fe.lower.pivot.z);
    if (Math.hypot(dy, dz) <= PARALLELOGRAM_TOLERANCE_MM) continue;
    const path = `${sidePath(d.frontEnd.upper.outerJoint, 'frontEnd.upper.outerJoint', side)}`;
    list.add({
      path,
      message:
        `${path}: the centre members and the ${side} upright are not a parallelogram in front view (the upper member reaches ` +
        `${roundForMessage(u.y - fe.upper.pivot.y)}, ${roundForMessage(u.z - fe.upper.pivot.z)} mm from its pivot, the lower ` +
        `${roundForMessage(l.y - fe.lower.pivot.y)}, ${roundForMessage(l.z - fe.lower.pivot.z)} mm in y, z); members spanning both sides ` +
        'then lock the linkage at design: it cannot lean',
      expected: `the same reach in y and z for both members, within ${PARALLELOGRAM_TOLERANCE_MM} mm`,
      found: `a difference of ${roundForMessage(Math.hypot(dy, dz))} mm`,
    }, side);
  }
}
