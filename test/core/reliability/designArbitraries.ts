/**
 * Generated designs for the fuzz tests, in three families:
 *
 * - near:      a demo design with its hardpoints moved, ratios and radii scaled, toe and
 *              camber changed, sometimes made asymmetric (left no longer the mirror);
 * - plausible: a tadpole front end of random proportions built from scratch (any layout the
 *              format knows), far from the demos but shaped like a vehicle;
 * - wild:      every point and direction uniformly random inside the schema's bounds, at a
 *              random scale from 0.3 m to 11 m per coordinate.
 *
 * Every generated design is a format-1 document that passes the schema (numbers inside their
 * bounds, single points on the right side, directions not zero); the checks across fields may
 * still reject it, which the tests count. Randomness comes only from fast-check, so a seed
 * reproduces a run and a failure shrinks.
 */
import fc from 'fast-check';
import type { DesignFile, Sided, Vec3Mm } from '../../../core/design/types';
import { clone } from './demoDesigns';
import { resolveSidedVec } from '../../../core/design/resolveDesign';

export type Family = 'near' | 'plausible' | 'wild';

export interface GeneratedDesign {
  family: Family;
  /** Where it came from, for failure messages. */
  origin: string;
  design: DesignFile;
}

/** Keys whose {x, y, z} value is a direction, not a point. */
const DIRECTION_KEYS = new Set(['axis', 'pivotAxis', 'columnAxis', 'studAxis']);
/** The schema's bound on a vector's length (schemaDsl DEFAULT_MAX_MAGNITUDE_MM). */
const MAX_MAGNITUDE_MM = 20000;

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** Numbers in [-1, 1] handed out in turn (wrapping), so one array drives a whole perturbation. */
class Noise {
  private i = 0;
  constructor(private readonly values: readonly number[]) {}
  next(): number {
    const v = this.values.length === 0 ? 0 : this.values[this.i % this.values.length];
    this.i++;
    return v;
  }
}

function isVec3(v: unknown): v is Vec3Mm {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && ['x', 'y', 'z'].every((k) => typeof (v as Record<string, unknown>)[k] === 'number') && Object.keys(v).length === 3;
}

function isTwoSidedObject(v: unknown): v is { right: unknown; left: unknown } {
  return typeof v === 'object' && v !== null && 'right' in v && 'left' in v;
}

function limitLength(v: Vec3Mm): Vec3Mm {
  const n = Math.hypot(v.x, v.y, v.z);
  if (n <= MAX_MAGNITUDE_MM * 0.999) return v;
  const k = (MAX_MAGNITUDE_MM * 0.999) / n;
  return { x: v.x * k, y: v.y * k, z: v.z * k };
}

export interface Perturbation {
  /** Typical hardpoint move, mm. */
  moveMm: number;
  /** Make sided points asymmetric (left no longer the mirror of the right). */
  asymmetric: boolean;
  noise: number[];
  /** A few values at exactly -1, 0 or 1 spliced in front of the noise: the corners of the range. */
  spikes: number[];
}

export const perturbationArb: fc.Arbitrary<Perturbation> = fc.record({
  moveMm: fc.constantFrom(0.5, 5, 20, 60, 200),
  asymmetric: fc.boolean(),
  // Unbiased and long enough for every field: fast-check's default bias would make many early
  // samples all-zero noise, i.e. the demo itself again. The extremes come from `spikes`.
  noise: fc.array(fc.noBias(fc.integer({ min: -1_000_000, max: 1_000_000 })).map((n) => n / 1_000_000), { minLength: 160, maxLength: 160 }),
  spikes: fc.array(fc.constantFrom(-1, 1, 0), { maxLength: 6 }),
});

