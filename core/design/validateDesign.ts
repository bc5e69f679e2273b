/**
 * Reading a design: text -> JSON -> format migration -> schema check -> checks across fields.
 *
 * Every stage collects all its issues instead of stopping at the first. The checks across
 * fields (coincident points, the steering axis vs the spin axis, ...) need a structurally
 * valid design, so they run only once the schema check has passed.
 */
import { designFileSchema } from './designSchema';
import { findDuplicateKeys } from './duplicateKeys';
import { wheelSpinAxisAtDesign } from '../mechanism/wheelAxis';
import { isTwoSided, resolveDesign } from './resolveDesign';
import { describeFound, roundForMessage, validateAgainst, type SchemaIssue } from './schemaDsl';
import {
  DESIGN_FORMAT_KEY,
  DESIGN_FORMAT_VERSION,
  SIDES,
  type DesignFile,
  type PerSide,
  type ResolvedDesign,
  type Side,
  type Sided,
  type Vec3Mm,
} from './types';

export interface DesignIssue extends SchemaIssue {
  /** 1-based position in the file, for JSON syntax errors. */
  line?: number;
  column?: number;
}

export type DesignResult = { ok: true; design: DesignFile } | { ok: false; issues: DesignIssue[] };

/**
 * Checks a parsed document against format 1 and the rules across fields. `source` (a file
 * name, say) prefixes every message.
 */
export function validateDesign(json: unknown, source?: string): DesignResult {
  const newer = newerFormatIssue(json);
  if (newer) return fail([newer], source);

  const checked = validateAgainst(designFileSchema, json);
  if (!checked.ok) return fail(checked.issues, source);

  const design = checked.value as DesignFile;
  const issues = checkAcrossFields(design);
  return issues.length === 0 ? { ok: true, design } : fail(issues, source);
}

/** Reads a `.tiltsheet` file's text: JSON syntax (with line:column), format version, then validation. */
export function parseDesignText(text: string, fileName: string): DesignResult {
  // Editors on some systems write a byte-order mark; JSON.parse refuses it, people cannot see it.
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  if (body.trim() === '') return fail([{ path: '', message: 'the file is empty; expected a JSON design' }], fileName);

  let json: unknown;
  try {
    json = JSON.parse(body);
  } catch (error) {
    return { ok: false, issues: [jsonSyntaxIssue(body, error, fileName)] };
  }
  // JSON.parse keeps the last of two equal keys without a word: refuse instead of guessing.
  const duplicates = findDuplicateKeys(body);
  if (duplicates.length > 0) {
    return {
      ok: false,
      issues: duplicates.map((d) => {
        const { line, column } = lineAndColumn(body, d.offset);
        return {
          path: d.path,
          line,
          column,
          message: `${fileName}:${line}:${column}: ${d.path}: ${JSON.stringify(d.key)} is given twice in the same object; keep one and delete the other`,
        };
      }),
    };
  }

  const migrated = migrateDesign(json);
  if (!migrated.ok) return fail(migrated.issues, fileName);
  return validateDesign(migrated.json, fileName);
}

function fail(issues: DesignIssue[], source: string | undefined): { ok: false; issues: DesignIssue[] } {
  if (source === undefined) return { ok: false, issues };
  return { ok: false, issues: issues.map((issue) => ({ ...issue, message: `${source}: ${issue.message}` })) };
}

// ---------------------------------------------------------------------------------------------
// Format versions and migrations
// ---------------------------------------------------------------------------------------------

/**
 * Turns a document of format N into one of format N + 1. It must not change its argument
 * (build and return a new object) and must set the format key to N + 1.
 */
export type DesignMigration = (document: Record<string, unknown>) => Record<string, unknown>;

/**
 * Migrations keyed by the format they upgrade FROM. Format 1 is the first published format,
 * so there are none yet; when format 2 arrives, format 1 files get an entry here.
 */
export const DESIGN_MIGRATIONS: Readonly<Record<number, DesignMigration>> = {};

export type MigrationResult = { ok: true; json: unknown; migratedFrom?: number } | { ok: false; issues: DesignIssue[] };

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function newerFormatIssue(json: unknown): DesignIssue | undefined {
  if (!isPlainObject(json)) return undefined;
  const version = json[DESIGN_FORMAT_KEY];
  if (typeof version !== 'number' || !Number.isInteger(version) || version <= DESIGN_FORMAT_VERSION) return undefined;
  return {
    path: DESIGN_FORMAT_KEY,
    message:
      `${DESIGN_FORMAT_KEY}: this design was made by a newer Tiltbench (format ${version}); ` +
      `this build reads format ${DESIGN_FORMAT_VERSION}. Update Tiltbench to open it.`,
    expected: `format ${DESIGN_FORMAT_VERSION} or older`,
    found: String(version),
  };
}

