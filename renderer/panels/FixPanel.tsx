/**
 * A finding opened into its fix, right under it: the hardpoints whose coordinates move the
 * finding's measure most per mm (the rates of core's sensitivity, run by itself after an edit),
 * which way to move each to improve it, their coordinates to edit there (each edit one undo
 * step), and the proposals that say what they do to that measure, with preview and accept.
 */
import { useEffect, useMemo, useRef } from 'react';
import type { CheckWhere } from '../../core/analysis/designCheck';
import { oppositeDirection } from '../../core/studies/studyCoordinates';
import { useActions, useDocument, usePose, useStudies, useUi, useWorkbenchApi } from '../app/workbenchContext';
import type { Alert } from '../model/analysisAdapter';
import { useFixJobs } from '../app/fixJobs';
import { setCoordinate } from '../model/designActions';
import { fixPoints, proposalsFor, usableObjective, type OpenFinding } from '../model/findings';
import { fmt } from '../model/format';
import { AXES, hardpointRows, rowName, type HardpointRow } from '../model/hardpoints';
import { SEVERITY_STYLE } from '../model/severity';
import type { UiStore } from '../state/uiStore';
import type { WorkbenchActions } from '../state/workbench';
import { acceptProposal, dismissProposal, previewProposal } from '../studies/ProposalsPanel';
import { StudyProgress } from '../studies/StudyProgress';
import { rateText } from '../studies/useSensitivity';
import { useStudyJob } from '../studies/useStudyJob';
import { NumberField } from './NumberField';

/**
 * A check pose in words. On a design with a lean linkage the check's travel is the spring's
 * (compression +; core's travelAxisOf), not the wheels', and is named so.
 */
export const whereText = (w: CheckWhere, design?: { leanLinkage?: unknown }) =>
  `lean ${fmt(w.leanDeg, 1)}°, handlebar ${fmt(w.handlebarDeg, 1)}°${w.travelMm !== 0 ? `, ${design?.leanLinkage ? 'spring travel' : 'travel'} ${fmt(w.travelMm, 0)} mm` : ''}`;

/**
 * Open a finding: it becomes the fix view's, its part is selected (the view rings it, the
 * tables show it), and a region finding takes the pose to where it is first exceeded. Opening
 * the open one again closes it.
 */
export function openFinding(ui: UiStore, actions: WorkbenchActions, f: OpenFinding): void {
  if (ui.getState().finding?.id === f.id) {
    ui.setState({ finding: null });
    return;
  }
  ui.setState({ finding: f, fixColumn: 'findings' });
  if (f.source === 'region' && f.where) {
    actions.setRide({ on: false });
    actions.setContact('ground');
    actions.setPose({ leanDeg: f.where.leanDeg, handlebarDeg: f.where.handlebarDeg, heaveMm: -f.where.travelMm });
  }
  if (f.hardpoint) actions.select(f.hardpoint);
}

/** The fix under the finding `id`, when that finding is the open one. */
export function FixSlot({ id }: { id: string }) {
  const open = useUi((s) => (s.finding?.id === id ? s.finding : null));
  return open ? <FixView finding={open} /> : null;
}

/**
 * The open finding's fix when its finding is no longer listed (an edit fixed it, the pose moved
 * on, or the check is running again): shown above the lists, so the fix never vanishes under
 * the hand that is using it.
 */
export function OrphanFix() {
  const finding = useUi((s) => s.finding);
  const alerts = usePose((s) => s.outcome.alerts);
  const shared = useFixJobs();
  if (!finding) return null;
  const listed =
    finding.source === 'pose'
      ? alerts.some((a) => poseFindingId(a) === finding.id)
      : (shared?.lastCheck?.data.items ?? []).some((it) => it.verdict !== 'within' && `region:${it.id}` === finding.id);
  if (listed) return null;
  return (
    <section className="panel orphan-fix" data-testid="orphan-fix">
      <p className="hint">{finding.source === 'pose' ? 'Not reported in this pose now' : 'Not listed by the last check of the operating region'}:</p>
      <FixView finding={finding} />
    </section>
  );
}

/** An alert's finding id, kept while the pose moves: its words without their numbers, with what it is about. */
export function poseFindingId(a: Alert): string {
  return `pose:${a.hardpoint ?? ''}:${a.text.replace(/[−+-]?\d+(\.\d+)?/g, '#')}`;
}

