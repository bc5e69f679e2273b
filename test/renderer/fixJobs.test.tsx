// The studies behind "What's wrong -> Fix" run by themselves: with nothing clicked, the operating
// region's check and then the rates per mm run for the design on screen (core's checkDesign on
// the workbench's grid gives the same items), and after an edit both run again for the edited
// design, so neither is left describing the design before it.
import { act, cleanup, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { FixJobsProvider } from '../../renderer/app/fixJobs';
import { LimitsPanel } from '../../renderer/panels/LimitsPanel';
import { HardpointTable } from '../../renderer/panels/HardpointTable';
import { setCoordinate } from '../../renderer/model/designActions';
import { checkDesign } from '../../core/analysis/designCheck';
import { resolveDesign } from '../../core/design/resolveDesign';
import { WORKBENCH_CHECK_STEPS } from '../../renderer/workers/studyJobs';
import { fmt } from '../../renderer/model/format';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('fix jobs', () => {
  it('check then rates run without a click, and again after an edit', async () => {
    const wb = demoWorkbench('finch-knuckle-steered-trike');
    render(
      withWorkbench(
        wb,
        <FixJobsProvider>
          <LimitsPanel />
          <HardpointTable />
        </FixJobsProvider>,
      ),
    );
    await waitFor(() => screen.getByTestId('limits-verdict'), { timeout: 60_000 });
    const core = checkDesign(resolveDesign(wb.document.getState().design), { steps: WORKBENCH_CHECK_STEPS });
    for (const it of core.operating.items.filter((i) => i.verdict !== 'within')) expect(screen.getByTestId(`limit-${it.id}`).textContent).toContain(it.label);
    await waitFor(() => expect(screen.getByTestId('sensitivity-note').textContent).toMatch(/poses of the operating region/), { timeout: 60_000 });

    act(() => {
      wb.actions.perform(setCoordinate, { rowId: 'upright.steeringArmJoint.right', axis: 'y', value: -340 });
    });
    // At once the rates say they are from before the edit; then both run again by themselves.
    expect(screen.getByTestId('sensitivity-note').textContent).toMatch(/before your last edit/);
    await waitFor(() => expect(screen.getByTestId('sensitivity-note').textContent).toMatch(/poses of the operating region/), { timeout: 60_000 });
    const edited = checkDesign(resolveDesign(wb.document.getState().design), { steps: WORKBENCH_CHECK_STEPS });
    const worst = edited.operating.items.find((i) => i.id === 'slip.left')!;
    // The edit changes the item's worst value at the shown precision, so the list cannot pass on the old result.
    expect(fmt(worst.worst, 2)).not.toBe(fmt(core.operating.items.find((i) => i.id === 'slip.left')!.worst, 2));
    expect(screen.getByTestId('limit-slip.left').textContent).toContain(`worst ${fmt(worst.worst, 2)}`);
  }, 180_000);
});
