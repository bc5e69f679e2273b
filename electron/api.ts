/**
 * The one contract between the Electron main process, the preload script and the renderer:
 * the IPC channel names and the typed API that the preload exposes as `window.tiltbench`.
 *
 * No runtime imports here: the sandboxed preload bundles this file, and the renderer may
 * import its types.
 */

/** IPC channel names, one per message. Main handles each with `ipcMain.handle`. */
export const IPC = {
  designOpen: 'design:open',
  designInitial: 'design:initial',
  designSave: 'design:save',
  designSaveAs: 'design:saveAs',
  recoveryWrite: 'recovery:write',
  recoveryRead: 'recovery:read',
  recoveryClear: 'recovery:clear',
  appRecent: 'app:recent',
  designOpenRecent: 'design:openRecent',
  designOpenRequest: 'design:openRequest',
  reportPdf: 'report:pdf',
} as const;

export type IpcChannel = (typeof IPC)[keyof typeof IPC];

/** A design file as read from disk: its absolute path and its text (JSON). */
export interface DesignFile {
  path: string;
  text: string;
}

/** A design named by a later launch of the app: its file, or why it could not be read. */
export type OpenRequest = { path: string; text: string } | { path: string; problem: string };

/** What the preload exposes to the renderer as `window.tiltbench`. */
export interface TiltbenchApi {
  /** Native open dialog; null when the user cancels. Files over 5 MiB are refused. */
  openDesign(): Promise<DesignFile | null>;
  /** The design named on the command line (`--design FILE`), or null. */
  initialDesign(): Promise<DesignFile | null>;
  /**
   * Atomic save to a path the user chose since the app started (open or save dialog, command
   * line). A path reopened from the recent list is read-only until chosen again: main shows a
   * save dialog at that path first. Resolves to the path written, or null when that dialog
   * was cancelled.
   */
  saveDesign(path: string, text: string): Promise<string | null>;
  /** Native save dialog then atomic save; resolves to the chosen path, or null on cancel. */
  saveDesignAs(text: string, suggestedName?: string): Promise<string | null>;
  /** Writes this instance's crash-recovery autosave (in the user-data folder). */
  writeRecovery(text: string): Promise<void>;
  /** This instance's recovery autosave, else the newest one an ended instance left; null when none. */
  readRecovery(): Promise<string | null>;
  clearRecovery(): Promise<void>;
  /** Recently opened or saved design paths, newest first, existing files only. */
  recentDesigns(): Promise<string[]>;
  /** Reopens a path listed by recentDesigns() (main refuses any other), read-only; null if it is gone. */
  openRecentDesign(path: string): Promise<DesignFile | null>;
  /** Waits for the next design a later launch of the app asks this window to open. */
  nextOpenRequest(): Promise<OpenRequest>;
  /**
   * The workshop report (a self-contained HTML document, no scripts) printed to PDF: a save
   * dialog first, then the HTML loaded in a hidden window with JavaScript off, printed by
   * Chromium's own printToPDF and written atomically. Resolves to the path written, or null
   * when the dialog was cancelled.
   */
  saveReportPdf(html: string, suggestedName?: string): Promise<string | null>;
}

declare global {
  interface Window {
    /** Present only inside the Electron shell; undefined in a plain browser. */
    tiltbench?: TiltbenchApi;
  }
}
