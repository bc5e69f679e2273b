/**
 * Open, new, save, save as, recent, autosave and recovery, in terms of the workbench's
 * document and UI stores and a file service. Nothing the user made is lost: a file that does not read leaves the
 * current design as it was, and every unsaved edit is autosaved to the recovery copy.
 */
import { parseDesignText, type DesignIssue } from '../../core/design/validateDesign';
import type { DesignFile } from '../../core/design/types';
import { DEMO_DESIGNS, DEFAULT_DEMO } from '../model/demoDesigns';
import { designToText, suggestedFileName } from '../model/designText';
import { askConfirm } from '../state/uiStore';
import type { Workbench } from '../state/workbench';
import type { FileService, OpenedFile, OpenRequestResult, RecentEntry } from './fileService';

/** Quiet time after the last edit before the recovery copy is written, ms. */
export const AUTOSAVE_DELAY_MS = 700;
const MAX_LISTED_ISSUES = 12;

function issueLines(issues: DesignIssue[]): string[] {
  const lines = issues.slice(0, MAX_LISTED_ISSUES).map((i) => (i.line !== undefined ? `${i.message} (line ${i.line}, column ${i.column})` : i.message));
  if (issues.length > MAX_LISTED_ISSUES) lines.push(`… and ${issues.length - MAX_LISTED_ISSUES} more.`);
  return lines;
}

function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

export class DocumentFlow {
  private autosaveTimer: ReturnType<typeof setTimeout> | undefined;
  private autosaveOn = false;
  private lastRecoveryText: string | null = null;

  constructor(
    readonly wb: Workbench,
    readonly files: FileService,
  ) {}

  private notify(kind: 'error' | 'info', title: string, lines: string[]): void {
    this.wb.actions.showNotice({ kind, title, lines });
  }

  /** Asks before dropping unsaved changes. */
  private async mayReplace(what: string): Promise<boolean> {
    const s = this.wb.document.getState();
    if (!s.dirty) return true;
    return askConfirm(this.wb.ui, {
      title: 'Unsaved changes',
      text: `“${s.design.name}” has changes that are not saved. ${what} anyway? (A recovery copy is kept until you edit the next design.)`,
      confirmLabel: `Discard changes and ${what.toLowerCase()}`,
      cancelLabel: 'Keep editing',
    });
  }

  /** Reads a file's text into the workbench, or explains why not and keeps the current design. */
  loadText(file: OpenedFile): boolean {
    const parsed = parseDesignText(file.text, file.fileName);
    if (!parsed.ok) {
      this.notify('error', `Could not open ${file.fileName}`, [
        ...issueLines(parsed.issues),
        'Nothing was changed: the design you had open is still here.',
      ]);
      return false;
    }
    this.wb.actions.loadDesign(parsed.design, { fileName: file.fileName, filePath: file.path, savedText: designToText(parsed.design) });
    return true;
  }

  async open(): Promise<void> {
    if (!(await this.mayReplace('Open another design'))) return;
    try {
      const file = await this.files.open();
      if (file) this.loadText(file);
    } catch (e) {
      this.notify('error', 'Could not open the file', [errorText(e), 'Nothing was changed: the design you had open is still here.']);
    }
  }

  async openRecent(entry: RecentEntry): Promise<void> {
    if (!(await this.mayReplace('Open another design'))) return;
    try {
      const file = await this.files.openRecent(entry);
      if (file) this.loadText(file);
      else this.notify('error', `Could not open ${entry.label}`, ['It is no longer in the recent list.']);
    } catch (e) {
      this.notify('error', `Could not open ${entry.label}`, [errorText(e), 'Nothing was changed.']);
    }
  }

  /**
   * Opens each design a later launch of the app hands to this window (Electron's single
   * instance), asking first if there are unsaved changes. Stops if the shell refuses to answer.
   */
  private async followOpenRequests(next: () => Promise<OpenRequestResult>): Promise<void> {
    for (;;) {
      let request: OpenRequestResult;
      try {
        request = await next();
      } catch {
        return;
      }
      if ('problem' in request) {
        this.notify('error', `Could not open ${request.fileName}`, [request.problem, 'Nothing was changed.']);
      } else if (await this.mayReplace('Open another design')) {
        this.loadText(request.file);
      }
    }
  }

