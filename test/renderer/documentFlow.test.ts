// Files: open, save, malformed files, autosave and recovery, through a fake file service.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AUTOSAVE_DELAY_MS, DocumentFlow } from '../../renderer/files/documentFlow';
import type { FileService, OpenedFile } from '../../renderer/files/fileService';
import { browserFileService } from '../../renderer/files/fileService';
import { setCoordinate } from '../../renderer/model/designActions';
import { designToText } from '../../renderer/model/designText';
import { demoDesign, demoWorkbench } from './helpers';

function fakeFiles(over: Partial<FileService> = {}) {
  const state = { recovery: null as string | null, saved: [] as { text: string; name: string }[], toOpen: null as OpenedFile | null };
  const files: FileService = {
    kind: 'browser',
    initialDesign: async () => null,
    open: async () => state.toOpen,
    save: async (text, current) => {
      state.saved.push({ text, name: current.fileName });
      return current;
    },
    saveAs: async (text, name) => {
      state.saved.push({ text, name });
      return { fileName: name, path: null };
    },
    recent: async () => [],
    openRecent: async () => null,
    writeRecovery: async (t) => {
      state.recovery = t;
    },
    readRecovery: async () => state.recovery,
    clearRecovery: async () => {
      state.recovery = null;
    },
    ...over,
  };
  return { files, state };
}

describe('document flow', () => {
  beforeEach(() => {
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('a malformed file shows a clear error and keeps the current design', async () => {
    const wb = demoWorkbench();
    wb.actions.perform(setCoordinate, { rowId: 'steering.pivot', axis: 'z', value: 110 });
    const before = wb.document.getState().designText;
    const { files, state } = fakeFiles();
    const flow = new DocumentFlow(wb, files);
    state.toOpen = { fileName: 'broken.tiltsheet', path: null, text: '{ "tiltsheet": 1, "name": "x", ' };
    // The design is dirty: opening asks first; answer yes.
    const opening = flow.open();
    await vi.waitFor(() => expect(wb.ui.getState().confirm).not.toBeNull());
    wb.ui.getState().confirm!.resolve(true);
    await opening;
    const { notice } = wb.ui.getState();
    expect(notice?.kind).toBe('error');
    expect(notice?.title).toBe('Could not open broken.tiltsheet');
    expect(notice?.lines.join(' ')).toMatch(/broken\.tiltsheet:1:32: invalid JSON.*line 1, column 32/);
    expect(notice?.lines.join(' ')).toMatch(/still here/);
    const s = wb.document.getState();
    expect(s.designText).toBe(before);
    expect(s.dirty).toBe(true);
  });

  it('a file that fails validation names the field', () => {
    const wb = demoWorkbench();
    const { files } = fakeFiles();
    const flow = new DocumentFlow(wb, files);
    const bad = demoDesign() as unknown as Record<string, Record<string, unknown>>;
    bad.envelope.leanDeg = 'lots';
    expect(flow.loadText({ fileName: 'bad.tiltsheet', path: null, text: JSON.stringify(bad) })).toBe(false);
    expect(wb.ui.getState().notice?.lines[0]).toMatch(/envelope\.leanDeg/);
  });

  it('save writes the canonical text, clears the dirty marker and the recovery copy', async () => {
    const wb = demoWorkbench();
    const { files, state } = fakeFiles();
    const flow = new DocumentFlow(wb, files);
    await flow.start();
    wb.actions.perform(setCoordinate, { rowId: 'steering.pivot', axis: 'z', value: 111 });
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 50);
    expect(state.recovery).toBe(wb.document.getState().designText);
    expect(await flow.save()).toBe(true);
    expect(state.saved[0].text).toBe(designToText(wb.document.getState().design));
    expect(wb.document.getState().dirty).toBe(false);
    expect(state.recovery).toBeNull();
  });

  it('start-up offers to restore unsaved work, and restoring brings it back unsaved', async () => {
    const edited = demoDesign();
    edited.name = 'Edited before the crash';
    const wb = demoWorkbench();
    const { files, state } = fakeFiles();
    state.recovery = designToText(edited);
    const flow = new DocumentFlow(wb, files);
    await flow.start();
    expect(wb.ui.getState().recovery?.name).toBe('Edited before the crash');
    await flow.resolveRecovery(true);
    expect(wb.document.getState().design.name).toBe('Edited before the crash');
    expect(wb.document.getState().dirty).toBe(true);
  });

  it('a damaged recovery copy is reported, not loaded', async () => {
    const wb = demoWorkbench();
    const { files, state } = fakeFiles();
    state.recovery = '{"tiltsheet": 1';
    const flow = new DocumentFlow(wb, files);
    await flow.start();
    expect(wb.ui.getState().recovery?.problem).toMatch(/recovery copy/);
    expect(wb.document.getState().design.name).toMatch(/Heron/);
  });

  it('the browser service saves by download and remembers recent files', async () => {
    const downloads: string[] = [];
    const storage = new Map<string, string>();
    const svc = browserFileService({
      pickFile: async () => null,
      download: (_t, name) => downloads.push(name),
      location: { search: '' } as Location,
      storage: {
        getItem: (k: string) => storage.get(k) ?? null,
        setItem: (k: string, v: string) => void storage.set(k, v),
        removeItem: (k: string) => void storage.delete(k),
      } as Storage,
      fetch: (async () => new Response('')) as typeof fetch,
    });
    await svc.saveAs('{}', 'my design');
    expect(downloads).toEqual(['my design.tiltsheet']);
    expect((await svc.recent()).map((r) => r.label)).toEqual(['my design.tiltsheet']);
    expect((await svc.openRecent({ label: 'my design.tiltsheet', id: 'my design.tiltsheet' }))?.text).toBe('{}');
    await svc.writeRecovery('x');
    expect(await svc.readRecovery()).toBe('x');
  });
});
