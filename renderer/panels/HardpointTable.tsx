/**
 * The hardpoint table: named points, x y z in mm. A mirrored point's left row follows its
 * right (edit either, both move); "unlink" makes the sides independent. Selection is shared
 * with the viewport.
 */
import { Fragment, memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useActions, useDocument, usePose, useStudies, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { linkPoint, setCoordinate, unlinkPoint } from '../model/designActions';
import { issuesOfCell, issuesOfPoint } from '../model/fieldIssues';
import { AXES, hardpointRows, rowName, type HardpointRow } from '../model/hardpoints';
import type { DesignIssue } from '../../core/design/validateDesign';
import { NumberField } from './NumberField';
import { rateText, useSensitivity } from '../studies/useSensitivity';
import { useFixRates } from '../app/fixJobs';
import type { SensitivityData } from '../workers/sensitivityJob';
import { pickedAxes, togglePoint } from '../model/tunePicks';
import type { TunePick } from '../state/studyStore';
import type { DesignFile } from '../../core/design/types';
import { acceptProposal, dismissProposal, previewProposal } from '../studies/ProposalsPanel';
import type { Proposal } from '../../core/studies/geometricSuggestion';
import { fmt } from '../model/format';
import { fixPoints } from '../model/findings';

export function HardpointTable() {
  const design = useDocument((s) => s.design);
  const issues = usePose((s) => s.issues);
  const selection = useUi((s) => s.selection);
  const rows = useMemo(() => hardpointRows(design), [design]);
  // The workbench shares one run of the rates with the fix view (renderer/app/fixJobs.tsx); alone, the table runs its own.
  const shared = useFixRates();
  const own = useSensitivity(design);
  const sensitivity = shared ?? own;
  const [objective, setObjective] = useState('selfSteer');
  // The rate column follows the measure of the finding opened in the fix view.
  const findingObjective = useUi((s) => s.finding?.objective ?? null);
  const [followed, setFollowed] = useState(findingObjective);
  if (followed !== findingObjective) {
    setFollowed(findingObjective);
    const headline = findingObjective?.startsWith('joint.') ? 'jointMargin' : findingObjective;
    if (headline && OBJECTIVE_CHOICES.some((o) => o.id === headline)) setObjective(headline);
  }
  const rates = sensitivity.state.phase === 'done' ? sensitivity.state.data : null;
  // "Strongest first": the points in the order of their largest rate of the chosen measure (as the fix view lists them), the rest after.
  const [strongestFirst, setStrongestFirst] = useState(false);
  const order = useMemo(() => (strongestFirst && rates ? fixPoints(rates, objective, Infinity).map((p) => p.key) : null), [strongestFirst, rates, objective]);
  const shownRows = useMemo(() => {
    if (!order) return rows;
    const rank = (key: string) => (order.includes(key) ? order.indexOf(key) : order.length);
    return [...rows].sort((a, b) => rank(a.key) - rank(b.key));
  }, [rows, order]);
  const picks = useStudies((s) => s.picks);
  const proposalSet = useStudies((s) => s.proposals);
  // Proposals found for this very design, not dismissed, shown under the points they move.
  const proposals = useMemo(
    () => (proposalSet && proposalSet.forDesign === design ? proposalSet.list.filter((p) => p.design !== null && !proposalSet.dismissed.includes(p.id)) : NO_PROPOSALS),
    [proposalSet, design],
  );
  const body = useRef<HTMLTableSectionElement>(null);
  /** Cells whose text is not a number yet: "rowId:axis" -> message. */
  const [typing, setTyping] = useState<Record<string, string>>({});
  const reportTyping = useCallback((cell: string, message: string | null) => {
    setTyping((t) => {
      if ((t[cell] ?? null) === message) return t;
      const next = { ...t };
      if (message === null) delete next[cell];
      else next[cell] = message;
      return next;
    });
  }, []);

  useEffect(() => {
    if (!selection) return;
    const rows = body.current?.querySelectorAll<HTMLElement>('[data-row-id]') ?? [];
    const el = [...rows].find((r) => r.dataset.rowId === selection);
    el?.scrollIntoView?.({ block: 'nearest' });
  }, [selection]);

  return (
    <section className="panel hardpoint-panel" aria-labelledby="hp-title">
      <h2 id="hp-title">Hardpoints</h2>
      <p className="hint">mm, vehicle axes: x forward, y left, z up. A mirrored pair shares one value (y flips sign on the left).</p>
      <SensitivityBar
        state={sensitivity.state}
        stale={sensitivity.stale}
        objective={objective}
        onObjective={setObjective}
        onRun={sensitivity.run}
        onCancel={sensitivity.cancel}
      />
      {rates && (
        <label className="hint sort-toggle">
          <input type="checkbox" checked={strongestFirst} onChange={(e) => setStrongestFirst(e.target.checked)} data-testid="sort-by-rate" /> strongest first (by the rate of the chosen measure)
        </label>
      )}
      <table className="hardpoint-table" data-testid="hardpoint-table">
        <TableHead />
        <tbody ref={body}>
          <TableRows shownRows={shownRows} grouped={!order} issues={issues} typing={typing} selection={selection} rates={rates} objective={objective} proposals={proposals} picks={picks} design={design} onTyping={reportTyping} />
        </tbody>
      </table>
    </section>
  );
}

const OBJECTIVE_CHOICES: { id: string; words: string }[] = [
  { id: 'selfSteer', words: 'self-steer' },
  { id: 'slip', words: 'toe mismatch (slip)' },
  { id: 'ratioChange', words: 'steering-ratio change' },
  { id: 'jointMargin', words: 'least joint margin' },
];

/** Run or cancel the sensitivity, pick the measure the column shows, and say how fresh it is. */
function SensitivityBar(p: {
  state: ReturnType<typeof useSensitivity>['state'];
  stale: boolean;
  objective: string;
  onObjective(id: string): void;
  onRun(): void;
  onCancel(): void;
}) {
  const { state } = p;
  return (
    <div className="sensitivity-bar" data-testid="sensitivity-bar">
      {state.phase === 'running' ? (
        <>
          <progress max={state.total} value={state.done} aria-label="sensitivity progress" />
          <button type="button" onClick={p.onCancel}>
            Cancel
          </button>
        </>
      ) : (
        <button type="button" onClick={p.onRun} data-testid="run-sensitivity" title="How much each measure moves per mm of each hardpoint coordinate, over the operating region (mirrored pairs moving together)">
          {state.phase === 'done' ? 'Rates again' : 'Rates per mm'}
        </button>
      )}
      <label>
        of{' '}
        <select value={p.objective} onChange={(e) => p.onObjective(e.target.value)} data-testid="sensitivity-objective">
          {OBJECTIVE_CHOICES.map((o) => (
            <option key={o.id} value={o.id}>
              {o.words}
            </option>
          ))}
        </select>
      </label>
      {state.phase === 'done' && (
        <span className={`hint ${p.stale ? 'is-stale' : ''}`} data-testid="sensitivity-note">
          {p.stale ? 'from before your last edit: run again' : `${state.data.poses} poses of the operating region, ${(state.data.elapsedMs / 1000).toFixed(1)} s; bold: the axis that matters most`}
        </span>
      )}
      {state.phase === 'failed' && (
        <span className="field-error" role="alert">
          Rates could not be computed: {state.message}
        </span>
      )}
    </div>
  );
}

/** Under a point: its x, y, z rates of the chosen measure per mm (a mirrored pair moving together). */
function RateRow({ rowKey, rates, objective }: { rowKey: string; rates: SensitivityData; objective: string }) {
  const of = rates.rows.filter((r) => r.key === rowKey);
  if (of.length === 0) return null;
  const unit = rates.objectives.find((o) => o.id === objective)?.unit ?? '';
  const best = of.reduce((a, b) => (b.rank < a.rank ? b : a));
  return (
    <tr className="rate-row">
      <td colSpan={6} title={of.map((r) => r.sentence).join('\n')} data-testid={`rate-${rowKey}`}>
        <div>
          <span className="rate-lead">per 1 mm:</span>
          {of.map((r) => (
            <span key={r.axis} className={r === best ? 'rate is-top' : 'rate'}>
              {r.direction} {rateText(r.perMm[objective], unit)}
            </span>
          ))}
        </div>
      </td>
    </tr>
  );
}

/** Under a point a proposal moves: where to, by how much, and the proposal's buttons. */
function ProposalRow(p: { proposal: Proposal; row: HardpointRow; onPreview(): void; onAccept(): void; onDismiss(): void }) {
  const move = p.proposal.moves.find((m) => m.key === p.row.key && m.side === p.row.side)!;
  const d = Math.hypot(move.toMm.x - move.fromMm.x, move.toMm.y - move.fromMm.y, move.toMm.z - move.fromMm.z);
  return (
    <tr className="proposal-row">
      <td colSpan={6} data-testid={`proposal-at-${p.row.id}-${p.proposal.id}`} title={p.proposal.rule}>
        <div>
          <span className="rate-lead">proposal, {p.proposal.title}:</span> to {fmt(move.toMm.x, 1)}, {fmt(move.toMm.y, 1)}, {fmt(move.toMm.z, 1)} ({fmt(d, 1)} mm)
          <button type="button" className="link-button" onClick={p.onPreview}>
            preview
          </button>
          <button type="button" className="link-button" onClick={p.onAccept}>
            accept
          </button>
          <button type="button" className="link-button" onClick={p.onDismiss}>
            dismiss
          </button>
        </div>
      </td>
    </tr>
  );
}

function TableHead() {
  return (
    <thead>
      <tr>
        <th scope="col">Point</th>
        <th scope="col">Side</th>
        <th scope="col">x</th>
        <th scope="col">y</th>
        <th scope="col">z</th>
        <th scope="col">
          <span className="sr-only">Mirror</span>
        </th>
      </tr>
    </thead>
  );
}

/** What is wrong with a row, each message once: text in its cells that is not a number, then the validator's issues. */
function rowMessages(row: HardpointRow, issues: DesignIssue[], typing: Record<string, string>): string[] {
  const rowIssues = [...issuesOfPoint(issues, row.key, row.side), ...AXES.flatMap((a) => issuesOfCell(issues, row.key, row.side, a))];
  const typed = AXES.map((a) => typing[`${row.id}:${a}`]).filter((m) => m !== undefined);
  return [...new Set([...typed, ...rowIssues.map((i) => i.message)])];
}

interface RowProps {
  row: HardpointRow;
  selected: boolean;
  invalidAxes: string[];
  onSelect(): void;
  onEdit(axis: 'x' | 'y' | 'z', value: number): void;
  onUnlink(): void;
  onLink(keep: 'right' | 'left'): void;
  onTyping(cell: string, message: string | null): void;
  /** The tune's "vary" tick: how many of the point's axes are picked; null on a mirrored left row. */
  vary: { picked: number; onToggle(): void } | null;
  /** Name the point's group in its row (no group headings when sorted by rate). */
  withGroup?: boolean;
}

function HardpointTableRow({ row, selected, invalidAxes, onSelect, onEdit, onUnlink, onLink, onTyping, vary, withGroup }: RowProps) {
  const name = rowName(row);
  return (
    <tr
      className={`hp-row ${selected ? 'is-selected' : ''} ${row.side === 'left' && row.linked ? 'is-mirror' : ''}`}
      data-row-id={row.id}
      data-testid={`hp-${row.id}`}
      aria-selected={selected}
      onFocusCapture={onSelect}
      onClick={onSelect}
    >
      <th scope="row" title={name}>
        {row.side !== 'left' ? (withGroup ? `${row.group.toLowerCase()} ${row.label}` : row.label) : ''}
      </th>
      <td className="side-cell">{row.side ?? 'centre'}</td>
      {AXES.map((axis) => (
        <td key={axis}>
          <CellField row={row} axis={axis} name={name} invalid={invalidAxes.includes(axis)} onEdit={onEdit} onTyping={onTyping} />
        </td>
      ))}
      <td className="link-cell">
        {row.side === 'right' &&
          (row.linked ? (
            <button type="button" className="link-toggle is-linked" title={`Mirrored: the left follows the right. Click to unlink the ${row.label}.`} onClick={onUnlink} data-testid={`unlink-${row.key}`}>
              ⇋ mirrored
            </button>
          ) : (
            <button type="button" className="link-toggle" title={`Unlinked. Click to mirror the right ${row.label} onto the left.`} onClick={() => onLink('right')} data-testid={`link-${row.key}`}>
              ↧ mirror
            </button>
          ))}
        {row.side === 'left' && !row.linked && (
          <button type="button" className="link-toggle" title={`Mirror the left ${row.label} onto the right.`} onClick={() => onLink('left')} data-testid={`link-left-${row.key}`}>
            ↥ mirror
          </button>
        )}
        {vary && (
          <label className="vary-toggle" title={`Let the tune move the ${name}${row.linked ? ' (both sides together)' : ''}; set its range in Studies, Tune`}>
            <input
              type="checkbox"
              checked={vary.picked === 3}
              ref={(el) => {
                if (el) el.indeterminate = vary.picked > 0 && vary.picked < 3;
              }}
              onChange={vary.onToggle}
              data-testid={`vary-${row.id}`}
            />{' '}
            vary
          </label>
        )}
      </td>
    </tr>
  );
}

function CellField(p: {
  row: HardpointRow;
  axis: 'x' | 'y' | 'z';
  name: string;
  invalid: boolean;
  onEdit(axis: 'x' | 'y' | 'z', value: number): void;
  onTyping(cell: string, message: string | null): void;
}) {
  const { row, axis, onTyping } = p;
  const report = useCallback((m: string | null) => onTyping(`${row.id}:${axis}`, m), [onTyping, row.id, axis]);
  return (
    <NumberField
      compact
      label={`${p.name} ${axis}`}
      unit="mm"
      value={row.value[axis]}
      invalid={p.invalid}
      onCommit={(v) => p.onEdit(axis, v)}
      onLocalError={report}
      testId={`hp-${row.id}-${axis}`}
    />
  );
}

const NO_PROPOSALS: Proposal[] = [];

interface TableRowsProps {
  shownRows: HardpointRow[];
  /** Group headings shown (not sorted by rate). */
  grouped: boolean;
  issues: DesignIssue[];
  typing: Record<string, string>;
  selection: string | null;
  rates: SensitivityData | null;
  objective: string;
  proposals: Proposal[];
  picks: TunePick[];
  design: DesignFile;
  onTyping: (cell: string, message: string | null) => void;
}

/**
 * The table's rows, rendered only when something they show changes: not at each progress step of
 * the rates (the bar above says it), so hundreds of inputs are not written again for nothing.
 */
const TableRows = memo(function TableRows({ shownRows, grouped, issues, typing, selection, rates, objective, proposals, picks, design, onTyping: reportTyping }: TableRowsProps) {
  const actions = useActions();
  const studies = useWorkbenchApi().studies;
  return (
    <>
      {shownRows.map((row, i) => {
        // A group's first row carries its heading (sorted by rate, each point names its group instead).
        const header = grouped && (i === 0 || row.group !== shownRows[i - 1].group);
        const messages = rowMessages(row, issues, typing);
        return (
          <Fragment key={row.id}>
            {header && (
              <tr className="group-row">
                <th colSpan={6} scope="rowgroup">
                  {row.group}
                </th>
              </tr>
            )}
            <HardpointTableRow
              row={row}
              withGroup={!grouped}
              selected={selection === row.id}
              invalidAxes={AXES.filter((a) => issuesOfCell(issues, row.key, row.side, a).length > 0)}
              onSelect={() => actions.select(row.id)}
              onEdit={(axis, value) => actions.perform(setCoordinate, { rowId: row.id, axis, value })}
              onUnlink={() => actions.perform(unlinkPoint, { key: row.key })}
              onLink={(keep) => actions.perform(linkPoint, { key: row.key, keep })}
              onTyping={reportTyping}
              vary={row.side === 'left' && row.linked ? null : { picked: pickedAxes(picks, row).length, onToggle: () => studies.setState({ picks: togglePoint(studies.getState().picks, row) }) }}
            />
            {rates && row.side !== 'left' && <RateRow rowKey={row.key} rates={rates} objective={objective} />}
            {proposals
              .filter((p) => p.moves.some((m) => m.key === row.key && m.side === row.side))
              .map((p) => (
                <ProposalRow key={p.id} proposal={p} row={row} onPreview={() => previewProposal(studies, p)} onAccept={() => acceptProposal(actions, studies, design, p)} onDismiss={() => dismissProposal(studies, p.id)} />
              ))}
            {messages.length > 0 && (
              <tr className="issue-row">
                <td colSpan={6} role="alert" className="field-error" data-testid={`issue-${row.id}`}>
                  {messages.join(' ')}
                </td>
              </tr>
            )}
          </Fragment>
        );
      })}
    </>
  );
});
