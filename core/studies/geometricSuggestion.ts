/**
 * Quick geometric proposals beside the optimiser, from two classic drawing-board rules
 * (common practice, no source), each shown with what it does before the user accepts it:
 *
 * 1. Tie rod on the instant-centre line (front view). Project the front end onto the y-z plane
 *    (along x). The upright's instant centre IC is where the two arms' lines (inner pivot to
 *    outer joint) meet. A tie rod moves with the upright without steering it, to first order,
 *    when it lies on the line from its outer joint through IC; to second order when its inner
 *    joint sits at the centre of curvature of the outer joint's path, on that line at the
 *    length that matches the arms (the classic drawing-board construction finds the same point
 *    on the line through the inner pivots when the outer joint lies on the line through the
 *    outer joints). We find the centre from the front-view four-bar moved 1 deg either way.
 *    Arms parallel in front view: the joint moved by the arm vector, a third bar of the
 *    parallelogram. The inner joint keeps its x (fore-aft position).
 * 2. Ackermann arms (plan view). Each steering arm's line, from the steering axis (at the arm
 *    joint's height) through the arm joint, passes through the middle of the rear axle line
 *    (x = -wheelbase, y = 0). The arm keeps its plan length and height and turns about the
 *    axis to that line, rearward or forward as it points now. Rule 1 is then applied again to
 *    the moved outer joints, so the tie rods stay on their instant-centre lines.
 *
 * Each proposal is a copy of the design (nothing is changed until the user applies it) with
 * the points it moves, before and after, and its effect on the study objectives over the
 * operating-region sample (the same poses and measures the sensitivity uses).
 */

import type { DesignFile, PerSide, ResolvedDesign, Side, Vec3Mm } from '../design/types';
import { resolveDesign } from '../design/resolveDesign';
import { SeedBook } from '../analysis/solveSeeds';
import { measureAtPoses, regionSamplePoses } from './studyPoses';
import { objectiveValue, studyObjectives, studyQuantities } from './studyQuantities';

export type ProposalId = 'tieRodLine' | 'ackermannArms';

export interface PointMove {
  /** Field path in the design file ('steering.tieRodJoint'). */
  key: string;
  side: Side;
  point: string;
  fromMm: Vec3Mm;
  toMm: Vec3Mm;
}

export interface ProposalEffect {
  id: string;
  label: string;
  unit: 'deg' | '%';
  tolerance: number | null;
  kind: 'worst' | 'least';
  before: number | null;
  after: number | null;
}

export interface Proposal {
  id: ProposalId;
  title: string;
  rule: string;
  moves: PointMove[];
  /** The design with the proposal applied; null when the rule does not apply (see reason). */
  design: DesignFile | null;
  /** Study objectives before and after over the region sample; null when not measured. */
  effect: ProposalEffect[] | null;
  reason?: string;
}

const SIDES: readonly Side[] = ['right', 'left'];
type Yz = [number, number];

/** Point on the line through a and b (3D) at x, projected to y-z; the midpoint when the line does not run along x. */
function atX(a: Vec3Mm, b: Vec3Mm, x: number): Yz {
  const dx = b.x - a.x;
  if (Math.abs(dx) < 1e-9) return [(a.y + b.y) / 2, (a.z + b.z) / 2];
  const t = (x - a.x) / dx;
  return [a.y + t * (b.y - a.y), a.z + t * (b.z - a.z)];
}

/** Intersection of line p + s d with line q + t e in 2D; null when parallel within 1e-9. */
function meet(p: Yz, d: Yz, q: Yz, e: Yz): Yz | null {
  const den = d[0] * e[1] - d[1] * e[0];
  if (Math.abs(den) < 1e-9 * Math.hypot(...d) * Math.hypot(...e)) return null;
  const s = ((q[0] - p[0]) * e[1] - (q[1] - p[1]) * e[0]) / den;
  return [p[0] + s * d[0], p[1] + s * d[1]];
}

const sub2 = (a: Yz, b: Yz): Yz => [a[0] - b[0], a[1] - b[1]];

