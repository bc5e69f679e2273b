/**
 * The browser's recovery copy, kept in IndexedDB with strict durability: Chromium writes
 * localStorage to disk in delayed batches, so a browser killed right after an autosave lost
 * the last few seconds of edits (found by the crash end-to-end test). A 'strict' transaction
 * completes only once the data is flushed to disk.
 */

const DB_NAME = 'tiltbench';
const STORE = 'recovery';
const KEY = 'latest';

export interface DurableRecovery {
  write(text: string): Promise<void>;
  read(): Promise<string | null>;
  clear(): Promise<void>;
}

function request<T>(r: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    r.onsuccess = () => resolve(r.result);
    r.onerror = () => reject(r.error ?? new Error('IndexedDB request failed'));
  });
}

function done(tx: IDBTransaction): Promise<void> {
  return new Promise((resolve, reject) => {
    tx.oncomplete = () => resolve();
    tx.onabort = tx.onerror = () => reject(tx.error ?? new Error('IndexedDB transaction failed'));
  });
}

export function indexedDbRecovery(idb: IDBFactory): DurableRecovery {
  let db: Promise<IDBDatabase> | undefined;
  const open = (): Promise<IDBDatabase> => {
    db ??= new Promise((resolve, reject) => {
      const r = idb.open(DB_NAME, 1);
      r.onupgradeneeded = () => r.result.createObjectStore(STORE);
      r.onsuccess = () => resolve(r.result);
      r.onerror = () => reject(r.error ?? new Error('IndexedDB cannot be opened'));
    });
    return db;
  };
  const tx = async (mode: IDBTransactionMode) => (await open()).transaction(STORE, mode, { durability: 'strict' });
  return {
    async write(text) {
      const t = await tx('readwrite');
      t.objectStore(STORE).put(text, KEY);
      await done(t);
    },
    async read() {
      const t = await tx('readonly');
      const value: unknown = await request(t.objectStore(STORE).get(KEY));
      return typeof value === 'string' ? value : null;
    },
    async clear() {
      const t = await tx('readwrite');
      t.objectStore(STORE).delete(KEY);
      await done(t);
    },
  };
}
