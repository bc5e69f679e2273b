/**
 * How the schema DSL words things: field paths, the value found, what a node expects (with
 * its unit and bounds), a likely intended name for a misspelt field.
 */
import type { NumberNode, SchemaNode, Unit } from './schemaNodes';

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

export function pathLabel(path: string): string {
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

export const UNIT_PHRASE: Record<Unit, string> = {
  mm: ' in mm',
  deg: ' in degrees',
  ratio: ' (a ratio)',
  'mm/deg': ' in mm per degree',
  '1': '',
  '%': ' in percent',
  'km/h': ' in km/h',
  g: ' in g (multiples of standard gravity)',
};

export const UNIT_LABEL: Record<Unit, string> = {
  mm: 'mm',
  deg: 'degrees',
  ratio: 'ratio',
  'mm/deg': 'mm per degree',
  '1': '',
  '%': 'percent',
  'km/h': 'km/h',
  g: 'g',
};

export function boundsPhrase(node: NumberNode): string {
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

export function withBounds(base: string, node: NumberNode): string {
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

export function roundForMessage(value: number): string {
  return String(Math.round(value * 1000) / 1000);
}

/** A likely intended field name for a misspelt one: same name ignoring case, a prefix, or two edits away. */
export function closestName(name: string, candidates: readonly string[]): string | undefined {
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
