/**
 * Playback: sweep lean back and forth, the handlebar lock to lock, or both together, at an
 * adjustable speed. Driven by requestAnimationFrame; each frame sets the pose through the
 * store (one solve) and the viewport follows through its subscription.
 */
import { createStore } from 'zustand/vanilla';
import type { Workbench } from '../model/workbenchStore';
import { motion } from '../viewport/viewSignals';

export type PlaybackMode = 'lean' | 'steer' | 'both';

export interface PlaybackState {
  playing: boolean;
  mode: PlaybackMode;
  /** Sweep speed of the leading input, degrees per second. */
  speedDegPerS: number;
}

export const playbackStore = createStore<PlaybackState>()(() => ({ playing: false, mode: 'lean', speedDegPerS: 20 }));

/** Position in [-1, 1] of a triangle wave with period 4 at phase p. */
function triangle(p: number): number {
  const q = ((p % 4) + 4) % 4;
  return q < 1 ? q : q < 3 ? 2 - q : q - 4;
}

/** The phase at which the triangle wave is at x (rising), x in [-1, 1]. */
function phaseOf(x: number): number {
  return Math.max(-1, Math.min(1, x));
}

export class PlaybackController {
  private raf = 0;
  private last = 0;
  private phase = 0;

  constructor(private readonly wb: Workbench) {}

  /** The amplitudes of lean and handlebar for a mode, from the design's envelope. */
  private amplitudes(mode: PlaybackMode): { lean: number; steer: number } {
    const s = this.wb.store.getState();
    const e = s.design.envelope;
    const lean = s.design.vehicle.tilting && mode !== 'steer' ? Math.max(1, e.leanDeg) : 0;
    const steer = mode !== 'lean' ? Math.max(1, e.handlebarDeg) : 0;
    return { lean, steer };
  }

  start(): void {
    if (playbackStore.getState().playing) return;
    const { mode } = playbackStore.getState();
    const a = this.amplitudes(mode);
    const pose = this.wb.store.getState().pose;
    // Start from where the pose is, so the picture does not jump.
    this.phase = a.lean > 0 ? phaseOf(pose.leanDeg / a.lean) : phaseOf(pose.handlebarDeg / Math.max(1, a.steer));
    playbackStore.setState({ playing: true });
    this.last = performance.now();
    this.raf = requestAnimationFrame(this.tick);
  }

  stop(): void {
    cancelAnimationFrame(this.raf);
    if (!playbackStore.getState().playing) return;
    playbackStore.setState({ playing: false });
    // The pose where playback stopped, with every measure (playback leaves some out).
    this.wb.actions.setPose({});
  }

  toggle(): void {
    if (playbackStore.getState().playing) this.stop();
    else this.start();
  }

  private tick = (now: number): void => {
    const st = playbackStore.getState();
    if (!st.playing) return;
    const dt = Math.min(0.1, Math.max(0, (now - this.last) / 1000));
    this.last = now;
    const a = this.amplitudes(st.mode);
    const lead = a.lean > 0 ? a.lean : a.steer;
    this.phase += (dt * st.speedDegPerS) / lead;
    const x = triangle(this.phase);
    motion.emit();
    this.wb.actions.setPose({ ...(a.lean > 0 ? { leanDeg: round(x * a.lean) } : {}), ...(a.steer > 0 ? { handlebarDeg: round(x * a.steer) } : {}) }, true);
    this.raf = requestAnimationFrame(this.tick);
  };
}

const round = (v: number) => Math.round(v * 100) / 100;
