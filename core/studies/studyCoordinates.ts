/**
 * The hardpoint coordinates a study may move: x, y and z of every hardpoint of the design,
 * enumerated from the hardpoint table (core/design/hardpointCsv.ts: every point and side, in
 * the order of the file format), and a copy of a design file with some of them moved.
 *
 * A sided point (one per side of the vehicle) is studied either as its mirrored pair, both
 * sides moving together as mirror images ('together', the default of the sensitivity: a
 * designer edits both sides at once), or one side at a time ('each': what a manufacturing
 * error does, and what the sensitivity gives on request). A centre point (the bell crank's
 * pivot, a centre member's pivot) has no side.
 *
 * Directions are the ones a designer thinks in, so a positive move reads the same on both
 * sides: x forward, z up, and y outward (away from the centre line) for a sided point; a
 * centre point's y is to the left (ISO 8855 +y). A mirrored point written once in the file is
 * written out for both sides when one side moves alone, so the other stays where it was.
 */

import { hardpointIds } from '../design/hardpointCsv';
import { hardpointEntries } from '../design/hardpointCatalogue';
import { isTwoSided, resolveSidedVec } from '../design/resolveDesign';
import type { DesignFile, Side, Vec3Mm } from '../design/types';

export type Axis = 'x' | 'y' | 'z';
export const AXES: readonly Axis[] = ['x', 'y', 'z'];

/** 'both': a mirrored pair moving together; a side: that side alone; null: a centre point. */
export type CoordinateSide = 'both' | Side | null;

export interface StudyCoordinate {
  /** Field path and side with the axis: 'frontEnd.lower.outerJoint:z', 'frontEnd.lower.outerJoint.right:z', 'steering.pivot:x'. */
  id: string;
  /** Field path of the point in the design file, dotted. */
  key: string;
  side: CoordinateSide;
  axis: Axis;
  /** The point in words, as the hardpoint table names it ('right lower wishbone outer joint'). */
  point: string;
  /** The positive direction in words: forward, outward, to the left, up. */
  direction: string;
}

/** How sided points are studied. */
export type SideMode = 'together' | 'each';

/** Words for a hardpoint field from the hardpoint catalogue (its group, then its label). */
function tableWords(file: DesignFile, key: string): { group: string; label: string } | null {
  const e = hardpointEntries(file).find((x) => x.key === key);
  return e ? { group: e.group.toLowerCase(), label: e.label } : null;
}

/** 'frontEnd.upper.frontPivot' -> 'front end upper front pivot' (for a field the table does not name). */
function pathWords(key: string): string {
  return key
    .split('.')
    .map((p) => p.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase())
    .join(' ');
}

/** The point in words: 'right lower wishbone outer joint', 'lower wishbone outer joints (both sides)', 'bell crank pivot'. */
export function pointWords(file: DesignFile, key: string, side: CoordinateSide): string {
  const w = tableWords(file, key);
  // 'rack' + 'rack end joint' reads 'rack end joint', not 'rack rack end joint'.
  const base = w ? (w.label.toLowerCase().startsWith(w.group) ? w.label : `${w.group} ${w.label}`) : pathWords(key);
  if (side === 'both') return `${base}s (both sides)`;
  return side ? `${side} ${base}` : base;
}

const POSITIVE: Record<Axis, { sided: string; centre: string }> = {
  x: { sided: 'forward', centre: 'forward' },
  y: { sided: 'outward', centre: 'to the left' },
  z: { sided: 'up', centre: 'up' },
};

const OPPOSITE: Record<string, string> = { forward: 'rearward', outward: 'inward', 'to the left': 'to the right', up: 'down' };

/** The negative direction's words ('up' -> 'down'). */
export function oppositeDirection(direction: string): string {
  return OPPOSITE[direction] ?? `against ${direction}`;
}

/** The hardpoint fields of a design, each with whether it is sided, in table order. */
function hardpointFields(file: DesignFile): { key: string; sided: boolean }[] {
  const out: { key: string; sided: boolean }[] = [];
  for (const id of hardpointIds(file)) {
    const m = /^(.*)\.(right|left)$/.exec(id);
    const key = m ? m[1] : id;
    if (!out.some((f) => f.key === key)) out.push({ key, sided: m !== null });
  }
  return out;
}

/** Every hardpoint coordinate of the design, in table order, x y z of each. */
export function studyCoordinates(file: DesignFile, sides: SideMode = 'together'): StudyCoordinate[] {
  const out: StudyCoordinate[] = [];
  for (const { key, sided } of hardpointFields(file)) {
    const pointSides: CoordinateSide[] = !sided ? [null] : sides === 'together' ? ['both'] : ['right', 'left'];
    for (const side of pointSides) {
      for (const axis of AXES) {
        const sideKey = side === null || side === 'both' ? key : `${key}.${side}`;
        out.push({ id: `${sideKey}:${axis}`, key, side, axis, point: pointWords(file, key, side), direction: POSITIVE[axis][side === null ? 'centre' : 'sided'] });
      }
    }
  }
  return out;
}

type Obj = Record<string, unknown>;

/**
 * A copy of the design file with each coordinate moved by its offset (mm, in the coordinate's
 * positive direction). The input is not changed. Offsets of 0 leave their field as written.
 */
export function offsetDesignFile(file: DesignFile, coordinates: readonly StudyCoordinate[], offsetsMm: ArrayLike<number>): DesignFile {
  if (offsetsMm.length !== coordinates.length) throw new Error(`offsetDesignFile: ${offsetsMm.length} offsets for ${coordinates.length} coordinates`);
  const copy = JSON.parse(JSON.stringify(file)) as DesignFile;
  for (let i = 0; i < coordinates.length; i++) {
    const d = offsetsMm[i];
    if (d === 0) continue;
    const c = coordinates[i];
    const path = c.key.split('.');
    let parent = copy as unknown as Obj;
    for (const k of path.slice(0, -1)) parent = parent[k] as Obj;
    const last = path[path.length - 1];
    const value = parent[last] as Vec3Mm | { right: Vec3Mm; left: Vec3Mm };
    if (c.side === null) {
      (value as Vec3Mm)[c.axis] += d;
      continue;
    }
    if (c.side === 'both' && !isTwoSided(value)) {
      // A point written once (right side, mirrored to the left) stays written once: the pair moves as mirror images.
      (value as Vec3Mm)[c.axis] += c.axis === 'y' ? -d : d;
      continue;
    }
    const both = isTwoSided(value) ? value : resolveSidedVec(value);
    parent[last] = both;
    for (const side of c.side === 'both' ? (['right', 'left'] as const) : [c.side]) {
      // Outward is -y on the right (y < 0 there) and +y on the left.
      both[side][c.axis] += c.axis === 'y' && side === 'right' ? -d : d;
    }
  }
  return copy;
}
