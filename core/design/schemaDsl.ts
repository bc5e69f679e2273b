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
 *
 * This file holds the builders; the node types are in schemaNodes.ts, the wording in
 * schemaWording.ts, the validator in schemaValidate.ts and the JSON Schema writer in
 * schemaJson.ts, all re-exported here.
 */

import type {
  FieldInput,
  FieldNode,
  Infer,
  NumberNode,
  ObjectNode,
  ObjectValue,
  OptionalField,
  Schema,
  SchemaNode,
  Unit,
} from './schemaNodes';

export type * from './schemaNodes';
export * from './schemaWording';
export { validateAgainst, type ValidationResult } from './schemaValidate';
export { toJsonSchema, type JsonSchema } from './schemaJson';

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
