/**
 * Fit to a built vehicle: a measurement sheet (CSV: lean, handlebar, travel, side, quantity,
 * value, optional weight) and the points ticked "vary" on the hardpoint table (each side on its
 * own, as a built vehicle's errors are); core's fit in the worker finds where those points
 * really are, with standard errors, every measurement's residual, and the points the data
 * cannot pin down. Preview draws the fitted design as the reference; Apply is one undo step.
 */
import { useMemo, useRef, useState } from 'react';
import type { FitReport } from '../../core/studies/fit';
import { tuneVariableIds } from '../../core/studies/tunePlan';
import { useActions, useDocument, useStudies, useWorkbenchApi } from '../app/workbenchContext';
import { adoptResult, previewResult } from './adoptResult';
import { fmt } from '../model/format';
import { fitIdsOf } from '../model/tunePicks';
import { StaleNote, StudyProgress } from './StudyProgress';
import { useStudyJob } from './useStudyJob';

export function FitPanel() {
  const design = useDocument((s) => s.design);
  const picks = useStudies((s) => s.picks);
  const studies = useWorkbenchApi().studies;
  const actions = useActions();
  const job = useStudyJob('fit', design);
  const fileInput = useRef<HTMLInputElement>(null);
  const [sheet, setSheet] = useState<{ name: string; text: string } | null>(null);
  const [eachSide, setEachSide] = useState(true);
  const valid = useMemo(() => new Set(tuneVariableIds(design)), [design]);
  const ids = fitIdsOf(picks, eachSide).filter((id) => valid.has(id));
  const result = job.state.phase === 'done' ? job.state.data : null;
  const problem = sheet === null ? 'Open a measurement sheet (CSV).' : ids.length === 0 ? 'Tick "vary" on the points that may be off on the built vehicle.' : null;

  return (
    <div className="study fit-study" data-testid="fit-panel">
      <p className="hint">Measured on the prototype: toe, camber or road-wheel angle per wheel at a lean, handlebar and travel (columns lean_deg, handlebar_deg, travel_mm, side, quantity, value, weight). The fit moves the points ticked "vary" until the model reproduces them.</p>
      <div className="study-line">
        <button type="button" onClick={() => fileInput.current?.click()} data-testid="fit-open">
          {sheet ? 'Another sheet…' : 'Measurement sheet…'}
        </button>
        <input
          ref={fileInput}
          type="file"
          accept=".csv,text/csv"
          hidden
          data-testid="fit-file"
          onChange={(e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) void f.text().then((text) => setSheet({ name: f.name, text }));
          }}
        />
        {sheet && <span data-testid="fit-sheet">{sheet.name}</span>}
        <label>
          <input type="checkbox" checked={eachSide} onChange={(e) => setEachSide(e.target.checked)} /> each side on its own
        </label>
      </div>
      <p className="hint">{ids.length} coordinates may move{ids.length > 0 ? `: ${ids.slice(0, 4).join(', ')}${ids.length > 4 ? ', …' : ''}` : ''}.</p>
      {job.state.phase !== 'running' && (
        <button type="button" disabled={problem !== null} onClick={() => sheet && job.run({ design, csv: sheet.text, csvName: sheet.name, ids })} data-testid="run-fit">
          Fit to the measurements
        </button>
      )}
      {problem && <p className="hint">{problem}</p>}
      <StudyProgress state={job.state} what="fit" onCancel={job.cancel} />
      {result && (
        <FitResult
          report={result}
          stale={job.stale}
          onPreview={() => previewResult(studies, result.fitted, 'fitted to the measurements')}
          onApply={() => {
            if (adoptResult(actions, studies, design, result.fitted, 'apply the fit to the measurements', 'before the fit')) job.reset();
          }}
        />
      )}
    </div>
  );
}

function FitResult({ report, stale, onPreview, onApply }: { report: FitReport; stale: boolean; onPreview(): void; onApply(): void }) {
  const broken = report.measurements.some((m) => m.modelled === null);
  return (
    <div className="study-result" data-testid="fit-result">
      <StaleNote stale={stale} />
      <p className="hint">
        {report.measurements.length} measurements, {report.iterations} iterations, {report.evaluations} solves, {report.seconds.toFixed(1)} s. Weighted RMS residual {fmt(report.rmsBeforeDeg, 4)} → {fmt(report.rmsAfterDeg, 4)} deg.
      </p>
      {report.notes.map((n, i) => (
        <p key={i} className="hint is-stale">
          {n}
        </p>
      ))}
      <table className="study-table" data-testid="fit-coordinates">
        <thead>
          <tr>
            <th scope="col">Coordinate</th>
            <th scope="col">Moved, mm</th>
            <th scope="col">± 1 se</th>
          </tr>
        </thead>
        <tbody>
          {report.variables.map((v) => (
            <tr key={v.id}>
              <td>{v.words}</td>
              <td>{v.identifiable ? fmt(v.movedMm, 3) : 'cannot be pinned down'}</td>
              <td>{fmt(v.standardErrorMm, 3)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="study-table" data-testid="fit-measurements">
        <thead>
          <tr>
            <th scope="col">Line</th>
            <th scope="col">Measured at</th>
            <th scope="col">Value, deg</th>
            <th scope="col">Model before</th>
            <th scope="col">after</th>
            <th scope="col">Residual</th>
          </tr>
        </thead>
        <tbody>
          {report.measurements.map((m) => (
            <tr key={m.line}>
              <td>{m.line}</td>
              <td>
                {m.pose}, {m.side} {m.quantity.replace(/_deg$/, '').replace(/_/g, ' ')}
              </td>
              <td>{fmt(m.measured, 3)}</td>
              <td>{fmt(m.before, 3)}</td>
              <td>{m.modelled === null ? 'does not assemble' : fmt(m.modelled, 3)}</td>
              <td>{fmt(m.residual, 3)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="study-line">
        <button type="button" onClick={onPreview} disabled={stale}>
          Preview
        </button>
        <button type="button" onClick={onApply} disabled={stale || broken} data-testid="fit-apply">
          Apply (one undo step)
        </button>
      </div>
    </div>
  );
}
