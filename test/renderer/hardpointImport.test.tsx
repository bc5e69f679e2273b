// The file menu's exchange commands: a hardpoint table imported through a dialog that lists
// exactly the points it moves and applies them as one undoable edit (nothing on error or
// cancel); the table and the 3D exports offered as files.
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { exportHardpointCsv } from '../../core/design/hardpointCsv';
import { FileMenu } from '../../renderer/app/FileMenu';
import { FlowProvider } from '../../renderer/app/flowContext';
import type { ExchangeFiles } from '../../renderer/files/exchangeFiles';
import { DocumentFlow } from '../../renderer/files/documentFlow';
import type { FileService } from '../../renderer/files/fileService';
import type { Workbench } from '../../renderer/state/workbench';
import { demoWorkbench, withWorkbench } from './helpers';

afterEach(cleanup);

interface Offered {
  data: string | Uint8Array;
  fileName: string;
  mime: string;
}

function fakeExchange(table: { fileName: string; text: string } | null) {
  const offered: Offered[] = [];
  const files: ExchangeFiles = {
    pickTable: async () => table,
    offer: (data, fileName, mime) => offered.push({ data, fileName, mime }),
  };
  return { files, offered };
}

function renderMenu(wb: Workbench, files: ExchangeFiles) {
  // The menu's design commands are not used here: a flow over no file service.
  const flow = new DocumentFlow(wb, {} as FileService);
  render(withWorkbench(wb, <FlowProvider flow={flow}><FileMenu exchange={files} /></FlowProvider>));
}

async function choose(testId: string) {
  fireEvent.click(screen.getByTestId('file-exchange'));
  await act(async () => {
    fireEvent.click(screen.getByTestId(testId));
  });
}

/** The demo's table with two points moved: one side of a mirrored pair and a single point. */
function tableWithTwoMoves(wb: Workbench): string {
  const csv = exportHardpointCsv(wb.document.getState().design);
  const moved = csv
    .replace('frontEnd.upper.outerJoint,right,-13.3,-313.7,330', 'frontEnd.upper.outerJoint,right,-10.3,-313.7,334')
    .replace('steering.pivot,centre,-75,0,107', 'steering.pivot,centre,-75,0,112');
  // The replacements must have hit (a typo here would make the test pass on an unchanged table).
  expect(moved.split('\n').filter((l, i) => l !== csv.split('\n')[i])).toHaveLength(2);
  return moved;
}

