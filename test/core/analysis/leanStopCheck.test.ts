/**
 * The lean stops as a check item (tiltbench check): the rocker angle's magnitude over the
 * envelope against the stop, with where it is worst and where it is first exceeded; the worst
 * value equals the rocker angle of an independent solve at that pose, a stop set below it is
 * exceeded (the negative control), and a design without a lean linkage has no such item.
 */
import { describe, expect, it } from 'vitest';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { checkDesign, judgeLeanStop, LEAN_STOP_ID } from '../../../core/analysis/designCheck';
import { buildMechanism } from '../../../core/mechanism/templates/buildMechanism';
import { LEAN_IDS } from '../../../core/mechanism/templates/leanLinkage';
import { zeroInputs } from '../../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../../core/solver/PoseSolver';
import { pipitDoc } from '../mechanism/pipitDemo';
import { demo } from './helpers';

const STEPS = { leanDeg: 5, handlebarDeg: 5, travelMm: 5 };

describe('lean stop check item', () => {
  it('judges the rocker against its stops over the envelope; the worst is the rocker angle solved there', () => {
    const design = resolveDesign(pipitDoc());
    const c = checkDesign(design, { judged: 'full', steps: STEPS });
    const item = c.full.items.find((i) => i.id === LEAN_STOP_ID)!;
    expect(item.verdict).toBe('within');
    expect(item.firstOver).toBeNull();
    const w = item.where!;
    const solver = new PoseSolver(buildMechanism(design));
    expect(solver.solve({ ...zeroInputs(), leanDeg: w.leanDeg, handlebarDeg: w.handlebarDeg, heaveMm: -w.travelMm }).reached).toBe(true);
    const rocker = solver.mechanism.coord[solver.mechanism.graph.bodies.findIndex((b) => b.id === LEAN_IDS.rocker)] * (180 / Math.PI);
    expect(item.worst!).toBeCloseTo(Math.abs(rocker), 9);
    expect(Math.abs(w.leanDeg)).toBe(design.envelope.leanDeg);
    expect(item.detail).toBe(`margin ${(30 - item.worst!).toFixed(1)} deg`);
  });

  it('a stop below the rocker angle the envelope needs is exceeded, first at a smaller lean (negative control)', () => {
    const doc = pipitDoc();
    doc.leanLinkage!.rocker.stopDeg = 15;
    const c = checkDesign(resolveDesign(doc), { judged: 'full', steps: STEPS });
    const item = c.full.items.find((i) => i.id === LEAN_STOP_ID)!;
    expect(item.verdict).toBe('over');
    expect(item.detail).toMatch(/past its stop/);
    expect(Math.abs(item.firstOver!.leanDeg)).toBeGreaterThan(0);
    expect(Math.abs(item.firstOver!.leanDeg)).toBeLessThan(25);
    expect(c.full.passed).toBe(false);
  });

  it('verdict words: over past the stop, close from 80 % of it; none for a design without a lean linkage', () => {
    expect(judgeLeanStop(30.01, 30)).toBe('over');
    expect(judgeLeanStop(24, 30)).toBe('close');
    expect(judgeLeanStop(23.9, 30)).toBe('within');
    const c = checkDesign(demo('heron-tilting-velomobile'), { judged: 'full', steps: { leanDeg: 25, handlebarDeg: 25, travelMm: 40 } });
    expect(c.full.items.some((i) => i.id === LEAN_STOP_ID)).toBe(false);
  });
});
