/**
 * Tune: the coordinates ticked "vary" on the hardpoint table, with their ranges; the objectives
 * and constraints; core's optimiser in the worker with progress and cancel; the result as
 * before/after of every objective and constraint and the moves it made. "Preview" draws the
 * tuned design as the reference (ghost and dashed curves); "Apply" makes it the design as one
 * undo step, keeping the design before it as the reference.
 */
import { useMemo, useState } from 'react';
import type { TuneReport, TuneSummaryItem } from '../../core/studies/tune';
import { MEASURE_WORDS, TUNE_MEASURES, tuneVariableIds, type TuneMeasure } from '../../core/studies/tunePlan';
import { useActions, useDocument, useStudies, useWorkbenchApi } from '../app/workbenchContext';
import { describeRow } from '../model/designActions';
import { adoptResult, previewResult } from './adoptResult';
import { fmt } from '../model/format';
import { stalePicks } from '../model/tunePicks';
import { defaultTuneForm, tunePlanOf, type TuneForm } from '../model/tuneForm';
import type { TunePick } from '../state/studyStore';
import { StaleNote, StudyProgress } from './StudyProgress';
import { useStudyJob } from './useStudyJob';

export function TunePanel() {
  const design = useDocument((s) => s.design);
  const picks = useStudies((s) => s.picks);
  const studies = useWorkbenchApi().studies;
  const actions = useActions();
  const [form, setForm] = useState<TuneForm>(defaultTuneForm);
  const job = useStudyJob('tune', design);
  const validIds = useMemo(() => new Set(tuneVariableIds(design)), [design]);
  const gone = stalePicks(picks, validIds);
  const usable = picks.filter((p) => validIds.has(p.id));
  const planned = tunePlanOf(design, usable, form);
  const running = job.state.phase === 'running';
  const result = job.state.phase === 'done' ? job.state.data : null;

  const setPick = (id: string, rangeMm: [number, number]) => studies.setState({ picks: picks.map((p) => (p.id === id ? { ...p, rangeMm } : p)) });
  const dropPick = (id: string) => studies.setState({ picks: picks.filter((p) => p.id !== id) });
  const setObjective = (m: TuneMeasure, change: Partial<TuneForm['objectives'][TuneMeasure]>) => setForm((f) => ({ ...f, objectives: { ...f.objectives, [m]: { ...f.objectives[m], ...change } } }));

  return (
    <div className="study tune-study" data-testid="tune-panel">
      <h3>Vary</h3>
      {picks.length === 0 ? (
        <p className="hint">Tick "vary" on rows of the hardpoint table to let the tune move those points (a mirrored pair moves together).</p>
      ) : (
        <table className="study-table" data-testid="tune-picks">
          <thead>
            <tr>
              <th scope="col">Point</th>
              <th scope="col">Axis</th>
              <th scope="col">From, mm</th>
              <th scope="col">To, mm</th>
              <th scope="col">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {picks.map((p) => (
              <PickRow key={p.id} pick={p} name={describeRow(design, p.rowId)} gone={!validIds.has(p.id)} onRange={(r) => setPick(p.id, r)} onDrop={() => dropPick(p.id)} />
            ))}
          </tbody>
        </table>
      )}
      {gone.length > 0 && <p className="hint is-stale">Struck-out rows no longer name a coordinate of this design (linked or unlinked since) and are left out.</p>}
      {design.steering.kind !== 'trackRod' && (
      <label className="study-line">
        <input type="checkbox" checked={form.tieRodLengthMm !== null} onChange={(e) => setForm((f) => ({ ...f, tieRodLengthMm: e.target.checked ? 5 : null }))} /> also the tie-rod length, ±
        <input type="number" className="small-number" min={0.5} max={100} step={0.5} value={form.tieRodLengthMm ?? 5} disabled={form.tieRodLengthMm === null} onChange={(e) => setForm((f) => ({ ...f, tieRodLengthMm: Number(e.target.value) }))} aria-label="tie-rod length range, mm" /> mm
      </label>
      )}

      <h3>Aim for</h3>
      <table className="study-table" data-testid="tune-objectives">
        <tbody>
          {TUNE_MEASURES.map((m) => {
            const o = form.objectives[m];
            return (
              <tr key={m}>
                <td>
                  <label>
                    <input type="checkbox" checked={o.on} onChange={(e) => setObjective(m, { on: e.target.checked })} /> {MEASURE_WORDS[m]}
                  </label>
                </td>
                <td>
                  <label>
                    weight <input type="number" className="small-number" min={0.01} step={0.5} value={o.weight} disabled={!o.on} onChange={(e) => setObjective(m, { weight: Number(e.target.value) })} />
                  </label>
                </td>
                <td>
                  {(m === 'ackermann' || m === 'steeringRatio') && (
                    <label>
                      target{' '}
                      <input
                        type="number"
                        className="small-number"
                        step={m === 'ackermann' ? 5 : 0.1}
                        value={o.target ?? ''}
                        disabled={!o.on}
                        onChange={(e) => setObjective(m, { target: e.target.value === '' ? null : Number(e.target.value) })}
                        aria-label={m === 'ackermann' ? 'Ackermann target, %' : 'steering ratio target, handlebar deg per road-wheel deg'}
                      />{' '}
                      {m === 'ackermann' ? '%' : ': 1'}
                    </label>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <h3>Keep</h3>
      <div className="study-line">
        <label>
          <input type="checkbox" checked={form.jointMargin} onChange={(e) => setForm((f) => ({ ...f, jointMargin: e.target.checked }))} /> joints inside rating minus margin
        </label>
        <label>
          <input type="checkbox" checked={form.clearance} onChange={(e) => setForm((f) => ({ ...f, clearance: e.target.checked }))} /> clearances
        </label>
        <label>
          transmission angle above{' '}
          <input type="number" className="small-number" min={0} max={60} value={form.transmissionFloorDeg} onChange={(e) => setForm((f) => ({ ...f, transmissionFloorDeg: Number(e.target.value) }))} /> deg
        </label>
      </div>
      <div className="study-line">
        <label>
          starts <input type="number" className="small-number" min={1} max={10} value={form.starts} onChange={(e) => setForm((f) => ({ ...f, starts: Number(e.target.value) }))} />
        </label>
        <label>
          iterations each <input type="number" className="small-number" min={1} max={200} value={form.maxIterations} onChange={(e) => setForm((f) => ({ ...f, maxIterations: Number(e.target.value) }))} />
        </label>
        {!running && (
          <button type="button" disabled={'problem' in planned} onClick={() => 'plan' in planned && job.run({ design, plan: planned.plan })} data-testid="run-tune">
            Tune over the operating region
          </button>
        )}
      </div>
      {'problem' in planned && (
        <p className="hint" data-testid="tune-problem">
          {planned.problem}
        </p>
      )}
      <StudyProgress state={job.state} what="tune" onCancel={job.cancel} />
      {result && (
        <TuneResult
          report={result}
          stale={job.stale}
          onPreview={() => previewResult(studies, result.tuned, 'tune result')}
          onApply={() => {
            const moved = result.variables.filter((v) => Math.abs(v.movedMm) > 0.005).length;
            if (adoptResult(actions, studies, design, result.tuned, `apply the tune (${moved} coordinates moved)`, 'before the tune')) job.reset();
          }}
        />
      )}
    </div>
  );
}

function PickRow({ pick, name, gone, onRange, onDrop }: { pick: TunePick; name: string; gone: boolean; onRange(r: [number, number]): void; onDrop(): void }) {
  return (
    <tr className={gone ? 'is-gone' : undefined} data-testid={`pick-${pick.id}`}>
      <td>{name}</td>
      <td>{pick.axis}</td>
      <td>
        <input type="number" className="small-number" max={0} min={-100} step={1} value={pick.rangeMm[0]} onChange={(e) => onRange([Math.min(0, Number(e.target.value)), pick.rangeMm[1]])} aria-label={`${name} ${pick.axis}: lowest offset, mm`} />
      </td>
      <td>
        <input type="number" className="small-number" min={0} max={100} step={1} value={pick.rangeMm[1]} onChange={(e) => onRange([pick.rangeMm[0], Math.max(0, Number(e.target.value))])} aria-label={`${name} ${pick.axis}: highest offset, mm`} />
      </td>
      <td>
        <button type="button" className="icon-button" onClick={onDrop} title="Do not vary this coordinate" aria-label={`do not vary ${name} ${pick.axis}`}>
          ×
        </button>
      </td>
    </tr>
  );
}

const unitOf = (i: TuneSummaryItem) => (i.unit === '' ? '' : ` ${i.unit}`);

function keptText(k: boolean | null): string {
  return k === null ? '' : k ? '✓ inside' : '✗ outside';
}

function TuneResult({ report, stale, onPreview, onApply }: { report: TuneReport; stale: boolean; onPreview(): void; onApply(): void }) {
  const moved = report.variables.filter((v) => Math.abs(v.movedMm) > 0.005);
  const start = report.starts[report.bestStart];
  return (
    <div className="study-result" data-testid="tune-result">
      <StaleNote stale={stale} />
      <p className="hint">
        {report.cancelled ? 'Stopped early. ' : ''}
        {report.iterations} iterations, {report.evaluations} designs solved at {report.poses.length} poses, {(report.elapsedMs / 1000).toFixed(1)} s; best of {report.starts.length} starts (from {start?.from === 'design' ? 'the design as it is' : 'a seeded point'}, {start?.ended}). Cost {report.costBefore.toPrecision(3)} → {report.costAfter.toPrecision(3)}.
      </p>
      {report.notAssembledAfter.length > 0 && <p className="field-error">The tuned design does not assemble at: {report.notAssembledAfter.join('; ')}</p>}
      <table className="study-table" data-testid="tune-summary">
        <thead>
          <tr>
            <th scope="col">Measure over the region</th>
            <th scope="col">Before</th>
            <th scope="col">After</th>
            <th scope="col">Limit</th>
          </tr>
        </thead>
        <tbody>
          {report.summary.map((i) => (
            <tr key={`${i.group}-${i.id}`} className={i.keptAfter === false ? 'is-over' : undefined}>
              <th scope="row">
                {i.label}
                {i.group === 'constraint' ? ' (kept)' : ''}
              </th>
              <td title={i.beforeWhere ?? ''}>
                {fmt(i.before, 3)}
                {unitOf(i)} <span className="verdict-word">{keptText(i.keptBefore)}</span>
              </td>
              <td title={i.afterWhere ?? ''}>
                {fmt(i.after, 3)}
                {unitOf(i)} <span className="verdict-word">{keptText(i.keptAfter)}</span>
              </td>
              <td>{i.limit === null ? '—' : `${i.kind === 'least' ? '≥ ' : '≤ '}${fmt(i.limit, 2)}${unitOf(i)}`}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="study-table" data-testid="tune-moves">
        <thead>
          <tr>
            <th scope="col">Moved</th>
            <th scope="col">by, mm</th>
          </tr>
        </thead>
        <tbody>
          {report.variables.map((v) => (
            <tr key={v.id}>
              <td>{v.words}</td>
              <td>
                {fmt(v.movedMm, 2)}
                {v.atBound && <span className="hint"> at the {v.atBound === 'low' ? 'lowest' : 'highest'} end of its range: the best may lie beyond</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="study-line">
        <button type="button" onClick={onPreview} disabled={stale} data-testid="tune-preview" title="Draw the tuned design as the reference: a ghost in the view and dashed curves in the plots">
          Preview
        </button>
        <button type="button" onClick={onApply} disabled={stale || moved.length === 0 || report.notAssembledAfter.length > 0} data-testid="tune-apply">
          Apply ({moved.length} moved; one undo step)
        </button>
      </div>
    </div>
  );
}
