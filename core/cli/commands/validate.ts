import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_OK } from '../io';
import { ArgError, parseArgs } from '../args';
import { reportArgError } from '../commandSupport';
import { loadDesignFile } from '../loadDesignFile';
import { formatIssue } from '../formatIssue';
import { designWarnings } from '../../design/validateDesign';

export const validateHelp = `tiltbench validate <design.tiltsheet>
  Checks a design file. Exit 0 when valid, 2 with one message per problem (field path, unit
  expected, value found) when not. Lines starting "warning:" name what the design holds but
  will not do as written (exit 0 all the same).`;

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
    for (const issue of loaded.issues) io.err(formatIssue(issue) + '\n');
    io.err(`${loaded.path}: ${loaded.issues.length} problem${loaded.issues.length === 1 ? '' : 's'}; the design was not loaded\n`);
    return EXIT_BAD_INPUT;
  }
  // Diagnostics on stderr, as the problems are; stdout keeps the one-line verdict.
  for (const warning of designWarnings(loaded.file)) io.err(`warning: ${loaded.path}: ${warning.message}\n`);
  io.out(`${loaded.path}: valid (${loaded.design.name})\n`);
  return EXIT_OK;
}
