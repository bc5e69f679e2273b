/**
 * The Tiltbench design document ("tilt sheet"), format version 1.
 *
 * Files use the extension `.tiltsheet` and hold JSON. Every length is in millimetres and
 * every angle in degrees. Axes follow ISO 8855: x forward, y to the left, z up, with the
 * origin on the ground midway between the two front contact patches at design position.
 *
 * Side-specific values are written for the RIGHT side (y < 0) and mirrored (y -> -y) to
 * the left, unless a value is written for both sides explicitly as `{ right, left }`.
 *
 * These interfaces describe the file as written. `resolveDesign` turns a validated file
 * into a `ResolvedDesign` with both sides spelled out and every default applied.
 */

/** A point or direction in millimetres (directions need not be unit length). */
export interface Vec3Mm {
  x: number;
  y: number;
  z: number;
}

/** A plan-view point in millimetres. */
export interface Vec2Mm {
  x: number;
  y: number;
}

/** A right-side value mirrored to the left, or both sides given explicitly. */
export type Sided<T> = T | { right: T; left: T };

export const DESIGN_FORMAT_KEY = 'tiltsheet';
export const DESIGN_FORMAT_VERSION = 1;
export const DESIGN_FILE_EXTENSION = '.tiltsheet';

/** A split (per side) wishbone: two inner pivots on the frame and an outer ball joint. */
export interface SplitWishbone {
  frontPivot: Sided<Vec3Mm>;
  rearPivot: Sided<Vec3Mm>;
  outerJoint: Sided<Vec3Mm>;
}

/** A transverse member pivoted on the frame at the centre line, spanning both sides. */
export interface CentreMember {
  /** Pivot point on the centre line (y = 0 expected). */
  pivot: Vec3Mm;
  /** Direction of the pivot axis (usually along x). */
  pivotAxis: Vec3Mm;
  /** Ball joint (or pivot) at the member's end, carrying the upright. */
  outerJoint: Sided<Vec3Mm>;
}

export type FrontEnd =
  | { kind: 'splitWishbones'; upper: SplitWishbone; lower: SplitWishbone }
  | { kind: 'centrePivot'; upper: CentreMember; lower: CentreMember };

export interface Upright {
  /** Ball joints (both turn freely) or a kingpin bolt between the two outer joints. */
  steeringAxis: 'ballJoints' | 'kingpin';
  /** Ball joint at the end of the steering arm, where the tie rod attaches. */
  steeringArmJoint: Sided<Vec3Mm>;
  /** Wheel centre (on the spin axis, in the wheel's mid plane). */
  wheelCentre: Sided<Vec3Mm>;
  /** Static toe at design position, toe-in positive, degrees. */
  staticToeDeg: Sided<number>;
  /** Static camber at design position, top of wheel outward positive, degrees. */
  staticCamberDeg: Sided<number>;
}

/**
 * How the handlebar turns a bell crank; or (`knuckle`) the handlebar is fixed to one upright
 * (kingpin uprights only: the handlebar angle is its turn about its kingpin) and that upright's
 * tie rod turns the crank, which turns the other upright: knuckle-mounted steering with tie rods.
 */
export type CrankInput =
  | {
      kind: 'knuckle';
      /** The upright the handlebar is fixed to. */
      upright: Side;
    }
  | {
      kind: 'ratio';
      /** Crank rotation (right-hand rule about its axis) per degree of handlebar. */
      crankDegPerHandlebarDeg: number;
    }
  | {
      kind: 'dragLink';
      columnPivot: Vec3Mm;
      /** Direction of the steering column; positive handlebar turns right-handed about it. */
      columnAxis: Vec3Mm;
      /** Ball joint on the column's arm. */
      columnArmJoint: Vec3Mm;
      /** Ball joint on the crank's input arm. */
      crankArmJoint: Vec3Mm;
    };

/**
 * How the handlebar turns a one-piece track rod's uprights: through a drag link from a
 * steering column to a second arm on one upright, fixed to one upright (knuckle-mounted:
 * the handlebar angle is that upright's own rotation about its kingpin; kingpin uprights only),
 * or by a lever on the steering column pulling the rod through a short link.
 */
