/**
 * Rules across fields, checked on a design that passed the schema: coincident points, points
 * on a line they must stay off, the steering axis against the spin axis, crown against rolling
 * radius, a lean on a vehicle that does not tilt, the riding block against the envelope, the
 * wheels on their own sides of the centre line, and sizes no vehicle has (the schema bounds
 * points to 20 m but leaves radii, widths and tolerances open above).
 * Each issue names the path a user would fix.
 */
import { angleBetween, norm, RAD, scale, sub, tuple } from '../math/vec3';
import type { DesignIssue } from './designIssue';
import { fixed, IssueList, locate, MIN_DISTINCT_MM, sidePath, type Located } from './issueList';
import { checkLeaningRear } from './rearPairChecks';
import { resolveDesign } from './resolveDesign';
import { describeFound, roundForMessage } from './schemaDsl';
import { SIDES, type DesignFile, type ResolvedDesign, type Side, type TrackRodDrive, type Vec3Mm } from './types';
import { wheelSpinAxisAtDesign } from './wheelAxis';

export { MIN_DISTINCT_MM } from './issueList';

/** Centre-pivot pivots must lie within this of the centre line (y = 0). */
export const CENTRE_LINE_TOLERANCE_MM = 1;
/**
 * The steering axis must be at least this far from the wheel's spin axis. Real axes are
 * 60-90 degrees from it; near 0 the wheel would just spin about the axis instead of steering.
 * The bound only catches broken input (wrong point, swapped coordinates).
 */
export const MIN_STEER_TO_SPIN_AXIS_DEG = 10;

/**
 * Largest sizes accepted: several times anything a road vehicle carries (a large car tyre is
 * about 350 mm in rolling radius and 300 mm wide; common practice, no source). Past them a
 * value is a slip (a unit mix-up, a pasted digit), and the solver would be asked to close
 * loops kilometres across.
 */
export const SIZE_LIMITS = {
  rollingRadiusMm: 2000,
  tyreWidthMm: 1000,
  trackMm: 5000,
  partRadiusMm: 500,
  clearanceMm: 1000,
  angleToleranceDeg: 90,
} as const;

/**
 * The wheel's spin axis at design position from static toe and camber, pointing outward
 * (the mechanism's convention, which points left on both sides, turned outward here).
 */
export function spinAxis(side: Side, toeDeg: number, camberDeg: number): Vec3Mm {
  const [x, y, z] = wheelSpinAxisAtDesign(side, toeDeg, camberDeg);
  const s = side === 'right' ? -1 : 1;
  return { x: s * x, y: s * y, z: s * z };
}

export function checkAcrossFields(d: DesignFile): DesignIssue[] {
  const r = resolveDesign(d);
  const list = new IssueList();
  checkFrontEnd(d, r, list);
  checkUpright(d, r, list);
  checkSteering(d, r, list);
  checkSpring(d, r, list);
  checkLeanLinkage(d, r, list);
  checkWheels(d, list);
  checkWheelSides(d, r, list);
  checkLeaningRear(d, list);
  checkSizes(d, list);
  checkEnvelope(d, list);
  checkRiding(d, r, list);
  return list.issues;
}

function outerJoints(d: DesignFile, r: ResolvedDesign, side: Side): { upper: Located; lower: Located } {
  return {
    upper: locate(d.frontEnd.upper.outerJoint, r.frontEnd.upper.outerJoint, 'frontEnd.upper.outerJoint', side),
    lower: locate(d.frontEnd.lower.outerJoint, r.frontEnd.lower.outerJoint, 'frontEnd.lower.outerJoint', side),
  };
}

