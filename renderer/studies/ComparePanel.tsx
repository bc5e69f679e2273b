/**
 * Variants: the design on screen against a reference (pinned copy, another file, a bundled
 * demo, or the design before an applied tune or proposal). The reference is drawn as a ghost
 * and as dashed curves; "Compare" runs core's compareVariants in the worker for the table of
 * hardpoints, settings and results that differ, and each design's check.
 */
import { useRef, useState } from 'react';
import { parseDesignText } from '../../core/design/validateDesign';
import type { VariantsReport } from '../../core/studies/variants';
import { useDocument, useStudies, useWorkbenchApi } from '../app/workbenchContext';
import { DEMO_DESIGNS } from '../model/demoDesigns';
import { fmt } from '../model/format';
import { StaleNote, StudyProgress } from './StudyProgress';
import { useStudyJob } from './useStudyJob';

const THIS = 'this design';

export function ComparePanel() {
  const design = useDocument((s) => s.design);
  const reference = useStudies((s) => s.reference);
  const studies = useWorkbenchApi().studies;
  const job = useStudyJob('variants', design);
  const fileInput = useRef<HTMLInputElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const stale = job.state.phase === 'done' && (job.stale || job.state.data.labels[1] !== reference?.label);

  const takeText = (text: string, fileName: string) => {
    const parsed = parseDesignText(text, fileName);
    if (!parsed.ok) {
      setProblem(`${fileName} cannot be the reference: ${parsed.issues.slice(0, 3).map((i) => i.message).join(' ')}`);
      return;
    }
    setProblem(null);
    studies.setState({ reference: { label: fileName, design: parsed.design } });
  };

  return (
    <div className="study compare-study" data-testid="compare-panel">
      <p className="hint">
        Reference: <strong data-testid="reference-label">{reference ? reference.label : 'none'}</strong>
        {reference ? ' — drawn as a ghost in the view and as dashed curves in the plots.' : ''}
      </p>
      <div className="study-line">
        <button type="button" data-testid="pin-reference" onClick={() => studies.setState({ reference: { label: `pinned at ${new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`, design } })} title="Keep a copy of the design as it is now, to compare your next edits with">
          Pin this design
        </button>
        <button type="button" onClick={() => fileInput.current?.click()}>
          Another file…
        </button>
        <input
          ref={fileInput}
          type="file"
          accept=".tiltsheet,.json"
          hidden
          onChange={(e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) void f.text().then((t) => takeText(t, f.name));
          }}
        />
        <select value="" onChange={(e) => {
          const demo = DEMO_DESIGNS.find((d) => d.id === e.target.value);
          if (demo) takeText(demo.text, demo.fileName);
        }} aria-label="a bundled demo as the reference">
          <option value="">a demo…</option>
          {DEMO_DESIGNS.map((d) => (
            <option key={d.id} value={d.id}>
              {d.fileName}
            </option>
          ))}
        </select>
        {reference && (
          <button type="button" onClick={() => studies.setState({ reference: null })} data-testid="clear-reference">
            No reference
          </button>
        )}
      </div>
      {problem && (
        <p className="field-error" role="alert">
          {problem}
        </p>
      )}
      {reference && job.state.phase !== 'running' && (
        <button type="button" data-testid="run-compare" onClick={() => job.run({ variants: [{ label: THIS, file: design }, { label: reference.label, file: reference.design }] })}>
          Compare in the operating region
        </button>
      )}
      <StudyProgress state={job.state} what="comparison" onCancel={job.cancel} />
      {job.state.phase === 'done' && <CompareResult report={job.state.data} stale={stale} />}
    </div>
  );
}

function CompareResult({ report, stale }: { report: VariantsReport; stale: boolean }) {
  const [a, b] = report.labels;
  return (
    <div className="study-result" data-testid="compare-result">
      <StaleNote stale={stale} />
      <p className="hint">
        At {report.poses.length} poses ({report.posesFrom}).{' '}
        {report.check.map((c, i) => (c ? `${report.labels[i]}: check ${c.passed ? 'passes' : `fails (${c.over.slice(0, 3).join(', ')}${c.over.length > 3 ? ', …' : ''})`}. ` : '')).join('')}
      </p>
      {report.notAssembled.map((n, i) => (n.length > 0 ? <p key={i} className="field-error">{report.labels[i]} does not assemble at {n.length} poses: {n[0]}</p> : null))}
      <table className="study-table" data-testid="compare-results">
        <thead>
          <tr>
            <th scope="col">Over the region</th>
            <th scope="col">{a}</th>
            <th scope="col">{b}</th>
            <th scope="col">Limit</th>
          </tr>
        </thead>
        <tbody>
          {report.results.map((r) => (
            <tr key={r.id}>
              <th scope="row">{r.label}</th>
              <td title={r.where[0] ?? ''}>
                {fmt(r.values[0], 3)} {r.unit}
              </td>
              <td title={r.where[1] ?? ''}>
                {fmt(r.values[1], 3)} {r.unit}
              </td>
              <td>{r.limits[0] === null ? '—' : `${r.kind === 'least' ? '≥' : '≤'} ${fmt(r.limits[0], 2)} ${r.unit}`}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="study-table" data-testid="compare-hardpoints">
        <thead>
          <tr>
            <th scope="col">Hardpoints that differ</th>
            <th scope="col">{a}, mm</th>
            <th scope="col">{b}, mm</th>
            <th scope="col">Apart</th>
          </tr>
        </thead>
        <tbody>
          {report.hardpoints.length === 0 && (
            <tr>
              <td colSpan={4}>none</td>
            </tr>
          )}
          {report.hardpoints.map((h) => (
            <tr key={h.id}>
              <td>{h.point}</td>
              <td>{h.values[0] ? `${fmt(h.values[0].x, 1)}, ${fmt(h.values[0].y, 1)}, ${fmt(h.values[0].z, 1)}` : 'absent'}</td>
              <td>{h.values[1] ? `${fmt(h.values[1].x, 1)}, ${fmt(h.values[1].y, 1)}, ${fmt(h.values[1].z, 1)}` : 'absent'}</td>
              <td>{h.movedMm === null ? '—' : `${fmt(h.movedMm, 2)} mm`}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {report.settings.length > 0 && (
        <table className="study-table" data-testid="compare-settings">
          <thead>
            <tr>
              <th scope="col">Settings that differ</th>
              <th scope="col">{a}</th>
              <th scope="col">{b}</th>
            </tr>
          </thead>
          <tbody>
            {report.settings.map((s) => (
              <tr key={s.path}>
                <td>{s.path}</td>
                <td>{s.values[0] ?? 'absent'}</td>
                <td>{s.values[1] ?? 'absent'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
