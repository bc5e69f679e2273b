/**
 * The long jobs of the plots (the 1-D curves and the envelope map), run by the sweep worker:
 * for each, the request running or last run, its progress, its result with the document
 * revision it is for, and its error. One job runs at a time (starting one stops the other);
 * cancel stops it.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import type { CurveSet, EnvelopeMapData } from '../../core/report/charts/chartData';
import { CURVE_KINDS, type CurveKind } from '../../core/analysis/curves';
import type { CurveRequest, MapRequest } from '../workers/sweepJobs';
import { CancelledError, SweepClient } from '../workers/sweepClient';
import type { DocumentStore } from './documentStore';

/** Map resolutions: the angle step from the larger half-range of lean and handlebar, deg. */
export const MAP_RESOLUTIONS = [
  { id: 'coarse', label: 'coarse (≈ 11 × 11)', step: (half: number) => Math.max(0.5, half / 5) },
  { id: 'medium', label: 'medium (2 deg)', step: () => 2 },
  { id: 'fine', label: 'fine (1 deg)', step: () => 1 },
] as const;

export type MapResolution = (typeof MAP_RESOLUTIONS)[number]['id'];

export interface JobProgress {
  done: number;
  total: number;
}

export interface JobSlot<Req, Res> {
  /** The job running or last run, with the document revision it was asked for. */
  request: (Req & { revision: number }) | null;
  /** Progress while the job runs; null when none runs. */
  progress: JobProgress | null;
  result: Res | null;
  /** Revision of the design the result is for (-1 before the first). */
  resultRevision: number;
  /**
   * Curve kinds of that revision still to come: the open chart's curves are computed and shown
   * first, the other charts' follow in a second job (empty once the result is whole; always
   * empty for the map).
   */
  pendingKinds: readonly CurveKind[];
  error: string | null;
}

export interface JobsState {
  curves: JobSlot<CurveRequest, CurveSet>;
  map: JobSlot<MapRequest, EnvelopeMapData>;
}

export type JobKind = keyof JobsState;
export type JobsStore = StoreApi<JobsState>;

const idle = <Req, Res>(): JobSlot<Req, Res> => ({ request: null, progress: null, result: null, resultRevision: -1, pendingKinds: [], error: null });

/** One curve set from the open chart's part and the rest, computed for the same design. */
export function mergeCurveSets(first: CurveSet, rest: CurveSet): CurveSet {
  return { ...rest, curves: { ...first.curves, ...rest.curves }, missing: { ...first.missing, ...rest.missing }, elapsedMs: first.elapsedMs + rest.elapsedMs };
}

export class Jobs {
  readonly store: JobsStore = createStore<JobsState>()(() => ({ curves: idle(), map: idle() }));

  constructor(
    private readonly document: DocumentStore,
    private readonly client: SweepClient = new SweepClient(),
  ) {}

  /**
   * Every curve of the design; with `first` (the open chart's kinds) in two jobs: those first,
   * shown as soon as they come (the slot's result for this revision, with the rest in
   * `pendingKinds`), then the rest, merged into one set.
   */
  runCurves(first: readonly CurveKind[] = []): void {
    const { design, revision } = this.document.getState();
    const firstKinds = CURVE_KINDS.filter((k) => first.includes(k));
    const rest = CURVE_KINDS.filter((k) => !first.includes(k));
    this.run('curves', { design, revision }, async (req, progress) => {
      if (firstKinds.length === 0 || rest.length === 0) return this.client.curves(req, progress);
      const total = CURVE_KINDS.length;
      const part = await this.client.curves({ ...req, kinds: firstKinds }, (done) => progress(done, total));
      // Stopped or overtaken in between (cancel, a newer job): nothing more for this request.
      const slot = this.store.getState().curves;
      if (slot.request !== req || slot.progress === null) throw new CancelledError();
      this.update('curves', { result: part, resultRevision: req.revision, pendingKinds: rest, progress: { done: firstKinds.length, total } });
      const others = await this.client.curves({ ...req, kinds: rest }, (done) => progress(firstKinds.length + done, total));
      return mergeCurveSets(part, others);
    });
  }

  runMap(resolution: MapResolution): void {
    const { design, revision } = this.document.getState();
    const half = Math.max(design.envelope.leanDeg, design.envelope.handlebarDeg);
    const angleStepDeg = MAP_RESOLUTIONS.find((r) => r.id === resolution)!.step(half);
    this.run('map', { design, angleStepDeg, revision }, (req, progress) => this.client.map(req, progress));
  }

  /**
   * Stops the running job (its slot keeps its last result). The stopped job stays counted as
   * asked for (the user's Cancel is not undone by the plots asking again at once), unless
   * `forget`: the panel that asked is going away, and the one mounted next asks anew (React's
   * StrictMode mounts, unmounts and mounts every panel once in a development build).
   */
  cancel({ forget = false }: { forget?: boolean } = {}): void {
    this.client.cancel();
    const running = (kind: JobKind) => (forget && this.store.getState()[kind].progress !== null ? { request: null } : {});
    this.settle('curves', running('curves'));
    this.settle('map', running('map'));
  }

  dispose(): void {
    this.client.dispose();
  }

  private run<Req extends { revision: number }, Res>(kind: JobKind, request: Req, start: (req: Req, progress: (done: number, total: number) => void) => Promise<Res>): void {
    // The client runs one job at a time: this one stops the other, which is then not counted
    // as asked for (the plots ask again when its tab is shown).
    const other = kind === 'curves' ? 'map' : 'curves';
    if (this.store.getState()[other].progress !== null) this.settle(other, { request: null });
    this.update(kind, { request, progress: { done: 0, total: 1 }, error: null });
    start(request, (done, total) => this.update(kind, { progress: { done, total } }))
      .then((result) => this.settle(kind, { result, resultRevision: request.revision, pendingKinds: [] }))
      .catch((e: unknown) => {
        // A cancelled job was stopped by cancel() or by a newer job, which set the slot itself.
        if (e instanceof CancelledError) return;
        this.settle(kind, { error: e instanceof Error ? e.message : String(e) });
      });
  }

  /** Ends a slot's running state (if any), with what the job left. */
  private settle(kind: JobKind, change: Partial<JobSlot<unknown, unknown>>): void {
    if (this.store.getState()[kind].progress === null && Object.keys(change).length === 0) return;
    this.update(kind, { ...change, progress: null });
  }

  /** The request and result types of a slot are set by runCurves and runMap, which name both. */
  private update(kind: JobKind, change: Partial<JobSlot<unknown, unknown>>): void {
    this.store.setState({ [kind]: { ...this.store.getState()[kind], ...change } } as Partial<JobsState>);
  }
}
