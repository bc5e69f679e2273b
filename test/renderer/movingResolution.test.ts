// The viewport's resolution while the picture moves (issue 11, speed): continuous motion and
// playback draw at MOVING_DPR_FACTOR of the full pixel ratio (at least 0.75), a lone motion
// signal keeps full resolution, and full resolution returns STILL_AFTER_MS after the last
// motion, or at once when playback stops. Timing constants come from the speed targets
// (issue 11), not from a source.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { CONTINUOUS_WITHIN_MS, MOVING_DPR_FACTOR, MovingResolution, STILL_AFTER_MS } from '../../renderer/viewport/RenderDriver';

describe('MovingResolution', () => {
  let t = 0;
  let set: number[];
  const make = (full = 1) => new MovingResolution(full, (d) => set.push(d), () => t);
  beforeEach(() => {
    vi.useFakeTimers();
    t = 1000;
    set = [];
  });
  afterEach(() => vi.useRealTimers());
  const advance = (ms: number) => {
    t += ms;
    vi.advanceTimersByTime(ms);
  };

  it('meets the targets: at least 0.75 of full while moving, full again within 100 ms', () => {
    expect(MOVING_DPR_FACTOR).toBeGreaterThanOrEqual(0.75);
    expect(STILL_AFTER_MS).toBeLessThan(100);
  });

  it('a lone motion signal keeps full resolution (no reallocation)', () => {
    const r = make();
    r.ping();
    advance(CONTINUOUS_WITHIN_MS + 50);
    r.ping();
    advance(500);
    expect(set).toEqual([]);
  });

  it('continuous motion lowers once, and restores STILL_AFTER_MS after the last signal', () => {
    const r = make(2);
    for (let k = 0; k < 10; k++) {
      r.ping();
      advance(16);
    }
    expect(set).toEqual([2 * MOVING_DPR_FACTOR]);
    advance(STILL_AFTER_MS - 16 - 1);
    expect(set).toEqual([2 * MOVING_DPR_FACTOR]);
    advance(2);
    expect(set).toEqual([2 * MOVING_DPR_FACTOR, 2]);
  });

  it('playback holds the low resolution through slow frames and restores at once on stop', () => {
    const r = make();
    r.setPlaying(true);
    r.ping();
    expect(set).toEqual([MOVING_DPR_FACTOR]);
    // Frames 200 ms apart (a loaded machine): no flip back to full between them.
    for (let k = 0; k < 5; k++) {
      advance(200);
      r.ping();
    }
    expect(set).toEqual([MOVING_DPR_FACTOR]);
    r.setPlaying(false);
    expect(set).toEqual([MOVING_DPR_FACTOR, 1]);
    advance(1000);
    expect(set).toEqual([MOVING_DPR_FACTOR, 1]);
  });

  it('stopping playback that never lowered sets nothing', () => {
    const r = make();
    r.setPlaying(true);
    r.setPlaying(false);
    expect(set).toEqual([]);
  });
});
