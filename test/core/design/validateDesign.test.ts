import { readFileSync } from 'node:fs';
import { describe, it, expect } from 'vitest';
import { checkAcrossFields, spinAxis, validateDesign, type DesignIssue } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';

/** Tests write wrong types into documents on purpose, so documents are loosely typed here. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Doc = any;

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');

/** A fresh, mutable copy of the minimal design for each test. */
function minimal(): Doc {
  return JSON.parse(FIXTURE_TEXT);
}

function issuesOf(json: unknown, source?: string): DesignIssue[] {
  const result = validateDesign(json, source);
  if (result.ok) throw new Error('expected the design to be rejected');
  return result.issues;
}

function pathsOf(json: unknown): string[] {
  return issuesOf(json).map((i) => i.path);
}

describe('validateDesign: valid input', () => {
  it('accepts the minimal fixture and returns it as the design', () => {
    const json = minimal();
    const result = validateDesign(json);
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.design).toEqual(json);
  });

  it('accepts explicit { right, left } values, including a right side with y > 0 when written explicitly', () => {
    const json = minimal();
    json.upright.wheelCentre = { right: { x: 0, y: -400, z: 250 }, left: { x: 0, y: 410, z: 250 } };
    json.upright.staticToeDeg = { right: 0.5, left: 0.25 };
    json.steering.tieRodJoint = { right: { x: -80, y: 5, z: 250 }, left: { x: -80, y: 60, z: 250 } };
    expect(validateDesign(json).ok).toBe(true);
  });

  it('accepts every optional section', () => {
    const json = minimal();
    json.notes = 'built in 2024';
    json.vehicle.rear = { kind: 'pair', trackMm: 700 };
    json.vehicle.bodyOutline = [
      { x: 300, y: 0 },
      { x: -1200, y: -350 },
      { x: -1200, y: 350 },
    ];
    json.tolerances = { toeErrorDeg: 0.5 };
    json.parts = { tieRodRadiusMm: 5 };
    json.spring = { on: 'lower', frameMount: { x: -20, y: -100, z: 450 }, armMount: { x: -20, y: -250, z: 190 } };
    json.steering.input = {
      kind: 'dragLink',
      columnPivot: { x: 200, y: 0, z: 500 },
      columnAxis: { x: -0.3, y: 0, z: 1 },
      columnArmJoint: { x: 200, y: -50, z: 450 },
      crankArmJoint: { x: -40, y: -50, z: 250 },
    };
    const result = validateDesign(json);
    expect(result.ok ? [] : result.issues).toEqual([]);
  });
});

