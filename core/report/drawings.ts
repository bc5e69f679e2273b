/**
 * Workshop drawings of the front end at design position: a front elevation, a side elevation
 * and a plan view, as SVG, from the layout template's drawing (`graph.drawing`, the same parts
 * the workbench's viewport draws). Every hardpoint is a numbered dot keyed to the report's
 * hardpoint table; a few key points carry their coordinates; track, kingpin angle, caster,
 * trail and wheelbase are dimensioned from core's pose analysis at design.
 *
 * Projection (ISO 8855 axes: x forward, y left, z up), in millimetres, SVG y pointing down:
 * - front elevation, seen from ahead: page right = +y (the vehicle's left), page up = +z;
 * - side elevation, seen from the left: page right = -x (forward is to the left), page up = +z;
 * - plan view, seen from above: page right = -y (the vehicle's right), page up = +x.
 * The SVG's user units are millimetres: a point (u, v) on the page is at cx = u, cy = -v.
 */
import type { MechanismGraph, Vec3 } from '../mechanism/MechanismGraph';
import type { DrawingLayout, DrawingPointRef } from '../mechanism/drawingLayout';
import { escapeHtml, mm1 } from './html';

export type ViewId = 'front' | 'side' | 'plan';

export interface ViewSpec {
  id: ViewId;
  title: string;
  /** How the view is seen, in words, for its caption. */
  seen: string;
  /** Page coordinates (mm) of a point: u to the right, v up. */
  project(p: Vec3): [number, number];
}

export const VIEWS: readonly ViewSpec[] = [
  { id: 'front', title: 'Front elevation', seen: 'seen from ahead: the vehicle\u2019s left on the right of the page, z up', project: (p) => [p[1], p[2]] },
  { id: 'side', title: 'Side elevation', seen: 'seen from the left: forward to the left of the page, z up', project: (p) => [-p[0], p[2]] },
  { id: 'plan', title: 'Plan view', seen: 'seen from above: forward up the page, the vehicle\u2019s left on the left', project: (p) => [-p[1], p[0]] },
];

/** A hardpoint as the drawings key it: its number in the hardpoint table and where it is. */
export interface KeyedPoint {
  /** The hardpoint's id in the design (`upright.wheelCentre.left`). */
  id: string;
  /** Number shown beside the dot (shared by both sides of one field). */
  key: number;
  label: string;
  side: 'left' | 'right' | 'centre';
  at: Vec3;
}

/** Core's figures the drawings dimension (pose analysis at design position), mm and deg. */
export interface DrawingFigures {
  /** Front contact patch centres, left and right. */
  contactLeft: Vec3;
  contactRight: Vec3;
  /** Where the left steering axis meets the ground. */
  axisGroundLeft: Vec3;
  kpiDeg: number;
  casterDeg: number;
  trailMm: number | null;
  scrubRadiusMm: number | null;
  wheelbaseMm: number;
}

/** Points with coordinates written beside them (left side), by hardpoint field. */
const COORDINATE_LABELS = ['upright.wheelCentre', 'frontEnd.upper.outerJoint', 'frontEnd.lower.outerJoint', 'upright.steeringArmJoint'];

function refPoint(graph: MechanismGraph, ref: DrawingPointRef): Vec3 | null {
  if ('point' in ref) return graph.points.find((p) => p.id === ref.point)?.design ?? null;
  // At design position every body sits at its design place: a body point is its design coordinates.
  return ref.design;
}

const fmt = (x: number) => (Math.abs(x) < 0.005 ? '0' : Number(x.toFixed(2)).toString());

interface Box {
  u0: number;
  u1: number;
  v0: number;
  v1: number;
}

function grow(b: Box, [u, v]: [number, number]): void {
  b.u0 = Math.min(b.u0, u);
  b.u1 = Math.max(b.u1, u);
  b.v0 = Math.min(b.v0, v);
  b.v1 = Math.max(b.v1, v);
}

