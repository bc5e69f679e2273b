/**
 * Small channels between the DOM around the canvas and the three.js scene: camera view
 * requests, the "something is moving" signal that lowers the resolution, and render
 * statistics for the benchmark and tests. Events, not state (the hover tip is the UI
 * store's). No React.
 */

export type ViewName = 'front' | 'side' | 'top' | 'threeQuarter' | 'fit';

type Listener<T> = (value: T) => void;

class Channel<T> {
  private readonly listeners = new Set<Listener<T>>();
  emit(value: T): void {
    for (const l of this.listeners) l(value);
  }
  on(l: Listener<T>): () => void {
    this.listeners.add(l);
    return () => this.listeners.delete(l);
  }
}

/** "Show this view" requests from the view buttons. */
export const viewRequests = new Channel<ViewName>();

/** The view on screen: an elevation ('front', 'side', 'top') or the perspective ('threeQuarter', also after orbiting). */
export type ShownView = Exclude<ViewName, 'fit'>;

/** The view now shown, and a channel that tells when it changes (the scene redraws what depends on it). */
export const shownView = { current: 'threeQuarter' as ShownView };
export const viewShown = new Channel<ShownView>();

export function setShownView(v: ShownView): void {
  if (shownView.current === v) return;
  shownView.current = v;
  viewShown.emit(v);
}

/** Pinged by anything that moves the picture continuously (sliders, playback, orbit, gizmo). */
export const motion = new Channel<void>();

/** Counters read by the benchmark and the end-to-end tests (window.__tiltbenchStats). */
export interface RenderStats {
  /** Frames rendered since start. */
  frames: number;
  /** performance.now() just after the last render call. */
  lastRenderAt: number;
  /** Increases with every pose or design the scene was updated to. */
  sceneSerial: number;
  /** sceneSerial of the last rendered frame. */
  renderedSerial: number;
  /** Current pixel ratio of the canvas. */
  dpr: number;
  /** Pixel ratio of the last rendered frame. */
  renderedDpr: number;
  /** WebGL renderer string (UNMASKED_RENDERER_WEBGL when available). */
  glRenderer: string;
  /** Where a world point (mm) appears in the canvas, CSS pixels from its top left (for tests). */
  project: (x: number, y: number, z: number) => [number, number];
  /** The kind of camera on screen (elevations are orthographic). */
  camera: 'perspective' | 'orthographic';
}

export const renderStats: RenderStats = { frames: 0, lastRenderAt: 0, sceneSerial: 0, renderedSerial: 0, dpr: 1, renderedDpr: 0, glRenderer: '', project: () => [NaN, NaN], camera: 'perspective' };
