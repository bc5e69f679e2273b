/**
 * The handler of every IPC message in `api.ts`. Each one first checks that the call comes from
 * the app's own page, then validates its arguments (`ipcValidators.ts`); file access goes
 * through `DesignAccess` (which paths the user chose), `RecoveryStore` and `atomicWrite`.
 */
import { BrowserWindow, dialog, ipcMain } from 'electron';
import type { IpcMainInvokeEvent } from 'electron';
import { existsSync } from 'node:fs';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { IPC, type DesignFile, type OpenRequest } from './api';
import { atomicWrite, resolveWriteTarget, SaveRefusedError } from './atomicWrite';
import { readRegularFile } from './boundedRead';
import type { DesignAccess, DesignAccessLevel } from './designAccess';
import { showTitledSaveDialog } from './electronExtras';
import {
  DESIGN_EXTENSION,
  MAX_FILE_BYTES,
  parseNoArgs,
  parseOpenRecentArgs,
  parseRecoveryWriteArgs,
  parseReportPdfArgs,
  PDF_EXTENSION,
  parseSaveArgs,
  parseSaveAsArgs,
  validateDesignPath,
  validateText,
} from './ipcValidators';
import type { OpenRequests } from './openRequests';
import type { RecoveryStore } from './recoveryStore';
import { isAllowedNavigation } from './windowOptions';

export const DESIGN_FILTERS = [{ name: 'Tiltbench design', extensions: [DESIGN_EXTENSION.slice(1)] }];

export interface ShellState {
  /** The app page's URL: the only sender whose calls are served. */
  appUrl: string;
  /** The design named on this launch's command line, or null. */
  initialDesign: string | null;
  /** Where "save as" starts when the page suggests only a name. */
  documentsFolder: string;
  access: DesignAccess;
  recovery: RecoveryStore;
  openRequests: OpenRequests;
}

