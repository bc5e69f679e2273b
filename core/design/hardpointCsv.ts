/**
 * Hardpoint tables as CSV (RFC 4180), for the workshop and for editing in a spreadsheet.
 *
 *     point,side,x_mm,y_mm,z_mm
 *     frontEnd.upper.frontPivot,right,110,-60,310
 *     frontEnd.upper.frontPivot,left,110,60,310
 *     steering.pivot,centre,-75,0,107
 *     ...
 *
 * One row per hardpoint of the design, in the order of the file format; a point of each side
 * gets a `right` and a `left` row (a point written once in the design, mirrored, is written
 * out for both sides), a one-of point on the centre line a `centre` row. Millimetres, ISO 8855
 * axes as everywhere (x forward, y left, z up). Directions (pivot axes, stud axes) and the
 * plan-view body outline are not hardpoints and are not in the table. Rows end with LF (what
 * most tools write); CRLF and a lone CR are read as well.
 *
 * Numbers are written in the shortest form that reads back to the same double, so
 * export -> import gives the identical design. Import takes a table for the same design
 * (the same layout) and returns a new design, or issues naming line and column: every
 * hardpoint must be listed exactly once, so a table cut short is refused, never half applied.
 * A side given as an exact mirror keeps the mirrored (single) form it had; otherwise both
 * sides are written out.
 *
 * Reading: columns are found by their header names (any order, any letter case); an optional
 * `note` column is kept out of the design (free text, quoted when it holds commas); any other
 * column is refused. The older four-column form, `point,x_mm,y_mm,z_mm` with the side as a
 * `.right` / `.left` suffix on the point, is still read, so tables already written import.
 */
import { csvField, csvLineCount, readCsvRecords, type CsvField } from './csvRecords';
import { designFileSchema } from './designSchema';
import { isTwoSided, mirrorY } from './resolveDesign';
import { validateDesign, type DesignIssue, type DesignResult } from './validateDesign';
import type { SchemaNode } from './schemaDsl';
import type { DesignFile, Vec3Mm } from './types';

export const HARDPOINT_CSV_HEADER = ['point', 'side', 'x_mm', 'y_mm', 'z_mm'] as const;
/** The table written before the side column: the side as a suffix of the point. Still read. */
export const OLD_HARDPOINT_CSV_HEADER = ['point', 'x_mm', 'y_mm', 'z_mm'] as const;
/** A free-text column a table may carry; never read into the design. */
const NOTE_COLUMN = 'note';

export type HardpointSide = 'right' | 'left' | 'centre';

/** One row of the table. */
export interface HardpointRow {
  /** The hardpoint's id: the field path, with `.right` / `.left` for a point of each side. */
  id: string;
  /** The field path, without the side ('upright.wheelCentre'). */
  point: string;
  side: HardpointSide;
  at: Vec3Mm;
}

