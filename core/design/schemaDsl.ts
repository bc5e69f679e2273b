/**
 * A tiny declarative schema language for the design file.
 *
 * A schema is plain data (a tree of nodes). Two interpreters read the same tree:
 * `validateAgainst` checks a value and collects every issue with its path, and
 * `toJsonSchema` emits JSON Schema (draft 2020-12) for editors and other tools. Because both
 * are derived from one tree, the validator and the published schema cannot drift apart.
 *
 * The only rule the JSON Schema cannot express is the Euclidean length bound of a vector
 * (`|v| <= maxMagnitudeMm`); the JSON Schema bounds each component by the same number instead
 * (a necessary condition) and says so in the description.
 *
 * Every builder takes a description, used in the JSON Schema and in nothing else.
 * Builders carry a phantom TypeScript type so `Infer<typeof schema>` can be checked against the
 * hand-written interfaces at compile time (see designSchema.ts).
 */

export type Unit = 'mm' | 'deg' | 'ratio' | 'mm/deg' | '1' | '%' | 'km/h' | 'g';

// ---------------------------------------------------------------------------------------------
// Nodes (runtime data)
// ---------------------------------------------------------------------------------------------

export interface NumberNode {
  readonly type: 'number';
  readonly description: string;
  readonly unit: Unit;
  readonly min?: number;
  readonly max?: number;
  readonly exclusiveMin?: number;
  readonly exclusiveMax?: number;
  /** Zero is meaningless for some ratios (a steering ratio of 0 steers nothing). */
  readonly nonZero?: boolean;
  /** Why the bounds are what they are, appended to an out-of-bounds message. */
  readonly boundsReason?: string;
}

export interface StringNode {
  readonly type: 'string';
  readonly description: string;
  readonly minLength?: number;
}

export interface BooleanNode {
  readonly type: 'boolean';
  readonly description: string;
}

export interface LiteralNode {
  readonly type: 'literal';
  readonly description: string;
  readonly value: string | number | boolean;
}

export interface EnumNode {
  readonly type: 'enum';
  readonly description: string;
  readonly values: readonly string[];
}

export interface ArrayNode {
  readonly type: 'array';
  readonly description: string;
  readonly items: SchemaNode;
  readonly minItems?: number;
}

export interface FieldNode {
  readonly node: SchemaNode;
  readonly optional: boolean;
}

export interface ObjectNode {
  readonly type: 'object';
  readonly description: string;
  /** Insertion order is the order of the JSON Schema's properties and of reported issues. */
  readonly fields: Readonly<Record<string, FieldNode>>;
}

/** Objects told apart by their `kind` field. */
export interface UnionNode {
  readonly type: 'union';
  readonly description: string;
  readonly discriminator: 'kind';
  readonly variants: Readonly<Record<string, ObjectNode>>;
}

/**
 * A right-side value mirrored to the left (`single`), or both sides spelled out
 * (`bothSides`, an object { right, left }).
 */
export interface SidedNode {
  readonly type: 'sided';
  readonly description: string;
  readonly single: SchemaNode;
  readonly bothSides: ObjectNode;
}

/** A point or direction in millimetres: an object whose components are numbers. */
export interface VecNode {
  readonly type: 'vec';
  readonly description: string;
  readonly role: 'point' | 'direction';
  readonly components: Readonly<Record<string, NumberNode>>;
  /** Euclidean length bound; the JSON Schema can only bound each component by it. */
  readonly maxMagnitudeMm: number;
}

export type SchemaNode =
  | NumberNode
  | StringNode
  | BooleanNode
  | LiteralNode
  | EnumNode
  | ArrayNode
  | ObjectNode
  | UnionNode
  | SidedNode
  | VecNode;

// ---------------------------------------------------------------------------------------------
// Phantom typing
// ---------------------------------------------------------------------------------------------

declare const VALUE_TYPE: unique symbol;

/** A schema node that describes values of type T (the type exists only at compile time). */
export type Schema<T> = SchemaNode & { readonly [VALUE_TYPE]?: T };

export type Infer<S> = S extends { readonly [VALUE_TYPE]?: infer T } ? T : never;

