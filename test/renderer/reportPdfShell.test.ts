// In the Electron shell the workbench's "Print workshop report" hands the report to main's
// printToPDF (window.tiltbench.saveReportPdf) instead of the print dialog; a failure is said in a
// notice and nothing else happens. The report itself is the worker's (checked in reportCommand).
import { describe, expect, it, vi } from 'vitest';
import { printReport, type ReportRunner } from '../../renderer/export/reportCommands';
import { demoWorkbench } from './helpers';

const HTML = '<!DOCTYPE html><html><body>report</body></html>';
const runner = { job: async () => HTML } as unknown as ReportRunner;

describe('report to PDF in the shell', () => {
  it('gives the report and a PDF name to the shell, and says where it was written', async () => {
    const wb = demoWorkbench('wren-rack-trike');
    const saveReportPdf = vi.fn(async () => '/home/me/wren.report.pdf');
    await printReport(wb, runner, document, { saveReportPdf });
    expect(saveReportPdf).toHaveBeenCalledWith(HTML, 'wren-rack-trike.report.pdf');
    expect(wb.ui.getState().notice?.lines.join(' ')).toContain('/home/me/wren.report.pdf');
    expect(document.querySelector('[data-testid=report-print-frame]')).toBeNull();
  });

  it('says so when the shell fails, and a cancelled dialog says nothing', async () => {
    const wb = demoWorkbench('wren-rack-trike');
    await printReport(wb, runner, document, { saveReportPdf: async () => Promise.reject(new Error('disk full')) });
    expect(wb.ui.getState().notice?.kind).toBe('error');
    expect(wb.ui.getState().notice?.lines[0]).toBe('disk full');
    const quiet = demoWorkbench('wren-rack-trike');
    await printReport(quiet, runner, document, { saveReportPdf: async () => null });
    expect(quiet.ui.getState().notice).toBeNull();
  });
});
