// Security settings of the Electron shell, checked without Electron: web preferences, the
// Content-Security-Policy, navigation rules and IPC validators. Saving is in atomicWrite.test.ts,
// the main process's handlers in mainProcess.test.ts.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { IPC } from '../../electron/api';
import {
  IpcValidationError,
  MAX_TEXT_BYTES,
  parseNoArgs,
  parseRecoveryWriteArgs,
  parseSaveArgs,
  parseSaveAsArgs,
  utf8ByteLength,
} from '../../electron/ipcValidators';
import {
  CONTENT_SECURITY_POLICY,
  CONTENT_SECURITY_POLICY_META,
  isAllowedNavigation,
  isExternalHttpUrl,
  secureWebPreferences,
} from '../../electron/windowOptions';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const source = (relative: string): Promise<string> => readFile(path.join(ROOT, relative), 'utf8');

/** Directive name -> source list. */
function parseCsp(policy: string): Map<string, string[]> {
  const directives = new Map<string, string[]>();
  for (const part of policy.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) directives.set(name, values);
  }
  return directives;
}

describe('web preferences', () => {
  const prefs = secureWebPreferences('/opt/tiltbench/dist-electron/preload.cjs');

  it('isolates and sandboxes the renderer', () => {
    expect(prefs.contextIsolation).toBe(true);
    expect(prefs.sandbox).toBe(true);
    expect(prefs.nodeIntegration).toBe(false);
    expect(prefs.nodeIntegrationInWorker).toBe(false);
    expect(prefs.nodeIntegrationInSubFrames).toBe(false);
    expect(prefs.webSecurity).toBe(true);
    expect(prefs.allowRunningInsecureContent).toBe(false);
    expect(prefs.webviewTag).toBe(false);
    expect(prefs.preload).toBe('/opt/tiltbench/dist-electron/preload.cjs');
  });

  it('is what main.ts uses, with no override', async () => {
    const main = await source('electron/main.ts');
    expect(main).toContain('webPreferences: secureWebPreferences(PRELOAD)');
    expect(main).not.toMatch(/sandbox\s*:\s*false|contextIsolation\s*:\s*false|nodeIntegration\s*:\s*true/);
    expect(main).toContain('app.enableSandbox()');
  });
});

describe('Content-Security-Policy', () => {
  const header = parseCsp(CONTENT_SECURITY_POLICY);

  it("defaults to 'self' and never allows eval or inline scripts", () => {
    expect(header.get('default-src')).toEqual(["'self'"]);
    expect(header.get('script-src')).toEqual(["'self'"]);
    expect(CONTENT_SECURITY_POLICY).not.toContain('unsafe-eval');
    expect(CONTENT_SECURITY_POLICY_META).not.toContain('unsafe-eval');
    expect(header.get('object-src')).toEqual(["'none'"]);
    expect(header.get('base-uri')).toEqual(["'none'"]);
    expect(header.get('frame-ancestors')).toEqual(["'none'"]);
  });

  it('allows nothing beyond the app itself (no remote hosts, no wildcards)', () => {
    for (const [name, values] of header) {
      for (const value of values) {
        expect(value, `${name} ${value}`).toMatch(/^('self'|'none'|'unsafe-inline'|data:|blob:)$/);
      }
      if (values.includes("'unsafe-inline'")) expect(name).toBe('style-src');
    }
  });

  it('is repeated in the meta tag of renderer/index.html', async () => {
    const html = await source('renderer/index.html');
    const meta = /<meta\s+http-equiv="Content-Security-Policy"\s+content="([^"]*)"/i.exec(html);
    expect(meta?.[1]).toBe(CONTENT_SECURITY_POLICY_META);
    expect([...parseCsp(CONTENT_SECURITY_POLICY_META).keys()]).not.toContain('frame-ancestors');
  });
});

