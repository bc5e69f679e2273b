/**
 * The schema of a design file, format 1, written in the schema DSL. The validator and the
 * published JSON Schema (assets/tiltsheet.schema.json) are both generated from this one tree.
 *
 * Bounds are sanity limits that catch slips (a unit mix-up, a sign error), not design advice.
 * Rules that involve more than one field (crown radius vs rolling radius, coincident points,
 * the steering axis vs the spin axis, ...) are in crossFieldChecks.ts.
 */
import {
  array,
  boolean,
  direction3,
  discriminatedUnion,
  enumOf,
  literal,
  number,
  object,
  optional,
  sided,
  string,
  vec2mm,
  vec3mm,
  type Infer,
} from './schemaDsl';
import { DESIGN_FORMAT_VERSION, type DesignFile } from './types';

const mm = (description: string, bounds: { min?: number; max?: number; exclusiveMin?: number } = {}) =>
  number({ unit: 'mm', description, ...bounds });
const positiveMm = (description: string) => mm(description, { exclusiveMin: 0 });
const positiveDeg = (description: string) => number({ unit: 'deg', description, exclusiveMin: 0 });
const point = vec3mm;
const sidedPoint = (description: string) => sided(vec3mm(description));

const splitWishbone = (which: string) =>
  object(`${which} wishbone of each side: two inner pivots on the frame and an outer ball joint`, {
    frontPivot: sidedPoint(`Front inner pivot of the ${which} wishbone`),
    rearPivot: sidedPoint(`Rear inner pivot of the ${which} wishbone`),
    outerJoint: sidedPoint(`Outer ball joint of the ${which} wishbone, on the upright`),
  });

const centreMember = (which: string) =>
  object(`${which} transverse member, pivoted on the frame at the centre line and spanning both sides`, {
    pivot: point(`Pivot of the ${which} member on the centre line (y = 0)`),
    pivotAxis: direction3(`Direction of the ${which} member's pivot axis (usually along x)`),
    outerJoint: sidedPoint(`Ball joint or pivot at the end of the ${which} member, carrying the upright`),
  });

const frontEnd = discriminatedUnion('Front suspension linkage', [
  object('Separate upper and lower wishbones on each side', {
    kind: literal('splitWishbones', 'Split wishbones'),
    upper: splitWishbone('upper'),
    lower: splitWishbone('lower'),
  }),
  object('One upper and one lower member pivoted at the centre line (tilting parallelogram)', {
    kind: literal('centrePivot', 'Centre-pivot members'),
    upper: centreMember('upper'),
    lower: centreMember('lower'),
  }),
]);

const upright = object('Upright (knuckle) carrying the wheel', {
  steeringAxis: enumOf(['ballJoints', 'kingpin'], 'The steering axis runs through two ball joints or a kingpin bolt between the outer joints'),
  steeringArmJoint: sidedPoint('Ball joint at the end of the steering arm, where the tie rod attaches'),
  wheelCentre: sidedPoint("Wheel centre, on the spin axis in the wheel's mid plane"),
  staticToeDeg: sided(number({ unit: 'deg', description: 'Static toe at design position, toe-in positive', min: -10, max: 10 })),
  staticCamberDeg: sided(
    number({ unit: 'deg', description: 'Static camber at design position, top of wheel outward positive', min: -30, max: 30 }),
  ),
});

