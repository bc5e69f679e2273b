/**
 * The schema DSL's data: the node types a schema tree is made of (plain data, read by the
 * validator in schemaValidate.ts, the JSON Schema writer in schemaJson.ts and the hardpoint
 * table), and the phantom typing that lets `Infer<typeof schema>` be checked against the
 * hand-written interfaces at compile time. The builders that make trees are in schemaDsl.ts.
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

export type FieldInput = Schema<unknown> | OptionalField<Schema<unknown>>;

type Simplify<T> = { [K in keyof T]: T[K] } & {};

export type ObjectValue<F extends Record<string, FieldInput>> = Simplify<
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
