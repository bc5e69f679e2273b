/**
 * The design sheet's field rows: a number, a choice, a vector, a per-side number, each bound
 * to a path of the design (every edit an undoable action) and showing the validator's
 * message for that path; and the collapsible section they sit in.
 */
import type { ReactNode } from 'react';
import { isTwoSided } from '../../core/design/resolveDesign';
import type { DesignIssue } from '../../core/design/validateDesign';
import type { Sided } from '../../core/design/types';
import { useActions, useDocument, usePose } from '../app/workbenchContext';
import { setField } from '../model/designActions';
import { getAt, parsePath } from '../model/designPath';
import { issuesAt } from '../model/fieldIssues';
import { NumberField } from './NumberField';

function useField(path: string): { value: unknown; issues: DesignIssue[] } {
  const value = useDocument((s) => getAt(s.design, parsePath(path)));
  const all = usePose((s) => s.issues);
  return { value, issues: issuesAt(all, path) };
}

export function Num({ path, label, unit, fallback, digits }: { path: string; label: string; unit: string; fallback?: number; digits?: number }) {
  const { value, issues } = useField(path);
  const actions = useActions();
  const shown = typeof value === 'number' ? value : (fallback ?? NaN);
  return (
    <div className="sheet-row">
      <NumberField
        label={label}
        unit={unit}
        value={shown}
        digits={digits}
        error={issues.map((i) => i.message).join(' ') || undefined}
        onCommit={(v) => actions.perform(setField, { path, value: v, label: `edit ${label.toLowerCase()}` })}
        testId={`field-${path}`}
      />
      {value === undefined && fallback !== undefined && <span className="hint default-note">default</span>}
    </div>
  );
}

export function Choice<T extends string>({ path, label, options, onPick }: { path: string; label: string; options: { value: T; label: string }[]; onPick?: (v: T) => void }) {
  const { value, issues } = useField(path);
  const actions = useActions();
  return (
    <div className="sheet-row">
      <label className="choice">
        <span className="nf-label">{label}</span>
        <select
          value={String(value)}
          data-testid={`field-${path}`}
          onChange={(e) => {
            const v = e.target.value as T;
            if (onPick) onPick(v);
            else actions.perform(setField, { path, value: v, label: `set ${label.toLowerCase()}` });
          }}
        >
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      </label>
      {issues.length > 0 && <span className="field-error" role="alert">{issues.map((i) => i.message).join(' ')}</span>}
    </div>
  );
}

export function Vec({ path, label, unit }: { path: string; label: string; unit: string }) {
  const { issues } = useField(path);
  return (
    <div className="sheet-row vec-row">
      <span className="nf-label">{label}</span>
      <span className="vec-fields">
        {(['x', 'y', 'z'] as const).map((a) => (
          <VecPart key={a} path={`${path}.${a}`} label={`${label} ${a}`} unit={unit} />
        ))}
      </span>
      {issues.length > 0 && <span className="field-error" role="alert">{issues.map((i) => i.message).join(' ')}</span>}
    </div>
  );
}

function VecPart({ path, label, unit }: { path: string; label: string; unit: string }) {
  const value = useDocument((s) => getAt(s.design, parsePath(path)));
  const actions = useActions();
  return (
    <NumberField
      compact
      label={label}
      unit={unit}
      value={typeof value === 'number' ? value : NaN}
      onCommit={(v) => actions.perform(setField, { path, value: v, label: `edit ${label.toLowerCase()}` })}
      testId={`field-${path}`}
    />
  );
}

/** A per-side number (toe, camber): one value for both sides, or one per side. */
export function SidedNum({ path, label, unit }: { path: string; label: string; unit: string }) {
  const { value } = useField(path);
  const actions = useActions();
  const raw = value as Sided<number>;
  const two = typeof raw === 'object' && raw !== null && isTwoSided(raw);
  return (
    <div className="sheet-row">
      {two ? (
        <span className="sided">
          <Num path={`${path}.right`} label={`${label}, right`} unit={unit} />
          <Num path={`${path}.left`} label={`${label}, left`} unit={unit} />
          <button type="button" className="link-toggle" onClick={() => actions.perform(setField, { path, value: raw.right, label: `use the right ${label.toLowerCase()} on both sides` })}>
            ⇋ same both sides
          </button>
        </span>
      ) : (
        <span className="sided">
          <Num path={path} label={`${label} (both sides)`} unit={unit} />
          <button
            type="button"
            className="link-toggle"
            onClick={() => actions.perform(setField, { path, value: { right: raw, left: raw }, label: `set ${label.toLowerCase()} per side` })}
          >
            per side
          </button>
        </span>
      )}
    </div>
  );
}

export function Section({ title, children, open = false }: { title: string; children: ReactNode; open?: boolean }) {
  return (
    <details className="sheet-section" open={open}>
      <summary>{title}</summary>
      <div className="sheet-body">{children}</div>
    </details>
  );
}
