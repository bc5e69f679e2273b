// The column beside the view: "What's wrong" first (this pose's alerts, the operating region's
// items, its tab counting both as listed), the full hardpoint table, studies and settings one tab
// away and kept mounted (a tab change hides, never unmounts).
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { FixColumn } from '../../renderer/app/FixColumn';
import { FixJobsProvider } from '../../renderer/app/fixJobs';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('fix column', () => {
  it('shows the findings first, counts them on its tab, and keeps the other tabs one click away', async () => {
    const wb = demoWorkbench('finch-knuckle-steered-trike');
    act(() => wb.actions.setPose({ leanDeg: 0, handlebarDeg: -15 }));
    render(withWorkbench(wb, <FixJobsProvider><FixColumn /></FixJobsProvider>));
    expect(screen.getByTestId('column-findings').hidden).toBe(false);
    expect(screen.getByTestId('column-hardpoints').hidden).toBe(true);
    await waitFor(() => screen.getByTestId('limits-verdict'), { timeout: 60_000 });
    const listed = screen.getByTestId('alerts').querySelectorAll('li').length + screen.getByTestId('limits').querySelectorAll('li[data-testid^=limit-]').length;
    expect(screen.getByTestId('alerts').querySelectorAll('li').length).toBeGreaterThan(0);
    expect(Number(screen.getByTestId('findings-count').textContent)).toBe(listed);

    const table = screen.getByTestId('hardpoint-table');
    fireEvent.click(screen.getByTestId('column-tab-hardpoints'));
    expect(screen.getByTestId('column-hardpoints').hidden).toBe(false);
    expect(screen.getByTestId('column-findings').hidden).toBe(true);
    fireEvent.click(screen.getByTestId('column-tab-studies'));
    expect(screen.getByTestId('studies-panel')).toBeTruthy();
    fireEvent.click(screen.getByTestId('column-tab-settings'));
    expect(screen.getByTestId('column-settings').hidden).toBe(false);
    // The same table element throughout: hidden, not unmounted.
    expect(screen.getByTestId('hardpoint-table')).toBe(table);
  }, 120_000);
});
