/**
 * Electron main process: one instance (a later launch hands its design to the first window),
 * one window, and the narrow IPC surface of `api.ts` (handlers in `ipcHandlers.ts`).
 * Bundled by scripts/build-electron.mjs to dist-electron/main.cjs.
 *
 * Usage: electron . [--design FILE.tiltsheet]
 */
import { app, BrowserWindow, session } from 'electron';
import type { WebContents } from 'electron';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { DesignAccess } from './designAccess';
import { bringToFront, singleInstanceApp } from './electronExtras';
import { openLinkAfterAsking } from './externalLinks';
import { registerIpc } from './ipcHandlers';
import { DESIGN_EXTENSION, MAX_FILE_BYTES, validateDesignPath } from './ipcValidators';
import { OpenRequests } from './openRequests';
import { newInstanceId, RecoveryStore } from './recoveryStore';
import { CONTENT_SECURITY_POLICY, isAllowedNavigation, secureWebPreferences } from './windowOptions';

const RENDERER_INDEX = path.join(__dirname, '..', 'dist', 'renderer', 'index.html');
const PRELOAD = path.join(__dirname, 'preload.cjs');
const APP_URL = pathToFileURL(RENDERER_INDEX).href;

/** The design a command line names (`--design FILE` or a bare `FILE.tiltsheet`), resolved against `cwd`. */
function designPathFromArgv(argv: readonly string[], cwd: string): string | null {
  const flag = argv.indexOf('--design');
  if (flag >= 0 && flag + 1 < argv.length) return path.resolve(cwd, argv[flag + 1]);
  const bare = argv.slice(1).find((arg) => !arg.startsWith('-') && arg.toLowerCase().endsWith(DESIGN_EXTENSION));
  return bare === undefined ? null : path.resolve(cwd, bare);
}

/**
 * The design a later launch handed over: the path it resolved itself (sent as the lock's
 * additional data, since Chromium may reorder the argv the first instance sees), else its argv.
 */
function designFromSecondLaunch(argv: string[], cwd: string, additionalData: unknown): string | null {
  const sent = (additionalData as { designPath?: unknown } | null)?.designPath;
  try {
    if (typeof sent === 'string') return validateDesignPath('second launch', sent);
    const fromArgv = designPathFromArgv(argv, cwd);
    return fromArgv === null ? null : validateDesignPath('second launch', fromArgv);
  } catch {
    return null; // not a design path: the window is still brought forward
  }
}

/** Applies navigation and window-opening rules to every web contents the app creates. */
function lockDown(contents: WebContents): void {
  contents.setWindowOpenHandler(({ url }) => {
    void openLinkAfterAsking(url).catch(() => undefined);
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

/** Starts the one instance that owns the user-data folder (recovery copies, recent list). */
function startPrimary(): void {
  const openRequests = new OpenRequests();
  const userData = app.getPath('userData');

  // Without a GPU, Chromium no longer falls back to SwiftShader for WebGL unless told to; the
  // viewport is designed to render on the CPU.
  app.commandLine.appendSwitch('enable-unsafe-swiftshader');
  app.enableSandbox();
  app.on('web-contents-created', (_event, contents) => lockDown(contents));

  // A later launch ends at once (see below) and its design opens here, in the existing window.
  singleInstanceApp.on('second-instance', (_event, argv, workingDirectory, additionalData) => {
    const requested = designFromSecondLaunch(argv, workingDirectory, additionalData);
    void app.whenReady().then(() => {
      const win = BrowserWindow.getAllWindows()[0];
      if (win) bringToFront(win);
      else createWindow();
      if (requested !== null) openRequests.push(requested);
    });
  });

  void app.whenReady().then(() => {
    session.defaultSession.webRequest.onHeadersReceived((details, callback) => {
      callback({
        responseHeaders: { ...details.responseHeaders, 'Content-Security-Policy': [CONTENT_SECURITY_POLICY] },
      });
    });
    session.defaultSession.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
    session.defaultSession.setPermissionCheckHandler(() => false);

    registerIpc({
      appUrl: APP_URL,
      initialDesign: designPathFromArgv(process.argv, process.cwd()),
      documentsFolder: app.getPath('documents'),
      access: new DesignAccess(path.join(userData, 'recent.json')),
      recovery: new RecoveryStore(
        path.join(userData, 'recovery'),
        newInstanceId(),
        MAX_FILE_BYTES,
        path.join(userData, 'recovery.tiltsheet'),
      ),
      openRequests,
    });
    createWindow();
    app.on('activate', () => {
      if (BrowserWindow.getAllWindows().length === 0) createWindow();
    });
  });

  app.on('window-all-closed', () => {
    if (process.platform !== 'darwin') app.quit();
  });
}

// One instance per user-data folder, so two never share the recent list or take each other's
// recovery copy; a second launch hands its design to the first and quits.
if (singleInstanceApp.requestSingleInstanceLock({ designPath: designPathFromArgv(process.argv, process.cwd()) })) {
  startPrimary();
} else {
  app.quit();
}