export interface OptionalField<S extends Schema<unknown>> {
  readonly optional: true;
  readonly schema: S;
}

type FieldInput = Schema<unknown> | OptionalField<Schema<unknown>>;

type Simplify<T> = { [K in keyof T]: T[K] } & {};

type ObjectValue<F extends Record<string, FieldInput>> = Simplify<
  {
    -readonly [K in keyof F as F[K] extends OptionalField<Schema<unknown>> ? never : K]: Infer<F[K]>;
  } & {
    -readonly [K in keyof F as F[K] extends OptionalField<Schema<unknown>> ? K : never]?: F[K] extends OptionalField<
      infer S
    >
      ? Infer<S>
      : never;
  }
>;

// ---------------------------------------------------------------------------------------------
// Builders
// ---------------------------------------------------------------------------------------------

export interface NumberOptions {
  unit: Unit;
  description: string;
  min?: number;
  max?: number;
  exclusiveMin?: number;
  exclusiveMax?: number;
  nonZero?: boolean;
}

export function number(options: NumberOptions): Schema<number> {
  return { type: 'number', ...options };
}

export function string(description: string, options: { minLength?: number } = {}): Schema<string> {
  return { type: 'string', description, ...options };
}

export function boolean(description: string): Schema<boolean> {
  return { type: 'boolean', description };
}

export function literal<const V extends string | number | boolean>(value: V, description: string): Schema<V> {
  return { type: 'literal', description, value };
}

export function enumOf<const V extends string>(values: readonly V[], description: string): Schema<V> {
  return { type: 'enum', description, values };
}

export function array<T>(items: Schema<T>, description: string, options: { minItems?: number } = {}): Schema<T[]> {
  return { type: 'array', description, items, ...options };
}

export function optional<S extends Schema<unknown>>(schema: S): OptionalField<S> {
  return { optional: true, schema };
}

export function object<const F extends Record<string, FieldInput>>(
  description: string,
  fields: F,
): Schema<ObjectValue<F>> {
  const nodes: Record<string, FieldNode> = {};
  for (const [name, field] of Object.entries(fields)) {
    nodes[name] = isOptionalField(field)
      ? { node: field.schema, optional: true }
      : { node: field, optional: false };
  }
  return { type: 'object', description, fields: nodes };
}

/** Objects told apart by a literal `kind` field; every variant must declare one. */
export function discriminatedUnion<const V extends readonly Schema<{ kind: string }>[]>(
  description: string,
  variants: V,
): Schema<Infer<V[number]>> {
  const byKind: Record<string, ObjectNode> = {};
  for (const variant of variants) {
    const kindField = variant.type === 'object' ? variant.fields.kind : undefined;
    if (!kindField || kindField.optional || kindField.node.type !== 'literal' || typeof kindField.node.value !== 'string') {
      throw new Error(`discriminatedUnion "${description}": every variant needs a required string literal "kind"`);
    }
    if (variant.type !== 'object') throw new Error('unreachable');
    byKind[kindField.node.value] = variant;
  }
  return { type: 'union', description, discriminator: 'kind', variants: byKind };
}

/** Default bound on coordinates: a 20 m box is far beyond any vehicle and catches unit slips (metres vs mm is fine, micrometres is not). */
export const DEFAULT_MAX_MAGNITUDE_MM = 20000;

function components(axes: readonly string[], maxMagnitudeMm: number): Record<string, NumberNode> {
  const result: Record<string, NumberNode> = {};
  for (const axis of axes) {
    result[axis] = {
      type: 'number',
      description: `${axis} coordinate`,
      unit: 'mm',
      min: -maxMagnitudeMm,
      max: maxMagnitudeMm,
    };
  }
  return result;
}

/** A point {x, y, z} in millimetres. */
export function vec3mm(description: string, maxMagnitudeMm = DEFAULT_MAX_MAGNITUDE_MM): Schema<{ x: number; y: number; z: number }> {
  return { type: 'vec', description, role: 'point', components: components(['x', 'y', 'z'], maxMagnitudeMm), maxMagnitudeMm };
}

