/** The safety caution, always visible at the foot of the window (and in the About box). */
export const SAFETY_CAUTION =
  'Tiltbench is a design aid. Confirm every result by measurement and testing; local vehicle regulations and licensed engineering practice come first.';

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
