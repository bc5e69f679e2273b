/** The layout's panel sizes as React state: read from and written to the browser's storage, clamped to the window. */
import { useCallback, useEffect, useState } from 'react';
import { clampPlots, clampSide, DEFAULT_SIZES, readSizes, STORAGE_KEY, type PanelSizes } from '../model/panelSizes';

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' ? window.localStorage : null;
  } catch {
    return null;
  }
}

export function usePanelSizes() {
  const [sizes, setSizes] = useState<PanelSizes>(() => readSizes(storage()?.getItem(STORAGE_KEY) ?? null));
  useEffect(() => {
    try {
      storage()?.setItem(STORAGE_KEY, JSON.stringify(sizes));
    } catch {
      // Storage full or refused: the sizes simply are not remembered.
    }
  }, [sizes]);
  const widthOf = (selector: string) => (document.querySelector(selector) as HTMLElement | null)?.offsetWidth ?? 0;
  const setSide = useCallback((which: 'leftPx' | 'rightPx', px: number) => {
    const other = widthOf(which === 'leftPx' ? '.right-side' : '.left-side');
    setSizes((s) => ({ ...s, [which]: clampSide(px, window.innerWidth, other) }));
  }, []);
  const setPlots = useCallback((px: number) => {
    const centre = (document.querySelector('.centre') as HTMLElement | null)?.offsetHeight ?? window.innerHeight;
    setSizes((s) => ({ ...s, plotsPx: clampPlots(px, centre) }));
  }, []);
  const reset = useCallback((which: keyof PanelSizes) => setSizes((s) => ({ ...s, [which]: DEFAULT_SIZES[which] })), []);
  return { sizes, setSide, setPlots, reset };
}
