/**
 * The crash-recovery autosave, one file per running instance of the app
 * (`<user data>/recovery/recovery-<instance>.tiltsheet`), so no instance ever writes or
 * deletes another's copy.
 *
 * At start the renderer reads a copy: its own if it has one (the page was reloaded), else the
 * newest copy left by an instance that has ended (crashed or killed), including the single
 * `recovery.tiltsheet` of older versions. That copy is then *claimed*: it is deleted once the
 * user has decided, that is when this instance clears its copy (the user discarded the offer
 * or saved) or writes its own (the restored design is now kept here). Other copies stay for
 * later starts. The single-instance lock means no other live instance shares the folder.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, readdir, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { atomicWrite } from './atomicWrite';
import { readRegularFile } from './boundedRead';

const COPY_NAME = /^recovery-[0-9a-z-]+\.tiltsheet$/;

/** A name no other instance uses: the process id and 32 random bits. */
export function newInstanceId(): string {
  return `${process.pid}-${randomBytes(4).toString('hex')}`;
}

export class RecoveryStore {
  private claimed: string | null = null;

  /**
   * `folder`: where every instance keeps its copy; `legacyFile`: the one shared copy of older
   * versions, offered like an ended instance's copy.
   */
  constructor(
    private readonly folder: string,
    private readonly instanceId: string,
    private readonly maxBytes: number,
    private readonly legacyFile: string | null = null,
  ) {
    if (!/^[0-9a-z-]+$/.test(instanceId)) throw new Error(`bad recovery instance id: ${instanceId}`);
  }

  get ownPath(): string {
    return path.join(this.folder, `recovery-${this.instanceId}.tiltsheet`);
  }

  async write(text: string): Promise<void> {
    await mkdir(this.folder, { recursive: true, mode: 0o700 });
    await atomicWrite(this.ownPath, text);
    await this.dropClaimed();
  }

  /** This instance's copy, else the newest copy an ended instance left; null when there is none. */
  async read(): Promise<string | null> {
    for (const candidate of await this.candidates()) {
      const text = await readRegularFile(candidate, this.maxBytes).catch(() => null);
      if (text === null) continue; // unreadable or oversized: left where it is
      this.claimed = candidate === this.ownPath ? null : candidate;
      return text;
    }
    return null;
  }

  async clear(): Promise<void> {
    await rm(this.ownPath, { force: true });
    await this.dropClaimed();
  }

  private async dropClaimed(): Promise<void> {
    if (this.claimed === null) return;
    await rm(this.claimed, { force: true });
    this.claimed = null;
  }

  /** Own copy first, then the others newest first. */
  private async candidates(): Promise<string[]> {
    const names = await readdir(this.folder).catch(() => [] as string[]);
    const others = names
      .filter((name) => COPY_NAME.test(name))
      .map((name) => path.join(this.folder, name))
      .filter((p) => p !== this.ownPath);
    if (this.legacyFile !== null) others.push(this.legacyFile);
    const dated = await Promise.all(
      others.map(async (p) => ({ p, at: await stat(p).then((s) => (s.isFile() ? s.mtimeMs : null), () => null) })),
    );
    const newestFirst = dated
      .filter((d): d is { p: string; at: number } => d.at !== null)
      .sort((a, b) => b.at - a.at)
      .map((d) => d.p);
    return [this.ownPath, ...newestFirst];
  }
}