/** A plan-view point {x, y} in millimetres. */
export function vec2mm(description: string, maxMagnitudeMm = DEFAULT_MAX_MAGNITUDE_MM): Schema<{ x: number; y: number }> {
  return { type: 'vec', description, role: 'point', components: components(['x', 'y'], maxMagnitudeMm), maxMagnitudeMm };
}

/** A direction {x, y, z} of any nonzero length (only its direction is used). */
export function direction3(description: string, maxMagnitudeMm = DEFAULT_MAX_MAGNITUDE_MM): Schema<{ x: number; y: number; z: number }> {
  return { type: 'vec', description, role: 'direction', components: components(['x', 'y', 'z'], maxMagnitudeMm), maxMagnitudeMm };
}

/**
 * Either one value, meaning the right side mirrored to the left, or `{ right, left }`.
 *
 * A single *point* is the right side, so its y must be <= 0 (a positive y would put the
 * "right" point on the left and its mirror on the right: almost always a sign slip). The rule
 * lives in the schema, not in a later check, so the JSON Schema enforces it too. Directions
 * and numbers have no such rule.
 */
export function sided<T>(inner: Schema<T>): Schema<T | { right: T; left: T }> {
  const single: SchemaNode =
    inner.type === 'vec' && inner.role === 'point' && inner.components.y
      ? {
          ...inner,
          description: `${inner.description} (right side; mirrored y -> -y to the left)`,
          components: {
            ...inner.components,
            y: {
              ...inner.components.y,
              description: 'y coordinate; the right side has y <= 0',
              max: 0,
              boundsReason: 'a single value is the right side (y <= 0), mirrored to the left; write { right, left } to give each side',
            },
          },
        }
      : inner;
  const bothSides: ObjectNode = {
    type: 'object',
    description: `${inner.description}, given for each side`,
    fields: {
      right: { node: { ...inner, description: `${inner.description} (right side)` } as SchemaNode, optional: false },
      left: { node: { ...inner, description: `${inner.description} (left side)` } as SchemaNode, optional: false },
    },
  };
  return {
    type: 'sided',
    description: `${inner.description}. One value is the right side mirrored to the left; { right, left } gives both sides.`,
    single,
    bothSides,
  };
}

function isOptionalField(field: FieldInput): field is OptionalField<Schema<unknown>> {
  return 'optional' in field && field.optional === true && 'schema' in field;
}

// ---------------------------------------------------------------------------------------------
// Paths and wording
// ---------------------------------------------------------------------------------------------

export interface SchemaIssue {
  /** Like `frontEnd.upper.outerJoint.right.z` or `vehicle.bodyOutline[2].x`; '' is the whole document. */
  path: string;
  /** Full sentence, starting with the path. */
  message: string;
  expected?: string;
  found?: string;
}

export type PathSegment = string | number;

const IDENTIFIER = /^[A-Za-z_$][\w$]*$/;

export function formatPath(segments: readonly PathSegment[]): string {
  let path = '';
  for (const segment of segments) {
    if (typeof segment === 'number') path += `[${segment}]`;
    else if (IDENTIFIER.test(segment)) path += path === '' ? segment : `.${segment}`;
    else path += `[${JSON.stringify(segment)}]`;
  }
  return path;
}

function pathLabel(path: string): string {
  return path === '' ? '(document)' : path;
}

/** How a found value reads in a message: strings quoted, long values cut. */
export function describeFound(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return `a list of ${value.length}`;
  if (typeof value === 'object') return 'an object';
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') {
    const quoted = JSON.stringify(value);
    return quoted.length > 42 ? `${quoted.slice(0, 40)}…"` : quoted;
  }
  return String(value);
}

const UNIT_PHRASE: Record<Unit, string> = {
  mm: ' in mm',
  deg: ' in degrees',
  ratio: ' (a ratio)',
  'mm/deg': ' in mm per degree',
  '1': '',
  '%': ' in percent',
  'km/h': ' in km/h',
  g: ' in g (multiples of standard gravity)',
};

