/**
 * The charts: the 1-D curves and the envelope heat map, computed by the workbench's jobs (in
 * the sweep worker, with progress and cancel) when the design changes, with a marker at the
 * current pose; clicking a map cell moves the sliders there. The tab and the map's choices
 * are the UI store's `plots`; the results are the jobs store's.
 */
import { Activity, useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { useActions, useDocument, useJobs, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { MAP_RESOLUTIONS, type JobProgress, type MapResolution } from '../state/jobsStore';
import { setPlots, type PlotTab } from '../state/uiStore';
import type { Workbench } from '../state/workbench';
import type { CurveSet, MapMetric } from '../../core/report/charts/chartData';
import { ChartView } from './ChartView';
import { CHART_CURVES, CURVE_CHARTS, curveOption, isLeanChart, NO_LEAN_REASON, type ChartMarker } from '../../core/report/charts/curveOptions';
import { heatMapOption, MAP_METRICS } from '../../core/report/charts/heatMapOptions';
import { sameGrid, withReference, withReferenceMap } from '../../core/report/charts/referenceOverlay';
import { heldRanges, withHeldRanges } from '../../core/report/charts/axisRange';
import { useReferenceCurves, useReferenceMap } from '../studies/useReferenceCurves';

/**
 * Quiet time after an edit before the charts are recomputed, ms, when edits come in a burst
 * (a held arrow key, repeated undo); an edit after a quiet spell recomputes at once. A gizmo
 * drag recomputes when the drag ends, not on each move.
 */
const RECOMPUTE_DELAY_MS = 40;
/** No job asked for this long: the next edit recomputes without waiting, ms. */
const QUIET_BEFORE_MS = 300;
/** The charts' marker follows the pose once it has been still this long, ms. */
const MARKER_SETTLE_MS = 250;

function markerOf(wb: Workbench): ChartMarker {
  const { pose, outcome } = wb.pose.getState();
  const a = outcome.analysis;
  const travel = pose.contact === 'travel' ? pose.travelRightMm : -pose.heaveMm;
  return {
    leanDeg: pose.leanDeg,
    handlebarDeg: pose.handlebarDeg,
    travelMm: travel,
    ackermann: a && a.ackermann.innerDeg !== null && a.ackermann.outerDeg !== null ? { innerDeg: a.ackermann.innerDeg, outerDeg: a.ackermann.outerDeg } : null,
  };
}

/** `prev` when `next` shows the same point (so the chart is not drawn again), else `next`. */
export function sameMarker(prev: ChartMarker, next: ChartMarker): ChartMarker {
  const a = prev.ackermann;
  const b = next.ackermann;
  const sameAckermann = a === b || (a !== null && b !== null && a.innerDeg === b.innerDeg && a.outerDeg === b.outerDeg);
  return prev.leanDeg === next.leanDeg && prev.handlebarDeg === next.handlebarDeg && prev.travelMm === next.travelMm && sameAckermann ? prev : next;
}

/**
 * The curve set a tab draws: the one it drew before while the tab's own curves are the same
 * objects of the same revision (the rest of the set arriving after the open chart's part does
 * not redraw it). A chart draws at most two kinds (camber: lean and travel).
 */
export function useTabCurves(curves: CurveSet | null, revision: number, tab: PlotTab): CurveSet | null {
  const kinds = tab === 'map' ? [] : CHART_CURVES[tab];
  const [k0, k1] = kinds;
  const c0 = k0 && curves ? (curves.curves[k0] ?? curves.missing[k0]) : undefined;
  const c1 = k1 && curves ? (curves.curves[k1] ?? curves.missing[k1]) : undefined;
  const whole = tab === 'map' || kinds.length > 2 ? curves : null;
  const none = curves === null;
  // The set is looked at only through the tab's own curves, which are the memo's inputs.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  return useMemo(() => curves, [none, whole, revision, tab, c0, c1]);
}

/**
 * The current pose for the charts' marker, once the pose has been still for a moment:
 * re-rendering a chart costs more than a frame of the viewport, so it never competes with
 * the frames of a slider drag or of playback.
 */
function useSettledMarker(): ChartMarker {
  const wb = useWorkbenchApi();
  const [marker, setMarker] = useState<ChartMarker>(() => markerOf(wb));
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const settle = () => {
      clearTimeout(timer);
      timer = setTimeout(() => {
        // Only a marker that moved redraws the chart (an edit re-solves the pose in place).
        if (!wb.ui.getState().playback.playing) setMarker((m) => sameMarker(m, markerOf(wb)));
      }, MARKER_SETTLE_MS);
    };
    const offPose = wb.pose.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome) settle();
    });
    const offUi = wb.ui.subscribe((u, prev) => {
      if (prev.playback.playing && !u.playback.playing) settle();
    });
    return () => {
      offPose();
      offUi();
      clearTimeout(timer);
    };
  }, [wb]);
  return marker;
}

