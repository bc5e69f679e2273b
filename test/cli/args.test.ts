/**
 * The CLI's argument parser: negative numbers and ranges are values, not options; every
 * mistake is an ArgError naming the option and, for numbers, the unit.
 */
import { describe, expect, it } from 'vitest';
import { ArgError, numberOption, parseArgs, rangeOption } from '../../core/cli/args';

const SPEC = { flags: ['json'], values: ['lean', 'steer'] };

function errorOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ArgError);
    return (e as Error).message;
  }
  throw new Error('expected an ArgError');
}

describe('parseArgs', () => {
  it('reads positionals, flags, "--name value" and "--name=value", with values that start with a dash', () => {
    const args = parseArgs(['d.tiltsheet', '--lean', '-10', '--steer=-20:20:5', '--json'], SPEC);
    expect(args.positionals).toEqual(['d.tiltsheet']);
    expect([...args.options]).toEqual([['lean', '-10'], ['steer', '-20:20:5'], ['json', true]]);
    expect(numberOption(args, 'lean', 'degrees', 0)).toBe(-10);
    expect(rangeOption(args, 'steer', 'degrees')).toEqual([-20, -15, -10, -5, 0, 5, 10, 15, 20]);
  });

  it('refuses an unknown option, a missing value and a value given to a flag, naming the option', () => {
    expect(errorOf(() => parseArgs(['--leen', '5'], SPEC))).toBe('unknown option --leen');
    expect(errorOf(() => parseArgs(['--lean'], SPEC))).toBe('option --lean needs a value');
    expect(errorOf(() => parseArgs(['--json=yes'], SPEC))).toBe('option --json takes no value');
  });
});

describe('numberOption and rangeOption', () => {
  it('name the unit and the text found', () => {
    const args = parseArgs(['--lean', 'ten', '--steer', '1:2'], SPEC);
    expect(errorOf(() => numberOption(args, 'lean', 'degrees', 0))).toBe('option --lean: expected a number in degrees, found "ten"');
    expect(errorOf(() => rangeOption(args, 'steer', 'degrees'))).toBe('option --steer: expected A:B:STEP in degrees, found "1:2"');
    expect(numberOption(parseArgs([], SPEC), 'lean', 'degrees', 7)).toBe(7); // absent: the fallback
  });

  it('refuse a step that is not positive and a grid too large, and run a range downwards', () => {
    expect(errorOf(() => rangeOption(parseArgs(['--steer', '0:10:0'], SPEC), 'steer', 'degrees'))).toBe('option --steer: STEP must be positive, found 0');
    expect(errorOf(() => rangeOption(parseArgs(['--steer', '0:1000000:1'], SPEC), 'steer', 'degrees'))).toContain('1000001 values is too many');
    expect(rangeOption(parseArgs(['--steer', '10:0:5'], SPEC), 'steer', 'degrees')).toEqual([10, 5, 0]);
  });
});

describe('issue 14, item 9: an empty range part and a repeated option', () => {
  it('refuses "::1" (Number("") is 0: it read as 0:0:1) and every range with an empty or blank part', () => {
    for (const raw of ['::1', '0::1', '0:10:', ' :10:1', ':', '::']) {
      expect(errorOf(() => rangeOption(parseArgs(['--lean', raw], SPEC), 'lean', 'degrees')), raw).toBe(`option --lean: expected A:B:STEP in degrees, found "${raw}"`);
    }
  });

  it('refuses an option given twice, naming it, whether value or flag, spaced or with "="', () => {
    expect(errorOf(() => parseArgs(['--lean', '5', '--lean', '10'], SPEC))).toBe('option --lean is given twice; give it once');
    expect(errorOf(() => parseArgs(['--lean=5', '--steer', '1', '--lean=10'], SPEC))).toBe('option --lean is given twice; give it once');
    expect(errorOf(() => parseArgs(['--json', '--json'], SPEC))).toBe('option --json is given twice; give it once');
  });

  it('through the command line: exit 2 with the option named', async () => {
    const { main } = await import('../../core/cli/main');
    const { HERON } = await import('./cliHarness');
    let err = '';
    const io = { out: () => {}, err: (t: string) => void (err += t), isTty: false };
    expect(await main(['pose', HERON, '--lean', '5', '--lean', '-5'], io)).toBe(2);
    expect(err).toMatch(/option --lean is given twice/);
    err = '';
    expect(await main(['sweep', HERON, '--lean', '::1', '--out', '/tmp/never-written.csv'], io)).toBe(2);
    expect(err).toMatch(/option --lean: expected A:B:STEP in degrees, found "::1"/);
  });
});
