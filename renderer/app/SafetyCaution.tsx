/** The safety caution, always visible at the foot of the window (and in the About box): core's one wording, as the CLI and the report print it. */
import { SAFETY_CAUTION } from '../../core/report/caution';

export { SAFETY_CAUTION };

export function SafetyCaution() {
  return (
    <footer className="caution" role="note" data-testid="safety-caution">
      <span className="caution-mark" aria-hidden="true">
        ⚠
      </span>{' '}
      {SAFETY_CAUTION}
    </footer>
  );
}
