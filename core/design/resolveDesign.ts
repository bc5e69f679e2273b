/**
 * Resolution: a validated design file -> both sides spelled out, every default applied.
 * And back: `unresolveDesign` writes a side as a single value wherever the left is the exact
 * mirror of the right, so a saved file stays as compact as a hand-written one.
 *
 * Mirroring is y -> -y, for points and directions alike (a direction is mirrored like the
 * difference of two points). Numbers (toe, camber) are copied: toe-in and camber-out are
 * already defined per side, so the same number means the mirror-image wheel.
 */
import {
  DEFAULT_PART_SIZES,
  DEFAULT_RIDING,
  DEFAULT_TOLERANCES,
  DESIGN_FORMAT_VERSION,
  type CrankInput,
  type DesignFile,
  type JointSpec,
  type LeanLinkage,
  type Joints,
  type LeaningRearPair,
  type PartSizes,
  type PerSide,
  type ResolvedLeanLinkage,
  type Rear,
  type ResolvedDesign,
  type Riding,
  type Sided,
  type Tolerances,
  type TrackRodDrive,
  type Vec3Mm,
  type Vehicle,
} from './types';

export function isTwoSided<T>(value: Sided<T>): value is { right: T; left: T } {
  return typeof value === 'object' && value !== null && 'right' in value && 'left' in value;
}

/** y -> -y, never producing -0 (so mirrored zeros compare and print as plain 0). */
export function mirrorY(v: Vec3Mm): Vec3Mm {
  return { x: v.x, y: v.y === 0 ? 0 : -v.y, z: v.z };
}

function copyVec(v: Vec3Mm): Vec3Mm {
  return { x: v.x, y: v.y, z: v.z };
}

/** Points and directions: a single value is the right side, mirrored to the left. */
export function resolveSidedVec(value: Sided<Vec3Mm>): PerSide<Vec3Mm> {
  if (isTwoSided(value)) return { right: copyVec(value.right), left: copyVec(value.left) };
  return { right: copyVec(value), left: mirrorY(value) };
}

/** Per-side numbers (toe, camber): a single value applies to both sides unchanged. */
export function resolveSidedNumber(value: Sided<number>): PerSide<number> {
  return isTwoSided(value) ? { right: value.right, left: value.left } : { right: value, left: value };
}

/**
 * The rear block: a leaning pair's per-side points are written out for both sides when
 * resolving (`sides: 'both'`) and compacted to one mirrored value where they mirror when
 * writing back (`'compact'`).
 */
function copyRear(r: Rear, sides: 'both' | 'compact'): Rear {
  if (r.kind === 'single') return { kind: 'single' };
  if (r.kind === 'pair') return { kind: 'pair', trackMm: r.trackMm };
  const point = (p: Sided<Vec3Mm>): Sided<Vec3Mm> => (sides === 'both' ? resolveSidedVec(p) : compactPoint(resolveSidedVec(p)));
  const member = (m: LeaningRearPair['upper']): LeaningRearPair['upper'] => ({ pivot: copyVec(m.pivot), pivotAxis: copyVec(m.pivotAxis), outerJoint: point(m.outerJoint) });
  return { kind: 'leaningPair', upper: member(r.upper), lower: member(r.lower), wheelCentre: point(r.wheelCentre) };
}

/** A leaning rear pair's per-side points, both sides spelled out (the right mirrored where written once). */
export function leaningRearSides(r: LeaningRearPair): {
  upper: { pivot: Vec3Mm; pivotAxis: Vec3Mm; outerJoint: PerSide<Vec3Mm> };
  lower: { pivot: Vec3Mm; pivotAxis: Vec3Mm; outerJoint: PerSide<Vec3Mm> };
  wheelCentre: PerSide<Vec3Mm>;
} {
  const member = (m: LeaningRearPair['upper']) => ({ pivot: copyVec(m.pivot), pivotAxis: copyVec(m.pivotAxis), outerJoint: resolveSidedVec(m.outerJoint) });
  return { upper: member(r.upper), lower: member(r.lower), wheelCentre: resolveSidedVec(r.wheelCentre) };
}

function copyVehicle(v: Vehicle, sides: 'both' | 'compact' = 'both'): Vehicle {
  return {
    wheelbaseMm: v.wheelbaseMm,
    tilting: v.tilting,
    rear: copyRear(v.rear, sides),
    ...(v.bodyOutline ? { bodyOutline: v.bodyOutline.map((p) => ({ x: p.x, y: p.y })) } : {}),
  };
}

