/** File commands: New, Open, Save, Save as, Recent. */
import { useEffect, useState } from 'react';
import type { RecentEntry } from '../files/fileService';
import { useFlow } from './flowContext';
import { useWorkbenchApi } from './workbenchContext';

export function FileMenu() {
  const flow = useFlow();
  const { ui } = useWorkbenchApi();
  const [recent, setRecent] = useState<RecentEntry[] | null>(null);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey)) return;
      const k = e.key.toLowerCase();
      if (k === 's') {
        e.preventDefault();
        void flow.save(e.shiftKey);
      } else if (k === 'o') {
        e.preventDefault();
        void flow.open();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [flow]);

  const showRecent = async () => {
    if (recent) {
      setRecent(null);
      return;
    }
    setRecent(await flow.files.recent().catch(() => []));
  };

  return (
    <nav className="file-menu" aria-label="File">
      <button type="button" onClick={() => ui.setState({ newDialogOpen: true })} data-testid="file-new">
        New
      </button>
      <button type="button" onClick={() => void flow.open()} title="Open a design (Ctrl+O)" data-testid="file-open">
        Open…
      </button>
      <button type="button" onClick={() => void flow.save(false)} title="Save (Ctrl+S)" data-testid="file-save">
        Save
      </button>
      <button type="button" onClick={() => void flow.save(true)} title="Save under a new name (Ctrl+Shift+S)" data-testid="file-save-as">
        Save as…
      </button>
      <span className="recent-wrap">
        <button type="button" aria-expanded={recent !== null} onClick={() => void showRecent()} data-testid="file-recent">
          Recent ▾
        </button>
        {recent && (
          <ul className="recent-list" role="menu">
            {recent.length === 0 && <li className="hint">No recent designs yet.</li>}
            {recent.map((r) => (
              <li key={r.id} role="none">
                <button
                  type="button"
                  role="menuitem"
                  title={r.id}
                  onClick={() => {
                    setRecent(null);
                    void flow.openRecent(r);
                  }}
                >
                  {r.label}
                </button>
              </li>
            ))}
          </ul>
        )}
      </span>
    </nav>
  );
}
