/** Play a lean sweep, a steer sweep or both, at an adjustable speed. */
import { useEffect } from 'react';
import { useDocument, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { setPlayback } from '../state/uiStore';
import type { PlaybackController, PlaybackMode } from './playback';

export function PlaybackPanel({ controller }: { controller: PlaybackController }) {
  const { ui } = useWorkbenchApi();
  const { playing, mode, speedDegPerS } = useUi((s) => s.playback);
  const tilting = useDocument((s) => s.design.vehicle.tilting);
  const valid = usePose((s) => s.resolved !== null);
  useEffect(() => {
    // A vehicle that does not lean can only sweep the steering.
    if (!tilting && mode !== 'steer') setPlayback(ui, { mode: 'steer' });
  }, [ui, tilting, mode]);
  useEffect(() => () => controller.stop(), [controller]);
  const setMode = (m: PlaybackMode) => {
    const was = playing;
    controller.stop();
    setPlayback(ui, { mode: m });
    if (was) controller.start();
  };
  return (
    <section className="panel playback-panel" aria-labelledby="playback-title">
      <h2 id="playback-title">Motion</h2>
      <div className="playback-row">
        <button type="button" className="play-button" onClick={() => controller.toggle()} disabled={!valid} aria-pressed={playing} data-testid="play">
          {playing ? '❚❚ Pause' : '▶ Play'}
        </button>
        <select value={mode} onChange={(e) => setMode(e.target.value as PlaybackMode)} aria-label="What to sweep" data-testid="play-mode">
          <option value="lean" disabled={!tilting}>
            lean, side to side
          </option>
          <option value="steer">steer, lock to lock</option>
          <option value="both" disabled={!tilting}>
            lean and steer together
          </option>
        </select>
      </div>
      <label className="speed-row">
        <span>Rate</span>
        <input
          type="range"
          min={2}
          max={90}
          step={1}
          value={speedDegPerS}
          onChange={(e) => setPlayback(ui, { speedDegPerS: Number(e.target.value) })}
          aria-valuetext={`${speedDegPerS} degrees per second`}
          data-testid="play-speed"
        />
        <span className="unit-value">{speedDegPerS} deg/s</span>
      </label>
    </section>
  );
}
