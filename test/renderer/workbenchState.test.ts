// The workbench's stores: the document holds the design and its history only, the pose store
// follows it, UI state is per workbench, and the jobs store runs, reports and cancels the
// plots' sweeps.
import { describe, expect, it } from 'vitest';
import { setCoordinate, setField } from '../../renderer/model/designActions';
import { createWorkbench } from '../../renderer/state/workbench';
import { setGizmo, setPlayback } from '../../renderer/state/uiStore';
import { Jobs } from '../../renderer/state/jobsStore';
import { createDocumentStore } from '../../renderer/state/documentStore';
import { CancelledError, SweepClient } from '../../renderer/workers/sweepClient';
import type { CurveSet } from '../../core/report/charts/chartData';
import { demoDesign, demoWorkbench } from './helpers';

describe('document and pose stores', () => {
  it('the document holds the design, its text, file and history, and nothing solved', () => {
    const wb = demoWorkbench();
    expect(Object.keys(wb.document.getState()).sort()).toEqual(['design', 'designText', 'dirty', 'doc', 'history', 'revision']);
  });

  it('every change of the design is solved again, and the pose store has heard of it before the document’s other listeners', () => {
    const wb = demoWorkbench();
    wb.actions.setPose({ handlebarDeg: 10 });
    const seen: string[] = [];
    wb.document.subscribe((d) => {
      // The outcome the pose store holds is already the one of this design.
      seen.push(`${d.revision}:${wb.pose.getState().outcome.snapshot!.points['upright.steeringArmJoint.right'][0].toFixed(3)}`);
    });
    const before = wb.pose.getState().outcome;
    wb.actions.perform(setCoordinate, { rowId: 'upright.steeringArmJoint.right', axis: 'x', value: -90 });
    const after = wb.pose.getState().outcome;
    expect(after).not.toBe(before);
    expect(after.analysis!.wheels.right.toeDeg).not.toBeCloseTo(before.analysis!.wheels.right.toeDeg, 6);
    expect(seen).toEqual([`1:${after.snapshot!.points['upright.steeringArmJoint.right'][0].toFixed(3)}`]);
  });

  it('an invalid design is not solved and has no drawing; fixing it brings both back', () => {
    const wb = demoWorkbench();
    wb.actions.perform(setField, { path: 'wheels.front.rollingRadiusMm', value: -5 });
    expect(wb.pose.getState().outcome.status).toBe('invalid-design');
    expect(wb.pose.getState().drawing).toBeNull();
    wb.actions.undo();
    expect(wb.pose.getState().outcome.reached).toBe(true);
    expect(wb.pose.getState().drawing?.tubes.length).toBeGreaterThan(0);
  });

  it('loading a design starts from the design pose, with nothing selected, and solves it', () => {
    const wb = demoWorkbench();
    wb.actions.setContact('travel');
    wb.actions.setPose({ leanDeg: 15, handlebarDeg: 8 });
    wb.actions.select('steering.pivot');
    wb.actions.loadDesign(demoDesign('wren-rack-trike'), { fileName: 'wren.tiltsheet', filePath: null, savedText: null });
    const { pose, outcome } = wb.pose.getState();
    expect(pose).toMatchObject({ leanDeg: 0, handlebarDeg: 0, contact: 'travel' });
    expect(outcome.snapshot!.inputs.leanDeg).toBe(0);
    expect(wb.ui.getState().selection).toBeNull();
    expect(wb.document.getState().history.past).toHaveLength(0);
  });

  it('pose and dialogs are not document state: changing them tells no document listener', () => {
    const wb = demoWorkbench();
    let documentCalls = 0;
    let poseCalls = 0;
    wb.document.subscribe(() => documentCalls++);
    wb.pose.subscribe(() => poseCalls++);
    wb.actions.setPose({ leanDeg: 5 });
    wb.actions.setRide({ on: true, speedKmh: 20 });
    wb.actions.showNotice({ kind: 'info', title: 'hello', lines: [] });
    expect(poseCalls).toBe(2);
    expect(documentCalls).toBe(0);
    expect(wb.ui.getState().notice?.title).toBe('hello');
  });
});

