// The open chart's curves first (issue 11, speed): after an edit the plots ask for the open
// tab's curve kinds alone, show them as soon as they come, then ask for the rest; the merged
// set equals core's computeCurves of every kind at once (the reference: the same sweep the
// report draws), for a leaning and a non-leaning demo; a newer job or a cancel in between
// stops the second part.
import { act, cleanup, render, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { PlotsPanel, sameMarker, useTabCurves } from '../../renderer/charts/PlotsPanel';
import { SweepClient } from '../../renderer/workers/sweepClient';
import { computeCurves, type CurveRequest } from '../../renderer/workers/sweepJobs';
import type { CurveSet } from '../../core/report/charts/chartData';
import { CURVE_KINDS, type CurveKind } from '../../core/analysis/curves';
import { CHART_CURVES } from '../../core/report/charts/curveOptions';
import { Jobs, mergeCurveSets } from '../../renderer/state/jobsStore';
import { createWorkbench } from '../../renderer/state/workbench';
import { designToText } from '../../renderer/model/designText';
import { setPlots, type PlotTab } from '../../renderer/state/uiStore';
import { demoDesign, withWorkbench } from './helpers';

afterEach(cleanup);

/** The main-thread client (no worker in jsdom), recording the kinds each curves job asks for. */
class KindsClient extends SweepClient {
  asked: (readonly CurveKind[] | 'all')[] = [];
  constructor() {
    super(null);
  }
  override curves(request: CurveRequest, progress?: (done: number, total: number) => void): Promise<CurveSet> {
    this.asked.push(request.kinds ?? 'all');
    return super.curves(request, progress);
  }
}

function setUp(name: string) {
  const design = demoDesign(name);
  const client = new KindsClient();
  const wb = createWorkbench(design, { fileName: `${name}.tiltsheet`, filePath: null, savedText: designToText(design) }, { sweepClient: client });
  return { wb, client };
}

const without = (set: CurveSet) => ({ curves: set.curves, missing: set.missing, tolerances: set.tolerances, ratedDeg: set.ratedDeg, design: set.design });

describe('the open chart first', () => {
  for (const name of ['heron-tilting-velomobile', 'wren-rack-trike']) {
    it(`${name}: the camber chart's kinds come first and are shown alone, then the merged set equals computeCurves of every kind`, async () => {
      const { wb, client } = setUp(name);
      const jobs: Jobs = wb.jobs;
      const first = CHART_CURVES.camber;
      const revision = wb.document.getState().revision;
      jobs.runCurves(first);
      expect(client.asked).toEqual([first]);
      // The first part: exactly the camber kinds, for this revision, the rest pending, still running.
      await vi.waitFor(() => expect(jobs.store.getState().curves.pendingKinds.length).toBeGreaterThan(0), { timeout: 20_000 });
      const partial = jobs.store.getState().curves;
      // (a vehicle that does not lean has its lean curve in `missing`, with the reason)
      expect([...Object.keys(partial.result!.curves), ...Object.keys(partial.result!.missing)].sort()).toEqual([...first].sort());
      expect(partial.resultRevision).toBe(revision);
      expect([...partial.pendingKinds].sort()).toEqual(CURVE_KINDS.filter((k) => !first.includes(k)).sort());
      expect(partial.progress).not.toBeNull();
      expect(client.asked).toEqual([first, CURVE_KINDS.filter((k) => !first.includes(k))]);
      // The whole set.
      await vi.waitFor(() => expect(jobs.store.getState().curves.progress).toBeNull(), { timeout: 20_000 });
      const done = jobs.store.getState().curves;
      expect(done.pendingKinds).toEqual([]);
      expect(done.resultRevision).toBe(revision);
      const whole = computeCurves({ design: wb.document.getState().design });
      expect(Object.keys(done.result!.curves).sort()).toEqual(Object.keys(whole.curves).sort());
      expect(without(done.result!)).toEqual(without(whole));
    }, 60_000);
  }

  it('a newer job or a cancel between the two parts stops the second', async () => {
    const { wb, client } = setUp('heron-tilting-velomobile');
    wb.jobs.runCurves(CHART_CURVES.leanSteer);
    await vi.waitFor(() => expect(client.asked.length).toBe(2), { timeout: 20_000 });
    // Cancelled while the rest runs: the open chart's part stays, the slot stops running.
    wb.jobs.cancel();
    const slot = wb.jobs.store.getState().curves;
    expect(slot.progress).toBeNull();
    expect(Object.keys(slot.result!.curves)).toEqual(['leanSteer']);
    await new Promise((r) => setTimeout(r, 100));
    expect(client.asked.length).toBe(2);
    // A newer job overtakes the first part: its rest is never asked.
    wb.jobs.runCurves(CHART_CURVES.bumpSteer);
    wb.jobs.runCurves(CHART_CURVES.ackermann);
    await vi.waitFor(() => expect(wb.jobs.store.getState().curves.progress).toBeNull(), { timeout: 20_000 });
    expect(client.asked.slice(2).map((k) => (k === 'all' ? k : k.join(',')))).toEqual(['bumpSteer', 'ackermann', CURVE_KINDS.filter((k) => k !== 'ackermann').join(',')]);
  }, 60_000);

  it('the plots ask for the open tab’s kinds first', () => {
    const { wb, client } = setUp('heron-tilting-velomobile');
    setPlots(wb.ui, { tab: 'jointsSteer' });
    render(withWorkbench(wb, <PlotsPanel />));
    expect(client.asked[0]).toEqual(CHART_CURVES.jointsSteer);
    act(() => wb.jobs.cancel());
  });
});

describe('no redraw without a change', () => {
  const design = demoDesign('heron-tilting-velomobile');
  const part = computeCurves({ design, kinds: CHART_CURVES.camber });
  const rest = computeCurves({ design, kinds: CURVE_KINDS.filter((k) => !CHART_CURVES.camber.includes(k)) });
  const merged = mergeCurveSets(part, rest);

  it('the rest of the set arriving keeps the open tab’s set (same curves, same revision)', () => {
    const { result, rerender } = renderHook(({ set, rev, tab }: { set: CurveSet | null; rev: number; tab: PlotTab }) => useTabCurves(set, rev, tab), {
      initialProps: { set: part as CurveSet | null, rev: 3, tab: 'camber' as PlotTab },
    });
    expect(result.current).toBe(part);
    rerender({ set: merged, rev: 3, tab: 'camber' });
    expect(result.current).toBe(part);
    // Another tab, a new revision or no result: the set as it is.
    rerender({ set: merged, rev: 3, tab: 'leanSteer' });
    expect(result.current).toBe(merged);
    const again = computeCurves({ design, kinds: CHART_CURVES.leanSteer });
    rerender({ set: again, rev: 4, tab: 'leanSteer' });
    expect(result.current).toBe(again);
    rerender({ set: null, rev: 4, tab: 'leanSteer' });
    expect(result.current).toBeNull();
  });

  it('a marker at the same point is the same object; a moved one is new', () => {
    const m = { leanDeg: 5, handlebarDeg: -3, travelMm: 0, ackermann: { innerDeg: 10, outerDeg: 8 } };
    expect(sameMarker(m, { ...m, ackermann: { ...m.ackermann } })).toBe(m);
    const moved = { ...m, ackermann: { innerDeg: 10, outerDeg: 8.01 } };
    expect(sameMarker(m, moved)).toBe(moved);
    const leaned = { ...m, leanDeg: 6 };
    expect(sameMarker(m, leaned)).toBe(leaned);
    const none = { ...m, ackermann: null };
    expect(sameMarker(m, none)).toBe(none);
  });
});
