/** Title, file commands, undo and redo, the dirty marker and About. */
import { useEffect } from 'react';
import { FileMenu } from './FileMenu';
import { useActions, useDocument } from './workbenchContext';

export function TopBar() {
  const name = useDocument((s) => s.design.name);
  const fileName = useDocument((s) => s.doc.fileName);
  const dirty = useDocument((s) => s.dirty);
  const canUndo = useDocument((s) => s.history.past.length > 0);
  const canRedo = useDocument((s) => s.history.future.length > 0);
  const undoLabel = useDocument((s) => s.history.past[s.history.past.length - 1]?.label);
  const redoLabel = useDocument((s) => s.history.future[s.history.future.length - 1]?.label);
  const actions = useActions();
  useEffect(() => {
    document.title = `${dirty ? '● ' : ''}${name} — Tiltbench`;
  }, [dirty, name]);
  return (
    <header className="topbar">
      <span className="brand">Tiltbench</span>
      <FileMenu />
      <span className="doc-title" data-testid="doc-title" title={fileName}>
        {dirty && (
          <span className="dirty-marker" data-testid="dirty-marker" title="Unsaved changes">
            ● unsaved
          </span>
        )}{' '}
        {name} <span className="file-name">— {fileName}</span>
      </span>
      <span className="spacer" />
      <button type="button" disabled={!canUndo} onClick={() => actions.undo()} title={undoLabel ? `Undo ${undoLabel} (Ctrl+Z)` : 'Nothing to undo'} data-testid="undo">
        Undo
      </button>
      <button type="button" disabled={!canRedo} onClick={() => actions.redo()} title={redoLabel ? `Redo ${redoLabel} (Ctrl+Shift+Z)` : 'Nothing to redo'} data-testid="redo">
        Redo
      </button>
      <button type="button" onClick={() => actions.setAboutOpen(true)} data-testid="about">
        About
      </button>
    </header>
  );
}