/** Front-view inner pivot and outer joint of each arm on one side, at the x of interest. */
function armsFrontView(d: ResolvedDesign, side: Side, x: number): { upperIn: Yz; upperOut: Yz; lowerIn: Yz; lowerOut: Yz } {
  const fe = d.frontEnd;
  const yz = (p: Vec3Mm): Yz => [p.y, p.z];
  if (fe.kind === 'splitWishbones') {
    return {
      upperIn: atX(fe.upper.frontPivot[side], fe.upper.rearPivot[side], x),
      upperOut: yz(fe.upper.outerJoint[side]),
      lowerIn: atX(fe.lower.frontPivot[side], fe.lower.rearPivot[side], x),
      lowerOut: yz(fe.lower.outerJoint[side]),
    };
  }
  return { upperIn: yz(fe.upper.pivot), upperOut: yz(fe.upper.outerJoint[side]), lowerIn: yz(fe.lower.pivot), lowerOut: yz(fe.lower.outerJoint[side]) };
}

/** Rotate v about the origin by angle a (2D). */
const rot = (v: Yz, a: number): Yz => [v[0] * Math.cos(a) - v[1] * Math.sin(a), v[0] * Math.sin(a) + v[1] * Math.cos(a)];
const add2 = (a: Yz, b: Yz): Yz => [a[0] + b[0], a[1] + b[1]];
const len2 = (a: Yz) => Math.hypot(a[0], a[1]);

/**
 * Where the outer tie-rod joint is when the upper arm has turned by `a` in the front-view
 * four-bar (inner pivots fixed, arms and the upright rigid): the lower outer joint from the
 * two circles' crossing nearest its design place, the joint carried with the upright.
 */
function outerJointAt(a4: { upperIn: Yz; upperOut: Yz; lowerIn: Yz; lowerOut: Yz }, t: Yz, a: number): Yz | null {
  const u = add2(a4.upperIn, rot(sub2(a4.upperOut, a4.upperIn), a));
  const r1 = len2(sub2(a4.lowerOut, a4.lowerIn));
  const r2 = len2(sub2(a4.lowerOut, a4.upperOut));
  const d = len2(sub2(u, a4.lowerIn));
  const k = (r1 * r1 - r2 * r2 + d * d) / (2 * d);
  const h2 = r1 * r1 - k * k;
  if (!(d > 0) || h2 < 0) return null;
  const e = sub2(u, a4.lowerIn).map((c) => c / d) as Yz;
  const base = add2(a4.lowerIn, [e[0] * k, e[1] * k]);
  const h = Math.sqrt(h2);
  const c1: Yz = [base[0] - e[1] * h, base[1] + e[0] * h];
  const c2: Yz = [base[0] + e[1] * h, base[1] - e[0] * h];
  const l = len2(sub2(c1, a4.lowerOut)) < len2(sub2(c2, a4.lowerOut)) ? c1 : c2;
  const before = sub2(a4.lowerOut, a4.upperOut);
  const after = sub2(l, u);
  const turn = Math.atan2(after[1], after[0]) - Math.atan2(before[1], before[0]);
  return add2(u, rot(sub2(t, a4.upperOut), turn));
}

/** Centre of the circle through three points; null when they are in line. */
function circumcentre(p: Yz, q: Yz, r: Yz): Yz | null {
  const d = 2 * (p[0] * (q[1] - r[1]) + q[0] * (r[1] - p[1]) + r[0] * (p[1] - q[1]));
  const scale = Math.max(len2(sub2(q, p)), len2(sub2(r, p))) ** 2;
  if (Math.abs(d) < 1e-12 * scale) return null;
  const s = (v: Yz) => v[0] * v[0] + v[1] * v[1];
  return [(s(p) * (q[1] - r[1]) + s(q) * (r[1] - p[1]) + s(r) * (p[1] - q[1])) / d, (s(p) * (r[0] - q[0]) + s(q) * (p[0] - r[0]) + s(r) * (q[0] - p[0])) / d];
}

/** Turn of the upper arm either side of design for the three positions, rad (small: the curvature at design). */
const PROBE_RAD = (1 * Math.PI) / 180;

