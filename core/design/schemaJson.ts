/**
 * The schema DSL's JSON Schema writer (draft 2020-12), from the same tree the validator reads,
 * so the published schema and the validator cannot drift apart.
 */
import type { FieldNode, SchemaNode } from './schemaNodes';
import { UNIT_LABEL } from './schemaWording';

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
