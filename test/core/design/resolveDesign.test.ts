import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, it, expect } from 'vitest';
import { compactPoint, resolveDesign, unresolveDesign } from '../../../core/design/resolveDesign';
import { validateDesign } from '../../../core/design/validateDesign';
import { DEFAULT_PART_SIZES, DEFAULT_TOLERANCES, type DesignFile, type ResolvedDesign } from '../../../core/design/types';

/** Tests write wrong types into documents on purpose, so documents are loosely typed here. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Doc = any;

const FIXTURE_TEXT = readFileSync(new URL('../../fixtures/minimal.tiltsheet', import.meta.url), 'utf8');

function minimal(): DesignFile {
  return JSON.parse(FIXTURE_TEXT);
}

/** Every optional section and every kind of sided value. */
function full(): DesignFile {
  const d: Doc = minimal();
  d.notes = 'second prototype';
  d.vehicle.rear = { kind: 'pair', trackMm: 700 };
  d.vehicle.bodyOutline = [
    { x: 300, y: 0 },
    { x: -1200, y: -350 },
    { x: -1200, y: 350 },
  ];
  d.upright.staticToeDeg = { right: 0.5, left: 0.25 };
  d.upright.staticCamberDeg = 1;
  d.frontEnd.lower.outerJoint = { right: { x: 10, y: -345, z: 180 }, left: { x: 12, y: 345, z: 180 } };
  d.joints.upperOuter.studAxis = { x: 0.1, y: -0.2, z: 1 };
  d.tolerances = { selfSteerDeg: 0.5, clearanceMm: DEFAULT_TOLERANCES.clearanceMm + 5 };
  d.riding = { maxKmh: 35, gripG: 0.7 };
  d.parts = { tieRodRadiusMm: 5 };
  d.spring = { on: 'lower', frameMount: { x: -20, y: -100, z: 450 }, armMount: { right: { x: -20, y: -250, z: 190 }, left: { x: -20, y: 255, z: 190 } } };
  d.steering.input = {
    kind: 'dragLink',
    columnPivot: { x: 200, y: 0, z: 500 },
    columnAxis: { x: -0.3, y: 0, z: 1 },
    columnArmJoint: { x: 200, y: -50, z: 450 },
    crankArmJoint: { x: -40, y: -50, z: 250 },
  };
  return d;
}

describe('resolveDesign', () => {
  it('mirrors single points to the left (y -> -y) and keeps the right as written', () => {
    const r = resolveDesign(minimal());
    if (r.frontEnd.kind !== 'splitWishbones') throw new Error('fixture is split wishbones');
    expect(r.frontEnd.upper.outerJoint).toEqual({ right: { x: -15, y: -330, z: 330 }, left: { x: -15, y: 330, z: 330 } });
    expect(r.frontEnd.lower.frontPivot).toEqual({ right: { x: 85, y: -110, z: 180 }, left: { x: 85, y: 110, z: 180 } });
    expect(r.upright.wheelCentre).toEqual({ right: { x: 0, y: -400, z: 250 }, left: { x: 0, y: 400, z: 250 } });
    expect(r.steering.kind === 'trackRod' ? null : r.steering.tieRodJoint).toEqual({ right: { x: -80, y: -60, z: 250 }, left: { x: -80, y: 60, z: 250 } });
  });

  it('mirrors directions the same way and never produces -0', () => {
    const r = resolveDesign(full());
    expect(r.joints.upperOuter.studAxis).toEqual({ right: { x: 0.1, y: -0.2, z: 1 }, left: { x: 0.1, y: 0.2, z: 1 } });
    expect(Object.is(r.joints.lowerOuter.studAxis.left.y, 0)).toBe(true);
  });

  it('copies per-side numbers unchanged and keeps explicit sides as given', () => {
    const r = resolveDesign(full());
    expect(r.upright.staticCamberDeg).toEqual({ right: 1, left: 1 });
    expect(r.upright.staticToeDeg).toEqual({ right: 0.5, left: 0.25 });
    expect(r.frontEnd.lower.outerJoint).toEqual({ right: { x: 10, y: -345, z: 180 }, left: { x: 12, y: 345, z: 180 } });
    expect(r.spring?.armMount).toEqual({ right: { x: -20, y: -250, z: 190 }, left: { x: -20, y: 255, z: 190 } });
  });

  it('applies the default tolerances, part sizes and notes', () => {
    const r = resolveDesign(minimal());
    expect(r.tolerances).toEqual(DEFAULT_TOLERANCES);
    expect(r.parts).toEqual(DEFAULT_PART_SIZES);
    expect(r.notes).toBe('');
    expect(r.spring).toBeUndefined();
  });

  it('fills only the missing tolerances and part sizes', () => {
    const r = resolveDesign(full());
    expect(r.tolerances).toEqual({ ...DEFAULT_TOLERANCES, selfSteerDeg: 0.5, clearanceMm: DEFAULT_TOLERANCES.clearanceMm + 5 });
    expect(r.parts).toEqual({ ...DEFAULT_PART_SIZES, tieRodRadiusMm: 5 });
    expect(r.notes).toBe('second prototype');
  });

  it('reads the older tolerance name toeErrorDeg as selfSteerDeg, unless selfSteerDeg is given too', () => {
    const d = minimal();
    d.tolerances = { toeErrorDeg: 0.4 };
    expect(resolveDesign(d).tolerances.selfSteerDeg).toBe(0.4);
    d.tolerances = { toeErrorDeg: 0.4, selfSteerDeg: 0.3 };
    expect(resolveDesign(d).tolerances.selfSteerDeg).toBe(0.3);
  });

  it('shares no objects with the file, so editing one leaves the other alone', () => {
    const d = full();
    const r = resolveDesign(d);
    r.upright.wheelCentre.right.x = 99;
    r.vehicle.bodyOutline![0].x = 99;
    r.wheels.front.tyreWidthMm = 99;
    r.envelope.leanDeg = 1;
    expect(d).toEqual(full());
  });
});

