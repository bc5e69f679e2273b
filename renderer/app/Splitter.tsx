/**
 * A drag handle between two panels: drag with the mouse, or focus it and use the arrow keys
 * (Shift for larger steps); double-click puts the default size back. It reports sizes in px;
 * the layout clamps and remembers them (renderer/model/panelSizes.ts).
 */
import { useRef, type KeyboardEvent, type PointerEvent } from 'react';

export interface SplitterProps {
  /** 'vertical': a bar between columns (drags left-right); 'horizontal': between rows. */
  orientation: 'vertical' | 'horizontal';
  label: string;
  /** The size now, px. */
  size(): number;
  /** +1 when dragging right (or down) makes the panel larger, -1 when smaller. */
  sign: 1 | -1;
  onSize(px: number): void;
  onReset(): void;
  testId: string;
}

export function Splitter(p: SplitterProps) {
  const start = useRef<{ at: number; size: number } | null>(null);
  const coordinate = (e: PointerEvent) => (p.orientation === 'vertical' ? e.clientX : e.clientY);
  return (
    <div
      className={`splitter splitter-${p.orientation}`}
      role="separator"
      aria-orientation={p.orientation}
      aria-label={p.label}
      tabIndex={0}
      title={`${p.label}: drag, or arrow keys; double-click for the default`}
      data-testid={p.testId}
      onPointerDown={(e) => {
        e.currentTarget.setPointerCapture?.(e.pointerId);
        start.current = { at: coordinate(e), size: p.size() };
      }}
      onPointerMove={(e) => {
        if (!start.current) return;
        p.onSize(start.current.size + p.sign * (coordinate(e) - start.current.at));
      }}
      onPointerUp={() => {
        start.current = null;
      }}
      onDoubleClick={p.onReset}
      onKeyDown={(e: KeyboardEvent) => {
        const step = e.shiftKey ? 40 : 10;
        const grow: Record<string, number> = p.orientation === 'vertical' ? { ArrowRight: 1, ArrowLeft: -1 } : { ArrowDown: 1, ArrowUp: -1 };
        const d = grow[e.key];
        if (d === undefined) return;
        e.preventDefault();
        p.onSize(p.size() + p.sign * d * step);
      }}
    />
  );
}
