/**
 * The published JSON Schema (draft 2020-12) of the design file, generated from the same
 * schema tree the validator uses. Editors can point `.tiltsheet` files at it for completion
 * and inline errors. It checks structure and bounds only: the rules across fields
 * (coincident points, steering axis vs spin axis, ...) live in validateDesign.ts.
 */
import { designFileSchema } from './designSchema';
import { toJsonSchema, type JsonSchema } from './schemaDsl';
import { DESIGN_FORMAT_VERSION } from './types';

export const DESIGN_JSON_SCHEMA_ID = `urn:tiltbench:tiltsheet:${DESIGN_FORMAT_VERSION}`;

export function designJsonSchema(): JsonSchema {
  const { description, ...root } = toJsonSchema(designFileSchema);
  return {
    $schema: 'https://json-schema.org/draft/2020-12/schema',
    $id: DESIGN_JSON_SCHEMA_ID,
    title: `Tiltbench design file (.tiltsheet), format ${DESIGN_FORMAT_VERSION}`,
    description,
    ...root,
  };
}