/**
 * Asks the jobs for what the open tab shows when the design changes (at once after a quiet
 * spell, else once edits pause). The document store is followed directly, not through a React
 * render: the job starts in the edit's own task, not after the next painted frame.
 */
function useRecompute(): void {
  const wb = useWorkbenchApi();
  const { open, tab, resolution } = useUi((s) => s.plots);
  const revision = useDocument((s) => s.revision);
  const valid = usePose((s) => s.resolved !== null);
  const dragging = useUi((s) => s.dragging);
  // The revision last asked for: a job running, done, failed or cancelled for it is not asked again.
  const asked = useJobs((s) => (tab === 'map' ? s.map : s.curves).request?.revision);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const lastAskAt = useRef(-Infinity);
  const schedule = useCallback(() => {
    const wanted = () => {
      const { open, tab } = wb.ui.getState().plots;
      const rev = wb.document.getState().revision;
      const slot = wb.jobs.store.getState()[tab === 'map' ? 'map' : 'curves'];
      return open && !wb.ui.getState().dragging && wb.pose.getState().resolved !== null && slot.request?.revision !== rev;
    };
    const ask = () => {
      if (!wanted()) return;
      lastAskAt.current = performance.now();
      const { tab, resolution } = wb.ui.getState().plots;
      if (tab === 'map') wb.jobs.runMap(resolution);
      // The open chart's curves first, shown as soon as they come; the other charts' after.
      else wb.jobs.runCurves(CHART_CURVES[tab]);
    };
    if (!wanted()) return;
    clearTimeout(timer.current);
    // After a quiet spell the job goes to the worker now, to run while the page re-renders.
    if (performance.now() - lastAskAt.current > QUIET_BEFORE_MS) ask();
    else timer.current = setTimeout(ask, RECOMPUTE_DELAY_MS);
  }, [wb]);
  useEffect(() => {
    const off = wb.document.subscribe((s, prev) => {
      if (s.revision !== prev.revision) schedule();
    });
    return () => {
      off();
      clearTimeout(timer.current);
    };
  }, [wb, schedule]);
  // The tab, its choices, a drag's end or a design that solves again.
  useEffect(() => {
    if (valid && open && !dragging && asked !== revision) schedule();
  }, [schedule, revision, tab, valid, open, dragging, asked, resolution]);
}

/**
 * The tabs; a vehicle that does not lean has no lean curves, so their tabs are left out and
 * the bar says why (and the plots move off such a tab).
 */
function PlotTabs() {
  const { ui } = useWorkbenchApi();
  const { open, tab, numbers } = useUi((s) => s.plots);
  const tilting = useDocument((s) => s.design.vehicle.tilting);
  const [shown, hidden] = useMemo(() => [CURVE_CHARTS.filter((c) => tilting || !isLeanChart(c.id)), CURVE_CHARTS.filter((c) => !tilting && isLeanChart(c.id))], [tilting]);
  useEffect(() => {
    if (tab !== 'map' && !tilting && isLeanChart(tab)) setPlots(ui, { tab: shown[0].id });
  }, [ui, tab, tilting, shown]);
  const tabButton = (id: typeof tab, label: string) => (
    <button key={id} type="button" role="tab" aria-selected={!numbers && tab === id} className={!numbers && tab === id ? 'is-active' : ''} onClick={() => setPlots(ui, { tab: id, open: true, numbers: false })} data-testid={`tab-${id}`}>
      {label}
    </button>
  );
  return (
    <div className="plots-bar" role="tablist">
      <button type="button" className="plots-toggle" onClick={() => setPlots(ui, { open: !open })} aria-expanded={open} title={open ? 'Hide the plots' : 'Show the plots'}>
        {open ? '▾' : '▸'} Plots
      </button>
      {shown.map((c) => tabButton(c.id, c.label))}
      {tabButton('map', 'Envelope map')}
      {/* Every reading of the pose on screen, as a tab of the strip (the layout passes the table in). */}
      <button type="button" role="tab" aria-selected={numbers} className={numbers ? 'is-active' : ''} onClick={() => setPlots(ui, { open: true, numbers: true })} data-testid="tab-numbers">
        Numbers
      </button>
      {hidden.length > 0 && (
        <span className="hint plots-hidden" data-testid="plots-hidden">
          {hidden.map((c) => c.label).join(', ')}: not shown, {NO_LEAN_REASON}
        </span>
      )}
    </div>
  );
}

