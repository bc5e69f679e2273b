// The slider-to-solver path: a store action or a slider move solves the pose with core and the
// readouts show core's numbers for it.
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { resolveDesign } from '../../core/design/resolveDesign';
import { buildMechanism } from '../../core/mechanism/templates/buildMechanism';
import { zeroInputs } from '../../core/mechanism/MechanismGraph';
import { PoseSolver } from '../../core/solver/PoseSolver';
import { PoseAnalyser } from '../../core/analysis/PoseAnalyser';
import { solveSinglePose } from '../../core/analysis/solveSinglePose';
import { fmt } from '../../renderer/model/format';
import { readout } from '../../renderer/model/analysisAdapter';
import { PosePanel } from '../../renderer/panels/PosePanel';
import { ReadoutPanel } from '../../renderer/panels/ReadoutPanel';
import { demoDesign, demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

/** Core on its own: solve a pose of the design and analyse it. */
function coreAt(leanDeg: number, handlebarDeg: number) {
  const d = resolveDesign(demoDesign());
  const solver = new PoseSolver(buildMechanism(d));
  const inputs = { ...zeroInputs(), leanDeg, handlebarDeg };
  const r = solver.solve(inputs, false);
  expect(r.status).toBe('converged');
  return new PoseAnalyser(d, solver.mechanism).analyse(r);
}

const text = (id: string) => (screen.getByTestId(id).textContent ?? '').trim();

describe('slider to solver to readouts', () => {
  it('a pose action solves with core and stores core’s measures', () => {
    const wb = demoWorkbench();
    wb.actions.setPose({ leanDeg: 10, handlebarDeg: 5 });
    const o = wb.pose.getState().outcome;
    expect(o.status).toBe('converged');
    const a = coreAt(10, 5);
    expect(o.analysis!.wheels.left.toeDeg).toBeCloseTo(a.wheels.left.toeDeg, 9);
    expect(o.analysis!.wheels.right.camberDeg).toBeCloseTo(a.wheels.right.camberDeg, 9);
    expect(readout(o, 'slip', 1)).toBeCloseTo(a.slip.right.slipDeg, 9);
    expect(o.snapshot!.inputs.leanDeg).toBe(10);
  });

  it('the measures that need neighbouring poses agree with core’s single-pose report', () => {
    const wb = demoWorkbench();
    wb.actions.setPose({ leanDeg: 8, handlebarDeg: 12 });
    const mine = wb.pose.getState().outcome.analysis!;
    const core = solveSinglePose(resolveDesign(demoDesign()), {
      contact: 'ground',
      steerBy: 'handlebar',
      leanDeg: 8,
      handlebarDeg: 12,
      heaveMm: 0,
      travelRightMm: 0,
      travelLeftMm: 0,
      wheelAngleDeg: 0,
    }).report.analysis!;
    expect(mine.steering.localRatio).toBeCloseTo(core.steering.localRatio!, 6);
    expect(mine.suspension.frontLiftMm).toBeCloseTo(core.suspension.frontLiftMm!, 6);
    expect(mine.selfSteer.leftDeg).toBeCloseTo(core.selfSteer.leftDeg!, 6);
  });

  it('the readouts show the solved numbers with units', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <ReadoutPanel />));
    expect(text('readout-toe-left')).toMatch(/^0\.000/);
    act(() => wb.actions.setPose({ leanDeg: 12 }));
    const a = coreAt(12, 0);
    expect(text('readout-toe-left')).toContain(fmt(a.wheels.left.toeDeg, 3));
    expect(text('readout-camberGround-right')).toContain(fmt(a.wheels.right.camberDeg, 2));
    expect(text('readout-lean')).toContain('12.00');
    expect(screen.getAllByText('deg').length).toBeGreaterThan(10);
    expect(screen.getAllByText('mm').length).toBeGreaterThan(5);
  });

  it('moving the lean slider re-solves and updates the readouts', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, [<PosePanel key="p" />, <ReadoutPanel key="r" />]));
    const before = text('readout-camberGround-left');
    fireEvent.change(screen.getByTestId('slider-leanDeg'), { target: { value: '20' } });
    expect(wb.pose.getState().pose.leanDeg).toBe(20);
    expect(text('readout-camberGround-left')).not.toBe(before);
    expect(text('readout-camberGround-left')).toContain(fmt(coreAt(20, 0).wheels.left.camberDeg, 2));
    expect((screen.getByTestId('pose-leanDeg') as HTMLInputElement).value).toBe('20.0');
  });

  it('typing a pose value that is not a number says so and keeps the pose', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <PosePanel />));
    const field = screen.getByTestId('pose-handlebarDeg') as HTMLInputElement;
    fireEvent.change(field, { target: { value: 'left' } });
    fireEvent.keyDown(field, { key: 'Enter' });
    expect(screen.getByRole('alert').textContent).toMatch(/Steer \(handlebar\).*not a number.*deg/);
    expect(wb.pose.getState().pose.handlebarDeg).toBe(0);
  });

  it('a non-tilting design keeps the lean at zero and says why the slider is off', () => {
    const wb = demoWorkbench('wren-rack-trike');
    render(withWorkbench(wb, <PosePanel />));
    expect((screen.getByTestId('slider-leanDeg') as HTMLInputElement).disabled).toBe(true);
    act(() => wb.actions.setPose({ leanDeg: 10 }));
    expect(wb.pose.getState().pose.leanDeg).toBe(0);
    expect(screen.getByText(/does not lean/)).toBeTruthy();
  });
});
