/**
 * A slice of a store that follows changes at most every `intervalMs` (the first change at
 * once, the last one always delivered). For text panels that need not repaint at the frame
 * rate while the pose moves continuously; a single change still shows immediately.
 */
import { useMemo } from 'react';
import { useStore, type StoreApi } from 'zustand';

type Readable<S> = Pick<StoreApi<S>, 'getState' | 'subscribe'>;

/** A view of a store whose listener hears of changes at most every `intervalMs`. */
function throttledView<S>(source: Readable<S>, intervalMs: number): Pick<StoreApi<S>, 'getState' | 'getInitialState' | 'subscribe'> {
  let delivered = source.getState();
  return {
    getState: () => delivered,
    getInitialState: () => delivered,
    subscribe(listener) {
      let last = 0;
      let timer: ReturnType<typeof setTimeout> | undefined;
      const deliver = () => {
        timer = undefined;
        last = performance.now();
        const prev = delivered;
        delivered = source.getState();
        listener(delivered, prev);
      };
      // Whatever changed before React subscribed is seen at once.
      delivered = source.getState();
      const off = source.subscribe(() => {
        if (timer !== undefined) return;
        const wait = intervalMs - (performance.now() - last);
        if (wait <= 0) deliver();
        else timer = setTimeout(deliver, wait);
      });
      return () => {
        off();
        clearTimeout(timer);
      };
    },
  };
}

export function useThrottledSlice<S, U>(store: Readable<S>, selector: (s: S) => U, intervalMs: number): U {
  const view = useMemo(() => throttledView(store, intervalMs), [store, intervalMs]);
  return useStore(view as StoreApi<S>, selector);
}
