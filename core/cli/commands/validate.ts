import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_OK } from '../io';
import { parseArgs } from '../args';
import { loadDesignFile } from '../loadDesignFile';
import { formatIssue } from '../formatIssue';

export const validateHelp = `tiltbench validate <design.tiltsheet>
  Checks a design file. Exit 0 when valid, 2 with one message per problem (field path, unit
  expected, value found) when not.`;

export async function runValidate(argv: string[], io: CliIo): Promise<number> {
  const args = parseArgs(argv, { flags: [], values: [] });
  if (args.positionals.length !== 1) {
    io.err(`usage:\n${validateHelp}\n`);
    return EXIT_BAD_INPUT;
  }
  const loaded = loadDesignFile(args.positionals[0]);
  if (!loaded.ok) {
    for (const issue of loaded.issues) io.err(formatIssue(issue) + '\n');
    io.err(`${loaded.path}: ${loaded.issues.length} problem${loaded.issues.length === 1 ? '' : 's'}; the design was not loaded\n`);
    return EXIT_BAD_INPUT;
  }
  io.out(`${loaded.path}: valid (${loaded.design.name})\n`);
  return EXIT_OK;
}
