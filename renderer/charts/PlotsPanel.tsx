/**
 * The charts: the 1-D curves and the envelope heat map, computed in the sweep worker when the
 * design changes (with progress and cancel), with a marker at the current pose; clicking a
 * map cell moves the sliders there.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { useActions, useWorkbench, useWorkbenchApi } from '../app/workbenchContext';
import { CancelledError, SweepClient } from '../workers/sweepClient';
import { playbackStore } from '../panels/playback';
import type { CurveSet, EnvelopeMapData, MapMetric } from './chartData';
import { ChartView } from './ChartView';
import { CURVE_CHARTS, curveOption, type ChartMarker, type CurveChartId } from './curveOptions';
import { heatMapOption, MAP_METRICS } from './heatMapOptions';

type Tab = CurveChartId | 'map';

/** Quiet time after an edit before the charts are recomputed, ms. */
const RECOMPUTE_DELAY_MS = 350;
/** The charts' marker follows the pose once it has been still this long, ms. */
const MARKER_SETTLE_MS = 250;

const RESOLUTIONS = [
  { id: 'coarse', label: 'coarse (≈ 11 × 11)', step: (half: number) => Math.max(0.5, half / 5) },
  { id: 'medium', label: 'medium (2 deg)', step: () => 2 },
  { id: 'fine', label: 'fine (1 deg)', step: () => 1 },
] as const;

interface Job {
  what: string;
  /** What `done` and `total` count. */
  unit: string;
  done: number;
  total: number;
}

/**
 * The current pose for the charts' marker, once the pose has been still for a moment:
 * re-rendering a chart costs more than a frame of the viewport, so it never competes with
 * the frames of a slider drag or of playback.
 */
function useSettledMarker(): ChartMarker {
  const wb = useWorkbenchApi();
  const read = (): ChartMarker => {
    const s = wb.store.getState();
    const a = s.outcome.analysis;
    const travel = s.pose.contact === 'travel' ? s.pose.travelRightMm : -s.pose.heaveMm;
    return {
      leanDeg: s.pose.leanDeg,
      handlebarDeg: s.pose.handlebarDeg,
      travelMm: travel,
      ackermann: a && a.ackermann.innerDeg !== null && a.ackermann.outerDeg !== null ? { innerDeg: a.ackermann.innerDeg, outerDeg: a.ackermann.outerDeg } : null,
    };
  };
  const [marker, setMarker] = useState<ChartMarker>(read);
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const settle = () => {
      clearTimeout(timer);
      timer = setTimeout(() => {
        if (!playbackStore.getState().playing) setMarker(read());
      }, MARKER_SETTLE_MS);
    };
    const off = wb.store.subscribe((s, prev) => {
      if (s.outcome !== prev.outcome) settle();
    });
    const offPlayback = playbackStore.subscribe((p, prev) => {
      if (prev.playing && !p.playing) settle();
    });
    return () => {
      off();
      offPlayback();
      clearTimeout(timer);
    };
  }, [wb]);
  return marker;
}

