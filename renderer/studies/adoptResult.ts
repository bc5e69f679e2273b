/**
 * A study's result made the design, or shown beside it. Applying is one undo step holding only
 * the values that differ (adoptDesign), and the design as it was becomes the reference (ghost,
 * dotted curves) so the change can be seen; previewing makes the result the reference.
 */
import type { DesignFile } from '../../core/design/types';
import { adoptDesign } from '../model/designActions';
import type { StudyState, StudyStore } from '../state/studyStore';
import type { WorkbenchActions } from '../state/workbench';

/** True when the design changed (false: the result was the design already). */
export function adoptResult(actions: WorkbenchActions, studies: StudyStore, before: DesignFile, result: DesignFile, undoLabel: string, beforeLabel: string, also: Partial<StudyState> = {}): boolean {
  if (!actions.perform(adoptDesign, { design: result, label: undoLabel })) return false;
  studies.setState({ reference: { label: beforeLabel, design: before }, ...also });
  return true;
}

export function previewResult(studies: StudyStore, result: DesignFile, label: string): void {
  studies.setState({ reference: { label, design: result } });
}