const crankInput = discriminatedUnion('How the handlebar turns the bell crank', [
  object('A fixed ratio between handlebar and crank rotation', {
    kind: literal('ratio', 'Fixed ratio'),
    crankDegPerHandlebarDeg: number({
      unit: 'ratio',
      description: 'Crank rotation (right-hand rule about its axis) per degree of handlebar',
      min: -10,
      max: 10,
      nonZero: true,
    }),
  }),
  object('A steering column whose arm drives the crank through a drag link', {
    kind: literal('dragLink', 'Drag link'),
    columnPivot: point('A point on the steering column axis'),
    columnAxis: direction3('Direction of the steering column; positive handlebar turns right-handed about it'),
    columnArmJoint: point("Ball joint on the column's arm"),
    crankArmJoint: point("Ball joint on the crank's input arm"),
  }),
  object('The handlebar fixed to one upright (kingpin uprights only); its tie rod turns the crank, which turns the other upright', {
    kind: literal('knuckle', 'Handlebar on the upright'),
    upright: enumOf(['right', 'left'], 'The upright the handlebar is fixed to'),
  }),
]);

const trackRodDrive = discriminatedUnion('How the handlebar turns the uprights joined by the track rod', [
  object('A steering column whose arm pulls one upright through a drag link', {
    kind: literal('dragLink', 'Drag link to one upright'),
    upright: enumOf(['right', 'left'], 'The upright the drag link pulls on'),
    columnPivot: point('A point on the steering column axis'),
    columnAxis: direction3('Direction of the steering column; positive handlebar turns right-handed about it'),
    columnArmJoint: point("Ball joint on the column's arm"),
    uprightArmJoint: point("Ball joint on the driven upright's drag-link arm"),
  }),
  object('A lever on the steering column pulling the track rod through a short link', {
    kind: literal('centreLever', 'Centre lever and short link'),
    pivot: point("A point on the lever's pivot axis (the steering column)"),
    axis: direction3('Lever pivot axis; positive handlebar turns right-handed about it'),
    leverJoint: point("Ball joint on the lever's arm"),
    trackRodJoint: point("Ball joint on the track rod, on its line between the steering-arm joints"),
  }),
  object('The handlebar fixed to one upright (kingpin uprights only): the handlebar angle is its rotation about the kingpin', {
    kind: literal('knuckle', 'Handlebar on the upright'),
    upright: enumOf(['right', 'left'], 'The upright the handlebar is fixed to'),
  }),
]);

const steering = discriminatedUnion('Steering linkage that moves the inner tie-rod joints', [
  object('A bell crank pivoted on the frame', {
    kind: literal('bellCrank', 'Bell crank'),
    pivot: point('A point on the bell crank pivot axis'),
    axis: direction3('Bell crank pivot axis direction, anywhere from horizontal to vertical'),
    tieRodJoint: sidedPoint("The crank's ball joint for the tie rod"),
    input: crankInput,
  }),
  object('A rack sliding across the frame', {
    kind: literal('rack', 'Rack'),
    axis: direction3('Direction the rack slides (usually y); positive handlebar moves it along +axis'),
    tieRodJoint: sidedPoint('Ball joint at the end of the rack (inner tie-rod joint)'),
    mmPerHandlebarDeg: number({ unit: 'mm/deg', description: 'Rack travel per degree of handlebar', min: -20, max: 20, nonZero: true }),
  }),
  object('One lever on the steering column carrying both tie rods', {
    kind: literal('direct', 'Direct lever'),
    pivot: point('A point on the steering column axis'),
    axis: direction3('Steering column axis direction'),
    tieRodJoint: sidedPoint("The lever's ball joint for the tie rod"),
  }),
  object('One track rod joining the two steering arms (the Ackermann trapezoid)', {
    kind: literal('trackRod', 'One-piece track rod'),
    drive: trackRodDrive,
  }),
]);

const tyre = (which: string) =>
  object(`${which} tyre`, {
    rollingRadiusMm: positiveMm('Centre to ground, upright wheel'),
    tyreWidthMm: positiveMm('Tyre width'),
    crownRadiusMm: positiveMm("Radius of the tread's cross-section (crown); at most the rolling radius"),
  });

