/**
 * Whether the viewport has drawn its first frame: the plots (their ECharts chunk, their first
 * sweep) wait for it, so they do not compete with the 3D view's start-up on the main thread and
 * the worker's core. If no frame comes (no WebGL), they start after FIRST_FRAME_WAIT_MS anyway.
 */
import { useEffect, useState } from 'react';
import { renderStats } from '../viewport/viewSignals';

export const FIRST_FRAME_WAIT_MS = 8000;

export function useAfterFirstFrame(stats: { frames: number } = renderStats): boolean {
  const [ready, setReady] = useState(() => stats.frames > 0);
  useEffect(() => {
    if (ready) return;
    let raf = 0;
    const check = () => {
      if (stats.frames > 0) setReady(true);
      else raf = requestAnimationFrame(check);
    };
    raf = requestAnimationFrame(check);
    const timer = setTimeout(() => setReady(true), FIRST_FRAME_WAIT_MS);
    return () => {
      cancelAnimationFrame(raf);
      clearTimeout(timer);
    };
  }, [ready, stats]);
  return ready;
}
