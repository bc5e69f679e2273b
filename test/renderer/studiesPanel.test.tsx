// The studies beside the hardpoint table, run as a user would (here on the main thread: jsdom has
// no Worker). Each result shown must be core's own study for the same design and settings (core's
// studies are checked against outside references in test/core/studies/: tune against the
// geometric construction, spread against first-order theory, sensitivity against re-solves);
// applying a result must be one undo step that restores the design exactly.
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { HardpointTable } from '../../renderer/panels/HardpointTable';
import { StudiesPanel } from '../../renderer/studies/StudiesPanel';
import { geometricProposals } from '../../core/studies/geometricSuggestion';
import { runTune } from '../../core/studies/tune';
import { readTunePlan } from '../../core/studies/tunePlan';
import { runToleranceSpread } from '../../core/studies/toleranceSpread';
import { fmt } from '../../renderer/model/format';
import { designToText } from '../../renderer/model/designText';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

function renderStudies(name: string) {
  const wb = demoWorkbench(name);
  render(
    withWorkbench(
      wb,
      <>
        <HardpointTable />
        <StudiesPanel />
      </>,
    ),
  );
  return wb;
}

const setNumber = (el: HTMLElement, value: number) => fireEvent.change(el, { target: { value: String(value) } });

describe('tune in the workbench', () => {
  it("ticks points on the table, runs core's tune with that plan, and applies the result as one undo step", async () => {
    const wb = renderStudies('heron-tilting-velomobile');
    const before = wb.document.getState().design;
    // A mirrored pair: one tick on the right row picks x, y and z of both sides together.
    fireEvent.click(screen.getByTestId('vary-steering.tieRodJoint.right'));
    expect(screen.queryByTestId('vary-steering.tieRodJoint.left')).toBeNull();
    const picks = within(screen.getByTestId('tune-picks'));
    expect(picks.getAllByRole('row')).toHaveLength(1 + 3);
    // Keep x and z only (drop y), one start and a few iterations: quick, still a real tune.
    fireEvent.click(within(screen.getByTestId('pick-steering.tieRodJoint:y')).getByRole('button'));
    const form = within(screen.getByTestId('tune-panel'));
    setNumber(form.getByLabelText(/^starts/), 1);
    setNumber(form.getByLabelText(/^iterations each/), 6);
    fireEvent.click(screen.getByTestId('run-tune'));
    await waitFor(() => screen.getByTestId('tune-result'), { timeout: 60_000 });

    // The same plan through core (the CLI's path) gives the same moves.
    const { plan, variables } = readTunePlan(
      {
        variables: [
          { id: 'steering.tieRodJoint:x', rangeMm: [-10, 10] },
          { id: 'steering.tieRodJoint:z', rangeMm: [-10, 10] },
        ],
        objectives: [
          { measure: 'selfSteer', weight: 1 },
          { measure: 'slip', weight: 1 },
        ],
        starts: 1,
        maxIterations: 6,
      },
      before,
    );
    const core = runTune(before, plan, variables);
    const moves = screen.getByTestId('tune-moves').textContent ?? '';
    for (const v of core.variables) expect(moves).toContain(fmt(v.movedMm, 2));
    const moved = core.variables.filter((v) => Math.abs(v.movedMm) > 0.005).length;
    expect(moved).toBeGreaterThan(0);

    fireEvent.click(screen.getByTestId('tune-apply'));
    expect(designToText(wb.document.getState().design)).toBe(designToText(core.tuned));
    expect(wb.studies.getState().reference?.label).toBe('before the tune');
    expect(wb.document.getState().history.past).toHaveLength(1);
    wb.actions.undo();
    expect(designToText(wb.document.getState().design)).toBe(designToText(before));
  }, 120_000);

  it('says what is missing before it can run', () => {
    renderStudies('wren-rack-trike');
    expect(screen.getByTestId('tune-problem').textContent).toMatch(/Pick points to vary/);
    expect((screen.getByTestId('run-tune') as HTMLButtonElement).disabled).toBe(true);
    fireEvent.click(screen.getByTestId('vary-steering.tieRodJoint.right'));
    // Every objective off: core's plan reader refuses it, in its own words.
    const form = within(screen.getByTestId('tune-objectives'));
    for (const box of form.getAllByRole('checkbox')) if ((box as HTMLInputElement).checked) fireEvent.click(box);
    expect(screen.getByTestId('tune-problem').textContent).toMatch(/objectives/);
  });
});

