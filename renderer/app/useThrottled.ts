/**
 * A slice of the store that follows changes at most every `intervalMs` (first change at once,
 * the last one always delivered). For text panels that need not repaint at the frame rate
 * while the pose moves continuously; a single change still shows immediately.
 */
import { useEffect, useRef, useState } from 'react';
import type { WorkbenchState } from '../model/workbenchStore';
import { useWorkbenchApi } from './workbenchContext';

export function useThrottledWorkbench<U>(selector: (s: WorkbenchState) => U, intervalMs: number): U {
  const wb = useWorkbenchApi();
  const sel = useRef(selector);
  sel.current = selector;
  const [value, setValue] = useState<U>(() => selector(wb.store.getState()));
  useEffect(() => {
    let last = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let current = sel.current(wb.store.getState());
    setValue(current);
    const deliver = () => {
      timer = undefined;
      last = performance.now();
      setValue(sel.current(wb.store.getState()));
    };
    const off = wb.store.subscribe((s) => {
      const next = sel.current(s);
      if (Object.is(next, current)) return;
      current = next;
      if (timer !== undefined) return;
      const wait = intervalMs - (performance.now() - last);
      if (wait <= 0) deliver();
      else timer = setTimeout(deliver, wait);
    });
    return () => {
      off();
      clearTimeout(timer);
    };
  }, [wb, intervalMs]);
  return value;
}