/** A circle of radius r about c in the plane normal to the unit vector n, as 48 points. */
function circle3(c: Vec3, n: Vec3, r: number): Vec3[] {
  const t: Vec3 = Math.abs(n[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const e1 = normalise(cross(n, t));
  const e2 = cross(n, e1);
  return Array.from({ length: 48 }, (_, i) => {
    const a = (2 * Math.PI * i) / 48;
    return [0, 1, 2].map((k) => c[k] + r * (Math.cos(a) * e1[k] + Math.sin(a) * e2[k])) as Vec3;
  });
}

function cross(a: Vec3, b: Vec3): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

function normalise(a: Vec3): Vec3 {
  const l = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / l, a[1] / l, a[2] / l];
}

/** Where the line through a and b meets z = 0 (null when it runs parallel to the ground). */
function groundPoint(a: Vec3, b: Vec3): Vec3 | null {
  const dz = b[2] - a[2];
  if (Math.abs(dz) < 1e-9) return null;
  const t = -a[2] / dz;
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), 0];
}

const COLOURS = {
  frame: '#8d979e',
  wishbone: '#55799a',
  upright: '#6b7b88',
  steering: '#8f7252',
  tieRod: '#a2845c',
  spring: '#84967a',
  handlebar: '#8d979e',
  axis: '#a0588c',
  tyre: '#3a3f45',
  ink: '#1d2529',
  dim: '#0f62c9',
};

