/**
 * Checks of a leaning rear pair (`vehicle.rear.kind: "leaningPair"`): the rules across fields
 * (errors: the members' pivots on the centre line and apart, outer joints off the pivot axes
 * and apart, the wheel centres above the ground on their own sides and on the rear axle line
 * the wheelbase gives) and the warnings (a rear pair that is not a parallelogram in rear view
 * locks; a rear wheel centre written where its tyre does not touch the ground).
 */
import type { IssueList } from './issueList';
import { fixed, locate, sidePath } from './issueList';
import { leaningRearSides } from './resolveDesign';
import { roundForMessage } from './schemaDsl';
import { SIDES, type DesignFile } from './types';

/** Rear member pivots must lie within this of the centre line (y = 0), mm (as the front's). */
export const REAR_CENTRE_LINE_TOLERANCE_MM = 1;
/** A rear wheel centre's x may differ from -wheelbase by at most this, mm. */
export const REAR_AXLE_TOLERANCE_MM = 1;
/** Rear members whose rear-view reaches differ by more than this are warned about, mm (as the front's). */
export const REAR_PARALLELOGRAM_TOLERANCE_MM = 0.05;
/** A rear wheel centre more than this from its on-the-ground height is warned about, mm (as the front's). */
export const REAR_WHEEL_HEIGHT_TOLERANCE_MM = 1;

const BASE = 'vehicle.rear';

export function checkLeaningRear(d: DesignFile, list: IssueList): void {
  const rear = d.vehicle.rear;
  if (rear.kind !== 'leaningPair') return;
  const r = leaningRearSides(rear);
  list.distinct(fixed(r.upper.pivot, `${BASE}.upper.pivot`), fixed(r.lower.pivot, `${BASE}.lower.pivot`),
    'the upper and lower rear members form a parallelogram with the rear uprights');
  for (const level of ['upper', 'lower'] as const) {
    const y = r[level].pivot.y;
    if (Math.abs(y) >= REAR_CENTRE_LINE_TOLERANCE_MM) {
      list.expected(`${BASE}.${level}.pivot.y`, `a y within ${REAR_CENTRE_LINE_TOLERANCE_MM} mm of 0 (a rear member pivots on the centre line)`, String(y));
    }
  }
  for (const side of SIDES) {
    for (const level of ['upper', 'lower'] as const) {
      const outer = locate(rear[level].outerJoint, r[level].outerJoint, `${BASE}.${level}.outerJoint`, side);
      list.offLine(outer, fixed(r[level].pivot, `${BASE}.${level}.pivot`), { direction: r[level].pivotAxis, path: `${BASE}.${level}.pivotAxis` },
        'the outer joint on the pivot axis would give the rear member no length');
    }
    const upper = locate(rear.upper.outerJoint, r.upper.outerJoint, `${BASE}.upper.outerJoint`, side);
    const lower = locate(rear.lower.outerJoint, r.lower.outerJoint, `${BASE}.lower.outerJoint`, side);
    list.distinct(upper, lower, 'the rear upright runs between the upper and lower outer joints');

    const centre = r.wheelCentre[side];
    const path = sidePath(rear.wheelCentre, `${BASE}.wheelCentre`, side);
    if (!(centre.z > 0)) list.expected(`${path}.z`, 'a rear wheel centre above the ground (z > 0 mm)', `${centre.z} mm`, side);
    const onSide = side === 'right' ? centre.y < 0 : centre.y > 0;
    if (!onSide) {
      const mirrored = path === `${BASE}.wheelCentre`;
      if (side === 'right' || !mirrored) {
        list.expected(`${path}.y`, `a y ${side === 'right' ? 'below' : 'above'} 0 mm (the ${side} rear wheel ${side} of the centre line${mirrored ? '; a single value is mirrored to the left' : ''})`, `${centre.y} mm`, mirrored ? undefined : side);
      }
    }
    const off = centre.x + d.vehicle.wheelbaseMm;
    if (!(Math.abs(off) <= REAR_AXLE_TOLERANCE_MM)) {
      list.expected(`${path}.x`, `an x within ${REAR_AXLE_TOLERANCE_MM} mm of -vehicle.wheelbaseMm = ${-d.vehicle.wheelbaseMm} mm (the rear wheel centres are on the rear axle line)`, `${centre.x} mm`, side);
    }
  }
}

export function leaningRearWarnings(d: DesignFile, list: IssueList): void {
  const rear = d.vehicle.rear;
  if (rear.kind !== 'leaningPair') return;
  const r = leaningRearSides(rear);
  const tyre = d.wheels.rear;
  for (const side of SIDES) {
    const u = r.upper.outerJoint[side];
    const l = r.lower.outerJoint[side];
    const dy = u.y - r.upper.pivot.y - (l.y - r.lower.pivot.y);
    const dz = u.z - r.upper.pivot.z - (l.z - r.lower.pivot.z);
    if (Math.hypot(dy, dz) > REAR_PARALLELOGRAM_TOLERANCE_MM) {
      const path = sidePath(rear.upper.outerJoint, `${BASE}.upper.outerJoint`, side);
      list.add({
        path,
        message:
          `${path}: the rear members and the rear upright are not a parallelogram in rear view (the upper member reaches ` +
          `${roundForMessage(u.y - r.upper.pivot.y)}, ${roundForMessage(u.z - r.upper.pivot.z)} mm from its pivot, the lower ` +
          `${roundForMessage(l.y - r.lower.pivot.y)}, ${roundForMessage(l.z - r.lower.pivot.z)} mm in y, z); members spanning both sides ` +
          'then lock the rear pair: with lean it cannot keep both rear tyres on the ground',
        expected: `the same reach in y and z for both rear members, within ${REAR_PARALLELOGRAM_TOLERANCE_MM} mm`,
        found: `a difference of ${roundForMessage(Math.hypot(dy, dz))} mm`,
      }, side);
    }
    // Static camber 0: the tyre touches level ground with the centre at the rolling radius.
    const z = r.wheelCentre[side].z;
    const gap = z - tyre.rollingRadiusMm;
    if (Math.abs(gap) > REAR_WHEEL_HEIGHT_TOLERANCE_MM) {
      const path = `${sidePath(rear.wheelCentre, `${BASE}.wheelCentre`, side)}.z`;
      const by = `${roundForMessage(Math.abs(gap))} mm`;
      list.add({
        path,
        message:
          `${path}: the rear wheel centre is ${by} ${gap > 0 ? 'above' : 'below'} the height at which the rear tyre touches the ground ` +
          `(wheels.rear.rollingRadiusMm = ${tyre.rollingRadiusMm} mm); the design pose puts the rear tyres on the ground, so the rear carrier ` +
          `${gap > 0 ? 'sinks' : 'rises'} by about ${by} there`,
        expected: `within ${REAR_WHEEL_HEIGHT_TOLERANCE_MM} mm of ${tyre.rollingRadiusMm} mm`,
        found: `${z} mm`,
      }, side);
    }
  }
}
