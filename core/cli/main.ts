/**
 * The `tiltbench` command line. Each command lives in commands/ and returns its exit code:
 * 0 success, 1 the job ran and found a failure (cannot assemble, check violated), 2 bad input.
 */
import { processIo, type CliIo, EXIT_BAD_INPUT, SAFETY_CAUTION } from './io';
import { runValidate, validateHelp } from './commands/validate';
import { runPose, poseHelp } from './commands/pose';
import { runSweepCommand, sweepHelp } from './commands/sweep';
import { runCheck, checkHelp } from './commands/check';
import { runSensitivityCommand, sensitivityHelp } from './commands/sensitivity';
import { runToleranceCommand, toleranceHelp } from './commands/tolerance';

export interface CliCommand {
  run(argv: string[], io: CliIo): Promise<number>;
  help: string;
}

/** Commands by name; further commands register here. */
export const COMMANDS: Record<string, CliCommand> = {
  validate: { run: runValidate, help: validateHelp },
  pose: { run: runPose, help: poseHelp },
  sweep: { run: runSweepCommand, help: sweepHelp },
  check: { run: runCheck, help: checkHelp },
  sensitivity: { run: runSensitivityCommand, help: sensitivityHelp },
  tolerance: { run: runToleranceCommand, help: toleranceHelp },
};

function usage(): string {
  return (
    'Tiltbench: steering and suspension kinematics of tilting multi-track vehicles.\n\n' +
    Object.values(COMMANDS)
      .map((c) => c.help)
      .join('\n\n') +
    '\n\n' +
    SAFETY_CAUTION +
    '\n'
  );
}

export async function main(argv: string[], io: CliIo = processIo()): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    io.out(usage());
    return name ? 0 : EXIT_BAD_INPUT;
  }
  const command = COMMANDS[name];
  if (!command) {
    io.err(`tiltbench: unknown command "${name}"; commands: ${Object.keys(COMMANDS).join(', ')}\n`);
    return EXIT_BAD_INPUT;
  }
  if (rest.includes('--help')) {
    io.out(command.help + '\n');
    return 0;
  }
  try {
    return await command.run(rest, io);
  } catch (e) {
    // A bug, not bad input: say so plainly rather than dumping a stack at a user.
    io.err(`tiltbench ${name}: internal error: ${(e as Error).message}\n`);
    return 70;
  }
}
