/**
 * The CLI fuzz's runs and what every run must hold, whatever the command, input or options:
 * - a documented exit code: 0 or 1 the job ran, 2 refused with a message; never 70 (a fault in
 *   Tiltbench), never an exception, never over HANG_MS;
 * - no raw control character on stdout or stderr (text from a file or an argument is escaped);
 * - JSON output parses and holds only finite numbers; text output prints no NaN or Infinity
 *   (lines echoing the design's name, which a file may set to "NaN", aside);
 * - an output file is whole or absent: after exit 0 or 1 it parses whole (a CSV row per pose, a
 *   JSON document with finite numbers); after any other exit the file there before is as it
 *   was; and no temporary file is left beside it.
 */
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname } from 'node:path';
import { main } from '../../../core/cli/main';
import type { CliIo } from '../../../core/cli/io';
import { escapeControls } from '../../../core/cli/safeText';
import { nonFiniteIn } from './poseChecks';
import { HANG_MS, type FigureTally } from './fuzzFigures';

const RAW_CONTROL = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

/** What was in an output file before a run. */
export const OLD_OUTPUT = 'old,file\n';

export interface CliRun {
  argv: string[];
  code: number | null;
  out: string;
  err: string;
  ms: number;
  thrown?: unknown;
}

export async function runCli(argv: string[]): Promise<CliRun> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => void (out += t), err: (t) => void (err += t), isTty: false };
  const t0 = performance.now();
  try {
    const code = await main(argv, io);
    return { argv, code, out, err, ms: performance.now() - t0 };
  } catch (thrown) {
    return { argv, code: null, out, err, ms: performance.now() - t0, thrown };
  }
}

/** The --out path of a run, if any. */
export function outputOf(argv: readonly string[]): string | undefined {
  const i = argv.indexOf('--out');
  return i >= 0 ? argv[i + 1] : undefined;
}

/** Lines that do not echo the design's name (which a fuzzed file may set to "NaN" or "Infinity"). */
function withoutName(text: string, name: string | undefined): string {
  if (!name) return text;
  const head = escapeControls(name).slice(0, 20);
  return text
    .split('\n')
    .filter((l) => !l.includes(head))
    .join('\n');
}

/** Every property a run must hold (see the header); the problems found, none when it holds. */
export function runProblems(r: CliRun, designName?: string, before?: string): string[] {
  const p: string[] = [];
  if (r.thrown !== undefined) p.push(`threw ${(r.thrown as Error)?.stack ?? String(r.thrown)}`);
  if (r.code === 70) p.push(`exit 70 (internal error): ${r.err.slice(0, 400)}`);
  else if (r.code !== null && ![0, 1, 2].includes(r.code)) p.push(`undocumented exit ${r.code}: ${r.err.slice(0, 400)}`);
  if (r.ms > HANG_MS) p.push(`took ${(r.ms / 1000).toFixed(1)} s`);
  if (RAW_CONTROL.test(r.out)) p.push('a raw control character on stdout');
  if (RAW_CONTROL.test(r.err)) p.push('a raw control character on stderr');
  if (r.code === 2 && r.err.trim() === '') p.push('exit 2 without a message');
  if (r.code === 0 || r.code === 1) {
    if (r.argv.includes('--json')) {
      try {
        p.push(...nonFiniteIn(JSON.parse(r.out), 'stdout'));
      } catch (e) {
        p.push(`--json output does not parse: ${(e as Error).message}`);
      }
    } else {
      p.push(...nonFiniteIn(withoutName(r.out, designName), 'stdout'));
    }
  }
  const out = outputOf(r.argv);
  if (out && r.argv[0] === 'sweep') p.push(...outputProblems(r, out, before));
  if (out && (r.argv[0] === 'tune' || r.argv[0] === 'fit')) p.push(...designOutputProblems(r, out, before));
  return p;
}

/** Whether a run that failed touched its output: a regular file there before must read the same,
 * and none may have appeared. */
