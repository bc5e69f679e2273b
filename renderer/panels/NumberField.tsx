/**
 * A number entry that commits on Enter or when it loses focus, reverts on Escape, and says
 * what is wrong next to the field: its own parse errors, or the design validator's issues.
 */
import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { fmt } from '../model/format';

export interface NumberFieldProps {
  value: number;
  onCommit(value: number): void;
  /** Names the field in messages and for assistive technology. */
  label: string;
  unit: string;
  /** Shown next to the input when set (e.g. the validator's message). */
  error?: string | undefined;
  digits?: number;
  min?: number;
  max?: number;
  disabled?: boolean;
  testId?: string;
  className?: string;
  /** Hide the visible label (tables give it in a header). */
  compact?: boolean;
  /** Mark the field invalid without showing a message (the parent shows it). */
  invalid?: boolean;
  /** When given, the field's own parse errors go here instead of under the field. */
  onLocalError?(message: string | null): void;
}

/** Parses what people type: a true minus sign or a decimal comma is accepted. */
export function parseNumberText(text: string): number | null {
  const t = text.trim().replace(/\u2212/g, '-').replace(',', '.');
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
}

/** The number typed in a field, or what is wrong with it (naming the field and its unit). */
export function readNumberField(text: string, f: Pick<NumberFieldProps, 'label' | 'unit' | 'min' | 'max'>): number | string {
  const n = parseNumberText(text);
  if (n === null) return `${f.label}: “${text.trim() || '(empty)'}” is not a number; enter a value in ${f.unit || 'plain numbers'}`;
  if (f.min !== undefined && n < f.min) return `${f.label}: ${n} ${f.unit} is below the least allowed, ${f.min} ${f.unit}`;
  if (f.max !== undefined && n > f.max) return `${f.label}: ${n} ${f.unit} is above the most allowed, ${f.max} ${f.unit}`;
  return n;
}

function show(value: number, digits: number | undefined): string {
  if (!Number.isFinite(value)) return String(value);
  if (digits === undefined) return String(value);
  return fmt(value, digits).replace('−', '-');
}

export function NumberField(p: NumberFieldProps) {
  const [draft, setDraft] = useState<string | null>(null);
  /** The field's own complaint, about the value it was showing when made. */
  const [complaint, setComplaint] = useState<{ message: string; about: number } | null>(null);
  const id = useId();
  const errId = `${id}-err`;
  const input = useRef<HTMLInputElement>(null);
  const shown = draft ?? show(p.value, p.digits);

  // When the value changes from elsewhere (undo, a slider), the old complaint no longer applies.
  const localError = complaint !== null && Object.is(complaint.about, p.value) ? complaint.message : null;
  const setLocalError = (message: string | null) => setComplaint(message === null ? null : { message, about: p.value });
  const { onLocalError } = p;
  useEffect(() => {
    onLocalError?.(localError);
  }, [localError, onLocalError]);

  const commit = () => {
    if (draft === null) return;
    const read = readNumberField(draft, p);
    if (typeof read === 'string') {
      setLocalError(read);
      return;
    }
    setLocalError(null);
    setDraft(null);
    if (read !== p.value) p.onCommit(read);
  };

  const onKey = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Enter') {
      e.preventDefault();
      commit();
    } else if (e.key === 'Escape') {
      setDraft(null);
      setLocalError(null);
    }
  };

  const error = (p.onLocalError ? null : localError) ?? p.error;
  return (
    <span className={`number-field ${error || localError || p.invalid ? 'has-error' : ''} ${p.className ?? ''}`}>
      {!p.compact && (
        <label htmlFor={id} className="nf-label">
          {p.label}
        </label>
      )}
      <span className="nf-box">
        <input
          ref={input}
          id={id}
          type="text"
          inputMode="decimal"
          spellCheck={false}
          autoComplete="off"
          value={shown}
          disabled={p.disabled}
          aria-label={`${p.label} (${p.unit || 'number'})`}
          aria-invalid={error || localError || p.invalid ? true : undefined}
          data-draft={draft !== null ? 'true' : undefined}
          aria-describedby={error ? errId : undefined}
          data-testid={p.testId}
          onChange={(e) => setDraft(e.target.value)}
          onBlur={commit}
          onKeyDown={onKey}
        />
        {p.unit && <span className="nf-unit">{p.unit}</span>}
      </span>
      {error && (
        <span id={errId} className="field-error" role="alert">
          {error}
        </span>
      )}
    </span>
  );
}
