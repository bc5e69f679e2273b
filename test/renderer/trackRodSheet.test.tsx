// The design sheet switches a design to a one-piece track rod and between its drives, or a bell
// crank to a handlebar on an upright: each switch is one undoable step that leaves a design the
// validator accepts (the rod's inner end takes the outer end's joint spec; a handlebar on an
// upright puts the uprights on kingpins), and the pose on screen solves with the new linkage.
import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { DesignSheet } from '../../renderer/panels/DesignSheet';
import { validateDesign } from '../../core/design/validateDesign';
import { demoWorkbench, withWorkbench } from './helpers';

describe('design sheet: one-piece track rod', () => {
  it('switches the Wren to a track rod, then to a centre lever, each step valid and undoable', () => {
    const wb = demoWorkbench('wren-rack-trike');
    render(withWorkbench(wb, <DesignSheet />));
    fireEvent.change(screen.getByTestId('field-steering.kind'), { target: { value: 'trackRod' } });
    let d = wb.document.getState().design;
    expect(d.steering.kind).toBe('trackRod');
    expect(d.joints.tieRodInner).toEqual(d.joints.tieRodOuter);
    const first = validateDesign(d);
    expect(first.ok ? [] : first.issues.map((i) => i.message)).toEqual([]);
    expect(wb.pose.getState().outcome.analysis).not.toBeNull();

    fireEvent.change(screen.getByTestId('field-steering.drive.kind'), { target: { value: 'centreLever' } });
    d = wb.document.getState().design;
    expect(d.steering.kind === 'trackRod' && d.steering.drive.kind).toBe('centreLever');
    const second = validateDesign(d);
    expect(second.ok ? [] : second.issues.map((i) => i.message)).toEqual([]);
    expect(screen.getByText('Lever axis')).toBeTruthy();

    wb.actions.undo();
    wb.actions.undo();
    expect(wb.document.getState().design.steering.kind).toBe('rack');
  });

  it('a handlebar on an upright (tie rods through the crank, or the track rod) also puts the uprights on kingpins, in one valid step', () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    render(withWorkbench(wb, <DesignSheet />));
    expect(wb.document.getState().design.upright.steeringAxis).toBe('ballJoints');
    fireEvent.change(screen.getByTestId('field-steering.input.kind'), { target: { value: 'knuckle' } });
    const d = wb.document.getState().design;
    expect(d.steering.kind === 'bellCrank' && d.steering.input.kind).toBe('knuckle');
    expect(d.upright.steeringAxis).toBe('kingpin');
    const checked = validateDesign(d);
    expect(checked.ok ? [] : checked.issues.map((i) => i.message)).toEqual([]);
    wb.actions.undo();
    expect(wb.document.getState().design.upright.steeringAxis).toBe('ballJoints');
  });
});
