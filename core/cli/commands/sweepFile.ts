/**
 * Writing a sweep's table to its file, whole or not at all: through an AtomicOutput, in slices
 * with a turn of the event loop between them so Ctrl-C and SIGTERM are heard, and with one
 * message and exit code for each way it can end early.
 */
import { EXIT_CANNOT_WRITE, EXIT_INTERRUPTED, OutputError, type CliIo } from '../io';
import { AtomicOutput, type OutputFs, type OutputTarget } from '../outputFile';
import { nextTurn, watchInterrupts, type StopSignal } from '../interrupts';
import { SweepTable, type TableFormat } from './sweepTable';

class Interrupted extends Error {
  constructor(readonly signal: StopSignal) {
    super(signal);
  }
}

export interface TableSpec {
  format: TableFormat;
  columns: readonly { name: string }[];
  /** The JSON document's fields before "rows". */
  head: Record<string, unknown>;
}

/**
 * Run `produce`, which writes rows to the table and calls `between()` after each slice of work
 * (there a signal received stops it); then close the table and put the file in place.
 * Returns the summary, or the exit code after saying why nothing was written.
 */
export async function writeTableFile<S>(
  io: CliIo,
  command: string,
  target: OutputTarget,
  spec: TableSpec,
  produce: (table: SweepTable, between: () => Promise<void>) => S | Promise<S>,
  fs?: OutputFs,
): Promise<{ summary: S } | { exit: number }> {
  const untouched = target.mode === undefined ? 'no file was written' : `${target.given} is as it was`;
  const watch = watchInterrupts();
  let out: AtomicOutput | undefined;
  try {
    out = AtomicOutput.open(target, fs);
    const table = new SweepTable(out, spec.format, spec.columns, spec.head);
    const between = async () => {
      await nextTurn();
      const signal = watch.received();
      if (signal) throw new Interrupted(signal);
    };
    const summary = await produce(table, between);
    table.finish(summary);
    out.commit();
    return { summary };
  } catch (e) {
    out?.abort();
    if (e instanceof Interrupted) {
      io.err(`\ntiltbench ${command}: stopped by ${e.signal === 'SIGINT' ? 'Ctrl-C (SIGINT)' : 'SIGTERM'}; ${untouched}\n`);
      return { exit: EXIT_INTERRUPTED[e.signal] };
    }
    if (e instanceof OutputError) {
      io.err(`tiltbench ${command}: ${e.message}; ${untouched}\n`);
      return { exit: EXIT_CANNOT_WRITE };
    }
    throw e;
  } finally {
    watch.release();
  }
}
