/**
 * Hardpoint tables as CSV, for the workshop and for editing in a spreadsheet.
 *
 *     point,x_mm,y_mm,z_mm
 *     frontEnd.upper.frontPivot.right,110,-60,310
 *     frontEnd.upper.frontPivot.left,110,60,310
 *     ...
 *
 * One row per hardpoint of the design, in the order of the file format; a point written
 * once for both sides (mirrored) gets a `.right` and a `.left` row. Millimetres, ISO 8855
 * axes as everywhere (x forward, y left, z up). Directions (pivot axes, stud axes) and the
 * plan-view body outline are not hardpoints and are not in the table.
 *
 * Numbers are written in the shortest form that reads back to the same double, so
 * export -> import gives the identical design. Import takes a table for the same design
 * (the same layout) and returns a new design, or issues naming line and column: every
 * hardpoint must be listed exactly once, so a table cut short is refused, never half applied.
 * A side given as an exact mirror keeps the mirrored (single) form it had; otherwise both
 * sides are written out.
 */
import { designFileSchema } from './designSchema';
import { isTwoSided, mirrorY } from './resolveDesign';
import { validateDesign, type DesignIssue, type DesignResult } from './validateDesign';
import type { SchemaNode } from './schemaDsl';
import type { DesignFile, Vec3Mm } from './types';

export const HARDPOINT_CSV_HEADER = ['point', 'x_mm', 'y_mm', 'z_mm'] as const;

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

export function exportHardpointCsv(design: DesignFile): string {
  const lines = [HARDPOINT_CSV_HEADER.join(',')];
  for (const ref of hardpointsOf(design)) {
    const p = pointOf(design, ref);
    lines.push([ref.id, formatNumber(p.x), formatNumber(p.y), formatNumber(p.z)].join(','));
  }
  return lines.join('\n') + '\n';
}

// ---------------------------------------------------------------------------------------------
// Import
// ---------------------------------------------------------------------------------------------

interface CsvField {
  text: string;
  /** 1-based column of the field's first character. */
  column: number;
}

type CsvLine = { ok: true; fields: CsvField[] } | { ok: false; column: number; reason: string };

/**
 * One line of RFC 4180 CSV (fields in double quotes may hold commas and "" for a quote; not
 * line breaks). Our own rather than a CSV library: csv-parse and papaparse report a record's
 * line and a field's index, not the character column each message here points at, and
 * csv-parse's typings pull Node's stream types into core.
 */