/** A demo design with its geometry and numbers perturbed; stays inside the schema's bounds. */
export function perturbDesign(base: DesignFile, p: Perturbation): DesignFile {
  const noise = new Noise([...p.spikes, ...p.noise]);
  const d = clone(base);

  const movePoint = (v: Vec3Mm, rightSide: boolean, centreLine: boolean): Vec3Mm => {
    const moved = {
      x: v.x + noise.next() * p.moveMm,
      y: centreLine ? v.y : v.y + noise.next() * p.moveMm,
      z: v.z + noise.next() * p.moveMm,
    };
    if (rightSide) moved.y = Math.min(0, moved.y);
    return limitLength(moved);
  };
  const turnDirection = (v: Vec3Mm): Vec3Mm => {
    const n = Math.hypot(v.x, v.y, v.z);
    const k = 0.4 * n;
    const turned = { x: v.x + noise.next() * k, y: v.y + noise.next() * k, z: v.z + noise.next() * k };
    return Math.hypot(turned.x, turned.y, turned.z) > 1e-6 * n ? limitLength(turned) : v;
  };

  const walk = (node: unknown, key: string, path: string): unknown => {
    if (isVec3(node)) {
      if (DIRECTION_KEYS.has(key)) return turnDirection(node);
      // A point that is not written per side (pivots of centre members, crank pivot, ...).
      return movePoint(node, false, path.startsWith('frontEnd.') && key === 'pivot');
    }
    if (Array.isArray(node)) return node.map((item, i) => walk(item, String(i), `${path}[${i}]`));
    if (typeof node === 'number') return perturbNumber(key, node, noise);
    if (typeof node !== 'object' || node === null) return node;
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(node)) out[k] = walkField(v, k, path === '' ? k : `${path}.${k}`);
    return out;
  };

  /** Sided fields: a single point is the right side; perhaps split it into two sides. */
  const walkField = (v: unknown, k: string, path: string): unknown => {
    if (!SIDED_KEYS.has(k)) return walk(v, k, path);
    if (isTwoSidedObject(v)) return { right: walkSided(v.right, k, true), left: walkSided(v.left, k, false) };
    if (p.asymmetric && noise.next() > 0) {
      const right = walkSided(v, k, true);
      const left = walkSided(mirrorOf(v), k, false);
      return { right, left };
    }
    return walkSided(v, k, true);
  };
  const walkSided = (v: unknown, k: string, right: boolean): unknown => {
    if (isVec3(v)) return DIRECTION_KEYS.has(k) ? turnDirection(v) : movePoint(v, right, false);
    if (typeof v === 'number') return perturbNumber(k, v, noise);
    return v;
  };

  const out = walk(d, '', '') as DesignFile;
  // A non-tilting vehicle must not lean (a rule across fields); keep that one valid.
  if (!out.vehicle.tilting) out.envelope.leanDeg = 0;
  return out;
}

function mirrorOf(v: unknown): unknown {
  return isVec3(v) ? { x: v.x, y: v.y === 0 ? 0 : -v.y, z: v.z } : v;
}

/** Fields written as Sided<...> in format 1 (types.ts). */
const SIDED_KEYS = new Set([
  'frontPivot',
  'rearPivot',
  'outerJoint',
  'steeringArmJoint',
  'wheelCentre',
  'staticToeDeg',
  'staticCamberDeg',
  'tieRodJoint',
  'studAxis',
  'frameMount',
  'armMount',
]);

function perturbNumber(key: string, value: number, noise: Noise): number {
  const n = noise.next();
  const scaled = (spread: number) => value * Math.exp(n * Math.log(spread));
  switch (key) {
    case 'crankDegPerHandlebarDeg': {
      const v = clamp(scaled(3) * (noise.next() < -0.85 ? -1 : 1), -10, 10);
      return v === 0 ? 1 : v;
    }
    case 'mmPerHandlebarDeg': {
      const v = clamp(scaled(3) * (noise.next() < -0.85 ? -1 : 1), -20, 20);
      return v === 0 ? 0.5 : v;
    }
    case 'rollingRadiusMm':
      return scaled(2.5);
    case 'crownRadiusMm':
      // kept at most the rolling radius by fixTyres below
      return scaled(4);
    case 'tyreWidthMm':
      return scaled(2);
    case 'staticToeDeg':
      return clamp(value + n * 4, -10, 10);
    case 'staticCamberDeg':
      return clamp(value + n * 8, -30, 30);
    case 'ratedDeg':
      return clamp(value + n * 15, 1, 89);
    case 'leanDeg':
      return clamp(value + n * 25, 0, 60);
    case 'handlebarDeg':
      return clamp(value + n * 40, 0, 180);
    case 'bumpMm':
    case 'reboundMm':
      return clamp(value + n * 80, 0, 500);
    case 'wheelbaseMm':
      return clamp(scaled(2), 300, 5000);
    case 'trackMm':
      return scaled(2);
    default:
      return value;
  }
}

