/**
 * Asks before a hardpoint table is applied: the points it moves (old and new position, mm,
 * and how far), or the table's problems with line and column. Apply makes one undoable edit;
 * Cancel (or a table with problems) changes nothing.
 */
import { createPortal } from 'react-dom';
import type { Vec3Mm } from '../../core/design/types';
import { adoptDesign } from '../model/designActions';
import { fmt } from '../model/format';
import type { ImportPlan } from '../export/hardpointImport';
import { Modal } from './Dialogs';
import { useActions } from './workbenchContext';

const xyz = (p: Vec3Mm) => `${fmt(p.x, 2)}, ${fmt(p.y, 2)}, ${fmt(p.z, 2)}`;

/** Rendered into the page's body: the menu that opens it sits in the top bar, whose layout containment would hold a fixed backdrop inside the bar. */
export function HardpointImportDialog(props: { plan: ImportPlan; onClose: () => void }) {
  return createPortal(<ImportDialogBody {...props} />, document.body);
}

function ImportDialogBody({ plan, onClose }: { plan: ImportPlan; onClose: () => void }) {
  const actions = useActions();
  if (!plan.ok) {
    return (
      <Modal title={`Could not import ${plan.fileName}`} onClose={onClose} testId="import-hardpoints" kind="error">
        <ul className="notice-lines import-problems" data-testid="import-problems">
          {plan.problems.map((p, i) => (
            <li key={i}>{p.message}</li>
          ))}
        </ul>
        <p className="hint">Nothing was changed.</p>
        <div className="modal-buttons">
          <button type="button" data-autofocus onClick={onClose} data-testid="import-close">
            OK
          </button>
        </div>
      </Modal>
    );
  }
  const apply = () => {
    const n = plan.changes.length;
    actions.perform(adoptDesign, { design: plan.design, label: `import hardpoints from ${plan.fileName} (${n} point${n === 1 ? '' : 's'} moved)` });
    onClose();
  };
  return (
    <Modal title={`Import hardpoints from ${plan.fileName}`} onClose={onClose} testId="import-hardpoints">
      {plan.changes.length === 0 ? (
        <p data-testid="import-no-change">The table holds the hardpoints the design already has: nothing to change.</p>
      ) : (
        <>
          <p>
            {plan.changes.length} point{plan.changes.length === 1 ? '' : 's'} move (x, y, z in mm, ISO 8855):
          </p>
          <table className="import-changes" data-testid="import-changes">
            <thead>
              <tr>
                <th>point</th>
                <th>side</th>
                <th>now</th>
                <th>from the table</th>
                <th>moved, mm</th>
              </tr>
            </thead>
            <tbody>
              {plan.changes.map((c) => (
                <tr key={`${c.point} ${c.side}`} data-point={c.point} data-side={c.side}>
                  <td title={c.point}>{c.words}</td>
                  <td>{c.side}</td>
                  <td>{xyz(c.before)}</td>
                  <td>{xyz(c.after)}</td>
                  <td className="num">{fmt(c.movedMm, 2)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
      <div className="modal-buttons">
        <button type="button" onClick={onClose} data-testid="import-cancel">
          Cancel
        </button>
        {plan.changes.length > 0 && (
          <button type="button" className="primary" data-autofocus onClick={apply} data-testid="import-apply">
            Apply as one edit
          </button>
        )}
      </div>
    </Modal>
  );
}
