// When the plots ask for a sweep after an edit (issue 11, speed): at once after a quiet spell,
// after a short pause within a burst of edits, never during a gizmo drag (once it ends), and
// the plots themselves wait for the viewport's first frame.
import { act, cleanup, render, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { PlotsPanel } from '../../renderer/charts/PlotsPanel';
import { FIRST_FRAME_WAIT_MS, useAfterFirstFrame } from '../../renderer/charts/afterFirstFrame';
import { SweepClient } from '../../renderer/workers/sweepClient';
import type { CurveRequest } from '../../renderer/workers/sweepJobs';
import type { CurveSet } from '../../core/report/charts/chartData';
import { createWorkbench } from '../../renderer/state/workbench';
import { designToText } from '../../renderer/model/designText';
import { demoDesign, withWorkbench } from './helpers';

afterEach(cleanup);

/** A sweep client that records the revisions asked for and never answers (the job stays running). */
class RecordingClient extends SweepClient {
  asked: number[] = [];
  constructor() {
    super(null);
  }
  override curves(request: CurveRequest): Promise<CurveSet> {
    this.asked.push((request as CurveRequest & { revision: number }).revision);
    return new Promise(() => {});
  }
}

function workbench() {
  const design = demoDesign('heron-tilting-velomobile');
  const client = new RecordingClient();
  const wb = createWorkbench(design, { fileName: 'heron.tiltsheet', filePath: null, savedText: designToText(design) }, { sweepClient: client });
  return { wb, client };
}

const wait = (ms: number) => act(() => new Promise<void>((r) => setTimeout(r, ms)));
const JOINT = 'upright.steeringArmJoint.left';
const at = (x: number) => ({ x, y: 341.4, z: 200 });

describe('plots recompute timing', () => {
  it('asks in the same task as an edit after a quiet spell, after a pause within a burst', async () => {
    const { wb, client } = workbench();
    render(withWorkbench(wb, <PlotsPanel />));
    // Mounting asks for the design as it is.
    expect(client.asked).toEqual([wb.document.getState().revision]);
    await wait(350);
    // A quiet spell: the edit's job is asked before anything else runs (no timer, no render).
    act(() => wb.actions.dragPoint(JOINT, at(-80)));
    const r1 = wb.document.getState().revision;
    expect(client.asked.at(-1)).toBe(r1);
    // Right after it, a burst: nothing is asked until the edits pause.
    act(() => {
      wb.actions.dragPoint(JOINT, at(-81));
      wb.actions.dragPoint(JOINT, at(-82));
    });
    const r3 = wb.document.getState().revision;
    expect(r3).toBe(r1 + 2);
    expect(client.asked.at(-1)).toBe(r1);
    await wait(80);
    // Only the last design of the burst is asked for.
    expect(client.asked.slice(-2)).toEqual([r1, r3]);
  });

  it('asks nothing during a gizmo drag, and once when it ends', async () => {
    const { wb, client } = workbench();
    render(withWorkbench(wb, <PlotsPanel />));
    await wait(350);
    const before = client.asked.length;
    act(() => {
      wb.actions.select(JOINT);
      wb.actions.beginDrag();
    });
    for (let k = 1; k <= 4; k++) {
      act(() => wb.actions.dragPoint(JOINT, at(-75 - k)));
      await wait(60);
    }
    // Held still mid-drag, longer than any pause the plots wait for.
    await wait(400);
    expect(client.asked.length).toBe(before);
    act(() => wb.actions.endDrag());
    await wait(80);
    expect(client.asked.length).toBe(before + 1);
    expect(client.asked.at(-1)).toBe(wb.document.getState().revision);
  });
});

describe('plots wait for the first frame', () => {
  it('is false until the viewport has drawn a frame, then true', async () => {
    const stats = { frames: 0 };
    const { result } = renderHook(() => useAfterFirstFrame(stats));
    await wait(60);
    expect(result.current).toBe(false);
    stats.frames = 1;
    await wait(100);
    expect(result.current).toBe(true);
  });

  it('gives up waiting after its limit (no WebGL, no frame ever)', async () => {
    vi.useFakeTimers();
    try {
      const { result } = renderHook(() => useAfterFirstFrame({ frames: 0 }));
      await act(() => vi.advanceTimersByTimeAsync(FIRST_FRAME_WAIT_MS - 100));
      expect(result.current).toBe(false);
      await act(() => vi.advanceTimersByTimeAsync(200));
      expect(result.current).toBe(true);
    } finally {
      vi.useRealTimers();
    }
  });
});