describe('navigation and new windows', () => {
  const appUrl = pathToFileURL('/opt/tiltbench/dist/renderer/index.html').href;

  it('allows only the app page itself', () => {
    expect(isAllowedNavigation(appUrl, appUrl)).toBe(true);
    expect(isAllowedNavigation(`${appUrl}#/design`, appUrl)).toBe(true);
    expect(isAllowedNavigation(pathToFileURL('/etc/passwd').href, appUrl)).toBe(false);
    expect(isAllowedNavigation('https://example.org/', appUrl)).toBe(false);
    expect(isAllowedNavigation('javascript:alert(1)', appUrl)).toBe(false);
    expect(isAllowedNavigation('not a url', appUrl)).toBe(false);
    expect(isAllowedNavigation('http://127.0.0.1:5273/x', 'http://127.0.0.1:5273/')).toBe(true);
    expect(isAllowedNavigation('http://127.0.0.1:5274/', 'http://127.0.0.1:5273/')).toBe(false);
  });

  it('hands only http(s) links to the system browser', () => {
    expect(isExternalHttpUrl('https://example.org/docs')).toBe(true);
    expect(isExternalHttpUrl('http://example.org/')).toBe(true);
    expect(isExternalHttpUrl('file:///etc/passwd')).toBe(false);
    expect(isExternalHttpUrl('javascript:alert(1)')).toBe(false);
    expect(isExternalHttpUrl('smb://host/share')).toBe(false);
    expect(isExternalHttpUrl('https://user:pw@example.org/')).toBe(false);
  });

  it('main denies new windows and guards will-navigate', async () => {
    const main = await source('electron/main.ts');
    expect(main).toMatch(/setWindowOpenHandler\([\s\S]*?action: 'deny'/);
    expect(main).toMatch(/'will-navigate'[\s\S]*?isAllowedNavigation[\s\S]*?preventDefault/);
  });
});

describe('IPC surface', () => {
  it('preload exposes one function per channel and never ipcRenderer itself', async () => {
    const preload = await source('electron/preload.ts');
    expect(preload.match(/exposeInMainWorld\(/g)).toHaveLength(1);
    expect(preload).not.toMatch(/exposeInMainWorld\([^)]*ipcRenderer\s*[,)]/);
    expect(preload).not.toMatch(/ipcRenderer\.(on|once|send|sendSync|postMessage)\b/);
    // That main handles every channel is checked on the running handlers in mainProcess.test.ts.
    for (const key of Object.keys(IPC)) {
      expect(preload, `preload uses IPC.${key}`).toContain(`IPC.${key}`);
    }
  });
});

describe('IPC validators', () => {
  const ch = IPC.designSave;
  const good = { path: '/home/me/trike.tiltsheet', text: '{"format":1}' };
  const rejects = (fn: () => unknown): void => {
    expect(fn).toThrow(IpcValidationError);
  };

  it('accepts a well-formed save', () => {
    expect(parseSaveArgs(ch, [good])).toEqual(good);
    expect(parseSaveArgs(ch, [{ path: '/a/../b/T.TILTSHEET', text: '' }]).path).toBe('/b/T.TILTSHEET');
  });

  it('rejects non-string paths', () => {
    for (const bad of [42, null, undefined, ['/a.tiltsheet'], { toString: () => '/a.tiltsheet' }]) {
      rejects(() => parseSaveArgs(ch, [{ path: bad, text: 'x' }]));
    }
  });

  it('rejects paths without the .tiltsheet extension, relative paths and NUL bytes', () => {
    for (const bad of ['/a/b.json', '/a/b.tiltsheet.exe', '/a/.tiltsheet', 'b.tiltsheet', '', '/a\0b.tiltsheet']) {
      rejects(() => parseSaveArgs(ch, [{ path: bad, text: 'x' }]));
    }
    rejects(() => parseSaveArgs(ch, [{ path: `/${'a'.repeat(5000)}.tiltsheet`, text: 'x' }]));
  });

  it('rejects non-string and too-large texts, counting UTF-8 bytes', () => {
    rejects(() => parseSaveArgs(ch, [{ path: good.path, text: 5 }]));
    rejects(() => parseSaveArgs(ch, [{ path: good.path, text: new Uint8Array(4) }]));
    rejects(() => parseSaveArgs(ch, [{ path: good.path, text: 'x'.repeat(MAX_TEXT_BYTES + 1) }]));
    expect(parseSaveArgs(ch, [{ path: good.path, text: 'x'.repeat(MAX_TEXT_BYTES) }]).text).toHaveLength(
      MAX_TEXT_BYTES,
    );
    const wide = 'é'.repeat(MAX_TEXT_BYTES / 2 + 1); // fewer chars than the limit, more bytes
    expect(wide.length).toBeLessThan(MAX_TEXT_BYTES);
    rejects(() => parseSaveArgs(ch, [{ path: good.path, text: wide }]));
    rejects(() => parseRecoveryWriteArgs(IPC.recoveryWrite, ['x'.repeat(MAX_TEXT_BYTES + 1)]));
    rejects(() => parseSaveAsArgs(IPC.designSaveAs, [{ text: wide }]));
  });

  it('rejects extra arguments, missing arguments and unknown keys', () => {
    rejects(() => parseSaveArgs(ch, [good, 'extra']));
    rejects(() => parseSaveArgs(ch, []));
    rejects(() => parseSaveArgs(ch, [{ ...good, mode: 0o777 }]));
    rejects(() => parseSaveArgs(ch, [{ path: good.path }]));
    rejects(() => parseSaveArgs(ch, [[good.path, good.text]]));
    rejects(() => parseSaveArgs(ch, [new (class Fake { path = good.path; text = good.text })()]));
    rejects(() => parseNoArgs(IPC.designOpen, ['/etc/passwd']));
    rejects(() => parseRecoveryWriteArgs(IPC.recoveryWrite, ['a', 'b']));
    rejects(() => parseRecoveryWriteArgs(IPC.recoveryWrite, [{ text: 'a' }]));
    expect(() => parseNoArgs(IPC.appRecent, [])).not.toThrow();
  });

  it('save-as takes a bare suggested name and adds the extension', () => {
    expect(parseSaveAsArgs(IPC.designSaveAs, [{ text: 'x' }])).toEqual({ text: 'x', suggestedName: null });
    expect(parseSaveAsArgs(IPC.designSaveAs, [{ text: 'x', suggestedName: 'trike' }]).suggestedName).toBe(
      'trike.tiltsheet',
    );
    for (const bad of ['../x', 'a/b', 'a\\b', '', '..', 7]) {
      rejects(() => parseSaveAsArgs(IPC.designSaveAs, [{ text: 'x', suggestedName: bad }]));
    }
    rejects(() => parseSaveAsArgs(IPC.designSaveAs, [{ text: 'x', path: '/tmp/x.tiltsheet' }]));
  });

  it('counts UTF-8 bytes like Buffer does', () => {
    for (const s of ['', 'abc', 'é', '€', '😀', 'a😀b€é', '\ud800', 'x\udc00y', '\ud83d']) {
      expect(utf8ByteLength(s), JSON.stringify(s)).toBe(Buffer.byteLength(s, 'utf8'));
    }
  });
});
