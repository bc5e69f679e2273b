/**
 * The workbench: its four stores and every action that spans them. No React here (the React
 * binding is app/workbenchContext.tsx); the viewport subscribes to the stores without React
 * to follow continuous motion.
 *
 * - document: the design and its undo history (documentStore.ts)
 * - pose: the pose asked for and everything solved from the design there (poseStore.ts)
 * - ui: selection, dialogs, gizmo, playback, plots, hover (uiStore.ts)
 * - jobs: the plots' curves and envelope map in the sweep worker (jobsStore.ts)
 * - studies: the coordinates picked for tuning and the reference design compared with (studyStore.ts)
 */
import type { DesignFile, Vec3Mm } from '../../core/design/types';
import { describeRow, movePoint, type DesignAction } from '../model/designActions';
import { changeAt } from '../model/history';
import { pointTarget, splitRowId } from '../model/hardpoints';
import type { Contact, PoseUi } from '../model/poseInputs';
import type { SweepClient } from '../workers/sweepClient';
import { createDocumentStore, DocumentEditor, type DocInfo, type DocumentStore } from './documentStore';
import { Jobs } from './jobsStore';
import { PoseView, type PoseStore, type RideUi } from './poseStore';
import { createStudyStore, type StudyStore } from './studyStore';
import { createUiStore, type Notice, type RecoveryOffer, type UiStore } from './uiStore';

export interface WorkbenchActions {
  /** Replace the design (open, new, restore): history cleared, the pose back at the design's. */
  loadDesign(design: DesignFile, doc: DocInfo): void;
  perform<P>(action: DesignAction<P>, payload: P): boolean;
  undo(): boolean;
  redo(): boolean;
  /** Set pose inputs and solve. `quick` (playback) skips the measures that need extra solves. */
  setPose(change: Partial<Omit<PoseUi, 'contact'>>, quick?: boolean): void;
  /** Switch ride mode (speed and handlebar; the lean follows the balanced turn) or set its speed. */
  setRide(change: Partial<RideUi>, quick?: boolean): void;
  setContact(contact: Contact): void;
  resetPose(): void;
  select(id: string | null): void;
  beginDrag(): void;
  dragPoint(rowId: string, value: Vec3Mm): void;
  endDrag(): void;
  markSaved(text: string, doc: Partial<DocInfo>): void;
  showNotice(notice: Notice | null): void;
  setRecovery(offer: RecoveryOffer | null): void;
  setAboutOpen(open: boolean): void;
}

export interface Workbench {
  document: DocumentStore;
  pose: PoseStore;
  ui: UiStore;
  jobs: Jobs;
  studies: StudyStore;
  actions: WorkbenchActions;
}

export interface WorkbenchOptions {
  /** The sweep client the jobs run on (tests pass one without a worker). */
  sweepClient?: SweepClient;
}

export function createWorkbench(design: DesignFile, doc: DocInfo, options: WorkbenchOptions = {}): Workbench {
  const document = createDocumentStore(design, doc);
  const editor = new DocumentEditor(document);
  const view = new PoseView(document);
  const ui = createUiStore();
  const jobs = new Jobs(document, options.sweepClient);
  const actions = workbenchActions(editor, view, ui);
  return { document, pose: view.store, ui, jobs, studies: createStudyStore(), actions };
}

function workbenchActions(editor: DocumentEditor, view: PoseView, ui: UiStore): WorkbenchActions {
  const document = editor.store;
  /** The design when the drag began, and the row being dragged. */
  let dragStart: DesignFile | null = null;
  let dragRow: string | null = null;
  return {
    loadDesign(d, info) {
      dragStart = null;
      ui.setState({ selection: null, dragging: false });
      view.startNextDesignAtDesignPose();
      editor.load(d, info);
    },
    perform: (action, payload) => editor.perform(action, payload),
    undo: () => editor.undo(),
    redo: () => editor.redo(),
    setPose: (change, quick) => view.setPose(change, quick),
    setRide: (change, quick) => view.setRide(change, quick),
    setContact: (contact) => view.setContact(contact),
    resetPose: () => view.resetPose(),
    select(id) {
      if (ui.getState().selection !== id) ui.setState({ selection: id });
    },
    beginDrag() {
      dragStart = document.getState().design;
      dragRow = ui.getState().selection;
      ui.setState({ dragging: true });
    },
    dragPoint(rowId, value) {
      const result = movePoint.perform(document.getState().design, { rowId, value });
      if (result.delta === null) return;
      dragRow = rowId;
      editor.replace(result.design);
    },
    /** The whole drag becomes one undo step. */
    endDrag() {
      const start = dragStart;
      dragStart = null;
      ui.setState({ dragging: false });
      if (!start || !dragRow) return;
      const { key, side } = splitRowId(dragRow);
      const target = pointTarget(document.getState().design, key, side, { x: 0, y: 0, z: 0 });
      const change = changeAt(start, document.getState().design, target.path);
      if (change) editor.record({ label: `move ${describeRow(start, dragRow)}`, changes: [change] });
    },
    markSaved: (text, info) => editor.markSaved(text, info),
    showNotice: (notice) => ui.setState({ notice }),
    setRecovery: (recovery) => ui.setState({ recovery }),
    setAboutOpen: (aboutOpen) => ui.setState({ aboutOpen }),
  };
}
