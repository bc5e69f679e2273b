import { readFileSync } from 'node:fs';
import { describe, it, expect } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020';
import { designFileSchema } from '../../../core/design/designSchema';
import { designJsonSchema } from '../../../core/design/jsonSchema';
import { validateAgainst, type JsonSchema, type SchemaNode } from '../../../core/design/schemaDsl';
import { validateDesign } from '../../../core/design/validateDesign';

/** Tests write wrong types into documents on purpose, so documents are loosely typed here. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Doc = any;

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');
const SCHEMA_FILE = new URL('../../../assets/tiltsheet.schema.json', import.meta.url);

function minimal(): Doc {
  return JSON.parse(FIXTURE_TEXT);
}

/** Every optional section, both forms of sided values, the other union variants. */
function full(): Doc {
  const d = minimal();
  d.notes = 'n';
  d.vehicle.rear = { kind: 'pair', trackMm: 700 };
  d.vehicle.bodyOutline = [
    { x: 300, y: 0 },
    { x: -1200, y: -350 },
    { x: -1200, y: 350 },
  ];
  d.upright.staticToeDeg = { right: 0.5, left: 0.25 };
  d.frontEnd.lower.outerJoint = { right: { x: 10, y: -345, z: 180 }, left: { x: 12, y: 345, z: 180 } };
  d.tolerances = { selfSteerDeg: 0.5, ratioChangePct: 20, slipDeg: 2, jointMarginDeg: 4, clearanceMm: 12 };
  d.riding = { minKmh: 8, maxKmh: 40, maxLeanDeg: 30, transientBandDeg: 4, gripG: 0.9 };
  d.parts = { wishboneTubeRadiusMm: 11, tieRodRadiusMm: 5, steeringArmRadiusMm: 7 };
  d.spring = { on: 'lower', frameMount: { x: -20, y: -100, z: 450 }, armMount: { x: -20, y: -250, z: 190 } };
  d.steering.input = {
    kind: 'dragLink',
    columnPivot: { x: 200, y: 0, z: 500 },
    columnAxis: { x: -0.3, y: 0, z: 1 },
    columnArmJoint: { x: 200, y: -50, z: 450 },
    crankArmJoint: { x: -40, y: -50, z: 250 },
  };
  return d;
}

function rackDesign(): Doc {
  const d = minimal();
  d.steering = { kind: 'rack', axis: { x: 0, y: 1, z: 0 }, tieRodJoint: { x: -80, y: -200, z: 240 }, mmPerHandlebarDeg: 0.6 };
  return d;
}

function centrePivotDesign(): Doc {
  const d = minimal();
  d.frontEnd = {
    kind: 'centrePivot',
    upper: { pivot: { x: 0, y: 0, z: 340 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: -15, y: -330, z: 330 } },
    lower: { pivot: { x: 0, y: 0, z: 180 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: 10, y: -345, z: 180 } },
  };
  d.steering = { kind: 'direct', pivot: { x: -40, y: 0, z: 250 }, axis: { x: 0, y: 0, z: 1 }, tieRodJoint: { x: -80, y: -60, z: 250 } };
  return d;
}

const BASE_DESIGNS = { minimal: minimal(), full: full(), rack: rackDesign(), centrePivot: centrePivotDesign() };

