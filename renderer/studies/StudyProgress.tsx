/** A study's progress bar with its elapsed time and a Cancel button, or its failure in words. */
import { useEffect, useState } from 'react';
import type { StudyJobState } from './useStudyJob';

export function StudyProgress<T>({ state, what, onCancel }: { state: StudyJobState<T>; what: string; onCancel(): void }) {
  // The clock is read in an interval (rendering stays pure); it shows whole seconds.
  const [now, setNow] = useState(0);
  const running = state.phase === 'running';
  useEffect(() => {
    if (!running) return;
    const t = setInterval(() => setNow(Date.now()), 500);
    return () => clearInterval(t);
  }, [running]);
  if (state.phase === 'running') {
    const seconds = Math.max(0, (now - state.startedAt) / 1000);
    return (
      <div className="study-progress" data-testid={`${what}-progress`}>
        <progress max={state.total} value={state.done} aria-label={`${what} progress`} />
        <span className="hint">{seconds.toFixed(0)} s</span>
        <button type="button" onClick={onCancel}>
          Cancel
        </button>
      </div>
    );
  }
  if (state.phase === 'failed') {
    return (
      <p className="field-error" role="alert" data-testid={`${what}-failed`}>
        The {what} could not run: {state.message}
      </p>
    );
  }
  return null;
}

/** "from before your last edit" beside a result that no longer describes the design on screen. */
export function StaleNote({ stale }: { stale: boolean }) {
  if (!stale) return null;
  return <p className="hint is-stale">This result is from before your last edit: run it again.</p>;
}
