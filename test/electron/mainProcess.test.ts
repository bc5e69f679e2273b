// The Electron main process (electron/main.ts and the handlers it registers), run for real
// against a stand-in for the `electron` module: every IPC handler is called as the renderer
// would call it, on real files in a temporary folder. Each `startInstance()` loads main.ts
// afresh, i.e. one launch of the app; several share one user-data folder like launches do.
import { existsSync } from 'node:fs';
import { chmod, lstat, mkdir, mkdtemp, readdir, readFile, realpath, rm, symlink, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { IPC } from '../../electron/api';

type Listener = (...args: unknown[]) => unknown;

interface FakeWindow {
  minimized: boolean;
  restored: number;
  focused: number;
}

const fake = vi.hoisted(() => ({
  handlers: new Map<string, Listener>(),
  appListeners: new Map<string, Listener[]>(),
  windows: [] as FakeWindow[],
  lockFree: true,
  lockData: undefined as unknown,
  quit: 0,
  userData: '',
  documents: '',
  openDialog: null as null | ((options: unknown) => { canceled: boolean; filePaths: string[] }),
  saveDialog: null as null | ((options: { defaultPath?: string; title?: string }) => { canceled: boolean; filePath: string }),
  saveDialogCalls: [] as { defaultPath?: string; title?: string }[],
  messageBox: null as null | ((options: { detail?: string }) => { response: number }),
  messageBoxCalls: [] as { detail?: string; buttons?: string[] }[],
  opened: [] as string[],
  /** Hidden windows made to print: their options, the file each loaded (and its text then), destroyed or not. */
  printWindows: [] as { options: unknown; loaded: string | null; loadedText: string | null; destroyed: boolean }[],
}));

vi.mock('electron', () => {
  const listen = (event: string, listener: Listener): void => {
    fake.appListeners.set(event, [...(fake.appListeners.get(event) ?? []), listener]);
  };
  class BrowserWindow implements FakeWindow {
    minimized = false;
    restored = 0;
    focused = 0;
    webContents: Record<string, unknown> = {};
    private printed: { options: unknown; loaded: string | null; loadedText: string | null; destroyed: boolean } | null = null;
    constructor(options?: { show?: boolean; webPreferences?: { javascript?: boolean } }) {
      fake.windows.push(this);
      // The report's print window is the one with JavaScript off (the app's own window keeps it).
      if (options?.webPreferences?.javascript === false) {
        const record = { options, loaded: null as string | null, loadedText: null as string | null, destroyed: false };
        this.printed = record;
        fake.printWindows.push(record);
        // Chromium's print: a stand-in PDF that names the text it was given.
        this.webContents = { printToPDF: async () => new TextEncoder().encode(`%PDF-stand-in ${record.loadedText?.length ?? 0}`) };
      }
    }
    destroy(): void {
      if (this.printed) this.printed.destroyed = true;
    }
    static getFocusedWindow(): null {
      return null;
    }
    static getAllWindows(): FakeWindow[] {
      return fake.windows;
    }
    once(): this {
      return this;
    }
    show(): void {}
    async loadFile(file: string): Promise<void> {
      if (this.printed) {
        const { readFileSync } = await import('node:fs');
        this.printed.loaded = file;
        this.printed.loadedText = readFileSync(file, 'utf8');
      }
    }
    isMinimized(): boolean {
      return this.minimized;
    }
    restore(): void {
      this.minimized = false;
      this.restored++;
    }
    focus(): void {
      this.focused++;
    }
  }
  const app = {
    getPath: (name: string) => (name === 'userData' ? fake.userData : fake.documents),
    commandLine: { appendSwitch: () => undefined },
    enableSandbox: () => undefined,
    on: (event: string, listener: Listener) => {
      listen(event, listener);
      return app;
    },
    whenReady: () => Promise.resolve(),
    quit: () => {
      fake.quit++;
    },
    requestSingleInstanceLock: (data: unknown) => {
      fake.lockData = data;
      return fake.lockFree;
    },
  };
  const lastArg = <T,>(args: unknown[]): T => args[args.length - 1] as T;
  return {
    app,
    BrowserWindow,
    ipcMain: { handle: (channel: string, listener: Listener) => fake.handlers.set(channel, listener) },
    dialog: {
      showOpenDialog: async (...args: unknown[]) => fake.openDialog!(lastArg(args)),
      showSaveDialog: async (...args: unknown[]) => {
        const options = lastArg<{ defaultPath?: string; title?: string }>(args);
        fake.saveDialogCalls.push(options);
        return fake.saveDialog!(options);
      },
      showMessageBox: async (...args: unknown[]) => {
        const options = lastArg<{ detail?: string; buttons?: string[] }>(args);
        fake.messageBoxCalls.push(options);
        return fake.messageBox!(options);
      },
    },
    shell: {
      openExternal: async (url: string) => {
        fake.opened.push(url);
      },
    },
    session: {
      defaultSession: {
        webRequest: { onHeadersReceived: () => undefined },
        setPermissionRequestHandler: () => undefined,
        setPermissionCheckHandler: () => undefined,
      },
    },
  };
});

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
/** The page main loads (electron/../dist/renderer/index.html): the only sender it serves. */
const APP_URL = pathToFileURL(path.join(ROOT, 'dist', 'renderer', 'index.html')).href;

interface Instance {
  handlers: Map<string, Listener>;
  appListeners: Map<string, Listener[]>;
  invoke(channel: string, ...args: unknown[]): Promise<unknown>;
  invokeFrom(url: string | null, channel: string, ...args: unknown[]): Promise<unknown>;
}

/** One launch of the app: main.ts loaded afresh, its handlers and app listeners kept apart. */
async function startInstance(): Promise<Instance> {
  const handlers = new Map<string, Listener>();
  const appListeners = new Map<string, Listener[]>();
  fake.handlers = handlers;
  fake.appListeners = appListeners;
  vi.resetModules();
  await import('../../electron/main');
  if (fake.lockFree) await vi.waitFor(() => expect(handlers.size).toBeGreaterThan(0));
  const invokeFrom = async (url: string | null, channel: string, ...args: unknown[]) => {
    const handler = handlers.get(channel);
    if (!handler) throw new Error(`no handler for ${channel}`);
    return handler({ senderFrame: url === null ? null : { url } }, ...args);
  };
  return { handlers, appListeners, invokeFrom, invoke: (channel, ...args) => invokeFrom(APP_URL, channel, ...args) };
}

let dir = '';
beforeEach(async () => {
  dir = await realpath(await mkdtemp(path.join(os.tmpdir(), 'tiltbench-main-')));
  fake.userData = path.join(dir, 'user-data');
  fake.documents = path.join(dir, 'documents');
  await mkdir(fake.userData);
  await mkdir(fake.documents);
  Object.assign(fake, {
    windows: [],
    lockFree: true,
    lockData: undefined,
    quit: 0,
    openDialog: null,
    saveDialog: null,
    saveDialogCalls: [],
    messageBox: null,
    messageBoxCalls: [],
    opened: [],
    printWindows: [],
  });
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function design(name: string, text = `{"name":"${name}"}`): Promise<string> {
  const file = path.join(dir, name);
  await writeFile(file, text);
  return file;
}

/** The user picks `file` in the open dialog. */
async function openByDialog(app: Instance, file: string): Promise<unknown> {
  fake.openDialog = () => ({ canceled: false, filePaths: [file] });
  return app.invoke(IPC.designOpen);
}

describe('main process: who may call', () => {
  it('handles every channel of the API', async () => {
    const app = await startInstance();
    expect([...app.handlers.keys()].sort()).toEqual(Object.values(IPC).sort());
  });

  it("serves only the app's own page", async () => {
    const app = await startInstance();
    const file = await design('mine.tiltsheet');
    await openByDialog(app, file);
    for (const url of ['https://evil.example/', 'file:///tmp/other.html', null]) {
      await expect(app.invokeFrom(url, IPC.appRecent)).rejects.toThrow(/unexpected page/);
      await expect(app.invokeFrom(url, IPC.designSave, { path: file, text: 'hijacked' })).rejects.toThrow(/unexpected page/);
      await expect(app.invokeFrom(url, IPC.recoveryRead)).rejects.toThrow(/unexpected page/);
    }
    expect(await readFile(file, 'utf8')).toBe('{"name":"mine.tiltsheet"}');
    expect(await app.invoke(IPC.appRecent)).toEqual([file]); // the same calls from the app's page work
  });
});

describe('main process: which files may be written', () => {
  it('saves only to a path the user chose in this run', async () => {
    const app = await startInstance();
    const file = await design('chosen.tiltsheet', 'old');
    await expect(app.invoke(IPC.designSave, { path: file, text: 'new' })).rejects.toThrow(/not opened or chosen/);
    expect(await readFile(file, 'utf8')).toBe('old');
    expect(await openByDialog(app, file)).toEqual({ path: file, text: 'old' });
    expect(await app.invoke(IPC.designSave, { path: file, text: 'new' })).toBe(file);
    expect(await readFile(file, 'utf8')).toBe('new');
  });

  it('a path chosen in an earlier run is not writable in this one', async () => {
    const first = await startInstance();
    const file = await design('earlier.tiltsheet', 'old');
    await openByDialog(first, file);
    const second = await startInstance();
    await expect(second.invoke(IPC.designSave, { path: file, text: 'new' })).rejects.toThrow(/not opened or chosen/);
    expect(await readFile(file, 'utf8')).toBe('old');
  });

  it('reopens only paths on the recent list, read-only: saving asks where first', async () => {
    const listed = await design('listed.tiltsheet', 'listed');
    const unlisted = await design('unlisted.tiltsheet', 'unlisted');
    await writeFile(path.join(fake.userData, 'recent.json'), JSON.stringify([listed]));
    const app = await startInstance();

    await expect(app.invoke(IPC.designOpenRecent, unlisted)).rejects.toThrow(/not a recent design/);
    expect(await app.invoke(IPC.designOpenRecent, listed)).toEqual({ path: listed, text: 'listed' });

    // Cancelled: nothing written, nothing granted.
    fake.saveDialog = () => ({ canceled: true, filePath: '' });
    expect(await app.invoke(IPC.designSave, { path: listed, text: 'edited' })).toBeNull();
    expect(fake.saveDialogCalls.map((o) => o.defaultPath)).toEqual([listed]);
    expect(await readFile(listed, 'utf8')).toBe('listed');

    // Confirmed at the same place: written, and from then on saved without asking.
    fake.saveDialog = (options) => ({ canceled: false, filePath: options.defaultPath! });
    expect(await app.invoke(IPC.designSave, { path: listed, text: 'edited' })).toBe(listed);
    expect(await readFile(listed, 'utf8')).toBe('edited');
    expect(await app.invoke(IPC.designSave, { path: listed, text: 'again' })).toBe(listed);
    expect(fake.saveDialogCalls).toHaveLength(2);
    expect(await readFile(listed, 'utf8')).toBe('again');
  });

  it('a read-only design is refused with a message naming it, and kept', async () => {
    const app = await startInstance();
    const file = await design('frozen.tiltsheet', 'keep');
    await chmod(file, 0o444);
    await openByDialog(app, file);
    await expect(app.invoke(IPC.designSave, { path: file, text: 'lost?' })).rejects.toThrow(/frozen\.tiltsheet is read-only/);
    expect(await readFile(file, 'utf8')).toBe('keep');
  });

  it('through a linked design, writes the linked design and keeps the link; a link to another kind of file is refused', async () => {
    const app = await startInstance();
    const realFile = await design('real.tiltsheet', 'old');
    const link = path.join(dir, 'link.tiltsheet');
    await symlink(realFile, link);
    await openByDialog(app, link);
    expect(await app.invoke(IPC.designSave, { path: link, text: 'new' })).toBe(link);
    expect((await lstat(link)).isSymbolicLink()).toBe(true);
    expect(await readFile(realFile, 'utf8')).toBe('new');

    const victim = path.join(dir, 'notes.txt');
    await writeFile(victim, 'not a design');
    const disguised = path.join(dir, 'disguised.tiltsheet');
    await symlink(victim, disguised);
    await openByDialog(app, disguised);
    await expect(app.invoke(IPC.designSave, { path: disguised, text: 'x' })).rejects.toThrow(/not a \.tiltsheet file/);
    expect(await readFile(victim, 'utf8')).toBe('not a design');
  });

  it('opens only regular files, within the size limit', async () => {
    const app = await startInstance();
    const big = await design('big.tiltsheet', 'x'.repeat(5 * 1024 * 1024 + 1));
    await expect(openByDialog(app, big)).rejects.toThrow(/larger than/);
    const folder = path.join(dir, 'folder.tiltsheet');
    await mkdir(folder);
    await expect(openByDialog(app, folder)).rejects.toThrow(/not a regular file/);
    await expect(app.invoke(IPC.designSave, { path: folder, text: 'x' })).rejects.toThrow(/not opened or chosen/);
  });
});

describe('main process: recovery copies', () => {
  const recoveryFolder = (): string => path.join(fake.userData, 'recovery');

  it("one instance's save never deletes another's recovery copy", async () => {
    const a = await startInstance();
    expect(await a.invoke(IPC.recoveryRead)).toBeNull();
    const b = await startInstance();
    expect(await b.invoke(IPC.recoveryRead)).toBeNull();
    await a.invoke(IPC.recoveryWrite, 'edits in A');
    await b.invoke(IPC.recoveryWrite, 'edits in B');
    await b.invoke(IPC.recoveryClear); // B saved its design
    expect(await readdir(recoveryFolder())).toHaveLength(1);
    // A is killed; the next launch is offered A's edits.
    const next = await startInstance();
    expect(await next.invoke(IPC.recoveryRead)).toBe('edits in A');
  });

  it('an offered copy is deleted once the user decides: restored (written here) or discarded', async () => {
    const crashed = await startInstance();
    await crashed.invoke(IPC.recoveryWrite, 'crashed edits');
    const restoring = await startInstance();
    expect(await restoring.invoke(IPC.recoveryRead)).toBe('crashed edits');
    await restoring.invoke(IPC.recoveryWrite, 'crashed edits, restored and edited');
    expect(await readdir(recoveryFolder())).toHaveLength(1); // the old copy went, this one holds the edits

    const discarding = await startInstance();
    expect(await discarding.invoke(IPC.recoveryRead)).toBe('crashed edits, restored and edited');
    await discarding.invoke(IPC.recoveryClear);
    expect(await readdir(recoveryFolder())).toEqual([]);
    expect(await (await startInstance()).invoke(IPC.recoveryRead)).toBeNull();
  });

  it('offers the shared copy an older version left', async () => {
    await writeFile(path.join(fake.userData, 'recovery.tiltsheet'), 'from the old version');
    const app = await startInstance();
    expect(await app.invoke(IPC.recoveryRead)).toBe('from the old version');
    await app.invoke(IPC.recoveryClear);
    expect(existsSync(path.join(fake.userData, 'recovery.tiltsheet'))).toBe(false);
  });
});

describe('main process: one instance', () => {
  it('a launch that does not get the lock quits before registering anything', async () => {
    fake.lockFree = false;
    const design = path.join(dir, 'wanted.tiltsheet');
    const argv = process.argv;
    process.argv = [...argv, '--design', design];
    try {
      const app = await startInstance();
      await new Promise((resolve) => setTimeout(resolve, 20));
      expect(fake.quit).toBe(1);
      expect(app.handlers.size).toBe(0);
      expect(fake.windows).toHaveLength(0);
      expect(fake.lockData).toEqual({ designPath: design }); // handed to the first instance
    } finally {
      process.argv = argv;
    }
  });

  it("a second launch's design opens in the first window, brought to the front, and may be saved", async () => {
    const app = await startInstance();
    expect(fake.windows).toHaveLength(1);
    const [win] = fake.windows;
    win.minimized = true;
    const secondLaunch = app.appListeners.get('second-instance')![0];
    const subdir = path.join(dir, 'sub');
    await mkdir(subdir);
    const file = path.join(subdir, 'handed.tiltsheet');
    await writeFile(file, 'handed over');

    const waiting = app.invoke(IPC.designOpenRequest); // the page is already waiting
    // Chromium may reorder the argv; the path the second launch resolved itself comes as lock data.
    secondLaunch({}, ['electron', '.', '--no-sandbox'], '/', { designPath: file });
    expect(await waiting).toEqual({ path: file, text: 'handed over' });
    expect(win.restored).toBe(1);
    expect(win.focused).toBe(1);
    expect(fake.windows).toHaveLength(1);
    expect(await app.invoke(IPC.designSave, { path: file, text: 'saved' })).toBe(file);
    expect(await readFile(file, 'utf8')).toBe('saved');

    // Without lock data, a relative path on its command line is read from its own folder; one
    // sent before the page asks is kept for it. A missing file comes back with the reason.
    secondLaunch({}, ['electron', '.', 'handed.tiltsheet'], subdir, null);
    await new Promise((resolve) => setTimeout(resolve, 10));
    expect(await app.invoke(IPC.designOpenRequest)).toEqual({ path: file, text: 'saved' });
    secondLaunch({}, ['electron', '.', 'gone.tiltsheet'], subdir, null);
    expect(await app.invoke(IPC.designOpenRequest)).toMatchObject({ path: path.join(subdir, 'gone.tiltsheet'), problem: /ENOENT/ });
    // Not a design path: the window comes forward and nothing is opened.
    secondLaunch({}, ['electron', '.'], subdir, { designPath: '/etc/passwd' });
    await new Promise((resolve) => setTimeout(resolve, 10));
    expect(win.focused).toBe(4);
    const pending = app.invoke(IPC.designOpenRequest);
    const settled = await Promise.race([pending.then(() => 'answered'), new Promise((r) => setTimeout(() => r('waiting'), 30))]);
    expect(settled).toBe('waiting');
  });
});

describe('main process: links to web pages', () => {
  async function windowOpenHandler(app: Instance): Promise<(details: { url: string }) => unknown> {
    let handler: ((details: { url: string }) => unknown) | null = null;
    const contents = {
      setWindowOpenHandler: (h: (details: { url: string }) => unknown) => {
        handler = h;
      },
      on: () => contents,
    };
    for (const listener of app.appListeners.get('web-contents-created') ?? []) listener({}, contents);
    expect(handler).not.toBeNull();
    return handler!;
  }

  it('opens an http(s) link only after the user agrees, and never opens a new window', async () => {
    const app = await startInstance();
    const onWindowOpen = await windowOpenHandler(app);

    fake.messageBox = () => ({ response: 0 }); // Cancel
    expect(onWindowOpen({ url: 'https://example.org/a b' })).toEqual({ action: 'deny' });
    await vi.waitFor(() => expect(fake.messageBoxCalls).toHaveLength(1));
    expect(fake.messageBoxCalls[0].detail).toBe('https://example.org/a%20b'); // exactly what would open
    await new Promise((resolve) => setTimeout(resolve, 10));
    expect(fake.opened).toEqual([]);

    fake.messageBox = () => ({ response: 1 }); // Open in browser
    expect(onWindowOpen({ url: 'https://example.org/docs' })).toEqual({ action: 'deny' });
    await vi.waitFor(() => expect(fake.opened).toEqual(['https://example.org/docs']));

    for (const url of ['file:///etc/passwd', 'javascript:alert(1)', `https://example.org/${'x'.repeat(3000)}`]) {
      expect(onWindowOpen({ url })).toEqual({ action: 'deny' });
    }
    await new Promise((resolve) => setTimeout(resolve, 10));
    expect(fake.messageBoxCalls).toHaveLength(2);
    expect(fake.opened).toEqual(['https://example.org/docs']);
  });
});

describe('main process: the workshop report as PDF', () => {
  const html = '<!DOCTYPE html><html><body><h1>Report</h1></body></html>';

  it('asks where, prints the HTML in a hidden window with JavaScript off, writes the PDF and removes the window and its folder', async () => {
    const app = await startInstance();
    const chosen = path.join(dir, 'documents', 'wren report');
    fake.saveDialog = () => ({ canceled: false, filePath: chosen });
    const written = await app.invoke(IPC.reportPdf, { html, suggestedName: 'wren.report' });
    expect(written).toBe(`${chosen}.pdf`);
    expect(fake.saveDialogCalls[0].defaultPath).toBe(path.join(fake.documents, 'wren.report.pdf'));
    expect(await readFile(`${chosen}.pdf`, 'utf8')).toBe(`%PDF-stand-in ${html.length}`);
    const w = fake.printWindows[0];
    expect(w.loadedText).toBe(html);
    expect(w.options).toMatchObject({ show: false, webPreferences: { javascript: false, sandbox: true, contextIsolation: true, nodeIntegration: false } });
    expect(w.destroyed).toBe(true);
    expect(existsSync(path.dirname(w.loaded!))).toBe(false);
  });

  it('writes nothing when the dialog is cancelled, and refuses what is not a whole HTML document', async () => {
    const app = await startInstance();
    fake.saveDialog = () => ({ canceled: true, filePath: '' });
    expect(await app.invoke(IPC.reportPdf, { html })).toBeNull();
    expect(fake.printWindows).toHaveLength(0);
    await expect(app.invoke(IPC.reportPdf, { html: 'just text' })).rejects.toThrow(/whole HTML document/);
    await expect(app.invoke(IPC.reportPdf, { html, extra: 1 })).rejects.toThrow();
    await expect(app.invoke(IPC.reportPdf, { html, suggestedName: '../../etc/x' })).rejects.toThrow(/bare file name/);
    await expect(app.invokeFrom('https://evil.example/', IPC.reportPdf, { html })).rejects.toThrow(/unexpected page/);
  });
});