describe('validateDesign: each kind of bad input names the exact path', () => {
  const cases: { what: string; mutate: (d: Doc) => void; path: string; message?: string; contains?: string[] }[] = [
    {
      what: 'a string where a number in mm is expected',
      mutate: (d) => (d.frontEnd.lower.outerJoint.z = '12a'),
      path: 'frontEnd.lower.outerJoint.z',
      message: 'frontEnd.lower.outerJoint.z: expected a finite number in mm, found "12a"',
    },
    {
      what: 'a component of an explicit side',
      mutate: (d) => (d.frontEnd.upper.outerJoint = { right: { x: -15, y: -330, z: 330 }, left: { x: -15, y: 330, z: null } }),
      path: 'frontEnd.upper.outerJoint.left.z',
      message: 'frontEnd.upper.outerJoint.left.z: expected a finite number in mm, found null',
    },
    {
      what: 'a missing side',
      mutate: (d) => (d.upright.staticToeDeg = { right: 0.5 }),
      path: 'upright.staticToeDeg.left',
      contains: ['required field missing', 'in degrees'],
    },
    {
      what: 'an array element',
      mutate: (d) => (d.vehicle.bodyOutline = [{ x: 1, y: 0 }, { x: 0, y: 1 }, { x: 'a', y: 0 }]),
      path: 'vehicle.bodyOutline[2].x',
      message: 'vehicle.bodyOutline[2].x: expected a finite number in mm, found "a"',
    },
    {
      what: 'a too short outline',
      mutate: (d) => (d.vehicle.bodyOutline = [{ x: 1, y: 0 }, { x: 0, y: 1 }]),
      path: 'vehicle.bodyOutline',
      message: 'vehicle.bodyOutline: expected a list of at least 3 items, found a list of 2',
    },
    {
      what: 'a number out of range',
      mutate: (d) => (d.vehicle.wheelbaseMm = 200),
      path: 'vehicle.wheelbaseMm',
      message: 'vehicle.wheelbaseMm: expected a number in mm from 300 to 5000, found 200',
    },
    {
      what: 'an open interval bound',
      mutate: (d) => (d.joints.upperOuter.ratedDeg = 90),
      path: 'joints.upperOuter.ratedDeg',
      message: 'joints.upperOuter.ratedDeg: expected a number in degrees greater than 0 and less than 90, found 90',
    },
    { what: 'lean above 60', mutate: (d) => (d.envelope.leanDeg = 61), path: 'envelope.leanDeg', contains: ['from 0 to 60', 'found 61'] },
    { what: 'negative handlebar lock', mutate: (d) => (d.envelope.handlebarDeg = -1), path: 'envelope.handlebarDeg', contains: ['from 0 to 180'] },
    { what: 'bump above 500', mutate: (d) => (d.envelope.bumpMm = 501), path: 'envelope.bumpMm', contains: ['from 0 to 500'] },
    { what: 'rebound below 0', mutate: (d) => (d.envelope.reboundMm = -5), path: 'envelope.reboundMm' },
    { what: 'a zero radius', mutate: (d) => (d.wheels.rear.rollingRadiusMm = 0), path: 'wheels.rear.rollingRadiusMm', contains: ['greater than 0'] },
    { what: 'a zero crown radius', mutate: (d) => (d.wheels.front.crownRadiusMm = 0), path: 'wheels.front.crownRadiusMm' },
    { what: 'a zero tolerance', mutate: (d) => (d.tolerances = { toeErrorDeg: 0 }), path: 'tolerances.toeErrorDeg', contains: ['greater than 0'] },
    { what: 'a negative part size', mutate: (d) => (d.parts = { tieRodRadiusMm: -1 }), path: 'parts.tieRodRadiusMm' },
    { what: 'a zero rear track', mutate: (d) => (d.vehicle.rear = { kind: 'pair', trackMm: 0 }), path: 'vehicle.rear.trackMm' },
    {
      what: 'a variant field missing',
      mutate: (d) => (d.vehicle.rear = { kind: 'pair' }),
      path: 'vehicle.rear.trackMm',
      message: 'vehicle.rear.trackMm: required field missing; expected a finite number in mm greater than 0',
    },
    {
      what: 'a zero steering ratio',
      mutate: (d) => (d.steering.input.crankDegPerHandlebarDeg = 0),
      path: 'steering.input.crankDegPerHandlebarDeg',
      contains: ['not 0'],
    },
    {
      what: 'a missing required field',
      mutate: (d) => delete d.envelope.bumpMm,
      path: 'envelope.bumpMm',
      message: 'envelope.bumpMm: required field missing; expected a finite number in mm from 0 to 500',
    },
    {
      what: 'an unknown field',
      mutate: (d) => (d.vehicle.colour = 'red'),
      path: 'vehicle.colour',
      message: 'vehicle.colour: unknown field',
    },
    {
      what: 'an unknown field inside a point',
      mutate: (d) => (d.upright.wheelCentre.w = 1),
      path: 'upright.wheelCentre.w',
    },
    {
      what: 'a wrong format literal',
      mutate: (d) => (d.tiltsheet = '1'),
      path: 'tiltsheet',
      message: 'tiltsheet: expected 1, found "1"',
    },
    {
      what: 'an unknown union kind',
      mutate: (d) => (d.steering.kind = 'wheel'),
      path: 'steering.kind',
      message: 'steering.kind: expected one of "bellCrank", "rack", "direct", "trackRod", found "wheel"',
    },
    { what: 'a missing union kind', mutate: (d) => delete d.frontEnd.kind, path: 'frontEnd.kind', contains: ['"splitWishbones", "centrePivot"'] },
    { what: 'a bad enum value', mutate: (d) => (d.joints.tieRodOuter.kind = 'heimJoint'), path: 'joints.tieRodOuter.kind', contains: ['"ballJoint", "rodEnd"'] },
    { what: 'a zero direction', mutate: (d) => (d.steering.axis = { x: 0, y: 0, z: 0 }), path: 'steering.axis', contains: ['nonzero length'] },
    {
      what: 'a zero direction on one side of a sided direction',
      mutate: (d) => (d.joints.tieRodInner.studAxis = { right: { x: 0, y: 0, z: 1 }, left: { x: 0, y: 0, z: 0 } }),
      path: 'joints.tieRodInner.studAxis.left',
    },
    {
      what: 'a point too far from the origin',
      mutate: (d) => (d.steering.pivot = { x: 15000, y: 0, z: 15000 }),
      path: 'steering.pivot',
      message: 'steering.pivot: expected a length of at most 20000 mm, found 21213.203 mm',
    },
    {
      what: 'a single (mirrored) right-side point with y > 0',
      mutate: (d) => (d.frontEnd.upper.outerJoint.y = 330),
      path: 'frontEnd.upper.outerJoint.y',
      contains: ['found 330', 'a single value is the right side (y <= 0)', '{ right, left }'],
    },
    { what: 'an empty name', mutate: (d) => (d.name = ''), path: 'name', contains: ['non-empty string'] },
    { what: 'a boolean as text', mutate: (d) => (d.vehicle.tilting = 'yes'), path: 'vehicle.tilting', message: 'vehicle.tilting: expected true or false, found "yes"' },
    { what: 'a section of the wrong type', mutate: (d) => (d.envelope = [1, 2]), path: 'envelope', message: 'envelope: expected an object, found a list of 2' },
    { what: 'NaN from a JavaScript caller', mutate: (d) => (d.wheels.front.tyreWidthMm = NaN), path: 'wheels.front.tyreWidthMm', contains: ['finite', 'found NaN'] },
    { what: 'Infinity from a JavaScript caller', mutate: (d) => (d.upright.wheelCentre.x = Infinity), path: 'upright.wheelCentre.x', contains: ['found Infinity'] },
  ];

  for (const c of cases) {
    it(c.what, () => {
      const json = minimal();
      c.mutate(json);
      const issues = issuesOf(json);
      expect(issues.map((i) => i.path)).toEqual([c.path]);
      if (c.message) expect(issues[0].message).toBe(c.message);
      for (const part of c.contains ?? []) expect(issues[0].message).toContain(part);
    });
  }

  it('suggests the intended name for a misspelt field', () => {
    const json = minimal();
    json.vehicle.wheelbase = json.vehicle.wheelbaseMm;
    delete json.vehicle.wheelbaseMm;
    const issues = issuesOf(json);
    expect(issues.map((i) => i.message)).toEqual([
      'vehicle.wheelbaseMm: required field missing; expected a finite number in mm from 300 to 5000',
      'vehicle.wheelbase: unknown field (did you mean "wheelbaseMm"?)',
    ]);
  });

  it('reports a document that is not an object at the top level', () => {
    const issues = issuesOf([]);
    expect(issues).toEqual([{ path: '', message: '(document): expected an object, found a list of 0', expected: 'an object', found: 'a list of 0' }]);
  });

  it('gives expected and found separately for tools', () => {
    const json = minimal();
    json.vehicle.wheelbaseMm = 200;
    expect(issuesOf(json)[0]).toMatchObject({ expected: 'a number in mm from 300 to 5000', found: '200' });
  });

  it('prefixes every message with the source name', () => {
    const json = minimal();
    json.vehicle.wheelbaseMm = 'long';
    json.name = 3;
    const issues = issuesOf(json, 'trike.tiltsheet');
    expect(issues).toHaveLength(2);
    for (const issue of issues) expect(issue.message.startsWith(`trike.tiltsheet: ${issue.path}: `)).toBe(true);
  });
});