describe('unresolveDesign', () => {
  it('round-trips the minimal fixture exactly, writing mirrored sides as single values', () => {
    expect(unresolveDesign(resolveDesign(minimal()))).toEqual(minimal());
  });

  it('round-trips a design that uses every option exactly', () => {
    expect(unresolveDesign(resolveDesign(full()))).toEqual(full());
  });

  it('writes { right, left } only where the sides differ', () => {
    const r = resolveDesign(minimal());
    r.upright.wheelCentre.left = { x: 0, y: 401, z: 250 };
    r.upright.staticToeDeg.left = 0.1;
    const d = unresolveDesign(r);
    expect(d.upright.wheelCentre).toEqual({ right: { x: 0, y: -400, z: 250 }, left: { x: 0, y: 401, z: 250 } });
    expect(d.upright.staticToeDeg).toEqual({ right: 0, left: 0.1 });
    expect(d.upright.steeringArmJoint).toEqual({ x: -80, y: -313, z: 220 });
    expect(resolveDesign(d)).toEqual(r);
  });

  it('keeps a mirrored pair two-sided when the right point has y > 0, since the file refuses that as a single value', () => {
    const p = { right: { x: -80, y: 5, z: 250 }, left: { x: -80, y: -5, z: 250 } };
    expect(compactPoint(p)).toEqual(p);
    const r = resolveDesign(minimal());
    if (r.steering.kind !== 'trackRod') r.steering.tieRodJoint = p;
    const d = unresolveDesign(r);
    expect(validateDesign(d).ok).toBe(true);
    expect(resolveDesign(d)).toEqual(r);
  });

  it('leaves out tolerances and parts equal to the defaults', () => {
    const r = resolveDesign(full());
    r.tolerances = { ...DEFAULT_TOLERANCES };
    r.parts = { ...DEFAULT_PART_SIZES, steeringArmRadiusMm: 12 };
    const d = unresolveDesign(r);
    expect(d.tolerances).toBeUndefined();
    expect(d.parts).toEqual({ steeringArmRadiusMm: 12 });
  });

  it('inverts resolveDesign for any side values (property test)', () => {
    // -0 and 0 are the same coordinate; the file cannot even write -0 back (JSON prints it as 0).
    const coordinate = fc
      .oneof(fc.integer({ min: -2000, max: 2000 }), fc.double({ min: -2000, max: 2000, noNaN: true }))
      .map((v) => (v === 0 ? 0 : v));
    const point = fc.record({ x: coordinate, y: coordinate, z: coordinate });
    fc.assert(
      fc.property(point, point, fc.boolean(), fc.double({ min: -5, max: 5, noNaN: true }), (right, left, mirrored, toe) => {
        const r: ResolvedDesign = resolveDesign(full());
        r.upright.steeringArmJoint = mirrored ? { right, left: { x: right.x, y: right.y === 0 ? 0 : -right.y, z: right.z } } : { right, left };
        r.upright.staticToeDeg = { right: toe, left: mirrored ? toe : toe + 1 };
        expect(resolveDesign(unresolveDesign(r))).toEqual(r);
      }),
      { numRuns: 500 },
    );
  });
});

describe('test designs', () => {
  it('are valid, so the round trips above start from real files', () => {
    for (const d of [minimal(), full()]) {
      const result = validateDesign(d);
      expect(result.ok ? [] : result.issues).toEqual([]);
    }
  });
});