function checkFrontEnd(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  for (const side of SIDES) {
    if (d.frontEnd.kind === 'splitWishbones' && r.frontEnd.kind === 'splitWishbones') {
      for (const which of ['upper', 'lower'] as const) {
        const raw = d.frontEnd[which];
        const res = r.frontEnd[which];
        const base = `frontEnd.${which}`;
        const front = locate(raw.frontPivot, res.frontPivot, `${base}.frontPivot`, side);
        const rear = locate(raw.rearPivot, res.rearPivot, `${base}.rearPivot`, side);
        const outer = locate(raw.outerJoint, res.outerJoint, `${base}.outerJoint`, side);
        list.distinct(front, rear, 'the two inner pivots define the wishbone pivot axis');
        list.offLine(outer, front, rear, 'the outer joint on the pivot axis would give the wishbone no length');
      }
    } else if (d.frontEnd.kind === 'centrePivot' && r.frontEnd.kind === 'centrePivot') {
      for (const which of ['upper', 'lower'] as const) {
        const res = r.frontEnd[which];
        const base = `frontEnd.${which}`;
        const outer = locate(d.frontEnd[which].outerJoint, res.outerJoint, `${base}.outerJoint`, side);
        list.offLine(outer, fixed(res.pivot, `${base}.pivot`), { direction: res.pivotAxis, path: `${base}.pivotAxis` },
          'the outer joint on the pivot axis would give the member no length');
      }
    }
    const { upper, lower } = outerJoints(d, r, side);
    list.distinct(upper, lower, 'the upper and lower outer joints define the steering axis');
  }

  if (d.frontEnd.kind === 'centrePivot' && r.frontEnd.kind === 'centrePivot') {
    list.distinct(fixed(r.frontEnd.upper.pivot, 'frontEnd.upper.pivot'), fixed(r.frontEnd.lower.pivot, 'frontEnd.lower.pivot'),
      'the upper and lower members form a parallelogram with the uprights');
    for (const which of ['upper', 'lower'] as const) {
      const y = r.frontEnd[which].pivot.y;
      if (Math.abs(y) >= CENTRE_LINE_TOLERANCE_MM) {
        list.expected(`frontEnd.${which}.pivot.y`, `a y within ${CENTRE_LINE_TOLERANCE_MM} mm of 0 (a centre-pivot member pivots on the centre line)`, String(y));
      }
    }
  }
}

function checkUpright(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  for (const side of SIDES) {
    const { upper, lower } = outerJoints(d, r, side);
    const arm = locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', side);
    list.offLine(arm, upper, lower, 'the steering arm needs length off the steering axis to turn the wheel');

    const centre = r.upright.wheelCentre[side];
    if (!(centre.z > 0)) {
      list.expected(`${sidePath(d.upright.wheelCentre, 'upright.wheelCentre', side)}.z`, 'a wheel centre above the ground (z > 0 mm)', String(centre.z), side);
    }

    const steerAxis = sub(tuple(upper.at), tuple(lower.at));
    if (norm(steerAxis) === 0) continue; // coincident joints, reported above
    const spin = tuple(spinAxis(side, r.upright.staticToeDeg[side], r.upright.staticCamberDeg[side]));
    // The angle between the lines, whichever way each points: at most 90 degrees.
    const lineAngleDeg = Math.min(angleBetween(steerAxis, spin), angleBetween(steerAxis, scale(spin, -1))) * RAD;
    if (lineAngleDeg < MIN_STEER_TO_SPIN_AXIS_DEG) {
      const found = `${roundForMessage(lineAngleDeg)}°`;
      const expected = `at least ${MIN_STEER_TO_SPIN_AXIS_DEG}° between the steering axis and the spin axis`;
      list.add({
        path: upper.path,
        message:
          `${upper.path}: the steering axis (${upper.path} to ${lower.path}) is only ${found} from the wheel's spin axis ` +
          `(set by upright.staticToeDeg and upright.staticCamberDeg); expected ${expected}, or turning it would not steer the wheel`,
        expected,
        found,
      }, side);
    }
  }
}

