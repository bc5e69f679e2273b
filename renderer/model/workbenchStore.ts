/**
 * The workbench's state and every action on it. No React here (the React binding is
 * `useWorkbench`); the viewport subscribes without React to follow continuous motion.
 *
 * The design document is the only thing edited and the only thing in the undo history;
 * the solved pose and every measure are recomputed from it.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { resolveDesign } from '../../core/design/resolveDesign';
import { validateDesign, type DesignIssue } from '../../core/design/validateDesign';
import type { DesignFile, ResolvedDesign, Vec3Mm } from '../../core/design/types';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { invalidDesignOutcome, PoseSession, type MechanismLayout, type PoseOutcome } from './analysisAdapter';
import { describeRow, movePoint, type ActionResult, type DesignAction } from './designActions';
import { designToText } from './designText';
import { applyDelta, changeAt, pushDelta, type HistoryState } from './history';
import { pointTarget, splitRowId } from './hardpoints';
import { DESIGN_POSE, type Contact, type PoseUi } from './poseInputs';

export interface DocInfo {
  /** Shown in the title bar: the file's name, or the design's suggested name. */
  fileName: string;
  /** Where Electron saves it; null until opened from or saved to a file. */
  filePath: string | null;
  /** Text of the design at the last open or save; null when never saved. */
  savedText: string | null;
}

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

export interface WorkbenchState {
  design: DesignFile;
  designText: string;
  doc: DocInfo;
  dirty: boolean;
  /** Increases with every change of the design (charts recompute on it). */
  revision: number;
  history: HistoryState;
  issues: DesignIssue[];
  resolved: ResolvedDesign | null;
  layout: MechanismLayout | null;
  /** How to draw the mechanism, from core's layout template; null while the design is invalid. */
  drawing: DrawingLayout | null;
  pose: PoseUi;
  outcome: PoseOutcome;
  selection: string | null;
  /** True while a hardpoint is dragged with the gizmo. */
  dragging: boolean;
  notice: Notice | null;
  recovery: RecoveryOffer | null;
  aboutOpen: boolean;
}

export interface WorkbenchActions {
  /** Replace the design (open, new, restore): history cleared, pose kept where it makes sense. */
  loadDesign(design: DesignFile, doc: DocInfo): void;
  perform<P>(action: DesignAction<P>, payload: P): boolean;
  undo(): boolean;
  redo(): boolean;
  /** Set pose inputs and solve. `quick` (playback) skips the measures that need extra solves. */
  setPose(change: Partial<Omit<PoseUi, 'contact'>>, quick?: boolean): void;
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
  store: StoreApi<WorkbenchState>;
  actions: WorkbenchActions;
}

interface Derived {
  issues: DesignIssue[];
  resolved: ResolvedDesign | null;
  layout: MechanismLayout | null;
  drawing: DrawingLayout | null;
  outcome: PoseOutcome;
}

