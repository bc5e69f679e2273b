// A finding opened into its fix, in the component: the operating region's item about self-steer
// opens under itself the hardpoints core's sensitivity ranks first for that measure (the same
// order as fixPoints over computeSensitivity, run here independently on the main thread), each
// with its coordinates; a coordinate typed there is one undo step of the design.
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { LimitsPanel } from '../../renderer/panels/LimitsPanel';
import { FixJobsProvider } from '../../renderer/app/fixJobs';
import { computeSensitivity } from '../../renderer/workers/sensitivityJob';
import { fixPoints } from '../../renderer/model/findings';
import { hardpointRows } from '../../renderer/model/hardpoints';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('fix view', () => {
  it("lists the points that move a region finding's measure most, in the sensitivity's order, and edits them as one undo step", async () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    const design = wb.document.getState().design;
    render(withWorkbench(wb, <FixJobsProvider auto={false}><LimitsPanel /></FixJobsProvider>));
    fireEvent.click(screen.getByTestId('run-limits'));
    await waitFor(() => screen.getByTestId('limits-verdict'), { timeout: 90_000 });
    const item = screen.getByTestId('limit-selfSteer.left');
    fireEvent.click(within(item).getAllByRole('button')[0]);
    // The fix opens under its finding; the rates are asked for there (the provider's automatic run is off here).
    const fix = within(item).getByTestId('fix');
    fireEvent.click(within(fix).getByTestId('fix-run-rates'));
    await waitFor(() => within(fix).getByTestId('fix-points'), { timeout: 90_000 });

    const expected = fixPoints(computeSensitivity({ design }), 'selfSteer');
    const rows = hardpointRows(design);
    const ids = expected.map((p) => rows.find((r) => r.key === p.key && r.side !== 'left')!.id);
    const shown = [...within(fix).getByTestId('fix-points').querySelectorAll('[data-testid^=fix-point-]')].map((e) => e.getAttribute('data-testid')!.replace('fix-point-', ''));
    expect(shown).toEqual(ids);
    expect(shown.length).toBeGreaterThan(1);

    const past = wb.document.getState().history.past.length;
    const field = within(fix).getByTestId(`fix-${ids[0]}-x`) as HTMLInputElement;
    const x = Number(field.value);
    await act(async () => {
      fireEvent.change(field, { target: { value: String(x + 2) } });
      fireEvent.keyDown(field, { key: 'Enter' });
    });
    expect(wb.document.getState().history.past.length).toBe(past + 1);
    expect(hardpointRows(wb.document.getState().design).find((r) => r.id === ids[0])!.value.x).toBe(x + 2);
    act(() => {
      wb.actions.undo();
    });
    expect(wb.document.getState().design).toEqual(design);
  }, 180_000);
});