function checkSteering(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  const s = d.steering;
  const rs = r.steering;
  if (s.kind === 'trackRod') {
    checkTrackRod(d, s.drive, r, list);
    return;
  }
  if (rs.kind === 'trackRod') return; // unreachable: resolution keeps the kind
  for (const side of SIDES) {
    const inner = locate(s.tieRodJoint, rs.tieRodJoint, 'steering.tieRodJoint', side);
    const outer = locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', side);
    list.distinct(outer, inner, 'the tie rod runs between them');
    if (rs.kind === 'bellCrank' || rs.kind === 'direct') {
      list.offLine(inner, fixed(rs.pivot, 'steering.pivot'), { direction: rs.axis, path: 'steering.axis' },
        'a joint on the pivot axis does not move when the crank turns');
    }
  }
  if (s.kind === 'bellCrank' && s.input.kind === 'knuckle' && d.upright.steeringAxis !== 'kingpin') {
    list.expected(
      'steering.input.kind',
      `"ratio" or "dragLink", or upright.steeringAxis "kingpin": a handlebar fixed to an upright turns it about its kingpin, and an upright on two ball joints has no single axis to turn about`,
      `"knuckle" with upright.steeringAxis "${d.upright.steeringAxis}"`,
    );
  }
  if (s.kind === 'bellCrank' && s.input.kind === 'dragLink') {
    const input = s.input;
    const columnArm = fixed(input.columnArmJoint, 'steering.input.columnArmJoint');
    const crankArm = fixed(input.crankArmJoint, 'steering.input.crankArmJoint');
    list.distinct(columnArm, crankArm, 'the drag link runs between them');
    list.offLine(columnArm, fixed(input.columnPivot, 'steering.input.columnPivot'), { direction: input.columnAxis, path: 'steering.input.columnAxis' },
      'a joint on the column axis does not move when the handlebar turns');
    list.offLine(crankArm, fixed(s.pivot, 'steering.pivot'), { direction: s.axis, path: 'steering.axis' },
      'a joint on the crank axis cannot turn the crank');
  }
}

/**
 * A one-piece track rod joins the two steering-arm joints, which must be apart; the drag link's
 * joints apart and off the axes they turn about; a handlebar on an upright needs a kingpin
 * (the upright's one rotation in its yoke). Both ends of the track rod sit on steering arms, so
 * joints.tieRodInner (each side's far end) must describe the same rod ends as tieRodOuter.
 */