export type TrackRodDrive =
  | {
      kind: 'dragLink';
      /** The upright the drag link pulls on. */
      upright: Side;
      columnPivot: Vec3Mm;
      /** Direction of the steering column; positive handlebar turns right-handed about it. */
      columnAxis: Vec3Mm;
      /** Ball joint on the column's arm. */
      columnArmJoint: Vec3Mm;
      /** Ball joint on the driven upright's drag-link arm. */
      uprightArmJoint: Vec3Mm;
    }
  | {
      kind: 'centreLever';
      /** A point on the lever's pivot axis (the steering column), turned one degree per handlebar degree. */
      pivot: Vec3Mm;
      /** Lever pivot axis; positive handlebar turns right-handed about it. */
      axis: Vec3Mm;
      /** Ball joint on the lever's arm. */
      leverJoint: Vec3Mm;
      /** Ball joint on the track rod, on its line between the steering-arm joints. */
      trackRodJoint: Vec3Mm;
    }
  | {
      kind: 'knuckle';
      /** The upright the handlebar is fixed to; positive handlebar turns it right-handed about its kingpin (lower to upper joint). */
      upright: Side;
    };

export type Steering =
  | {
      /**
       * One rod joins the two steering arms' joints (`upright.steeringArmJoint`): the Ackermann
       * trapezoid. No inner tie-rod joints.
       */
      kind: 'trackRod';
      drive: TrackRodDrive;
    }
  | {
      kind: 'bellCrank';
      pivot: Vec3Mm;
      /** Pivot axis direction, anywhere from horizontal to vertical. */
      axis: Vec3Mm;
      /** The crank's ball joint for each side's tie rod. */
      tieRodJoint: Sided<Vec3Mm>;
      input: CrankInput;
    }
  | {
      kind: 'rack';
      /** Direction the rack slides (usually y). Positive handlebar moves it along +axis. */
      axis: Vec3Mm;
      /** Ball joint at each end of the rack (inner tie-rod joint). */
      tieRodJoint: Sided<Vec3Mm>;
      /** Rack travel per degree of handlebar. */
      mmPerHandlebarDeg: number;
    }
  | {
      kind: 'direct';
      /** The steering column carries one lever with both tie rods' joints. */
      pivot: Vec3Mm;
      axis: Vec3Mm;
      tieRodJoint: Sided<Vec3Mm>;
    };

export interface Tyre {
  /** Centre to ground, upright wheel, mm. */
  rollingRadiusMm: number;
  tyreWidthMm: number;
  /** Radius of the tread's cross-section (crown); the contact point rolls around it. */
  crownRadiusMm: number;
}

export interface Wheels {
  front: Tyre;
  rear: Tyre;
}

/**
 * A rear pair that leans with the frame through its own members (a tilting quadricycle): an
 * upper and a lower member pivoted on a rear carrier at the centre line (the carrier slides
 * vertically in the frame: the rear spring's travel), and a rear upright per side hung on the
 * lower member's outer joint (turning about the member's pivot axis, not steered) and closed
 * at the upper member's outer joint. Static toe and camber are 0: each rear wheel's spin axis
 * is along y at design. The rear tyre is `wheels.rear`.
 */
export interface LeaningRearPair {
  kind: 'leaningPair';
  upper: CentreMember;
  lower: CentreMember;
  /** Rear wheel centre (on the spin axis, in the wheel's mid plane), carried by the rear upright. */
  wheelCentre: Sided<Vec3Mm>;
}

export type Rear = { kind: 'single' } | { kind: 'pair'; trackMm: number } | LeaningRearPair;

export type JointKind = 'ballJoint' | 'rodEnd';

/**
 * A ball joint or rod end. The stud (ball joint) or bolt (rod end) is fixed in one body and
 * the housing in the other; at design position the housing axis lies along `studAxis`, so
 * articulation is zero there and grows as the two bodies rotate relative to each other.
 */
export interface JointSpec {
  kind: JointKind;
  /** Rated articulation (half cone angle) from the maker's data, degrees. */
  ratedDeg: number;
  /** Stud or bolt direction at design position. */
  studAxis: Sided<Vec3Mm>;
}

export interface Joints {
  /** Upper outer joint between wishbone (or member) and upright; stud in the upright. */
  upperOuter: JointSpec;
  /** Lower outer joint; stud in the upright. */
  lowerOuter: JointSpec;
  /** Tie rod's outer end; bolt or stud fixed in the steering arm, housing in the tie rod. */
  tieRodOuter: JointSpec;
  /** Tie rod's inner end; bolt or stud fixed in the crank, rack or lever. */
  tieRodInner: JointSpec;
}

