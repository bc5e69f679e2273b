/**
 * What a layout template tells the viewport to draw, as plain data beside its mechanism
 * graph: tubes between points, joints, axis lines, wheels, the handlebar and the body
 * outline, each with a label in words, and which drawn parts stand for each check (a joint's
 * articulation, a clearance part, a loop-closing constraint, a transmission angle).
 *
 * The template that names a body, point or constraint also names the parts drawn from it, so
 * the viewport never spells a mechanism id: a renamed point renames its drawing with it, and
 * a new layout draws itself. `drawingProblems` checks that every reference resolves.
 */

import type { Joints, Side } from '../design/types';
import type { InputName, MechanismGraph, Vec3 } from './MechanismGraph';

/** A named mechanism point (moved by the solver), or a design point fixed in a body. */
export type DrawingPointRef = { point: string } | { body: string; design: Vec3 };

/** What a part is, for its neutral colour when no check colours it. */
export type PartClass = 'frame' | 'wishbone' | 'upright' | 'steering' | 'tieRod' | 'spring' | 'handlebar' | 'axis';

/** A straight tube (a capsule) between two points. */
export interface DrawnTube {
  /** Unique within the layout (as every part id); also the key of the part's condition. */
  id: string;
  label: string;
  part: PartClass;
  a: DrawingPointRef;
  b: DrawingPointRef;
  radius: number;
}

/** A joint or hardpoint, drawn as a ball; selecting it selects the hardpoint. */
export interface DrawnJoint {
  id: string;
  label: string;
  /** The hardpoint it shows: its path in the design file (with the side), e.g. `steering.pivot`. */
  hardpoint: string;
  /** Id of the body that carries it (the gizmo moves it in that body's axes). */
  body: string;
  at: DrawingPointRef;
  radius: number;
}

/** A thin line through two points (a steering axis), optionally on down to the ground. */
export interface DrawnAxisLine {
  id: string;
  label: string;
  part: 'axis';
  a: DrawingPointRef;
  /** Drawn from `a` through `b`, and on to the ground plane when `toGround`. */
  b: DrawingPointRef;
  toGround: boolean;
}

/** A front road wheel; its pose is the graph's wheel of the same side. */
export interface DrawnFrontWheel {
  id: string;
  label: string;
  side: Side;
  rollingRadius: number;
  crownRadius: number;
  width: number;
}

/** A rear wheel fixed in a body (it carries no joint of the front end). */
export interface DrawnRearWheel {
  id: string;
  label: string;
  body: string;
  centre: Vec3;
  /** Unit spin axis, design coordinates of the body. */
  spinAxis: Vec3;
  rollingRadius: number;
  crownRadius: number;
  width: number;
}

/** A symbolic handlebar: a bar turned by an input about the body's z axis, on a stem below it. */
export interface DrawnHandlebar {
  id: string;
  label: string;
  part: 'handlebar';
  body: string;
  /** Centre of the bar, design coordinates of the body. */
  at: Vec3;
  /** The input (degrees) that turns the bar. */
  turnedBy: InputName;
  halfWidth: number;
  /** Length of the stem, straight down from the bar. */
  stem: number;
  barRadius: number;
  stemRadius: number;
}

/** A closed outline (the body's plan) fixed in a body. */
export interface DrawnOutline {
  id: string;
  label: string;
  part: 'frame';
  body: string;
  points: Vec3[];
}

/** The parts the clearance checks model (the same names as core's clearance module). */
export type ClearancePartName = 'upperArm' | 'lowerArm' | 'upperRail' | 'lowerRail' | 'tieRod' | 'steeringArm' | 'crankArm' | 'rack' | 'tyre';

/** A check whose result colours drawn parts. */
export type DrawingCheck =
  | { kind: 'joint'; joint: keyof Joints; side: Side }
  | { kind: 'clearance'; part: ClearancePartName; side: Side }
  | { kind: 'constraint'; constraint: string }
  | { kind: 'transmission'; link: 'steeringArm' | 'linkage'; side: Side };

/** The drawn parts (ids) that stand for one check. */
export interface CheckParts {
  check: DrawingCheck;
  parts: string[];
}

export interface DrawingLayout {
  tubes: DrawnTube[];
  joints: DrawnJoint[];
  axisLines: DrawnAxisLine[];
  frontWheels: DrawnFrontWheel[];
  rearWheels: DrawnRearWheel[];
  handlebar: DrawnHandlebar | null;
  outline: DrawnOutline | null;
  checks: CheckParts[];
}

export function emptyDrawing(): DrawingLayout {
  return { tubes: [], joints: [], axisLines: [], frontWheels: [], rearWheels: [], handlebar: null, outline: null, checks: [] };
}