function checkTrackRod(d: DesignFile, drive: TrackRodDrive, r: ResolvedDesign, list: IssueList): void {
  list.distinct(
    locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', 'right'),
    locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', 'left'),
    'the track rod runs between them',
  );
  const outer = r.joints.tieRodOuter;
  const inner = r.joints.tieRodInner;
  const same = (a: Vec3Mm, b: Vec3Mm) => angleBetween(tuple(a), tuple(b)) * RAD < 1e-6;
  if (inner.kind !== outer.kind || inner.ratedDeg !== outer.ratedDeg) {
    list.expected(
      'joints.tieRodInner',
      `the same kind and rating as joints.tieRodOuter (${outer.kind}, ${outer.ratedDeg} deg): with a one-piece track rod both ends are its joints on the steering arms`,
      `${inner.kind}, ${inner.ratedDeg} deg`,
    );
  } else if (!same(inner.studAxis.right, outer.studAxis.right) || !same(inner.studAxis.left, outer.studAxis.left)) {
    list.expected(
      'joints.tieRodInner.studAxis',
      'the stud axes of joints.tieRodOuter: with a one-piece track rod both ends are its joints on the steering arms',
      'other directions',
    );
  }
  if (drive.kind === 'knuckle') {
    if (d.upright.steeringAxis !== 'kingpin') {
      list.expected(
        'steering.drive.kind',
        `"dragLink", or upright.steeringAxis "kingpin": a handlebar fixed to an upright turns it about its kingpin, and an upright on two ball joints has no single axis to turn about`,
        `"knuckle" with upright.steeringAxis "${d.upright.steeringAxis}"`,
      );
    }
    return;
  }
  if (drive.kind === 'centreLever') {
    const lever = fixed(drive.leverJoint, 'steering.drive.leverJoint');
    const onRod = fixed(drive.trackRodJoint, 'steering.drive.trackRodJoint');
    list.distinct(lever, onRod, 'the short link runs between them');
    list.offLine(lever, fixed(drive.pivot, 'steering.drive.pivot'), { direction: drive.axis, path: 'steering.drive.axis' },
      'a joint on the lever axis does not move when the handlebar turns');
    checkOnTrackRod(drive.trackRodJoint, r, list);
    return;
  }
  const side = drive.upright;
  const columnArm = fixed(drive.columnArmJoint, 'steering.drive.columnArmJoint');
  const uprightArm = fixed(drive.uprightArmJoint, 'steering.drive.uprightArmJoint');
  list.distinct(columnArm, uprightArm, 'the drag link runs between them');
  list.offLine(columnArm, fixed(drive.columnPivot, 'steering.drive.columnPivot'), { direction: drive.columnAxis, path: 'steering.drive.columnAxis' },
    'a joint on the column axis does not move when the handlebar turns');
  list.offLine(
    uprightArm,
    locate(d.frontEnd.lower.outerJoint, r.frontEnd.lower.outerJoint, 'frontEnd.lower.outerJoint', side),
    locate(d.frontEnd.upper.outerJoint, r.frontEnd.upper.outerJoint, 'frontEnd.upper.outerJoint', side),
    'a joint on the steering axis cannot turn the upright',
  );
}

/**
 * The short link's joint on the track rod must lie on the rod's line between its ends: the
 * rod's ends are ball joints, so nothing fixes its spin, and a joint off its line would move
 * with that spin (the template holds the rod by a universal joint at its right end, which is
 * exact only for points on the line).
 */
function checkOnTrackRod(p: Vec3Mm, r: ResolvedDesign, list: IssueList): void {
  const a = tuple(r.upright.steeringArmJoint.right);
  const b = tuple(r.upright.steeringArmJoint.left);
  const ab = sub(b, a);
  const len2 = ab[0] ** 2 + ab[1] ** 2 + ab[2] ** 2;
  if (!(len2 > 0)) return; // coincident ends, reported above
  const ap = sub(tuple(p), a);
  const t = (ap[0] * ab[0] + ap[1] * ab[1] + ap[2] * ab[2]) / len2;
  const off = norm(sub(ap, scale(ab, t)));
  if (off >= MIN_DISTINCT_MM || t <= 0 || t >= 1) {
    const expected = `a point on the track rod's line between upright.steeringArmJoint right and left (within ${MIN_DISTINCT_MM} mm of it): its ends are ball joints, so the rod's spin is free and a joint off its line would have no place`;
    const found = `${roundForMessage(off)} mm off the line, at ${roundForMessage(t * 100)} % of the way from the right end`;
    list.expected('steering.drive.trackRodJoint', expected, found);
  }
}

function checkSpring(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  if (!d.spring || !r.spring) return;
  for (const side of SIDES) {
    list.distinct(
      locate(d.spring.frameMount, r.spring.frameMount, 'spring.frameMount', side),
      locate(d.spring.armMount, r.spring.armMount, 'spring.armMount', side),
      'the spring runs between them',
    );
  }
}

/**
 * The balance-beam lean linkage: on split wishbones of a tilting vehicle only (its push links
 * act on one wishbone per side, and it exists to let the frame lean); its points must define
 * the slide, the rocker's arms, the links and their arms on the wishbones.
 */