/** Allowed errors; every warning in the tool measures against these. */
export interface Tolerances {
  /** Self-steer: road-wheel angle change at zero handlebar as the vehicle leans or the wheels travel. */
  selfSteerDeg: number;
  /** Steering-ratio change with lean and travel, percent of the upright ratio at the same handlebar. */
  ratioChangePct: number;
  slipDeg: number;
  jointMarginDeg: number;
  clearanceMm: number;
}

/** The operating range the design must cover. */
export interface Envelope {
  /** Largest lean each way, degrees (0 for a non-tilting vehicle). */
  leanDeg: number;
  /** Handlebar lock each way, degrees. */
  handlebarDeg: number;
  bumpMm: number;
  reboundMm: number;
}

/** A spring or damper between the frame and a wishbone (or member). */
export interface SpringMount {
  on: 'upper' | 'lower';
  frameMount: Sided<Vec3Mm>;
  armMount: Sided<Vec3Mm>;
}

/**
 * A balance-beam (rocker) lean linkage for split wishbones on a tilting vehicle: a carrier
 * slides in the frame along the spring's line (the spring or damper acts between the frame
 * mount and the carrier mount), a rocker turns on the carrier, and a push link per side joins
 * the rocker to that side's wishbone. In lean the rocker turns and the spring keeps its length;
 * in heave the carrier slides and compresses the spring.
 */
export interface LeanLinkage {
  carrier: {
    /** Spring mount on the frame; the carrier slides along the line from its mount to this one. */
    frameMount: Vec3Mm;
    /** Spring mount on the carrier. */
    carrierMount: Vec3Mm;
  };
  rocker: {
    /** A point on the rocker's pivot axis, in the carrier. */
    pivot: Vec3Mm;
    /** Rocker pivot axis (usually along x); the rocker angle is right-handed about it. */
    axis: Vec3Mm;
    /** The rocker's ball joint for each side's push link. */
    linkJoint: Sided<Vec3Mm>;
    /** Largest rocker rotation each way relative to the carrier (the lean stops), degrees. */
    stopDeg: number;
  };
  pushLinks: {
    /** Which wishbone each push link acts on. */
    on: 'upper' | 'lower';
    /** The push link's ball joint on that wishbone. */
    armJoint: Sided<Vec3Mm>;
  };
  /** A lean actuator or tilt lock: a length between a frame mount and a rocker mount. */
  actuator?: { frameMount: Vec3Mm; rockerMount: Vec3Mm };
}

/** Radii used to model parts as capsules for clearance checks. */
export interface PartSizes {
  wishboneTubeRadiusMm: number;
  tieRodRadiusMm: number;
  steeringArmRadiusMm: number;
}

/**
 * How the vehicle is ridden. `check` judges the operating region: the (lean, handlebar,
 * travel) that balanced turns between minKmh and maxKmh reach, widened by the transient band
 * and bounded by the lean limit, the grip limit and the steering limits.
 */
export interface Riding {
  /** Lowest speed of the balanced turns judged, km/h. */
  minKmh: number;
  /** Highest speed of the balanced turns judged, km/h. */
  maxKmh: number;
  /** Largest lean the vehicle allows each way, degrees (0 when the vehicle does not tilt). */
  maxLeanDeg: number;
  /** Lean either side of the balanced lean that transients reach (countersteering), degrees. */
  transientBandDeg: number;
  /** Lateral grip limit of the tyres, in g (multiples of standard gravity). */
  gripG: number;
}

export interface Vehicle {
  wheelbaseMm: number;
  /** Whether the frame leans (false: lean stays at 0). */
  tilting: boolean;
  rear: Rear;
  /** Plan-view outline of the body for wall-to-wall turning; optional. */
  bodyOutline?: Vec2Mm[];
}

export interface DesignFile {
  tiltsheet: 1;
  name: string;
  notes?: string;
  vehicle: Vehicle;
  frontEnd: FrontEnd;
  upright: Upright;
  steering: Steering;
  wheels: Wheels;
  joints: Joints;
  envelope: Envelope;
  /** `toeErrorDeg` is the older name of `selfSteerDeg`, read when that is absent. */
  tolerances?: Partial<Tolerances> & { toeErrorDeg?: number };
  spring?: SpringMount;
  /** A balance-beam lean linkage (split wishbones, tilting vehicles only). */
  leanLinkage?: LeanLinkage;
  parts?: Partial<PartSizes>;
  /** Missing values take DEFAULT_RIDING; maxLeanDeg defaults to envelope.leanDeg. */
  riding?: Partial<Riding>;
}

