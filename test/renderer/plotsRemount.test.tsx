// The plots ask again when they are mounted again (issue 11, e2e legibility): a panel taken
// away cancels its running sweep and forgets it, so the panel mounted next asks for the design
// anew. React's StrictMode (the development build, which the e2e project's build is: vitest sets
// NODE_ENV=test) mounts, unmounts and mounts every component once; the cancelled first job used to
// stay "asked for" and the charts said "Nothing computed yet." for good.
import { StrictMode } from 'react';
import { act, cleanup, render } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { PlotsPanel } from '../../renderer/charts/PlotsPanel';
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

describe('plots mounted again', () => {
  it('under StrictMode (mount, unmount, mount) a sweep is running for the design after mounting', async () => {
    const { wb, client } = workbench();
    render(
      <StrictMode>
        {withWorkbench(wb, <PlotsPanel />)}
      </StrictMode>,
    );
    // The second mount asks after the burst pause (40 ms: the first ask was just now).
    await act(() => new Promise<void>((r) => setTimeout(r, 150)));
    const slot = wb.jobs.store.getState().curves;
    expect(slot.progress, 'a job running').not.toBeNull();
    expect(slot.request?.revision).toBe(wb.document.getState().revision);
    expect(client.asked.length).toBeGreaterThanOrEqual(1);
  });

  it('a panel unmounted mid-job and mounted again asks again; the Cancel button still keeps the job counted as asked', () => {
    const { wb, client } = workbench();
    const first = render(withWorkbench(wb, <PlotsPanel />));
    expect(client.asked).toEqual([0]);
    first.unmount();
    expect(wb.jobs.store.getState().curves.progress).toBeNull();
    render(withWorkbench(wb, <PlotsPanel />));
    expect(client.asked).toEqual([0, 0]);
    expect(wb.jobs.store.getState().curves.progress).not.toBeNull();
    // The user's cancel is not undone by an ask at once.
    wb.jobs.cancel();
    expect(wb.jobs.store.getState().curves.progress).toBeNull();
    expect(client.asked).toEqual([0, 0]);
  });
});
