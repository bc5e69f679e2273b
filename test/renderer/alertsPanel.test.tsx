// Alerts first: the pose's verdict and its alerts grouped by severity, worst first; an alert about
// a joint selects that joint's hardpoint. The reference for "that joint" is core's drawing layout:
// the drawn parts core names for the joint's check (drawingPartsFor), independent of the alert.
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { AlertsPanel } from '../../renderer/panels/ReadoutPanel';
import { drawingPartsFor } from '../../core/mechanism/drawingLayout';
import { subjectHardpoint } from '../../renderer/model/readoutTables';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

describe('alerts panel', () => {
  it('groups alerts worst first and selects the joint an alert is about', () => {
    const wb = demoWorkbench('heron-tilting-velomobile');
    // The teaching example's outer ball joints are over their rating at full lean and lock.
    wb.actions.setPose({ leanDeg: 25, handlebarDeg: -25 });
    render(withWorkbench(wb, <AlertsPanel />));
    const over = screen.getByTestId('alerts-over');
    const items = within(over).getAllByRole('listitem');
    expect(items.length).toBeGreaterThan(0);
    expect(screen.getByTestId('pose-status').textContent).toMatch(/over/i);
    // Groups in order: over before close.
    const groups = [...screen.getByTestId('alerts').querySelectorAll('[data-testid^=alerts-]')].map((g) => g.getAttribute('data-testid'));
    expect(groups.indexOf('alerts-over')).toBeLessThan(groups.indexOf('alerts-close') === -1 ? Infinity : groups.indexOf('alerts-close'));

    const outcome = wb.pose.getState().outcome;
    const drawing = wb.pose.getState().drawing!;
    const a = outcome.analysis!;
    const i = a.findingSubjects.findIndex((s) => s.kind === 'joint');
    expect(i).toBeGreaterThanOrEqual(0);
    const subject = a.findingSubjects[i] as { kind: 'joint'; joint: 'upperOuter'; side: 'left' | 'right' };
    const parts = new Set(drawingPartsFor(drawing, { kind: 'joint', joint: subject.joint, side: subject.side }));
    const allowed = drawing.joints.filter((j) => parts.has(j.id)).map((j) => j.hardpoint);
    expect(allowed.length).toBeGreaterThan(0);
    expect(allowed).toContain(subjectHardpoint(drawing, subject));

    const text = a.findings[i].replace(/^(over|close): /, '');
    const button = within(over).getAllByRole('button').find((b) => b.textContent!.toLowerCase() === text.toLowerCase())!;
    fireEvent.click(button);
    expect(allowed).toContain(wb.ui.getState().selection);
  });

  it('says so when the pose has no alerts', () => {
    const wb = demoWorkbench('wren-rack-trike');
    render(withWorkbench(wb, <AlertsPanel />));
    expect(screen.getByTestId('alerts').textContent).toMatch(/no alerts/);
    expect(screen.queryByTestId('alerts-over')).toBeNull();
  });
});