export type Side = 'left' | 'right';
export const SIDES: readonly Side[] = ['right', 'left'];

/** Both sides spelled out. */
export interface PerSide<T> {
  right: T;
  left: T;
}

/** A lean linkage with both sides spelled out. */
export interface ResolvedLeanLinkage {
  carrier: LeanLinkage['carrier'];
  rocker: { pivot: Vec3Mm; axis: Vec3Mm; linkJoint: PerSide<Vec3Mm>; stopDeg: number };
  pushLinks: { on: 'upper' | 'lower'; armJoint: PerSide<Vec3Mm> };
  actuator?: { frameMount: Vec3Mm; rockerMount: Vec3Mm };
}

/** A design after validation and resolution: explicit sides, defaults applied. */
export interface ResolvedDesign {
  name: string;
  notes: string;
  vehicle: Vehicle;
  frontEnd:
    | {
        kind: 'splitWishbones';
        upper: { frontPivot: PerSide<Vec3Mm>; rearPivot: PerSide<Vec3Mm>; outerJoint: PerSide<Vec3Mm> };
        lower: { frontPivot: PerSide<Vec3Mm>; rearPivot: PerSide<Vec3Mm>; outerJoint: PerSide<Vec3Mm> };
      }
    | {
        kind: 'centrePivot';
        upper: { pivot: Vec3Mm; pivotAxis: Vec3Mm; outerJoint: PerSide<Vec3Mm> };
        lower: { pivot: Vec3Mm; pivotAxis: Vec3Mm; outerJoint: PerSide<Vec3Mm> };
      };
  upright: {
    steeringAxis: 'ballJoints' | 'kingpin';
    steeringArmJoint: PerSide<Vec3Mm>;
    wheelCentre: PerSide<Vec3Mm>;
    staticToeDeg: PerSide<number>;
    staticCamberDeg: PerSide<number>;
  };
  steering:
    | { kind: 'trackRod'; drive: TrackRodDrive }
    | { kind: 'bellCrank'; pivot: Vec3Mm; axis: Vec3Mm; tieRodJoint: PerSide<Vec3Mm>; input: CrankInput }
    | { kind: 'rack'; axis: Vec3Mm; tieRodJoint: PerSide<Vec3Mm>; mmPerHandlebarDeg: number }
    | { kind: 'direct'; pivot: Vec3Mm; axis: Vec3Mm; tieRodJoint: PerSide<Vec3Mm> };
  wheels: Wheels;
  joints: Record<keyof Joints, { kind: JointKind; ratedDeg: number; studAxis: PerSide<Vec3Mm> }>;
  envelope: Envelope;
  tolerances: Tolerances;
  spring?: { on: 'upper' | 'lower'; frameMount: PerSide<Vec3Mm>; armMount: PerSide<Vec3Mm> };
  leanLinkage?: ResolvedLeanLinkage;
  parts: PartSizes;
  /** Always present: defaults filled; maxLeanDeg is 0 for a vehicle that does not tilt. */
  riding: Riding;
}

/**
 * Defaults for tolerances and part sizes. Common practice, no source: a toe error of
 * 0.25 degrees and 1 degree of slip are what a careful builder would accept on a
 * human-powered trike; a steering ratio that moves by 15 % as the vehicle leans is about
 * what a rider adapts to without noticing; 3 degrees of joint margin and 10 mm of clearance leave room for
 * build tolerances.
 */
export const DEFAULT_TOLERANCES: Tolerances = {
  selfSteerDeg: 0.25,
  ratioChangePct: 15,
  slipDeg: 1,
  jointMarginDeg: 3,
  clearanceMm: 10,
};

export const DEFAULT_PART_SIZES: PartSizes = {
  wishboneTubeRadiusMm: 10,
  tieRodRadiusMm: 6,
  steeringArmRadiusMm: 8,
};

/**
 * Defaults of the riding block for a human-powered or small electric leaning trike. Common
 * practice, no source: below 5 km/h a rider balances with the handlebar rather than by
 * leaning into a steady turn; 45 km/h is about the top speed of such a vehicle on the flat;
 * 5 degrees either side of balance covers the countersteer that starts a turn; 0.8 g is what
 * a road tyre holds on dry tarmac without sliding. The lean limit defaults to the envelope's
 * lean, so it is not here.
 */
export const DEFAULT_RIDING: Omit<Riding, 'maxLeanDeg'> = {
  minKmh: 5,
  maxKmh: 45,
  transientBandDeg: 5,
  gripG: 0.8,
};
