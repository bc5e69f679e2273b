/**
 * The selected hardpoint (picked in the view, a finding or a table) with its coordinates to
 * type, above the findings, so a point picked in the view is edited without leaving them; the
 * full table is a tab away.
 */
import { useMemo } from 'react';
import { useActions, useDocument, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { setCoordinate } from '../model/designActions';
import { AXES, hardpointRows, rowName } from '../model/hardpoints';
import { NumberField } from './NumberField';

export function SelectedPoint() {
  const design = useDocument((s) => s.design);
  const selection = useUi((s) => s.selection);
  const actions = useActions();
  const { ui } = useWorkbenchApi();
  const row = useMemo(() => (selection ? hardpointRows(design).find((r) => r.id === selection) : undefined), [design, selection]);
  if (!row) return null;
  const name = rowName(row);
  return (
    <section className="panel selected-point" aria-label={`Selected: ${name}`} data-testid="selected-point">
      <div className="selected-head">
        <span className="selected-name" title={name}>
          <span className="hint">Selected:</span> {name}
          {row.side !== null && row.linked ? <span className="hint"> (mirrored)</span> : null}
        </span>
        <button type="button" className="link-button" onClick={() => ui.setState({ fixColumn: 'hardpoints' })} data-testid="selected-in-table">
          in the table
        </button>
      </div>
      <div className="selected-fields">
        {AXES.map((axis) => (
          <NumberField key={axis} label={axis} unit="mm" value={row.value[axis]} onCommit={(v) => actions.perform(setCoordinate, { rowId: row.id, axis, value: v })} testId={`selected-${axis}`} />
        ))}
      </div>
    </section>
  );
}
