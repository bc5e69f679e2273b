/**
 * The geometric proposals (core/studies/geometricSuggestion.ts): the classic constructions for
 * the inner tie-rod points and the steering-arm joints, each with the points it moves and its
 * effect on the objectives over the operating region, before anything is applied. "Preview"
 * draws it as the reference; "Accept" applies it as one undo step; "Dismiss" hides it. The
 * hardpoint table shows each live proposal under the point it moves.
 */
import type { DesignFile } from '../../core/design/types';
import type { Proposal } from '../../core/studies/geometricSuggestion';
import { useActions, useDocument, useStudies, useWorkbenchApi } from '../app/workbenchContext';
import type { WorkbenchActions } from '../state/workbench';
import type { StudyStore } from '../state/studyStore';
import { adoptResult, previewResult } from './adoptResult';
import { fmt } from '../model/format';
import { useEffect } from 'react';
import { StaleNote, StudyProgress } from './StudyProgress';
import { useStudyJob } from './useStudyJob';

export function ProposalsPanel() {
  const design = useDocument((s) => s.design);
  const set = useStudies((s) => s.proposals);
  const studies = useWorkbenchApi().studies;
  const job = useStudyJob('proposals', design);
  const { state } = job;
  useEffect(() => {
    if (state.phase === 'done') studies.setState({ proposals: { forDesign: state.forDesign, list: state.data, dismissed: [] } });
  }, [state, studies]);
  const stale = set !== null && set.forDesign !== design;
  const shown = set ? set.list.filter((p) => !set.dismissed.includes(p.id)) : [];
  return (
    <div className="study proposals-study" data-testid="proposals-panel">
      <p className="hint">Rules of thumb applied to this design (common practice, no source): each proposal moves a few points; see what it does before you accept it.</p>
      <div className="study-line">
        {state.phase !== 'running' && (
          <button type="button" onClick={() => job.run({ design })} data-testid="run-proposals">
            {set ? 'Find proposals again' : 'Find proposals'}
          </button>
        )}
      </div>
      <StudyProgress state={state} what="proposals" onCancel={job.cancel} />
      <StaleNote stale={stale} />
      {set && shown.length === 0 && <p className="hint">All proposals dismissed.</p>}
      {shown.map((p) => (
        <ProposalCard key={p.id} proposal={p} stale={stale} />
      ))}
    </div>
  );
}

/** Apply a proposal as one undo step; the design before it becomes the reference. */
export function acceptProposal(actions: WorkbenchActions, studies: StudyStore, before: DesignFile, p: Proposal): void {
  if (p.design) adoptResult(actions, studies, before, p.design, `accept the proposal: ${p.title}`, 'before the proposal', { proposals: null });
}

export function dismissProposal(studies: StudyStore, id: string): void {
  const s = studies.getState().proposals;
  if (s) studies.setState({ proposals: { ...s, dismissed: [...s.dismissed, id] } });
}

export function previewProposal(studies: StudyStore, p: Proposal): void {
  if (p.design) previewResult(studies, p.design, `proposal: ${p.title}`);
}

export function ProposalCard({ proposal: p, stale }: { proposal: Proposal; stale: boolean }) {
  const design = useDocument((s) => s.design);
  const studies = useWorkbenchApi().studies;
  const actions = useActions();
  return (
    <article className="proposal" data-testid={`proposal-${p.id}`}>
      <h4>{p.title}</h4>
      <p className="hint">{p.rule}</p>
      {p.design === null ? (
        <p className="hint">Does not apply: {p.reason}</p>
      ) : (
        <>
          <table className="study-table">
            <thead>
              <tr>
                <th scope="col">Point</th>
                <th scope="col">From, mm</th>
                <th scope="col">To, mm</th>
                <th scope="col">Moves</th>
              </tr>
            </thead>
            <tbody>
              {p.moves.map((m) => (
                <tr key={`${m.key}.${m.side}`}>
                  <td>{m.point}</td>
                  <td>{xyz(m.fromMm)}</td>
                  <td>{xyz(m.toMm)}</td>
                  <td>{fmt(Math.hypot(m.toMm.x - m.fromMm.x, m.toMm.y - m.fromMm.y, m.toMm.z - m.fromMm.z), 1)} mm</td>
                </tr>
              ))}
            </tbody>
          </table>
          {p.effect && (
            <table className="study-table" data-testid={`proposal-effect-${p.id}`}>
              <thead>
                <tr>
                  <th scope="col">Over the region</th>
                  <th scope="col">Now</th>
                  <th scope="col">With it</th>
                  <th scope="col">Limit</th>
                </tr>
              </thead>
              <tbody>
                {p.effect.map((e) => (
                  <tr key={e.id}>
                    <th scope="row">{e.label}</th>
                    <td>
                      {fmt(e.before, 3)} {e.unit}
                    </td>
                    <td>
                      {e.after === null ? 'does not assemble' : `${fmt(e.after, 3)} ${e.unit}`}
                    </td>
                    <td>{e.tolerance === null ? '—' : `${e.kind === 'least' ? '≥' : '≤'} ${fmt(e.tolerance, 2)} ${e.unit}`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <div className="study-line">
            <button type="button" disabled={stale} onClick={() => previewProposal(studies, p)}>
              Preview
            </button>
            <button
              type="button"
              disabled={stale}
              data-testid={`accept-${p.id}`}
              onClick={() => acceptProposal(actions, studies, design, p)}
            >
              Accept (one undo step)
            </button>
            <button type="button" onClick={() => dismissProposal(studies, p.id)}>
              Dismiss
            </button>
          </div>
        </>
      )}
    </article>
  );
}

function xyz(p: { x: number; y: number; z: number }): string {
  return `${fmt(p.x, 1)}, ${fmt(p.y, 1)}, ${fmt(p.z, 1)}`;
}
