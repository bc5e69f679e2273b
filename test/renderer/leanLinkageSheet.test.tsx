// The design sheet on a design with a balance-beam lean linkage: switching the front end to
// centre-pivot members drops the linkage (its push links act on split wishbones) in the same
// undoable step, leaving a design the validator accepts; one undo brings both back. Ticking the
// box adds a starting linkage (designStarters.ts) to a tilting split-wishbone design.
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { DesignSheet } from '../../renderer/panels/DesignSheet';
import { validateDesign } from '../../core/design/validateDesign';
import { demoWorkbench, withWorkbench } from './helpers';

describe('design sheet: lean linkage', () => {
  afterEach(cleanup);

  it('switching the Pipit to centre-pivot members removes its lean linkage in one valid, undoable step', () => {
    const wb = demoWorkbench('pipit-balance-beam-trike');
    render(withWorkbench(wb, <DesignSheet />));
    expect(wb.document.getState().design.leanLinkage).toBeDefined();
    fireEvent.change(screen.getByTestId('field-frontEnd.kind'), { target: { value: 'centrePivot' } });
    const d = wb.document.getState().design;
    expect(d.frontEnd.kind).toBe('centrePivot');
    expect(d.leanLinkage).toBeUndefined();
    const checked = validateDesign(d);
    expect(checked.ok ? [] : checked.issues.map((i) => i.message)).toEqual([]);
    wb.actions.undo();
    const back = wb.document.getState().design;
    expect(back.frontEnd.kind).toBe('splitWishbones');
    expect(back.leanLinkage).toBeDefined();
  });

  it('adds a starting lean linkage to the Heron in one valid, undoable step, and the pose solves with it', () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    render(withWorkbench(wb, <DesignSheet />));
    const box = screen.getByLabelText(/Balance-beam lean linkage/) as HTMLInputElement;
    expect(box.checked).toBe(false);
    fireEvent.click(box);
    const d = wb.document.getState().design;
    expect(d.leanLinkage?.pushLinks.on).toBe('lower');
    const checked = validateDesign(d);
    expect(checked.ok ? [] : checked.issues.map((i) => i.message)).toEqual([]);
    const outcome = wb.pose.getState().outcome;
    expect(outcome.analysis).not.toBeNull();
    expect(outcome.analysis!.leanLinkage!.springLengthMm).toBeCloseTo(200, 9);
    expect(screen.getByText('Rocker stops (each way)')).toBeTruthy();
    wb.actions.undo();
    expect(wb.document.getState().design.leanLinkage).toBeUndefined();
  });

  it('is not offered on a vehicle that does not tilt (the Wren)', () => {
    const wb = demoWorkbench('wren-rack-trike');
    render(withWorkbench(wb, <DesignSheet />));
    expect(screen.queryByLabelText(/Balance-beam lean linkage/)).toBeNull();
  });
});
