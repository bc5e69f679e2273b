// "First exceeded at": for each joint of the check, the grid pose nearest the design pose where
// it is over its rating minus margin. Checked independently of the check's accumulator: every
// grid pose solved afresh by a pose engine of its own, the articulation judged with the same
// rule (rating minus the design's margin; tolerance.ts), and the nearest over pose found by
// brute force with the nearness written out here (largest of |input| / envelope).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseDesignText } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { checkDesign } from '../../../core/analysis/designCheck';
import { PoseEngine } from '../../../core/analysis/PoseEngine';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';

function load(name: string) {
  const p = parseDesignText(readFileSync(`assets/designs/${name}.tiltsheet`, 'utf8'), name);
  if (!p.ok) throw new Error('bad demo');
  return resolveDesign(p.design);
}

describe('first exceeded at', () => {
  it('is, for each joint over its limit somewhere, the over pose nearest the design pose (brute force)', () => {
    const d = load('heron-tilting-velomobile');
    const steps = { leanDeg: 5, handlebarDeg: 10, travelMm: 20 };
    const check = checkDesign(d, { steps });
    const engine = new PoseEngine(d, { contact: 'ground', steerBy: 'handlebar' }, { findings: false });
    const e = d.envelope;
    const near = (l: number, h: number, t: number) => Math.max(e.leanDeg > 0 ? Math.abs(l) / e.leanDeg : 0, Math.abs(h) / e.handlebarDeg, t === 0 ? 0 : Math.abs(t) / (t > 0 ? e.bumpMm : e.reboundMm));
    const joints = check.full.items.filter((i) => i.group === 'joint');
    const overJoints = joints.filter((i) => i.firstOver !== null);
    // The teaching example's outer ball joints are over at full lean (its notes say so).
    expect(overJoints.length).toBeGreaterThan(0);
    for (const item of joints) {
      const [, name, side] = item.id.split('.') as [string, keyof typeof d.joints, 'left' | 'right'];
      const limit = d.joints[name].ratedDeg - d.tolerances.jointMarginDeg;
      let best: { n: number; where: { leanDeg: number; handlebarDeg: number; travelMm: number } } | null = null;
      for (const leanDeg of check.axes.leanDeg) {
        for (const handlebarDeg of check.axes.handlebarDeg) {
          for (const travelMm of check.axes.travelMm) {
            const r = engine.solve({ ...zeroInputs(), leanDeg, handlebarDeg, heaveMm: -travelMm }, { relatives: false });
            const j = r.analysis?.joints.find((x) => x.joint === name && x.side === side);
            if (!j || j.articulationDeg <= limit) continue;
            const n = near(leanDeg, handlebarDeg, travelMm);
            if (!best || n < best.n - 1e-9) best = { n, where: { leanDeg, handlebarDeg, travelMm } };
          }
        }
      }
      if (best === null) expect(item.firstOver, item.id).toBeNull();
      else {
        expect(item.firstOver, item.id).not.toBeNull();
        expect(near(item.firstOver!.leanDeg, item.firstOver!.handlebarDeg, item.firstOver!.travelMm), item.id).toBeCloseTo(best.n, 9);
      }
    }
  }, 120_000);

  it('is absent for a design inside every limit (negative control)', () => {
    const check = checkDesign(load('wren-rack-trike'), { steps: { handlebarDeg: 10, travelMm: 20 } });
    for (const item of check.operating.items) expect(item.firstOver, item.id).toBeNull();
  }, 60_000);
});
