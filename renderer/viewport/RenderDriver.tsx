/**
 * Renders each requested frame itself (so it can time it), and keeps the resolution low while
 * something moves and full once still.
 */
import { useEffect, useMemo, useRef } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { motion, renderStats } from './viewSignals';
import { AxisTriad } from './AxisTriad';

/** Fraction of the full pixel ratio used while the picture moves. */
export const MOVING_DPR_FACTOR = 0.6;
/** How long the picture must be still before full resolution returns, ms. */
export const STILL_AFTER_MS = 220;

export function RenderDriver({ fullDpr }: { fullDpr: number }) {
  const setDpr = useThree((s) => s.setDpr);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const lowered = useRef(false);
  const triad = useMemo(() => new AxisTriad(), []);

  useEffect(() => {
    const ctx = gl.getContext();
    const ext = ctx.getExtension('WEBGL_debug_renderer_info');
    renderStats.glRenderer = String(ext ? ctx.getParameter(ext.UNMASKED_RENDERER_WEBGL) : ctx.getParameter(ctx.RENDERER));
  }, [gl]);

  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    renderStats.dpr = fullDpr;
    const off = motion.on(() => {
      if (!lowered.current) {
        lowered.current = true;
        renderStats.dpr = fullDpr * MOVING_DPR_FACTOR;
        setDpr(renderStats.dpr);
      }
      clearTimeout(timer);
      timer = setTimeout(() => {
        lowered.current = false;
        renderStats.dpr = fullDpr;
        setDpr(fullDpr);
        invalidate();
      }, STILL_AFTER_MS);
    });
    return () => {
      off();
      clearTimeout(timer);
    };
  }, [fullDpr, setDpr, invalidate]);

  // Priority 1: this callback renders the frame (R3F's own render is then skipped).
  useFrame(({ gl: renderer, scene, camera }) => {
    const serial = renderStats.sceneSerial;
    renderer.render(scene, camera);
    triad.render(renderer, camera);
    renderStats.frames++;
    renderStats.renderedSerial = serial;
    renderStats.lastRenderAt = performance.now();
  }, 1);
  return null;
}
