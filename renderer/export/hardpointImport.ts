/**
 * A hardpoint table read against the design on screen, before anything is applied: the new
 * design and the points it moves (old and new position, distance moved), or the table's
 * problems with line and column. Reading is core's (`importHardpointCsv`); this only lists
 * what differs, for the dialog that asks before applying.
 */
import { exportHardpointCsv, hardpointTable, importHardpointCsv, type HardpointSide } from '../../core/design/hardpointCsv';
import type { DesignFile, Vec3Mm } from '../../core/design/types';
import { pointWords } from '../../core/studies/studyCoordinates';

export interface PointChange {
  /** Point and side as the table writes them. */
  point: string;
  side: HardpointSide;
  /** The point in words ('right upper wishbone outer joint'). */
  words: string;
  before: Vec3Mm;
  after: Vec3Mm;
  /** Distance moved, mm. */
  movedMm: number;
}

export interface ImportProblem {
  line?: number;
  column?: number;
  /** Core's message, starting with file:line:column when there is a place. */
  message: string;
}

export type ImportPlan =
  | { ok: true; fileName: string; design: DesignFile; changes: PointChange[] }
  | { ok: false; fileName: string; problems: ImportProblem[] };

/** Reads `text` as a hardpoint table for `design`; nothing is applied. */
export function planHardpointImport(design: DesignFile, text: string, fileName: string): ImportPlan {
  const read = importHardpointCsv(design, text, fileName);
  if (!read.ok) return { ok: false, fileName, problems: read.issues.map((i) => ({ line: i.line, column: i.column, message: i.message })) };
  const before = new Map(hardpointTable(design).map((r) => [r.id, r]));
  const changes: PointChange[] = [];
  for (const row of hardpointTable(read.design)) {
    const old = before.get(row.id);
    if (!old) continue;
    const a = old.at;
    const b = row.at;
    if (a.x === b.x && a.y === b.y && a.z === b.z) continue;
    changes.push({
      point: row.point,
      side: row.side,
      words: pointWords(design, row.point, row.side === 'centre' ? null : row.side),
      before: a,
      after: b,
      movedMm: Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z),
    });
  }
  return { ok: true, fileName, design: read.design, changes };
}

/** The hardpoint table of a design, as the file menu exports it. */
export function hardpointTableText(design: DesignFile): string {
  return exportHardpointCsv(design);
}
