// The hardpoint table: numeric entry, mirrored editing of left/right pairs, unlink and relink,
// validation messages at the field, undo of table edits.
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { HardpointTable } from '../../renderer/panels/HardpointTable';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

function cell(rowId: string, axis: 'x' | 'y' | 'z'): HTMLInputElement {
  return screen.getByTestId(`hp-${rowId}-${axis}`) as HTMLInputElement;
}

function type(input: HTMLInputElement, text: string) {
  fireEvent.change(input, { target: { value: text } });
  fireEvent.keyDown(input, { key: 'Enter' });
}

describe('hardpoint table', () => {
  it('lists every hardpoint of the demo with its side and value in mm', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    expect(cell('frontEnd.upper.outerJoint.right', 'y').value).toBe('-313.7');
    expect(cell('frontEnd.upper.outerJoint.left', 'y').value).toBe('313.7');
    expect(cell('steering.pivot', 'z').value).toBe('107');
    expect(screen.getAllByText('⇋ mirrored').length).toBeGreaterThan(5);
  });

  it('editing a cell changes the design, and the mirrored side follows', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    type(cell('frontEnd.upper.outerJoint.right', 'y'), '-320');
    const d = wb.document.getState().design;
    expect(d.frontEnd.upper.outerJoint).toEqual({ x: -13.3, y: -320, z: 330 });
    expect(cell('frontEnd.upper.outerJoint.left', 'y').value).toBe('320');
    expect(wb.document.getState().dirty).toBe(true);
    expect(wb.document.getState().history.past).toHaveLength(1);
  });

  it('editing the left side of a mirrored pair stores the mirror of it', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    type(cell('upright.wheelCentre.left', 'y'), '410');
    type(cell('upright.wheelCentre.left', 'x'), '5');
    expect(wb.document.getState().design.upright.wheelCentre).toEqual({ x: 5, y: -410, z: 245 });
    expect(cell('upright.wheelCentre.right', 'y').value).toBe('-410');
    expect(cell('upright.wheelCentre.right', 'x').value).toBe('5');
  });

  it('unlinking makes the sides independent; mirroring links them again; undo walks back', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    fireEvent.click(screen.getByTestId('unlink-frontEnd.lower.outerJoint'));
    expect(wb.document.getState().design.frontEnd.lower.outerJoint).toEqual({ right: { x: 12, y: -352, z: 150 }, left: { x: 12, y: 352, z: 150 } });
    type(cell('frontEnd.lower.outerJoint.left', 'z'), '160');
    expect(cell('frontEnd.lower.outerJoint.right', 'z').value).toBe('150');
    expect(wb.document.getState().design.frontEnd.lower.outerJoint).toEqual({ right: { x: 12, y: -352, z: 150 }, left: { x: 12, y: 352, z: 160 } });

    fireEvent.click(screen.getByTestId('link-frontEnd.lower.outerJoint'));
    expect(wb.document.getState().design.frontEnd.lower.outerJoint).toEqual({ x: 12, y: -352, z: 150 });
    expect(cell('frontEnd.lower.outerJoint.left', 'z').value).toBe('150');

    act(() => {
      wb.actions.undo();
    });
    expect(cell('frontEnd.lower.outerJoint.left', 'z').value).toBe('160');
    act(() => {
      wb.actions.undo();
      wb.actions.undo();
    });
    expect(wb.document.getState().design.frontEnd.lower.outerJoint).toEqual({ x: 12, y: -352, z: 150 });
    expect(wb.document.getState().dirty).toBe(false);
  });

  it('refuses text that is not a number, naming the field, and changes nothing', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    const before = wb.document.getState().design;
    type(cell('upright.steeringArmJoint.right', 'x'), '12,5mm');
    expect(wb.document.getState().design).toBe(before);
    const msg = screen.getByTestId('issue-upright.steeringArmJoint.right').textContent ?? '';
    expect(msg).toMatch(/right upright steering arm joint x/);
    expect(msg).toMatch(/not a number/);
    expect(msg).toMatch(/mm/);
  });

  it("shows the validator's message at the point it names", () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    type(cell('upright.wheelCentre.right', 'z'), '-5');
    const issue = screen.getByTestId('issue-upright.wheelCentre.right').textContent ?? '';
    expect(issue).toMatch(/upright\.wheelCentre\.z/);
    expect(issue).toMatch(/above the ground/);
    expect(wb.pose.getState().outcome.status).toBe('invalid-design');
    expect(cell('upright.wheelCentre.right', 'z').getAttribute('aria-invalid')).toBe('true');
  });

  it('selecting a row selects the hardpoint for the viewport', () => {
    const wb = demoWorkbench();
    render(withWorkbench(wb, <HardpointTable />));
    fireEvent.click(screen.getByTestId('hp-steering.pivot'));
    expect(wb.ui.getState().selection).toBe('steering.pivot');
    expect(screen.getByTestId('hp-steering.pivot').getAttribute('aria-selected')).toBe('true');
  });
});
