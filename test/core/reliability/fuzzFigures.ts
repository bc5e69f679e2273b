/**
 * Figures from the fuzz runs, for the issue's closing note: designs fuzzed, files fuzzed, poses
 * solved, failures by kind, the longest single solve.
 *
 * Each test file keeps its own tally and, when done, writes it as one part of
 * test-artifacts/fuzz-figures.json (a git-ignored folder). Test files run in parallel
 * workers, so the parts are merged under a lock directory (mkdir is atomic) and the
 * merged file is written to a temporary name and renamed over the old one.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, rmdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ARTIFACTS_DIR = fileURLToPath(new URL('../../../test-artifacts', import.meta.url));
export const FIGURES_FILE = join(ARTIFACTS_DIR, 'fuzz-figures.json');

/** Scale for the number of fuzz cases: FUZZ_RUNS=10 runs ten times as many as `npm test`. */
export function fuzzScale(): number {
  const raw = process.env.FUZZ_RUNS;
  if (raw === undefined || raw.trim() === '') return 1;
  const value = Number(raw);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`FUZZ_RUNS must be a positive number, found "${raw}"`);
  return value;
}

/** A case count scaled by FUZZ_RUNS, at least 1. */
export function runs(base: number): number {
  return Math.max(1, Math.round(base * fuzzScale()));
}

/** The fixed seed of every fuzz property; FUZZ_SEED overrides it for a different sample. */
export function fuzzSeed(): number {
  const raw = process.env.FUZZ_SEED;
  return raw === undefined || raw.trim() === '' ? 20240605 : Number(raw);
}

export interface LongestSolve {
  ms: number;
  what: string;
}

export interface FigurePart {
  /** Which test file wrote this part. */
  part: string;
  writtenAt: string;
  fuzzRuns: number;
  seed: number;
  designsFuzzed: number;
  /** Designs the validator accepted (the rest were rejected with named fields). */
  designsAccepted: number;
  filesFuzzed: number;
  /** Fuzzed files that loaded, and that were refused with a message naming field, line or column. */
  filesLoaded: number;
  filesRejected: number;
  posesSolved: number;
  /** Poses solved inside the analysis sweeps (runSweep, curves, limits): counted, not classified by status. */
  sweepPosesSolved: number;
  /** Solve results by status (converged included, for the ratio). */
  statuses: Record<string, number>;
  /** Designs refused at validation, by the first issue's field path. */
  validationRejects: Record<string, number>;
  longestSolve: LongestSolve;
  /** Most Levenberg-Marquardt iterations run by one solve (counted, not as reported). */
  mostLmIterations: number;
  /** Wall time of the part's fuzzing, ms. */
  elapsedMs: number;
  /** Command-line runs (cliFuzz): tried, and how they ended. */
  cli?: CliRuns;
}

export interface CliRuns {
  tried: number;
  /** Exit 0 or 1: the job ran (1: it found a failure). */
  ran: number;
  /** Exit 2: refused as bad input, with a message. */
  refused: number;
  /** Exit 70 or an exception out of the command: a fault in Tiltbench. */
  crashed: number;
  /** Runs over the time limit (10 s). */
  hung: number;
  /** Any other exit code (74, 130, ...), by code. */
  other: Record<string, number>;
  slowestMs: number;
  slowest: string;
  byCommand: Record<string, number>;
}

/** The longest a single command-line run may take in the fuzz before it counts as hung. */
export const HANG_MS = 10_000;

export class FigureTally {
  private readonly started = performance.now();
  readonly data: FigurePart;

  constructor(part: string) {
    this.data = {
      part,
      writtenAt: '',
      fuzzRuns: fuzzScale(),
      seed: fuzzSeed(),
      designsFuzzed: 0,
      designsAccepted: 0,
      filesFuzzed: 0,
      filesLoaded: 0,
      filesRejected: 0,
      posesSolved: 0,
      sweepPosesSolved: 0,
      statuses: {},
      validationRejects: {},
      longestSolve: { ms: 0, what: '' },
      mostLmIterations: 0,
      elapsedMs: 0,
    };
  }

