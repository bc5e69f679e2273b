// The plots' tabs: the ratio-change and toe-mismatch charts have tabs; a vehicle that does not
// lean shows no lean-only charts and says why.
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { PlotsPanel } from '../../renderer/charts/PlotsPanel';
import { setPlots } from '../../renderer/state/uiStore';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

/** A workbench with the plots closed, so no sweep starts while the tabs are looked at. */
function closedPlots(name?: string) {
  const wb = demoWorkbench(name);
  setPlots(wb.ui, { open: false });
  return wb;
}

describe('plot tabs', () => {
  it('a tilting design has the ratio-change and toe-mismatch tabs beside the lean charts', () => {
    const wb = closedPlots();
    render(withWorkbench(wb, <PlotsPanel />));
    expect(screen.getByTestId('tab-ratioLean').textContent).toBe('Ratio change');
    expect(screen.getByTestId('tab-slipSteer').textContent).toBe('Toe mismatch');
    expect(screen.getByTestId('tab-leanSteer')).toBeTruthy();
    expect(screen.queryByTestId('plots-hidden')).toBeNull();
    fireEvent.click(screen.getByTestId('tab-ratioLean'));
    expect(wb.ui.getState().plots).toMatchObject({ tab: 'ratioLean', open: true });
    setPlots(wb.ui, { open: false });
  });

  it('a non-tilting design hides the lean-only charts, says why, and leaves such a tab', () => {
    const wb = closedPlots('wren-rack-trike');
    expect(wb.ui.getState().plots.tab).toBe('leanSteer');
    render(withWorkbench(wb, <PlotsPanel />));
    for (const id of ['leanSteer', 'ratioLean', 'jointsLean']) expect(screen.queryByTestId(`tab-${id}`), id).toBeNull();
    // Camber also has a panel against wheel travel, so it stays.
    for (const id of ['bumpSteer', 'slipSteer', 'camber', 'map']) expect(screen.getByTestId(`tab-${id}`), id).toBeTruthy();
    expect(screen.getByTestId('plots-hidden').textContent).toMatch(/Lean steer, Ratio change, Joints vs lean: not shown, this vehicle does not lean/);
    expect(wb.ui.getState().plots.tab).toBe('bumpSteer');
  });
});