function copyTrackRodDrive(drive: TrackRodDrive): TrackRodDrive {
  if (drive.kind === 'knuckle') return { kind: 'knuckle', upright: drive.upright };
  if (drive.kind === 'centreLever') {
    return { kind: 'centreLever', pivot: copyVec(drive.pivot), axis: copyVec(drive.axis), leverJoint: copyVec(drive.leverJoint), trackRodJoint: copyVec(drive.trackRodJoint) };
  }
  return {
    kind: 'dragLink',
    upright: drive.upright,
    columnPivot: copyVec(drive.columnPivot),
    columnAxis: copyVec(drive.columnAxis),
    columnArmJoint: copyVec(drive.columnArmJoint),
    uprightArmJoint: copyVec(drive.uprightArmJoint),
  };
}

function copyCrankInput(input: CrankInput): CrankInput {
  if (input.kind === 'ratio') return { kind: 'ratio', crankDegPerHandlebarDeg: input.crankDegPerHandlebarDeg };
  if (input.kind === 'knuckle') return { kind: 'knuckle', upright: input.upright };
  return {
    kind: 'dragLink',
    columnPivot: copyVec(input.columnPivot),
    columnAxis: copyVec(input.columnAxis),
    columnArmJoint: copyVec(input.columnArmJoint),
    crankArmJoint: copyVec(input.crankArmJoint),
  };
}

/** Tolerances with defaults filled; a file's older `toeErrorDeg` stands for `selfSteerDeg`. */
function resolveTolerances(given: DesignFile['tolerances']): Tolerances {
  const { toeErrorDeg, ...rest } = given ?? {};
  const t = withDefaults<Tolerances>(DEFAULT_TOLERANCES, rest);
  if (rest.selfSteerDeg === undefined && toeErrorDeg !== undefined) t.selfSteerDeg = toeErrorDeg;
  return t;
}

/** Defaults for the keys a file leaves out (a key present with `undefined` counts as left out). */
function withDefaults<T extends object>(defaults: T, given: Partial<T> | undefined): T {
  const result = { ...defaults };
  for (const key of Object.keys(defaults) as (keyof T)[]) {
    const value = given?.[key];
    if (value !== undefined) result[key] = value as T[keyof T];
  }
  return result;
}

/**
 * The riding block with defaults filled: the lean limit defaults to the envelope's lean, and
 * a vehicle that does not tilt has none (a lean limit written for it is ignored).
 */
function ridingDefaults(vehicle: Vehicle, envelope: DesignFile['envelope']): Riding {
  return { ...DEFAULT_RIDING, maxLeanDeg: vehicle.tilting ? envelope.leanDeg : 0 };
}

function resolveRiding(d: DesignFile): Riding {
  const riding = withDefaults<Riding>(ridingDefaults(d.vehicle, d.envelope), d.riding);
  if (!d.vehicle.tilting) riding.maxLeanDeg = 0;
  return riding;
}

const JOINT_NAMES: readonly (keyof Joints)[] = ['upperOuter', 'lowerOuter', 'tieRodOuter', 'tieRodInner'];

function resolveJoint(j: JointSpec): ResolvedDesign['joints'][keyof Joints] {
  return { kind: j.kind, ratedDeg: j.ratedDeg, studAxis: resolveSidedVec(j.studAxis) };
}

function resolveLeanLinkage(l: LeanLinkage): ResolvedLeanLinkage {
  return {
    carrier: { frameMount: copyVec(l.carrier.frameMount), carrierMount: copyVec(l.carrier.carrierMount) },
    rocker: { pivot: copyVec(l.rocker.pivot), axis: copyVec(l.rocker.axis), linkJoint: resolveSidedVec(l.rocker.linkJoint), stopDeg: l.rocker.stopDeg },
    pushLinks: { on: l.pushLinks.on, armJoint: resolveSidedVec(l.pushLinks.armJoint) },
    ...(l.actuator ? { actuator: { frameMount: copyVec(l.actuator.frameMount), rockerMount: copyVec(l.actuator.rockerMount) } } : {}),
  };
}

function unresolveLeanLinkage(l: ResolvedLeanLinkage): LeanLinkage {
  return {
    carrier: { frameMount: copyVec(l.carrier.frameMount), carrierMount: copyVec(l.carrier.carrierMount) },
    rocker: { pivot: copyVec(l.rocker.pivot), axis: copyVec(l.rocker.axis), linkJoint: compactPoint(l.rocker.linkJoint), stopDeg: l.rocker.stopDeg },
    pushLinks: { on: l.pushLinks.on, armJoint: compactPoint(l.pushLinks.armJoint) },
    ...(l.actuator ? { actuator: { frameMount: copyVec(l.actuator.frameMount), rockerMount: copyVec(l.actuator.rockerMount) } } : {}),
  };
}

