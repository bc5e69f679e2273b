// The fix column's hidden tabs are not rendered again for nothing (issue 11, speed): while only
// the pose changes (playback) and while the region check reports its progress, the "All
// hardpoints" table (hundreds of inputs) and the studies' forms commit nothing, and while the
// rates run the table's rows are not written at each progress step (DOM MutationObserver on its
// inputs); an edit of the design does render the table (so the counter does see renders).
// Counted with React's <Profiler onRender>, which is called for every commit inside it.
import { act, cleanup, render, waitFor } from '@testing-library/react';
import { Profiler, type ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { FixColumn } from '../../renderer/app/FixColumn';
import { FixJobsProvider, useFixJobs, type FixJobs } from '../../renderer/app/fixJobs';
import { setCoordinate } from '../../renderer/model/designActions';
import type { JobKind, JobKinds } from '../../renderer/workers/sweepProtocol';
import { demoWorkbench, withWorkbench } from './helpers';

const commits = { table: 0, studies: 0 };

function counted(id: keyof typeof commits, children: ReactNode) {
  return (
    <Profiler id={id} onRender={() => (commits[id] += 1)}>
      {children}
    </Profiler>
  );
}

// FixColumn's own table and studies panel, each inside a Profiler.
vi.mock('../../renderer/panels/HardpointTable', async (original) => {
  const m = await original<typeof import('../../renderer/panels/HardpointTable')>();
  return { ...m, HardpointTable: () => counted('table', <m.HardpointTable />) };
});
vi.mock('../../renderer/studies/StudiesPanel', async (original) => {
  const m = await original<typeof import('../../renderer/studies/StudiesPanel')>();
  return { ...m, StudiesPanel: () => counted('studies', <m.StudiesPanel />) };
});

// The rates job reports progress steps before it runs (the in-test worker answers at once, with no
// steps between), so there are progress steps to render or not.
vi.mock('../../renderer/workers/sweepClient', async (original) => {
  const m = await original<typeof import('../../renderer/workers/sweepClient')>();
  class SteppedClient extends m.SweepClient {
    override async job<K extends JobKind>(kind: K, request: JobKinds[K]['request'], onProgress?: (done: number, total: number) => void): Promise<JobKinds[K]['data']> {
      if (kind === 'sensitivity' && onProgress) {
        for (let i = 1; i <= 5; i++) {
          onProgress(i, 10);
          await new Promise((r) => setTimeout(r, 20));
        }
      }
      return super.job(kind, request, onProgress);
    }
  }
  return { ...m, SweepClient: SteppedClient };
});

afterEach(cleanup);

let jobs: FixJobs | null = null;
function GrabJobs() {
  jobs = useFixJobs();
  return null;
}

describe('fix column renders', () => {
  it("hidden tabs do not render while only the pose changes or the check reports progress; the table's rows not at the rates' progress steps", async () => {
    const wb = demoWorkbench('finch-knuckle-steered-trike');
    render(
      withWorkbench(
        wb,
        <FixJobsProvider auto={false}>
          <GrabJobs />
          <FixColumn />
        </FixJobsProvider>,
      ),
    );
    expect(commits.table).toBeGreaterThan(0);
    commits.table = 0;
    commits.studies = 0;

    // Playback's poses: lean and handlebar change, the design does not.
    for (let i = 1; i <= 20; i++) act(() => wb.actions.setPose({ leanDeg: i, handlebarDeg: -i / 2 }, true));
    expect(wb.pose.getState().pose.leanDeg).toBe(20);
    expect(commits).toEqual({ table: 0, studies: 0 });

    // The region check: running with progress steps, then done (the findings count changes).
    const states: string[] = [];
    act(() => jobs!.check.run({ design: wb.document.getState().design }));
    await waitFor(
      () => {
        states.push(jobs!.check.state.phase);
        expect(jobs!.check.state.phase).toBe('done');
      },
      { timeout: 60_000 },
    );
    expect(states).toContain('running');
    expect(commits).toEqual({ table: 0, studies: 0 });

    // The rates: while they run, the table's rows are not written again at each progress step
    // (only the bar above them); when they arrive, the rows are rendered once with them.
    const table = document.querySelector('[data-testid="hardpoint-table"] tbody')!;
    let rowCommits = 0;
    const rateStates: string[] = [];
    const seen = new MutationObserver((records) => {
      if (records.some((r) => r.type === 'attributes' && (r.target as HTMLElement).dataset?.testid?.startsWith('hp-'))) rowCommits += 1;
    });
    seen.observe(table, { subtree: true, attributes: true });
    act(() => jobs!.rates.run());
    await waitFor(
      () => {
        const st = jobs!.rates.state;
        rateStates.push(st.phase === 'running' ? `running ${st.done}/${st.total}` : st.phase);
        expect(st.phase).toBe('done');
      },
      { timeout: 60_000, interval: 5 },
    );
    await act(async () => new Promise((r) => setTimeout(r, 50)));
    seen.disconnect();
    // Several progress steps were seen (so the count below means something).
    expect(new Set(rateStates.filter((x) => x.startsWith('running'))).size).toBeGreaterThan(2);
    expect(document.querySelector('[data-testid^="rate-"]')).not.toBeNull();
    expect(rowCommits).toBeLessThanOrEqual(1);

    // An edit of the design does render the table (the counter sees renders).
    act(() => {
      wb.actions.perform(setCoordinate, { rowId: 'upright.steeringArmJoint.right', axis: 'y', value: -340 });
    });
    expect(commits.table).toBeGreaterThan(0);
  }, 120_000);
});

describe('hidden Numbers tab', () => {
  it('does not commit while its tab is closed and the pose changes, and shows the current pose when opened', async () => {
    const { PlotsPanel } = await import('../../renderer/charts/PlotsPanel');
    const { ReadoutPanel } = await import('../../renderer/panels/ReadoutPanel');
    const wb = demoWorkbench();
    let numbers = 0;
    render(
      withWorkbench(
        wb,
        <PlotsPanel
          numbers={
            <Profiler id="numbers" onRender={() => (numbers += 1)}>
              <ReadoutPanel />
            </Profiler>
          }
        />,
      ),
    );
    const body = document.querySelector('[data-testid="readouts"]')!;
    const before = body.textContent;
    numbers = 0;
    // Updates of a hidden Activity wait for idle time; act() would flush them, so the poses are set outside it.
    for (let i = 1; i <= 10; i++) wb.actions.setPose({ leanDeg: 2 * i, handlebarDeg: i }, true);
    await new Promise((r) => setTimeout(r, 0));
    expect(numbers).toBe(0);
    // Opened, the tab renders the pose now (its text differs from the design pose's).
    act(() => wb.ui.setState({ plots: { ...wb.ui.getState().plots, open: true, numbers: true } }));
    expect(numbers).toBeGreaterThan(0);
    expect(document.querySelector('[data-testid="readouts"]')!.textContent).not.toBe(before);
  });
});
