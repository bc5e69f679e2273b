/**
 * What the user is looking at and doing, none of it part of the design or its history: the
 * selected hardpoint, a drag in progress, dialogs and notices, the gizmo's settings, playback,
 * the plots' tab and choices, and the hover tip.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { CurveChartId } from '../../core/report/charts/curveOptions';
import type { MapMetric } from '../../core/report/charts/chartData';
import type { MapResolution } from './jobsStore';
import type { OpenFinding } from '../model/findings';

export interface Notice {
  kind: 'error' | 'info';
  title: string;
  lines: string[];
}

export interface RecoveryOffer {
  text: string;
  /** What the recovered design is called, when it parsed. */
  name: string | null;
  /** Why it cannot be restored, when it did not parse. */
  problem: string | null;
}

export interface ConfirmRequest {
  title: string;
  text: string;
  confirmLabel: string;
  cancelLabel?: string;
  resolve(ok: boolean): void;
}

export type GizmoConstraint = 'free' | 'x' | 'y' | 'z' | 'xy' | 'yz' | 'xz';

/** How the gizmo moves a hardpoint: which axes or plane, and the snap step. */
export interface GizmoSettings {
  enabled: boolean;
  constraint: GizmoConstraint;
  /** Snap step, mm; 0 for none. */
  snapMm: number;
}

export type PlaybackMode = 'lean' | 'steer' | 'both';

export interface PlaybackSettings {
  playing: boolean;
  mode: PlaybackMode;
  /** Sweep speed of the leading input, degrees per second. */
  speedDegPerS: number;
}

export type PlotTab = CurveChartId | 'map';

/** The tabs of the "What's wrong -> Fix" column. */
export type FixColumnTab = 'findings' | 'hardpoints' | 'studies' | 'settings';

export interface PlotsView {
  open: boolean;
  tab: PlotTab;
  metric: MapMetric;
  resolution: MapResolution;
  /** The strip shows every reading of the pose (its "Numbers" tab) instead of the plot of \`tab\`. */
  numbers: boolean;
}

export interface HoverInfo {
  /** Pixel position in the viewport element. */
  x: number;
  y: number;
  title: string;
  lines: string[];
}

export interface UiState {
  /** The selected hardpoint (its row id), shared by the table, the viewport and the gizmo. */
  selection: string | null;
  /** True while a hardpoint is dragged with the gizmo. */
  dragging: boolean;
  notice: Notice | null;
  recovery: RecoveryOffer | null;
  confirm: ConfirmRequest | null;
  newDialogOpen: boolean;
  aboutOpen: boolean;
  gizmo: GizmoSettings;
  playback: PlaybackSettings;
  plots: PlotsView;
  hover: HoverInfo | null;
  /** The finding opened in the fix view (null: none). */
  finding: OpenFinding | null;
  /** The tab shown in the "What's wrong -> Fix" column. */
  fixColumn: FixColumnTab;
}

export type UiStore = StoreApi<UiState>;

export function createUiStore(): UiStore {
  return createStore<UiState>()(() => ({
    selection: null,
    dragging: false,
    notice: null,
    recovery: null,
    confirm: null,
    newDialogOpen: false,
    aboutOpen: false,
    gizmo: { enabled: true, constraint: 'free', snapMm: 1 },
    playback: { playing: false, mode: 'lean', speedDegPerS: 20 },
    plots: { open: true, tab: 'leanSteer', metric: 'status', resolution: 'coarse', numbers: false },
    hover: null,
    finding: null,
    fixColumn: 'findings',
  }));
}

/** Change some of the gizmo's, playback's or plots' settings. */
export function setGizmo(ui: UiStore, change: Partial<GizmoSettings>): void {
  ui.setState({ gizmo: { ...ui.getState().gizmo, ...change } });
}

export function setPlayback(ui: UiStore, change: Partial<PlaybackSettings>): void {
  ui.setState({ playback: { ...ui.getState().playback, ...change } });
}

export function setPlots(ui: UiStore, change: Partial<PlotsView>): void {
  ui.setState({ plots: { ...ui.getState().plots, ...change } });
}

/** Ask the user to confirm; resolves when the dialog is answered. */
export function askConfirm(ui: UiStore, req: Omit<ConfirmRequest, 'resolve'>): Promise<boolean> {
  return new Promise((resolve) => {
    ui.setState({
      confirm: {
        ...req,
        resolve: (ok) => {
          ui.setState({ confirm: null });
          resolve(ok);
        },
      },
    });
  });
}
