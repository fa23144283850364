/**
 * Argument parsing shared by every command: `--name value`, `--name=value`, flags, `--`
 * ending the options, positionals anywhere. Every mistake becomes one plain sentence.
 */
import type { CliOptionSpec, ParsedArgs } from './types';

/** A usage mistake: the CLI answers with exit code 2, the message and the command's usage. */
export class CliUsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CliUsageError';
  }
}

function describeOptions(specs: readonly CliOptionSpec[]): string {
  return specs
    .map((s) => (s.value ? `--${s.name} ${s.choices ? s.choices.join('|') : s.value}` : `--${s.name}`))
    .join(', ');
}

/**
 * Parses a command's arguments against its option list.
 *
 * @throws CliUsageError for an unknown option, a missing or unexpected value, a value
 *   outside the allowed choices, or an option given twice.
 * @example
 * parseArgs(['a.xml', '--format', 'json', '--check'], specs)
 * // { positionals: ['a.xml'], options: { format: 'json', check: true } }
 */
export function parseArgs(argv: readonly string[], specs: readonly CliOptionSpec[]): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const positionals: string[] = [];
  const options: Record<string, string | true> = {};
  let onlyPositionals = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i] as string;
    if (onlyPositionals || !arg.startsWith('-') || arg === '-') {
      positionals.push(arg);
      continue;
    }
    if (arg === '--') {
      onlyPositionals = true;
      continue;
    }
    if (!arg.startsWith('--')) {
      throw new CliUsageError(`unknown option ${arg}, expected one of ${describeOptions(specs)}`);
    }
    const eq = arg.indexOf('=');
    const name = eq < 0 ? arg.slice(2) : arg.slice(2, eq);
    const spec = byName.get(name);
    if (!spec) throw new CliUsageError(`unknown option --${name}, expected one of ${describeOptions(specs)}`);
    if (Object.prototype.hasOwnProperty.call(options, name)) throw new CliUsageError(`option --${name} is given twice`);
    if (!spec.value) {
      if (eq >= 0) throw new CliUsageError(`option --${name} takes no value, found "${arg.slice(eq + 1)}"`);
      options[name] = true;
      continue;
    }
    let value: string;
    if (eq >= 0) value = arg.slice(eq + 1);
    else {
      const next = argv[i + 1];
      if (next === undefined || (next.startsWith('--') && next.length > 2)) {
        throw new CliUsageError(
          `option --${name} needs a value (${spec.choices ? spec.choices.join('|') : spec.value})`,
        );
      }
      value = next;
      i++;
    }
    if (spec.choices && !spec.choices.includes(value)) {
      throw new CliUsageError(`option --${name} is "${value}", expected one of ${spec.choices.join(', ')}`);
    }
    options[name] = value;
  }
  return { positionals, options };
}
