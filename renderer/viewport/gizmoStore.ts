/** How the gizmo moves a hardpoint: which axes or plane, and the snap step. */
import { createStore } from 'zustand/vanilla';

export type GizmoConstraint = 'free' | 'x' | 'y' | 'z' | 'xy' | 'yz' | 'xz';

export interface GizmoState {
  enabled: boolean;
  constraint: GizmoConstraint;
  /** Snap step, mm; 0 for none. */
  snapMm: number;
}

export const gizmoStore = createStore<GizmoState>()(() => ({ enabled: true, constraint: 'free', snapMm: 1 }));
