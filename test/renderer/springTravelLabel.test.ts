/**
 * The pose panel's heave input is labelled as the spring travel on a design with a lean
 * linkage (core drives the linkage's carrier with it there) and as heave elsewhere; the
 * readouts show core's rocker angle, stop margin and spring length for such a design.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DESIGN_POSE, POSE_LABELS, poseLabel } from '../../renderer/model/poseInputs';
import { PoseSession, readout } from '../../renderer/model/analysisAdapter';
import { resolveDesign } from '../../core/design/resolveDesign';
import { PoseEngine } from '../../core/analysis/PoseEngine';
import { zeroInputs } from '../../core/mechanism/MechanismGraph';
import { pipitDoc } from '../core/mechanism/pipitDemo';

describe('heave slider label', () => {
  it('says "Spring travel" for the Pipit and "Heave" once its lean linkage is removed', () => {
    const d = pipitDoc();
    expect(poseLabel('heaveMm', d).label).toBe('Spring travel');
    expect(poseLabel('heaveMm', d).hint).toMatch(/extension/);
    expect(poseLabel('leanDeg', d)).toBe(POSE_LABELS.leanDeg);
    delete d.leanLinkage;
    expect(poseLabel('heaveMm', d).label).toBe('Heave');
  });
});

describe('lean linkage readouts', () => {
  it("show core's rocker angle, stop margin and spring length for the Pipit, and none for the Heron", () => {
    const design = resolveDesign(pipitDoc());
    const o = new PoseSession(design, 'ground').solve({ ...DESIGN_POSE, leanDeg: 20 });
    const rocker = readout(o, 'rocker');
    expect(rocker).not.toBeNull();
    // The same pose solved by core alone, and its analysis's rocker angle.
    const engine = new PoseEngine(design, { contact: 'ground', steerBy: 'handlebar' });
    const core = engine.solve({ ...zeroInputs(), leanDeg: 20 }).analysis!.leanLinkage!;
    expect(rocker!).toBeCloseTo(core.rockerDeg, 9);
    expect(readout(o, 'leanStopMargin')!).toBeCloseTo(30 - Math.abs(core.rockerDeg), 9);
    expect(readout(o, 'springLength')!).toBeCloseTo(200, 9);
    const heron = new PoseSession(resolveDesign(JSON.parse(readFileSync(join(__dirname, '..', '..', 'assets', 'designs', 'heron-tilting-velomobile.tiltsheet'), 'utf8'))), 'ground').solve(DESIGN_POSE);
    expect(readout(heron, 'rocker')).toBeNull();
  });
});
