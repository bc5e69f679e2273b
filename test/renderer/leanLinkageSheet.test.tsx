// The design sheet on a design with a balance-beam lean linkage: switching the front end to
// centre-pivot members drops the linkage (its push links act on split wishbones) in the same
// undoable step, leaving a design the validator accepts; one undo brings both back.
import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { DesignSheet } from '../../renderer/panels/DesignSheet';
import { validateDesign } from '../../core/design/validateDesign';
import { demoWorkbench, withWorkbench } from './helpers';

describe('design sheet: lean linkage', () => {
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
});