describe('the published JSON Schema', () => {
  it('is the committed assets/tiltsheet.schema.json (rerun `npx tsx core/cli/write-schema.ts` if this fails)', () => {
    expect(JSON.parse(readFileSync(SCHEMA_FILE, 'utf8'))).toEqual(designJsonSchema());
  });

  it('declares draft 2020-12', () => {
    expect(designJsonSchema().$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('mirrors the DSL node for node: fields, required fields, bounds, descriptions', () => {
    const checked = { objects: 0, numbers: 0 };
    const walk = (node: SchemaNode, schema: JsonSchema, where: string): void => {
      expect(typeof schema.description, `${where}: description`).toBe('string');
      expect((schema.description as string).length, `${where}: description`).toBeGreaterThan(0);
      switch (node.type) {
        case 'object': {
          checked.objects++;
          const names = Object.keys(node.fields);
          const required = names.filter((n) => !node.fields[n].optional);
          expect(Object.keys(schema.properties as object), `${where}: properties`).toEqual(names);
          expect(schema.required, `${where}: required`).toEqual(required);
          expect(schema.additionalProperties, `${where}: unknown fields`).toBe(false);
          for (const n of names) walk(node.fields[n].node, (schema.properties as Record<string, JsonSchema>)[n], `${where}.${n}`);
          return;
        }
        case 'vec': {
          checked.objects++;
          const axes = Object.keys(node.components);
          expect(schema.required, `${where}: required`).toEqual(axes);
          expect(schema.additionalProperties).toBe(false);
          if (node.role === 'direction') expect(schema.not, `${where}: nonzero`).toBeDefined();
          for (const a of axes) walk(node.components[a], (schema.properties as Record<string, JsonSchema>)[a], `${where}.${a}`);
          return;
        }
        case 'number':
          checked.numbers++;
          expect(schema.type).toBe('number');
          expect(schema.minimum, `${where}: min`).toBe(node.min);
          expect(schema.maximum, `${where}: max`).toBe(node.max);
          expect(schema.exclusiveMinimum, `${where}: exclusive min`).toBe(node.exclusiveMin);
          expect(schema.exclusiveMaximum, `${where}: exclusive max`).toBe(node.exclusiveMax);
          expect(schema.not, `${where}: nonzero`).toEqual(node.nonZero ? { const: 0 } : undefined);
          return;
        case 'union': {
          const variants = Object.values(node.variants);
          expect((schema.oneOf as unknown[]).length).toBe(variants.length);
          variants.forEach((v, i) => walk(v, (schema.oneOf as JsonSchema[])[i], `${where}<${Object.keys(node.variants)[i]}>`));
          return;
        }
        case 'sided':
          expect((schema.anyOf as unknown[]).length).toBe(2);
          walk(node.single, (schema.anyOf as JsonSchema[])[0], where);
          walk(node.bothSides, (schema.anyOf as JsonSchema[])[1], where);
          return;
        case 'array':
          expect(schema.minItems).toBe(node.minItems);
          walk(node.items, schema.items as JsonSchema, `${where}[]`);
          return;
        case 'literal':
          expect(schema.const).toBe(node.value);
          return;
        case 'enum':
          expect(schema.enum).toEqual(node.values);
          return;
        case 'string':
          expect(schema.type).toBe('string');
          expect(schema.minLength).toBe(node.minLength);
          return;
        case 'boolean':
          expect(schema.type).toBe('boolean');
          return;
      }
    };
    walk(designFileSchema, designJsonSchema(), '(root)');
    expect(checked.objects).toBeGreaterThan(50);
    expect(checked.numbers).toBeGreaterThan(150);
  });

  it('carries the bounds of the format description', () => {
    const s = designJsonSchema() as Doc;
    const p = s.properties;
    expect(p.tiltsheet.const).toBe(1);
    expect(s.required).toEqual(['tiltsheet', 'name', 'vehicle', 'frontEnd', 'upright', 'steering', 'wheels', 'joints', 'envelope']);
    expect(p.vehicle.properties.wheelbaseMm).toMatchObject({ minimum: 300, maximum: 5000 });
    expect(p.vehicle.properties.bodyOutline.minItems).toBe(3);
    expect(p.wheels.properties.front.properties.crownRadiusMm.exclusiveMinimum).toBe(0);
    expect(p.joints.properties.upperOuter.properties.ratedDeg).toMatchObject({ exclusiveMinimum: 0, exclusiveMaximum: 90 });
    expect(p.envelope.properties.leanDeg).toMatchObject({ minimum: 0, maximum: 60 });
    expect(p.envelope.properties.handlebarDeg).toMatchObject({ minimum: 0, maximum: 180 });
    expect(p.envelope.properties.bumpMm).toMatchObject({ minimum: 0, maximum: 500 });
    expect(p.tolerances.required).toEqual([]);
    // A single sided point is the right side: y <= 0.
    expect(p.upright.properties.wheelCentre.anyOf[0].properties.y.maximum).toBe(0);
    expect(p.upright.properties.wheelCentre.anyOf[1].properties.left.properties.y.maximum).toBe(20000);
  });
});

/** All single-step corruptions of a design: replaced leaves, dropped and added fields, wrong shapes. */
function mutations(design: unknown): unknown[] {
  const out: unknown[] = [];
  const leafValues: unknown[] = ['12a', null, true, 0, -1, 0.5, 330, 1e4, -1e6, ''];
  const visit = (value: unknown, replace: (v: unknown) => unknown) => {
    if (Array.isArray(value)) {
      out.push(replace([]), replace(value.slice(0, 2)), replace([...value, { x: 'a', y: 0 }]), replace({}));
      value.forEach((item, i) => visit(item, (v) => replace(value.map((x, j) => (j === i ? v : x)))));
    } else if (typeof value === 'object' && value !== null) {
      const object = value as Record<string, unknown>;
      out.push(replace(5), replace([]), replace({ ...object, extra: 1 }), replace({ right: object, left: object }), replace({ right: object }));
      for (const key of Object.keys(object)) {
        const { [key]: _dropped, ...rest } = object;
        out.push(replace(rest));
        visit(object[key], (v) => replace({ ...object, [key]: v }));
      }
    } else {
      for (const v of leafValues) out.push(replace(v));
    }
  };
  visit(design, (v) => v);
  return out;
}

/**
 * Verdicts of Ajv's draft 2020-12 validator, an implementation of JSON Schema independent of
 * ours (an npm devDependency, so the check runs wherever the tests run). Compiling checks the
 * schema against the draft's meta-schema first, in Ajv's default strict mode.
 */
function ajvVerdicts(instances: unknown[]): boolean[] {
  const ajv = new Ajv2020();
  const validate = ajv.compile(designJsonSchema());
  return instances.map((instance) => validate(instance) === true);
}

describe('the JSON Schema under an independent validator (Ajv, draft 2020-12)', () => {
  it('accepts the valid designs', () => {
    expect(ajvVerdicts(Object.values(BASE_DESIGNS))).toEqual([true, true, true, true]);
    for (const d of Object.values(BASE_DESIGNS)) expect(validateDesign(d).ok).toBe(true);
  });

  it('agrees with the DSL validator on every single-step corruption of the valid designs', { timeout: 120_000 }, () => {
    const instances = Object.values(BASE_DESIGNS).flatMap(mutations);
    expect(instances.length).toBeGreaterThan(3000);
    const ajv = ajvVerdicts(instances);
    const disagreements = instances
      .map((instance, i) => ({ instance, ajv: ajv[i], dsl: validateAgainst(designFileSchema, instance).ok }))
      .filter((r) => r.ajv !== r.dsl);
    expect(disagreements.slice(0, 3)).toEqual([]);
    // Sanity: the corpus holds both verdicts, so agreement means something.
    expect(ajv.filter((v) => v).length).toBeGreaterThan(100);
    expect(ajv.filter((v) => !v).length).toBeGreaterThan(1000);
  });

  it('differs only where documented: vector length bound and the checks across fields', () => {
    const longVector = minimal();
    longVector.steering.pivot = { x: 15000, y: 0, z: 15000 }; // each component within 20000, length is not
    const coincident = minimal();
    coincident.frontEnd.upper.rearPivot = { ...coincident.frontEnd.upper.frontPivot };
    expect(ajvVerdicts([longVector, coincident])).toEqual([true, true]);
    expect(validateDesign(longVector).ok).toBe(false);
    expect(validateAgainst(designFileSchema, coincident).ok).toBe(true);
    expect(validateDesign(coincident).ok).toBe(false);
  });
});