describe('validateDesign: collects all issues', () => {
  it('reports every problem in one pass, in document order', () => {
    const json = minimal();
    json.name = '';
    json.vehicle.wheelbaseMm = 100;
    json.frontEnd.upper.rearPivot.x = 'x';
    json.frontEnd.lower.outerJoint.z = '12a';
    json.vehicle.bodyOutline = [{ x: 0, y: 0 }, { x: 1, y: 1 }, { x: 2 }];
    json.joints.lowerOuter.ratedDeg = -3;
    json.envelope.extra = true;
    expect(pathsOf(json)).toEqual([
      'name',
      'vehicle.wheelbaseMm',
      'vehicle.bodyOutline[2].y',
      'frontEnd.upper.rearPivot.x',
      'frontEnd.lower.outerJoint.z',
      'joints.lowerOuter.ratedDeg',
      'envelope.extra',
    ]);
  });

  it('collects several checks across fields together', () => {
    const json = minimal();
    json.frontEnd.upper.rearPivot = { ...json.frontEnd.upper.frontPivot, x: 60.4 };
    json.wheels.front.crownRadiusMm = 300;
    json.vehicle.tilting = false;
    expect(pathsOf(json)).toEqual(['frontEnd.upper.rearPivot', 'wheels.front.crownRadiusMm', 'envelope.leanDeg']);
  });
});

