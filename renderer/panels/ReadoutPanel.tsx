/** Every measure of the current pose, per wheel and overall, with units and condition words. */
import { useActions, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { useThrottledSlice } from '../app/useThrottled';
import type { Alert, ReadoutRow, ReadoutTable } from '../model/analysisAdapter';
import { fmt } from '../model/format';
import { RIDE_TABLE_ID } from '../model/rideReadout';
import { SEVERITY_STYLE, type Severity } from '../model/severity';
import { FixSlot, openFinding, poseFindingId } from './FixPanel';

/** While the pose moves continuously, the readings repaint at most this often, ms. */
export const READOUT_INTERVAL_MS = 100;
/** During playback, slower still: numbers changing faster cannot be read anyway, ms. */
export const PLAYING_READOUT_INTERVAL_MS = 250;

function useReadoutInterval(): number {
  return useUi((s) => s.playback.playing) ? PLAYING_READOUT_INTERVAL_MS : READOUT_INTERVAL_MS;
}


function Sev({ s }: { s: Severity | undefined }) {
  if (!s || s === 'none' || s === 'within') return null;
  const st = SEVERITY_STYLE[s];
  return (
    <span className={`sev sev-${s}`} title={`${st.word}: ${st.meaning}`} style={{ color: st.colour }}>
      {st.glyph}
      <span className="sr-only"> {st.word}</span>
    </span>
  );
}

const OPEN_TABLES = new Set([RIDE_TABLE_ID, 'wheel', 'joints', 'overall']);

function cellTestId(table: ReadoutTable, r: ReadoutRow, i: number): string {
  return table.columns.length === 1 ? `readout-${r.id}` : `readout-${r.id}-${table.columns[i].toLowerCase()}`;
}

function Table({ table }: { table: ReadoutTable }) {
  const single = table.columns.length === 1;
  return (
    <details className="readout-group" open={OPEN_TABLES.has(table.id)}>
      <summary>{table.title}</summary>
      <table className="readout-table">
        {!single && (
          <thead>
            <tr>
              <th scope="col">
                <span className="sr-only">Measure</span>
              </th>
              {table.columns.map((col) => (
                <th key={col} scope="col">
                  {col}
                </th>
              ))}
              <th scope="col">Unit</th>
            </tr>
          </thead>
        )}
        <tbody>
          {table.rows.map((r) => {
            const missing = r.missing !== undefined && r.cells.every((c) => c.value === null);
            return (
              <tr key={r.id} title={r.hint}>
                <th scope="row">{r.label}</th>
                {missing ? (
                  <td colSpan={table.columns.length + 1} className="missing" data-testid={cellTestId(table, r, 0)}>
                    {r.missing}
                  </td>
                ) : (
                  <>
                    {r.cells.map((c, i) => (
                      <td key={i} data-testid={cellTestId(table, r, i)} className={c.severity ? `sev-cell sev-${c.severity}` : undefined}>
                        {r.digits > 6 && c.value !== null ? c.value.toExponential(1) : fmt(c.value, r.digits)} <Sev s={c.severity} />
                      </td>
                    ))}
                    <td className="unit">{r.id === 'solveMs' ? 'ms' : r.unit}</td>
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </details>
  );
}

export function ReadoutPanel() {
  const outcome = useThrottledSlice(useWorkbenchApi().pose, (s) => s.outcome, useReadoutInterval());
  const reached = outcome.shown === 'requested';
  return (
    <section className="panel readout-panel" aria-labelledby="readout-title" data-testid="readouts">
      <h2 id="readout-title">Readings</h2>
      {!reached && <p className="hint">No readings: this pose was not reached.</p>}
      {outcome.tables.map((t) => (
        <Table key={t.id} table={t} />
      ))}
    </section>
  );
}

/** Groups of alerts, worst first. */
const ALERT_GROUPS: { severity: Severity; title: string }[] = [
  { severity: 'broken', title: "Won't assemble or invalid" },
  { severity: 'over', title: 'Over a limit' },
  { severity: 'close', title: 'Close to a limit' },
];

/**
 * The pose's verdict and its alerts, at the top of the left column: grouped by severity, worst
 * first; an alert about a part selects one of its joints (the view rings it, the table shows it).
 */
export function AlertsPanel() {
  const outcome = useThrottledSlice(useWorkbenchApi().pose, (s) => s.outcome, useReadoutInterval());
  const issues = usePose((s) => s.issues);
  const actions = useActions();
  const selection = useUi((s) => s.selection);
  const openId = useUi((s) => s.finding?.id ?? null);
  const { ui } = useWorkbenchApi();
  const alerts: Alert[] = [...issues.map((i): Alert => ({ severity: 'broken', text: i.message })), ...outcome.alerts];
  const ps = outcome.poseStatus;
  return (
    <section className="panel alerts-panel" aria-labelledby="alerts-title" data-testid="alerts">
      <h2 id="alerts-title">
        This pose <span className="count">{alerts.length === 0 ? 'no alerts' : `${alerts.length} alert${alerts.length === 1 ? '' : 's'}`}</span>
      </h2>
      {ps && (
        <p className={`pose-status sev-${ps}`} data-testid="pose-status" style={{ borderColor: SEVERITY_STYLE[ps].colour }}>
          <span style={{ color: SEVERITY_STYLE[ps].colour }}>{SEVERITY_STYLE[ps].glyph}</span> This pose: {SEVERITY_STYLE[ps].pose}
        </p>
      )}
      {alerts.length === 0 && <p className="hint">Nothing outside tolerance or near it in this pose.</p>}
      {ALERT_GROUPS.map((g) => {
        const of = alerts.filter((a) => a.severity === g.severity);
        if (of.length === 0) return null;
        return (
          <div key={g.severity} className="alert-group" data-testid={`alerts-${g.severity}`}>
            <h3>
              <span style={{ color: SEVERITY_STYLE[g.severity].colour }}>{SEVERITY_STYLE[g.severity].glyph}</span> {g.title} ({of.length})
            </h3>
            <ul>
              {of.map((a, k) => {
                const id = poseFindingId(a);
                const open = openId === id;
                return (
                  <li key={k} className={`alert sev-${a.severity} ${a.hardpoint && a.hardpoint === selection ? 'is-selected' : ''} ${open ? 'is-open' : ''}`}>
                    {a.hardpoint || a.objective ? (
                      <button
                        type="button"
                        className="alert-button"
                        aria-expanded={open}
                        onClick={() => openFinding(ui, actions, { id, source: 'pose', severity: a.severity, text: a.text, hardpoint: a.hardpoint ?? null, objective: a.objective ?? null, where: null })}
                        title="Show the part in the view and how to fix it"
                      >
                        {a.text}
                      </button>
                    ) : (
                      a.text
                    )}
                    <FixSlot id={id} />
                  </li>
                );
              })}
            </ul>
          </div>
        );
      })}
    </section>
  );
}
