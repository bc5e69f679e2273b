/**
 * The workbench's state moved to renderer/state/ (document, pose, UI and jobs stores; see
 * workbench.ts). This module re-exports it for main.tsx and the document flow, which import
 * from here; new code imports from renderer/state/.
 */
export { createWorkbench, type Workbench, type WorkbenchActions, type WorkbenchState } from '../state/workbench';
export type { DocInfo } from '../state/documentStore';
export type { Notice, RecoveryOffer } from '../state/uiStore';