function MapControls({ running }: { running: boolean }) {
  const { ui, jobs } = useWorkbenchApi();
  const { metric, resolution } = useUi((s) => s.plots);
  const map = useJobs((s) => s.map.result);
  return (
    <div className="map-controls">
      <label>
        Colour by{' '}
        <select value={metric} onChange={(e) => setPlots(ui, { metric: e.target.value as MapMetric })} data-testid="map-metric">
          {MAP_METRICS.map((m) => (
            <option key={m.id} value={m.id}>
              {m.label}
            </option>
          ))}
        </select>
      </label>
      <label>
        Resolution{' '}
        <select
          value={resolution}
          onChange={(e) => {
            const r = e.target.value as MapResolution;
            setPlots(ui, { resolution: r });
            jobs.runMap(r);
          }}
        >
          {MAP_RESOLUTIONS.map((r) => (
            <option key={r.id} value={r.id}>
              {r.label}
            </option>
          ))}
        </select>
      </label>
      <button type="button" onClick={() => jobs.runMap(resolution)} disabled={running}>
        Recompute
      </button>
      {map && <span className="hint">{map.cells.length} poses in {(map.elapsedMs / 1000).toFixed(1)} s</span>}
    </div>
  );
}

function JobProgressBar({ what, unit, progress }: { what: string; unit: string; progress: JobProgress }) {
  const { jobs } = useWorkbenchApi();
  return (
    <div className="progress" role="progressbar" aria-valuemin={0} aria-valuemax={progress.total} aria-valuenow={progress.done} data-testid="sweep-progress">
      <span>
        Computing the {what}… {progress.total > 1 ? `${progress.done} of ${progress.total} ${unit}` : ''}
      </span>
      <progress max={progress.total} value={progress.done} />
      <button type="button" onClick={() => jobs.cancel()} data-testid="sweep-cancel">
        Cancel
      </button>
    </div>
  );
}

