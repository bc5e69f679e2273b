/// <reference lib="webworker" />
// The sweep worker: runs core's sweeps and studies off the main thread and reports progress.
// Cancelling a job terminates the worker (the client starts a fresh one).
import { runJob } from './runJob';
import type { SweepRequest, SweepResponse } from './sweepProtocol';

const post = (m: SweepResponse) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = (event: MessageEvent<SweepRequest>) => {
  const req = event.data;
  const progress = (done: number, total: number) => post({ id: req.id, type: 'progress', done, total });
  try {
    post({ id: req.id, type: 'done', data: runJob(req, progress) });
  } catch (e) {
    post({ id: req.id, type: 'error', message: e instanceof Error ? e.message : String(e) });
  }
};
