/**
 * Runs sweeps in a Web Worker with progress and cancel. One job per client at a time: a new
 * job, or cancel(), stops the running one (the worker is terminated and replaced). Where no
 * worker can be started, the job runs on the main thread after a paint (slower, no cancel).
 *
 * Speed: a worker that was terminated mid-job is replaced by a spare that has already loaded
 * its module (started while the client was idle), so the job after a cancel does not wait for
 * a module load; a worker that is idle when a job is cancelled is kept (nothing to stop). The
 * spare repeats the last curves or map job once, unanswered, so its JIT is warm too.
 */
import type { CurveSet, EnvelopeMapData } from '../../core/report/charts/chartData';
import type { CurveRequest, MapRequest } from './sweepJobs';
import type { SensitivityData, SensitivityRequest } from './sensitivityJob';
import { runJob } from './runJob';
import type { JobKind, JobKinds, SweepRequest, SweepResponse } from './sweepProtocol';

export class CancelledError extends Error {
  constructor() {
    super('cancelled');
    this.name = 'CancelledError';
  }
}

type Pending = {
  id: number;
  request: SweepRequest;
  resolve(v: unknown): void;
  reject(e: Error): void;
  progress?: (done: number, total: number) => void;
  /** Whether the worker has answered this job at all. */
  heard: boolean;
};

export type WorkerFactory = () => Worker;

/** Quiet time after a job before the spare worker is started, ms. */
const SPARE_DELAY_MS = 200;
/** The id of a spare worker's warm-up job (real jobs count from 1). */
const WARM_UP_ID = 0;

export const defaultWorkerFactory: WorkerFactory = () => new Worker(new URL('./sweepWorker.ts', import.meta.url), { type: 'module', name: 'tiltbench-sweeps' });

export class SweepClient {
  private worker: Worker | null = null;
  /** A worker started ahead, idle, to replace one terminated mid-job. */
  private spare: Worker | null = null;
  private spareTimer: ReturnType<typeof setTimeout> | null = null;
  private pending: Pending | null = null;
  /** The last curves or map job asked for (cheap to repeat): a new spare worker's warm-up. */
  private lastChartJob: SweepRequest | null = null;
  private nextId = 1;
  private workerBroken = false;

  constructor(private readonly factory: WorkerFactory | null = typeof Worker === 'undefined' ? null : defaultWorkerFactory) {}

  get usesWorker(): boolean {
    return this.factory !== null && !this.workerBroken;
  }

  /** Any job of the protocol's table (sweepProtocol.ts). */
  job<K extends JobKind>(kind: K, request: JobKinds[K]['request'], progress?: (done: number, total: number) => void): Promise<JobKinds[K]['data']> {
    return this.run({ id: this.nextId++, kind, request } as SweepRequest, progress) as Promise<JobKinds[K]['data']>;
  }

  curves(request: CurveRequest, progress?: (done: number, total: number) => void): Promise<CurveSet> {
    return this.job('curves', request, progress);
  }

  map(request: MapRequest, progress?: (done: number, total: number) => void): Promise<EnvelopeMapData> {
    return this.job('map', request, progress);
  }

  sensitivity(request: SensitivityRequest, progress?: (done: number, total: number) => void): Promise<SensitivityData> {
    return this.job('sensitivity', request, progress);
  }

  /** Stops the running job; its promise rejects with CancelledError. */
  cancel(): void {
    const p = this.pending;
    this.pending = null;
    // Only a worker busy with a job needs stopping; an idle one stays warm.
    if (this.worker && p) {
      this.worker.terminate();
      this.worker = this.takeSpare();
    }
    p?.reject(new CancelledError());
  }

  dispose(): void {
    this.cancel();
    if (this.spareTimer) clearTimeout(this.spareTimer);
    this.spareTimer = null;
    this.spare?.terminate();
    this.spare = null;
    this.worker?.terminate();
    this.worker = null;
  }

  /** The spare worker wired as the current one, or null (a new one is then made on demand). */
  private takeSpare(): Worker | null {
    const w = this.spare;
    this.spare = null;
    if (w) this.wire(w);
    return w;
  }

  /**
   * Starts a spare worker shortly after a job ends (not while one runs: the machine may have
   * two cores, and the job comes first). Its module loads in the background.
   */
  private prepareSpare(): void {
    if (this.spare || this.spareTimer || !this.factory || this.workerBroken) return;
    this.spareTimer = setTimeout(() => {
      this.spareTimer = null;
      if (this.spare || this.pending || !this.factory || this.workerBroken) return;
      try {
        const w = this.factory();
        // A spare that fails to load is dropped (the next worker is then made on demand, and
        // its failure handled as any other's).
        w.onerror = (e) => {
          e.preventDefault?.();
          if (this.spare === w) this.spare = null;
          w.terminate();
        };
        // Its JIT warmed on the last chart job (a cold worker's first sweep runs several times
        // slower); id 0 is never a real job's, so the answer is ignored.
        if (this.lastChartJob) w.postMessage({ ...this.lastChartJob, id: WARM_UP_ID });
        this.spare = w;
      } catch {
        // No spare: the next worker is made on demand.
      }
    }, SPARE_DELAY_MS);
  }

  private ensureWorker(): Worker | null {
    if (this.worker || !this.factory || this.workerBroken) return this.worker;
    try {
      this.worker = this.takeSpare() ?? this.wire(this.factory());
    } catch {
      this.workerBroken = true;
    }
    return this.worker;
  }

  private wire(w: Worker): Worker {
    w.onmessage = (e: MessageEvent<SweepResponse>) => this.onMessage(e.data);
    w.onerror = (e) => {
      // A worker that cannot load (a file:// page, a policy): run on the main thread from now on,
      // starting with the job it did not take.
      e.preventDefault?.();
      this.workerBroken = true;
      this.worker?.terminate();
      this.worker = null;
      const p = this.pending;
      if (!p) return;
      if (p.heard) {
        this.pending = null;
        p.reject(new Error(`the sweep worker failed: ${e.message || 'unknown error'}`));
      } else {
        this.runHere(p);
      }
    };
    return w;
  }

  private run(req: SweepRequest, progress?: (done: number, total: number) => void): Promise<unknown> {
    if (this.pending) this.cancel();
    if (req.kind === 'curves' || req.kind === 'map') this.lastChartJob = req;
    return new Promise((resolve, reject) => {
      const p: Pending = { id: req.id, request: req, resolve, reject, progress, heard: false };
      this.pending = p;
      const w = this.ensureWorker();
      if (w) w.postMessage(req);
      else this.runHere(p);
    });
  }

  /** Main-thread fallback, after the browser had a chance to paint the progress bar. */
  private runHere(p: Pending): void {
    setTimeout(() => {
      if (this.pending !== p) return;
      try {
        const data = runJob(p.request, p.progress);
        this.pending = null;
        p.resolve(data);
      } catch (e) {
        this.pending = null;
        p.reject(e instanceof Error ? e : new Error(String(e)));
      }
    }, 30);
  }

  private onMessage(m: SweepResponse): void {
    const p = this.pending;
    if (!p || p.id !== m.id) return;
    p.heard = true;
    if (m.type === 'progress') {
      p.progress?.(m.done, m.total);
      return;
    }
    this.pending = null;
    this.prepareSpare();
    if (m.type === 'error') p.reject(new Error(m.message));
    else p.resolve(m.data);
  }
}
