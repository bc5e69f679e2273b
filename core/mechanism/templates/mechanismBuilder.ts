/**
 * Collects a mechanism graph and its drawing while a layout template builds them. Each
 * helper returns the id (or reference) it created, so the template's drawing refers to the
 * bodies and points it just made instead of spelling their ids a second time.
 */

import type { Body, Constraint, InputBinding, LinkRef, MechanismGraph, NamedPoint, TreeJoint, Vec3, WheelRef } from '../MechanismGraph';
import { emptyDrawing, sameCheck, type DrawingCheck, type DrawingLayout, type DrawingPointRef, type DrawnTube } from '../drawingLayout';
import type { Side, Vec3Mm } from '../../design/types';

export const DEG = Math.PI / 180;
export const SIDES: readonly Side[] = ['right', 'left'];

export const v = (p: Vec3Mm): Vec3 => [p.x, p.y, p.z];
export const sub = (a: Vec3Mm, b: Vec3Mm): Vec3 => [a.x - b.x, a.y - b.y, a.z - b.z];
export const dist = (a: Vec3Mm, b: Vec3Mm) => Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);
export const mid = (a: Vec3Mm, b: Vec3Mm): Vec3 => [(a.x + b.x) / 2, (a.y + b.y) / 2, (a.z + b.z) / 2];

/** A tree joint as a template gives it; the builder adds the id, label and child. */
export type JointSpec = Omit<TreeJoint, 'child' | 'id' | 'label'>;

/** The driver or reported input of the handlebar joint, by pose mode. */
export type HandlebarBinding = (gain: number) => { driver?: InputBinding; reportsInput?: InputBinding };

export class MechanismBuilder {
  readonly bodies: Body[] = [];
  readonly joints: TreeJoint[] = [];
  readonly constraints: Constraint[] = [];
  readonly points: NamedPoint[] = [];
  readonly wheels: WheelRef[] = [];
  /** Rear wheels on bodies of their own (a leaning rear pair); empty otherwise. */
  readonly rearWheels: WheelRef[] = [];
  readonly links: LinkRef[] = [];
  readonly drawing: DrawingLayout = emptyDrawing();

  /** Adds a body on its tree joint (`<id>.joint`); returns the body's index. */
  addBody(id: string, label: string, joint: JointSpec): number {
    const index = this.bodies.length;
    this.bodies.push({ id, label });
    this.joints.push({ ...joint, id: `${id}.joint`, label: `${label} joint`, child: index });
    return index;
  }

  bodyId(index: number): string {
    return this.bodies[index].id;
  }

  /** Adds a named point carried by a body; returns a drawing reference to it. */
  addPoint(id: string, label: string, body: number, p: Vec3Mm): DrawingPointRef {
    this.points.push({ id, label, body, design: v(p) });
    return { point: id };
  }

  /** A drawing reference to a design point fixed in a body. */
  onBody(body: number, p: Vec3Mm | Vec3): DrawingPointRef {
    return { body: this.bodyId(body), design: Array.isArray(p) ? [p[0], p[1], p[2]] : v(p) };
  }

  /** Adds a constraint; returns its id. */
  addConstraint(c: Constraint): string {
    this.constraints.push(c);
    return c.id;
  }

  /** Draws a tube; `name` becomes the id `tube.<name>`, which is returned. */
  tube(name: string, t: Omit<DrawnTube, 'id'>): string {
    const id = `tube.${name}`;
    this.drawing.tubes.push({ id, ...t });
    return id;
  }

  /**
   * Draws a named point of the graph as a joint (carried by the point's body); its hardpoint
   * is the point id, which the templates take from the design field's path. Returns the id.
   */
  jointAt(ref: DrawingPointRef, label: string, radius: number): string {
    if (!('point' in ref)) throw new Error(`jointAt needs a named point (${label})`);
    const p = this.points.find((x) => x.id === ref.point);
    if (!p) throw new Error(`no point "${ref.point}" to draw (${label})`);
    return this.jointOf(ref.point, label, radius, ref, this.bodyId(p.body));
  }

  /** Draws a hardpoint that is not a mechanism point, fixed in a body. Returns the id. */
  jointOnBody(hardpoint: string, label: string, radius: number, body: number, p: Vec3Mm): string {
    return this.jointOf(hardpoint, label, radius, this.onBody(body, p), this.bodyId(body));
  }

  private jointOf(hardpoint: string, label: string, radius: number, at: DrawingPointRef, body: string): string {
    const id = `joint.${hardpoint}`;
    this.drawing.joints.push({ id, label, hardpoint, body, at, radius });
    return id;
  }

  axisLine(name: string, label: string, a: DrawingPointRef, b: DrawingPointRef, toGround: boolean): string {
    const id = `axis.${name}`;
    this.drawing.axisLines.push({ id, label, part: 'axis', a, b, toGround });
    return id;
  }

  /** Records which drawn parts stand for a check (adding to any already recorded). */
  shows(check: DrawingCheck, ...parts: string[]): void {
    const same = this.drawing.checks.find((c) => sameCheck(c.check, check));
    if (same) same.parts.push(...parts);
    else this.drawing.checks.push({ check, parts });
  }

  graph(name: string, frameBody: number): MechanismGraph & { drawing: DrawingLayout } {
    const { bodies, joints, constraints, points, wheels, rearWheels, links, drawing } = this;
    return { name, bodies, joints, constraints, points, wheels, ...(rearWheels.length > 0 ? { rearWheels } : {}), links, frameBody, drawing };
  }
}