  solve(status: string, ms: number, what: () => string, lmIterations = 0): void {
    this.data.posesSolved++;
    this.data.mostLmIterations = Math.max(this.data.mostLmIterations, lmIterations);
    this.data.statuses[status] = (this.data.statuses[status] ?? 0) + 1;
    if (ms > this.data.longestSolve.ms) this.data.longestSolve = { ms, what: what() };
  }

  design(accepted: boolean, firstIssuePath?: string): void {
    this.data.designsFuzzed++;
    if (accepted) this.data.designsAccepted++;
    else {
      const key = firstIssuePath === undefined || firstIssuePath === '' ? '(document)' : firstIssuePath.replace(/\.(right|left)\b/g, '');
      this.data.validationRejects[key] = (this.data.validationRejects[key] ?? 0) + 1;
    }
  }

  /** One command-line run: its command, exit code (null: it threw) and time. */
  cliRun(command: string, code: number | null, ms: number, what: () => string): void {
    const c = (this.data.cli ??= { tried: 0, ran: 0, refused: 0, crashed: 0, hung: 0, other: {}, slowestMs: 0, slowest: '', byCommand: {} });
    c.tried++;
    c.byCommand[command] = (c.byCommand[command] ?? 0) + 1;
    if (code === 0 || code === 1) c.ran++;
    else if (code === 2) c.refused++;
    else if (code === null || code === 70) c.crashed++;
    else c.other[String(code)] = (c.other[String(code)] ?? 0) + 1;
    if (ms > HANG_MS) c.hung++;
    if (ms > c.slowestMs) {
      c.slowestMs = ms;
      c.slowest = what();
    }
  }

  file(loaded: boolean): void {
    this.data.filesFuzzed++;
    if (loaded) this.data.filesLoaded++;
    else this.data.filesRejected++;
  }

  /** Write this part into the shared figures file and print one summary line. */
  write(): void {
    this.data.elapsedMs = Math.round(performance.now() - this.started);
    this.data.writtenAt = new Date().toISOString();
    const totals = mergePart(this.data);
    console.log(summaryLine(this.data));
    if (this.data.cli) console.log(cliLine(this.data.cli));
    console.log(totalsLine(totals));
  }
}

export function summaryLine(p: Pick<FigurePart, 'part' | 'designsFuzzed' | 'filesFuzzed' | 'posesSolved' | 'sweepPosesSolved' | 'statuses' | 'longestSolve' | 'elapsedMs'>): string {
  const failures = Object.entries(p.statuses)
    .filter(([k]) => k !== 'converged')
    .map(([k, v]) => `${k} ${v}`)
    .join(', ');
  return (
    `fuzz figures [${p.part}]: ${p.designsFuzzed} designs, ${p.filesFuzzed} files, ${p.posesSolved} poses checked one by one ` +
    `(converged ${p.statuses.converged ?? 0}${failures ? `; ${failures}` : ''}), ` +
    `${p.sweepPosesSolved ? `+ ${p.sweepPosesSolved} in sweeps, ` : ''}longest solve ${p.longestSolve.ms.toFixed(1)} ms, ${(p.elapsedMs / 1000).toFixed(1)} s`
  );
}

export function cliLine(c: CliRuns): string {
  const other = Object.entries(c.other).map(([k, v]) => `exit ${k}: ${v}`).join(', ');
  return (
    `fuzz figures [cli runs]: ${c.tried} tried: ${c.ran} ran (exit 0 or 1), ${c.refused} refused (exit 2), ${c.crashed} crashed, ` +
    `${c.hung} hung (over ${HANG_MS / 1000} s)${other ? `, ${other}` : ''}; slowest ${(c.slowestMs / 1000).toFixed(2)} s (${c.slowest}); ` +
    `by command: ${Object.entries(c.byCommand).map(([k, v]) => `${k} ${v}`).join(', ')}`
  );
}

/** One line over every part in the figures file (the last test file to finish prints the full one). */
export function totalsLine(t: FiguresFile['totals']): string {
  const failures = Object.entries(t.failuresByKind).map(([k, v]) => `${k} ${v}`).join(', ');
  return (
    `fuzz figures [all parts]: ${t.designsFuzzed} designs (${t.designsFuzzed - t.designsAccepted} refused by validation), ` +
    `${t.filesFuzzed} files (${t.filesRejected} refused), ${t.posesSolved + t.sweepPosesSolved} poses solved ` +
    `(${t.statuses.converged ?? 0} converged${failures ? `; ${failures}` : ''}; ${t.sweepPosesSolved} in sweeps, not classified), ` +
    `longest single solve ${t.longestSolve.ms.toFixed(1)} ms, most LM iterations in one solve ${t.mostLmIterations}`
  );
}

