// The renderer's side of the Electron file API (renderer/files/): a save that main answered
// with another path or a cancelled dialog, and designs handed over by a later launch of the app,
// through a fake `window.tiltbench` and a real workbench on a demo design.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { parseDesignText } from '../../core/design/validateDesign';
import type { OpenRequest, TiltbenchApi } from '../../electron/api';
import { DocumentFlow } from '../../renderer/files/documentFlow';
import { electronFileService } from '../../renderer/files/fileService';
import { designToText } from '../../renderer/model/designText';
import { createWorkbench, type Workbench } from '../../renderer/state/workbench';

const DEMO = 'heron-tilting-velomobile';
const demoText = readFileSync(path.join(process.cwd(), 'assets', 'designs', `${DEMO}.tiltsheet`), 'utf8');

function workbench(): Workbench {
  const parsed = parseDesignText(demoText, `${DEMO}.tiltsheet`);
  if (!parsed.ok) throw new Error('demo does not parse');
  return createWorkbench(parsed.design, { fileName: `${DEMO}.tiltsheet`, filePath: null, savedText: designToText(parsed.design) });
}

/** A design text that differs from the demo only by its name. */
function renamedDemo(name: string): string {
  const json = JSON.parse(demoText) as { name: string };
  json.name = name;
  return JSON.stringify(json);
}

/** A fake preload API whose open requests the test hands over one at a time. */
function fakeApi(over: Partial<TiltbenchApi> = {}) {
  const requests: ((r: OpenRequest) => void)[] = [];
  let refuse: ((e: Error) => void) | null = null;
  const api: TiltbenchApi = {
    openDesign: async () => null,
    initialDesign: async () => null,
    saveDesign: async (p) => p,
    saveDesignAs: async () => null,
    writeRecovery: async () => undefined,
    readRecovery: async () => null,
    clearRecovery: async () => undefined,
    recentDesigns: async () => [],
    openRecentDesign: async () => null,
    nextOpenRequest: () =>
      new Promise<OpenRequest>((resolve, reject) => {
        requests.push(resolve);
        refuse = reject;
      }),
    saveReportPdf: async () => null,
    ...over,
  } as TiltbenchApi;
  const handOver = async (r: OpenRequest): Promise<void> => {
    await vi.waitFor(() => expect(requests.length).toBeGreaterThan(0));
    requests.shift()!(r);
  };
  return { api, handOver, waiting: () => requests.length, refuse: (e: Error) => refuse?.(e) };
}

describe('Electron file service: save', () => {
  it('keeps the path main wrote, which the user may have changed, and reports a cancelled dialog', async () => {
    const answers: (string | null)[] = ['/designs/other.tiltsheet', null];
    const { api } = fakeApi({ saveDesign: async () => answers.shift() ?? null });
    const files = electronFileService(api);
    expect(await files.save('{}', { fileName: 'trike.tiltsheet', path: '/designs/trike.tiltsheet' })).toEqual({
      fileName: 'other.tiltsheet',
      path: '/designs/other.tiltsheet',
    });
    expect(await files.save('{}', { fileName: 'trike.tiltsheet', path: '/designs/trike.tiltsheet' })).toBeNull();
  });

  it('a cancelled confirmation leaves the design unsaved and the recovery copy in place', async () => {
    const cleared = vi.fn(async () => undefined);
    const { api } = fakeApi({ saveDesign: async () => null, clearRecovery: cleared });
    const wb = workbench();
    wb.actions.loadDesign(wb.document.getState().design, { fileName: 'trike.tiltsheet', filePath: '/d/trike.tiltsheet', savedText: null });
    const flow = new DocumentFlow(wb, electronFileService(api));
    expect(await flow.save()).toBe(false);
    expect(wb.document.getState().dirty).toBe(true);
    expect(cleared).not.toHaveBeenCalled();
  });
});

describe('designs handed over by a later launch', () => {
  it('opens in this window, asking first when there are unsaved changes', async () => {
    const fake = fakeApi();
    const wb = workbench();
    const flow = new DocumentFlow(wb, electronFileService(fake.api));
    await flow.start();

    await fake.handOver({ path: '/d/first.tiltsheet', text: renamedDemo('First handed') });
    await vi.waitFor(() => expect(wb.document.getState().design.name).toBe('First handed'));
    expect(wb.document.getState().doc.filePath).toBe('/d/first.tiltsheet');

    // Unsaved changes: the user is asked; "keep editing" keeps them.
    wb.actions.loadDesign(wb.document.getState().design, { fileName: 'first.tiltsheet', filePath: '/d/first.tiltsheet', savedText: null });
    await fake.handOver({ path: '/d/second.tiltsheet', text: renamedDemo('Second handed') });
    await vi.waitFor(() => expect(wb.ui.getState().confirm).not.toBeNull());
    wb.ui.getState().confirm!.resolve(false);
    await vi.waitFor(() => expect(fake.waiting()).toBe(1)); // listening again
    expect(wb.document.getState().design.name).toBe('First handed');

    // A file main could not read: a notice, and the design stays.
    await fake.handOver({ path: '/d/gone.tiltsheet', problem: 'ENOENT: no such file' });
    await vi.waitFor(() => expect(wb.ui.getState().notice?.title).toBe('Could not open gone.tiltsheet'));
    expect(wb.document.getState().design.name).toBe('First handed');
  });

  it('stops listening when main refuses to answer, instead of asking again in a loop', async () => {
    const fake = fakeApi();
    const next = vi.spyOn(fake.api, 'nextOpenRequest');
    const flow = new DocumentFlow(workbench(), electronFileService(fake.api));
    await flow.start();
    await vi.waitFor(() => expect(fake.waiting()).toBe(1));
    fake.refuse(new Error('design:openRequest: call from an unexpected page'));
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(next).toHaveBeenCalledTimes(1);
  });
});