/** One view as an SVG element (width 100 %, user units mm). */
export function drawView(view: ViewSpec, graph: MechanismGraph & { drawing: DrawingLayout }, allPoints: readonly KeyedPoint[], figures: DrawingFigures): string {
  const d = graph.drawing;
  // Drawings of the front end: a leaning rear pair's points (vehicle.rear.*), a wheelbase behind,
  // would shrink it into a corner and number the rear joints over the front ones in front view.
  const points = allPoints.filter((p) => !p.id.startsWith('vehicle.rear.'));
  const P = (p: Vec3) => view.project(p);
  // The front end: the hardpoints' box, widened a little; parts reaching far beyond it (the spine to the rear wheel) are left out.
  const hx = points.map((p) => p.at[0]);
  const near = (p: Vec3) => p[0] >= Math.min(...hx) - 250 && p[0] <= Math.max(...hx) + 250;
  const box: Box = { u0: Infinity, u1: -Infinity, v0: Infinity, v1: -Infinity };
  const body: string[] = [];
  const front: string[] = [];
  const hiddenSide = view.id === 'side' ? 'right' : null;

  const line = (a: Vec3, b: Vec3, colour: string, width: number, extra = '') => {
    const [u1, v1] = P(a);
    const [u2, v2] = P(b);
    grow(box, [u1, v1]);
    grow(box, [u2, v2]);
    return `<line x1="${fmt(u1)}" y1="${fmt(-v1)}" x2="${fmt(u2)}" y2="${fmt(-v2)}" stroke="${colour}" stroke-width="${fmt(width)}" stroke-linecap="round"${extra}/>`;
  };

  // Tyres: the two side circles of each front tyre at design (spin axis from the graph).
  for (const w of graph.wheels) {
    const half = w.tyreWidth / 2;
    for (const s of [-1, 1]) {
      const c: Vec3 = [w.centre[0] + s * half * w.spinAxis[0], w.centre[1] + s * half * w.spinAxis[1], w.centre[2] + s * half * w.spinAxis[2]];
      const pts = circle3(c, w.spinAxis, w.rollingRadius).map(P);
      pts.forEach((p) => grow(box, p));
      const dash = hiddenSide === w.side ? ' stroke-dasharray="12 8" opacity="0.45"' : '';
      body.push(`<polygon class="tyre" points="${pts.map(([u, v]) => `${fmt(u)},${fmt(-v)}`).join(' ')}" fill="none" stroke="${COLOURS.tyre}" stroke-width="2.5"${dash}/>`);
    }
  }
  for (const t of d.tubes) {
    const a = refPoint(graph, t.a);
    const b = refPoint(graph, t.b);
    if (!a || !b || !near(a) || !near(b)) continue;
    const side = t.id.includes('.right.') || t.id.endsWith('.right') ? 'right' : 'other';
    const extra = hiddenSide === side ? ' stroke-dasharray="12 8" opacity="0.45"' : '';
    body.push(line(a, b, COLOURS[t.part] ?? COLOURS.frame, Math.max(3, t.radius * 0.8), extra));
  }
  // Steering axes, on to the ground.
  for (const ax of d.axisLines) {
    const a = refPoint(graph, ax.a);
    const b = refPoint(graph, ax.b);
    if (!a || !b) continue;
    const g = ax.toGround ? groundPoint(a, b) : null;
    body.push(line(a, g ?? b, COLOURS.axis, 1.6, ' stroke-dasharray="10 5"'));
  }
  // Ground line.
  const ground = view.id !== 'plan';

  // Hardpoints, numbered.
  for (const p of points) grow(box, P(p.at));
  // Text about 2.8 mm high on the printed sheet: the view fills a box of about 180 x 68 mm
  // (the report's drawing box), so the scale follows from the geometry's extent.
  const scale = Math.min(180 / ((box.u1 - box.u0) * 1.12), 68 / ((box.v1 - box.v0) * 1.35));
  const font = 2.8 / scale;
  // One label per place on the page: points that project onto one spot (a mirrored pair seen
  // from the side, a front and a rear pivot seen from ahead) share it, "1, 2".
  const spots = new Map<string, { u: number; v: number; keys: number[] }>();
  for (const p of points) {
    const [u, v] = P(p.at);
    const hidden = hiddenSide === p.side;
    const title = `${p.key}. ${p.label}: x ${fmt(p.at[0])}, y ${fmt(p.at[1])}, z ${fmt(p.at[2])} mm`;
    front.push(
      `<g class="hardpoint" data-id="${escapeHtml(p.id)}" data-key="${p.key}"${hidden ? ' opacity="0.45"' : ''}><title>${escapeHtml(title)}</title>` +
        `<circle cx="${fmt(u)}" cy="${fmt(-v)}" r="${fmt(font * 0.3)}" fill="#ffffff" stroke="${COLOURS.ink}" stroke-width="${fmt(font * 0.1)}"/></g>`,
    );
    if (hidden) continue;
    const spot = `${Math.round(u / (font * 0.6))},${Math.round(v / (font * 0.6))}`;
    const at = spots.get(spot) ?? { u, v, keys: [] };
    if (!at.keys.includes(p.key)) at.keys.push(p.key);
    spots.set(spot, at);
    const field = p.id.replace(/\.(left|right)$/, '');
    if (view.id === 'front' && p.side === 'left' && COORDINATE_LABELS.includes(field)) {
      front.push(
        `<text class="coords" data-id="${escapeHtml(p.id)}" x="${fmt(u + font * 0.45)}" y="${fmt(-v + font * 0.95)}" font-size="${fmt(font * 0.62)}" fill="${COLOURS.ink}">(${fmt(p.at[0])}, ${fmt(p.at[1])}, ${fmt(p.at[2])})</text>`,
      );
    }
  }
  for (const { u, v, keys: ks } of spots.values()) {
    front.push(`<text class="key" x="${fmt(u + font * 0.4)}" y="${fmt(-v - font * 0.3)}" font-size="${fmt(font * 0.8)}" fill="${COLOURS.ink}">${ks.sort((a, b) => a - b).join(', ')}</text>`);
  }
  // Dimensions from core's analysis.
  const dims: string[] = [];
  const gap = font * 2.2;
  const f = figures;
  if (view.id === 'front' || view.id === 'plan') {
    const [ua, va] = P(f.contactLeft);
    const [ub, vb] = P(f.contactRight);
    const vLine = view.id === 'front' ? Math.min(va, vb) - gap : Math.min(box.v0, va, vb) - gap;
    dims.push(dimension(ua, va, ub, vb, vLine, `track ${mm1(Math.abs(f.contactLeft[1] - f.contactRight[1]))} mm (contact patch centres)`, font, 'track'));
    grow(box, [ua, vLine - font * 1.6]);
  }
  if (view.id === 'front') {
    const [u, v] = P(f.axisGroundLeft);
    dims.push(`<text class="dim" data-dim="kpi" x="${fmt(u)}" y="${fmt(-v + gap + font * 2.2)}" font-size="${fmt(font * 0.8)}" fill="${COLOURS.dim}" text-anchor="middle">KPI ${f.kpiDeg.toFixed(2)}\u00b0, scrub radius ${mm1(f.scrubRadiusMm)} mm (left)</text>`);
    grow(box, [u, v - gap - font * 3]);
  }
  if (view.id === 'side') {
    const [u, v] = P(f.axisGroundLeft);
    const [uc] = P(f.contactLeft);
    dims.push(dimension(u, v, uc, v, v - gap, `trail ${mm1(f.trailMm)} mm`, font, 'trail'));
    dims.push(`<text class="dim" data-dim="caster" x="${fmt(u)}" y="${fmt(-v + gap + font * 2.4)}" font-size="${fmt(font * 0.8)}" fill="${COLOURS.dim}" text-anchor="middle">caster ${f.casterDeg.toFixed(2)}\u00b0 (left)</text>`);
    grow(box, [u, v - gap - font * 3]);
  }
  if (view.id === 'plan') {
    const [ua] = P(f.contactLeft);
    dims.push(`<text class="dim" data-dim="wheelbase" x="${fmt((ua + P(f.contactRight)[0]) / 2)}" y="${fmt(-box.v0 + font * 1.2)}" font-size="${fmt(font * 0.8)}" fill="${COLOURS.dim}" text-anchor="middle">wheelbase ${mm1(f.wheelbaseMm)} mm: rear axle ${mm1(f.wheelbaseMm)} mm behind the front axle (x = 0)</text>`);
    grow(box, [ua, box.v0 - font * 2]);
  }
  const pad = font * 2;
  const u0 = box.u0 - pad;
  const v1 = box.v1 + pad;
  const w = box.u1 - box.u0 + 2 * pad;
  const h = box.v1 - box.v0 + 2 * pad;
  if (ground) body.unshift(`<line class="ground" x1="${fmt(u0)}" y1="0" x2="${fmt(u0 + w)}" y2="0" stroke="#aeb4ab" stroke-width="1.5"/>`);
  return (
    `<svg class="drawing" data-view="${view.id}" xmlns="http://www.w3.org/2000/svg" viewBox="${fmt(u0)} ${fmt(-v1)} ${fmt(w)} ${fmt(h)}" ` +
    `preserveAspectRatio="xMidYMid meet" font-family="sans-serif" role="img" aria-label="${escapeHtml(view.title)}">` +
    body.join('') +
    dims.join('') +
    front.join('') +
    `</svg>`
  );
}

