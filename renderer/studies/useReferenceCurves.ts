/**
 * The reference design's curves and envelope map (the pinned copy, the design before a tune, a
 * proposal being previewed), computed in workers of their own when the reference (or the map's
 * grid) changes, for the plots to draw dotted beside the design on screen.
 */
import { useEffect, useRef, useState } from 'react';
import type { CurveSet, EnvelopeMapData } from '../../core/report/charts/chartData';
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

export interface ReferenceMap {
  label: string;
  map: EnvelopeMapData;
}

/** The reference's map on the grid step of the map on screen (null until asked or while computing). */
export function useReferenceMap(angleStepDeg: number | null, travelMm: number | undefined): ReferenceMap | null {
  const reference = useStudies((s) => s.reference);
  const client = useRef<SweepClient | null>(null);
  const [result, setResult] = useState<{ for: unknown; step: number; value: ReferenceMap } | null>(null);
  useEffect(() => () => client.current?.dispose(), []);
  useEffect(() => {
    if (!reference || angleStepDeg === null) return;
    const c = (client.current ??= new SweepClient());
    let live = true;
    c.map({ design: reference.design, angleStepDeg, travelMm })
      .then((map) => live && setResult({ for: reference, step: angleStepDeg, value: { label: reference.label, map } }))
      .catch((e: unknown) => {
        if (!(e instanceof CancelledError)) console.warn('reference map:', e);
      });
    return () => {
      live = false;
    };
  }, [reference, angleStepDeg, travelMm]);
  return reference && result && result.for === reference && result.step === angleStepDeg ? result.value : null;
}
