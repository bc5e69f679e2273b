/**
 * Playback: sweep lean back and forth, the handlebar lock to lock, or both together, at an
 * adjustable speed. Driven by requestAnimationFrame; each frame sets the pose through the
 * workbench (one solve) and the viewport follows through its subscription. Whether it plays,
 * what and how fast are the UI store's `playback` settings.
 */
import type { Workbench } from '../state/workbench';
import { setPlayback, type PlaybackMode } from '../state/uiStore';
import { motion } from '../viewport/viewSignals';

export type { PlaybackMode };

/** Position in [-1, 1] of a triangle wave with period 4 at phase p. */
function triangle(p: number): number {
  const q = ((p % 4) + 4) % 4;
  return q < 1 ? q : q < 3 ? 2 - q : q - 4;
}

/** The phase at which the triangle wave is at x (rising), x in [-1, 1]. */
function phaseOf(x: number): number {
  return Math.max(-1, Math.min(1, x));
}

/**
 * The pose inputs at wave position x in [-1, 1] for the amplitudes of a mode. When both move,
 * the lean goes into the turn as in a balanced turn: positive handlebar turns left (ISO 8855
 * yaw) and positive lean lowers the right side, so the lean takes the handlebar's opposite sign.
 */
export function playbackInputs(x: number, a: { lean: number; steer: number }): { leanDeg?: number; handlebarDeg?: number } {
  const out: { leanDeg?: number; handlebarDeg?: number } = {};
  if (a.lean > 0) out.leanDeg = round((a.steer > 0 ? -x : x) * a.lean);
  if (a.steer > 0) out.handlebarDeg = round(x * a.steer);
  return out;
}

export class PlaybackController {
  private raf = 0;
  private last = 0;
  private phase = 0;

  constructor(private readonly wb: Workbench) {}

  private get settings() {
    return this.wb.ui.getState().playback;
  }

  /**
   * The amplitudes of lean and handlebar for a mode, from the design's envelope. In ride mode
   * the lean follows the handlebar, so whatever the mode, the handlebar is swept.
   */
  private amplitudes(mode: PlaybackMode): { lean: number; steer: number } {
    const design = this.wb.document.getState().design;
    const riding = this.wb.pose.getState().ride.on;
    const e = design.envelope;
    const lean = design.vehicle.tilting && mode !== 'steer' && !riding ? Math.max(1, e.leanDeg) : 0;
    const steer = mode !== 'lean' || riding ? Math.max(1, e.handlebarDeg) : 0;
    return { lean, steer };
  }

  start(): void {
    if (this.settings.playing) return;
    const a = this.amplitudes(this.settings.mode);
    const pose = this.wb.pose.getState().pose;
    // Start from where the pose is, so the picture does not jump.
    this.phase = a.lean > 0 ? phaseOf(((a.steer > 0 ? -1 : 1) * pose.leanDeg) / a.lean) : phaseOf(pose.handlebarDeg / Math.max(1, a.steer));
    setPlayback(this.wb.ui, { playing: true });
    this.last = performance.now();
    this.raf = requestAnimationFrame(this.tick);
  }

  stop(): void {
    cancelAnimationFrame(this.raf);
    if (!this.settings.playing) return;
    setPlayback(this.wb.ui, { playing: false });
    // The pose where playback stopped, with every measure (playback leaves some out).
    this.wb.actions.setPose({});
  }

  toggle(): void {
    if (this.settings.playing) this.stop();
    else this.start();
  }

  private tick = (now: number): void => {
    const st = this.settings;
    if (!st.playing) return;
    const dt = Math.min(0.1, Math.max(0, (now - this.last) / 1000));
    this.last = now;
    const a = this.amplitudes(st.mode);
    const lead = a.lean > 0 ? a.lean : a.steer;
    this.phase += (dt * st.speedDegPerS) / lead;
    const x = triangle(this.phase);
    motion.emit();
    this.wb.actions.setPose(playbackInputs(x, a), true);
    this.raf = requestAnimationFrame(this.tick);
  };
}

const round = (v: number) => Math.round(v * 100) / 100;
