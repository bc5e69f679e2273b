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

/**
 * Ride mode: instead of a lean, a speed; core finds the lean that balances the turn the
 * handlebar makes (tan(lean) = v^2 / (g R)) and the lean slider follows it.
 */
export interface RideUi {
  on: boolean;
  /** Speed, km/h; null until ride mode is first switched on (then the middle of the design's riding range). */
  speedKmh: number | null;
}

export interface PoseState {
  pose: PoseUi;
  ride: RideUi;
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
    const ride: RideUi = { on: false, speedKmh: null };
    this.store = createStore<PoseState>()(() => ({ ride, ...this.derive(design, pose, ride) }));
    // Subscribed before anything else, so every other listener of the document already sees
    // the outcome of the design it is told about.
    document.subscribe((d, prev) => {
      if (d.revision === prev.revision) return;
      const s = this.store.getState();
      const base = this.resetOnNextDesign ? { ...DESIGN_POSE, contact: s.pose.contact } : s.pose;
      this.resetOnNextDesign = false;
      const pose = clampPose(d.design, base);
      this.store.setState(this.derive(d.design, pose, s.ride));
    });
  }

  /** The next design the document takes is shown at the design pose (a design just opened). */
  startNextDesignAtDesignPose(): void {
    this.resetOnNextDesign = true;
  }

  /** Set pose inputs and solve. `quick` (playback) skips the measures that need extra solves. */
  setPose(change: Partial<Omit<PoseUi, 'contact'>>, quick = false): void {
    const s = this.store.getState();
    // In ride mode the lean is core's answer, not an input.
    const { leanDeg: _ignored, ...withoutLean } = change;
    const pose = clampPose(this.document.getState().design, { ...s.pose, ...(s.ride.on ? withoutLean : change) });
    this.store.setState(this.session ? this.solveAt(this.session, pose, s.ride, !quick) : { pose });
  }

  /** Switch ride mode or change its speed, and solve. */
  setRide(change: Partial<RideUi>, quick = false): void {
    const s = this.store.getState();
    const ride: RideUi = { ...s.ride, ...change };
    if (ride.on && ride.speedKmh === null) ride.speedKmh = defaultSpeedKmh(s.resolved);
    if (ride.on === s.ride.on && ride.speedKmh === s.ride.speedKmh) return;
    this.store.setState(this.session ? { ride, ...this.solveAt(this.session, s.pose, ride, !quick) } : { ride });
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
    this.store.setState(this.derive(design, pose, this.store.getState().ride));
  }

  /** Validate, resolve, rebuild the session and solve the pose. */
  private derive(d: DesignFile, pose: PoseUi, ride: RideUi): Omit<PoseState, 'ride'> {
    const checked = validateDesign(d);
    if (!checked.ok) {
      this.session = null;
      return { pose, issues: checked.issues, resolved: null, drawing: null, outcome: invalidDesignOutcome(checked.issues.length) };
    }
    const resolved = resolveDesign(checked.design);
    this.session = new PoseSession(resolved, pose.contact);
    return { issues: [], resolved, drawing: this.session.engine.graph.drawing ?? null, ...this.solveAt(this.session, pose, ride, true) };
  }

  /** Solve the pose, or in ride mode the balanced pose at the ride's speed (the lean taken from core's answer). */
  private solveAt(session: PoseSession, pose: PoseUi, ride: RideUi, detail: boolean): Pick<PoseState, 'pose' | 'outcome'> {
    if (!ride.on || ride.speedKmh === null) return { pose, outcome: session.solve(pose, detail) };
    const outcome = session.solveRide(pose, ride.speedKmh, detail);
    return { pose: { ...pose, leanDeg: outcome.ride.leanDeg }, outcome };
  }
}

/** Ride mode starts in the middle of the design's riding range (20 km/h while the design is invalid). */
function defaultSpeedKmh(resolved: ResolvedDesign | null): number {
  return resolved ? Math.round((resolved.riding.minKmh + resolved.riding.maxKmh) / 2) : 20;
}