describe('UI store', () => {
  it('belongs to its workbench: two workbenches do not share selection, gizmo or playback', () => {
    const a = demoWorkbench();
    const b = demoWorkbench();
    a.actions.select('steering.pivot');
    setGizmo(a.ui, { constraint: 'z' });
    setPlayback(a.ui, { speedDegPerS: 45 });
    expect(b.ui.getState().selection).toBeNull();
    expect(b.ui.getState().gizmo.constraint).toBe('free');
    expect(b.ui.getState().playback.speedDegPerS).toBe(20);
  });
});

/** A sweep client whose jobs the test settles by hand. */
class ManualClient {
  pending: { kind: string; resolve(v: unknown): void; reject(e: Error): void; progress?: (d: number, t: number) => void } | null = null;
  curves(_req: unknown, progress?: (d: number, t: number) => void) {
    return this.start('curves', progress);
  }
  map(_req: unknown, progress?: (d: number, t: number) => void) {
    return this.start('map', progress);
  }
  cancel() {
    const p = this.pending;
    this.pending = null;
    p?.reject(new CancelledError());
  }
  dispose() {
    this.cancel();
  }
  private start(kind: string, progress?: (d: number, t: number) => void) {
    this.cancel();
    return new Promise((resolve, reject) => {
      this.pending = { kind, resolve, reject, progress };
    });
  }
}

const flush = () => new Promise((r) => setTimeout(r, 0));

describe('jobs store', () => {
  const setup = () => {
    const client = new ManualClient();
    const document = createDocumentStore(demoDesign(), { fileName: 'x.tiltsheet', filePath: null, savedText: null });
    return { client, document, jobs: new Jobs(document, client as unknown as SweepClient) };
  };

  it('reports progress, then the result with the revision it is for', async () => {
    const { client, jobs } = setup();
    jobs.runCurves();
    expect(jobs.store.getState().curves.progress).toEqual({ done: 0, total: 1 });
    client.pending!.progress!(3, 8);
    expect(jobs.store.getState().curves.progress).toEqual({ done: 3, total: 8 });
    const result = { marker: 'curves' } as unknown as CurveSet;
    client.pending!.resolve(result);
    await flush();
    const slot = jobs.store.getState().curves;
    expect(slot.progress).toBeNull();
    expect(slot.result).toBe(result);
    expect(slot.resultRevision).toBe(0);
    expect(slot.request?.revision).toBe(0);
  });

  it('a failed job keeps its message; cancel stops a job and keeps it counted as asked for', async () => {
    const { client, jobs } = setup();
    jobs.runMap('coarse');
    expect(jobs.store.getState().map.request?.angleStepDeg).toBeGreaterThan(0);
    client.pending!.reject(new Error('no pose closed'));
    await flush();
    expect(jobs.store.getState().map).toMatchObject({ progress: null, error: 'no pose closed', result: null });
    jobs.runCurves();
    jobs.cancel();
    await flush();
    expect(jobs.store.getState().curves).toMatchObject({ progress: null, error: null, result: null });
    expect(jobs.store.getState().curves.request?.revision).toBe(0);
  });

  it('starting one job stops the other, which is then asked for again', async () => {
    const { client, jobs } = setup();
    jobs.runCurves();
    jobs.runMap('fine');
    await flush();
    expect(client.pending!.kind).toBe('map');
    expect(jobs.store.getState().curves).toMatchObject({ progress: null, request: null });
    expect(jobs.store.getState().map.progress).not.toBeNull();
  });

  it('runs for real on the main thread when no worker exists', async () => {
    const wb = createWorkbench(demoDesign('wren-rack-trike'), { fileName: 'w.tiltsheet', filePath: null, savedText: null }, { sweepClient: new SweepClient(null) });
    wb.jobs.runMap('coarse');
    await expect.poll(() => wb.jobs.store.getState().map.result, { timeout: 20_000 }).not.toBeNull();
    const map = wb.jobs.store.getState().map.result!;
    expect(map.cells.length).toBe(map.lean.length * map.handlebar.length);
  });
});
