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