export function createWorkbench(design: DesignFile, doc: DocInfo): Workbench {
  let session: PoseSession | null = null;
  let dragStart: DesignFile | null = null;
  let dragRow: string | null = null;

  const clampPose = (d: DesignFile, pose: PoseUi): PoseUi => (d.vehicle.tilting ? pose : { ...pose, leanDeg: 0 });

  /** Validate, resolve, rebuild the solver and solve the current pose. */
  const derive = (d: DesignFile, pose: PoseUi): Derived => {
    const checked = validateDesign(d);
    if (!checked.ok) {
      session = null;
      return { issues: checked.issues, resolved: null, layout: null, drawing: null, outcome: invalidDesignOutcome(checked.issues.length) };
    }
    const resolved = resolveDesign(checked.design);
    session = new PoseSession(resolved, pose.contact);
    return { issues: [], resolved, layout: session.layout, drawing: session.engine.graph.drawing ?? null, outcome: session.solve(pose) };
  };

  const initialText = designToText(design);
  const store = createStore<WorkbenchState>()(() => {
    const pose = clampPose(design, DESIGN_POSE);
    return {
      design,
      designText: initialText,
      doc,
      dirty: doc.savedText !== null ? doc.savedText !== initialText : false,
      revision: 0,
      history: { past: [], future: [] },
      ...derive(design, pose),
      pose,
      selection: null,
      dragging: false,
      notice: null,
      recovery: null,
      aboutOpen: false,
    };
  });

  const applyDesign = (next: DesignFile, history: HistoryState) => {
    const s = store.getState();
    const pose = clampPose(next, s.pose);
    const designText = designToText(next);
    const derived = derive(next, pose);
    store.setState({
      design: next,
      designText,
      dirty: s.doc.savedText === null ? true : designText !== s.doc.savedText,
      revision: s.revision + 1,
      history,
      pose,
      ...derived,
    });
  };

  const actions: WorkbenchActions = {
    loadDesign(d, info) {
      const s = store.getState();
      const pose = clampPose(d, { ...DESIGN_POSE, contact: s.pose.contact });
      const designText = designToText(d);
      dragStart = null;
      store.setState({
        design: d,
        designText,
        doc: info,
        dirty: info.savedText === null ? true : info.savedText !== designText,
        revision: s.revision + 1,
        history: { past: [], future: [] },
        pose,
        selection: null,
        dragging: false,
        ...derive(d, pose),
      });
    },

    perform(action, payload) {
      const s = store.getState();
      const result: ActionResult = action.perform(s.design, payload);
      if (result.delta === null) return false;
      applyDesign(result.design, pushDelta(s.history, result.delta));
      return true;
    },

    undo() {
      const s = store.getState();
      const delta = s.history.past[s.history.past.length - 1];
      if (!delta) return false;
      applyDesign(applyDelta(s.design, delta, 'undo'), { past: s.history.past.slice(0, -1), future: [...s.history.future, delta] });
      return true;
    },

    redo() {
      const s = store.getState();
      const delta = s.history.future[s.history.future.length - 1];
      if (!delta) return false;
      applyDesign(applyDelta(s.design, delta, 'redo'), { past: [...s.history.past, delta], future: s.history.future.slice(0, -1) });
      return true;
    },

    setPose(change, quick = false) {
      const s = store.getState();
      const pose = clampPose(s.design, { ...s.pose, ...change });
      if (!session) {
        store.setState({ pose });
        return;
      }
      store.setState({ pose, outcome: session.solve(pose, !quick) });
    },

    setContact(contact) {
      const s = store.getState();
      if (s.pose.contact === contact) return;
      const pose = { ...s.pose, contact };
      store.setState({ pose, ...derive(s.design, pose) });
    },

    resetPose() {
      const s = store.getState();
      const pose = clampPose(s.design, { ...DESIGN_POSE, contact: s.pose.contact });
      store.setState({ pose, ...derive(s.design, pose) });
    },

    select(id) {
      if (store.getState().selection !== id) store.setState({ selection: id });
    },

    beginDrag() {
      const s = store.getState();
      dragStart = s.design;
      dragRow = s.selection;
      store.setState({ dragging: true });
    },

    dragPoint(rowId, value) {
      const s = store.getState();
      const result = movePoint.perform(s.design, { rowId, value });
      if (result.delta === null) return;
      dragRow = rowId;
      applyDesign(result.design, s.history);
    },

    endDrag() {
      const s = store.getState();
      const start = dragStart;
      dragStart = null;
      store.setState({ dragging: false });
      if (!start || !dragRow) return;
      const { key, side } = splitRowId(dragRow);
      const target = pointTarget(s.design, key, side, { x: 0, y: 0, z: 0 });
      const change = changeAt(start, s.design, target.path);
      if (!change) return;
      const label = `move ${describeRow(start, dragRow)}`;
      store.setState({ history: pushDelta(s.history, { label, changes: [change] }) });
    },

    markSaved(text, info) {
      const s = store.getState();
      const doc = { ...s.doc, ...info, savedText: text };
      store.setState({ doc, dirty: s.designText !== text });
    },

    showNotice(notice) {
      store.setState({ notice });
    },

    setRecovery(offer) {
      store.setState({ recovery: offer });
    },

    setAboutOpen(open) {
      store.setState({ aboutOpen: open });
    },
  };

  return { store, actions };
}
