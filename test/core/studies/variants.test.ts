// Variants side by side. The hardpoint table's distances are checked against the move the test
// made (a point moved by (dx, dy, dz) is sqrt(dx^2 + dy^2 + dz^2) away: Euclid), and the
// objectives over the poses against solveSinglePose (a fresh engine per pose, not the study's
// engine) at the same poses.
import { describe, it, expect } from 'vitest';
import { demoDoc, resolveDoc } from '../analysis/helpers';
import { compareVariants } from '../../../core/studies/variants';
import { solveSinglePose } from '../../../core/analysis/solveSinglePose';
import type { DesignFile } from '../../../core/design/types';

const swift = () => demoDoc('swift-parallelogram-trike') as DesignFile;

describe('compare variants', () => {
  const a = swift();
  const b = swift();
  b.upright.steeringArmJoint = { ...(b.upright.steeringArmJoint as { x: number; y: number; z: number }) };
  (b.upright.steeringArmJoint as { z: number }).z += 2;
  (b.upright.steeringArmJoint as { x: number }).x -= 1;
  b.joints.tieRodInner.ratedDeg = 35;
  const r = compareVariants([{ label: 'A', file: a }, { label: 'B', file: b }]);

  it('lists exactly the hardpoints that moved, with how far', () => {
    expect(r.hardpoints.map((h) => h.id).sort()).toEqual(['upright.steeringArmJoint.left', 'upright.steeringArmJoint.right']);
    for (const h of r.hardpoints) expect(h.movedMm!).toBeCloseTo(Math.hypot(2, 1), 9);
  });

  it('lists the other settings that differ', () => {
    expect(r.settings).toEqual([{ path: 'joints.tieRodInner.ratedDeg', values: ['30', '35'] }]);
  });

  it('measures every variant at the same poses, as a single-pose solve does', () => {
    const row = r.results.find((x) => x.id === 'selfSteer')!;
    [a, b].forEach((file, i) => {
      const d = resolveDoc(file);
      let worst = 0;
      for (const p of r.poses) {
        const s = solveSinglePose(d, { contact: 'ground', steerBy: 'handlebar', leanDeg: p.leanDeg, handlebarDeg: p.handlebarDeg, heaveMm: -p.travelMm, travelRightMm: 0, travelLeftMm: 0, wheelAngleDeg: 0 });
        const ss = s.report.analysis!.selfSteer;
        worst = Math.max(worst, Math.abs(ss.leftDeg!), Math.abs(ss.rightDeg!));
      }
      expect(row.values[i]!).toBeCloseTo(worst, 8);
    });
    expect(row.values[0]).not.toBeCloseTo(row.values[1]!, 3);
  });

  it('designs of different layouts: points one lacks are absent, and a vehicle that does not tilt is compared upright', () => {
    const c = compareVariants([{ label: 'swift', file: swift() }, { label: 'wren', file: demoDoc('wren-rack-trike') }]);
    expect(c.poses.every((p) => p.leanDeg === 0)).toBe(true);
    const lonely = c.hardpoints.find((h) => h.values.some((v) => v === null))!;
    expect(lonely.movedMm).toBeNull();
    expect(() => compareVariants([{ label: 'one', file: swift() }])).toThrow(/at least two/);
  });
});