function checkLeanLinkage(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  const l = d.leanLinkage;
  const rl = r.leanLinkage;
  if (!l || !rl) return;
  if (d.frontEnd.kind !== 'splitWishbones') {
    list.expected('leanLinkage', "split wishbones (frontEnd.kind \"splitWishbones\"): the push links act on one wishbone per side", `frontEnd.kind "${d.frontEnd.kind}"`);
  }
  if (!d.vehicle.tilting) {
    list.expected('leanLinkage', 'a tilting vehicle (vehicle.tilting true): the linkage lets the frame lean', 'vehicle.tilting false');
  }
  list.distinct(fixed(rl.carrier.frameMount, 'leanLinkage.carrier.frameMount'), fixed(rl.carrier.carrierMount, 'leanLinkage.carrier.carrierMount'),
    'the carrier slides along the line between them');
  if (rl.actuator) {
    list.distinct(fixed(rl.actuator.frameMount, 'leanLinkage.actuator.frameMount'), fixed(rl.actuator.rockerMount, 'leanLinkage.actuator.rockerMount'),
      'the actuator runs between them');
  }
  for (const side of SIDES) {
    const joint = locate(l.rocker.linkJoint, rl.rocker.linkJoint, 'leanLinkage.rocker.linkJoint', side);
    const arm = locate(l.pushLinks.armJoint, rl.pushLinks.armJoint, 'leanLinkage.pushLinks.armJoint', side);
    list.offLine(joint, fixed(rl.rocker.pivot, 'leanLinkage.rocker.pivot'), { direction: rl.rocker.axis, path: 'leanLinkage.rocker.axis' },
      'a joint on the pivot axis would give the rocker no arm');
    list.distinct(joint, arm, 'the push link runs between them');
    if (d.frontEnd.kind === 'splitWishbones' && r.frontEnd.kind === 'splitWishbones') {
      const on = l.pushLinks.on;
      const w = r.frontEnd[on];
      list.offLine(arm, locate(d.frontEnd[on].frontPivot, w.frontPivot, `frontEnd.${on}.frontPivot`, side),
        locate(d.frontEnd[on].rearPivot, w.rearPivot, `frontEnd.${on}.rearPivot`, side),
        'a push link on the wishbone pivot axis could not turn the wishbone');
    }
  }
}

function checkWheels(d: DesignFile, list: IssueList): void {
  for (const axle of ['front', 'rear'] as const) {
    const tyre = d.wheels[axle];
    if (tyre.crownRadiusMm > tyre.rollingRadiusMm) {
      const expected = `a crown radius in mm at most the rolling radius (wheels.${axle}.rollingRadiusMm = ${tyre.rollingRadiusMm})`;
      list.expected(`wheels.${axle}.crownRadiusMm`, expected, String(tyre.crownRadiusMm));
    }
  }
}

/**
 * Each wheel centre on its own side of the centre line (right y < 0, left y > 0), the two at
 * least a front tyre's width apart across: a single wheel centre written at y = 0, mirrored,
 * puts both wheels at one place, which the solver would close as a "converged" pose.
 */
function checkWheelSides(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  const right = r.upright.wheelCentre.right.y;
  const left = r.upright.wheelCentre.left.y;
  const width = r.wheels.front.tyreWidthMm;
  const pathOf = (side: Side) => `${sidePath(d.upright.wheelCentre, 'upright.wheelCentre', side)}.y`;
  if (!(right < 0)) {
    const why = isMirrored(d) ? '; a single value is mirrored to the left, so y = 0 puts both wheels in one place' : '';
    list.expected(pathOf('right'), `a y below 0 mm (the right wheel right of the centre line${why})`, `${right} mm`, isMirrored(d) ? undefined : 'right');
  }
  // A single value is the right side mirrored: its one y is judged once, above.
  if (!isMirrored(d) && !(left > 0)) list.expected(pathOf('left'), 'a y above 0 mm (the left wheel left of the centre line)', `${left} mm`, 'left');
  if (right < 0 && left > 0 && left - right < width) {
    const path = isMirrored(d) ? pathOf('right') : pathOf('left');
    list.expected(
      path,
      `the wheel centres at least the tyre width (wheels.front.tyreWidthMm = ${width} mm) apart across the vehicle, or the two tyres overlap at the centre line`,
      `${roundForMessage(left - right)} mm apart (y ${left} and ${right} mm)`,
    );
  }
}

