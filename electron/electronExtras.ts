/**
 * Electron APIs the shell uses that types/electron-fallback.d.ts does not declare yet, as
 * narrowed copies of Electron 41's signatures, so the shell still type-checks against the
 * fallback alone (tsconfig.electron-fallback.json). They belong in that file (not this
 * helper's to edit); once they are declared there, these casts can go.
 */
import { app, dialog, type BrowserWindow } from 'electron';

export interface MessageBoxOptions {
  type?: 'none' | 'info' | 'error' | 'question' | 'warning';
  buttons?: string[];
  defaultId?: number;
  cancelId?: number;
  title?: string;
  message: string;
  detail?: string;
  noLink?: boolean;
}

export interface TitledSaveDialogOptions {
  title?: string;
  buttonLabel?: string;
  defaultPath?: string;
  filters?: { name: string; extensions: string[] }[];
}

interface SingleInstanceApp {
  requestSingleInstanceLock(additionalData?: Record<string, unknown>): boolean;
  on(
    event: 'second-instance',
    listener: (event: unknown, argv: string[], workingDirectory: string, additionalData: unknown) => void,
  ): unknown;
}

interface ExtraDialog {
  showMessageBox(window: BrowserWindow, options: MessageBoxOptions): Promise<{ response: number }>;
  showMessageBox(options: MessageBoxOptions): Promise<{ response: number }>;
  showSaveDialog(window: BrowserWindow, options: TitledSaveDialogOptions): Promise<{ canceled: boolean; filePath: string }>;
  showSaveDialog(options: TitledSaveDialogOptions): Promise<{ canceled: boolean; filePath: string }>;
}

interface RestorableWindow {
  isMinimized(): boolean;
  restore(): void;
  focus(): void;
}

export const singleInstanceApp = app as unknown as SingleInstanceApp;

export function showMessageBox(owner: BrowserWindow | null, options: MessageBoxOptions): Promise<{ response: number }> {
  const extra = dialog as unknown as ExtraDialog;
  return owner ? extra.showMessageBox(owner, options) : extra.showMessageBox(options);
}

export function showTitledSaveDialog(
  owner: BrowserWindow | null,
  options: TitledSaveDialogOptions,
): Promise<{ canceled: boolean; filePath: string }> {
  const extra = dialog as unknown as ExtraDialog;
  return owner ? extra.showSaveDialog(owner, options) : extra.showSaveDialog(options);
}

/** Shows a window that may be minimised or behind others. */
export function bringToFront(win: BrowserWindow): void {
  const w = win as unknown as RestorableWindow;
  if (w.isMinimized()) w.restore();
  w.focus();
}