function changed(out: string, before: string | undefined): boolean {
  const now = isRegularFile(out) ? readFileSync(out, 'utf8') : undefined;
  return now !== before;
}

/** Only a regular file is read back: reading a named pipe given as an output would block the test. */
function isRegularFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

function outputProblems(r: CliRun, out: string, before: string | undefined): string[] {
  const p: string[] = [];
  const folder = dirname(out);
  if (existsSync(folder)) {
    const left = readdirSync(folder).filter((f) => f.startsWith(`.${basename(out)}.`) && f.endsWith('.partial'));
    if (left.length > 0) p.push(`temporary files left: ${left.join(', ')}`);
  }
  if (r.code === 0 || r.code === 1) {
    const text = readFileSync(out, 'utf8');
    if (out.toLowerCase().endsWith('.json')) {
      try {
        const doc = JSON.parse(text) as { rows: unknown[]; summary: { poses: number } };
        if (doc.rows.length !== doc.summary.poses) p.push(`${out}: ${doc.rows.length} rows for ${doc.summary.poses} poses`);
        p.push(...nonFiniteIn(doc, out));
      } catch (e) {
        p.push(`${out} does not parse: ${(e as Error).message}`);
      }
    } else {
      const rows = text.trimEnd().split('\n').length - 1;
      const said = /wrote (\d+) rows/.exec(r.out);
      if (!said || Number(said[1]) !== rows) p.push(`${out}: ${rows} rows, the summary says ${said?.[1]}`);
      if (/\bNaN\b|\bInfinity\b/.test(text)) p.push(`${out} holds NaN or Infinity`);
    }
  } else if (changed(out, before)) {
    p.push(`exit ${r.code}, yet ${out} changed`);
  }
  return p;
}

/** A design written by tune or fit: whole (it parses as JSON) after exit 0, else the old file as it was. */
function designOutputProblems(r: CliRun, out: string, before: string | undefined): string[] {
  if (!existsSync(dirname(out))) return [];
  const left = readdirSync(dirname(out)).filter((f) => f.startsWith(`.${basename(out)}.`));
  const p = left.length > 0 ? [`temporary files left: ${left.join(', ')}`] : [];
  const text = isRegularFile(out) ? readFileSync(out, 'utf8') : undefined;
  if (r.code === 0) {
    try {
      p.push(...nonFiniteIn(JSON.parse(text ?? ''), out));
    } catch (e) {
      p.push(`${out} is not a whole design: ${(e as Error).message}`);
    }
  } else if (changed(out, before)) p.push(`exit ${r.code}, yet ${out} changed`);
  return p;
}

/** Prepare the output file a run may write (the old content it must keep unless it succeeds). */
export function prepareOutput(argv: readonly string[]): void {
  const out = outputOf(argv);
  // A sweep's hostile outputs (the input, links, pipes) are left as they are; tune's written
  // proposal goes to a file of its own, reset before every run.
  // A name past the file system's limit cannot be prepared; the run must refuse it.
  if (out && existsSync(dirname(out)) && (!existsSync(out) || argv[0] === 'tune' || argv[0] === 'fit') && Buffer.byteLength(basename(out)) <= 255) writeFileSync(out, OLD_OUTPUT);
}

/** Run, tally and return the problems, each labelled. */
export async function fuzzRun(tally: FigureTally, argv: string[], label: string, designName?: string): Promise<{ run: CliRun; problems: string[] }> {
  prepareOutput(argv);
  const out = outputOf(argv);
  const before = out !== undefined && isRegularFile(out) ? readFileSync(out, 'utf8') : undefined;
  const r = await runCli(argv);
  tally.cliRun(argv[0], r.thrown === undefined ? r.code : null, r.ms, () => `${label}: ${argv.join(' ').slice(0, 200)}`);
  return { run: r, problems: runProblems(r, designName, before).map((m) => `${label}: tiltbench ${argv.join(' ').slice(0, 300)}: ${m}`) };
}