/**
 * Brings an older document up to the current format, one step at a time. Documents of the
 * current format, and anything that is not an object, pass through unchanged (the schema
 * check then reports what is wrong with them).
 */
export function migrateDesign(json: unknown, migrations: Readonly<Record<number, DesignMigration>> = DESIGN_MIGRATIONS): MigrationResult {
  if (!isPlainObject(json)) return { ok: true, json };
  const newer = newerFormatIssue(json);
  if (newer) return { ok: false, issues: [newer] };

  if (!Object.prototype.hasOwnProperty.call(json, DESIGN_FORMAT_KEY)) {
    return {
      ok: false,
      issues: [
        {
          path: DESIGN_FORMAT_KEY,
          message: `${DESIGN_FORMAT_KEY}: missing; this is not a Tiltbench design (a design starts with "${DESIGN_FORMAT_KEY}": ${DESIGN_FORMAT_VERSION})`,
          expected: String(DESIGN_FORMAT_VERSION),
          found: 'nothing',
        },
      ],
    };
  }

  const version = json[DESIGN_FORMAT_KEY];
  if (version === DESIGN_FORMAT_VERSION) return { ok: true, json };
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
    // Not a format number at all: let the schema check say so, together with everything else.
    return { ok: true, json };
  }

  let document = json;
  for (let from = version; from < DESIGN_FORMAT_VERSION; from++) {
    const step = migrations[from];
    if (!step) {
      return {
        ok: false,
        issues: [
          {
            path: DESIGN_FORMAT_KEY,
            message: `${DESIGN_FORMAT_KEY}: format ${version} is not supported; this build reads format ${DESIGN_FORMAT_VERSION} and has no conversion from format ${from}`,
            expected: String(DESIGN_FORMAT_VERSION),
            found: String(version),
          },
        ],
      };
    }
    document = step(document);
    if (document[DESIGN_FORMAT_KEY] !== from + 1) {
      // A bug in a migration, not in the user's file: fail loudly.
      throw new Error(`design migration from format ${from} did not produce format ${from + 1}`);
    }
  }
  return { ok: true, json: document, migratedFrom: version };
}

// ---------------------------------------------------------------------------------------------
// JSON syntax errors with line and column
// ---------------------------------------------------------------------------------------------

function jsonSyntaxIssue(text: string, error: unknown, fileName: string): DesignIssue {
  // Engines word JSON.parse errors differently and some give no position (V8 in Node 20:
  // "Unexpected token '}', ... is not valid JSON"), so find the position ourselves and use the
  // engine's "position N" only if our scanner disagrees with the engine.
  const scanned = findJsonSyntaxError(text);
  // Past MAX_JSON_DEPTH the scanner stops looking; the engine (which has no such limit) knows where the error is.
  const located = scanned?.reason === 'nested too deeply' && /position \d+/.test(error instanceof Error ? error.message : '') ? undefined : scanned;
  const engineMessage = error instanceof Error ? error.message : String(error);
  const enginePosition = /position (\d+)/.exec(engineMessage);
  const offset = located?.offset ?? (enginePosition ? Number(enginePosition[1]) : undefined);
  const reason = located?.reason ?? engineMessage;
  if (offset === undefined) {
    return { path: '', message: `${fileName}: invalid JSON: ${reason}` };
  }
  const { line, column } = lineAndColumn(text, offset);
  return { path: '', message: `${fileName}:${line}:${column}: invalid JSON: ${reason}`, line, column };
}

/** 1-based line and column of a character offset; \r\n, \n and \r each end a line. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    const c = text[i];
    if (c === '\n' || (c === '\r' && text[i + 1] !== '\n')) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

class JsonSyntaxError {
  constructor(
    readonly offset: number,
    readonly reason: string,
  ) {}
}

const MAX_JSON_DEPTH = 512;

/**
 * The offset and a plain-words reason of the first syntax error in `text` (RFC 8259 JSON),
 * or undefined if the text is valid. Run only after JSON.parse has failed.
 */
