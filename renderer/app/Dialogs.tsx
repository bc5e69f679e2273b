/** Modal dialogs: notices (errors), confirmations, the recovery offer, "New", About. */
import { useEffect, useRef, type ReactNode } from 'react';
import { DEMO_DESIGNS } from '../model/demoDesigns';
import { useFlow } from './flowContext';
import { SAFETY_CAUTION } from './SafetyCaution';
import { useActions, useUi, useWorkbenchApi } from './workbenchContext';

const VERSION = '0.1.0';

export function Modal({ title, children, onClose, testId, kind = 'info' }: { title: string; children: ReactNode; onClose?: () => void; testId: string; kind?: 'info' | 'error' }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    box.current?.querySelector<HTMLElement>('[data-autofocus]')?.focus();
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape' && onClose) onClose();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [onClose]);
  return (
    <div className="modal-backdrop">
      <div ref={box} className={`modal modal-${kind}`} role={kind === 'error' ? 'alertdialog' : 'dialog'} aria-modal="true" aria-label={title} data-testid={testId}>
        <h2>{title}</h2>
        {children}
      </div>
    </div>
  );
}

export function Dialogs() {
  return (
    <>
      <RecoveryDialog />
      <NoticeDialog />
      <ConfirmDialog />
      <NewDesignDialog />
      <AboutDialog />
    </>
  );
}

function NoticeDialog() {
  const notice = useUi((s) => s.notice);
  const actions = useActions();
  if (!notice) return null;
  const close = () => actions.showNotice(null);
  return (
    <Modal title={notice.title} onClose={close} testId="notice" kind={notice.kind}>
      <ul className="notice-lines">
        {notice.lines.map((l, i) => (
          <li key={i}>{l}</li>
        ))}
      </ul>
      <div className="modal-buttons">
        <button type="button" data-autofocus onClick={close} data-testid="notice-ok">
          OK
        </button>
      </div>
    </Modal>
  );
}

function ConfirmDialog() {
  const req = useUi((s) => s.confirm);
  if (!req) return null;
  return (
    <Modal title={req.title} onClose={() => req.resolve(false)} testId="confirm">
      <p>{req.text}</p>
      <div className="modal-buttons">
        <button type="button" data-autofocus onClick={() => req.resolve(false)}>
          {req.cancelLabel ?? 'Cancel'}
        </button>
        <button type="button" className="danger" onClick={() => req.resolve(true)} data-testid="confirm-ok">
          {req.confirmLabel}
        </button>
      </div>
    </Modal>
  );
}

function RecoveryDialog() {
  const offer = useUi((s) => s.recovery);
  const flow = useFlow();
  if (!offer) return null;
  return (
    <Modal title="Restore unsaved work?" testId="recovery">
      {offer.problem === null ? (
        <p>
          The last session ended with unsaved changes to <strong>{offer.name}</strong>. Restore them? (Discarding deletes the recovery copy.)
        </p>
      ) : (
        <p>
          A recovery copy from the last session exists but cannot be read: {offer.problem}. Save a copy of it to look at later, or
          continue without it (it is then deleted).
        </p>
      )}
      <div className="modal-buttons">
        {offer.problem === null ? (
          <>
            <button type="button" onClick={() => void flow.resolveRecovery(false)} data-testid="recovery-discard">
              Discard
            </button>
            <button type="button" data-autofocus className="primary" onClick={() => void flow.resolveRecovery(true)} data-testid="recovery-restore">
              Restore
            </button>
          </>
        ) : (
          <>
            <button type="button" onClick={() => void flow.files.saveAs(offer.text, 'recovery-copy.tiltsheet').catch(() => null)} data-testid="recovery-save-copy">
              Save a copy…
            </button>
            <button type="button" data-autofocus onClick={() => void flow.resolveRecovery(false)} data-testid="recovery-discard">
              Continue without it
            </button>
          </>
        )}
      </div>
    </Modal>
  );
}

function NewDesignDialog() {
  const open = useUi((s) => s.newDialogOpen);
  const { ui } = useWorkbenchApi();
  const flow = useFlow();
  if (!open) return null;
  const close = () => ui.setState({ newDialogOpen: false });
  return (
    <Modal title="New design" onClose={close} testId="new-design">
      <p>Start from one of these layouts; every point can be moved afterwards.</p>
      <ul className="starter-list">
        {DEMO_DESIGNS.map((d) => (
          <li key={d.id}>
            <button
              type="button"
              onClick={() => {
                close();
                void flow.newDesign(d.id);
              }}
            >
              {d.starter}
            </button>
          </li>
        ))}
      </ul>
      <div className="modal-buttons">
        <button type="button" data-autofocus onClick={close}>
          Cancel
        </button>
      </div>
    </Modal>
  );
}

function AboutDialog() {
  const open = useUi((s) => s.aboutOpen);
  const actions = useActions();
  if (!open) return null;
  const close = () => actions.setAboutOpen(false);
  return (
    <Modal title="About Tiltbench" onClose={close} testId="about-dialog">
      <p>
        Tiltbench {VERSION} — a workbench for the steering and suspension kinematics of tilting (and non-tilting) multi-track vehicles.
      </p>
      <p className="about-caution" role="note">
        <strong>Safety:</strong> {SAFETY_CAUTION} Steering and suspension are safety-critical: welded and bolted parts need proper engineering.
      </p>
      <p>
        Units: lengths in mm, angles in degrees. Axes as ISO 8855: x forward, y left, z up; positive lean lowers the right side (a right turn);
        positive handlebar steers left; toe-in and camber top-outward are positive.
      </p>
      <p>
        Keys: Ctrl+Z undo, Ctrl+Shift+Z or Ctrl+Y redo, Ctrl+O open, Ctrl+S save, Ctrl+Shift+S save as, Esc deselect. Double-click a slider
        to return it to zero.
      </p>
      <p>MIT licence. Built with React, three.js (via @react-three/fiber and drei), ECharts and zustand.</p>
      <div className="modal-buttons">
        <button type="button" data-autofocus onClick={close} data-testid="about-close">
          Close
        </button>
      </div>
    </Modal>
  );
}
