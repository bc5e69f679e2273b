/**
 * What the design studies hold between runs, none of it part of the design or its history:
 * the coordinates picked for tuning (with their ranges) and the reference design the workbench
 * compares with (a pinned copy, the design before an applied tune or proposal, or another
 * file), drawn as a ghost and as dashed curves.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { DesignFile } from '../../core/design/types';
import type { Proposal } from '../../core/studies/geometricSuggestion';

/** A coordinate picked for tuning: core's variable id and its allowed offsets. */
export interface TunePick {
  /** Core's variable id ('steering.tieRodJoint:y', 'upright.steeringArmJoint.left:z'). */
  id: string;
  /** Hardpoint-table row it was picked on (for display and un-picking). */
  rowId: string;
  axis: 'x' | 'y' | 'z';
  rangeMm: [number, number];
}

export interface ReferenceDesign {
  /** How it is named in tables and legends ("before tune", a file name, "pinned 14:02"). */
  label: string;
  design: DesignFile;
}

/** The geometric proposals found for a design, and those the user dismissed. */
export interface ProposalSet {
  forDesign: DesignFile;
  list: Proposal[];
  dismissed: string[];
}

export interface StudyState {
  picks: TunePick[];
  reference: ReferenceDesign | null;
  proposals: ProposalSet | null;
}

export type StudyStore = StoreApi<StudyState>;

export function createStudyStore(): StudyStore {
  return createStore<StudyState>()(() => ({ picks: [], reference: null, proposals: null }));
}