export function findJsonSyntaxError(text: string): { offset: number; reason: string } | undefined {
  let i = 0;

  const fail = (reason: string, at = i): never => {
    throw new JsonSyntaxError(at, reason);
  };
  const describeAt = (at: number): string => {
    if (at >= text.length) return 'the end of the file';
    const word = /^[A-Za-z0-9_.+-]+/.exec(text.slice(at, at + 20));
    return JSON.stringify(word ? word[0] : text[at]);
  };
  const skipWhitespace = () => {
    while (i < text.length && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const expect = (char: string, what: string) => {
    if (text[i] !== char) {
      const hint = text[i] === '/' ? ' (comments are not allowed in JSON)' : '';
      fail(`expected ${what}, found ${describeAt(i)}${hint}`);
    }
    i++;
  };

  const scanString = () => {
    const start = i;
    i++; // opening quote
    for (;;) {
      if (i >= text.length) fail('a string is never closed (missing ")', start);
      const c = text.charCodeAt(i);
      if (c === 0x22) {
        i++;
        return;
      }
      if (c < 0x20) fail('a line break or control character inside a string (strings must be closed on the same line; write \\n for a line break)');
      if (c === 0x5c) {
        const escape = text[i + 1];
        if (escape === 'u') {
          if (!/^[0-9A-Fa-f]{4}$/.test(text.slice(i + 2, i + 6))) fail('\\u must be followed by four hex digits');
          i += 6;
        } else if (escape !== undefined && '"\\/bfnrt'.includes(escape)) {
          i += 2;
        } else {
          fail(`unknown escape \\${escape ?? ''} in a string`);
        }
        continue;
      }
      i++;
    }
  };

  const digits = (what: string) => {
    if (!(text[i] >= '0' && text[i] <= '9')) fail(`expected ${what}, found ${describeAt(i)}`);
    while (text[i] >= '0' && text[i] <= '9') i++;
  };
  const scanNumber = () => {
    if (text[i] === '-') i++;
    if (text[i] === '0') i++;
    else digits('a digit');
    if (text[i] === '.') {
      i++;
      digits('a digit after the decimal point');
    }
    if (text[i] === 'e' || text[i] === 'E') {
      i++;
      if (text[i] === '+' || text[i] === '-') i++;
      digits('a digit in the exponent');
    }
  };

  const scanValue = (depth: number): void => {
    if (depth > MAX_JSON_DEPTH) fail('nested too deeply');
    skipWhitespace();
    const c = text[i];
    if (c === '{') return scanObject(depth);
    if (c === '[') return scanArray(depth);
    if (c === '"') return scanString();
    if (c === '-' || (c >= '0' && c <= '9')) return scanNumber();
    for (const word of ['true', 'false', 'null']) {
      if (text.startsWith(word, i)) {
        i += word.length;
        return;
      }
    }
    const hint = c === "'" ? ' (strings need double quotes)' : c === '/' ? ' (comments are not allowed in JSON)' : '';
    fail(`expected a value, found ${describeAt(i)}${hint}`);
  };

  const scanObject = (depth: number) => {
    i++; // {
    skipWhitespace();
    if (text[i] === '}') {
      i++;
      return;
    }
    for (;;) {
      skipWhitespace();
      if (text[i] !== '"') {
        const hint =
          text[i] === '}'
            ? ' (a comma before "}" is not allowed in JSON)'
            : text[i] === "'"
              ? ' (names need double quotes)'
              : text[i] === '/'
                ? ' (comments are not allowed in JSON)'
                : '';
        fail(`expected a property name in double quotes, found ${describeAt(i)}${hint}`);
      }
      scanString();
      skipWhitespace();
      expect(':', "':' after the property name");
      scanValue(depth + 1);
      skipWhitespace();
      if (text[i] === ',') {
        i++;
        continue;
      }
      expect('}', "',' or '}' after a property value");
      return;
    }
  };

  const scanArray = (depth: number) => {
    i++; // [
    skipWhitespace();
    if (text[i] === ']') {
      i++;
      return;
    }
    for (;;) {
      skipWhitespace();
      if (text[i] === ']') fail('expected a value, found "]" (a comma before "]" is not allowed in JSON)');
      scanValue(depth + 1);
      skipWhitespace();
      if (text[i] === ',') {
        i++;
        continue;
      }
      expect(']', "',' or ']' after a list item");
      return;
    }
  };

  try {
    scanValue(0);
    skipWhitespace();
    if (i < text.length) fail(`unexpected ${describeAt(i)} after the end of the JSON document`);
    return undefined;
  } catch (error) {
    if (error instanceof JsonSyntaxError) return { offset: error.offset, reason: error.reason };
    throw error;
  }
}

// ---------------------------------------------------------------------------------------------
// Checks across fields
// ---------------------------------------------------------------------------------------------

/** Below this, two points that must define a line or a length count as coincident. */
export const MIN_DISTINCT_MM = 1;
/** Centre-pivot pivots must lie within this of the centre line (y = 0). */
export const CENTRE_LINE_TOLERANCE_MM = 1;
/**
 * The steering axis must be at least this far from the wheel's spin axis. Real axes are
 * 60-90 degrees from it; near 0 the wheel would just spin about the axis instead of steering.
 * The bound only catches broken input (wrong point, swapped coordinates).
 */
export const MIN_STEER_TO_SPIN_AXIS_DEG = 10;

/** A point (as resolved) together with the path a user would fix; `side` for per-side points. */
interface Located {
  path: string;
  at: Vec3Mm;
  side?: Side;
}

function sub(a: Vec3Mm, b: Vec3Mm): Vec3Mm {
  return { x: a.x - b.x, y: a.y - b.y, z: a.z - b.z };
}
function dot(a: Vec3Mm, b: Vec3Mm): number {
  return a.x * b.x + a.y * b.y + a.z * b.z;
}
function cross(a: Vec3Mm, b: Vec3Mm): Vec3Mm {
  return { x: a.y * b.z - a.z * b.y, y: a.z * b.x - a.x * b.z, z: a.x * b.y - a.y * b.x };
}
function norm(a: Vec3Mm): number {
  return Math.hypot(a.x, a.y, a.z);
}
function distanceToLine(p: Vec3Mm, through: Vec3Mm, direction: Vec3Mm): number {
  return norm(cross(sub(p, through), direction)) / norm(direction);
}

/** The path of one side of a sided field: the field itself when written as one mirrored value. */
function sidePath(raw: Sided<unknown>, base: string, side: Side): string {
  return isTwoSided(raw) ? `${base}.${side}` : base;
}

function locate(raw: Sided<Vec3Mm>, resolved: PerSide<Vec3Mm>, base: string, side: Side): Located {
  return { path: sidePath(raw, base, side), at: resolved[side], side };
}

function fixed(at: Vec3Mm, path: string): Located {
  return { path, at };
}

/**
 * The wheel's spin axis at design position from static toe and camber, pointing outward
 * (the mechanism's convention, which points left on both sides, turned outward here).
 */
export function spinAxis(side: Side, toeDeg: number, camberDeg: number): Vec3Mm {
  const [x, y, z] = wheelSpinAxisAtDesign(side, toeDeg, camberDeg);
  const s = side === 'right' ? -1 : 1;
  return { x: s * x, y: s * y, z: s * z };
}

/**
 * Issues from checks that run once per side. A value written once (mirrored) usually fails
 * on both sides alike: it is reported once. An issue found on one side only says which side,
 * unless its path already does (`....left`).
 */
class IssueList {
  private readonly entries: { issue: DesignIssue; side?: Side }[] = [];

  add(issue: DesignIssue, side?: Side): void {
    this.entries.push({ issue, side });
  }

  get issues(): DesignIssue[] {
    const result: DesignIssue[] = [];
    const emitted = new Set<string>();
    for (const { issue, side } of this.entries) {
      if (emitted.has(issue.message)) continue;
      emitted.add(issue.message);
      const onBothSides = this.entries.some((e) => e.issue.message === issue.message && e.side !== side);
      const pathNamesSide = side !== undefined && `${issue.path}.`.includes(`.${side}.`);
      if (side === undefined || onBothSides || pathNamesSide) {
        result.push(issue);
      } else {
        const prefix = `${issue.path}: `;
        result.push({ ...issue, message: `${prefix}on the ${side} side, ${issue.message.slice(prefix.length)}` });
      }
    }
    return result;
  }

  distinct(a: Located, b: Located, why: string): void {
    const d = norm(sub(a.at, b.at));
    if (d >= MIN_DISTINCT_MM) return;
    const found = `${roundForMessage(d)} mm`;
    this.add(
      {
        path: b.path,
        message: `${b.path}: is ${found} from ${a.path}; ${why}, so they must be at least ${MIN_DISTINCT_MM} mm apart`,
        expected: `at least ${MIN_DISTINCT_MM} mm from ${a.path}`,
        found,
      },
      a.side ?? b.side,
    );
  }

  offLine(p: Located, through: Located, towards: Located | { direction: Vec3Mm; path: string }, why: string): void {
    const direction = 'direction' in towards ? towards.direction : sub(towards.at, through.at);
    if (norm(direction) === 0) return; // reported by distinct() or the schema already
    const d = distanceToLine(p.at, through.at, direction);
    if (d >= MIN_DISTINCT_MM) return;
    const line = `the line through ${through.path} and ${towards.path}`;
    const found = `${roundForMessage(d)} mm`;
    this.add(
      {
        path: p.path,
        message: `${p.path}: is ${found} from ${line}; ${why}, so it must be at least ${MIN_DISTINCT_MM} mm off that line`,
        expected: `at least ${MIN_DISTINCT_MM} mm from ${line}`,
        found,
      },
      p.side ?? through.side,
    );
  }
}

export function checkAcrossFields(d: DesignFile): DesignIssue[] {
  const r = resolveDesign(d);
  const list = new IssueList();
  checkFrontEnd(d, r, list);
  checkUpright(d, r, list);
  checkSteering(d, r, list);
  checkSpring(d, r, list);
  checkWheels(d, list);
  checkEnvelope(d, list);
  return list.issues;
}

function outerJoints(d: DesignFile, r: ResolvedDesign, side: Side): { upper: Located; lower: Located } {
  return {
    upper: locate(d.frontEnd.upper.outerJoint, r.frontEnd.upper.outerJoint, 'frontEnd.upper.outerJoint', side),
    lower: locate(d.frontEnd.lower.outerJoint, r.frontEnd.lower.outerJoint, 'frontEnd.lower.outerJoint', side),
  };
}

function checkFrontEnd(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  for (const side of SIDES) {
    if (d.frontEnd.kind === 'splitWishbones' && r.frontEnd.kind === 'splitWishbones') {
      for (const which of ['upper', 'lower'] as const) {
        const raw = d.frontEnd[which];
        const res = r.frontEnd[which];
        const base = `frontEnd.${which}`;
        const front = locate(raw.frontPivot, res.frontPivot, `${base}.frontPivot`, side);
        const rear = locate(raw.rearPivot, res.rearPivot, `${base}.rearPivot`, side);
        const outer = locate(raw.outerJoint, res.outerJoint, `${base}.outerJoint`, side);
        list.distinct(front, rear, 'the two inner pivots define the wishbone pivot axis');
        list.offLine(outer, front, rear, 'the outer joint on the pivot axis would give the wishbone no length');
      }
    } else if (d.frontEnd.kind === 'centrePivot' && r.frontEnd.kind === 'centrePivot') {
      for (const which of ['upper', 'lower'] as const) {
        const res = r.frontEnd[which];
        const base = `frontEnd.${which}`;
        const outer = locate(d.frontEnd[which].outerJoint, res.outerJoint, `${base}.outerJoint`, side);
        list.offLine(outer, fixed(res.pivot, `${base}.pivot`), { direction: res.pivotAxis, path: `${base}.pivotAxis` },
          'the outer joint on the pivot axis would give the member no length');
      }
    }
    const { upper, lower } = outerJoints(d, r, side);
    list.distinct(upper, lower, 'the upper and lower outer joints define the steering axis');
  }

  if (d.frontEnd.kind === 'centrePivot' && r.frontEnd.kind === 'centrePivot') {
    list.distinct(fixed(r.frontEnd.upper.pivot, 'frontEnd.upper.pivot'), fixed(r.frontEnd.lower.pivot, 'frontEnd.lower.pivot'),
      'the upper and lower members form a parallelogram with the uprights');
    for (const which of ['upper', 'lower'] as const) {
      const y = r.frontEnd[which].pivot.y;
      if (Math.abs(y) >= CENTRE_LINE_TOLERANCE_MM) {
        const path = `frontEnd.${which}.pivot.y`;
        const expected = `a y within ${CENTRE_LINE_TOLERANCE_MM} mm of 0 (a centre-pivot member pivots on the centre line)`;
        list.add({ path, message: `${path}: expected ${expected}, found ${y}`, expected, found: String(y) });
      }
    }
  }
}

function checkUpright(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  for (const side of SIDES) {
    const { upper, lower } = outerJoints(d, r, side);
    const arm = locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', side);
    list.offLine(arm, upper, lower, 'the steering arm needs length off the steering axis to turn the wheel');

    const centre = r.upright.wheelCentre[side];
    if (!(centre.z > 0)) {
      const path = `${sidePath(d.upright.wheelCentre, 'upright.wheelCentre', side)}.z`;
      const expected = 'a wheel centre above the ground (z > 0 mm)';
      list.add({ path, message: `${path}: expected ${expected}, found ${centre.z}`, expected, found: String(centre.z) }, side);
    }

    const steerAxis = sub(upper.at, lower.at);
    if (norm(steerAxis) === 0) continue; // coincident joints, reported above
    const spin = spinAxis(side, r.upright.staticToeDeg[side], r.upright.staticCamberDeg[side]);
    const cosine = Math.min(1, Math.abs(dot(steerAxis, spin)) / norm(steerAxis));
    const angleDeg = (Math.acos(cosine) * 180) / Math.PI;
    if (angleDeg < MIN_STEER_TO_SPIN_AXIS_DEG) {
      const found = `${roundForMessage(angleDeg)}°`;
      const expected = `at least ${MIN_STEER_TO_SPIN_AXIS_DEG}° between the steering axis and the spin axis`;
      list.add({
        path: upper.path,
        message:
          `${upper.path}: the steering axis (${upper.path} to ${lower.path}) is only ${found} from the wheel's spin axis ` +
          `(set by upright.staticToeDeg and upright.staticCamberDeg); expected ${expected}, or turning it would not steer the wheel`,
        expected,
        found,
      }, side);
    }
  }
}

function checkSteering(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  const s = d.steering;
  const rs = r.steering;
  for (const side of SIDES) {
    const inner = locate(s.tieRodJoint, rs.tieRodJoint, 'steering.tieRodJoint', side);
    const outer = locate(d.upright.steeringArmJoint, r.upright.steeringArmJoint, 'upright.steeringArmJoint', side);
    list.distinct(outer, inner, 'the tie rod runs between them');
    if (rs.kind === 'bellCrank' || rs.kind === 'direct') {
      list.offLine(inner, fixed(rs.pivot, 'steering.pivot'), { direction: rs.axis, path: 'steering.axis' },
        'a joint on the pivot axis does not move when the crank turns');
    }
  }
  if (s.kind === 'bellCrank' && s.input.kind === 'dragLink') {
    const input = s.input;
    const columnArm = fixed(input.columnArmJoint, 'steering.input.columnArmJoint');
    const crankArm = fixed(input.crankArmJoint, 'steering.input.crankArmJoint');
    list.distinct(columnArm, crankArm, 'the drag link runs between them');
    list.offLine(columnArm, fixed(input.columnPivot, 'steering.input.columnPivot'), { direction: input.columnAxis, path: 'steering.input.columnAxis' },
      'a joint on the column axis does not move when the handlebar turns');
    list.offLine(crankArm, fixed(s.pivot, 'steering.pivot'), { direction: s.axis, path: 'steering.axis' },
      'a joint on the crank axis cannot turn the crank');
  }
}

function checkSpring(d: DesignFile, r: ResolvedDesign, list: IssueList): void {
  if (!d.spring || !r.spring) return;
  for (const side of SIDES) {
    list.distinct(
      locate(d.spring.frameMount, r.spring.frameMount, 'spring.frameMount', side),
      locate(d.spring.armMount, r.spring.armMount, 'spring.armMount', side),
      'the spring runs between them',
    );
  }
}

function checkWheels(d: DesignFile, list: IssueList): void {
  for (const axle of ['front', 'rear'] as const) {
    const tyre = d.wheels[axle];
    if (tyre.crownRadiusMm > tyre.rollingRadiusMm) {
      const path = `wheels.${axle}.crownRadiusMm`;
      const expected = `a crown radius in mm at most the rolling radius (wheels.${axle}.rollingRadiusMm = ${tyre.rollingRadiusMm})`;
      list.add({ path, message: `${path}: expected ${expected}, found ${tyre.crownRadiusMm}`, expected, found: String(tyre.crownRadiusMm) });
    }
  }
}

function checkEnvelope(d: DesignFile, list: IssueList): void {
  if (!d.vehicle.tilting && d.envelope.leanDeg !== 0) {
    const path = 'envelope.leanDeg';
    const expected = '0 degrees, because vehicle.tilting is false (the frame does not lean)';
    list.add({ path, message: `${path}: expected ${expected}, found ${describeFound(d.envelope.leanDeg)}`, expected, found: String(d.envelope.leanDeg) });
  }
}
