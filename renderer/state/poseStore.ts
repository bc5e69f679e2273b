/**
 * The solved view of the document: the pose the user asked for, and everything derived from
 * the design at that pose (validation issues, the resolved design, the mechanism's drawing,
 * core's outcome). Recomputed whenever the document's revision moves; never in the undo
 * history. The one place the workbench holds a pose session (analysisAdapter.ts).
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import { resolveDesign } from '../../core/design/resolveDesign';
import { validateDesign, type DesignIssue } from '../../core/design/validateDesign';
import type { DesignFile, ResolvedDesign } from '../../core/design/types';
import type { DrawingLayout } from '../../core/mechanism/drawingLayout';
import { invalidDesignOutcome, PoseSession, type PoseOutcome } from '../model/analysisAdapter';
import { DESIGN_POSE, type Contact, type PoseUi } from '../model/poseInputs';
import type { DocumentStore } from './documentStore';

export interface PoseState {
  pose: PoseUi;
  issues: DesignIssue[];
  resolved: ResolvedDesign | null;
  /** How to draw the mechanism, from core's layout template; null while the design is invalid. */
  drawing: DrawingLayout | null;
  outcome: PoseOutcome;
}

export type PoseStore = StoreApi<PoseState>;

/** A non-tilting vehicle stays upright. */
const clampPose = (d: DesignFile, pose: PoseUi): PoseUi => (d.vehicle.tilting ? pose : { ...pose, leanDeg: 0 });

/** Solves the document at the requested pose and keeps the result in its store. */
export class PoseView {
  readonly store: PoseStore;
  private session: PoseSession | null = null;
  private resetOnNextDesign = false;

  constructor(private readonly document: DocumentStore) {
    const design = document.getState().design;
    const pose = clampPose(design, DESIGN_POSE);
    this.store = createStore<PoseState>()(() => ({ pose, ...this.derive(design, pose) }));
    // Subscribed before anything else, so every other listener of the document already sees
    // the outcome of the design it is told about.
    document.subscribe((d, prev) => {
      if (d.revision === prev.revision) return;
      const s = this.store.getState();
      const base = this.resetOnNextDesign ? { ...DESIGN_POSE, contact: s.pose.contact } : s.pose;
      this.resetOnNextDesign = false;
      const pose = clampPose(d.design, base);
      this.store.setState({ pose, ...this.derive(d.design, pose) });
    });
  }

  /** The next design the document takes is shown at the design pose (a design just opened). */
  startNextDesignAtDesignPose(): void {
    this.resetOnNextDesign = true;
  }

  /** Set pose inputs and solve. `quick` (playback) skips the measures that need extra solves. */
  setPose(change: Partial<Omit<PoseUi, 'contact'>>, quick = false): void {
    const s = this.store.getState();
    const pose = clampPose(this.document.getState().design, { ...s.pose, ...change });
    this.store.setState(this.session ? { pose, outcome: this.session.solve(pose, !quick) } : { pose });
  }

  setContact(contact: Contact): void {
    const s = this.store.getState();
    if (s.pose.contact === contact) return;
    this.resolveAt({ ...s.pose, contact });
  }

  resetPose(): void {
    this.resolveAt({ ...DESIGN_POSE, contact: this.store.getState().pose.contact });
  }

  /** Rebuild the session (contact changed, or back to the design pose) and solve. */
  private resolveAt(requested: PoseUi): void {
    const design = this.document.getState().design;
    const pose = clampPose(design, requested);
    this.store.setState({ pose, ...this.derive(design, pose) });
  }

  /** Validate, resolve, rebuild the session and solve the pose. */
  private derive(d: DesignFile, pose: PoseUi): Omit<PoseState, 'pose'> {
    const checked = validateDesign(d);
    if (!checked.ok) {
      this.session = null;
      return { issues: checked.issues, resolved: null, drawing: null, outcome: invalidDesignOutcome(checked.issues.length) };
    }
    const resolved = resolveDesign(checked.design);
    this.session = new PoseSession(resolved, pose.contact);
    return { issues: [], resolved, drawing: this.session.engine.graph.drawing ?? null, outcome: this.session.solve(pose) };
  }
}
