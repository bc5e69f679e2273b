/**
 * A design study run in the sweep worker on request: its own client (the plots keep theirs),
 * progress, cancel, and whether the result is from before the last edit of the design.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { DesignFile } from '../../core/design/types';
import { CancelledError, SweepClient } from '../workers/sweepClient';
import type { JobKind, JobKinds } from '../workers/sweepProtocol';

export type StudyJobState<T> =
  | { phase: 'idle' }
  | { phase: 'running'; done: number; total: number; startedAt: number }
  | { phase: 'done'; data: T; forDesign: DesignFile }
  | { phase: 'failed'; message: string };

export function useStudyJob<K extends JobKind>(kind: K, design: DesignFile, client?: SweepClient) {
  const own = useRef<SweepClient | null>(null);
  const [state, setState] = useState<StudyJobState<JobKinds[K]['data']>>({ phase: 'idle' });
  const get = useCallback(() => client ?? (own.current ??= new SweepClient()), [client]);
  useEffect(() => () => own.current?.dispose(), []);

  const run = useCallback(
    (request: JobKinds[K]['request']) => {
      const startedAt = Date.now();
      setState({ phase: 'running', done: 0, total: 1, startedAt });
      const forDesign = design;
      get()
        .job(kind, request, (done, total) => setState({ phase: 'running', done, total, startedAt }))
        .then((data) => setState({ phase: 'done', data, forDesign }))
        .catch((e: unknown) => {
          if (e instanceof CancelledError) setState({ phase: 'idle' });
          else setState({ phase: 'failed', message: e instanceof Error ? e.message : String(e) });
        });
    },
    [design, get, kind],
  );

  const cancel = useCallback(() => get().cancel(), [get]);
  const reset = useCallback(() => setState({ phase: 'idle' }), []);
  const stale = state.phase === 'done' && state.forDesign !== design;
  return { state, run, cancel, reset, stale };
}
