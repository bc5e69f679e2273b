// The hardpoint table's rate column: the sensitivity runs (here on the main thread: jsdom has no
// Worker), its numbers are core's runSensitivity for the same design, it is marked stale after an
// edit. The reference is core's own central differences of the full solve, themselves checked
// against a direct re-solve in test/core/studies/ (sensitivity tests).
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { HardpointTable } from '../../renderer/panels/HardpointTable';
import { runSensitivity } from '../../core/studies/sensitivity';
import { rateText } from '../../renderer/studies/useSensitivity';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('rate column of the hardpoint table', () => {
  it("shows core's rates per mm for each point, and says when an edit made them stale", async () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    expect(screen.queryByTestId('rate-steering.tieRodJoint')).toBeNull();
    fireEvent.click(screen.getByTestId('run-sensitivity'));
    await waitFor(() => expect(screen.getByTestId('sensitivity-note').textContent).toMatch(/poses of the operating region/), { timeout: 60_000 });
    const core = runSensitivity(wb.document.getState().design, { linearityCheck: false });
    const z = core.coordinates.find((c) => c.coordinate.key === 'steering.tieRodJoint' && c.coordinate.axis === 'z')!;
    const cell = screen.getByTestId('rate-steering.tieRodJoint');
    expect(cell.textContent).toContain(`${z.coordinate.direction} ${rateText(z.objectives.selfSteer.perMm, 'deg')}`);
    expect(cell.getAttribute('title')).toContain(z.sentence);
    // Another measure shows other numbers (negative control: the column follows the choice).
    fireEvent.change(screen.getByTestId('sensitivity-objective'), { target: { value: 'jointMargin' } });
    expect(screen.getByTestId('rate-steering.tieRodJoint').textContent).toContain(`${z.coordinate.direction} ${rateText(z.objectives.jointMargin.perMm, 'deg')}`);
    // An edit makes the rates stale.
    const input = screen.getByTestId('hp-steering.pivot-z') as HTMLInputElement;
    fireEvent.change(input, { target: { value: String(Number(input.value) + 1) } });
    fireEvent.keyDown(input, { key: 'Enter' });
    expect(screen.getByTestId('sensitivity-note').textContent).toMatch(/from before your last edit/);
  }, 120_000);
});