/** Crown radius at most the rolling radius (a rule across fields), applied after perturbation. */
export function fixTyres(d: DesignFile): DesignFile {
  for (const axle of ['front', 'rear'] as const) {
    const t = d.wheels[axle];
    if (t.crownRadiusMm > t.rollingRadiusMm) t.crownRadiusMm = t.rollingRadiusMm;
  }
  return d;
}

export function nearDesignArb(bases: readonly { file: string; design: DesignFile }[]): fc.Arbitrary<GeneratedDesign> {
  return fc.tuple(fc.nat({ max: bases.length - 1 }), perturbationArb).map(([i, p]) => ({
    family: 'near' as const,
    origin: `${bases[i].file} moved by up to ${p.moveMm} mm${p.asymmetric ? ', asymmetric' : ''}`,
    design: fixTyres(perturbDesign(bases[i].design, p)),
  }));
}

// ---------------------------------------------------------------------------------------------
// Designs from scratch
// ---------------------------------------------------------------------------------------------

/** Uniform numbers in [0, 1) handed out in turn. */
class Uniform {
  private i = 0;
  constructor(private readonly values: readonly number[]) {}
  next(): number {
    const v = this.values.length === 0 ? 0.5 : this.values[this.i % this.values.length];
    this.i++;
    return v;
  }
  between(lo: number, hi: number): number {
    return lo + (hi - lo) * this.next();
  }
  pick<T>(options: readonly T[]): T {
    return options[Math.min(options.length - 1, Math.floor(this.next() * options.length))];
  }
}

const P = (x: number, y: number, z: number): Vec3Mm => ({ x, y, z });
const rightPoint = (v: Vec3Mm): Vec3Mm => ({ x: v.x, y: Math.min(0, v.y), z: v.z });

function jointSpecs(u: Uniform): DesignFile['joints'] {
  const joint = () => ({
    kind: u.pick(['ballJoint', 'rodEnd'] as const),
    ratedDeg: u.between(5, 45),
    studAxis: P(u.between(-1, 1), u.between(-1, 1), u.between(0.2, 1)),
  });
  return { upperOuter: joint(), lowerOuter: joint(), tieRodOuter: joint(), tieRodInner: joint() };
}

function envelopeOf(u: Uniform, tilting: boolean): DesignFile['envelope'] {
  return {
    leanDeg: tilting ? u.between(0, 60) : 0,
    handlebarDeg: u.between(0, 120),
    bumpMm: u.between(0, 150),
    reboundMm: u.between(0, 150),
  };
}

function tyreOf(u: Uniform, rolling: number): DesignFile['wheels']['front'] {
  const crown = u.between(0.02, 1) * rolling;
  return { rollingRadiusMm: rolling, tyreWidthMm: u.between(0.05, 1) * rolling, crownRadiusMm: crown };
}

