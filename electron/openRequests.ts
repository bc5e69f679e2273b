/**
 * Designs named by a later launch of the app, waiting for the first window to take them. The
 * single-instance lock ends the later launch and hands its path here; the renderer asks for
 * the next one with an invoke that stays pending until a path arrives (no push channel, so the
 * preload keeps exposing invokes only). A path that arrives before the page asks is queued.
 */
const MAX_QUEUED = 16;

export class OpenRequests {
  private queued: string[] = [];
  private waiting: ((filePath: string) => void)[] = [];

  push(filePath: string): void {
    if (this.waiting.length > 0) {
      // Every waiter gets it: a reloaded page leaves a waiter behind whose answer goes nowhere.
      const waiting = this.waiting;
      this.waiting = [];
      for (const resolve of waiting) resolve(filePath);
      return;
    }
    this.queued.push(filePath);
    if (this.queued.length > MAX_QUEUED) this.queued.shift();
  }

  next(): Promise<string> {
    const first = this.queued.shift();
    if (first !== undefined) return Promise.resolve(first);
    return new Promise((resolve) => this.waiting.push(resolve));
  }
}
