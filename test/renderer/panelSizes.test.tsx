// The resizable layout: sizes clamped so the 3D view and the panels stay usable, remembered in the
// browser's storage, anything malformed there ignored; the splitters answer the keyboard.
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { clampPlots, clampSide, PLOTS_MIN_PX, readSizes, SIDE_MAX_SHARE, SIDE_MIN_PX, sizeStyle, STORAGE_KEY, VIEW_MIN_HEIGHT_PX, VIEW_MIN_PX } from '../../renderer/model/panelSizes';
import { Splitter } from '../../renderer/app/Splitter';

afterEach(cleanup);

describe('panel sizes', () => {
  it('keeps a side column between its minimum and the room the view and the other column leave', () => {
    expect(clampSide(100, 1280, 380)).toBe(SIDE_MIN_PX);
    expect(clampSide(9999, 1920, 400)).toBe(Math.round(1920 * SIDE_MAX_SHARE));
    // A narrow window: the view keeps its width first.
    expect(clampSide(500, 1000, 300)).toBe(1000 - 300 - VIEW_MIN_PX);
    expect(clampSide(330, 1280, 380)).toBe(330);
  });

  it('keeps the plots between their minimum and what leaves the view its height', () => {
    expect(clampPlots(10, 700)).toBe(PLOTS_MIN_PX);
    expect(clampPlots(9999, 700)).toBe(700 - VIEW_MIN_HEIGHT_PX);
    expect(clampPlots(320.4, 700)).toBe(320);
  });

  it('reads back what it wrote, and treats anything else as the default', () => {
    const s = { leftPx: 330, rightPx: null, plotsPx: 280 };
    expect(readSizes(JSON.stringify(s))).toEqual(s);
    expect(readSizes('not json')).toEqual({ leftPx: null, rightPx: null, plotsPx: null });
    expect(readSizes(JSON.stringify({ leftPx: -4, rightPx: 'wide', plotsPx: 1e9 }))).toEqual({ leftPx: null, rightPx: null, plotsPx: null });
    expect(sizeStyle(s)).toEqual({ '--left-w': '330px', '--plots-h': '280px' });
    expect(STORAGE_KEY).toMatch(/^tiltbench\./);
  });

  it('a splitter moves by 10 px per arrow key (40 with Shift), in the direction that grows its panel', () => {
    const seen: number[] = [];
    let size = 300;
    render(<Splitter orientation="horizontal" label="Height of the plots" size={() => size} sign={-1} onSize={(px) => seen.push((size = px))} onReset={() => seen.push(-1)} testId="split" />);
    const bar = screen.getByTestId('split');
    expect(bar.getAttribute('role')).toBe('separator');
    fireEvent.keyDown(bar, { key: 'ArrowUp' });
    fireEvent.keyDown(bar, { key: 'ArrowUp', shiftKey: true });
    fireEvent.keyDown(bar, { key: 'ArrowDown' });
    fireEvent.keyDown(bar, { key: 'ArrowLeft' });
    fireEvent.doubleClick(bar);
    expect(seen).toEqual([310, 350, 340, -1]);
  });
});
