/**
 * Ctrl-C and SIGTERM during a long write. The solver runs synchronously, and Node delivers a
 * signal to a listener only when the event loop turns, so a command that writes a file works
 * in slices and yields between them (`nextTurn`); a signal seen there stops the work, the
 * temporary file is removed and nothing is written. Without a listener Node would end the
 * process at once and leave the temporary file.
 */
export type StopSignal = 'SIGINT' | 'SIGTERM';

export interface InterruptWatch {
  /** The first signal received since the watch began, or null. */
  received(): StopSignal | null;
  release(): void;
}

export function watchInterrupts(): InterruptWatch {
  let got: StopSignal | null = null;
  const onInt = () => void (got ??= 'SIGINT');
  const onTerm = () => void (got ??= 'SIGTERM');
  process.on('SIGINT', onInt);
  process.on('SIGTERM', onTerm);
  return {
    received: () => got,
    release: () => {
      process.removeListener('SIGINT', onInt);
      process.removeListener('SIGTERM', onTerm);
    },
  };
}

/** Let the event loop turn once (signals, I/O) before the next slice of work. */
export const nextTurn = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));
