/**
 * The hardpoint table's rate column: runs core's sensitivity for the design on screen in the
 * sweep worker (its own client, so the plots keep theirs), with progress and cancel, and says
 * when the result is from before the last edit.
 */
import { useCallback } from 'react';
import type { DesignFile } from '../../core/design/types';
import type { SweepClient } from '../workers/sweepClient';
import { useStudyJob } from './useStudyJob';

export function useSensitivity(design: DesignFile, client?: SweepClient) {
  const job = useStudyJob('sensitivity', design, client);
  const { run: runJob } = job;
  const run = useCallback(() => runJob({ design }), [runJob, design]);
  return { state: job.state, run, cancel: job.cancel, stale: job.stale };
}

/** "+0.041" style, with the unit; a dash where absent. */
export function rateText(x: number | null | undefined, unit: string): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–';
  const digits = Math.abs(x) >= 0.1 ? 2 : 3;
  // A rate that rounds to zero is shown unsigned (no "-0.000").
  if (Math.abs(x) < 0.5 * 10 ** -digits) return `0.000 ${unit}`;
  return `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(digits)} ${unit}`;
}
