/// <reference lib="webworker" />
// The sweep worker: runs core's sweeps off the main thread and reports progress. Cancelling a
// job terminates the worker (the client starts a fresh one).
import { computeCurves, computeMap } from './sweepJobs';
import { computeSensitivity } from './sensitivityJob';
import type { SweepRequest, SweepResponse } from './sweepProtocol';

const post = (m: SweepResponse) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = (event: MessageEvent<SweepRequest>) => {
  const req = event.data;
  const progress = (done: number, total: number) => post({ id: req.id, type: 'progress', done, total });
  try {
    if (req.kind === 'curves') post({ id: req.id, type: 'curves', data: computeCurves(req.request, progress) });
    else if (req.kind === 'map') post({ id: req.id, type: 'map', data: computeMap(req.request, progress) });
    else post({ id: req.id, type: 'sensitivity', data: computeSensitivity(req.request, progress) });
  } catch (e) {
    post({ id: req.id, type: 'error', message: e instanceof Error ? e.message : String(e) });
  }
};