function splitCsvLine(line: string): CsvLine {
  const fields: CsvField[] = [];
  let i = 0;
  for (;;) {
    const start = i;
    let text = '';
    // Spaces before an opening quote are allowed (spreadsheets write none; people do).
    let j = i;
    while (line[j] === ' ' || line[j] === '\t') j++;
    if (line[j] === '"') {
      i = j + 1;
      for (;;) {
        if (i >= line.length) return { ok: false, column: j + 1, reason: 'a quoted field is never closed (missing ")' };
        if (line[i] === '"') {
          if (line[i + 1] === '"') {
            text += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        text += line[i++];
      }
      while (line[i] === ' ' || line[i] === '\t') i++;
      if (i < line.length && line[i] !== ',') return { ok: false, column: i + 1, reason: `unexpected ${JSON.stringify(line[i])} after a quoted field` };
    } else {
      while (i < line.length && line[i] !== ',') {
        if (line[i] === '"') return { ok: false, column: i + 1, reason: 'a quote inside an unquoted field (quote the whole field and write "" for a quote)' };
        text += line[i++];
      }
    }
    fields.push({ text, column: start + 1 });
    if (i >= line.length) return { ok: true, fields };
    i++; // the comma
  }
}

/** A plain decimal number: optional sign, digits with an optional point, optional exponent. */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

type Rows = Map<string, { line: number; point: Vec3Mm }>;
/** Records an issue at a line and column of the table. */
type At = (line: number, column: number, message: string, path?: string) => void;

export function importHardpointCsv(design: DesignFile, csv: string, fileName: string): DesignResult {
  const issues: DesignIssue[] = [];
  const at: At = (line, column, message, path = '') => {
    issues.push({ path, message: `${fileName}:${line}:${column}: ${message}`, line, column });
  };

  const refs = hardpointsOf(design);
  const text = csv.startsWith('\uFEFF') ? csv.slice(1) : csv;
  const lines = text.split(/\r\n|\n|\r/);
  const { header, rows } = readTable(lines, refs, at);
  if (header === undefined) {
    return { ok: false, issues: [{ path: '', message: `${fileName}:1:1: the table is empty; expected the header ${HARDPOINT_CSV_HEADER.join(',')} and one row per hardpoint`, line: 1, column: 1 }] };
  }
  if (issues.length > 0) return { ok: false, issues };

  // Every hardpoint must be listed, so a table cut short is refused, never half applied.
  for (const ref of refs) {
    if (!rows.has(ref.id)) at(lines.length, 1, `${ref.id}: no row for this hardpoint (every hardpoint must be listed; ${rows.size} of ${refs.length} are)`, ref.id);
  }
  if (issues.length > 0) return { ok: false, issues };

  // The new design must still be a valid design; say which row to fix.
  const checked = validateDesign(withHardpoints(design, refs, rows));
  if (!checked.ok) return { ok: false, issues: checked.issues.map((issue) => atRowOf(issue, rows, fileName)) };
  return checked;
}

/** The header (its line, or undefined for an empty table) and the rows read, reporting every bad line. */
function readTable(lines: string[], refs: HardpointRef[], at: At): { header: number | undefined; rows: Rows } {
  const byId = new Map(refs.map((r) => [r.id, r]));
  let header: number | undefined;
  const rows: Rows = new Map();
  lines.forEach((raw, index) => {
    const line = index + 1;
    if (raw.trim() === '') return;
    const parsed = splitCsvLine(raw);
    if (!parsed.ok) {
      at(line, parsed.column, parsed.reason);
    } else if (header === undefined) {
      header = line;
      checkHeader(parsed.fields, raw, line, at);
    } else {
      readRow(parsed.fields, raw, line, { refs, byId, rows }, at);
    }
  });
  return { header, rows };
}

function checkHeader(f: CsvField[], raw: string, line: number, at: At): void {
  const names = f.map((x) => x.text.trim().toLowerCase());
  const bad = HARDPOINT_CSV_HEADER.findIndex((want, k) => names[k] !== want);
  if (bad < 0 && names.length === HARDPOINT_CSV_HEADER.length) return;
  const k = bad >= 0 ? bad : HARDPOINT_CSV_HEADER.length;
  const column = k < f.length ? f[k].column : raw.length + 1;
  const found = k < f.length ? JSON.stringify(f[k].text) : 'the end of the line';
  at(line, column, `expected the header ${HARDPOINT_CSV_HEADER.join(',')}; column ${k + 1} should be ${HARDPOINT_CSV_HEADER[k] ?? 'the end of the line'}, found ${found}`);
}

function readRow(f: CsvField[], raw: string, line: number, table: { refs: HardpointRef[]; byId: Map<string, HardpointRef>; rows: Rows }, at: At): void {
  if (f.length !== 4) {
    const column = f.length > 4 ? f[4].column - 1 : raw.length + 1;
    at(line, column, `expected 4 fields (point, x_mm, y_mm, z_mm), found ${f.length}`);
    return;
  }
  const id = f[0].text.trim();
  if (!table.byId.has(id)) {
    const known = id.replace(/\.(right|left)$/, '');
    const near = table.refs.filter((r) => r.id === known || r.id.startsWith(`${known}.`)).map((r) => r.id);
    const hint = near.length > 0 ? ` (this design has ${near.join(', ')})` : '';
    at(line, f[0].column, `${JSON.stringify(id)} is not a hardpoint of this design${hint}`);
    return;
  }
  const previous = table.rows.get(id);
  if (previous) {
    at(line, f[0].column, `${id} is listed twice (first on line ${previous.line})`, id);
    return;
  }
  const values: number[] = [];
  let good = true;
  (['x', 'y', 'z'] as const).forEach((axis, k) => {
    const field = f[k + 1];
    const t = field.text.trim();
    const value = NUMBER.test(t) ? Number(t) : NaN;
    if (!Number.isFinite(value)) {
      at(line, field.column, `${id} ${axis}_mm: expected a number in mm, found ${t === '' ? 'nothing' : JSON.stringify(t)}`, `${id}.${axis}`);
      good = false;
    }
    values.push(value);
  });
  if (good) table.rows.set(id, { line, point: { x: values[0], y: values[1], z: values[2] } });
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

/** The ids of a design's hardpoints, in table order (the first column of exportHardpointCsv). */
export function hardpointIds(design: DesignFile): string[] {
  return hardpointsOf(design).map((r) => r.id);
}