const rearMember = (which: string) =>
  object(`${which} rear member, pivoted at the centre line on the rear carrier (which slides vertically in the frame) and spanning both sides`, {
    pivot: point(`Pivot of the ${which} rear member on the centre line (y = 0)`),
    pivotAxis: direction3(`Direction of the ${which} rear member's pivot axis (usually along x)`),
    outerJoint: sidedPoint(`Joint at the end of the ${which} rear member, carrying the rear upright`),
  });

const rear = discriminatedUnion('Rear wheel layout', [
  object('One rear wheel', { kind: literal('single', 'Single rear wheel') }),
  object('Two rear wheels', {
    kind: literal('pair', 'Rear wheel pair'),
    trackMm: positiveMm('Rear track, contact patch centre to centre'),
  }),
  object('Two rear wheels that lean with the frame through their own members (tilting quadricycle; not steered, static toe and camber 0)', {
    kind: literal('leaningPair', 'Leaning rear pair'),
    upper: rearMember('upper'),
    lower: rearMember('lower'),
    wheelCentre: sidedPoint("Rear wheel centre, on the spin axis in the wheel's mid plane, carried by the rear upright"),
  }),
]);

const vehicle = object('The vehicle as a whole', {
  wheelbaseMm: mm('Wheelbase, front axle line to rear axle line', { min: 300, max: 5000 }),
  tilting: boolean('Whether the frame leans (false: lean stays at 0)'),
  rear,
  bodyOutline: optional(array(vec2mm('A corner of the plan-view body outline'), 'Plan-view outline of the body, for the wall-to-wall turning circle', { minItems: 3 })),
});

const joint = (which: string) =>
  object(which, {
    kind: enumOf(['ballJoint', 'rodEnd'], 'Ball joint or rod end'),
    ratedDeg: number({ unit: 'deg', description: "Rated articulation (half cone angle) from the maker's data", exclusiveMin: 0, exclusiveMax: 90 }),
    studAxis: sided(direction3('Stud or bolt direction at design position')),
  });

const joints = object('Ball joints and rod ends whose articulation is checked', {
  upperOuter: joint('Upper outer joint between wishbone (or member) and upright; stud in the upright'),
  lowerOuter: joint('Lower outer joint; stud in the upright'),
  tieRodOuter: joint("Tie rod's outer end; bolt or stud fixed in the steering arm"),
  tieRodInner: joint("Tie rod's inner end; bolt or stud fixed in the crank, rack or lever"),
});

const envelope = object('The operating range the design must cover', {
  leanDeg: number({ unit: 'deg', description: 'Largest lean each way (0 for a non-tilting vehicle)', min: 0, max: 60 }),
  handlebarDeg: number({ unit: 'deg', description: 'Handlebar lock each way', min: 0, max: 180 }),
  bumpMm: mm('Suspension compression from design position', { min: 0, max: 500 }),
  reboundMm: mm('Suspension extension from design position', { min: 0, max: 500 }),
});

const tolerances = object('Allowed errors; missing ones take the defaults', {
  selfSteerDeg: optional(positiveDeg('Allowed self-steer: road-wheel angle change at zero handlebar with lean or travel')),
  ratioChangePct: optional(number({ unit: '%', description: 'Allowed steering-ratio change with lean and travel, percent of upright', min: 0.1, max: 1000 })),
  toeErrorDeg: optional(positiveDeg('Older name of selfSteerDeg, read when selfSteerDeg is absent')),
  slipDeg: optional(positiveDeg('Allowed slip angle')),
  jointMarginDeg: optional(positiveDeg('Required margin below a joint’s rated articulation')),
  clearanceMm: optional(positiveMm('Required clearance between parts')),
});

const spring = object('A spring or damper between the frame and a wishbone (or member)', {
  on: enumOf(['upper', 'lower'], 'Which wishbone (or member) carries the spring'),
  frameMount: sidedPoint('Spring mount on the frame'),
  armMount: sidedPoint('Spring mount on the wishbone (or member)'),
});

