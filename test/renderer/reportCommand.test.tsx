// The workshop report from the workbench's file menu: the document `tiltbench report` writes
// (its tables equal the CLI's for the same design), offered as an HTML file named after the
// design, hashed over the design text the workbench saves (checked with Python's hashlib), and
// printed from a hidden frame through the print dialog.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { FileMenu } from '../../renderer/app/FileMenu';
import { FlowProvider } from '../../renderer/app/flowContext';
import type { ExchangeFiles } from '../../renderer/files/exchangeFiles';
import { DocumentFlow } from '../../renderer/files/documentFlow';
import type { FileService } from '../../renderer/files/fileService';
import type { Workbench } from '../../renderer/state/workbench';
import { printHtml, type ReportRunner } from '../../renderer/export/reportCommands';
import { runJob } from '../../renderer/workers/runJob';
import type { SweepRequest } from '../../renderer/workers/sweepProtocol';
import { run as runCli, WREN } from '../cli/cliHarness';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

/** The worker's job run here, on the main thread (the same code the worker runs). */
const hereRunner: ReportRunner = { job: (async (kind: SweepRequest['kind'], request: SweepRequest['request']) => runJob({ id: 1, kind, request } as SweepRequest)) as ReportRunner['job'] };

function renderMenu(wb: Workbench, files: ExchangeFiles, reports: ReportRunner) {
  const flow = new DocumentFlow(wb, {} as FileService);
  render(withWorkbench(wb, <FlowProvider flow={flow}><FileMenu exchange={files} reports={reports} /></FlowProvider>));
}

async function choose(testId: string) {
  fireEvent.click(screen.getByTestId('file-exchange'));
  await act(async () => {
    fireEvent.click(screen.getByTestId(testId));
  });
}

const parse = (html: string) => new DOMParser().parseFromString(html, 'text/html');

describe('the workshop report from the file menu', () => {
  it('offers the report as wren-rack-trike.report.html; its tables equal tiltbench report\u2019s and its hash is of the saved text', async () => {
    const wb = demoWorkbench('wren-rack-trike');
    const offered: { data: string | Uint8Array; fileName: string; mime: string }[] = [];
    const files: ExchangeFiles = { pickTable: async () => null, offer: (data, fileName, mime) => offered.push({ data, fileName, mime }) };
    renderMenu(wb, files, hereRunner);
    await choose('file-export-report');
    await waitFor(() => expect(offered).toHaveLength(1), { timeout: 60_000 });
    expect(offered[0].fileName).toBe('wren-rack-trike.report.html');
    expect(offered[0].mime).toBe('text/html');
    const doc = parse(offered[0].data as string);
    expect(doc.querySelector('h1')?.textContent).toBe(`Workshop report: ${wb.document.getState().design.name}`);
    const dir = mkdtempSync(join(tmpdir(), 'tiltbench-report-wb-'));
    writeFileSync(join(dir, 'saved.tiltsheet'), wb.document.getState().designText);
    const sha = execFileSync('python3', ['-c', 'import hashlib,sys;print(hashlib.sha256(open(sys.argv[1],"rb").read()).hexdigest())', join(dir, 'saved.tiltsheet')], { encoding: 'utf8' }).trim();
    expect(doc.getElementById('sha256')?.textContent).toBe(sha);
    // The CLI's report of the same design: the same numbers in the same tables.
    const out = join(dir, 'cli.html');
    const cli = await runCli(['report', WREN, '--out', out]);
    expect(cli.code, cli.err).toBe(0);
    const cliDoc = parse(readFileSync(out, 'utf8'));
    for (const id of ['hardpoints', 'alignment', 'limits', 'turning']) {
      expect(doc.getElementById(id)?.outerHTML, id).toBe(cliDoc.getElementById(id)?.outerHTML);
      expect(doc.getElementById(id)?.querySelectorAll('td').length, id).toBeGreaterThan(10);
    }
    expect(wb.ui.getState().notice).toBeNull();
  }, 120_000);

  it('a report that fails says why in a notice and offers nothing', async () => {
    const wb = demoWorkbench('wren-rack-trike');
    const offer = vi.fn();
    renderMenu(wb, { pickTable: async () => null, offer }, { job: (async () => Promise.reject(new Error('the worker stopped'))) as ReportRunner['job'] });
    await choose('file-export-report');
    await waitFor(() => expect(wb.ui.getState().notice?.kind).toBe('error'));
    expect(wb.ui.getState().notice).toEqual({ kind: 'error', title: 'Could not make the report', lines: ['the worker stopped'] });
    expect(offer).not.toHaveBeenCalled();
  });

  it('print: the report goes into a hidden frame that opens the print dialog when loaded', async () => {
    const wb = demoWorkbench('wren-rack-trike');
    const html = '<!DOCTYPE html><html><body><section class="sheet"><h1>Workshop report: X</h1></section></body></html>';
    renderMenu(wb, { pickTable: async () => null, offer: vi.fn() }, { job: (async () => html) as ReportRunner['job'] });
    await choose('file-print-report');
    const frame = (await waitFor(() => {
      const f = document.querySelector('iframe[data-testid="report-print-frame"]');
      expect(f).not.toBeNull();
      return f;
    })) as HTMLIFrameElement;
    expect(frame.srcdoc).toBe(html);
    expect(frame.style.visibility).toBe('hidden');
    const print = vi.fn();
    frame.contentWindow!.print = print;
    frame.dispatchEvent(new Event('load'));
    expect(print).toHaveBeenCalledTimes(1);
    frame.contentWindow!.dispatchEvent(new Event('afterprint'));
    await waitFor(() => expect(document.querySelector('iframe[data-testid="report-print-frame"]')).toBeNull());
  });

  it('printHtml on its own: one frame per call, removed after printing', () => {
    const a = printHtml('<p>a</p>');
    const b = printHtml('<p>b</p>');
    expect(document.querySelectorAll('iframe[data-testid="report-print-frame"]')).toHaveLength(2);
    a.remove();
    b.remove();
  });
});
