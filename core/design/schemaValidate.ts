/**
 * The schema DSL's validator: checks a value against a schema tree and collects every issue
 * with its path, what was expected and what was found.
 */
import type { ArrayNode, NumberNode, ObjectNode, Schema, SchemaNode, UnionNode, VecNode } from './schemaNodes';
import {
  describeExpected,
  describeFound,
  formatPath,
  pathLabel,
  roundForMessage,
  closestName,
  UNIT_PHRASE,
  withBounds,
  type PathSegment,
  type SchemaIssue,
} from './schemaWording';

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