describe('import hardpoints (CSV) from the file menu', () => {
  it('lists exactly the two moved points with old and new positions, applies them as one edit, and one undo restores', async () => {
    const wb = demoWorkbench();
    const before = wb.document.getState().designText;
    const historyBefore = wb.document.getState().history.past.length;
    const { files } = fakeExchange({ fileName: 'edited.csv', text: tableWithTwoMoves(wb) });
    renderMenu(wb, files);
    await choose('file-import-hardpoints');

    const dialog = await screen.findByTestId('import-hardpoints');
    const rows = within(screen.getByTestId('import-changes')).getAllByRole('row').slice(1);
    expect(rows.map((r) => [r.dataset.point, r.dataset.side])).toEqual([
      ['frontEnd.upper.outerJoint', 'right'],
      ['steering.pivot', 'centre'],
    ]);
    const cells = (r: HTMLElement) => within(r).getAllByRole('cell').map((c) => c.textContent);
    expect(cells(rows[0])).toEqual(['right upper wishbone outer joint', 'right', '−13.30, −313.70, 330.00', '−10.30, −313.70, 334.00', '5.00']);
    expect(cells(rows[1]).slice(2)).toEqual(['−75.00, 0.00, 107.00', '−75.00, 0.00, 112.00', '5.00']);
    // Nothing is applied while the dialog asks.
    expect(wb.document.getState().designText).toBe(before);

    fireEvent.click(within(dialog).getByTestId('import-apply'));
    expect(screen.queryByTestId('import-hardpoints')).toBeNull();
    const d = wb.document.getState().design;
    // One side moved: the pair is written out as two sides, the other side as it was (mirrored).
    expect(d.frontEnd.upper.outerJoint).toEqual({ right: { x: -10.3, y: -313.7, z: 334 }, left: { x: -13.3, y: 313.7, z: 330 } });
    expect(d.steering.kind === 'bellCrank' && d.steering.pivot).toEqual({ x: -75, y: 0, z: 112 });
    expect(wb.document.getState().history.past).toHaveLength(historyBefore + 1);
    expect(wb.document.getState().history.past.at(-1)!.label).toMatch(/import hardpoints from edited\.csv \(2 points moved\)/);

    act(() => {
      wb.actions.undo();
    });
    expect(wb.document.getState().designText).toBe(before);
  });

  it('a malformed row shows its line:column and changes nothing', async () => {
    const wb = demoWorkbench();
    const before = wb.document.getState().designText;
    const lines = tableWithTwoMoves(wb).split('\n');
    const n = lines.findIndex((l) => l.startsWith('steering.pivot,'));
    lines[n] = 'steering.pivot,centre,-75,0,1o7';
    const { files } = fakeExchange({ fileName: 'bad.csv', text: lines.join('\n') });
    renderMenu(wb, files);
    await choose('file-import-hardpoints');

    const problems = await screen.findByTestId('import-problems');
    expect(problems.textContent).toContain(`bad.csv:${n + 1}:29: steering.pivot (centre) z_mm: expected a number in mm, found "1o7"`);
    expect(screen.getByTestId('import-hardpoints').textContent).toContain('Nothing was changed.');
    expect(screen.queryByTestId('import-apply')).toBeNull();
    fireEvent.click(screen.getByTestId('import-close'));
    expect(wb.document.getState().designText).toBe(before);
    expect(wb.document.getState().history.past).toHaveLength(0);
  });

  it('cancel changes nothing; a cancelled file choice opens no dialog', async () => {
    const wb = demoWorkbench();
    const before = wb.document.getState().designText;
    renderMenu(wb, fakeExchange({ fileName: 'edited.csv', text: tableWithTwoMoves(wb) }).files);
    await choose('file-import-hardpoints');
    fireEvent.click(await screen.findByTestId('import-cancel'));
    expect(wb.document.getState().designText).toBe(before);
    expect(wb.document.getState().history.past).toHaveLength(0);
    cleanup();
    renderMenu(wb, fakeExchange(null).files);
    await choose('file-import-hardpoints');
    expect(screen.queryByTestId('import-hardpoints')).toBeNull();
  });
});

describe('exports from the file menu', () => {
  it('offers the hardpoint table as CSV under the design\'s name', async () => {
    const wb = demoWorkbench();
    const { files, offered } = fakeExchange(null);
    renderMenu(wb, files);
    await choose('file-export-hardpoints');
    expect(offered).toEqual([{ data: exportHardpointCsv(wb.document.getState().design), fileName: 'heron-tilting-velomobile.hardpoints.csv', mime: 'text/csv' }]);
  });

  it('offers the pose and the lean sweep as .glb files (binary glTF header)', async () => {
    const wb = demoWorkbench();
    const { files, offered } = fakeExchange(null);
    renderMenu(wb, files);
    await choose('file-export-pose-glb');
    await choose('file-export-sweep-glb');
    // Both exports finish asynchronously (the exporter reads its blobs back): wait for the two offers.
    await act(async () => {
      await vi.waitFor(() => expect(offered).toHaveLength(2), { timeout: 20_000 });
    });
    expect(offered.map((o) => [o.fileName, o.mime]).sort()).toEqual([
      ['heron-tilting-velomobile.lean-sweep.glb', 'model/gltf-binary'],
      ['heron-tilting-velomobile.pose.glb', 'model/gltf-binary'],
    ]);
    for (const o of offered) expect(new TextDecoder().decode((o.data as Uint8Array).subarray(0, 4))).toBe('glTF');
    expect(wb.ui.getState().notice).toBeNull();
  }, 60_000);
});