/**
 * Rule 1 for one side: the inner tie-rod joint at the centre of curvature of the outer
 * joint's front-view path, which lies on the line from the joint through the instant centre
 * (the joint's velocity is perpendicular to that line) at the length that matches the arms.
 * For arms parallel in front view it is the joint moved by the arm (inner pivot minus outer
 * joint), the tie rod a third bar of the parallelogram. Null with the reason when the path is
 * straight at design (the centre at infinity) or the four-bar cannot move.
 */
export function tieRodLinePoint(d: ResolvedDesign, side: Side, outer: Vec3Mm, innerX: number): { point: Vec3Mm } | { reason: string } {
  const a4 = armsFrontView(d, side, innerX);
  const t: Yz = [outer.y, outer.z];
  const p = outerJointAt(a4, t, -PROBE_RAD);
  const q = outerJointAt(a4, t, PROBE_RAD);
  if (!p || !q) return { reason: `${side} side: the front-view linkage cannot move at design position` };
  const c = circumcentre(p, t, q);
  if (!c) return { reason: `${side} side: the outer tie-rod joint moves on a straight line at design position (its centre of curvature is at infinity)` };
  return { point: { x: innerX, y: c[0], z: c[1] } };
}

/** The front-view instant centre of one side (null when the arms are parallel in front view), for checks and drawings. */
export function frontViewInstantCentre(d: ResolvedDesign, side: Side, x: number): Yz | null {
  const a = armsFrontView(d, side, x);
  return meet(a.upperIn, sub2(a.upperOut, a.upperIn), a.lowerIn, sub2(a.lowerOut, a.lowerIn));
}

/** The steering axis at design position: through the two outer joints. */
function steeringAxisAt(d: ResolvedDesign, side: Side, z: number): [number, number] {
  const u = d.frontEnd.upper.outerJoint[side];
  const l = d.frontEnd.lower.outerJoint[side];
  const t = Math.abs(u.z - l.z) < 1e-9 ? 0 : (z - l.z) / (u.z - l.z);
  return [l.x + t * (u.x - l.x), l.y + t * (u.y - l.y)];
}

/** Rule 2 for one side: the arm joint turned in plan to point at the middle of the rear axle. */
export function ackermannArmPoint(d: ResolvedDesign, side: Side): Vec3Mm {
  const a = d.upright.steeringArmJoint[side];
  const [kx, ky] = steeringAxisAt(d, side, a.z);
  const len = Math.hypot(a.x - kx, a.y - ky);
  const rx = -d.vehicle.wheelbaseMm - kx;
  const ry = -ky;
  const rl = Math.hypot(rx, ry);
  const sign = a.x <= kx ? 1 : -1; // rearward arm points toward the rear axle, forward arm away from it
  return { x: kx + (sign * len * rx) / rl, y: ky + (sign * len * ry) / rl, z: a.z };
}

const round = (p: Vec3Mm): Vec3Mm => ({ x: Math.round(p.x * 100) / 100, y: Math.round(p.y * 100) / 100, z: Math.round(p.z * 100) / 100 });

function withPoints(file: DesignFile, key: 'steering.tieRodJoint' | 'upright.steeringArmJoint', pts: PerSide<Vec3Mm>): DesignFile {
  const copy = JSON.parse(JSON.stringify(file)) as DesignFile;
  if (key === 'steering.tieRodJoint') {
    if (copy.steering.kind !== 'trackRod') copy.steering.tieRodJoint = { right: pts.right, left: pts.left };
  }
  else copy.upright.steeringArmJoint = { right: pts.right, left: pts.left };
  return copy;
}