export function PlotsPanel() {
  const wb = useWorkbenchApi();
  const actions = useActions();
  const revision = useWorkbench((s) => s.revision);
  const valid = useWorkbench((s) => s.resolved !== null);
  const [tab, setTab] = useState<Tab>('leanSteer');
  const [curves, setCurves] = useState<CurveSet | null>(null);
  const [curvesRevision, setCurvesRevision] = useState(-1);
  const [map, setMap] = useState<EnvelopeMapData | null>(null);
  const [mapRevision, setMapRevision] = useState(-1);
  const [metric, setMetric] = useState<MapMetric>('status');
  const [resolution, setResolution] = useState<(typeof RESOLUTIONS)[number]['id']>('coarse');
  const [job, setJob] = useState<Job | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [open, setOpen] = useState(true);
  const client = useMemo(() => new SweepClient(), []);
  const marker = useSettledMarker();
  const mapResolutionRef = useRef(resolution);

  useEffect(() => () => client.dispose(), [client]);

  const runCurves = () => {
    const s = wb.store.getState();
    if (!s.resolved) return;
    const rev = s.revision;
    setError(null);
    setJob({ what: 'curves', unit: 'curves', done: 0, total: 1 });
    client
      .curves({ design: s.design }, (done, total) => setJob({ what: 'curves', unit: 'curves', done, total }))
      .then((data) => {
        setCurves(data);
        setCurvesRevision(rev);
        setJob(null);
      })
      .catch((e) => {
        if (!(e instanceof CancelledError)) {
          setError(e instanceof Error ? e.message : String(e));
          setJob(null);
        }
      });
  };

  const runMap = (res = mapResolutionRef.current) => {
    const s = wb.store.getState();
    if (!s.resolved) return;
    const rev = s.revision;
    const half = Math.max(s.design.envelope.leanDeg, s.design.envelope.handlebarDeg);
    const step = RESOLUTIONS.find((r) => r.id === res)!.step(half);
    setError(null);
    setJob({ what: 'envelope map', unit: 'poses', done: 0, total: 1 });
    client
      .map({ design: s.design, angleStepDeg: step }, (done, total) => setJob({ what: 'envelope map', unit: 'poses', done, total }))
      .then((data) => {
        setMap(data);
        setMapRevision(rev);
        setJob(null);
      })
      .catch((e) => {
        if (!(e instanceof CancelledError)) {
          setError(e instanceof Error ? e.message : String(e));
          setJob(null);
        }
      });
  };

  // Recompute what is shown after the design settles.
  useEffect(() => {
    if (!valid || !open) return;
    const needs = tab === 'map' ? mapRevision !== revision : curvesRevision !== revision;
    if (!needs) return;
    const t = setTimeout(() => (tab === 'map' ? runMap() : runCurves()), RECOMPUTE_DELAY_MS);
    return () => clearTimeout(t);
  }, [revision, tab, valid, open, curvesRevision, mapRevision]);

  const option = useMemo(() => {
    if (tab === 'map') return map ? heatMapOption(map, metric, marker.leanDeg !== null && marker.handlebarDeg !== null ? { leanDeg: marker.leanDeg, handlebarDeg: marker.handlebarDeg } : null) : null;
    return curves ? curveOption(tab, curves, marker) : null;
  }, [tab, curves, map, metric, marker]);

  const stale = tab === 'map' ? map !== null && mapRevision !== revision : curves !== null && curvesRevision !== revision;

  return (
    <section className={`plots ${open ? '' : 'is-closed'}`} aria-label="Plots" data-testid="plots">
      <div className="plots-bar" role="tablist">
        <button type="button" className="plots-toggle" onClick={() => setOpen(!open)} aria-expanded={open} title={open ? 'Hide the plots' : 'Show the plots'}>
          {open ? '▾' : '▸'} Plots
        </button>
        {CURVE_CHARTS.map((c) => (
          <button key={c.id} type="button" role="tab" aria-selected={tab === c.id} className={tab === c.id ? 'is-active' : ''} onClick={() => { setTab(c.id); setOpen(true); }} data-testid={`tab-${c.id}`}>
            {c.label}
          </button>
        ))}
        <button type="button" role="tab" aria-selected={tab === 'map'} className={tab === 'map' ? 'is-active' : ''} onClick={() => { setTab('map'); setOpen(true); }} data-testid="tab-map">
          Envelope map
        </button>
      </div>
      {open && (
        <div className="plots-body">
          {tab === 'map' && (
            <div className="map-controls">
              <label>
                Colour by{' '}
                <select value={metric} onChange={(e) => setMetric(e.target.value as MapMetric)} data-testid="map-metric">
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
                    const r = e.target.value as typeof resolution;
                    setResolution(r);
                    mapResolutionRef.current = r;
                    runMap(r);
                  }}
                >
                  {RESOLUTIONS.map((r) => (
                    <option key={r.id} value={r.id}>
                      {r.label}
                    </option>
                  ))}
                </select>
              </label>
              <button type="button" onClick={() => runMap()} disabled={job !== null}>
                Recompute
              </button>
              {map && <span className="hint">{map.cells.length} poses in {(map.elapsedMs / 1000).toFixed(1)} s</span>}
            </div>
          )}
          {job && (
            <div className="progress" role="progressbar" aria-valuemin={0} aria-valuemax={job.total} aria-valuenow={job.done} data-testid="sweep-progress">
              <span>
                Computing the {job.what}… {job.total > 1 ? `${job.done} of ${job.total} ${job.unit}` : ''}
              </span>
              <progress max={job.total} value={job.done} />
              <button
                type="button"
                onClick={() => {
                  client.cancel();
                  setJob(null);
                }}
                data-testid="sweep-cancel"
              >
                Cancel
              </button>
            </div>
          )}
          {error && <p className="field-error">The sweep failed: {error}</p>}
          {!valid && <p className="hint">The design has errors; the plots wait until it is valid.</p>}
          {stale && !job && <p className="hint stale">The design changed; these plots are from before the change.</p>}
          {option ? (
            <ChartView
              option={option}
              testId={`chart-${tab}`}
              onClick={(p) => {
                if (tab !== 'map' || !map || p.seriesType !== 'heatmap') return;
                const d = p.data as number[];
                actions.setPose({ leanDeg: map.lean[d[0]], handlebarDeg: map.handlebar[d[1]] });
              }}
            />
          ) : (
            !job && valid && <p className="hint">Nothing computed yet.</p>
          )}
        </div>
      )}
    </section>
  );
}
