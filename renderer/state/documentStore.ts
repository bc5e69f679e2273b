/**
 * The design document: the design being edited, its text, where it lives on disk, and its
 * undo history (deltas of the design only). Nothing derived from it lives here; the pose
 * store solves it and the UI store holds what the user is looking at.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { DesignFile } from '../../core/design/types';
import type { ActionResult, DesignAction } from '../model/designActions';
import { designToText } from '../model/designText';
import { applyDelta, pushDelta, type Delta, type HistoryState } from '../model/history';

export interface DocInfo {
  /** Shown in the title bar: the file's name, or the design's suggested name. */
  fileName: string;
  /** Where Electron saves it; null until opened from or saved to a file. */
  filePath: string | null;
  /** Text of the design at the last open or save; null when never saved. */
  savedText: string | null;
}

export interface DocumentState {
  design: DesignFile;
  designText: string;
  doc: DocInfo;
  /** Whether the design differs from the text last opened or saved. */
  dirty: boolean;
  /** Increases with every change of the design (what is derived from it recomputes on it). */
  revision: number;
  history: HistoryState;
}

export type DocumentStore = StoreApi<DocumentState>;

const isDirty = (doc: DocInfo, text: string) => (doc.savedText === null ? true : doc.savedText !== text);

export function createDocumentStore(design: DesignFile, doc: DocInfo): DocumentStore {
  const designText = designToText(design);
  return createStore<DocumentState>()(() => ({
    design,
    designText,
    doc,
    // A design never saved is not dirty at start (the bundled demo); only its edits are.
    dirty: doc.savedText !== null ? doc.savedText !== designText : false,
    revision: 0,
    history: { past: [], future: [] },
  }));
}

/** Every change of the document, each one a single state update. */
export class DocumentEditor {
  constructor(readonly store: DocumentStore) {}

  /** Replace the design (open, new, restore); the history starts afresh. */
  load(design: DesignFile, doc: DocInfo): void {
    const s = this.store.getState();
    const designText = designToText(design);
    this.store.setState({ design, designText, doc, dirty: isDirty(doc, designText), revision: s.revision + 1, history: { past: [], future: [] } });
  }

  /** Apply an undoable action; false when it changed nothing. */
  perform<P>(action: DesignAction<P>, payload: P): boolean {
    const s = this.store.getState();
    const result: ActionResult = action.perform(s.design, payload);
    if (result.delta === null) return false;
    this.replace(result.design, pushDelta(s.history, result.delta));
    return true;
  }

  undo(): boolean {
    const { design, history } = this.store.getState();
    const delta = history.past[history.past.length - 1];
    if (!delta) return false;
    this.replace(applyDelta(design, delta, 'undo'), { past: history.past.slice(0, -1), future: [...history.future, delta] });
    return true;
  }

  redo(): boolean {
    const { design, history } = this.store.getState();
    const delta = history.future[history.future.length - 1];
    if (!delta) return false;
    this.replace(applyDelta(design, delta, 'redo'), { past: [...history.past, delta], future: history.future.slice(0, -1) });
    return true;
  }

  /** A new design with the given history (a drag moves the design without recording each step). */
  replace(design: DesignFile, history: HistoryState = this.store.getState().history): void {
    const s = this.store.getState();
    const designText = designToText(design);
    this.store.setState({ design, designText, dirty: isDirty(s.doc, designText), revision: s.revision + 1, history });
  }

  /** Record an edit already applied (the whole of a drag, as one step). */
  record(delta: Delta): void {
    this.store.setState({ history: pushDelta(this.store.getState().history, delta) });
  }

  markSaved(text: string, info: Partial<DocInfo>): void {
    const s = this.store.getState();
    this.store.setState({ doc: { ...s.doc, ...info, savedText: text }, dirty: s.designText !== text });
  }
}
