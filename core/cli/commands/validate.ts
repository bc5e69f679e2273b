import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_OK } from '../io';
import { ArgError, parseArgs } from '../args';
import { reportArgError } from '../commandSupport';
import { loadDesignFile, MAX_DESIGN_BYTES } from '../loadDesignFile';
import { formatIssues } from '../formatIssue';
import { designWarnings } from '../../design/validateDesign';
import { clip, MAX_ECHOED_NAME, MAX_PROBLEMS_PRINTED, problemLines } from '../safeText';

export const validateHelp = `tiltbench validate <design.tiltsheet>
  Checks a design file (a regular file of at most ${MAX_DESIGN_BYTES} bytes). Exit 0 when valid, 2
  with one message per problem (field path, unit expected, value found) when not: at most
  ${MAX_PROBLEMS_PRINTED} are printed, then how many more. Lines starting "warning:" name what the
  design holds but will not do as written (exit 0 all the same).`;

export async function runValidate(argv: string[], io: CliIo): Promise<number> {
  let path: string;
  try {
    const args = parseArgs(argv, { flags: [], values: [] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    path = args.positionals[0];
  } catch (e) {
    return reportArgError(e, io, 'validate', validateHelp);
  }
  const loaded = loadDesignFile(path);
  if (!loaded.ok) {
    for (const line of formatIssues(loaded.issues)) io.err(line + '\n');
    io.err(`${loaded.path}: ${loaded.issues.length} problem${loaded.issues.length === 1 ? '' : 's'}; the design was not loaded\n`);
    return EXIT_BAD_INPUT;
  }
  // Diagnostics on stderr, as the problems are; stdout keeps the one-line verdict.
  for (const line of problemLines(designWarnings(loaded.file).map((w) => w.message))) io.err(`warning: ${loaded.path}: ${line}\n`);
  io.out(`${loaded.path}: valid (${clip(loaded.design.name, MAX_ECHOED_NAME)})\n`);
  return EXIT_OK;
}
