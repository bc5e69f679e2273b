/**
 * Electron main process: one window, file I/O and the narrow IPC surface of `api.ts`.
 * Bundled by scripts/build-electron.mjs to dist-electron/main.cjs.
 *
 * Usage: electron . [--design FILE.tiltsheet]
 */
import { app, BrowserWindow, dialog, ipcMain, session, shell } from 'electron';
import type { IpcMainInvokeEvent, WebContents } from 'electron';
import { existsSync } from 'node:fs';
import { readFile, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { IPC, type DesignFile } from './api';
import { atomicWrite } from './atomicWrite';
import {
  DESIGN_EXTENSION,
  MAX_FILE_BYTES,
  parseNoArgs,
  parseRecoveryWriteArgs,
  parseSaveArgs,
  parseSaveAsArgs,
  validateDesignPath,
  validateText,
} from './ipcValidators';
import {
  CONTENT_SECURITY_POLICY,
  isAllowedNavigation,
  isExternalHttpUrl,
  secureWebPreferences,
} from './windowOptions';

const RENDERER_INDEX = path.join(__dirname, '..', 'dist', 'renderer', 'index.html');
const PRELOAD = path.join(__dirname, 'preload.cjs');
const APP_URL = pathToFileURL(RENDERER_INDEX).href;
const RECENT_LIMIT = 10;
const DESIGN_FILTERS = [{ name: 'Tiltbench design', extensions: [DESIGN_EXTENSION.slice(1)] }];

/** Paths the user picked this session (open, save as, command line): the only ones `design:save` writes. */
const grantedPaths = new Set<string>();

function recoveryPath(): string {
  return path.join(app.getPath('userData'), 'recovery.tiltsheet');
}

function recentListPath(): string {
  return path.join(app.getPath('userData'), 'recent.json');
}

function designPathFromArgv(argv: readonly string[]): string | null {
  const flag = argv.indexOf('--design');
  if (flag >= 0 && flag + 1 < argv.length) return path.resolve(argv[flag + 1]);
  const bare = argv.slice(1).find((arg) => !arg.startsWith('-') && arg.toLowerCase().endsWith(DESIGN_EXTENSION));
  return bare === undefined ? null : path.resolve(bare);
}

async function readDesign(channel: string, filePath: string): Promise<DesignFile> {
  const checked = validateDesignPath(channel, filePath);
  const info = await stat(checked);
  if (!info.isFile()) throw new Error(`${channel}: not a file: ${checked}`);
  if (info.size > MAX_FILE_BYTES) throw new Error(`${channel}: file exceeds ${MAX_FILE_BYTES} bytes`);
  const text = await readFile(checked, 'utf8');
  grantedPaths.add(checked);
  await rememberRecent(checked);
  return { path: checked, text };
}

async function loadRecent(): Promise<string[]> {
  try {
    const parsed: unknown = JSON.parse(await readFile(recentListPath(), 'utf8'));
    if (!Array.isArray(parsed)) return [];
    return parsed.filter((p): p is string => typeof p === 'string').slice(0, RECENT_LIMIT);
  } catch {
    return [];
  }
}

async function rememberRecent(filePath: string): Promise<void> {
  const list = [filePath, ...(await loadRecent()).filter((p) => p !== filePath)].slice(0, RECENT_LIMIT);
  await atomicWrite(recentListPath(), JSON.stringify(list, null, 2));
}

/** Registers a handler that accepts calls from the app's own page only. */
function handle<T>(channel: string, run: (args: unknown[]) => Promise<T>): void {
  ipcMain.handle(channel, (event: IpcMainInvokeEvent, ...args: unknown[]) => {
    const sender = event.senderFrame?.url ?? '';
    if (!isAllowedNavigation(sender, APP_URL)) throw new Error(`${channel}: call from an unexpected page`);
    return run(args);
  });
}

function registerIpc(initialDesign: string | null): void {
  handle(IPC.designOpen, async (args) => {
    parseNoArgs(IPC.designOpen, args);
    const owner = BrowserWindow.getFocusedWindow();
    const options = { properties: ['openFile' as const], filters: DESIGN_FILTERS };
    const result = owner ? await dialog.showOpenDialog(owner, options) : await dialog.showOpenDialog(options);
    if (result.canceled || result.filePaths.length === 0) return null;
    return readDesign(IPC.designOpen, result.filePaths[0]);
  });

  handle(IPC.designInitial, async (args) => {
    parseNoArgs(IPC.designInitial, args);
    return initialDesign === null ? null : readDesign(IPC.designInitial, initialDesign);
  });

  handle(IPC.designSave, async (args) => {
    const { path: target, text } = parseSaveArgs(IPC.designSave, args);
    if (!grantedPaths.has(target)) {
      throw new Error(`${IPC.designSave}: path was not opened or chosen in this session; use save as`);
    }
    await atomicWrite(target, text);
    await rememberRecent(target);
  });

  handle(IPC.designSaveAs, async (args) => {
    const { text, suggestedName } = parseSaveAsArgs(IPC.designSaveAs, args);
    const owner = BrowserWindow.getFocusedWindow();
    const options = {
      filters: DESIGN_FILTERS,
      defaultPath: path.join(app.getPath('documents'), suggestedName ?? `design${DESIGN_EXTENSION}`),
    };
    const result = owner ? await dialog.showSaveDialog(owner, options) : await dialog.showSaveDialog(options);
    if (result.canceled || !result.filePath) return null;
    const chosen = result.filePath.toLowerCase().endsWith(DESIGN_EXTENSION)
      ? result.filePath
      : result.filePath + DESIGN_EXTENSION;
    const target = validateDesignPath(IPC.designSaveAs, chosen);
    await atomicWrite(target, text);
    grantedPaths.add(target);
    await rememberRecent(target);
    return target;
  });

  handle(IPC.recoveryWrite, async (args) => {
    await atomicWrite(recoveryPath(), parseRecoveryWriteArgs(IPC.recoveryWrite, args));
  });

  handle(IPC.recoveryRead, async (args) => {
    parseNoArgs(IPC.recoveryRead, args);
    try {
      const info = await stat(recoveryPath());
      if (info.size > MAX_FILE_BYTES) return null;
      return validateText(IPC.recoveryRead, await readFile(recoveryPath(), 'utf8'));
    } catch {
      return null;
    }
  });

  handle(IPC.recoveryClear, async (args) => {
    parseNoArgs(IPC.recoveryClear, args);
    await rm(recoveryPath(), { force: true });
  });

  handle(IPC.appRecent, async (args) => {
    parseNoArgs(IPC.appRecent, args);
    return (await loadRecent()).filter((p) => existsSync(p));
  });

  handle(IPC.designOpenRecent, async (args) => {
    if (args.length !== 1 || typeof args[0] !== 'string') throw new Error(`${IPC.designOpenRecent}: expected one path`);
    const wanted = validateDesignPath(IPC.designOpenRecent, args[0]);
    // Only a path this app listed as recent: the renderer cannot name arbitrary files.
    if (!(await loadRecent()).includes(wanted)) throw new Error(`${IPC.designOpenRecent}: not a recent design`);
    if (!existsSync(wanted)) return null;
    return readDesign(IPC.designOpenRecent, wanted);
  });
}

/** Applies navigation and window-opening rules to every web contents the app creates. */
function lockDown(contents: WebContents): void {
  contents.setWindowOpenHandler(({ url }) => {
    if (isExternalHttpUrl(url)) void shell.openExternal(url);
    return { action: 'deny' };
  });
  contents.on('will-navigate', (event, url) => {
    if (!isAllowedNavigation(url, APP_URL)) event.preventDefault();
  });
  contents.on('will-redirect', (event, url) => {
    if (!isAllowedNavigation(url, APP_URL)) event.preventDefault();
  });
  contents.on('will-attach-webview', (event) => event.preventDefault());
}

function createWindow(): void {
  const win = new BrowserWindow({
    width: 1400,
    height: 900,
    minWidth: 800,
    minHeight: 600,
    title: 'Tiltbench',
    show: false,
    webPreferences: secureWebPreferences(PRELOAD),
  });
  win.once('ready-to-show', () => win.show());
  void win.loadFile(RENDERER_INDEX);
}

// Without a GPU, Chromium no longer falls back to SwiftShader for WebGL unless told to; the
// viewport is designed to render on the CPU.
app.commandLine.appendSwitch('enable-unsafe-swiftshader');
app.enableSandbox();
app.on('web-contents-created', (_event, contents) => lockDown(contents));

void app.whenReady().then(() => {
  session.defaultSession.webRequest.onHeadersReceived((details, callback) => {
    callback({
      responseHeaders: { ...details.responseHeaders, 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] },
    });
  });
  session.defaultSession.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  session.defaultSession.setPermissionCheckHandler(() => false);

  registerIpc(designPathFromArgv(process.argv));
  createWindow();
  app.on('activate', () => {
    if (BrowserWindow.getAllWindows().length === 0) createWindow();
  });
});

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin') app.quit();
});
