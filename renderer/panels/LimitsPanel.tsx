/**
 * Limits over the operating region: core's check of the design (on a coarser grid than the
 * CLI's, in the worker), the items over or close to their limits first, each with its worst
 * value and where it is first exceeded; clicking one goes to that pose and selects the part.
 */
import type { CheckItem, CheckWhere } from '../../core/analysis/designCheck';
import { useActions, useDocument, usePose } from '../app/workbenchContext';
import { subjectHardpoint } from '../model/readoutTables';
import { SEVERITY_STYLE } from '../model/severity';
import { fmt } from '../model/format';
import { StaleNote, StudyProgress } from '../studies/StudyProgress';
import { useStudyJob } from '../studies/useStudyJob';

const whereText = (w: CheckWhere) => `lean ${fmt(w.leanDeg, 1)}°, handlebar ${fmt(w.handlebarDeg, 1)}°${w.travelMm !== 0 ? `, travel ${fmt(w.travelMm, 0)} mm` : ''}`;

function worstText(it: CheckItem): string {
  if (it.worst === null) return '—';
  return it.unit === 'poses' ? String(it.worst) : `${fmt(it.worst, it.unit === 'mm' ? 1 : 2)} ${it.unit}`;
}

export function LimitsPanel() {
  const design = useDocument((s) => s.design);
  const drawing = usePose((s) => s.drawing);
  const actions = useActions();
  const job = useStudyJob('check', design);
  const go = (it: CheckItem) => {
    const w = it.firstOver ?? it.where;
    if (w) {
      actions.setRide({ on: false });
      actions.setContact('ground');
      actions.setPose({ leanDeg: w.leanDeg, handlebarDeg: w.handlebarDeg, heaveMm: -w.travelMm });
    }
    const hp = drawing && it.subject ? subjectHardpoint(drawing, it.subject) : null;
    if (hp) actions.select(hp);
  };
  const data = job.state.phase === 'done' ? job.state.data : null;
  const shown = data ? data.items.filter((i) => i.verdict !== 'within') : [];
  return (
    <section className="panel limits-panel" aria-labelledby="limits-title" data-testid="limits">
      <h2 id="limits-title">
        Operating region{' '}
        {data && (
          <span className="count" data-testid="limits-verdict">
            {data.passed ? 'passes' : `${data.items.filter((i) => i.verdict === 'over' || i.verdict === 'broken').length} over`}
          </span>
        )}
      </h2>
      {job.state.phase !== 'running' && (
        <button type="button" onClick={() => job.run({ design })} data-testid="run-limits" title="Every tolerance, joint and clearance over the poses where the vehicle is ridden, as tiltbench check does">
          {data ? 'Check again' : 'Check every limit'}
        </button>
      )}
      <StudyProgress state={job.state} what="check" onCancel={job.cancel} />
      <StaleNote stale={job.stale} />
      {data && (
        <>
          <p className="hint">
            {data.poses} poses ({data.steps.leanDeg}° and {data.steps.travelMm} mm apart; the command-line check uses 1°), {(data.elapsedMs / 1000).toFixed(1)} s. {shown.length === 0 ? 'Everything within its limit.' : 'Click an item to go where it is first exceeded.'}
          </p>
          <ul className="limits-list">
            {shown.map((it) => (
              <li key={it.id} className={`alert sev-${it.verdict}`} data-testid={`limit-${it.id}`}>
                <button type="button" className="alert-button" onClick={() => go(it)}>
                  <span style={{ color: SEVERITY_STYLE[it.verdict].colour }}>{SEVERITY_STYLE[it.verdict].glyph}</span> {it.label}: worst {worstText(it)} ({it.limit})
                  {it.firstOver ? `; first exceeded at ${whereText(it.firstOver)}` : it.where ? `; worst at ${whereText(it.where)}` : ''}
                </button>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