function tieRodMoves(file: DesignFile): { design: DesignFile; moves: PointMove[] } | { reason: string } {
  const d = resolveDesign(file);
  const st = d.steering;
  if (st.kind === 'trackRod') return { reason: 'a one-piece track rod has no inner tie-rod joints: its ends are the steering-arm joints' };
  const pts = {} as PerSide<Vec3Mm>;
  const moves: PointMove[] = [];
  for (const side of SIDES) {
    const inner = st.tieRodJoint[side];
    const r = tieRodLinePoint(d, side, d.upright.steeringArmJoint[side], inner.x);
    if ('reason' in r) return r;
    pts[side] = round(r.point);
    moves.push({ key: 'steering.tieRodJoint', side, point: `${side} inner tie-rod joint`, fromMm: inner, toMm: pts[side] });
  }
  return { design: withPoints(file, 'steering.tieRodJoint', pts), moves };
}

function ackermannMoves(file: DesignFile): { design: DesignFile; moves: PointMove[] } | { reason: string } {
  const d = resolveDesign(file);
  const pts = {} as PerSide<Vec3Mm>;
  const moves: PointMove[] = [];
  for (const side of SIDES) {
    pts[side] = round(ackermannArmPoint(d, side));
    moves.push({ key: 'upright.steeringArmJoint', side, point: `${side} steering-arm joint`, fromMm: d.upright.steeringArmJoint[side], toMm: pts[side] });
  }
  const armed = withPoints(file, 'upright.steeringArmJoint', pts);
  // A one-piece track rod simply joins the moved arms: no inner joints to put back.
  if (d.steering.kind === 'trackRod') return { design: armed, moves };
  const rods = tieRodMoves(armed);
  if ('reason' in rods) return rods;
  return { design: rods.design, moves: [...moves, ...rods.moves] };
}

/** Study objectives over the region sample of the design as it is, for the design and the proposal. */
export function proposalEffect(file: DesignFile, proposed: DesignFile): ProposalEffect[] | null {
  const design = resolveDesign(file);
  const sample = regionSamplePoses(design);
  if (sample.poses.length === 0) return null;
  const quantities = studyQuantities(design);
  const objectives = studyObjectives(quantities, design.tolerances).filter((o) => !o.id.startsWith('joint.'));
  const P = sample.poses.length;
  const Q = quantities.length;
  const seeds = new SeedBook();
  const before = measureAtPoses(design, sample.poses, quantities, { record: seeds });
  let after: ReturnType<typeof measureAtPoses> | null = null;
  try {
    after = measureAtPoses(resolveDesign(proposed), sample.poses, quantities, { replay: seeds });
  } catch {
    after = null;
  }
  const value = (m: ReturnType<typeof measureAtPoses> | null, o: (typeof objectives)[number]) => {
    if (!m || m.failed.length > 0) return null;
    const v = objectiveValue(o, m.values, P, Q);
    return Number.isNaN(v) ? null : v;
  };
  return objectives.map((o) => ({ id: o.id, label: o.label, unit: o.unit, tolerance: o.tolerance, kind: o.kind, before: value(before, o), after: value(after, o) }));
}

/** Both proposals for the design, each with its effect (measure = false skips the solves). */
export function geometricProposals(file: DesignFile, measure = true): Proposal[] {
  const rules: { id: ProposalId; title: string; rule: string; make: (f: DesignFile) => { design: DesignFile; moves: PointMove[] } | { reason: string } }[] = [
    {
      id: 'tieRodLine',
      title: 'tie rods on the instant-centre lines',
      rule: 'front view: each inner tie-rod joint on the line from the outer tie-rod joint through the instant centre, at the length that matches the arms (the centre of curvature of the outer joint\'s path; common practice, no source)',
      make: tieRodMoves,
    },
    {
      id: 'ackermannArms',
      title: 'steering arms aimed at the middle of the rear axle',
      rule: 'plan view: each steering arm turned about the steering axis so its line passes through the middle of the rear axle line, then the tie rods put back on their instant-centre lines (common practice, no source)',
      make: ackermannMoves,
    },
  ];
  return rules.map((r) => {
    const made = r.make(file);
    if ('reason' in made) return { id: r.id, title: r.title, rule: r.rule, moves: [], design: null, effect: null, reason: made.reason };
    return { id: r.id, title: r.title, rule: r.rule, moves: made.moves, design: made.design, effect: measure ? proposalEffect(file, made.design) : null };
  });
}