/** A hardpoint: its id (the field path, with `.right` / `.left` for a sided field) and where it lives. */
interface HardpointRef {
  id: string;
  /** Path of the field in the design, as object keys. */
  field: string[];
  /** For a sided field: which side this row is. */
  side?: 'right' | 'left';
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function isPointNode(node: SchemaNode): boolean {
  return node.type === 'vec' && node.role === 'point' && 'z' in node.components;
}

/** Every hardpoint of a design, in schema order, following the variants the design uses. */
function hardpointsOf(design: DesignFile): HardpointRef[] {
  const out: HardpointRef[] = [];
  const walk = (node: SchemaNode, value: unknown, field: string[]) => {
    switch (node.type) {
      case 'object':
        if (!isObject(value)) return;
        for (const [name, f] of Object.entries(node.fields)) if (name in value) walk(f.node, value[name], [...field, name]);
        return;
      case 'union': {
        if (!isObject(value) || typeof value.kind !== 'string') return;
        const variant = node.variants[value.kind];
        if (variant) walk(variant, value, field);
        return;
      }
      case 'sided':
        if (isPointNode(node.single)) for (const side of ['right', 'left'] as const) out.push({ id: [...field, side].join('.'), field, side });
        return;
      case 'vec':
        if (isPointNode(node)) out.push({ id: field.join('.'), field });
        return;
      default:
        return;
    }
  };
  walk(designFileSchema, design, []);
  return out;
}

function getField(design: DesignFile, field: string[]): unknown {
  let v: unknown = design;
  for (const k of field) v = isObject(v) ? v[k] : undefined;
  return v;
}

function setField(design: DesignFile, field: string[], value: unknown): void {
  let v = design as unknown as Record<string, unknown>;
  for (const k of field.slice(0, -1)) v = v[k] as Record<string, unknown>;
  v[field[field.length - 1]] = value;
}

function pointOf(design: DesignFile, ref: HardpointRef): Vec3Mm {
  const v = getField(design, ref.field) as Vec3Mm | { right: Vec3Mm; left: Vec3Mm };
  if (!ref.side) return v as Vec3Mm;
  if (isTwoSided(v as { right: Vec3Mm; left: Vec3Mm })) return (v as { right: Vec3Mm; left: Vec3Mm })[ref.side];
  return ref.side === 'right' ? (v as Vec3Mm) : mirrorY(v as Vec3Mm);
}

/** Shortest text that reads back to the same double; -0 kept. */
function formatNumber(x: number): string {
  return Object.is(x, -0) ? '-0' : String(x);
}

/** Every hardpoint of the design with its side and where it is, in table order. */
export function hardpointTable(design: DesignFile): HardpointRow[] {
  return hardpointsOf(design).map((ref) => ({ id: ref.id, point: ref.field.join('.'), side: ref.side ?? 'centre', at: { ...pointOf(design, ref) } }));
}

export function exportHardpointCsv(design: DesignFile): string {
  const lines = [HARDPOINT_CSV_HEADER.join(',')];
  for (const row of hardpointTable(design)) {
    lines.push([csvField(row.point), row.side, formatNumber(row.at.x), formatNumber(row.at.y), formatNumber(row.at.z)].join(','));
  }
  return lines.join('\n') + '\n';
}

/** The ids of a design's hardpoints, in table order (point and side, as `hardpointTable` gives them). */
export function hardpointIds(design: DesignFile): string[] {
  return hardpointsOf(design).map((r) => r.id);
}

// ---------------------------------------------------------------------------------------------
// Import
// ---------------------------------------------------------------------------------------------

/** A plain decimal number: optional sign, digits with an optional point, optional exponent. */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

type Rows = Map<string, { line: number; point: Vec3Mm }>;
/** Records an issue at a line and column of the table. */
type At = (line: number, column: number, message: string, path?: string) => void;

/** Which field of a row holds what, found from the header. */
interface Columns {
  point: number;
  /** Absent in the older four-column form (side as a suffix of the point). */
  side?: number;
  x: number;
  y: number;
  z: number;
  count: number;
}

export function importHardpointCsv(design: DesignFile, csv: string, fileName: string): DesignResult {
  const issues: DesignIssue[] = [];
  const at: At = (line, column, message, path = '') => {
    issues.push({ path, message: `${fileName}:${line}:${column}: ${message}`, line, column });
  };

  const read = readCsvRecords(csv);
  if (!read.ok) {
    at(read.line, read.column, read.reason);
    return { ok: false, issues };
  }
  const [header, ...body] = read.records;
  if (header === undefined) {
    return { ok: false, issues: [{ path: '', message: `${fileName}:1:1: the table is empty; expected the header ${HARDPOINT_CSV_HEADER.join(',')} and one row per hardpoint`, line: 1, column: 1 }] };
  }
  const columns = readHeader(header.fields, header.end, at);
  if (!columns) return { ok: false, issues };

  const refs = hardpointsOf(design);
  const table = { refs, byId: new Map(refs.map((r) => [r.id, r])), rows: new Map() as Rows };
  for (const record of body) readRow(record.fields, record.end, columns, table, at);
  if (issues.length > 0) return { ok: false, issues };

  // Every hardpoint must be listed, so a table cut short is refused, never half applied.
  const lastLine = csvLineCount(csv);
  for (const ref of refs) {
    if (!table.rows.has(ref.id)) at(lastLine, 1, `${describe(ref)}: no row for this hardpoint (every hardpoint must be listed; ${table.rows.size} of ${refs.length} are)`, ref.id);
  }
  if (issues.length > 0) return { ok: false, issues };

  // The new design must still be a valid design; say which row to fix.
  const checked = validateDesign(withHardpoints(design, refs, table.rows));
  if (!checked.ok) return { ok: false, issues: checked.issues.map((issue) => atRowOf(issue, table.rows, fileName)) };
  return checked;
}

/** A hardpoint as the table names it: point and side. */
function describe(ref: HardpointRef): string {
  return `${ref.field.join('.')} (${ref.side ?? 'centre'})`;
}

const HEADER_WORDS = `${HARDPOINT_CSV_HEADER.join(',')} (and optionally ${NOTE_COLUMN})`;

/** Where each column is, or undefined after reporting what is wrong with the header. */
function readHeader(f: CsvField[], end: { line: number; column: number }, at: At): Columns | undefined {
  const found = new Map<string, number>();
  let good = true;
  f.forEach((field, k) => {
    const name = field.text.trim().toLowerCase();
    const known = (HARDPOINT_CSV_HEADER as readonly string[]).includes(name) || name === NOTE_COLUMN;
    if (!known) {
      at(field.line, field.column, `column ${k + 1} of the header is ${JSON.stringify(field.text)}, not a column of the hardpoint table; expected ${HEADER_WORDS}`);
      good = false;
    } else if (found.has(name)) {
      at(field.line, field.column, `the header names ${name} twice (columns ${found.get(name)! + 1} and ${k + 1})`);
      good = false;
    } else {
      found.set(name, k);
    }
  });
  if (!good) return undefined;
  const needed = found.has('side') ? HARDPOINT_CSV_HEADER : OLD_HARDPOINT_CSV_HEADER;
  const missing = needed.filter((name) => !found.has(name));
  if (missing.length > 0) {
    at(end.line, end.column, `the header has no ${missing.join(', ')} column${missing.length > 1 ? 's' : ''}; expected ${HEADER_WORDS}`);
    return undefined;
  }
  return { point: found.get('point')!, side: found.get('side'), x: found.get('x_mm')!, y: found.get('y_mm')!, z: found.get('z_mm')!, count: f.length };
}

const SIDES: Record<string, HardpointSide> = { right: 'right', left: 'left', centre: 'centre', center: 'centre' };

/** The hardpoint a row is about, or undefined after reporting why it names none. */
function rowRef(f: CsvField[], columns: Columns, table: { refs: HardpointRef[]; byId: Map<string, HardpointRef> }, at: At): HardpointRef | undefined {
  const pointField = f[columns.point];
  const point = pointField.text.trim();
  if (columns.side === undefined) {
    // The older form: the side is a suffix of the point.
    const ref = table.byId.get(point);
    if (ref) return ref;
    const known = point.replace(/\.(right|left)$/, '');
    const near = table.refs.filter((r) => r.id === known || r.id.startsWith(`${known}.`)).map((r) => r.id);
    const hint = near.length > 0 ? ` (this design has ${near.join(', ')})` : '';
    at(pointField.line, pointField.column, `${JSON.stringify(point)} is not a hardpoint of this design${hint}`);
    return undefined;
  }
  const sideField = f[columns.side];
  const ofPoint = table.refs.filter((r) => r.field.join('.') === point);
  if (ofPoint.length === 0) {
    const suffixed = table.byId.get(point);
    const hint = suffixed ? ` (give the point as ${suffixed.field.join('.')} and the side as ${suffixed.side})` : '';
    at(pointField.line, pointField.column, `${JSON.stringify(point)} is not a hardpoint of this design${hint}`);
    return undefined;
  }
  const sided = ofPoint[0].side !== undefined;
  const sideText = sideField.text.trim();
  const side = SIDES[sideText.toLowerCase()];
  const expected = sided ? 'right or left (this point is on each side)' : 'centre (this point is a single one on the centre line)';
  if (side === undefined || (sided ? side === 'centre' : side !== 'centre')) {
    at(sideField.line, sideField.column, `${point} side: expected ${expected}, found ${sideText === '' ? 'nothing' : JSON.stringify(sideText)}`, point);
    return undefined;
  }
  return sided ? ofPoint.find((r) => r.side === side) : ofPoint[0];
}

function readRow(
  f: CsvField[],
  end: { line: number; column: number },
  columns: Columns,
  table: { refs: HardpointRef[]; byId: Map<string, HardpointRef>; rows: Rows },
  at: At,
): void {
  const line = f[0].line;
  if (f.length !== columns.count) {
    const where = f.length > columns.count ? { line: f[columns.count].line, column: f[columns.count].column - 1 } : end;
    at(where.line, where.column, `expected ${columns.count} fields (as in the header), found ${f.length}`);
    return;
  }
  const ref = rowRef(f, columns, table, at);
  if (!ref) return;
  const previous = table.rows.get(ref.id);
  if (previous) {
    const p = f[columns.point];
    at(p.line, p.column, `${describe(ref)} is listed twice (first on line ${previous.line})`, ref.id);
    return;
  }
  const values: number[] = [];
  let good = true;
  (['x', 'y', 'z'] as const).forEach((axis) => {
    const field = f[columns[axis]];
    const t = field.text.trim();
    const value = NUMBER.test(t) ? Number(t) : NaN;
    if (!Number.isFinite(value)) {
      at(field.line, field.column, `${describe(ref)} ${axis}_mm: expected a number in mm, found ${t === '' ? 'nothing' : JSON.stringify(t)}`, `${ref.id}.${axis}`);
      good = false;
    }
    values.push(value);
  });
  if (good) table.rows.set(ref.id, { line, point: { x: values[0], y: values[1], z: values[2] } });
}

/**
 * A copy of the design with every hardpoint replaced. A side given as an exact mirror keeps
 * the mirrored (single) form it had; otherwise both sides are written out.
 */
function withHardpoints(design: DesignFile, refs: HardpointRef[], rows: Rows): DesignFile {
  const next = JSON.parse(JSON.stringify(design)) as DesignFile;
  const fields = new Map<string, HardpointRef[]>();
  for (const ref of refs) {
    const key = ref.field.join('.');
    fields.set(key, [...(fields.get(key) ?? []), ref]);
  }
  for (const group of fields.values()) {
    const field = group[0].field;
    if (!group[0].side) {
      setField(next, field, { ...rows.get(group[0].id)!.point });
      continue;
    }
    const right = rows.get(`${field.join('.')}.right`)!.point;
    const left = rows.get(`${field.join('.')}.left`)!.point;
    const wasSingle = !isTwoSided(getField(design, field) as Vec3Mm);
    const mirrored = left.x === right.x && left.y === -right.y && left.z === right.z && right.y <= 0;
    setField(next, field, wasSingle && mirrored ? { ...right } : { right: { ...right }, left: { ...left } });
  }
  return next;
}

/** A validation issue of the new design, placed at the row that set the field (line:1). */
function atRowOf(issue: DesignIssue, rows: Rows, fileName: string): DesignIssue {
  const row = [...rows.entries()].find(([id]) => issue.path === id || issue.path.startsWith(`${id}.`))
    ?? [...rows.entries()].find(([id]) => id.replace(/\.(right|left)$/, '') === issue.path.replace(/\.[xyz]$/, ''));
  if (!row) return { ...issue, message: `${fileName}: ${issue.message}` };
  const [, { line }] = row;
  return { ...issue, message: `${fileName}:${line}:1: ${issue.message}`, line, column: 1 };
}
