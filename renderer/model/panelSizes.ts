/**
 * The workbench's resizable layout: the widths of the two side columns and the height of the
 * plot strip, kept inside limits that leave the 3D view and the panels usable at any window
 * size, and remembered between sessions (as plain JSON in the browser's storage).
 */

export interface PanelSizes {
  /** Left column (Ride: pose inputs and playback), px; null: the default width for the window. */
  leftPx: number | null;
  /** Right column (what is wrong and its fix; all hardpoints, studies, settings), px. */
  rightPx: number | null;
  /** Plot strip, px. */
  plotsPx: number | null;
}

export const DEFAULT_SIZES: PanelSizes = { leftPx: null, rightPx: null, plotsPx: null };

/** Narrowest and widest a side column may be, px. */
export const SIDE_MIN_PX = 260;
export const SIDE_MAX_SHARE = 0.4;
/** The 3D view keeps at least this width and height, px. */
export const VIEW_MIN_PX = 320;
export const VIEW_MIN_HEIGHT_PX = 180;
export const PLOTS_MIN_PX = 160;

export const STORAGE_KEY = 'tiltbench.panelSizes.v1';

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** A side column's width kept inside its limits for a window `windowPx` wide, with the other column `otherPx` wide. */
export function clampSide(px: number, windowPx: number, otherPx: number): number {
  const hi = Math.max(SIDE_MIN_PX, Math.min(windowPx * SIDE_MAX_SHARE, windowPx - otherPx - VIEW_MIN_PX));
  return Math.round(clamp(px, SIDE_MIN_PX, hi));
}

/** The plot strip's height kept inside its limits for a centre column `centrePx` high. */
export function clampPlots(px: number, centrePx: number): number {
  const hi = Math.max(PLOTS_MIN_PX, centrePx - VIEW_MIN_HEIGHT_PX);
  return Math.round(clamp(px, PLOTS_MIN_PX, hi));
}

/** Sizes read back from storage; anything malformed is the default (never an error at start-up). */
export function readSizes(text: string | null): PanelSizes {
  if (!text) return DEFAULT_SIZES;
  try {
    const o = JSON.parse(text) as Record<string, unknown>;
    const num = (x: unknown) => (typeof x === 'number' && Number.isFinite(x) && x > 0 && x < 10_000 ? x : null);
    return { leftPx: num(o.leftPx), rightPx: num(o.rightPx), plotsPx: num(o.plotsPx) };
  } catch {
    return DEFAULT_SIZES;
  }
}

/** The CSS custom properties the layout reads; a size left at its default sets none. */
export function sizeStyle(s: PanelSizes): Record<string, string> {
  const out: Record<string, string> = {};
  if (s.leftPx !== null) out['--left-w'] = `${s.leftPx}px`;
  if (s.rightPx !== null) out['--right-w'] = `${s.rightPx}px`;
  if (s.plotsPx !== null) out['--plots-h'] = `${s.plotsPx}px`;
  return out;
}
