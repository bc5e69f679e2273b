/**
 * Which tune variable a hardpoint-table row and axis stand for. A mirrored pair is one variable
 * (both sides move together, y mirrored), an unlinked side is its own, a centre point has no
 * side: the ids core's tune plan takes (core/studies/tunePlan.ts, studyCoordinates.ts).
 */
import type { HardpointRow } from './hardpoints';
import type { TunePick } from '../state/studyStore';

export type Axis = 'x' | 'y' | 'z';

/** Offsets a newly picked coordinate may take, mm (either way). */
export const DEFAULT_PICK_RANGE_MM = 10;

export function variableIdOf(row: Pick<HardpointRow, 'key' | 'side' | 'linked'>, axis: Axis): string {
  if (row.side === null || row.linked) return `${row.key}:${axis}`;
  return `${row.key}.${row.side}:${axis}`;
}

/** The picks with a row's three axes added, or removed when all three are picked already. */
export function togglePoint(picks: readonly TunePick[], row: HardpointRow): TunePick[] {
  const ids = (['x', 'y', 'z'] as const).map((a) => variableIdOf(row, a));
  const all = ids.every((id) => picks.some((p) => p.id === id));
  if (all) return picks.filter((p) => !ids.includes(p.id));
  const added = (['x', 'y', 'z'] as const)
    .filter((a) => !picks.some((p) => p.id === variableIdOf(row, a)))
    .map((axis) => ({ id: variableIdOf(row, axis), rowId: row.id, axis, rangeMm: [-DEFAULT_PICK_RANGE_MM, DEFAULT_PICK_RANGE_MM] as [number, number] }));
  return [...picks, ...added];
}

/** How many of a row's axes are picked (0-3). */
export function pickedAxes(picks: readonly TunePick[], row: HardpointRow): Axis[] {
  return (['x', 'y', 'z'] as const).filter((a) => picks.some((p) => p.id === variableIdOf(row, a)));
}

/**
 * Picks that no longer name a coordinate of the design (a pair unlinked or linked since, a
 * layout switched): kept out of the plan, and said.
 */
export function stalePicks(picks: readonly TunePick[], validIds: ReadonlySet<string>): TunePick[] {
  return picks.filter((p) => !validIds.has(p.id));
}

/**
 * The coordinate ids a fit moves for the picks: a mirrored pair's pick stands for both sides,
 * and with `eachSide` each side becomes its own coordinate (a built vehicle's errors are not
 * mirrored).
 */
export function fitIdsOf(picks: readonly TunePick[], eachSide: boolean): string[] {
  const out: string[] = [];
  for (const p of picks) {
    const m = /^(.*):([xyz])$/.exec(p.id);
    const sided = m !== null && !/\.(right|left)$/.test(m[1]) && /\.(right|left)$/.test(p.rowId);
    const ids = eachSide && m && sided ? [`${m[1]}.right:${m[2]}`, `${m[1]}.left:${m[2]}`] : [p.id];
    for (const id of ids) if (!out.includes(id)) out.push(id);
  }
  return out;
}