function steeringOf(u: Uniform, layout: { armZ: number; innerY: number; armX: number; armY: number }, L: (s: number) => number): DesignFile['steering'] {
  const kind = u.pick(['bellCrank', 'bellCrankDragLink', 'rack', 'direct', 'trackRodDragLink', 'trackRodKnuckle', 'trackRodCentreLever', 'bellCrankKnuckle'] as const);
  if (kind === 'trackRodKnuckle') return { kind: 'trackRod', drive: { kind: 'knuckle', upright: u.pick(['right', 'left'] as const) } };
  if (kind === 'trackRodCentreLever') {
    // A lever on a column behind the rod's middle, the short link to a point on the rod's line (x = armX, z = armZ, y = 0).
    const x = layout.armX;
    const back = Math.sign(x || 1) * L(u.between(0.03, 0.1));
    return {
      kind: 'trackRod',
      drive: {
        kind: 'centreLever',
        pivot: P(x + back, -L(0.08), layout.armZ + L(0.04)),
        axis: P(u.between(-0.3, 0.3), u.between(-0.2, 0.2), 1),
        leverJoint: P(x, -L(0.08), layout.armZ + L(0.04)),
        trackRodJoint: P(x, L(0.3) * (u.next() - 0.5) * 0.2, layout.armZ),
      },
    };
  }
  if (kind === 'trackRodDragLink') {
    // A column on the centre line whose arm pulls an arm on one upright, on the other side of the axis from the steering arm.
    const side = u.pick(['right', 'left'] as const);
    const x = -layout.armX;
    return {
      kind: 'trackRod',
      drive: {
        kind: 'dragLink',
        upright: side,
        columnPivot: P(x - L(0.05), 0, layout.armZ + L(0.1)),
        columnAxis: P(u.between(-0.5, 0.5), u.between(-0.2, 0.2), 1),
        columnArmJoint: P(x + L(0.05) * (u.next() - 0.5), L(0.05) * (u.next() - 0.5), layout.armZ),
        uprightArmJoint: P(x, side === 'right' ? layout.armY : -layout.armY, layout.armZ + L(0.05) * (u.next() - 0.5)),
      },
    };
  }
  const inner = rightPoint(P(layout.armX + L(0.15) * (u.next() - 0.5), layout.innerY, layout.armZ + L(0.2) * (u.next() - 0.5)));
  if (kind === 'rack') {
    return { kind: 'rack', axis: P(u.between(-0.2, 0.2), u.pick([-1, 1]), u.between(-0.2, 0.2)), tieRodJoint: inner, mmPerHandlebarDeg: u.pick([-1, 1]) * u.between(0.05, 20) };
  }
  const pivot = P(inner.x + L(0.1) * (u.next() - 0.5), 0, inner.z - L(0.1) * u.next());
  const axis = P(u.between(-1, 1), u.between(-0.3, 0.3), u.between(-1, 1));
  if (Math.hypot(axis.x, axis.y, axis.z) < 0.05) axis.z = 1;
  if (kind === 'direct') return { kind: 'direct', pivot, axis, tieRodJoint: inner };
  const input: Extract<DesignFile['steering'], { kind: 'bellCrank' }>['input'] =
    kind === 'bellCrankKnuckle'
      ? { kind: 'knuckle', upright: u.pick(['right', 'left'] as const) }
      : kind === 'bellCrankDragLink'
      ? {
          kind: 'dragLink',
          columnPivot: P(pivot.x - L(0.3), 0, pivot.z + L(0.2)),
          columnAxis: P(u.between(-1, 1), u.between(-0.2, 0.2), u.between(0.2, 1)),
          columnArmJoint: P(pivot.x - L(0.3) + L(0.08) * (u.next() - 0.5), L(0.08) * (u.next() - 0.5), pivot.z + L(0.2)),
          crankArmJoint: P(pivot.x + L(0.08) * (u.next() - 0.5), L(0.08) * (u.next() - 0.5), pivot.z + L(0.05)),
        }
      : { kind: 'ratio', crankDegPerHandlebarDeg: u.pick([-1, 1]) * u.between(0.1, 10) };
  return { kind: 'bellCrank', pivot, axis, tieRodJoint: inner, input };
}

/**
 * A tadpole front end of random proportions: track, wheel size, wishbone heights and
 * lengths, caster and KPI, arm direction and layout all drawn at random.
 */
