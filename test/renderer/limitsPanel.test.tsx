// Limits over the operating region in the workbench: core's check (same design, same grid), the
// items over or close listed with where each is first exceeded; a click goes to that pose and
// selects a joint of the part (among the parts core's drawing names for the item).
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { LimitsPanel } from '../../renderer/panels/LimitsPanel';
import { checkDesign } from '../../core/analysis/designCheck';
import { resolveDesign } from '../../core/design/resolveDesign';
import { drawingPartsFor } from '../../core/mechanism/drawingLayout';
import { WORKBENCH_CHECK_STEPS } from '../../renderer/workers/studyJobs';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('limits panel', () => {
  it("lists core's check of the operating region and goes to where an item is first exceeded", async () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    render(withWorkbench(wb, <LimitsPanel />));
    fireEvent.click(screen.getByTestId('run-limits'));
    await waitFor(() => screen.getByTestId('limits-verdict'), { timeout: 90_000 });
    const core = checkDesign(resolveDesign(wb.document.getState().design), { steps: WORKBENCH_CHECK_STEPS });
    const over = core.operating.items.filter((i) => i.verdict !== 'within');
    expect(over.length).toBeGreaterThan(0);
    for (const it of over) expect(screen.getByTestId(`limit-${it.id}`).textContent).toContain(it.label);
    for (const it of core.operating.items.filter((i) => i.verdict === 'within')) expect(screen.queryByTestId(`limit-${it.id}`)).toBeNull();

    const joint = over.find((i) => i.group === 'joint' && i.firstOver)!;
    fireEvent.click(screen.getByTestId(`limit-${joint.id}`).querySelector('button')!);
    const pose = wb.pose.getState().pose;
    expect(pose.leanDeg).toBeCloseTo(joint.firstOver!.leanDeg, 9);
    expect(pose.handlebarDeg).toBeCloseTo(joint.firstOver!.handlebarDeg, 9);
    expect(pose.heaveMm).toBeCloseTo(-joint.firstOver!.travelMm, 9);
    const drawing = wb.pose.getState().drawing!;
    const [, name, side] = joint.id.split('.') as [string, 'upperOuter', 'left' | 'right'];
    const parts = new Set(drawingPartsFor(drawing, { kind: 'joint', joint: name, side }));
    expect(drawing.joints.filter((j) => parts.has(j.id)).map((j) => j.hardpoint)).toContain(wb.ui.getState().selection);
  }, 120_000);
});