describe('proposals in the workbench', () => {
  it("shows core's proposals beside the points they move, and accepting one is one undo step", async () => {
    const wb = renderStudies('heron-tilting-velomobile');
    const before = wb.document.getState().design;
    fireEvent.click(screen.getByTestId('study-tab-proposals'));
    fireEvent.click(screen.getByTestId('run-proposals'));
    await waitFor(() => screen.getByTestId('proposal-tieRodLine'), { timeout: 60_000 });
    const core = geometricProposals(before, true);
    const tieRod = core.find((p) => p.id === 'tieRodLine')!;
    expect(tieRod.design).not.toBeNull();
    // Under each moved point of the table, where it would go.
    const right = tieRod.moves.find((m) => m.side === 'right')!;
    const hint = screen.getByTestId(`proposal-at-${right.key}.right-tieRodLine`).textContent ?? '';
    expect(hint).toContain(`${fmt(right.toMm.x, 1)}, ${fmt(right.toMm.y, 1)}, ${fmt(right.toMm.z, 1)}`);
    // Its effect, before anything is applied: core's numbers.
    const effect = screen.getByTestId('proposal-effect-tieRodLine').textContent ?? '';
    for (const e of tieRod.effect!) if (e.after !== null) expect(effect).toContain(fmt(e.after, 3));
    expect(designToText(wb.document.getState().design)).toBe(designToText(before));

    fireEvent.click(screen.getByTestId('accept-tieRodLine'));
    expect(wb.document.getState().design).toEqual(tieRod.design);
    expect(screen.queryByTestId(`proposal-at-${right.key}.right-tieRodLine`)).toBeNull();
    wb.actions.undo();
    expect(designToText(wb.document.getState().design)).toBe(designToText(before));
  }, 120_000);
});

describe('tolerance spread in the workbench', () => {
  it("shows core's percentiles and drivers for the same band, samples and seed", async () => {
    const wb = renderStudies('wren-rack-trike');
    fireEvent.click(screen.getByTestId('study-tab-spread'));
    const panel = within(screen.getByTestId('spread-panel'));
    setNumber(panel.getByLabelText('tolerance band, mm'), 0.8);
    setNumber(panel.getByLabelText(/^samples/), 40);
    setNumber(panel.getByLabelText(/^seed/), 7);
    fireEvent.click(screen.getByTestId('run-spread'));
    await waitFor(() => screen.getByTestId('spread-result'), { timeout: 90_000 });
    const core = runToleranceSpread(wb.document.getState().design, { samples: 40, seed: 7, bands: { defaultMm: 0.8 }, distribution: 'normal', method: 'monte-carlo' });
    const first = core.overPoses.find((s) => s.summary !== null)!;
    const row = screen.getByTestId(`spread-row-${first.id}`).textContent ?? '';
    expect(row).toContain(fmt(first.summary!.p5, 3));
    expect(row).toContain(fmt(first.summary!.p95, 3));
    fireEvent.click(within(screen.getByTestId(`spread-row-${first.id}`)).getByRole('button'));
    expect(screen.getByTestId('spread-histogram').querySelectorAll('rect.bin')).toHaveLength(first.summary!.histogram.counts.length);
    if (first.drivers.length > 0) expect(screen.getByTestId('spread-drivers').textContent).toContain(first.drivers[0].point);
  }, 120_000);
});

describe('comparing with a reference', () => {
  it('pins the design, and after an edit lists the moved point and its distance', async () => {
    const wb = renderStudies('wren-rack-trike');
    fireEvent.click(screen.getByTestId('study-tab-compare'));
    fireEvent.click(screen.getByTestId('pin-reference'));
    expect(screen.getByTestId('reference-label').textContent).toMatch(/^pinned at/);
    const input = screen.getByTestId('hp-frontEnd.upper.frontPivot.right-z') as HTMLInputElement;
    setNumber(input, Number(input.value) + 3);
    fireEvent.keyDown(input, { key: 'Enter' });
    fireEvent.click(screen.getByTestId('run-compare'));
    await waitFor(() => screen.getByTestId('compare-result'), { timeout: 90_000 });
    const table = screen.getByTestId('compare-hardpoints');
    const rows = within(table).getAllByRole('row').slice(1);
    // A mirrored pair: both sides moved, each 3 mm.
    expect(rows).toHaveLength(2);
    for (const r of rows) expect(r.textContent).toContain('3.00 mm');
    expect(wb.studies.getState().reference).not.toBeNull();
    fireEvent.click(screen.getByTestId('clear-reference'));
    expect(wb.studies.getState().reference).toBeNull();
  }, 120_000);
});

