/**
 * Arrow-key nudge of the selected hardpoint (keys and steps in precision.ts). Each press is
 * one edit through the same design action as the gizmo's drag (movePoint), so it is undone
 * by one undo; typed entry in the table stays the exact path.
 */
import { movePoint } from '../model/designActions';
import { hardpointRows } from '../model/hardpoints';
import type { Workbench } from '../state/workbench';
import { nudged, nudgeForKey, type Nudge } from './precision';

/** Moves the selected hardpoint by one nudge; false when nothing is selected or nothing moved. */
export function nudgeSelection(wb: Workbench, n: Nudge): boolean {
  const selection = wb.ui.getState().selection;
  if (!selection || wb.ui.getState().dragging) return false;
  const row = hardpointRows(wb.document.getState().design).find((r) => r.id === selection);
  if (!row) return false;
  return wb.actions.perform(movePoint, { rowId: row.id, value: nudged(row.value, n) });
}

/** Whether a key event comes from a place that uses arrow keys itself (fields, sliders, lists). */
function ownsArrowKeys(target: EventTarget | null): boolean {
  if (typeof HTMLElement === 'undefined' || !(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  const tag = target.tagName;
  if (tag === 'INPUT' || tag === 'TEXTAREA' || tag === 'SELECT') return true;
  const role = target.getAttribute('role');
  return role === 'slider' || role === 'tab' || role === 'menuitem' || role === 'listbox' || role === 'option' || role === 'grid' || role === 'spinbutton';
}

/** The window's key handler: a nudge key with a hardpoint selected moves it (Ctrl/Alt/Meta keys are left alone). */
export function handleNudgeKey(wb: Workbench, e: KeyboardEvent): boolean {
  if (e.ctrlKey || e.altKey || e.metaKey || ownsArrowKeys(e.target)) return false;
  const n = nudgeForKey(e.key, e.shiftKey);
  if (!n || !wb.ui.getState().selection) return false;
  e.preventDefault();
  nudgeSelection(wb, n);
  return true;
}
