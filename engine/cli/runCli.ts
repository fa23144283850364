/**
 * The `ebbline` command line, as a pure function of its arguments and file access:
 * `runCli(argv, io)` returns the exit code and everything to print or write. bin/ebbline.mjs
 * does the Node I/O around it.
 *
 * Exit codes (DESIGN.md section 5): 0 success; 2 bad input or usage, with one line per
 * problem on stderr and no stack trace; 1 internal error, with a short message.
 */
import { EngineError } from '../core/errors';
import { COMMANDS } from './commands/index';
import { CliUsageError, parseArgs } from './parseArgs';
import type { CliCommand, CliContext, CliIo, CliOutcome } from './types';

/** The program name used in messages. */
const PROGRAM = 'ebbline';

function outcome(exitCode: 0 | 1 | 2, stdout: string, stderr: string): CliOutcome {
  return { exitCode, stdout, stderr, writes: [] };
}

function optionLines(command: CliCommand): string[] {
  const rows = command.options.map((o) => {
    const left = o.value ? `--${o.name} ${o.choices ? o.choices.join('|') : o.value}` : `--${o.name}`;
    return [left, o.description] as const;
  });
  const width = Math.max(0, ...rows.map(([l]) => l.length));
  return rows.map(([l, d]) => `  ${l.padEnd(width)}  ${d}`);
}

/** Help text of one command. */
export function commandHelp(command: CliCommand): string {
  return [`usage: ${command.usage}`, '', command.summary, '', 'options:', ...optionLines(command)].join('\n') + '\n';
}

/** Help text of the whole program. */
export function programHelp(commands: readonly CliCommand[] = COMMANDS): string {
  const width = Math.max(...commands.map((c) => c.name.length));
  return (
    [
      `usage: ${PROGRAM} <command> [arguments]`,
      '',
      'commands:',
      ...commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
      '',
      `Run "${PROGRAM} <command> --help" for a command's options.`,
    ].join('\n') + '\n'
  );
}

/** Importer for the real CLI: the registry, loaded on first use. */
async function registryImporter(): Promise<CliContext['importStatement']> {
  const { importStatement } = await import('../import/registry');
  return importStatement;
}

/** What runCli may be given besides the file access (tests swap the importer). */
export interface RunCliOptions {
  readonly importStatement?: CliContext['importStatement'];
  /** Commands to offer instead of the registry's (tests). */
  readonly commands?: readonly CliCommand[];
}

/**
 * Runs one command line.
 *
 * @param argv the arguments after the program name, e.g. `['import', 'a.xml', '--check']`.
 * @example
 * const out = await runCli(['import', 'jan.xml', '--check', '--format', 'json'], { readFile });
 * out.exitCode // 0
 */
export async function runCli(argv: readonly string[], io: CliIo, options: RunCliOptions = {}): Promise<CliOutcome> {
  const commands = options.commands ?? COMMANDS;
  const [name, ...rest] = argv;
  if (name === undefined) return outcome(2, '', `${PROGRAM}: a command is missing\n${programHelp(commands)}`);
  if (name === '--help' || name === '-h' || name === 'help') {
    const target = rest[0] === undefined ? undefined : commands.find((c) => c.name === rest[0]);
    if (rest[0] !== undefined && !target)
      return outcome(2, '', `${PROGRAM}: unknown command "${rest[0]}"\n${programHelp(commands)}`);
    return outcome(0, target ? commandHelp(target) : programHelp(commands), '');
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    return outcome(
      2,
      '',
      `${PROGRAM}: unknown command "${name}", expected one of ${commands.map((c) => c.name).join(', ')}\n${programHelp(commands)}`,
    );
  }
  if (rest.includes('--help') || rest.includes('-h')) return outcome(0, commandHelp(command), '');
  try {
    const args = parseArgs(rest, command.options);
    if (args.positionals.length < command.minPositionals) {
      throw new CliUsageError(`no ${command.positionalName} given, expected at least ${command.minPositionals}`);
    }
    const importStatement = options.importStatement ?? (await registryImporter());
    return await command.run(args, { io, importStatement });
  } catch (error) {
    if (error instanceof CliUsageError) {
      return outcome(2, '', `${PROGRAM} ${command.name}: ${error.message}\nusage: ${command.usage}\n`);
    }
    if (error instanceof EngineError && (error.code === 'INVALID_PLAN' || error.code === 'INPUT_TOO_LARGE')) {
      return outcome(2, '', `${PROGRAM} ${command.name}: ${error.message}\n`);
    }
    const message = error instanceof Error ? error.message : String(error);
    return outcome(1, '', `${PROGRAM}: internal error: ${message.split('\n')[0]}\n`);
  }
}
