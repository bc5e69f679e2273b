/**
 * Limits over the operating region: core's check of the design (on a coarser grid than the
 * CLI's, in the worker), the items over or close to their limits, worst first, each with its worst
 * value and where it is first exceeded; clicking one goes to that pose, selects the part and
 * opens its fix under it. In the workbench the check runs by itself after each edit.
 */
import type { CheckItem } from '../../core/analysis/designCheck';
import { useActions, useDocument, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { useFixJobs } from '../app/fixJobs';
import { regionFinding, worstFirst } from '../model/findings';
import { FixSlot, openFinding, whereText } from './FixPanel';
import { subjectHardpoint } from '../model/readoutTables';
import { SEVERITY_STYLE } from '../model/severity';
import { fmt } from '../model/format';
import { StaleNote, StudyProgress } from '../studies/StudyProgress';
import { useStudyJob } from '../studies/useStudyJob';

function worstText(it: CheckItem): string {
  if (it.worst === null) return '—';
  return it.unit === 'poses' ? String(it.worst) : `${fmt(it.worst, it.unit === 'mm' ? 1 : 2)} ${it.unit}`;
}

export function LimitsPanel() {
  const design = useDocument((s) => s.design);
  const drawing = usePose((s) => s.drawing);
  const actions = useActions();
  const { ui } = useWorkbenchApi();
  const openId = useUi((s) => s.finding?.id ?? null);
  const shared = useFixJobs();
  const own = useStudyJob('check', design);
  // Inside the workbench the check runs by itself after an edit (renderer/app/fixJobs.tsx); alone, on request.
  const job = shared?.check ?? own;
  // While the check runs again after an edit, the last result stays listed (marked as from before the edit).
  const data = job.state.phase === 'done' ? job.state.data : (shared?.lastCheck?.data ?? null);
  const stale = job.stale || (job.state.phase !== 'done' && data !== null);
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
        {job.state.phase !== 'running' && (
          <button type="button" className="link-button run-again" onClick={() => job.run({ design })} data-testid="run-limits" title="Every tolerance, joint and clearance over the poses where the vehicle is ridden, as tiltbench check does">
            {data ? 'check again' : 'Check every limit'}
          </button>
        )}
      </h2>
      {job.state.phase === 'running' && <p className="hint">{data ? 'Checking again after your edit…' : 'Checking every limit over the operating region…'}</p>}
      <StudyProgress state={job.state} what="check" onCancel={job.cancel} />
      {job.state.phase !== 'running' && <StaleNote stale={stale} />}
      {data && (
        <>
          <p className="hint">
            {data.poses} poses ({data.steps.leanDeg}° and {data.steps.travelMm} mm apart; the command-line check uses 1°), {(data.elapsedMs / 1000).toFixed(1)} s. {shown.length === 0 ? 'Everything within its limit.' : 'Click an item to go where it is first exceeded and see how to fix it.'}
          </p>
          <ul className="limits-list">
            {worstFirst(shown.map((it) => ({ it, severity: it.verdict, source: 'region' as const }))).map(({ it }) => {
              const hp = drawing && it.subject ? subjectHardpoint(drawing, it.subject) : null;
              const finding = regionFinding(it, hp);
              const open = finding !== null && openId === finding.id;
              return (
                <li key={it.id} className={`alert sev-${it.verdict} ${open ? 'is-open' : ''}`} data-testid={`limit-${it.id}`}>
                  <button type="button" className="alert-button" aria-expanded={open} onClick={() => finding && openFinding(ui, actions, finding)}>
                    <span style={{ color: SEVERITY_STYLE[it.verdict].colour }}>{SEVERITY_STYLE[it.verdict].glyph}</span> {it.label}: worst {worstText(it)} ({it.limit})
                    {it.firstOver ? `; first exceeded at ${whereText(it.firstOver, design)}` : it.where ? `; worst at ${whereText(it.where, design)}` : ''}
                  </button>
                  {finding && <FixSlot id={finding.id} />}
                </li>
              );
            })}
          </ul>
        </>
      )}
    </section>
  );
}