/** Registers a handler that serves calls from the app's own page only. */
function handle<T>(appUrl: string, channel: string, run: (args: unknown[]) => Promise<T>): void {
  ipcMain.handle(channel, (event: IpcMainInvokeEvent, ...args: unknown[]) => {
    const sender = event.senderFrame?.url ?? '';
    if (!isAllowedNavigation(sender, appUrl)) throw new Error(`${channel}: call from an unexpected page`);
    return run(args);
  });
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

export function registerIpc(state: ShellState): void {
  const { access, recovery } = state;
  const on = <T>(channel: string, run: (args: unknown[]) => Promise<T>): void => handle(state.appUrl, channel, run);

  /** Reads a design the user chose (write) or reopened from the recent list (read). */
  async function readDesign(channel: string, filePath: string, level: DesignAccessLevel): Promise<DesignFile> {
    const checked = validateDesignPath(channel, filePath);
    const text = await readRegularFile(checked, MAX_FILE_BYTES);
    access.grant(checked, level);
    await access.remember(checked);
    return { path: checked, text };
  }

  /**
   * Writes a design. Through a link the file written is the link's target, which must itself
   * be a design file: a link the user opened cannot turn a save into a write of anything else.
   */
  async function writeDesign(target: string, text: string): Promise<void> {
    const real = await resolveWriteTarget(target);
    if (!path.basename(real).toLowerCase().endsWith(DESIGN_EXTENSION)) {
      throw new SaveRefusedError(`${target} is a link to ${real}, which is not a ${DESIGN_EXTENSION} file; nothing was written.`);
    }
    await atomicWrite(real, text);
    await access.remember(target);
  }

  /** The save dialog; the chosen path (with the extension), or null when cancelled. */
  async function askSavePath(channel: string, defaultPath: string, title?: string): Promise<string | null> {
    const options = { title, filters: DESIGN_FILTERS, defaultPath };
    const result = await showTitledSaveDialog(BrowserWindow.getFocusedWindow(), options);
    if (result.canceled || !result.filePath) return null;
    const chosen = result.filePath.toLowerCase().endsWith(DESIGN_EXTENSION)
      ? result.filePath
      : result.filePath + DESIGN_EXTENSION;
    const target = validateDesignPath(channel, chosen);
    access.grant(target, 'write');
    return target;
  }

  on(IPC.designOpen, async (args) => {
    parseNoArgs(IPC.designOpen, args);
    const owner = BrowserWindow.getFocusedWindow();
    const options = { properties: ['openFile' as const], filters: DESIGN_FILTERS };
    const result = owner ? await dialog.showOpenDialog(owner, options) : await dialog.showOpenDialog(options);
    if (result.canceled || result.filePaths.length === 0) return null;
    return readDesign(IPC.designOpen, result.filePaths[0], 'write');
  });

  on(IPC.designInitial, async (args) => {
    parseNoArgs(IPC.designInitial, args);
    return state.initialDesign === null ? null : readDesign(IPC.designInitial, state.initialDesign, 'write');
  });

  on(IPC.designSave, async (args) => {
    const { path: target, text } = parseSaveArgs(IPC.designSave, args);
    const level = access.levelOf(target);
    if (level === null) {
      throw new Error(`${IPC.designSave}: path was not opened or chosen in this session; use save as`);
    }
    if (level === 'read') {
      // Reopened from the recent list: the user confirms where to write before anything is.
      const chosen = await askSavePath(IPC.designSave, target, 'Confirm where to save this design');
      if (chosen === null) return null;
      await writeDesign(chosen, text);
      return chosen;
    }
    await writeDesign(target, text);
    return target;
  });

  on(IPC.designSaveAs, async (args) => {
    const { text, suggestedName } = parseSaveAsArgs(IPC.designSaveAs, args);
    const defaultPath = path.join(state.documentsFolder, suggestedName ?? `design${DESIGN_EXTENSION}`);
    const chosen = await askSavePath(IPC.designSaveAs, defaultPath);
    if (chosen === null) return null;
    await writeDesign(chosen, text);
    return chosen;
  });

  on(IPC.recoveryWrite, async (args) => {
    await recovery.write(parseRecoveryWriteArgs(IPC.recoveryWrite, args));
  });

  on(IPC.recoveryRead, async (args) => {
    parseNoArgs(IPC.recoveryRead, args);
    const text = await recovery.read();
    return text === null ? null : validateText(IPC.recoveryRead, text);
  });

  on(IPC.recoveryClear, async (args) => {
    parseNoArgs(IPC.recoveryClear, args);
    await recovery.clear();
  });

  on(IPC.appRecent, async (args) => {
    parseNoArgs(IPC.appRecent, args);
    return (await access.recent()).filter((p) => existsSync(p));
  });

  on(IPC.designOpenRecent, async (args) => {
    const wanted = parseOpenRecentArgs(IPC.designOpenRecent, args);
    // Only a path this app listed as recent: the renderer cannot name arbitrary files.
    if (!(await access.isRecent(wanted))) throw new Error(`${IPC.designOpenRecent}: not a recent design`);
    if (!existsSync(wanted)) return null;
    return readDesign(IPC.designOpenRecent, wanted, 'read');
  });

  on(IPC.reportPdf, async (args) => {
    const { html, suggestedName } = parseReportPdfArgs(IPC.reportPdf, args);
    const options = { title: 'Save the workshop report as PDF', filters: [{ name: 'PDF', extensions: ['pdf'] }], defaultPath: path.join(state.documentsFolder, suggestedName) };
    const result = await showTitledSaveDialog(BrowserWindow.getFocusedWindow(), options);
    if (result.canceled || !result.filePath) return null;
    const target = result.filePath.toLowerCase().endsWith(PDF_EXTENSION) ? result.filePath : result.filePath + PDF_EXTENSION;
    await atomicWrite(await resolveWriteTarget(target), await printHtmlToPdf(html));
    return target;
  });

  on(IPC.designOpenRequest, async (args): Promise<OpenRequest> => {
    parseNoArgs(IPC.designOpenRequest, args);
    const requested = await state.openRequests.next();
    try {
      // Named on a command line by the user: a choice made now, so it may be saved over.
      return await readDesign(IPC.designOpenRequest, requested, 'write');
    } catch (error) {
      return { path: requested, problem: messageOf(error) };
    }
  });
}

/**
 * Chromium's own print of an HTML document to PDF (A4 from the report's CSS page size,
 * backgrounds printed): loaded from a private temporary folder into a hidden window with
 * JavaScript, Node and the preload off, then the window and the folder are removed.
 */
async function printHtmlToPdf(html: string): Promise<Uint8Array> {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'tiltbench-report-'));
  const win = new BrowserWindow({ show: false, webPreferences: { javascript: false, sandbox: true, contextIsolation: true, nodeIntegration: false } });
  try {
    const file = path.join(dir, 'report.html');
    await writeFile(file, html, { mode: 0o600 });
    await win.loadFile(file);
    return await win.webContents.printToPDF({ printBackground: true, preferCSSPageSize: true });
  } finally {
    win.destroy();
    await rm(dir, { recursive: true, force: true });
  }
}
