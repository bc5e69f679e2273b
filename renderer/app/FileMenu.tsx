/** File commands: New, Open, Save, Save as, Recent, and the exchange commands (hardpoint CSV, 3D export, the workshop report). */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { RecentEntry } from '../files/fileService';
import { pageExchangeFiles, type ExchangeFiles } from '../files/exchangeFiles';
import { exportHardpointTable, exportPoseGlb, exportSweepGlb, readHardpointTable } from '../export/exchangeCommands';
import { exportReport, printReport, type ReportRunner } from '../export/reportCommands';
import { SweepClient } from '../workers/sweepClient';
import type { ImportPlan } from '../export/hardpointImport';
import { HardpointImportDialog } from './HardpointImportDialog';
import { useFlow } from './flowContext';
import { useWorkbenchApi } from './workbenchContext';

/**
 * `exchange`: where tables are read from and exports offered (the page's file input and downloads unless given);
 * `reports`: what makes the workshop report (a sweep client of its own unless given).
 */
export function FileMenu({ exchange, reports }: { exchange?: ExchangeFiles; reports?: ReportRunner } = {}) {
  const flow = useFlow();
  const wb = useWorkbenchApi();
  const { ui } = wb;
  const [recent, setRecent] = useState<RecentEntry[] | null>(null);
  const [exchangeOpen, setExchangeOpen] = useState(false);
  const [plan, setPlan] = useState<ImportPlan | null>(null);
  const files = useMemo(() => exchange ?? pageExchangeFiles(), [exchange]);
  const ownReports = useRef<SweepClient | null>(null);
  useEffect(() => () => ownReports.current?.dispose(), []);
  const reportRunner = (): ReportRunner => reports ?? (ownReports.current ??= new SweepClient());
  const run = (command: () => unknown) => {
    setExchangeOpen(false);
    void command();
  };
  const exchangeItems: [string, string, string, () => unknown][] = [
    ['Export hardpoints (CSV)…', 'The hardpoint table: point, side, x, y, z in mm', 'file-export-hardpoints', () => exportHardpointTable(wb, files)],
    ['Import hardpoints (CSV)…', 'Read a hardpoint table; shows what moves before applying', 'file-import-hardpoints', async () => setPlan(await readHardpointTable(wb, files))],
    ['Export 3D at this pose (.glb)', 'The mechanism at the pose on screen, glTF 2.0 binary, metres', 'file-export-pose-glb', () => exportPoseGlb(wb, files)],
    ['Export lean sweep animation (.glb)', 'A sweep of lean across the envelope (handlebar if the vehicle does not lean), animated', 'file-export-sweep-glb', () => exportSweepGlb(wb, files)],
    ['Workshop report (HTML)…', 'One document for the workshop: hardpoints, alignment, drawings, curves, limits, turning circles (as tiltbench report)', 'file-export-report', () => exportReport(wb, files, reportRunner())],
    ['Print workshop report…', 'The same report as PDF (in the desktop app) or through the print dialog (Save as PDF there)', 'file-print-report', () => printReport(wb, reportRunner())],
  ];

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey)) return;
      const k = e.key.toLowerCase();
      if (k === 's') {
        e.preventDefault();
        void flow.save(e.shiftKey);
      } else if (k === 'o') {
        e.preventDefault();
        void flow.open();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [flow]);

  const showRecent = async () => {
    if (recent) {
      setRecent(null);
      return;
    }
    setRecent(await flow.files.recent().catch(() => []));
  };

  return (
    <nav className="file-menu" aria-label="File">
      <button type="button" onClick={() => ui.setState({ newDialogOpen: true })} data-testid="file-new">
        New
      </button>
      <button type="button" onClick={() => void flow.open()} title="Open a design (Ctrl+O)" data-testid="file-open">
        Open…
      </button>
      <button type="button" onClick={() => void flow.save(false)} title="Save (Ctrl+S)" data-testid="file-save">
        Save
      </button>
      <button type="button" onClick={() => void flow.save(true)} title="Save under a new name (Ctrl+Shift+S)" data-testid="file-save-as">
        Save as…
      </button>
      <span className="recent-wrap">
        <button type="button" aria-expanded={recent !== null} onClick={() => void showRecent()} data-testid="file-recent">
          Recent ▾
        </button>
        {recent && (
          <ul className="recent-list" role="menu">
            {recent.length === 0 && <li className="hint">No recent designs yet.</li>}
            {recent.map((r) => (
              <li key={r.id} role="none">
                <button
                  type="button"
                  role="menuitem"
                  title={r.id}
                  onClick={() => {
                    setRecent(null);
                    void flow.openRecent(r);
                  }}
                >
                  {r.label}
                </button>
              </li>
            ))}
          </ul>
        )}
      </span>
      <span className="recent-wrap">
        <button type="button" aria-expanded={exchangeOpen} onClick={() => setExchangeOpen(!exchangeOpen)} data-testid="file-exchange">
          Import/Export ▾
        </button>
        {exchangeOpen && (
          <ul className="recent-list" role="menu">
            {exchangeItems.map(([label, title, testId, command]) => (
              <li key={testId} role="none">
                <button type="button" role="menuitem" title={title} data-testid={testId} onClick={() => run(command)}>
                  {label}
                </button>
              </li>
            ))}
          </ul>
        )}
      </span>
      {plan && <HardpointImportDialog plan={plan} onClose={() => setPlan(null)} />}
    </nav>
  );
}
