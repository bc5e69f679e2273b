// Ride mode: a speed and the handlebar in, the balanced lean out, through core's ride solve
// (one pose engine); the lean slider follows and is disabled, and nothing enters the undo
// history.
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { readout } from '../../renderer/model/analysisAdapter';
import { PosePanel } from '../../renderer/panels/PosePanel';
import { ReadoutPanel } from '../../renderer/panels/ReadoutPanel';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

// Standard gravity, m/s^2 (3rd CGPM 1901; ISO 80000-3), written here rather than imported
// from core so the check does not lean on the code it checks.
const G = 9.80665;

/** The balanced lean of a steady turn, tan(lean) = v^2 / (g R) (point-mass balance of a leaning vehicle, common practice, no source). */
const balancedLeanDeg = (speedKmh: number, radiusMm: number) => (Math.atan((speedKmh / 3.6) ** 2 / (G * (radiusMm / 1000))) * 180) / Math.PI;

describe('ride mode', () => {
  it('finds the balanced lean for the speed and the turn radius the linkage makes there', () => {
    const wb = demoWorkbench();
    wb.actions.setPose({ handlebarDeg: 8 });
    wb.actions.setRide({ on: true, speedKmh: 20 });
    const { pose, outcome } = wb.pose.getState();
    expect(outcome.status).toBe('converged');
    const radius = readout(outcome, 'turnRadius')!;
    expect(radius).toBeGreaterThan(1000);
    // A left turn (handlebar +) leans left: a negative lean (ISO 8855, right side down +).
    expect(pose.leanDeg).toBeLessThan(-1);
    expect(pose.leanDeg).toBeCloseTo(-balancedLeanDeg(20, radius), 4);
    expect(outcome.analysis!.inputs.leanDeg).toBeCloseTo(pose.leanDeg, 9);
    expect(readout(outcome, 'rideSpeed')).toBe(20);
    expect(Math.abs(readout(outcome, 'rideResidual')!)).toBeLessThan(1e-4);
    expect(readout(outcome, 'rideLateralG')).toBeCloseTo((20 / 3.6) ** 2 / (G * (radius / 1000)), 6);
  });

  it('a lean asked for in ride mode is ignored; leaving ride mode keeps the pose', () => {
    const wb = demoWorkbench();
    wb.actions.setRide({ on: true, speedKmh: 25 });
    wb.actions.setPose({ handlebarDeg: -6 });
    const lean = wb.pose.getState().pose.leanDeg;
    expect(lean).toBeGreaterThan(1);
    wb.actions.setPose({ leanDeg: -20 });
    expect(wb.pose.getState().pose.leanDeg).toBeCloseTo(lean, 9);
    wb.actions.setRide({ on: false });
    expect(wb.pose.getState().pose.leanDeg).toBeCloseTo(lean, 9);
    expect(wb.pose.getState().outcome.ride).toBeUndefined();
    wb.actions.setPose({ leanDeg: -20 });
    expect(wb.pose.getState().pose.leanDeg).toBe(-20);
  });

  it('ride state is not design data: no undo step, the document untouched', () => {
    const wb = demoWorkbench();
    const text = wb.document.getState().designText;
    wb.actions.setRide({ on: true, speedKmh: 30 });
    wb.actions.setPose({ handlebarDeg: 5 });
    expect(wb.document.getState().history.past).toHaveLength(0);
    expect(wb.document.getState().designText).toBe(text);
    expect(wb.document.getState().dirty).toBe(false);
  });

  it('the panel switches to ride: a speed slider, the lean slider disabled and following, the ride readings', async () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, [<PosePanel key="p" />, <ReadoutPanel key="r" />]));
    expect(screen.queryByTestId('slider-speedKmh')).toBeNull();
    fireEvent.click(screen.getByTestId('mode-ride'));
    const speed = screen.getByTestId('slider-speedKmh') as HTMLInputElement;
    const riding = wb.pose.getState().resolved!.riding;
    expect(Number(speed.max)).toBeCloseTo(Math.max(riding.maxKmh * 1.2, 10), 9);
    expect(Number(speed.min)).toBe(0);
    expect((screen.getByTestId('slider-leanDeg') as HTMLInputElement).disabled).toBe(true);
    expect(screen.getByText(/lean follows the balanced turn/)).toBeTruthy();
    fireEvent.change(screen.getByTestId('slider-handlebarDeg'), { target: { value: '3' } });
    fireEvent.change(speed, { target: { value: '30' } });
    const { pose, outcome } = wb.pose.getState();
    expect(wb.pose.getState().ride.speedKmh).toBe(30);
    expect(pose.leanDeg).toBeCloseTo(-balancedLeanDeg(30, readout(outcome, 'turnRadius')!), 4);
    expect((screen.getByTestId('pose-leanDeg') as HTMLInputElement).value).toBe(pose.leanDeg.toFixed(1));
    // The readings repaint at most every 100 ms while the pose moves.
    await waitFor(() => expect(screen.getByTestId('readout-rideSpeed').textContent).toContain('30.0'));
    expect(screen.getByTestId('readout-rideLateralG').textContent).toMatch(/^0\.\d{3}/);
  });

  it('a turn that needs more lean than the limit stops at the limit and says so', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <PosePanel />));
    act(() => {
      wb.actions.setRide({ on: true, speedKmh: 30 });
      wb.actions.setPose({ handlebarDeg: 10 });
    });
    const { pose, outcome, resolved } = wb.pose.getState();
    const limit = resolved!.riding.maxLeanDeg;
    expect(pose.leanDeg).toBeCloseTo(-limit, 9);
    const needed = balancedLeanDeg(30, readout(outcome, 'turnRadius')!);
    expect(needed).toBeGreaterThan(limit);
    expect(readout(outcome, 'rideResidual')).toBeCloseTo(-limit + needed, 4);
    expect(screen.getByTestId('ride-notes').textContent).toMatch(/lean limit/);
  });

  it('a non-tilting design rides upright and still shows the lateral acceleration', () => {
    const wb = demoWorkbench('wren-rack-trike');
    act(() => {
      wb.actions.setRide({ on: true, speedKmh: 20 });
      wb.actions.setPose({ handlebarDeg: 10 });
    });
    const { pose, outcome } = wb.pose.getState();
    expect(pose.leanDeg).toBe(0);
    const radius = readout(outcome, 'turnRadius')!;
    expect(readout(outcome, 'rideLateralG')).toBeCloseTo((20 / 3.6) ** 2 / (G * (radius / 1000)), 6);
    expect(readout(outcome, 'rideBalancedLean')).toBeNull();
    expect(outcome.ride!.notes.join(' ')).toMatch(/does not lean/);
  });
});
