/**
 * A small argument parser: positionals, `--flag`, `--name value` and `--name=value`.
 * Unknown options are errors that name the option, so a typo never runs a wrong job; so is an
 * option given twice (which of two values was meant cannot be known).
 *
 * Not Node's util.parseArgs: in strict mode it refuses a value that starts with a dash
 * (`--lean -10`, `--steer -20:20:5`, which every sweep of both sides needs) as "ambiguous"
 * unless written `--lean=-10`, and its messages would need rewording to name our units anyway.
 */
import { quoted } from './safeText';

export interface ParsedArgs {
  positionals: string[];
  options: Map<string, string | true>;
}

export class ArgError extends Error {}

/** An option name as an error message shows it: escaped and cut (it is the user's text). */
const optionName = (name: string) => `--${quoted(name).slice(1, -1)}`;

export function parseArgs(argv: string[], spec: { flags: string[]; values: string[] }): ParsedArgs {
  const positionals: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--') || a === '--') {
      positionals.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    const known = spec.flags.includes(name) || spec.values.includes(name);
    if (known && options.has(name)) throw new ArgError(`option --${name} is given twice; give it once`);
    if (spec.flags.includes(name)) {
      if (eq > 0) throw new ArgError(`option --${name} takes no value`);
      options.set(name, true);
    } else if (spec.values.includes(name)) {
      const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
      if (value === undefined) throw new ArgError(`option --${name} needs a value`);
      options.set(name, value);
    } else {
      throw new ArgError(`unknown option ${optionName(name)}`);
    }
  }
  return { positionals, options };
}

/** A finite number option, with the unit named in the error. */
export function numberOption(args: ParsedArgs, name: string, unit: string, fallback: number): number {
  const raw = args.options.get(name);
  if (raw === undefined) return fallback;
  if (raw === true) throw new ArgError(`option --${name} needs a value in ${unit}`);
  const value = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(value)) throw new ArgError(`option --${name}: expected a number in ${unit}, found ${quoted(raw)}`);
  return value;
}

/** Most values one range option may give. */
export const MAX_RANGE_VALUES = 100_000;

/** A range `A:B:STEP` (inclusive), with the unit named in errors. */
export function rangeOption(args: ParsedArgs, name: string, unit: string): number[] | undefined {
  const raw = args.options.get(name);
  if (raw === undefined) return undefined;
  if (raw === true) throw new ArgError(`option --${name} needs a range A:B:STEP in ${unit}`);
  const texts = raw.split(':');
  const parts = texts.map((p) => Number(p));
  // Number('') is 0: an empty part ("::1") must not read as 0:0:1.
  if (parts.length !== 3 || texts.some((t) => t.trim() === '') || parts.some((p) => !Number.isFinite(p))) {
    throw new ArgError(`option --${name}: expected A:B:STEP in ${unit}, found ${quoted(raw)}`);
  }
  const [a, b, step] = parts;
  if (!(step > 0)) throw new ArgError(`option --${name}: STEP must be positive, found ${step}`);
  const count = Math.floor(Math.abs(b - a) / step + 1e-9) + 1;
  if (!(count <= MAX_RANGE_VALUES)) throw new ArgError(`option --${name}: ${count} values is too many (at most ${MAX_RANGE_VALUES})`);
  const dir = b >= a ? 1 : -1;
  return Array.from({ length: count }, (_, i) => a + dir * i * step);
}