/** Whether two checks are the same check. */
export function sameCheck(a: DrawingCheck, b: DrawingCheck): boolean {
  switch (a.kind) {
    case 'joint':
      return b.kind === 'joint' && a.joint === b.joint && a.side === b.side;
    case 'clearance':
      return b.kind === 'clearance' && a.part === b.part && a.side === b.side;
    case 'constraint':
      return b.kind === 'constraint' && a.constraint === b.constraint;
    case 'transmission':
      return b.kind === 'transmission' && a.link === b.link && a.side === b.side;
  }
}

/** Ids of the drawn parts that stand for a check; empty when the layout draws none for it. */
export function drawingPartsFor(layout: DrawingLayout, check: DrawingCheck): readonly string[] {
  return layout.checks.find((c) => sameCheck(c.check, check))?.parts ?? [];
}

/** The checks a drawn part stands for (for its hover text). */
export function checksShownBy(layout: DrawingLayout, partId: string): DrawingCheck[] {
  return layout.checks.filter((c) => c.parts.includes(partId)).map((c) => c.check);
}

/** Every part id of a layout, in drawing order. */
export function drawnPartIds(layout: DrawingLayout): string[] {
  return [
    ...layout.tubes.map((t) => t.id),
    ...layout.joints.map((j) => j.id),
    ...layout.axisLines.map((l) => l.id),
    ...layout.frontWheels.map((w) => w.id),
    ...layout.rearWheels.map((w) => w.id),
    ...(layout.handlebar ? [layout.handlebar.id] : []),
    ...(layout.outline ? [layout.outline.id] : []),
  ];
}

/**
 * Every reference of a graph's drawing that does not resolve in the graph: points, bodies,
 * wheels and constraints it names, the carrier it gives each joint, and the parts its checks
 * name. Empty when the drawing is sound (or the graph has none).
 */
export function drawingProblems(graph: MechanismGraph): string[] {
  const d = graph.drawing;
  if (!d) return [];
  const problems: string[] = [];
  const bodies = new Set(graph.bodies.map((b) => b.id));
  const pointBody = new Map(graph.points.map((p) => [p.id, graph.bodies[p.body]?.id]));
  const ref = (r: DrawingPointRef, where: string) => {
    if ('point' in r) {
      if (!pointBody.has(r.point)) problems.push(`${where} names point "${r.point}", which the mechanism lacks`);
    } else if (!bodies.has(r.body)) {
      problems.push(`${where} is fixed in body "${r.body}", which the mechanism lacks`);
    }
  };
  const body = (id: string, where: string) => {
    if (!bodies.has(id)) problems.push(`${where} is fixed in body "${id}", which the mechanism lacks`);
  };
  for (const t of [...d.tubes, ...d.axisLines]) {
    ref(t.a, `${t.id} (${t.label}), end a,`);
    ref(t.b, `${t.id} (${t.label}), end b,`);
  }
  for (const j of d.joints) {
    ref(j.at, `${j.id} (${j.label})`);
    body(j.body, `${j.id} (${j.label})`);
    const carrier = 'point' in j.at ? pointBody.get(j.at.point) : j.at.body;
    if (carrier !== undefined && carrier !== j.body) problems.push(`${j.id} (${j.label}) says body "${j.body}" carries it, but it sits on "${carrier}"`);
  }
  for (const w of d.frontWheels) {
    if (!graph.wheels.some((g) => g.side === w.side)) problems.push(`${w.id} (${w.label}) is the ${w.side} wheel, which the mechanism lacks`);
  }
  for (const w of d.rearWheels) body(w.body, `${w.id} (${w.label})`);
  if (d.handlebar) body(d.handlebar.body, `${d.handlebar.id} (${d.handlebar.label})`);
  if (d.outline) body(d.outline.body, `${d.outline.id} (${d.outline.label})`);

  const ids = drawnPartIds(d);
  const seen = new Set<string>();
  for (const id of ids) {
    if (seen.has(id)) problems.push(`part id "${id}" is used twice`);
    seen.add(id);
  }
  const constraints = new Set(graph.constraints.map((c) => c.id));
  for (const c of d.checks) {
    const what = JSON.stringify(c.check);
    if (c.check.kind === 'constraint' && !constraints.has(c.check.constraint)) problems.push(`check ${what} names a constraint the mechanism lacks`);
    for (const p of c.parts) if (!seen.has(p)) problems.push(`check ${what} names part "${p}", which the drawing lacks`);
    if (c.parts.length === 0) problems.push(`check ${what} lists no parts`);
  }
  return problems;
}
