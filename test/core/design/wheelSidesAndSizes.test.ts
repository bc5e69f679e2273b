/**
 * Issue 14, item 5: geometry the validator let through. A wheel centre on or across the centre
 * line (a single value at y = 0 is mirrored onto itself: both wheels in one place, which the
 * solver closed as "converged"), wheel centres closer than a tyre width, and sizes no vehicle
 * has (a rear rolling radius of 3.4e8 mm) are refused, each naming its field and the reason.
 * The bundled demos stay valid: they are real vehicles, and a rule they trip is wrong.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { SIZE_LIMITS } from '../../../core/design/crossFieldChecks';
import { validateDesign, type DesignIssue } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';

const DEMOS = ['heron-tilting-velomobile', 'swift-parallelogram-trike', 'wren-rack-trike'].map(
  (n) => JSON.parse(readFileSync(new URL(`../../../assets/designs/${n}.tiltsheet`, import.meta.url), 'utf8')) as DesignFile,
);
const heron = (): DesignFile => structuredClone(DEMOS[0]);

function issuesOf(d: DesignFile): DesignIssue[] {
  const r = validateDesign(d);
  return r.ok ? [] : r.issues;
}

describe('wheels on their own sides of the centre line', () => {
  it('accepts every demo (negative control: the rules trip no real vehicle)', () => {
    for (const d of DEMOS) expect(issuesOf(d), d.name).toEqual([]);
  });

  it('refuses a single wheel centre at y = 0, naming the field and the mirrored-onto-itself reason', () => {
    const d = heron();
    d.upright.wheelCentre = { x: 0, y: 0, z: 245 };
    const issues = issuesOf(d);
    expect(issues.map((i) => i.path)).toEqual(['upright.wheelCentre.y']);
    expect(issues[0].message).toMatch(/^upright\.wheelCentre\.y: expected a y below 0 mm .*y = 0 puts both wheels in one place.*, found 0 mm$/);
  });

  it('refuses a left wheel across the centre line, naming that side', () => {
    const d = heron();
    d.upright.wheelCentre = { right: { x: 0, y: -400, z: 245 }, left: { x: 0, y: -20, z: 245 } };
    const issues = issuesOf(d);
    expect(issues.map((i) => i.path)).toEqual(['upright.wheelCentre.left.y']);
    expect(issues[0].message).toMatch(/expected a y above 0 mm \(the left wheel left of the centre line\), found -20 mm/);
  });

  it('refuses wheel centres closer together than a tyre width (the tyres overlap at the centre line)', () => {
    const d = heron(); // 40 mm tyres
    d.upright.wheelCentre = { x: 0, y: -19, z: 245 };
    const issues = issuesOf(d);
    expect(issues.map((i) => i.path)).toEqual(['upright.wheelCentre.y']);
    expect(issues[0].message).toMatch(/at least the tyre width \(wheels\.front\.tyreWidthMm = 40 mm\) apart.*found 38 mm apart \(y 19 and -19 mm\)/);
    // At exactly the width the tyres touch but do not overlap: accepted.
    d.upright.wheelCentre = { x: 0, y: -20, z: 245 };
    expect(issuesOf(d).filter((i) => i.path.startsWith('upright.wheelCentre'))).toEqual([]);
  });
});

describe('sizes no vehicle has', () => {
  it('refuses a rear rolling radius of 3.4e8 mm, naming the field, the limit and the value', () => {
    const d = heron();
    d.wheels.rear.rollingRadiusMm = 3.4e8;
    const issues = issuesOf(d);
    expect(issues.map((i) => i.path)).toEqual(['wheels.rear.rollingRadiusMm']);
    expect(issues[0].message).toBe(
      `wheels.rear.rollingRadiusMm: expected at most ${SIZE_LIMITS.rollingRadiusMm} mm (a wheel 4 m across; a larger value is taken for a slip), found 340000000 mm`,
    );
  });

  it('refuses each open-ended size past its limit and accepts it at the limit', () => {
    const cases: [string, (d: DesignFile, v: number) => void, number][] = [
      ['wheels.front.tyreWidthMm', (d, v) => (d.wheels.front.tyreWidthMm = v), SIZE_LIMITS.tyreWidthMm],
      ['vehicle.rear.trackMm', (d, v) => (d.vehicle.rear = { kind: 'pair', trackMm: v }), SIZE_LIMITS.trackMm],
      ['parts.tieRodRadiusMm', (d, v) => (d.parts = { tieRodRadiusMm: v }), SIZE_LIMITS.partRadiusMm],
      ['tolerances.clearanceMm', (d, v) => (d.tolerances = { ...d.tolerances, clearanceMm: v }), SIZE_LIMITS.clearanceMm],
      ['tolerances.slipDeg', (d, v) => (d.tolerances = { ...d.tolerances, slipDeg: v }), SIZE_LIMITS.angleToleranceDeg],
    ];
    for (const [path, set, limit] of cases) {
      const over = heron();
      set(over, limit * 1.5);
      expect(issuesOf(over).map((i) => i.path), path).toContain(path);
      const at = heron();
      set(at, limit);
      expect(issuesOf(at).map((i) => i.path), path).not.toContain(path);
    }
  });
});