describe('validateDesign: checks across fields', () => {
  it('refuses coincident inner pivots of a wishbone, once for a mirrored value', () => {
    const json = minimal();
    json.frontEnd.upper.rearPivot = { x: 60, y: -120.5, z: 340 };
    const issues = issuesOf(json);
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe('frontEnd.upper.rearPivot');
    expect(issues[0].message).toBe(
      'frontEnd.upper.rearPivot: is 0.5 mm from frontEnd.upper.frontPivot; the two inner pivots define the wishbone pivot axis, so they must be at least 1 mm apart',
    );
  });

  it('names the side when only one explicit side is wrong', () => {
    const json = minimal();
    json.frontEnd.lower.rearPivot = { right: { x: -65, y: -110, z: 180 }, left: { x: 85, y: 110, z: 180.2 } };
    expect(pathsOf(json)).toEqual(['frontEnd.lower.rearPivot.left']);
  });

  it('says which side when a mirrored value fails on one side only', () => {
    const json = minimal();
    // Crank pivot off the centre line: the mirrored left joint lands on the pivot axis, the right does not.
    json.steering.pivot.y = 10;
    json.steering.tieRodJoint = { x: -40, y: -10, z: 100 };
    expect(issuesOf(json).map((i) => i.message)).toEqual([
      'steering.tieRodJoint: on the left side, is 0 mm from the line through steering.pivot and steering.axis; ' +
        'a joint on the pivot axis does not move when the crank turns, so it must be at least 1 mm off that line',
    ]);
  });

  it('refuses coincident upper and lower outer joints', () => {
    const json = minimal();
    json.frontEnd.upper.outerJoint = { x: 10, y: -345, z: 180.5 };
    expect(pathsOf(json)).toContain('frontEnd.lower.outerJoint');
    expect(issuesOf(json).find((i) => i.path === 'frontEnd.lower.outerJoint')?.message).toContain('define the steering axis');
  });

  it('refuses an outer joint on the wishbone pivot axis', () => {
    const json = minimal();
    json.frontEnd.upper.outerJoint = { x: -300, y: -120, z: 340 };
    expect(pathsOf(json)).toContain('frontEnd.upper.outerJoint');
  });

  it('refuses a steering arm joint on the steering axis', () => {
    const json = minimal();
    // Midway between the outer joints (-15,-330,330) and (10,-345,180).
    json.upright.steeringArmJoint = { x: -2.5, y: -337.5, z: 255 };
    expect(pathsOf(json)).toEqual(['upright.steeringArmJoint']);
    expect(issuesOf(json)[0].message).toContain('the line through frontEnd.upper.outerJoint and frontEnd.lower.outerJoint');
  });

  it('refuses a tie rod of zero length', () => {
    const json = minimal();
    json.steering.tieRodJoint = { x: -80, y: -313, z: 220.3 };
    expect(pathsOf(json)).toEqual(['steering.tieRodJoint']);
  });

  it('refuses a crank joint on the crank pivot axis', () => {
    const json = minimal();
    json.steering.tieRodJoint = { x: -40, y: 0, z: 100 };
    expect(pathsOf(json)).toEqual(['steering.tieRodJoint']);
    expect(issuesOf(json)[0].message).toContain('steering.pivot and steering.axis');
  });

  it('refuses a wheel centre at or below the ground, naming the side and component', () => {
    const json = minimal();
    json.upright.wheelCentre = { x: 0, y: -400, z: 0 };
    expect(pathsOf(json)).toEqual(['upright.wheelCentre.z']);
    json.upright.wheelCentre = { right: { x: 0, y: -400, z: 250 }, left: { x: 0, y: 400, z: -10 } };
    expect(issuesOf(json)).toMatchObject([{ path: 'upright.wheelCentre.left.z', found: '-10' }]);
  });

  it('refuses a steering axis nearly parallel to the wheel spin axis', () => {
    const json = minimal();
    // Upper joint 100 mm outboard of the lower one and 5 mm higher: the axis is ~3 degrees off the y axis.
    json.frontEnd.upper.outerJoint = { x: 10, y: -245, z: 185 };
    const issues = issuesOf(json);
    expect(issues.map((i) => i.path)).toEqual(['frontEnd.upper.outerJoint']);
    expect(issues[0].message).toContain("from the wheel's spin axis");
    expect(issues[0].found).toBe('2.862°');
  });

  it('refuses a crown radius larger than the rolling radius', () => {
    const json = minimal();
    json.wheels.rear.crownRadiusMm = 331;
    expect(issuesOf(json)).toMatchObject([{ path: 'wheels.rear.crownRadiusMm', found: '331' }]);
  });

  it('refuses a lean envelope on a non-tilting vehicle', () => {
    const json = minimal();
    json.vehicle.tilting = false;
    expect(pathsOf(json)).toEqual(['envelope.leanDeg']);
    json.envelope.leanDeg = 0;
    expect(validateDesign(json).ok).toBe(true);
  });

  it('checks the drag link and the spring mounts', () => {
    const json = minimal();
    json.steering.input = {
      kind: 'dragLink',
      columnPivot: { x: 200, y: 0, z: 500 },
      columnAxis: { x: 0, y: 0, z: 1 },
      columnArmJoint: { x: 200, y: 0, z: 450 },
      crankArmJoint: { x: 200, y: 0.2, z: 450 },
    };
    json.spring = { on: 'lower', frameMount: { x: -20, y: -100, z: 450 }, armMount: { x: -20, y: -100, z: 450 } };
    expect(pathsOf(json)).toEqual([
      'steering.input.crankArmJoint',
      'steering.input.columnArmJoint',
      'spring.armMount',
    ]);
  });

  describe('centre-pivot front end', () => {
    function centrePivot(): Doc {
      const json = minimal();
      json.frontEnd = {
        kind: 'centrePivot',
        upper: { pivot: { x: 0, y: 0, z: 340 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: -15, y: -330, z: 330 } },
        lower: { pivot: { x: 0, y: 0, z: 180 }, pivotAxis: { x: 1, y: 0, z: 0 }, outerJoint: { x: 10, y: -345, z: 180 } },
      };
      return json;
    }

    it('accepts a plausible layout', () => {
      const result = validateDesign(centrePivot());
      expect(result.ok ? [] : result.issues).toEqual([]);
    });

    it('refuses a pivot off the centre line', () => {
      const json = centrePivot();
      json.frontEnd.lower.pivot.y = 1.5;
      expect(issuesOf(json)).toMatchObject([{ path: 'frontEnd.lower.pivot.y', found: '1.5' }]);
      json.frontEnd.lower.pivot.y = -0.9;
      expect(validateDesign(json).ok).toBe(true);
    });

    it('refuses coincident pivots of the two members', () => {
      const json = centrePivot();
      json.frontEnd.lower.pivot = { x: 0, y: 0, z: 339.5 };
      expect(pathsOf(json)).toEqual(['frontEnd.lower.pivot']);
    });
  });

  it('runs only on structurally valid designs (the schema issues come alone)', () => {
    const json = minimal();
    json.frontEnd.upper.rearPivot = json.frontEnd.upper.frontPivot; // coincident...
    json.vehicle.wheelbaseMm = 1; // ...but the structure is wrong too
    expect(pathsOf(json)).toEqual(['vehicle.wheelbaseMm']);
  });

  it('finds nothing on the fixture', () => {
    expect(checkAcrossFields(minimal() as DesignFile)).toEqual([]);
  });
});

