/**
 * The dialog state moved to the workbench's UI store (renderer/state/uiStore.ts). The document
 * flow (renderer/files/documentFlow.ts) still asks for confirmation through this function,
 * without naming its workbench: it goes to the UI store of the workbench made last (the app
 * makes one per window). New code calls askConfirm(wb.ui, ...) from renderer/state/uiStore.
 */
import { askConfirm as askConfirmIn, type ConfirmRequest } from '../state/uiStore';
import { latestUiStore } from '../state/workbench';

export function askConfirm(req: Omit<ConfirmRequest, 'resolve'>): Promise<boolean> {
  const ui = latestUiStore();
  if (!ui) throw new Error('askConfirm before any workbench was made');
  return askConfirmIn(ui, req);
}