describe('fit in the workbench', () => {
  it("fits the ticked points, each side on its own, to a measurement sheet: core's fit for the same input, applied as one undo step", async () => {
    const { readFileSync } = await import('node:fs');
    const { prepareFit } = await import('../../core/studies/fitInput');
    const { runFit } = await import('../../core/studies/fit');
    const wb = renderStudies('wren-rack-trike');
    const before = wb.document.getState().design;
    fireEvent.click(screen.getByTestId('study-tab-fit'));
    // Picks as the table's ticks make them, trimmed to one axis per point.
    wb.studies.setState({
      picks: [
        { id: 'steering.tieRodJoint:y', rowId: 'steering.tieRodJoint.right', axis: 'y', rangeMm: [-10, 10] },
        { id: 'upright.steeringArmJoint:z', rowId: 'upright.steeringArmJoint.right', axis: 'z', rangeMm: [-10, 10] },
      ],
    });
    const csvPath = 'assets/designs/measurements/wren-rack-trike.measurements.csv';
    const text = readFileSync(csvPath, 'utf8');
    fireEvent.change(screen.getByTestId('fit-file'), { target: { files: [new File([text], 'wren.measurements.csv', { type: 'text/csv' })] } });
    await waitFor(() => expect(screen.getByTestId('fit-sheet').textContent).toBe('wren.measurements.csv'));
    fireEvent.click(screen.getByTestId('run-fit'));
    await waitFor(() => screen.getByTestId('fit-result'), { timeout: 90_000 });

    const ids = ['steering.tieRodJoint.right:y', 'steering.tieRodJoint.left:y', 'upright.steeringArmJoint.right:z', 'upright.steeringArmJoint.left:z'];
    const input = prepareFit(before, text, 'wren.measurements.csv', ids);
    if (!input.ok) throw new Error(input.problems.join('\n'));
    const core = runFit(before, input.measurements, input.variables);
    const shown = screen.getByTestId('fit-coordinates').textContent ?? '';
    for (const v of core.variables) expect(shown).toContain(v.identifiable ? fmt(v.movedMm, 3) : 'cannot be pinned down');
    expect(within(screen.getByTestId('fit-measurements')).getAllByRole('row')).toHaveLength(1 + core.measurements.length);
    // The sheet was made with the left rack-end joint 1.8 mm outward (its own comment): the fit
    // moves that coordinate by about that much (core's fit test checks recovery closely).
    const left = core.variables.find((v) => v.id === 'steering.tieRodJoint.left:y')!;
    expect(Math.abs(left.movedMm! - 1.8)).toBeLessThan(0.5);

    fireEvent.click(screen.getByTestId('fit-apply'));
    expect(designToText(wb.document.getState().design)).toBe(designToText(core.fitted));
    wb.actions.undo();
    expect(designToText(wb.document.getState().design)).toBe(designToText(before));
  }, 120_000);

  it('names the line and column of a bad sheet and changes nothing', async () => {
    const wb = renderStudies('wren-rack-trike');
    const before = designToText(wb.document.getState().design);
    fireEvent.click(screen.getByTestId('study-tab-fit'));
    wb.studies.setState({ picks: [{ id: 'steering.tieRodJoint:y', rowId: 'steering.tieRodJoint.right', axis: 'y', rangeMm: [-10, 10] }] });
    const bad = 'lean_deg,handlebar_deg,travel_mm,side,quantity,value\n0,10,0,left,toe_deg,0.1\n0,10,0,middle,toe_deg,0.2\n';
    fireEvent.change(screen.getByTestId('fit-file'), { target: { files: [new File([bad], 'bad.csv')] } });
    await waitFor(() => screen.getByTestId('fit-sheet'));
    fireEvent.click(screen.getByTestId('run-fit'));
    await waitFor(() => screen.getByTestId('fit-failed'), { timeout: 30_000 });
    expect(screen.getByTestId('fit-failed').textContent).toMatch(/bad\.csv.*3:/);
    expect(designToText(wb.document.getState().design)).toBe(before);
  }, 60_000);
});
