/**
 * The hardpoint catalogue: which named points a design has, in table order, with the path
 * of each in the file and whether its left side mirrors the right. Pure reshaping of the
 * design document; the mirroring itself is core's (`mirrorY`, `resolveSidedVec`).
 *
 * A row's id is the point's path in the design file with its side (`frontEnd.upper.outerJoint.right`,
 * `steering.pivot`): the file's own field names, not the mechanism's. Core's drawing layout
 * names the hardpoint each drawn joint shows the same way, so the table and the viewport
 * select the same thing.
 */
import { isTwoSided, mirrorY, resolveSidedVec } from '../../core/design/resolveDesign';
import type { DesignFile, Side, Sided, Vec3Mm } from '../../core/design/types';
import { getAt } from './designPath';
import { hardpointEntries } from '../../core/design/hardpointCatalogue';

export { hardpointEntries, type HardpointEntry } from '../../core/design/hardpointCatalogue';

export type Axis = 'x' | 'y' | 'z';
export const AXES: readonly Axis[] = ['x', 'y', 'z'];

export interface HardpointRow {
  /** Selection id: the design-file path with the side, as core's drawing layout names hardpoints. */
  id: string;
  key: string;
  side: Side | null;
  label: string;
  group: string;
  value: Vec3Mm;
  /** Sided points only: true when the file holds one value mirrored to the left. */
  linked: boolean;
}

export function hardpointRows(d: DesignFile): HardpointRow[] {
  const rows: HardpointRow[] = [];
  for (const e of hardpointEntries(d)) {
    const raw = getAt(d, e.key.split('.'));
    if (!e.sided) {
      rows.push({ id: e.key, key: e.key, side: null, label: e.label, group: e.group, value: raw as Vec3Mm, linked: false });
      continue;
    }
    const sided = raw as Sided<Vec3Mm>;
    const both = resolveSidedVec(sided);
    const linked = !isTwoSided(sided);
    for (const side of ['right', 'left'] as const) {
      rows.push({ id: `${e.key}.${side}`, key: e.key, side, label: e.label, group: e.group, value: both[side], linked });
    }
  }
  return rows;
}

/** Human name of a row for messages and history: "right upper wishbone outer joint". */
export function rowName(row: Pick<HardpointRow, 'side' | 'label' | 'group'>): string {
  return `${row.side ? `${row.side} ` : ''}${row.group.toLowerCase()} ${row.label}`;
}

/** The row id's key and side. */
export function splitRowId(id: string): { key: string; side: Side | null } {
  if (id.endsWith('.right')) return { key: id.slice(0, -6), side: 'right' };
  if (id.endsWith('.left')) return { key: id.slice(0, -5), side: 'left' };
  return { key: id, side: null };
}

/**
 * Where in the file a coordinate of one side lives, and the value to write there so that
 * the side reads `value`. A mirrored (linked) point is stored as its right side, so an edit
 * of the left side is mirrored back (y -> -y) before it is stored.
 */
export function coordinateTarget(
  d: DesignFile,
  key: string,
  side: Side | null,
  axis: Axis,
  value: number,
): { path: string[]; value: number } {
  const base = key.split('.');
  if (side === null) return { path: [...base, axis], value };
  const raw = getAt(d, base) as Sided<Vec3Mm>;
  if (isTwoSided(raw)) return { path: [...base, side, axis], value };
  if (side === 'left' && axis === 'y') return { path: [...base, axis], value: value === 0 ? 0 : -value };
  return { path: [...base, axis], value };
}

/** Same for a whole point: the path and the stored value that make the side read `p`. */
export function pointTarget(d: DesignFile, key: string, side: Side | null, p: Vec3Mm): { path: string[]; value: Vec3Mm } {
  const base = key.split('.');
  if (side === null) return { path: base, value: { ...p } };
  const raw = getAt(d, base) as Sided<Vec3Mm>;
  if (isTwoSided(raw)) return { path: [...base, side], value: { ...p } };
  return { path: base, value: side === 'left' ? mirrorY(p) : { ...p } };
}