describe('spinAxis', () => {
  const close = (a: { x: number; y: number; z: number }, b: { x: number; y: number; z: number }) => {
    expect(a.x).toBeCloseTo(b.x, 12);
    expect(a.y).toBeCloseTo(b.y, 12);
    expect(a.z).toBeCloseTo(b.z, 12);
  };

  it('points outward along y for zero toe and camber', () => {
    close(spinAxis('right', 0, 0), { x: 0, y: -1, z: 0 });
    close(spinAxis('left', 0, 0), { x: 0, y: 1, z: 0 });
  });

  it('tips its outer end down with positive (top-out) camber', () => {
    const s = Math.sin((10 * Math.PI) / 180);
    const c = Math.cos((10 * Math.PI) / 180);
    close(spinAxis('right', 0, 10), { x: 0, y: -c, z: -s });
    close(spinAxis('left', 0, 10), { x: 0, y: c, z: -s });
  });

  it('stays perpendicular to the heading; toe-in turns the fronts toward the centre line', () => {
    const toe = 2;
    const t = (toe * Math.PI) / 180;
    // Right wheel heading with toe-in points to +y (the centre line), left to -y.
    const headingRight = { x: Math.cos(t), y: Math.sin(t), z: 0 };
    const headingLeft = { x: Math.cos(t), y: -Math.sin(t), z: 0 };
    const r = spinAxis('right', toe, 3);
    const l = spinAxis('left', toe, 3);
    expect(r.x * headingRight.x + r.y * headingRight.y).toBeCloseTo(0, 12);
    expect(l.x * headingLeft.x + l.y * headingLeft.y).toBeCloseTo(0, 12);
    close(l, { x: r.x, y: -r.y, z: r.z }); // mirror images
    expect(Math.hypot(r.x, r.y, r.z)).toBeCloseTo(1, 12);
  });
});