/** Expects a design that passed `validateDesign`. */
export function resolveDesign(d: DesignFile): ResolvedDesign {
  const frontEnd: ResolvedDesign['frontEnd'] =
    d.frontEnd.kind === 'splitWishbones'
      ? {
          kind: 'splitWishbones',
          upper: {
            frontPivot: resolveSidedVec(d.frontEnd.upper.frontPivot),
            rearPivot: resolveSidedVec(d.frontEnd.upper.rearPivot),
            outerJoint: resolveSidedVec(d.frontEnd.upper.outerJoint),
          },
          lower: {
            frontPivot: resolveSidedVec(d.frontEnd.lower.frontPivot),
            rearPivot: resolveSidedVec(d.frontEnd.lower.rearPivot),
            outerJoint: resolveSidedVec(d.frontEnd.lower.outerJoint),
          },
        }
      : {
          kind: 'centrePivot',
          upper: {
            pivot: copyVec(d.frontEnd.upper.pivot),
            pivotAxis: copyVec(d.frontEnd.upper.pivotAxis),
            outerJoint: resolveSidedVec(d.frontEnd.upper.outerJoint),
          },
          lower: {
            pivot: copyVec(d.frontEnd.lower.pivot),
            pivotAxis: copyVec(d.frontEnd.lower.pivotAxis),
            outerJoint: resolveSidedVec(d.frontEnd.lower.outerJoint),
          },
        };

  const s = d.steering;
  const steering: ResolvedDesign['steering'] =
    s.kind === 'trackRod'
      ? { kind: 'trackRod', drive: copyTrackRodDrive(s.drive) }
      : s.kind === 'bellCrank'
      ? { kind: 'bellCrank', pivot: copyVec(s.pivot), axis: copyVec(s.axis), tieRodJoint: resolveSidedVec(s.tieRodJoint), input: copyCrankInput(s.input) }
      : s.kind === 'rack'
        ? { kind: 'rack', axis: copyVec(s.axis), tieRodJoint: resolveSidedVec(s.tieRodJoint), mmPerHandlebarDeg: s.mmPerHandlebarDeg }
        : { kind: 'direct', pivot: copyVec(s.pivot), axis: copyVec(s.axis), tieRodJoint: resolveSidedVec(s.tieRodJoint) };

  const joints = {} as ResolvedDesign['joints'];
  for (const name of JOINT_NAMES) joints[name] = resolveJoint(d.joints[name]);

  return {
    name: d.name,
    notes: d.notes ?? '',
    vehicle: copyVehicle(d.vehicle),
    frontEnd,
    upright: {
      steeringAxis: d.upright.steeringAxis,
      steeringArmJoint: resolveSidedVec(d.upright.steeringArmJoint),
      wheelCentre: resolveSidedVec(d.upright.wheelCentre),
      staticToeDeg: resolveSidedNumber(d.upright.staticToeDeg),
      staticCamberDeg: resolveSidedNumber(d.upright.staticCamberDeg),
    },
    steering,
    wheels: { front: { ...d.wheels.front }, rear: { ...d.wheels.rear } },
    joints,
    envelope: { ...d.envelope },
    tolerances: resolveTolerances(d.tolerances),
    ...(d.spring
      ? { spring: { on: d.spring.on, frameMount: resolveSidedVec(d.spring.frameMount), armMount: resolveSidedVec(d.spring.armMount) } }
      : {}),
    ...(d.leanLinkage ? { leanLinkage: resolveLeanLinkage(d.leanLinkage) } : {}),
    parts: withDefaults<PartSizes>(DEFAULT_PART_SIZES, d.parts),
    riding: resolveRiding(d),
  };
}

// ---------------------------------------------------------------------------------------------
// Back to the file form
// ---------------------------------------------------------------------------------------------

function isMirror(right: Vec3Mm, left: Vec3Mm): boolean {
  return left.x === right.x && left.y === -right.y && left.z === right.z;
}

/**
 * A point pair as a single value when the left mirrors the right. Only if the right point has
 * y <= 0: the file format reads a single point as the right side and refuses y > 0 there.
 */
export function compactPoint(p: PerSide<Vec3Mm>): Sided<Vec3Mm> {
  return isMirror(p.right, p.left) && p.right.y <= 0 ? copyVec(p.right) : { right: copyVec(p.right), left: copyVec(p.left) };
}

/** Directions have no side restriction on y. */
export function compactDirection(p: PerSide<Vec3Mm>): Sided<Vec3Mm> {
  return isMirror(p.right, p.left) ? copyVec(p.right) : { right: copyVec(p.right), left: copyVec(p.left) };
}

export function compactNumber(p: PerSide<number>): Sided<number> {
  return p.right === p.left ? p.right : { right: p.right, left: p.left };
}

