/**
 * Warnings: what a design may hold but will not behave as written. They never refuse a design;
 * `validate` prints them and still exits 0.
 *
 * The one warning so far: a wheel centre written at a height where the tyre does not touch the
 * ground. The design pose (zero lean, handlebar and travel) puts each tyre on the ground, so
 * the linkage moves to get there, and every measure at "design position" is taken in that
 * moved pose, not at the written points.
 */
import type { DesignIssue } from './designIssue';
import { IssueList, sidePath } from './issueList';
import { resolveDesign } from './resolveDesign';
import { roundForMessage } from './schemaDsl';
import { SIDES, type DesignFile } from './types';

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
  return list.issues;
}