const UNIT_LABEL: Record<Unit, string> = {
  mm: 'mm',
  deg: 'degrees',
  ratio: 'ratio',
  'mm/deg': 'mm per degree',
  '1': '',
  '%': 'percent',
  'km/h': 'km/h',
  g: 'g',
};

function boundsPhrase(node: NumberNode): string {
  if (node.min !== undefined && node.max !== undefined && node.exclusiveMin === undefined && node.exclusiveMax === undefined) {
    return [`from ${node.min} to ${node.max}`, node.nonZero ? 'not 0' : ''].filter(Boolean).join(' and ');
  }
  const parts: string[] = [];
  if (node.exclusiveMin !== undefined) parts.push(`greater than ${node.exclusiveMin}`);
  if (node.min !== undefined) parts.push(`at least ${node.min}`);
  if (node.exclusiveMax !== undefined) parts.push(`less than ${node.exclusiveMax}`);
  if (node.max !== undefined) parts.push(`at most ${node.max}`);
  if (node.nonZero) parts.push('not 0');
  return parts.join(' and ');
}

function withBounds(base: string, node: NumberNode): string {
  const bounds = boundsPhrase(node);
  return bounds === '' ? base : `${base} ${bounds}`;
}

/** What a node accepts, in words (used for "expected ..."). */
export function describeExpected(node: SchemaNode): string {
  switch (node.type) {
    case 'number':
      return withBounds(`a finite number${UNIT_PHRASE[node.unit]}`, node);
    case 'string':
      return node.minLength && node.minLength > 0 ? 'a non-empty string' : 'a string';
    case 'boolean':
      return 'true or false';
    case 'literal':
      return JSON.stringify(node.value);
    case 'enum':
      return `one of ${node.values.map((v) => JSON.stringify(v)).join(', ')}`;
    case 'array':
      return node.minItems ? `a list of at least ${node.minItems} items` : 'a list';
    case 'object':
      return 'an object';
    case 'union':
      return `an object whose "kind" is one of ${Object.keys(node.variants).map((k) => JSON.stringify(k)).join(', ')}`;
    case 'sided':
      return `${describeExpected(node.single)}, or { right, left } giving each side`;
    case 'vec': {
      const braces = `{${Object.keys(node.components).join(', ')}}`;
      return node.role === 'point' ? `a point ${braces} in mm` : `a direction ${braces}, not all zero`;
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Validation
// ---------------------------------------------------------------------------------------------

export type ValidationResult<T> = { ok: true; value: T } | { ok: false; issues: SchemaIssue[] };

export function validateAgainst<T>(schema: Schema<T>, value: unknown): ValidationResult<T> {
  const issues: SchemaIssue[] = [];
  checkNode(schema, value, [], issues);
  return issues.length === 0 ? { ok: true, value: value as T } : { ok: false, issues };
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function hasOwn(object: Record<string, unknown>, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(object, key);
}

function report(issues: SchemaIssue[], path: readonly PathSegment[], expected: string, value: unknown, reason?: string): void {
  const where = formatPath(path);
  const found = describeFound(value);
  const because = reason ? ` (${reason})` : '';
  issues.push({ path: where, message: `${pathLabel(where)}: expected ${expected}, found ${found}${because}`, expected, found });
}

function checkNode(node: SchemaNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  switch (node.type) {
    case 'number':
      return checkNumber(node, value, path, issues);
    case 'string':
      if (typeof value !== 'string' || value.length < (node.minLength ?? 0)) report(issues, path, describeExpected(node), value);
      return;
    case 'boolean':
      if (typeof value !== 'boolean') report(issues, path, describeExpected(node), value);
      return;
    case 'literal':
      if (value !== node.value) report(issues, path, describeExpected(node), value);
      return;
    case 'enum':
      if (typeof value !== 'string' || !node.values.includes(value)) report(issues, path, describeExpected(node), value);
      return;
    case 'array':
      return checkArray(node, value, path, issues);
    case 'object':
      return checkObject(node, value, path, issues);
    case 'union':
      return checkUnion(node, value, path, issues);
    case 'sided':
      // An object naming a side is the two-sided form; anything else is the single form.
      if (isPlainObject(value) && (hasOwn(value, 'right') || hasOwn(value, 'left'))) {
        return checkObject(node.bothSides, value, path, issues);
      }
      return checkNode(node.single, value, path, issues);
    case 'vec':
      return checkVec(node, value, path, issues);
  }
}

function checkNumber(node: NumberNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    report(issues, path, `a finite number${UNIT_PHRASE[node.unit]}`, value);
    return;
  }
  const inRange =
    (node.min === undefined || value >= node.min) &&
    (node.max === undefined || value <= node.max) &&
    (node.exclusiveMin === undefined || value > node.exclusiveMin) &&
    (node.exclusiveMax === undefined || value < node.exclusiveMax) &&
    !(node.nonZero && value === 0);
  if (!inRange) report(issues, path, withBounds(`a number${UNIT_PHRASE[node.unit]}`, node), value, node.boundsReason);
}

function checkArray(node: ArrayNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  if (!Array.isArray(value)) {
    report(issues, path, describeExpected(node), value);
    return;
  }
  if (node.minItems !== undefined && value.length < node.minItems) report(issues, path, describeExpected(node), value);
  value.forEach((item, index) => checkNode(node.items, item, [...path, index], issues));
}

function checkObject(node: ObjectNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  if (!isPlainObject(value)) {
    report(issues, path, describeExpected(node), value);
    return;
  }
  for (const [name, field] of Object.entries(node.fields)) {
    if (hasOwn(value, name)) checkNode(field.node, value[name], [...path, name], issues);
    else if (!field.optional) reportMissing(issues, [...path, name], field.node);
  }
  reportUnknownFields(issues, path, value, Object.keys(node.fields));
}

function reportMissing(issues: SchemaIssue[], path: PathSegment[], node: SchemaNode): void {
  const where = formatPath(path);
  const expected = describeExpected(node);
  issues.push({ path: where, message: `${where}: required field missing; expected ${expected}`, expected, found: 'nothing' });
}

function reportUnknownFields(
  issues: SchemaIssue[],
  path: PathSegment[],
  value: Record<string, unknown>,
  known: readonly string[],
): void {
  for (const key of Object.keys(value)) {
    if (known.includes(key)) continue;
    const where = formatPath([...path, key]);
    const guess = closestName(key, known.filter((name) => !hasOwn(value, name)));
    const hint = guess ? ` (did you mean "${guess}"?)` : '';
    const expected = `one of the fields ${known.join(', ')}`;
    issues.push({ path: where, message: `${where}: unknown field${hint}`, expected, found: describeFound(value[key]) });
  }
}

function checkUnion(node: UnionNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  if (!isPlainObject(value)) {
    report(issues, path, describeExpected(node), value);
    return;
  }
  const kinds = Object.keys(node.variants).map((k) => JSON.stringify(k)).join(', ');
  if (!hasOwn(value, 'kind')) {
    const where = formatPath([...path, 'kind']);
    const expected = `one of ${kinds}`;
    issues.push({ path: where, message: `${where}: required field missing; expected ${expected}`, expected, found: 'nothing' });
    return;
  }
  const kind = value.kind;
  const variant = typeof kind === 'string' && hasOwn(node.variants, kind) ? node.variants[kind] : undefined;
  if (!variant) {
    // Without a known kind the other fields cannot be judged; say only this.
    report(issues, [...path, 'kind'], `one of ${kinds}`, kind);
    return;
  }
  checkObject(variant, value, path, issues);
}

function checkVec(node: VecNode, value: unknown, path: PathSegment[], issues: SchemaIssue[]): void {
  if (!isPlainObject(value)) {
    report(issues, path, describeExpected(node), value);
    return;
  }
  const before = issues.length;
  for (const [axis, component] of Object.entries(node.components)) {
    if (hasOwn(value, axis)) checkNode(component, value[axis], [...path, axis], issues);
    else reportMissing(issues, [...path, axis], component);
  }
  reportUnknownFields(issues, path, value, Object.keys(node.components));
  if (issues.length > before) return;

  const coordinates = Object.keys(node.components).map((axis) => value[axis] as number);
  const length = Math.hypot(...coordinates);
  const where = formatPath(path);
  if (length > node.maxMagnitudeMm) {
    const expected = `a length of at most ${node.maxMagnitudeMm} mm`;
    const found = `${roundForMessage(length)} mm`;
    issues.push({ path: where, message: `${where}: expected ${expected}, found ${found}`, expected, found });
  }
  if (node.role === 'direction' && length === 0) {
    const expected = 'a direction with nonzero length';
    issues.push({ path: where, message: `${where}: expected ${expected}, found all components 0`, expected, found: 'all components 0' });
  }
}

export function roundForMessage(value: number): string {
  return String(Math.round(value * 1000) / 1000);
}

/** A likely intended field name for a misspelt one: same name ignoring case, a prefix, or two edits away. */
function closestName(name: string, candidates: readonly string[]): string | undefined {
  const lower = name.toLowerCase();
  let best: { candidate: string; distance: number } | undefined;
  for (const candidate of candidates) {
    const other = candidate.toLowerCase();
    const distance = other === lower || other.startsWith(lower) || lower.startsWith(other) ? 0 : editDistance(lower, other);
    if (distance <= 2 && (!best || distance < best.distance)) best = { candidate, distance };
  }
  return best?.candidate;
}

function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    previous = current;
  }
  return previous[b.length];
}

// ---------------------------------------------------------------------------------------------
// JSON Schema (draft 2020-12)
// ---------------------------------------------------------------------------------------------

export type JsonSchema = { [keyword: string]: unknown };

export function toJsonSchema(node: SchemaNode): JsonSchema {
  switch (node.type) {
    case 'number': {
      const unit = UNIT_LABEL[node.unit];
      const schema: JsonSchema = { type: 'number', description: unit ? `${node.description} [${unit}]` : node.description };
      if (node.min !== undefined) schema.minimum = node.min;
      if (node.max !== undefined) schema.maximum = node.max;
      if (node.exclusiveMin !== undefined) schema.exclusiveMinimum = node.exclusiveMin;
      if (node.exclusiveMax !== undefined) schema.exclusiveMaximum = node.exclusiveMax;
      if (node.nonZero) schema.not = { const: 0 };
      return schema;
    }
    case 'string':
      return { type: 'string', description: node.description, ...(node.minLength !== undefined ? { minLength: node.minLength } : {}) };
    case 'boolean':
      return { type: 'boolean', description: node.description };
    case 'literal':
      return { const: node.value, description: node.description };
    case 'enum':
      return { type: 'string', enum: [...node.values], description: node.description };
    case 'array':
      return {
        type: 'array',
        description: node.description,
        items: toJsonSchema(node.items),
        ...(node.minItems !== undefined ? { minItems: node.minItems } : {}),
      };
    case 'object':
      return objectSchema(node.description, node.fields);
    case 'union':
      return { description: node.description, oneOf: Object.values(node.variants).map(toJsonSchema) };
    case 'sided':
      return { description: node.description, anyOf: [toJsonSchema(node.single), toJsonSchema(node.bothSides)] };
    case 'vec': {
      const fields: Record<string, FieldNode> = {};
      for (const [axis, component] of Object.entries(node.components)) fields[axis] = { node: component, optional: false };
      const description =
        `${node.description}. ${node.role === 'direction' ? 'A direction (length unused, not zero)' : 'A point'} in mm; ` +
        `Tiltbench also requires a length of at most ${node.maxMagnitudeMm} mm.`;
      const schema = objectSchema(description, fields);
      if (node.role === 'direction') {
        const allZero: Record<string, JsonSchema> = {};
        for (const axis of Object.keys(node.components)) allZero[axis] = { const: 0 };
        schema.not = { properties: allZero };
      }
      return schema;
    }
  }
}

function objectSchema(description: string, fields: Readonly<Record<string, FieldNode>>): JsonSchema {
  const properties: Record<string, JsonSchema> = {};
  const required: string[] = [];
  for (const [name, field] of Object.entries(fields)) {
    properties[name] = toJsonSchema(field.node);
    if (!field.optional) required.push(name);
  }
  return { type: 'object', description, properties, required, additionalProperties: false };
}