/**
 * Only values that differ from the defaults are written: a file that leaves a tolerance out
 * means "the default", so writing defaults back would change nothing but the file's size.
 * Returns undefined when everything is default, so the whole key can be left out.
 */
function differencesFrom<T extends object>(defaults: T, values: T): Partial<T> | undefined {
  const result: Partial<T> = {};
  let any = false;
  for (const key of Object.keys(defaults) as (keyof T)[]) {
    if (values[key] !== defaults[key]) {
      result[key] = values[key];
      any = true;
    }
  }
  return any ? result : undefined;
}

/** The inverse of `resolveDesign`: resolveDesign(unresolveDesign(r)) equals r. */
export function unresolveDesign(r: ResolvedDesign): DesignFile {
  const frontEnd: DesignFile['frontEnd'] =
    r.frontEnd.kind === 'splitWishbones'
      ? {
          kind: 'splitWishbones',
          upper: {
            frontPivot: compactPoint(r.frontEnd.upper.frontPivot),
            rearPivot: compactPoint(r.frontEnd.upper.rearPivot),
            outerJoint: compactPoint(r.frontEnd.upper.outerJoint),
          },
          lower: {
            frontPivot: compactPoint(r.frontEnd.lower.frontPivot),
            rearPivot: compactPoint(r.frontEnd.lower.rearPivot),
            outerJoint: compactPoint(r.frontEnd.lower.outerJoint),
          },
        }
      : {
          kind: 'centrePivot',
          upper: {
            pivot: copyVec(r.frontEnd.upper.pivot),
            pivotAxis: copyVec(r.frontEnd.upper.pivotAxis),
            outerJoint: compactPoint(r.frontEnd.upper.outerJoint),
          },
          lower: {
            pivot: copyVec(r.frontEnd.lower.pivot),
            pivotAxis: copyVec(r.frontEnd.lower.pivotAxis),
            outerJoint: compactPoint(r.frontEnd.lower.outerJoint),
          },
        };

  const s = r.steering;
  const steering: DesignFile['steering'] =
    s.kind === 'trackRod'
      ? { kind: 'trackRod', drive: copyTrackRodDrive(s.drive) }
      : s.kind === 'bellCrank'
      ? { kind: 'bellCrank', pivot: copyVec(s.pivot), axis: copyVec(s.axis), tieRodJoint: compactPoint(s.tieRodJoint), input: copyCrankInput(s.input) }
      : s.kind === 'rack'
        ? { kind: 'rack', axis: copyVec(s.axis), tieRodJoint: compactPoint(s.tieRodJoint), mmPerHandlebarDeg: s.mmPerHandlebarDeg }
        : { kind: 'direct', pivot: copyVec(s.pivot), axis: copyVec(s.axis), tieRodJoint: compactPoint(s.tieRodJoint) };

  const joints = {} as Joints;
  for (const name of JOINT_NAMES) {
    const j = r.joints[name];
    joints[name] = { kind: j.kind, ratedDeg: j.ratedDeg, studAxis: compactDirection(j.studAxis) };
  }

  const tolerances = differencesFrom<Tolerances>(DEFAULT_TOLERANCES, r.tolerances);
  const parts = differencesFrom<PartSizes>(DEFAULT_PART_SIZES, r.parts);
  const riding = differencesFrom<Riding>(ridingDefaults(r.vehicle, r.envelope), r.riding);

  return {
    tiltsheet: DESIGN_FORMAT_VERSION,
    name: r.name,
    ...(r.notes !== '' ? { notes: r.notes } : {}),
    vehicle: copyVehicle(r.vehicle, 'compact'),
    frontEnd,
    upright: {
      steeringAxis: r.upright.steeringAxis,
      steeringArmJoint: compactPoint(r.upright.steeringArmJoint),
      wheelCentre: compactPoint(r.upright.wheelCentre),
      staticToeDeg: compactNumber(r.upright.staticToeDeg),
      staticCamberDeg: compactNumber(r.upright.staticCamberDeg),
    },
    steering,
    wheels: { front: { ...r.wheels.front }, rear: { ...r.wheels.rear } },
    joints,
    envelope: { ...r.envelope },
    ...(tolerances ? { tolerances } : {}),
    ...(r.spring
      ? { spring: { on: r.spring.on, frameMount: compactPoint(r.spring.frameMount), armMount: compactPoint(r.spring.armMount) } }
      : {}),
    ...(r.leanLinkage ? { leanLinkage: unresolveLeanLinkage(r.leanLinkage) } : {}),
    ...(parts ? { parts } : {}),
    ...(riding ? { riding } : {}),
  };
}
