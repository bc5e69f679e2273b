/**
 * Which design paths the renderer may read and write, and the recent list.
 *
 * Write access is granted only to a path the user chose since the app started: in the open or
 * save dialog, or by naming it on the command line (this launch or a later one handed over by
 * the single-instance lock). A path reopened from the recent list was chosen in an earlier run,
 * perhaps by someone else or before the file was swapped, so it is granted for reading only;
 * saving to it asks the user again (a save dialog at that path) before anything is written.
 */
import { readFile } from 'node:fs/promises';
import { atomicWrite } from './atomicWrite';

export type DesignAccessLevel = 'read' | 'write';

const RECENT_LIMIT = 10;

export class DesignAccess {
  private readonly granted = new Map<string, DesignAccessLevel>();

  /** `recentFile`: the JSON list of recent paths (in the user-data folder). */
  constructor(private readonly recentFile: string) {}

  /** Records the user's choice of a path; a later read-only open never takes write access away. */
  grant(filePath: string, level: DesignAccessLevel): void {
    if (level === 'write' || !this.granted.has(filePath)) this.granted.set(filePath, level);
  }

  levelOf(filePath: string): DesignAccessLevel | null {
    return this.granted.get(filePath) ?? null;
  }

  /** The recent list, newest first; a missing or damaged list reads as empty. */
  async recent(): Promise<string[]> {
    try {
      const parsed: unknown = JSON.parse(await readFile(this.recentFile, 'utf8'));
      if (!Array.isArray(parsed)) return [];
      return parsed.filter((p): p is string => typeof p === 'string').slice(0, RECENT_LIMIT);
    } catch {
      return [];
    }
  }

  async isRecent(filePath: string): Promise<boolean> {
    return (await this.recent()).includes(filePath);
  }

  /**
   * Puts a path at the top of the recent list. Best effort: the design itself is already
   * read or written, and an unwritable list must not turn that into a failure.
   */
  async remember(filePath: string): Promise<void> {
    const list = [filePath, ...(await this.recent()).filter((p) => p !== filePath)].slice(0, RECENT_LIMIT);
    await atomicWrite(this.recentFile, JSON.stringify(list, null, 2)).catch(() => undefined);
  }
}
