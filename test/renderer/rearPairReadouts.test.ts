/**
 * The workbench readouts of a leaning rear pair (the Plover demo) are core's own numbers: the
 * rear cambers and toes and the four-wheel turn centre and worst slip of the same pose solved
 * by core's pose engine alone; a design with another rear shows none of these rows.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DESIGN_POSE } from '../../renderer/model/poseInputs';
import { PoseSession, readout } from '../../renderer/model/analysisAdapter';
import { resolveDesign } from '../../core/design/resolveDesign';
import { PoseEngine } from '../../core/analysis/PoseEngine';
import { zeroInputs } from '../../core/mechanism/MechanismGraph';

const design = (name: string) => resolveDesign(JSON.parse(readFileSync(join(__dirname, '..', '..', 'assets', 'designs', `${name}.tiltsheet`), 'utf8')));

describe('leaning rear pair readouts', () => {
  it("show core's rear cambers, toes, four-wheel turn centre and worst slip for the Plover, none for the Heron", () => {
    const plover = design('plover-tilting-quad');
    const o = new PoseSession(plover, 'ground').solve({ ...DESIGN_POSE, leanDeg: 20, handlebarDeg: 25 });
    const core = new PoseEngine(plover, { contact: 'ground', steerBy: 'handlebar' }).solve({ ...zeroInputs(), leanDeg: 20, handlebarDeg: 25 }).analysis!.rear!;
    expect(readout(o, 'rearCamberLeft')!).toBeCloseTo(core.left.camberDeg, 9);
    expect(readout(o, 'rearCamberRight')!).toBeCloseTo(20, 9);
    expect(readout(o, 'rearToeLeft')!).toBeCloseTo(0, 9);
    expect(readout(o, 'rearToeRight')!).toBeCloseTo(0, 9);
    expect(readout(o, 'fourWheelCentreX')!).toBeCloseTo(core.turnCentre.centreMm!.x, 6);
    expect(readout(o, 'fourWheelCentreY')!).toBeCloseTo(core.turnCentre.centreMm!.y, 6);
    expect(readout(o, 'fourWheelSlip')!).toBeCloseTo(core.turnCentre.worstSlipDeg!, 9);
    // straight ahead: no centre, the row says why
    const straight = new PoseSession(plover, 'ground').solve({ ...DESIGN_POSE, leanDeg: 10 });
    expect(readout(straight, 'fourWheelCentreX')).toBeNull();
    expect(readout(straight, 'rearCamberRight')!).toBeCloseTo(10, 9);
    const heron = new PoseSession(design('heron-tilting-velomobile'), 'ground').solve(DESIGN_POSE);
    expect(readout(heron, 'rearCamberLeft')).toBeNull();
    expect(readout(heron, 'fourWheelCentreX')).toBeNull();
  });
});
