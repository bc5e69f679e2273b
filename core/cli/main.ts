/**
 * The `tiltbench` command line. Each command lives in commands/ and returns its exit code:
 * 0 success, 1 the job ran and found a failure (cannot assemble, check violated), 2 bad input,
 * 74 an output could not be written (disk full), 130/143 stopped by a signal; 70 is left for a
 * fault in Tiltbench itself. Everything a command prints passes through `safeIo`: text echoed
 * from a file or an argument cannot send control sequences to the terminal.
 */
import { processIo, safeIo, type CliIo, EXIT_BAD_INPUT, EXIT_CANNOT_WRITE, EXIT_CODES_HELP, OutputError, SAFETY_CAUTION } from './io';
import { quoted } from './safeText';
import { runValidate, validateHelp } from './commands/validate';
import { runPose, poseHelp } from './commands/pose';
import { runSweepCommand, sweepHelp } from './commands/sweep';
import { runCheck, checkHelp } from './commands/check';
import { runSensitivityCommand, sensitivityHelp } from './commands/sensitivity';
import { runToleranceCommand, toleranceHelp } from './commands/tolerance';
import { runTuneCommand, tuneHelp } from './commands/tune';
import { runCompareCommand, compareHelp } from './commands/compare';
import { runHardpointsCommand, hardpointsHelp } from './commands/hardpoints';
import { runFitCommand, fitHelp } from './commands/fit';
import { runReportCommand, reportHelp } from './commands/report';

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
  tune: { run: runTuneCommand, help: tuneHelp },
  compare: { run: runCompareCommand, help: compareHelp },
  hardpoints: { run: runHardpointsCommand, help: hardpointsHelp },
  fit: { run: runFitCommand, help: fitHelp },
  report: { run: runReportCommand, help: reportHelp },
};

function usage(): string {
  return (
    'Tiltbench: steering and suspension kinematics of tilting multi-track vehicles.\n\n' +
    Object.values(COMMANDS)
      .map((c) => c.help)
      .join('\n\n') +
    '\n\n' +
    EXIT_CODES_HELP +
    '\n\n' +
    SAFETY_CAUTION +
    '\n'
  );
}

export async function main(argv: string[], rawIo: CliIo = processIo()): Promise<number> {
  const io = safeIo(rawIo);
  const [name, ...rest] = argv;
  try {
    return await dispatch(name, rest, io);
  } catch (e) {
    if (e instanceof OutputError) {
      // Standard output on a full disk, say: the job ran, its report could not be written.
      io.err(`tiltbench${name ? ` ${name}` : ''}: ${e.message}\n`);
      return EXIT_CANNOT_WRITE;
    }
    // A bug, not bad input: say so plainly rather than dumping a stack at a user.
    io.err(`tiltbench ${name}: internal error: ${(e as Error).message}\n`);
    return 70;
  }
}

async function dispatch(name: string | undefined, rest: string[], io: CliIo): Promise<number> {
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    io.out(usage());
    return name ? 0 : EXIT_BAD_INPUT;
  }
  // Own keys only: "constructor" or "__proto__" is not a command.
  const command = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (!command) {
    io.err(`tiltbench: unknown command ${quoted(name)}; commands: ${Object.keys(COMMANDS).join(', ')}\n`);
    return EXIT_BAD_INPUT;
  }
  if (rest.includes('--help')) {
    io.out(command.help + '\n');
    return 0;
  }
  return command.run(rest, io);
}