/** A dimension between two page points, drawn on the horizontal line at height vLine. */
function dimension(ua: number, va: number, ub: number, vb: number, vLine: number, text: string, font: number, id: string): string {
  const c = COLOURS.dim;
  const tick = font * 0.5;
  return (
    `<g class="dimension" data-dim="${id}">` +
    `<line x1="${fmt(ua)}" y1="${fmt(-va)}" x2="${fmt(ua)}" y2="${fmt(-vLine + tick)}" stroke="${c}" stroke-width="0.8"/>` +
    `<line x1="${fmt(ub)}" y1="${fmt(-vb)}" x2="${fmt(ub)}" y2="${fmt(-vLine + tick)}" stroke="${c}" stroke-width="0.8"/>` +
    `<line x1="${fmt(ua)}" y1="${fmt(-vLine)}" x2="${fmt(ub)}" y2="${fmt(-vLine)}" stroke="${c}" stroke-width="1.2"/>` +
    `<line x1="${fmt(ua - tick)}" y1="${fmt(-vLine + tick)}" x2="${fmt(ua + tick)}" y2="${fmt(-vLine - tick)}" stroke="${c}" stroke-width="1.2"/>` +
    `<line x1="${fmt(ub - tick)}" y1="${fmt(-vLine + tick)}" x2="${fmt(ub + tick)}" y2="${fmt(-vLine - tick)}" stroke="${c}" stroke-width="1.2"/>` +
    `<text x="${fmt((ua + ub) / 2)}" y="${fmt(-vLine + font * 1.2)}" font-size="${fmt(font * 0.8)}" fill="${c}" text-anchor="middle">${escapeHtml(text)}</text>` +
    `</g>`
  );
}