export function plausibleDesign(values: readonly number[]): DesignFile {
  const u = new Uniform(values);
  const scale = u.between(0.3, 3); // a toy to a small car
  const L = (s: number) => s * 1000 * scale;
  const track = L(u.between(0.5, 1.0)) / 2;
  const rolling = L(u.between(0.12, 0.35));
  const lowerZ = rolling * u.between(0.2, 0.8);
  const upperZ = lowerZ + L(u.between(0.06, 0.35));
  const lowerOuterY = -track + L(u.between(0.02, 0.12));
  const upperOuterY = lowerOuterY + L(u.between(-0.02, 0.08));
  const caster = L(u.between(-0.05, 0.08));
  const lowerOuter = P(caster / 2, lowerOuterY, lowerZ);
  const upperOuter = P(-caster / 2, upperOuterY, upperZ);
  const armSign = u.pick([-1, 1]); // rearward or forward steering arm
  const armZ = (lowerZ + upperZ) / 2 + L(0.03) * (u.next() - 0.5);
  const armX = armSign * L(u.between(0.04, 0.12));
  const arm = P(armX, (lowerOuterY + upperOuterY) / 2 + L(0.06) * (u.next() - 0.5), armZ);
  const wheelCentre = P(L(0.02) * (u.next() - 0.5), -track, rolling + L(0.02) * (u.next() - 0.5));
  const tilting = u.next() < 0.7;
  const centrePivot = u.next() < 0.35;
  const innerY = centrePivot ? -L(u.between(0.01, 0.08)) : -L(u.between(0.03, 0.2));

  const frontEnd: DesignFile['frontEnd'] = centrePivot
    ? {
        kind: 'centrePivot',
        upper: { pivot: P(0, 0, upperZ), pivotAxis: P(1, 0, u.between(-0.2, 0.2)), outerJoint: upperOuter },
        lower: { pivot: P(0, 0, lowerZ), pivotAxis: P(1, 0, u.between(-0.2, 0.2)), outerJoint: lowerOuter },
      }
    : {
        kind: 'splitWishbones',
        upper: {
          frontPivot: P(L(0.1), innerY, upperZ + L(0.03) * (u.next() - 0.5)),
          rearPivot: P(-L(0.1), innerY, upperZ + L(0.03) * (u.next() - 0.5)),
          outerJoint: upperOuter,
        },
        lower: {
          frontPivot: P(L(0.12), innerY, lowerZ + L(0.03) * (u.next() - 0.5)),
          rearPivot: P(-L(0.12), innerY, lowerZ + L(0.03) * (u.next() - 0.5)),
          outerJoint: lowerOuter,
        },
      };

  const design: DesignFile = {
    tiltsheet: 1,
    name: `plausible ${scale.toFixed(2)}x`,
    vehicle: {
      wheelbaseMm: clamp(L(u.between(0.6, 1.5)), 300, 5000),
      tilting,
      rear: u.next() < 0.8 ? { kind: 'single' } : { kind: 'pair', trackMm: 2 * track * u.between(0.5, 1.2) },
    },
    frontEnd,
    upright: {
      steeringAxis: u.pick(['ballJoints', 'kingpin'] as const),
      steeringArmJoint: arm,
      wheelCentre,
      staticToeDeg: u.between(-3, 3),
      staticCamberDeg: u.between(-5, 5),
    },
    steering: steeringOf(u, { armZ, innerY: Math.min(innerY, -1), armX, armY: arm.y }, L),
    wheels: { front: tyreOf(u, rolling), rear: tyreOf(u, rolling * u.between(0.8, 1.6)) },
    joints: jointSpecs(u),
    envelope: envelopeOf(u, tilting),
  };
  // A handlebar on an upright (with tie rods or a track rod) turns it about its kingpin.
  if (design.steering.kind === 'bellCrank' && design.steering.input.kind === 'knuckle') design.upright.steeringAxis = 'kingpin';
  if (design.steering.kind === 'trackRod') {
    // Both ends of a one-piece track rod are its joints on the steering arms; a handlebar on an upright needs a kingpin.
    design.joints.tieRodInner = JSON.parse(JSON.stringify(design.joints.tieRodOuter));
    if (design.steering.drive.kind === 'knuckle') design.upright.steeringAxis = 'kingpin';
  }
  // A leaning rear pair one time in five (drawn last, so the draws above are those of earlier seeds):
  // a parallelogram or, one time in four, members of different reach (which lock the pair).
  if (u.next() < 0.2) {
    const rearTyre = design.wheels.rear.rollingRadiusMm;
    const x = -design.vehicle.wheelbaseMm;
    const reach = L(u.between(0.15, 0.5));
    const lowZ = rearTyre * u.between(0.3, 1);
    const highZ = lowZ + L(u.between(0.1, 0.4));
    const skew = u.next() < 0.25 ? L(u.between(-0.05, 0.05)) : 0;
    const axis = P(1, 0, u.between(-0.2, 0.2));
    design.vehicle.rear = {
      kind: 'leaningPair',
      upper: { pivot: P(x, 0, highZ), pivotAxis: axis, outerJoint: P(x, -reach - skew, highZ) },
      lower: { pivot: P(x, 0, lowZ), pivotAxis: axis, outerJoint: P(x, -reach, lowZ) },
      wheelCentre: P(x, -reach - L(u.between(0.02, 0.15)), rearTyre + L(0.02) * (u.next() - 0.5)),
    };
  }
  // A balance-beam lean linkage on a third of the tilting split-wishbone ones (drawn last): a rocker
  // above the wishbones on a carrier sliding up to the frame, push links to a point part-way along
  // one wishbone of each side.
  const fe = design.frontEnd;
  if (fe.kind === 'splitWishbones' && tilting && u.next() < 0.35) {
    const on = u.pick(['upper', 'lower'] as const);
    const w = fe[on];
    const t = u.between(0.25, 0.85);
    const inner = mid(w.frontPivot as Vec3Mm, w.rearPivot as Vec3Mm);
    const outer = w.outerJoint as Vec3Mm;
    const armJoint = P(inner.x + t * (outer.x - inner.x), inner.y + t * (outer.y - inner.y), inner.z + t * (outer.z - inner.z));
    const pivotZ = upperZ + L(u.between(0.05, 0.3));
    const half = L(u.between(0.04, 0.2));
    const carrierMount = P(0, 0, pivotZ + L(0.03));
    design.leanLinkage = {
      carrier: { carrierMount, frameMount: P(0, L(0.01) * (u.next() - 0.5), carrierMount.z + L(u.between(0.1, 0.3))) },
      rocker: { pivot: P(0, 0, pivotZ), axis: P(1, 0, u.between(-0.1, 0.1)), linkJoint: P(armJoint.x * u.next(), -half, pivotZ + L(0.02) * (u.next() - 0.5)), stopDeg: u.between(10, 60) },
      pushLinks: { on, armJoint },
      ...(u.next() < 0.5 ? { actuator: { frameMount: P(0, -half / 2, pivotZ + L(0.15)), rockerMount: P(0, -half / 2, pivotZ) } } : {}),
    };
  }
  return design;
}

