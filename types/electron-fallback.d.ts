/**
 * The few Electron APIs the shell (electron/main.ts, electron/preload.ts,
 * electron/windowOptions.ts) uses, declared by hand: a fallback for type-checking on a
 * machine where the optional `electron` package did not install (its install script downloads
 * the binary; where that download fails, npm removes the optional package, types and all).
 *
 * tsconfig.json maps `electron` to node_modules/electron/electron.d.ts first and to this file
 * only when that is missing, so wherever Electron is installed (CI sets
 * ELECTRON_SKIP_BINARY_DOWNLOAD so it is) the shell is checked against the real types.
 * `npm run lint` also checks the shell against this file alone (tsconfig.electron-fallback.json),
 * so it cannot fall behind what the shell uses. Signatures are narrowed copies of Electron
 * 41's: add here when the shell starts using another API.
 */

export interface WebPreferences {
  preload?: string;
  contextIsolation?: boolean;
  sandbox?: boolean;
  nodeIntegration?: boolean;
  nodeIntegrationInWorker?: boolean;
  nodeIntegrationInSubFrames?: boolean;
  webSecurity?: boolean;
  allowRunningInsecureContent?: boolean;
  experimentalFeatures?: boolean;
  webviewTag?: boolean;
  navigateOnDragDrop?: boolean;
  javascript?: boolean;
  spellcheck?: boolean;
}

export interface BrowserWindowConstructorOptions {
  width?: number;
  height?: number;
  minWidth?: number;
  minHeight?: number;
  title?: string;
  show?: boolean;
  webPreferences?: WebPreferences;
}

interface PreventableEvent {
  preventDefault(): void;
}

export interface HandlerDetails {
  url: string;
}

export interface WebContents {
  setWindowOpenHandler(handler: (details: HandlerDetails) => { action: 'deny' } | { action: 'allow' }): void;
  on(event: 'will-navigate' | 'will-redirect', listener: (event: PreventableEvent, url: string) => void): this;
  on(event: 'will-attach-webview', listener: (event: PreventableEvent) => void): this;
  printToPDF(options: { printBackground?: boolean; preferCSSPageSize?: boolean }): Promise<Uint8Array>;
}

export class BrowserWindow {
  constructor(options?: BrowserWindowConstructorOptions);
  static getFocusedWindow(): BrowserWindow | null;
  static getAllWindows(): BrowserWindow[];
  readonly webContents: WebContents;
  once(event: 'ready-to-show', listener: () => void): this;
  show(): void;
  loadFile(filePath: string): Promise<void>;
  destroy(): void;
}

export interface WebFrameMain {
  readonly url: string;
}

export interface IpcMainInvokeEvent {
  readonly senderFrame: WebFrameMain | null;
}

export const ipcMain: {
  handle(channel: string, listener: (event: IpcMainInvokeEvent, ...args: unknown[]) => Promise<unknown> | unknown): void;
};

export const ipcRenderer: {
  // Electron's own signature: the reply is whatever main's handler returned (structured clone).
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  invoke(channel: string, ...args: unknown[]): Promise<any>;
};

export const contextBridge: {
  exposeInMainWorld(apiKey: string, api: unknown): void;
};

export interface FileFilter {
  name: string;
  extensions: string[];
}

export interface OpenDialogOptions {
  properties?: Array<'openFile' | 'openDirectory' | 'multiSelections' | 'showHiddenFiles'>;
  filters?: FileFilter[];
  defaultPath?: string;
}

export interface SaveDialogOptions {
  filters?: FileFilter[];
  defaultPath?: string;
}

export const dialog: {
  showOpenDialog(window: BrowserWindow, options: OpenDialogOptions): Promise<{ canceled: boolean; filePaths: string[] }>;
  showOpenDialog(options: OpenDialogOptions): Promise<{ canceled: boolean; filePaths: string[] }>;
  showSaveDialog(window: BrowserWindow, options: SaveDialogOptions): Promise<{ canceled: boolean; filePath: string }>;
  showSaveDialog(options: SaveDialogOptions): Promise<{ canceled: boolean; filePath: string }>;
};

export const shell: {
  openExternal(url: string): Promise<void>;
};

export interface OnHeadersReceivedListenerDetails {
  responseHeaders?: Record<string, string[]>;
}

export interface Session {
  readonly webRequest: {
    onHeadersReceived(
      listener: (details: OnHeadersReceivedListenerDetails, callback: (response: { responseHeaders?: Record<string, string[] | string> }) => void) => void,
    ): void;
  };
  setPermissionRequestHandler(handler: (webContents: WebContents, permission: string, callback: (granted: boolean) => void) => void): void;
  setPermissionCheckHandler(handler: (webContents: WebContents | null, permission: string) => boolean): void;
}

export const session: {
  readonly defaultSession: Session;
};

export const app: {
  getPath(name: 'home' | 'appData' | 'userData' | 'temp' | 'documents' | 'downloads' | 'desktop'): string;
  readonly commandLine: { appendSwitch(name: string, value?: string): void };
  enableSandbox(): void;
  on(event: 'web-contents-created', listener: (event: PreventableEvent, webContents: WebContents) => void): typeof app;
  on(event: 'activate' | 'window-all-closed', listener: () => void): typeof app;
  whenReady(): Promise<void>;
  quit(): void;
};