/** The hardpoint-table row a sensitivity key is edited through: the right (or centre) row; a mirrored pair moves together. */
function editRow(rows: HardpointRow[], key: string): HardpointRow | undefined {
  return rows.find((r) => r.key === key && r.side !== 'left');
}

export function FixView({ finding }: { finding: OpenFinding }) {
  const design = useDocument((s) => s.design);
  const actions = useActions();
  const { ui } = useWorkbenchApi();
  const shared = useFixJobs();
  const rows = useMemo(() => hardpointRows(design), [design]);
  const rates = shared?.rates;
  const data = rates && rates.state.phase === 'done' ? rates.state.data : null;
  const known = data ? data.objectives.map((o) => o.id) : [];
  const objective = data ? usableObjective(finding.objective, known) : finding.objective;
  const objectiveInfo = data?.objectives.find((o) => o.id === objective);
  const points = data && objective ? fixPoints(data, objective) : [];
  const sev = SEVERITY_STYLE[finding.severity];
  // Opened, the finding and its fix come to the top of the column (the pose it moves to may have lengthened the lists above it).
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const t = setTimeout(() => (box.current?.parentElement ?? box.current)?.scrollIntoView?.({ block: 'start' }), 120);
    return () => clearTimeout(t);
  }, [finding.id]);

  return (
    <div className="fix" ref={box} data-testid="fix" aria-label={`Fix: ${finding.text}`}>
      <div className="fix-head">
        <span className="fix-title">
          <span style={{ color: sev.colour }}>{sev.glyph}</span> Fix: {finding.text}
        </span>
        <button type="button" className="link-button" onClick={() => ui.setState({ finding: null })} data-testid="fix-close">
          close
        </button>
      </div>
      {finding.where && <p className="hint">First exceeded at {whereText(finding.where, design)} (the pose on screen now).</p>}
      {finding.objective === null ? (
        <NoRate finding={finding} rows={rows} actions={actions} />
      ) : (
        <>
          <h4>
            Hardpoints that move it most{objectiveInfo ? ` (${objectiveInfo.label})` : ''}
            {rates?.stale && <span className="hint is-stale"> (rates from before your last edit)</span>}
          </h4>
          {rates && <StudyProgress state={rates.state} what="rates" onCancel={rates.cancel} />}
          {!rates && <p className="hint">Rates per mm are in All hardpoints.</p>}
          {rates && rates.state.phase !== 'running' && !data && (
            <button type="button" onClick={rates.run} data-testid="fix-run-rates">
              Work out the rates per mm
            </button>
          )}
          {data && points.length === 0 && <p className="hint">No hardpoint coordinate moves this measure over the operating region (or the rates could not be measured for it).</p>}
          {points.length > 0 && (
            <table className="fix-table" data-testid="fix-points">
              <tbody>
                {points.map((pt) => {
                  const row = editRow(rows, pt.key);
                  if (!row) return null;
                  const unit = objectiveInfo?.unit ?? '';
                  const better = pt.best.improveSign > 0 ? pt.best.direction : oppositeDirection(pt.best.direction);
                  // Moving the better way lowers a worst |value| or raises a least margin, by the rate's size.
                  const change = pt.best.perMm;
                  return (
                    <tr key={pt.key} className="fix-point" data-testid={`fix-point-${row.id}`} onClick={() => actions.select(row.id)}>
                      <th scope="row">
                        <span className="fix-name">{row.linked ? `${row.group.toLowerCase()} ${row.label} (both sides)` : rowName(row)}</span>
                        <span className="fix-move">
                          1 mm {better} improves it by <strong>{rateText(Math.abs(change), unit).replace(/^\+/, '')}</strong>
                          <span className="hint fix-rates"> per mm {pt.rates.map((r) => `${r.direction} ${rateText(r.perMm, '').trim()}`).join(', ')}</span>
                        </span>
                      </th>
                      {AXES.map((axis) => (
                        <td key={axis}>
                          <NumberField
                            compact
                            label={`${rowName(row)} ${axis}`}
                            unit="mm"
                            value={row.value[axis]}
                            onCommit={(v) => actions.perform(setCoordinate, { rowId: row.id, axis, value: v })}
                            testId={`fix-${row.id}-${axis}`}
                          />
                        </td>
                      ))}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          )}
          {objective && <FixProposals objective={objective} />}
        </>
      )}
    </div>
  );
}

/** A finding the rate study has no measure for (a clearance, dead centre, a pose that cannot be assembled): its part's point to edit. */
function NoRate({ finding, rows, actions }: { finding: OpenFinding; rows: HardpointRow[]; actions: WorkbenchActions }) {
  const row = finding.hardpoint ? rows.find((r) => r.id === finding.hardpoint) : undefined;
  return (
    <>
      <p className="hint">The rates per mm cover self-steer, slip, steering-ratio change and joint margins, not this one; move the part shown{row ? '' : ' (see All hardpoints)'}.</p>
      {row && (
        <table className="fix-table" data-testid="fix-points">
          <tbody>
            <tr className="fix-point" data-testid={`fix-point-${row.id}`}>
              <th scope="row">
                <span className="fix-name">{rowName(row)}</span>
              </th>
              {AXES.map((axis) => (
                <td key={axis}>
                  <NumberField compact label={`${rowName(row)} ${axis}`} unit="mm" value={row.value[axis]} onCommit={(v) => actions.perform(setCoordinate, { rowId: row.id, axis, value: v })} testId={`fix-${row.id}-${axis}`} />
                </td>
              ))}
            </tr>
          </tbody>
        </table>
      )}
    </>
  );
}

/** The proposals that say what they do to the objective, improving ones first; found by themselves while the fix is open. */
function FixProposals({ objective }: { objective: string }) {
  const design = useDocument((s) => s.design);
  const set = useStudies((s) => s.proposals);
  const studies = useWorkbenchApi().studies;
  const actions = useActions();
  const job = useStudyJob('proposals', design);
  const { state } = job;
  useEffect(() => {
    if (state.phase === 'done') studies.setState({ proposals: { forDesign: state.forDesign, list: state.data, dismissed: [] } });
  }, [state, studies]);
  const live = set && set.forDesign === design ? set.list.filter((p) => !set.dismissed.includes(p.id)) : null;
  const list = live ? proposalsFor(live, objective) : [];
  // While a fix is open, its proposals are found by themselves (about 1-2 s in the worker), again after each edit once typing pauses.
  const { run } = job;
  const need = live === null && state.phase !== 'running' && state.phase !== 'failed' && !(state.phase === 'done' && state.forDesign === design);
  useEffect(() => {
    if (!need) return;
    const t = setTimeout(() => run({ design }), 600);
    return () => clearTimeout(t);
  }, [need, run, design]);
  return (
    <div className="fix-proposals" data-testid="fix-proposals">
      <h4>Proposals</h4>
      {live === null && state.phase !== 'running' && (
        <button type="button" onClick={() => job.run({ design })} data-testid="fix-find-proposals" title="The classic constructions applied to this design, each with its effect over the operating region">
          Find proposals for this design
        </button>
      )}
      <StudyProgress state={state} what="proposals" onCancel={job.cancel} />
      {live !== null && list.length === 0 && <p className="hint">No proposal changes this measure.</p>}
      {list.map(({ proposal: p, before, after, unit, improves }) => (
        <div key={p.id} className={`fix-proposal ${improves ? 'is-better' : 'is-worse'}`} data-testid={`fix-proposal-${p.id}`} title={p.rule}>
          <span>
            <strong>{p.title}</strong>: {fmt(before, 3)} → {after === null ? 'does not assemble' : `${fmt(after, 3)} ${unit}`} ({improves ? 'better' : 'worse'}); moves {p.moves.map((m) => m.point).join(', ')}
          </span>
          <span className="fix-proposal-buttons">
            <button type="button" className="link-button" onClick={() => previewProposal(studies, p)}>
              preview
            </button>
            <button type="button" className="link-button" onClick={() => acceptProposal(actions, studies, design, p)} data-testid={`fix-accept-${p.id}`}>
              accept (one undo step)
            </button>
            <button type="button" className="link-button" onClick={() => dismissProposal(studies, p.id)}>
              dismiss
            </button>
          </span>
        </div>
      ))}
    </div>
  );
}