  async newDesign(starterId: string): Promise<void> {
    const starter = DEMO_DESIGNS.find((d) => d.id === starterId) ?? DEFAULT_DEMO;
    if (!(await this.mayReplace('Start a new design'))) return;
    const parsed = parseDesignText(starter.text, starter.fileName);
    if (!parsed.ok) return;
    const design: DesignFile = { ...parsed.design, name: 'Untitled design', notes: `Started from ${starter.fileName}.` };
    this.wb.actions.loadDesign(design, { fileName: 'untitled.tiltsheet', filePath: null, savedText: designToText(design) });
  }

  async save(as = false): Promise<boolean> {
    const s = this.wb.document.getState();
    const text = s.designText;
    const fileName = s.doc.filePath === null && s.doc.fileName === 'untitled.tiltsheet' ? suggestedFileName(s.design) : s.doc.fileName;
    try {
      const result = as ? await this.files.saveAs(text, fileName) : await this.files.save(text, { fileName, path: s.doc.filePath });
      if (!result) return false;
      this.wb.actions.markSaved(text, { fileName: result.fileName, filePath: result.path });
      await this.files.clearRecovery();
      this.lastRecoveryText = null;
      return true;
    } catch (e) {
      this.notify('error', 'Could not save', [errorText(e), 'Your design is still open and unchanged; the recovery copy keeps your edits.']);
      return false;
    }
  }

  /**
   * Start-up: the design named on the command line or in the address, else the bundled
   * demo; then an offer to restore unsaved work from the last session.
   */
  async start(): Promise<void> {
    const nextOpenRequest = this.files.nextOpenRequest?.bind(this.files);
    if (nextOpenRequest) void this.followOpenRequests(nextOpenRequest);
    try {
      const initial = await this.files.initialDesign();
      if (initial) this.loadText(initial);
    } catch (e) {
      this.notify('error', 'Could not open the design you asked for', [errorText(e), 'Showing the demo design instead.']);
    }
    let recovered: string | null = null;
    try {
      recovered = await this.files.readRecovery();
    } catch {
      recovered = null;
    }
    if (recovered !== null && recovered !== this.wb.document.getState().designText) {
      const parsed = parseDesignText(recovered, 'recovery copy');
      this.wb.actions.setRecovery({
        text: recovered,
        name: parsed.ok ? parsed.design.name : null,
        problem: parsed.ok ? null : issueLines(parsed.issues).join(' '),
      });
      return; // autosave starts once the user has decided
    }
    this.startAutosave();
  }

  /** The user's answer to the recovery offer. */
  async resolveRecovery(restore: boolean): Promise<void> {
    const offer = this.wb.ui.getState().recovery;
    this.wb.actions.setRecovery(null);
    if (offer && restore) {
      const parsed = parseDesignText(offer.text, 'recovery copy');
      if (parsed.ok) {
        this.wb.actions.loadDesign(parsed.design, { fileName: suggestedFileName(parsed.design), filePath: null, savedText: null });
      }
    } else if (offer) {
      await this.files.clearRecovery().catch(() => undefined);
    }
    this.startAutosave();
  }

  /** Writes the recovery copy shortly after each edit while there are unsaved changes. */
  startAutosave(): void {
    if (this.autosaveOn) return;
    this.autosaveOn = true;
    const schedule = () => {
      clearTimeout(this.autosaveTimer);
      this.autosaveTimer = setTimeout(() => void this.flushAutosave(), AUTOSAVE_DELAY_MS);
    };
    this.wb.document.subscribe((s, prev) => {
      if (s.designText !== prev.designText || s.dirty !== prev.dirty) schedule();
    });
    if (this.wb.document.getState().dirty) schedule();
  }

  async flushAutosave(): Promise<void> {
    clearTimeout(this.autosaveTimer);
    const s = this.wb.document.getState();
    try {
      if (s.dirty) {
        if (s.designText === this.lastRecoveryText) return;
        await this.files.writeRecovery(s.designText);
        this.lastRecoveryText = s.designText;
      } else if (this.lastRecoveryText !== null) {
        await this.files.clearRecovery();
        this.lastRecoveryText = null;
      }
    } catch (e) {
      this.notify('error', 'Autosave failed', [errorText(e), 'Save your design to a file to keep your changes.']);
    }
  }
}