const mid = (a: Vec3Mm, b: Vec3Mm): Vec3Mm => P((a.x + b.x) / 2, (a.y + b.y) / 2, (a.z + b.z) / 2);

/** Every point and direction uniform in a random box; only the schema's bounds respected. */
export function wildDesign(values: readonly number[]): DesignFile {
  const u = new Uniform(values);
  const half = u.pick([300, 1000, 5000, 11000]); // 11000 * sqrt(3) < 20000, the length bound
  const c = () => u.between(-half, half);
  const point = () => P(c(), c(), c());
  const right = () => P(c(), -Math.abs(c()), c());
  const dir = () => {
    const v = P(u.between(-1, 1), u.between(-1, 1), u.between(-1, 1));
    return Math.hypot(v.x, v.y, v.z) < 1e-3 ? P(0, 0, 1) : v;
  };
  const sided = (make: () => Vec3Mm): Sided<Vec3Mm> => (u.next() < 0.3 ? { right: make(), left: point() } : make());
  const rolling = u.between(1, Math.min(half, 3000));
  const tilting = u.next() < 0.5;
  const frontEnd: DesignFile['frontEnd'] =
    u.next() < 0.5
      ? {
          kind: 'splitWishbones',
          upper: { frontPivot: sided(right), rearPivot: sided(right), outerJoint: sided(right) },
          lower: { frontPivot: sided(right), rearPivot: sided(right), outerJoint: sided(right) },
        }
      : {
          kind: 'centrePivot',
          upper: { pivot: P(c(), 0, c()), pivotAxis: dir(), outerJoint: sided(right) },
          lower: { pivot: P(c(), 0, c()), pivotAxis: dir(), outerJoint: sided(right) },
        };
  const kind = u.pick(['ratio', 'dragLink', 'rack', 'direct', 'trackRodDragLink', 'trackRodKnuckle', 'trackRodCentreLever', 'knuckle'] as const);
  const steering: DesignFile['steering'] =
    kind === 'trackRodCentreLever'
      ? { kind: 'trackRod', drive: { kind: 'centreLever', pivot: point(), axis: dir(), leverJoint: point(), trackRodJoint: point() } }
      : kind === 'trackRodKnuckle'
      ? { kind: 'trackRod', drive: { kind: 'knuckle', upright: u.pick(['right', 'left'] as const) } }
      : kind === 'trackRodDragLink'
        ? { kind: 'trackRod', drive: { kind: 'dragLink', upright: u.pick(['right', 'left'] as const), columnPivot: point(), columnAxis: dir(), columnArmJoint: point(), uprightArmJoint: point() } }
        : kind === 'rack'
      ? { kind: 'rack', axis: dir(), tieRodJoint: sided(right), mmPerHandlebarDeg: u.pick([-1, 1]) * u.between(0.01, 20) }
      : kind === 'direct'
        ? { kind: 'direct', pivot: point(), axis: dir(), tieRodJoint: sided(right) }
        : {
            kind: 'bellCrank',
            pivot: point(),
            axis: dir(),
            tieRodJoint: sided(right),
            input:
              kind === 'ratio'
                ? { kind: 'ratio', crankDegPerHandlebarDeg: u.pick([-1, 1]) * u.between(0.01, 10) }
                : kind === 'knuckle'
                  ? { kind: 'knuckle', upright: u.pick(['right', 'left'] as const) }
                  : { kind: 'dragLink', columnPivot: point(), columnAxis: dir(), columnArmJoint: point(), crankArmJoint: point() },
          };
  const design: DesignFile = {
    tiltsheet: 1,
    name: `wild ${half} mm`,
    vehicle: { wheelbaseMm: u.between(300, 5000), tilting, rear: { kind: 'single' } },
    frontEnd,
    upright: {
      steeringAxis: u.pick(['ballJoints', 'kingpin'] as const),
      steeringArmJoint: sided(right),
      wheelCentre: sided(() => P(c(), -Math.abs(c()), Math.abs(c()) + 1)),
      staticToeDeg: u.between(-10, 10),
      staticCamberDeg: u.between(-30, 30),
    },
    steering,
    wheels: { front: tyreOf(u, rolling), rear: tyreOf(u, rolling) },
    joints: jointSpecs(u),
    envelope: envelopeOf(u, tilting),
  };
  // A track rod's rules across fields would refuse nearly every wild one: mostly keep them, so the
  // solver sees wild track rods too (the refusals are still drawn, one time in five).
  if (design.steering.kind === 'trackRod' && u.next() < 0.8) {
    design.joints.tieRodInner = JSON.parse(JSON.stringify(design.joints.tieRodOuter));
    const drive = design.steering.drive;
    if (drive.kind === 'knuckle') design.upright.steeringAxis = 'kingpin';
    if (drive.kind === 'centreLever') {
      const arm = resolveSidedVec(design.upright.steeringArmJoint);
      const t = u.between(0.05, 0.95);
      drive.trackRodJoint = P(arm.right.x + t * (arm.left.x - arm.right.x), arm.right.y + t * (arm.left.y - arm.right.y), arm.right.z + t * (arm.left.z - arm.right.z));
    }
  }
  // A wild leaning rear pair one time in four (drawn last, so the draws above are those of earlier seeds).
  if (u.next() < 0.25) {
    design.vehicle.rear = {
      kind: 'leaningPair',
      upper: { pivot: P(c(), u.next() < 0.8 ? 0 : c(), c()), pivotAxis: dir(), outerJoint: sided(right) },
      lower: { pivot: P(c(), 0, c()), pivotAxis: dir(), outerJoint: sided(right) },
      wheelCentre: sided(() => P(u.next() < 0.7 ? -design.vehicle.wheelbaseMm : c(), -Math.abs(c()), Math.abs(c()) + 1)),
    };
  }
  // A wild lean linkage one time in four (drawn last): any points, refused or not by the checks across fields.
  if (u.next() < 0.25) {
    design.leanLinkage = {
      carrier: { frameMount: point(), carrierMount: point() },
      rocker: { pivot: point(), axis: dir(), linkJoint: sided(right), stopDeg: u.between(0.1, 90) },
      pushLinks: { on: u.pick(['upper', 'lower'] as const), armJoint: sided(right) },
      ...(u.next() < 0.5 ? { actuator: { frameMount: point(), rockerMount: point() } } : {}),
    };
  }
  return design;
}

/** Uniform numbers in [0, 1): unbiased, so random geometry is spread evenly, not piled on 0. */
const unitArray = fc.array(fc.noBias(fc.integer({ min: 0, max: 0xffffffff })).map((n) => n / 0x100000000), { minLength: 120, maxLength: 120 });

export const plausibleDesignArb: fc.Arbitrary<GeneratedDesign> = unitArray.map((values) => ({
  family: 'plausible' as const,
  origin: 'plausible tadpole from scratch',
  design: plausibleDesign(values),
}));

export const wildDesignArb: fc.Arbitrary<GeneratedDesign> = unitArray.map((values) => ({
  family: 'wild' as const,
  origin: 'wild geometry',
  design: wildDesign(values),
}));