const isMirrored = (d: DesignFile) => sidePath(d.upright.wheelCentre, 'upright.wheelCentre', 'right') === 'upright.wheelCentre';

/** Sizes past SIZE_LIMITS, each named by its field. */
function checkSizes(d: DesignFile, list: IssueList): void {
  const most = (path: string, value: number | undefined, limit: number, unit: string, what: string) => {
    if (value !== undefined && value > limit) list.expected(path, `at most ${limit} ${unit} (${what}; a larger value is taken for a slip)`, `${describeFound(value)} ${unit}`);
  };
  for (const axle of ['front', 'rear'] as const) {
    const t = d.wheels[axle];
    most(`wheels.${axle}.rollingRadiusMm`, t.rollingRadiusMm, SIZE_LIMITS.rollingRadiusMm, 'mm', 'a wheel 4 m across');
    most(`wheels.${axle}.tyreWidthMm`, t.tyreWidthMm, SIZE_LIMITS.tyreWidthMm, 'mm', 'a tyre 1 m wide');
  }
  if (d.vehicle.rear.kind === 'pair') most('vehicle.rear.trackMm', d.vehicle.rear.trackMm, SIZE_LIMITS.trackMm, 'mm', 'the largest wheelbase accepted');
  for (const part of ['wishboneTubeRadiusMm', 'tieRodRadiusMm', 'steeringArmRadiusMm'] as const) {
    most(`parts.${part}`, d.parts?.[part], SIZE_LIMITS.partRadiusMm, 'mm', 'a part 1 m thick');
  }
  const t = d.tolerances;
  most('tolerances.clearanceMm', t?.clearanceMm, SIZE_LIMITS.clearanceMm, 'mm', 'a metre between parts');
  for (const angle of ['selfSteerDeg', 'toeErrorDeg', 'slipDeg', 'jointMarginDeg'] as const) {
    most(`tolerances.${angle}`, t?.[angle], SIZE_LIMITS.angleToleranceDeg, 'degrees', 'a right angle');
  }
}

function checkEnvelope(d: DesignFile, list: IssueList): void {
  if (!d.vehicle.tilting && d.envelope.leanDeg !== 0) {
    list.expected('envelope.leanDeg', '0 degrees, because vehicle.tilting is false (the frame does not lean)', describeFound(d.envelope.leanDeg));
  }
}

/**
 * The speed range must be a range, and the lean limit must lie inside the envelope that the
 * design is checked over. Judged on the resolved values, so a bound given against a default
 * is caught too; the message names the field the file gives (or the other bound's default).
 */
function checkRiding(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  const given = d.riding;
  if (!given) return;
  const { minKmh, maxKmh } = r.riding;
  if (!(minKmh < maxKmh)) {
    const blamed = given.maxKmh !== undefined ? 'maxKmh' : 'minKmh';
    const other = blamed === 'maxKmh' ? 'minKmh' : 'maxKmh';
    const otherValue = `${r.riding[other]} km/h${given[other] === undefined ? ', the default' : ''}`;
    const expected = blamed === 'maxKmh' ? `a speed in km/h above riding.minKmh (${otherValue})` : `a speed in km/h below riding.maxKmh (${otherValue})`;
    list.expected(`riding.${blamed}`, expected, String(r.riding[blamed]));
  }
  if (d.vehicle.tilting && given.maxLeanDeg !== undefined && given.maxLeanDeg > d.envelope.leanDeg) {
    const expected = `at most envelope.leanDeg (${d.envelope.leanDeg} degrees), the largest lean the design is checked over; raise envelope.leanDeg too`;
    list.expected('riding.maxLeanDeg', expected, String(given.maxLeanDeg));
  }
}