const leanLinkage = object(
  'A balance-beam lean linkage (split wishbones, tilting vehicles): a carrier sliding in the frame along the spring, a rocker turning on it and a push link per side to a wishbone',
  {
    carrier: object('The carrier: it slides in the frame along the line between the spring mounts', {
      frameMount: point('Spring mount on the frame; the carrier slides along the line from its own mount to this one'),
      carrierMount: point('Spring mount on the carrier'),
    }),
    rocker: object('The rocker (balance beam), on a revolute joint in the carrier', {
      pivot: point("A point on the rocker's pivot axis"),
      axis: direction3("Rocker pivot axis (usually along x); the rocker angle is right-handed about it"),
      linkJoint: sidedPoint("The rocker's ball joint for the push link"),
      stopDeg: number({ unit: 'deg', description: 'Largest rocker rotation each way relative to the carrier (the lean stops)', exclusiveMin: 0, max: 90 }),
    }),
    pushLinks: object('A push link per side: a rigid link with a ball joint at each end, from the rocker to a wishbone', {
      on: enumOf(['upper', 'lower'], 'Which wishbone the push links act on'),
      armJoint: sidedPoint("The push link's ball joint on the wishbone"),
    }),
    actuator: optional(
      object('A lean actuator or tilt lock: a length between a frame mount and a rocker mount', {
        frameMount: point('Actuator mount on the frame'),
        rockerMount: point('Actuator mount on the rocker'),
      }),
    ),
  },
);

const parts = object('Radii used to model parts as capsules for clearance checks; missing ones take the defaults', {
  wishboneTubeRadiusMm: optional(positiveMm('Wishbone tube radius')),
  tieRodRadiusMm: optional(positiveMm('Tie rod radius')),
  steeringArmRadiusMm: optional(positiveMm('Steering arm radius')),
});

const riding = object(
  'How the vehicle is ridden: check judges the (lean, handlebar) that balanced turns in this speed range reach; missing values take the defaults',
  {
    minKmh: optional(number({ unit: 'km/h', description: 'Lowest speed of the balanced turns judged (default 5)', exclusiveMin: 0, max: 200 })),
    maxKmh: optional(number({ unit: 'km/h', description: 'Highest speed of the balanced turns judged (default 45)', exclusiveMin: 0, max: 200 })),
    maxLeanDeg: optional(
      number({
        unit: 'deg',
        description: 'Largest lean the vehicle allows each way, at most envelope.leanDeg (default envelope.leanDeg; ignored when vehicle.tilting is false)',
        min: 0,
        max: 60,
      }),
    ),
    transientBandDeg: optional(
      number({ unit: 'deg', description: 'Lean either side of the balanced lean reached in transients such as countersteering (default 5)', min: 0, max: 30 }),
    ),
    gripG: optional(number({ unit: 'g', description: 'Lateral grip limit of the tyres (default 0.8)', exclusiveMin: 0, max: 1.5 })),
  },
);

export const designFileSchema = object('A Tiltbench design ("tilt sheet"). Lengths in mm, angles in degrees; ISO 8855 axes: x forward, y left, z up.', {
  tiltsheet: literal(DESIGN_FORMAT_VERSION, 'Format version of this file'),
  name: string('Name of the design', { minLength: 1 }),
  notes: optional(string('Free notes')),
  vehicle,
  frontEnd,
  upright,
  steering,
  wheels: object('Front and rear tyres', { front: tyre('Front'), rear: tyre('Rear') }),
  joints,
  envelope,
  tolerances: optional(tolerances),
  spring: optional(spring),
  leanLinkage: optional(leanLinkage),
  parts: optional(parts),
  riding: optional(riding),
});

// Compile-time guard: the schema and the hand-written DesignFile interface must describe the
// same values. If either changes alone, this line stops compiling.
type MutuallyAssignable<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const schemaMatchesDesignFile: MutuallyAssignable<Infer<typeof designFileSchema>, DesignFile> = true;
void schemaMatchesDesignFile;
