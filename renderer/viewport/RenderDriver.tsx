/**
 * Renders each requested frame itself (so it can time it), and keeps the resolution low while
 * something moves and full once still.
 */
import { useEffect, useMemo } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { motion, renderStats } from './viewSignals';
import { AxisTriad } from './AxisTriad';
import { useWorkbenchApi } from '../app/workbenchContext';

/** Fraction of the full pixel ratio used while the picture moves (issue 11: at least 0.75). */
export const MOVING_DPR_FACTOR = 0.75;
/**
 * How long the picture must be still before full resolution returns, ms (issue 11: full
 * resolution within 100 ms of stopping, and one frame at full resolution takes 20-40 ms on
 * SwiftShader). Playback holds the low resolution while it plays and gives it back at once
 * when it stops.
 */
export const STILL_AFTER_MS = 60;
/**
 * Motion pings closer together than this are continuous motion (a drag, playback); a lone ping
 * (a view button's framing, one slider step, one nudge) is drawn at full resolution, sparing two
 * drawing-buffer reallocations, ms.
 */
export const CONTINUOUS_WITHIN_MS = 150;

/**
 * The resolution policy, apart from React and three.js (tested alone): `ping` on each motion
 * signal, `playing` when playback starts or stops; `set` is called with each new pixel ratio.
 */
export class MovingResolution {
  private lowered = false;
  private lastPing = -Infinity;
  private playing = false;
  private timer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly fullDpr: number,
    private readonly set: (dpr: number) => void,
    private readonly now: () => number = () => performance.now(),
  ) {}

  ping(): void {
    const t = this.now();
    const continuous = t - this.lastPing < CONTINUOUS_WITHIN_MS;
    this.lastPing = t;
    if (!continuous && !this.playing) return;
    if (!this.lowered) {
      this.lowered = true;
      this.set(this.fullDpr * MOVING_DPR_FACTOR);
    }
    clearTimeout(this.timer);
    if (!this.playing) this.timer = setTimeout(() => this.restore(), STILL_AFTER_MS);
  }

  setPlaying(playing: boolean): void {
    if (playing === this.playing) return;
    this.playing = playing;
    if (!playing) this.restore();
  }

  dispose(): void {
    clearTimeout(this.timer);
  }

  private restore(): void {
    clearTimeout(this.timer);
    this.timer = undefined;
    if (!this.lowered) return;
    this.lowered = false;
    this.set(this.fullDpr);
  }
}

export function RenderDriver({ fullDpr }: { fullDpr: number }) {
  const setDpr = useThree((s) => s.setDpr);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const wb = useWorkbenchApi();
  const triad = useMemo(() => new AxisTriad(), []);

  useEffect(() => {
    const ctx = gl.getContext();
    const ext = ctx.getExtension('WEBGL_debug_renderer_info');
    renderStats.glRenderer = String(ext ? ctx.getParameter(ext.UNMASKED_RENDERER_WEBGL) : ctx.getParameter(ctx.RENDERER));
  }, [gl]);

  useEffect(() => {
    renderStats.dpr = fullDpr;
    const policy = new MovingResolution(fullDpr, (dpr) => {
      renderStats.dpr = dpr;
      setDpr(dpr);
      invalidate();
    });
    policy.setPlaying(wb.ui.getState().playback.playing);
    const offUi = wb.ui.subscribe((s, prev) => {
      if (s.playback.playing !== prev.playback.playing) policy.setPlaying(s.playback.playing);
    });
    const off = motion.on(() => policy.ping());
    return () => {
      off();
      offUi();
      policy.dispose();
    };
  }, [fullDpr, setDpr, invalidate, wb]);

  // Priority 1: this callback renders the frame (R3F's own render is then skipped).
  useFrame(({ gl: renderer, scene, camera }) => {
    const serial = renderStats.sceneSerial;
    renderer.render(scene, camera);
    triad.render(renderer, camera);
    renderStats.frames++;
    renderStats.renderedSerial = serial;
    renderStats.renderedDpr = renderer.getPixelRatio();
    renderStats.lastRenderAt = performance.now();
  }, 1);
  return null;
}
