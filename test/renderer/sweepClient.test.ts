// The sweep client: progress, cancel, and the main-thread fallback when no worker can start.
import { describe, expect, it } from 'vitest';
import { CancelledError, SweepClient } from '../../renderer/workers/sweepClient';
import { computeMap } from '../../renderer/workers/sweepJobs';
import { demoDesign } from './helpers';

/** A stand-in worker that never loads (as a file:// page may refuse module workers). */
class BrokenWorker {
  onmessage: ((e: MessageEvent) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  postMessage(): void {
    setTimeout(() => this.onerror?.({ message: 'refused', preventDefault() {} } as unknown as ErrorEvent), 5);
  }
  terminate(): void {}
}

describe('sweep client', () => {
  it('runs on the main thread when no worker exists, with progress', async () => {
    const client = new SweepClient(null);
    const seen: number[] = [];
    const map = await client.map({ design: demoDesign('wren-rack-trike'), angleStepDeg: 10 }, (done) => seen.push(done));
    expect(map.cells.length).toBe(map.lean.length * map.handlebar.length);
    expect(seen.length).toBeGreaterThan(0);
  });

  it('falls back to the main thread when the worker fails to load, for the same job', async () => {
    const client = new SweepClient(() => new BrokenWorker() as unknown as Worker);
    const request = { design: demoDesign('heron-tilting-velomobile'), angleStepDeg: 10 };
    const map = await client.map(request);
    expect(client.usesWorker).toBe(false);
    // The same job run on the main thread directly: every cell, verdict, region flag and
    // balanced line the same (only the time it took differs).
    const reference = computeMap(request);
    expect(map.cells.length).toBeGreaterThan(0);
    expect(map.balancedLines.length).toBeGreaterThan(0);
    expect({ ...map, elapsedMs: 0 }).toEqual({ ...reference, elapsedMs: 0 });
  });

  it('cancel rejects the running job with CancelledError', async () => {
    const client = new SweepClient(null);
    const job = client.curves({ design: demoDesign('wren-rack-trike') });
    client.cancel();
    await expect(job).rejects.toBeInstanceOf(CancelledError);
  });
});

/**
 * A stand-in worker that answers a job with the main thread's own result after `delayMs`, and
 * counts how many were made and terminated (the client's warm-worker bookkeeping).
 */
class FakeWorker {
  static made = 0;
  static terminated = 0;
  onmessage: ((e: MessageEvent) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  dead = false;
  private timer: ReturnType<typeof setTimeout> | undefined;
  /** The ids of the jobs posted to this worker. */
  readonly posted: number[] = [];
  constructor(private readonly delayMs: number) {
    FakeWorker.made++;
    FakeWorker.all.push(this);
  }
  static all: FakeWorker[] = [];
  postMessage(req: { id: number; kind: 'map'; request: Parameters<typeof computeMap>[0] }): void {
    this.posted.push(req.id);
    this.timer = setTimeout(() => {
      if (!this.dead) this.onmessage?.({ data: { id: req.id, type: 'done', data: computeMap(req.request) } } as MessageEvent);
    }, this.delayMs);
  }
  terminate(): void {
    this.dead = true;
    clearTimeout(this.timer);
    FakeWorker.terminated++;
  }
}

describe('sweep client keeps a worker warm', () => {
  const request = { design: demoDesign('wren-rack-trike'), angleStepDeg: 10 };
  const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

  it('keeps an idle worker on cancel, and replaces a busy one by a spare started after a job', async () => {
    FakeWorker.made = 0;
    FakeWorker.terminated = 0;
    const client = new SweepClient(() => new FakeWorker(40) as unknown as Worker);
    const first = await client.map(request);
    expect(first.cells.length).toBe(first.lean.length * first.handlebar.length);
    expect(FakeWorker.made).toBe(1);
    // Cancelling with nothing running stops no worker.
    client.cancel();
    expect(FakeWorker.terminated).toBe(0);
    // A spare is started a moment after the job ended, and warmed on the last job (id 0,
    // whose answer nobody waits for).
    await wait(300);
    expect(FakeWorker.made).toBe(2);
    const spare = FakeWorker.all.at(-1)!;
    expect(spare.posted).toEqual([0]);
    // A job cancelled mid-way: its worker is terminated and the spare takes the next job, so no
    // worker is made for it.
    const stale = client.map(request);
    const fresh = client.map(request);
    await expect(stale).rejects.toBeInstanceOf(CancelledError);
    expect(FakeWorker.terminated).toBe(1);
    expect(FakeWorker.made).toBe(2);
    const map = await fresh;
    expect(spare.posted.length).toBe(2);
    expect(spare.posted[1]).toBeGreaterThan(0);
    expect({ ...map, elapsedMs: 0 }).toEqual({ ...computeMap(request), elapsedMs: 0 });
    client.dispose();
    expect(FakeWorker.terminated).toBe(FakeWorker.made);
  });

  it('drops a spare that fails to load and makes a fresh worker for the next job', async () => {
    let n = 0;
    const made: FakeWorker[] = [];
    const client = new SweepClient(() => {
      const w = new FakeWorker(10);
      made.push(w);
      // The second worker (the spare) fails to load.
      if (++n === 2) setTimeout(() => w.onerror?.({ message: 'refused', preventDefault() {} } as unknown as ErrorEvent), 5);
      return w as unknown as Worker;
    });
    await client.map(request);
    await wait(300);
    expect(made.length).toBe(2);
    expect(made[1].dead).toBe(true);
    // Cancel a running job: no spare left, so the next job gets a new worker and still resolves.
    const stale = client.map(request);
    const fresh = client.map(request);
    await expect(stale).rejects.toBeInstanceOf(CancelledError);
    expect((await fresh).cells.length).toBeGreaterThan(0);
    expect(made.length).toBe(3);
    expect(client.usesWorker).toBe(true);
    client.dispose();
  });
});
