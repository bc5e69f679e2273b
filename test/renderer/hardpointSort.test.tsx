// The full hardpoint table sorted "strongest first": each point ordered by its largest rate per mm
// of the chosen measure, taken from core's runSensitivity run apart here (the largest |rate| over
// x, y and z of each point), the points no coordinate of which moves it after; without the tick the
// table keeps its groups (negative control: the order changes with the tick and with the measure).
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { HardpointTable } from '../../renderer/panels/HardpointTable';
import { runSensitivity } from '../../core/studies/sensitivity';
import { hardpointRows } from '../../renderer/model/hardpoints';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

/** Point keys in the order core's rates give for an objective: largest |rate| of any axis first. */
function coreOrder(design: Parameters<typeof runSensitivity>[0], objective: string): string[] {
  const best = new Map<string, number>();
  for (const c of runSensitivity(design, { linearityCheck: false }).coordinates) {
    const v = Math.abs(c.objectives[objective]?.perMm ?? 0);
    best.set(c.coordinate.key, Math.max(best.get(c.coordinate.key) ?? 0, Number.isFinite(v) ? v : 0));
  }
  return [...best].filter(([, v]) => v > 0).sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([k]) => k);
}

const shownKeys = () => {
  const keys = [...screen.getByTestId('hardpoint-table').querySelectorAll('tr[data-row-id]')].map((r) => r.getAttribute('data-row-id')!.replace(/\.(right|left)$/, ''));
  return keys.filter((k, i) => keys.indexOf(k) === i);
};

describe('hardpoint table sorted by rate', () => {
  it("orders the points by their largest rate of the chosen measure, as core's sensitivity gives them", async () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    const design = wb.document.getState().design;
    render(withWorkbench(wb, <HardpointTable />));
    fireEvent.click(screen.getByTestId('run-sensitivity'));
    await waitFor(() => screen.getByTestId('sort-by-rate'), { timeout: 60_000 });
    const tableOrder = shownKeys();
    expect(tableOrder).toEqual([...new Set(hardpointRows(design).map((r) => r.key))]);

    fireEvent.click(screen.getByTestId('sort-by-rate'));
    const selfSteer = coreOrder(design, 'selfSteer');
    expect(shownKeys().slice(0, selfSteer.length)).toEqual(selfSteer);
    expect(shownKeys()).not.toEqual(tableOrder);
    expect(screen.getByTestId('hardpoint-table').querySelectorAll('.group-row')).toHaveLength(0);

    fireEvent.change(screen.getByTestId('sensitivity-objective'), { target: { value: 'jointMargin' } });
    const margin = coreOrder(design, 'jointMargin');
    expect(margin).not.toEqual(selfSteer);
    expect(shownKeys().slice(0, margin.length)).toEqual(margin);
  }, 120_000);
});
