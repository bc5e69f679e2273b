/**
 * The hardpoint table's rate column: runs core's sensitivity for the design on screen in the
 * sweep worker (its own client, so the plots keep theirs), with progress and cancel, and says
 * when the result is from before the last edit.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { DesignFile } from '../../core/design/types';
import { CancelledError, SweepClient } from '../workers/sweepClient';
import type { SensitivityData } from '../workers/sensitivityJob';

export type SensitivityState =
  | { phase: 'idle' }
  | { phase: 'running'; done: number; total: number }
  | { phase: 'done'; data: SensitivityData; forDesign: DesignFile }
  | { phase: 'failed'; message: string };

export function useSensitivity(design: DesignFile, client?: SweepClient) {
  const own = useRef<SweepClient | null>(null);
  const [state, setState] = useState<SensitivityState>({ phase: 'idle' });
  const get = useCallback(() => client ?? (own.current ??= new SweepClient()), [client]);
  useEffect(() => () => own.current?.dispose(), []);

  const run = useCallback(() => {
    setState({ phase: 'running', done: 0, total: 1 });
    const forDesign = design;
    get()
      .sensitivity({ design }, (done, total) => setState({ phase: 'running', done, total }))
      .then((data) => setState({ phase: 'done', data, forDesign }))
      .catch((e: unknown) => {
        if (e instanceof CancelledError) setState({ phase: 'idle' });
        else setState({ phase: 'failed', message: e instanceof Error ? e.message : String(e) });
      });
  }, [design, get]);

  const cancel = useCallback(() => get().cancel(), [get]);
  const stale = state.phase === 'done' && state.forDesign !== design;
  return { state, run, cancel, stale };
}

/** "+0.041" style, with the unit; a dash where absent. */
export function rateText(x: number | null | undefined, unit: string): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–';
  const digits = Math.abs(x) >= 0.1 ? 2 : 3;
  // A rate that rounds to zero is shown unsigned (no "-0.000").
  if (Math.abs(x) < 0.5 * 10 ** -digits) return `0.000 ${unit}`;
  return `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(digits)} ${unit}`;
}
