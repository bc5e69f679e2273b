// A tune plan never lets a mirrored point cross the centre line. A point written for the right
// side (y < 0) and mirrored to the left is refused by the validator once its y reaches the other
// side; a plan whose inward range is longer than the point's distance to y = 0 could otherwise
// let the optimiser write a design that `tiltbench validate` refuses (found tuning a demo).
// The check is the validator itself (core/design/validateDesign.ts), not the plan's arithmetic.
import { describe, it, expect } from 'vitest';
import { demoDoc } from '../analysis/helpers';
import { readTunePlan, TunePlanError } from '../../../core/studies/tunePlan';
import { applyTuneOffsets } from '../../../core/studies/tuneVariables';
import { validateDesign } from '../../../core/design/validateDesign';
import type { DesignFile } from '../../../core/design/types';

function plan(file: DesignFile, rangeMm: [number, number]) {
  return readTunePlan({ variables: [{ id: 'steering.tieRodJoint:y', rangeMm }], objectives: [{ measure: 'selfSteer' }] }, file);
}

describe('tune ranges stop short of the centre line', () => {
  // The Swift's steering lever carries its tie-rod joints 5.5 mm either side of the centre line.
  const file = demoDoc('swift-parallelogram-trike') as unknown as DesignFile;

  it('limits the inward end of the range to 1 mm short of the centre line and says so', () => {
    const { variables } = plan(file, [-20, 10]);
    const v = variables[0];
    expect(v.lo).toBeCloseTo(-4.5, 9);
    expect(v.hi).toBe(10);
    expect(v.words).toMatch(/inward at most 4\.5 mm: the centre line/);
    // The design at the limited end is valid, its right joint still on the right side.
    const moved = applyTuneOffsets(file, variables, [v.lo]);
    expect(validateDesign(moved).ok).toBe(true);
    const s = moved.steering as { tieRodJoint: { y: number } };
    expect(s.tieRodJoint.y).toBeCloseTo(-1, 9);
  });

  it('the range as given would have crossed it: the validator refuses that design (negative control)', () => {
    const { variables } = plan(file, [-20, 10]);
    const crossed = applyTuneOffsets(file, variables, [-20]);
    expect(validateDesign(crossed).ok).toBe(false);
  });

  it('leaves a range that stays on its side as given', () => {
    const { variables } = plan(file, [-3, 10]);
    expect(variables[0].lo).toBe(-3);
    expect(variables[0].words).not.toMatch(/centre line/);
  });

  it('refuses an inward-only range for a point too close to the centre line to move inward', () => {
    const near = JSON.parse(JSON.stringify(file)) as DesignFile;
    (near.steering as { tieRodJoint: { y: number } }).tieRodJoint.y = -0.6;
    expect(() => readTunePlan({ variables: [{ id: 'steering.tieRodJoint:y', rangeMm: [-5, 0] }], objectives: [{ measure: 'selfSteer' }] }, near)).toThrow(TunePlanError);
  });
});
