/**
 * Files through one interface: the Electron shell's narrow preload API (native dialogs,
 * atomic writes in main) or, in a plain browser, the browser's own file APIs (a file input,
 * a download, IndexedDB (strict durability) and localStorage for the recovery copy, localStorage
 * for the recent list).
 */
import type { TiltbenchApi } from '../../electron/api';
import type { DurableRecovery } from './durableRecovery';

export interface OpenedFile {
  fileName: string;
  /** Absolute path (Electron); null in a browser. */
  path: string | null;
  text: string;
}

export interface RecentEntry {
  /** What the menu shows. */
  label: string;
  /** Electron: the path; browser: the key of the stored copy. */
  id: string;
}

/** A design a later launch of the app asked this window to open (Electron), or why it could not be read. */
export type OpenRequestResult = { file: OpenedFile } | { fileName: string; problem: string };

export interface SaveResult {
  fileName: string;
  path: string | null;
}

export interface FileService {
  readonly kind: 'electron' | 'browser';
  /** The design to start on (command line or ?design=), or null for the bundled demo. */
  initialDesign(): Promise<OpenedFile | null>;
  /** Asks the user for a file; null when they cancel. */
  open(): Promise<OpenedFile | null>;
  /** Saves over `path` when there is one (Electron), else behaves like saveAs. */
  save(text: string, current: SaveResult): Promise<SaveResult | null>;
  saveAs(text: string, suggestedName: string): Promise<SaveResult | null>;
  recent(): Promise<RecentEntry[]>;
  openRecent(entry: RecentEntry): Promise<OpenedFile | null>;
  writeRecovery(text: string): Promise<void>;
  readRecovery(): Promise<string | null>;
  clearRecovery(): Promise<void>;
  /** Electron only: waits for the next design a later launch of the app hands to this window. */
  nextOpenRequest?(): Promise<OpenRequestResult>;
}

export function baseName(p: string): string {
  const parts = p.split(/[\\/]/);
  return parts[parts.length - 1] || p;
}

type ElectronApi = TiltbenchApi;

export function electronFileService(api: ElectronApi): FileService {
  const opened = (f: { path: string; text: string } | null): OpenedFile | null => (f ? { fileName: baseName(f.path), path: f.path, text: f.text } : null);
  const saveAs = async (text: string, suggestedName: string): Promise<SaveResult | null> => {
    const path = await api.saveDesignAs(text, suggestedName);
    return path === null ? null : { fileName: baseName(path), path };
  };
  return {
    kind: 'electron',
    initialDesign: async () => opened(await api.initialDesign()),
    open: async () => opened(await api.openDesign()),
    async save(text, current) {
      if (current.path === null) return saveAs(text, current.fileName);
      // Main may ask where to save first (a design reopened from the recent list): the answer can be another path, or none.
      const written = await api.saveDesign(current.path, text);
      return written === null ? null : { fileName: baseName(written), path: written };
    },
    saveAs,
    recent: async () => (await api.recentDesigns()).map((p) => ({ label: baseName(p), id: p })),
    openRecent: async (entry) => opened(await api.openRecentDesign(entry.id)),
    writeRecovery: (text) => api.writeRecovery(text),
    readRecovery: () => api.readRecovery(),
    clearRecovery: () => api.clearRecovery(),
    async nextOpenRequest() {
      const request = await api.nextOpenRequest();
      if ('problem' in request) return { fileName: baseName(request.path), problem: request.problem };
      return { file: { fileName: baseName(request.path), path: request.path, text: request.text } };
    },
  };
}

const RECOVERY_KEY = 'tiltbench.recovery.v1';
const RECENT_KEY = 'tiltbench.recent.v1';
const RECENT_LIMIT = 8;

interface StoredRecent {
  fileName: string;
  text: string;
  at: number;
}

function readRecentList(storage: Storage): StoredRecent[] {
  try {
    const list: unknown = JSON.parse(storage.getItem(RECENT_KEY) ?? '[]');
    return Array.isArray(list) ? (list as StoredRecent[]).filter((r) => typeof r?.fileName === 'string' && typeof r?.text === 'string') : [];
  } catch {
    return [];
  }
}

function remember(storage: Storage, fileName: string, text: string): void {
  const list = [{ fileName, text, at: Date.now() }, ...readRecentList(storage).filter((r) => r.fileName !== fileName)].slice(0, RECENT_LIMIT);
  try {
    storage.setItem(RECENT_KEY, JSON.stringify(list));
  } catch {
    // Storage full or refused: the recent list is a convenience.
  }
}

export interface BrowserHooks {
  /** Lets the user pick a file (the page's hidden file input); null on cancel. */
  pickFile(): Promise<File | null>;
  /** Offers text as a download under a name. */
  download(text: string, fileName: string): void;
  /** The page's address, for ?design=. */
  location: Location;
  storage: Storage;
  fetch: typeof fetch;
  /** Where the recovery copy is flushed to disk; without it (tests), localStorage only. */
  durable?: DurableRecovery;
}

export function browserFileService(h: BrowserHooks): FileService {
  const saveAs = async (text: string, suggestedName: string): Promise<SaveResult> => {
    const fileName = suggestedName.toLowerCase().endsWith('.tiltsheet') ? suggestedName : `${suggestedName}.tiltsheet`;
    h.download(text, fileName);
    remember(h.storage, fileName, text);
    return { fileName, path: null };
  };
  return {
    kind: 'browser',
    async initialDesign() {
      const asked = new URLSearchParams(h.location.search).get('design');
      // Only a relative path to a design served by the same origin (what `npm start` passes).
      if (!asked || !/^[\w./-]+\.tiltsheet$/.test(asked) || asked.includes('..') || asked.startsWith('/')) return null;
      const res = await h.fetch(asked);
      if (!res.ok) throw new Error(`could not load ${asked}: HTTP ${res.status}`);
      return { fileName: baseName(asked), path: null, text: await res.text() };
    },
    async open() {
      const file = await h.pickFile();
      if (!file) return null;
      if (file.size > 5 * 1024 * 1024) throw new Error(`${file.name} is ${Math.round(file.size / 1024)} KiB; a design file is at most 5 MiB`);
      const text = await file.text();
      remember(h.storage, file.name, text);
      return { fileName: file.name, path: null, text };
    },
    save: (text, current) => saveAs(text, current.fileName),
    saveAs,
    recent: async () => readRecentList(h.storage).map((r) => ({ label: r.fileName, id: r.fileName })),
    async openRecent(entry) {
      const r = readRecentList(h.storage).find((x) => x.fileName === entry.id);
      return r ? { fileName: r.fileName, path: null, text: r.text } : null;
    },
    async writeRecovery(text) {
      // Durable copy first; the localStorage copy (quick to read, and what tests watch) is
      // written only once the durable one is on disk.
      if (h.durable) await h.durable.write(text);
      h.storage.setItem(RECOVERY_KEY, text);
    },
    async readRecovery() {
      if (h.durable) {
        try {
          const text = await h.durable.read();
          if (text !== null) return text;
        } catch {
          // IndexedDB unavailable (private mode, quota): fall back to localStorage.
        }
      }
      return h.storage.getItem(RECOVERY_KEY);
    },
    async clearRecovery() {
      if (h.durable) await h.durable.clear();
      h.storage.removeItem(RECOVERY_KEY);
    },
  };
}