interface FiguresFile {
  note: string;
  totals: {
    designsFuzzed: number;
    designsAccepted: number;
    filesFuzzed: number;
    filesLoaded: number;
    filesRejected: number;
    posesSolved: number;
    sweepPosesSolved: number;
    statuses: Record<string, number>;
    failuresByKind: Record<string, number>;
    validationRejects: Record<string, number>;
    longestSolve: LongestSolve & { part: string };
    mostLmIterations: number;
  };
  parts: Record<string, FigurePart>;
}

function addCounts(into: Record<string, number>, from: Record<string, number>): void {
  for (const [k, v] of Object.entries(from)) into[k] = (into[k] ?? 0) + v;
}

export function totalsOf(parts: Record<string, FigurePart>): FiguresFile['totals'] {
  const t: FiguresFile['totals'] = {
    designsFuzzed: 0,
    designsAccepted: 0,
    filesFuzzed: 0,
    filesLoaded: 0,
    filesRejected: 0,
    posesSolved: 0,
    sweepPosesSolved: 0,
    statuses: {},
    failuresByKind: {},
    validationRejects: {},
    longestSolve: { ms: 0, what: '', part: '' },
    mostLmIterations: 0,
  };
  for (const p of Object.values(parts)) {
    t.designsFuzzed += p.designsFuzzed;
    t.designsAccepted += p.designsAccepted;
    t.filesFuzzed += p.filesFuzzed;
    t.filesLoaded += p.filesLoaded;
    t.filesRejected += p.filesRejected;
    t.posesSolved += p.posesSolved;
    t.sweepPosesSolved += p.sweepPosesSolved ?? 0;
    addCounts(t.statuses, p.statuses);
    addCounts(t.validationRejects, p.validationRejects);
    t.mostLmIterations = Math.max(t.mostLmIterations, p.mostLmIterations ?? 0);
    if (p.longestSolve.ms > t.longestSolve.ms) t.longestSolve = { ...p.longestSolve, part: p.part };
  }
  for (const [k, v] of Object.entries(t.statuses)) if (k !== 'converged') t.failuresByKind[k] = v;
  return t;
}

const LOCK = join(ARTIFACTS_DIR, '.fuzz-figures.lock');

function withLock(action: () => void): void {
  mkdirSync(ARTIFACTS_DIR, { recursive: true });
  const deadline = Date.now() + 10_000;
  for (;;) {
    try {
      mkdirSync(LOCK);
      break;
    } catch {
      // A lock left by a killed run is stale after 30 s.
      try {
        if (Date.now() - statSync(LOCK).mtimeMs > 30_000) rmdirSync(LOCK);
      } catch {
        /* gone meanwhile */
      }
      if (Date.now() > deadline) throw new Error(`could not lock ${LOCK}`);
      Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 20);
    }
  }
  try {
    action();
  } finally {
    rmdirSync(LOCK);
  }
}

function mergePart(part: FigurePart): FiguresFile['totals'] {
  let totals: FiguresFile['totals'] | undefined;
  withLock(() => {
    let parts: Record<string, FigurePart> = {};
    if (existsSync(FIGURES_FILE)) {
      try {
        parts = (JSON.parse(readFileSync(FIGURES_FILE, 'utf8')) as FiguresFile).parts ?? {};
      } catch {
        parts = {}; // a damaged figures file is rebuilt from this run
      }
    }
    parts[part.part] = part;
    const file: FiguresFile = {
      note:
        'Written by test/core/reliability/*.test.ts. Each part is the last run of one test file (see writtenAt, fuzzRuns, seed); ' +
        'totals add the parts. failuresByKind counts solve results other than converged.',
      totals: totalsOf(parts),
      parts,
    };
    const tmp = `${FIGURES_FILE}.${process.pid}.tmp`;
    writeFileSync(tmp, JSON.stringify(file, null, 2) + '\n');
    renameSync(tmp, FIGURES_FILE);
    totals = file.totals;
  });
  return totals!;
}
