/**
 * The workshop report from the workbench: the same HTML document `tiltbench report` writes
 * (core/report), made in the sweep worker for the design on screen, then offered as a file or
 * printed: to PDF by Electron's own printToPDF in the shell, through the browser's print dialog
 * in a plain browser.
 */
import type { Workbench } from '../state/workbench';
import { exportName, type ExchangeFiles } from '../files/exchangeFiles';
import type { SweepClient } from '../workers/sweepClient';
import { CancelledError } from '../workers/sweepClient';

/** What runs the report job (the workbench's own sweep client for reports). */
export type ReportRunner = Pick<SweepClient, 'job'>;

/** SHA-256 of a text's UTF-8 bytes, hex (Web Crypto). */
export async function sha256Hex(text: string): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/** The report of the design on screen; null (said in a notice) when it cannot be made. */
export async function makeReport(wb: Workbench, runner: ReportRunner, now: () => Date = () => new Date()): Promise<string | null> {
  if (!wb.pose.getState().resolved) {
    wb.actions.showNotice({ kind: 'error', title: 'Could not make the report', lines: ['The design has errors, so nothing can be analysed. Fix the marked fields first.'] });
    return null;
  }
  const d = wb.document.getState();
  const fileName = d.dirty || d.doc.savedText === null ? `${d.doc.fileName} (as the workbench would save it now)` : d.doc.fileName;
  wb.actions.showNotice({ kind: 'info', title: 'Making the workshop report…', lines: ['The check over the whole envelope runs first: about 5 to 15 s.'] });
  try {
    const html = await runner.job('report', { design: d.design, fileName, sha256: await sha256Hex(d.designText), madeAt: now().toISOString().replace(/\.\d{3}Z$/, 'Z') });
    wb.actions.showNotice(null);
    return html;
  } catch (e) {
    if (e instanceof CancelledError) wb.actions.showNotice(null);
    else wb.actions.showNotice({ kind: 'error', title: 'Could not make the report', lines: [e instanceof Error ? e.message : String(e)] });
    return null;
  }
}

/** Offers the report as an HTML file named after the design. */
export async function exportReport(wb: Workbench, files: ExchangeFiles, runner: ReportRunner): Promise<void> {
  const html = await makeReport(wb, runner);
  if (html !== null) files.offer(html, exportName(wb.document.getState().doc.fileName, '.report.html'), 'text/html');
}

/**
 * Prints an HTML document through the print dialog: it is loaded into a hidden frame of this
 * page (new windows are refused in the Electron shell) and that frame prints itself. The frame
 * is removed after the dialog (a minute later at most).
 */
export function printHtml(html: string, doc: Document = document): HTMLIFrameElement {
  const frame = doc.createElement('iframe');
  frame.title = 'Workshop report (printing)';
  frame.dataset.testid = 'report-print-frame';
  frame.setAttribute('aria-hidden', 'true');
  Object.assign(frame.style, { position: 'fixed', right: '0', bottom: '0', width: '0', height: '0', border: '0', visibility: 'hidden' });
  const remove = () => frame.remove();
  frame.addEventListener('load', () => {
    const w = frame.contentWindow;
    if (!w) return remove();
    w.addEventListener('afterprint', () => setTimeout(remove, 0));
    setTimeout(remove, 60_000);
    w.focus();
    w.print();
  });
  frame.srcdoc = html;
  doc.body.appendChild(frame);
  return frame;
}

/** What the Electron shell offers for the report (window.tiltbench); absent in a plain browser. */
export type ShellPdf = { saveReportPdf(html: string, suggestedName?: string): Promise<string | null> } | undefined;

/**
 * Makes the report, then: in the Electron shell, Chromium's own print to PDF in main (a save
 * dialog, then the PDF written atomically); in a plain browser, the print dialog (Save as PDF
 * there).
 */
export async function printReport(wb: Workbench, runner: ReportRunner, doc: Document = document, shell: ShellPdf = typeof window === 'undefined' ? undefined : window.tiltbench): Promise<void> {
  const html = await makeReport(wb, runner);
  if (html === null) return;
  if (!shell) {
    printHtml(html, doc);
    return;
  }
  try {
    const written = await shell.saveReportPdf(html, exportName(wb.document.getState().doc.fileName, '.report.pdf'));
    if (written !== null) wb.actions.showNotice({ kind: 'info', title: 'Workshop report saved', lines: [`Written to ${written}.`] });
  } catch (e) {
    wb.actions.showNotice({ kind: 'error', title: 'Could not save the report as PDF', lines: [e instanceof Error ? e.message : String(e), 'Nothing was written.'] });
  }
}
