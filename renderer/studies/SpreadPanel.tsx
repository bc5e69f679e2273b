/**
 * Tolerance spread: every hardpoint coordinate off by a manufacturing error inside a band
 * (normal or uniform, seeded), core's Monte Carlo (or first-order) study in the worker; the
 * spread of each measure over the operating region as percentiles and a histogram, the share
 * inside tolerance, and the tolerances that drive it.
 */
import { useState } from 'react';
import { MAX_BAND_MM, type Distribution } from '../../core/studies/toleranceBands';
import { MAX_SAMPLES, type Spread, type SpreadMethod, type ToleranceReport } from '../../core/studies/toleranceSpread';
import { useDocument } from '../app/workbenchContext';
import { fmt } from '../model/format';
import { SpreadHistogram } from './SpreadHistogram';
import { StaleNote, StudyProgress } from './StudyProgress';
import { useStudyJob } from './useStudyJob';

export interface SpreadForm {
  bandMm: number;
  distribution: Distribution;
  method: SpreadMethod;
  samples: number;
  seed: number;
}

export const DEFAULT_SPREAD_FORM: SpreadForm = { bandMm: 0.5, distribution: 'normal', method: 'monte-carlo', samples: 500, seed: 1 };

/** What is wrong with the form in words, or null. */
export function spreadFormProblem(f: SpreadForm): string | null {
  if (!(f.bandMm > 0 && f.bandMm <= MAX_BAND_MM)) return `The band is a number of mm above 0 and at most ${MAX_BAND_MM}.`;
  if (!Number.isInteger(f.samples) || f.samples < 10 || f.samples > MAX_SAMPLES[f.method]) return `Samples: a whole number from 10 to ${MAX_SAMPLES[f.method]}.`;
  if (!Number.isInteger(f.seed) || f.seed < 0 || f.seed > 0xffffffff) return 'Seed: a whole number from 0 to 4294967295.';
  return null;
}

export function SpreadPanel() {
  const design = useDocument((s) => s.design);
  const [form, setForm] = useState<SpreadForm>(DEFAULT_SPREAD_FORM);
  const job = useStudyJob('tolerance', design);
  const problem = spreadFormProblem(form);
  const set = (change: Partial<SpreadForm>) => setForm((f) => ({ ...f, ...change }));
  return (
    <div className="study spread-study" data-testid="spread-panel">
      <div className="study-line">
        <label>
          every coordinate ±<input type="number" className="small-number" min={0.05} max={MAX_BAND_MM} step={0.05} value={form.bandMm} onChange={(e) => set({ bandMm: Number(e.target.value) })} aria-label="tolerance band, mm" /> mm
        </label>
        <label>
          <select value={form.distribution} onChange={(e) => set({ distribution: e.target.value as Distribution })} aria-label="distribution">
            <option value="normal">normal (band = 3 sd)</option>
            <option value="uniform">uniform over the band</option>
          </select>
        </label>
      </div>
      <div className="study-line">
        <label>
          <select value={form.method} onChange={(e) => set({ method: e.target.value as SpreadMethod })} aria-label="method">
            <option value="monte-carlo">every sample solved</option>
            <option value="first-order">first order (from the rates)</option>
          </select>
        </label>
        <label>
          samples <input type="number" className="small-number" min={10} step={100} value={form.samples} onChange={(e) => set({ samples: Math.round(Number(e.target.value)) })} />
        </label>
        <label>
          seed <input type="number" className="small-number" min={0} value={form.seed} onChange={(e) => set({ seed: Math.round(Number(e.target.value)) })} />
        </label>
        {job.state.phase !== 'running' && (
          <button
            type="button"
            disabled={problem !== null}
            data-testid="run-spread"
            onClick={() => job.run({ design, options: { samples: form.samples, seed: form.seed, bands: { defaultMm: form.bandMm }, distribution: form.distribution, method: form.method } })}
          >
            Spread over the operating region
          </button>
        )}
      </div>
      {problem && <p className="hint">{problem}</p>}
      <StudyProgress state={job.state} what="spread" onCancel={job.cancel} />
      {job.state.phase === 'done' && <SpreadResult report={job.state.data} stale={job.stale} />}
    </div>
  );
}

function percentText(x: number | null): string {
  return x === null ? '—' : `${(100 * x).toFixed(1)} %`;
}

export function SpreadResult({ report, stale }: { report: ToleranceReport; stale: boolean }) {
  const rows = report.overPoses;
  const [chosen, setChosen] = useState(rows[0]?.id ?? '');
  const spread: Spread | undefined = rows.find((r) => r.id === chosen) ?? rows[0];
  return (
    <div className="study-result" data-testid="spread-result">
      <StaleNote stale={stale} />
      <p className="hint">
        {report.samplesMeasured} of {report.samplesAsked} samples measured ({report.methodWords}; {report.distributionWords}; seed {report.seed}) at {report.poses.length} poses, {((report.elapsedMs.sensitivity + report.elapsedMs.sampling) / 1000).toFixed(1)} s.
        {report.notAssembled > 0 ? ` ${report.notAssembled} samples could not be assembled and are left out.` : ''} All measures inside tolerance together: {percentText(report.withinAll)}.
      </p>
      <table className="study-table" data-testid="spread-table">
        <thead>
          <tr>
            <th scope="col">Over the region</th>
            <th scope="col">As drawn</th>
            <th scope="col">5 %</th>
            <th scope="col">50 %</th>
            <th scope="col">95 %</th>
            <th scope="col">Inside</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className={r.id === spread?.id ? 'is-chosen' : undefined} onClick={() => setChosen(r.id)} data-testid={`spread-row-${r.id}`}>
              <th scope="row">
                <button type="button" className="link-button" onClick={() => setChosen(r.id)}>
                  {r.label}
                </button>
              </th>
              <td>{fmt(r.nominal, 3)}</td>
              <td>{fmt(r.summary?.p5, 3)}</td>
              <td>{fmt(r.summary?.p50, 3)}</td>
              <td>
                {fmt(r.summary?.p95, 3)} {r.unit}
              </td>
              <td title={r.tolerance === null ? 'no tolerance set' : `${r.kind === 'least' ? 'at least' : 'at most'} ${fmt(r.tolerance, 2)} ${r.unit}`}>{percentText(r.withinTolerance)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {spread && (
        <>
          <h4>
            {spread.label}: {spread.kind === 'worst' ? 'worst |value|' : spread.kind === 'least' ? 'least value' : 'value'} over the region
          </h4>
          <SpreadHistogram spread={spread} />
          <p className="hint">
            sd {fmt(spread.summary?.std, 4)} {spread.unit} from the samples; {spread.firstOrderSigma === null ? 'no first-order estimate (a rate is missing)' : `${fmt(spread.firstOrderSigma, 4)} ${spread.unit} first order`}
          </p>
          {spread.drivers.length > 0 && (
            <table className="study-table" data-testid="spread-drivers">
              <thead>
                <tr>
                  <th scope="col">Driven most by</th>
                  <th scope="col">Band</th>
                  <th scope="col">Share</th>
                </tr>
              </thead>
              <tbody>
                {spread.drivers.map((d) => (
                  <tr key={d.coordinateId}>
                    <td>
                      {d.point}, {d.direction}
                    </td>
                    <td>±{fmt(d.bandMm, 2)} mm</td>
                    <td>{fmt(d.sharePct, 1)} %</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </>
      )}
    </div>
  );
}