/** The chart of the open tab, or why there is none. */
function PlotBody({ running }: { running: boolean }) {
  const actions = useActions();
  const { tab, metric } = useUi((s) => s.plots);
  const revision = useDocument((s) => s.revision);
  const valid = usePose((s) => s.resolved !== null);
  const slot = useJobs((s) => (tab === 'map' ? s.map : s.curves));
  const curvesRevision = useJobs((s) => s.curves.resultRevision);
  const allCurves = useJobs((s) => s.curves.result);
  const curves = useTabCurves(allCurves, curvesRevision, tab);
  const pendingKinds = useJobs((s) => s.curves.pendingKinds);
  const tabPending = tab !== 'map' && CHART_CURVES[tab].some((k) => pendingKinds.includes(k));
  const map = useJobs((s) => s.map.result);
  const settled = useSettledMarker();
  // Only the Ackermann chart draws the pose's Ackermann angles: on the other tabs an edit that
  // moves them (but not the pose) does not redraw the chart.
  const { leanDeg, handlebarDeg, travelMm } = settled;
  const ackermann = tab === 'ackermann' ? settled.ackermann : null;
  const marker = useMemo<ChartMarker>(() => ({ leanDeg, handlebarDeg, travelMm, ackermann }), [leanDeg, handlebarDeg, travelMm, ackermann]);
  const reference = useReferenceCurves();
  const mapRequest = useJobs((s) => s.map.request);
  const referenceMap = useReferenceMap(tab === 'map' && mapRequest ? mapRequest.angleStepDeg : null, mapRequest?.travelMm);
  const mapsComparable = map !== null && referenceMap !== null && sameGrid(map, referenceMap.map);

  // "Hold the y-axis": the curves as they were when the hold began; each chart keeps the y range
  // it had then, through edits.
  const [heldCurves, setHeldCurves] = useState<typeof curves>(null);

  const shown = useMemo(() => {
    if (tab === 'map') {
      if (!map) return null;
      const own = heatMapOption(map, metric, marker.leanDeg !== null && marker.handlebarDeg !== null ? { leanDeg: marker.leanDeg, handlebarDeg: marker.handlebarDeg } : null);
      return referenceMap && mapsComparable ? withReferenceMap(own, referenceMap.map, metric, referenceMap.label) : own;
    }
    // A tab whose curves are still to come (another chart's came first) waits for them.
    if (!curves || tabPending) return null;
    const own = curveOption(tab, curves, marker);
    return reference ? withReference(own, curveOption(tab, reference.curves), reference.label) : own;
  }, [tab, curves, tabPending, map, metric, marker, reference, referenceMap, mapsComparable]);
  const ranges = useMemo(() => (heldCurves && tab !== 'map' ? heldRanges(curveOption(tab, heldCurves)) : null), [heldCurves, tab]);
  const option = shown && ranges ? withHeldRanges(shown, ranges) : shown;
  const stale = slot.result !== null && slot.resultRevision !== revision;

  return (
    <>
      {slot.error && <p className="field-error">The sweep failed: {slot.error}</p>}
      {!valid && <p className="hint">The design has errors; the plots wait until it is valid.</p>}
      {stale && !running && <p className="hint stale">The design changed; these plots are from before the change.</p>}
      {tab !== 'map' && curves && (
        <label className="hint hold-axis" title="Keep each chart's y range as it is now while you edit, so changes are seen against a fixed scale">
          <input
            type="checkbox"
            checked={heldCurves !== null}
            onChange={(e) => setHeldCurves(e.target.checked ? allCurves : null)}
            data-testid="hold-y"
          />{' '}
          hold the y-axis
        </label>
      )}
      {reference && tab !== 'map' && (
        <p className="hint reference-note" data-testid="reference-note">
          Dotted: {reference.label}
        </p>
      )}
      {referenceMap && tab === 'map' && (
        <p className="hint reference-note" data-testid="reference-note">
          {mapsComparable ? `Dotted outline: where ${referenceMap.label} is within tolerance on this measure` : `${referenceMap.label} has another envelope, so its map is not drawn over this one`}
        </p>
      )}
      {option ? (
        <ChartView
          option={option}
          testId={`chart-${tab}`}
          onClick={(p) => {
            if (tab !== 'map' || !map || p.seriesType !== 'heatmap') return;
            const d = p.value as number[];
            // A cell is a lean and a handlebar: going there leaves ride mode, where the lean is not an input.
            actions.setRide({ on: false });
            actions.setPose({ leanDeg: map.lean[d[0]], handlebarDeg: map.handlebar[d[1]] });
          }}
        />
      ) : (
        !running && valid && <p className="hint">Nothing computed yet.</p>
      )}
    </>
  );
}

export function PlotsPanel({ numbers }: { numbers?: ReactNode } = {}) {
  const { jobs } = useWorkbenchApi();
  const { open, tab, numbers: numbersShown } = useUi((s) => s.plots);
  const curvesProgress = useJobs((s) => s.curves.progress);
  const mapProgress = useJobs((s) => s.map.progress);
  useRecompute();
  // Leaving the workbench stops whatever is computing; mounted again, the plots ask anew.
  useEffect(() => () => jobs.cancel({ forget: true }), [jobs]);
  const running = curvesProgress !== null || mapProgress !== null;

  return (
    <section className={`plots ${open ? '' : 'is-closed'}`} aria-label="Plots" data-testid="plots">
      <PlotTabs />
      {open && (
        <div className="plots-body">
          {!numbersShown && (
            <>
              {tab === 'map' && <MapControls running={running} />}
              {curvesProgress && <JobProgressBar what="curves" unit="curves" progress={curvesProgress} />}
              {mapProgress && <JobProgressBar what="envelope map" unit="poses" progress={mapProgress} />}
              <PlotBody running={running} />
            </>
          )}
          {numbers && (
            <div className="numbers-body" hidden={!numbersShown} data-testid="numbers-body">
              {/* Hidden, the Numbers tab keeps its state but its updates wait for idle time (React's
                  Activity), so playback's poses and an edit do not render its hundreds of cells first. */}
              <Activity mode={numbersShown ? 'visible' : 'hidden'}>{numbers}</Activity>
            </div>
          )}
        </div>
      )}
    </section>
  );
}
