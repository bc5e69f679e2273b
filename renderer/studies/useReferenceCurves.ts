/**
 * The reference design's curves (the pinned copy, the design before a tune, a proposal being
 * previewed), computed in a worker of their own when the reference changes, for the plots to
 * draw dotted beside the design on screen.
 */
import { useEffect, useRef, useState } from 'react';
import type { CurveSet } from '../../core/report/charts/chartData';
import { useStudies } from '../app/workbenchContext';
import { CancelledError, SweepClient } from '../workers/sweepClient';

export interface ReferenceCurves {
  label: string;
  curves: CurveSet;
}

export function useReferenceCurves(): ReferenceCurves | null {
  const reference = useStudies((s) => s.reference);
  const client = useRef<SweepClient | null>(null);
  const [result, setResult] = useState<{ for: unknown; value: ReferenceCurves } | null>(null);
  useEffect(() => () => client.current?.dispose(), []);
  useEffect(() => {
    if (!reference) return;
    const c = (client.current ??= new SweepClient());
    let live = true;
    c.curves({ design: reference.design })
      .then((curves) => live && setResult({ for: reference, value: { label: reference.label, curves } }))
      .catch((e: unknown) => {
        if (!(e instanceof CancelledError)) console.warn('reference curves:', e);
      });
    return () => {
      live = false;
    };
  }, [reference]);
  return reference && result && result.for === reference ? result.value : null;
}
