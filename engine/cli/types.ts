/**
 * The command line's contract with the outside world. The engine side is pure: it gets
 * file bytes through `CliIo`, and returns everything it wants printed or written as plain
 * data in a `CliOutcome`; bin/ebbline.mjs does the Node I/O.
 */
import type { ImportOptions, ImportResult } from '../import/types';
import type { UnreadableFile } from '../import/registry';

/** File access the CLI needs. `readFile` throws (with a Node-style `code`) when it cannot read. */
export interface CliIo {
  readFile(path: string): Uint8Array | Promise<Uint8Array>;
}

/** A file the command wants written (e.g. `--out`). */
export interface CliWrite {
  readonly path: string;
  readonly content: string;
  /** `pdf`: `content` is HTML that the host prints to PDF at `path` (bin/ebbline.mjs uses Chromium). */
  readonly as?: 'pdf';
}

/** Everything a run produces. Exit codes: 0 success, 2 bad input or usage, 1 internal error. */
export interface CliOutcome {
  readonly exitCode: 0 | 1 | 2;
  readonly stdout: string;
  readonly stderr: string;
  readonly writes: readonly CliWrite[];
}

/** One option a command accepts. Without `value` it is a flag. */
export interface CliOptionSpec {
  /** Long name without dashes, e.g. `format`. */
  readonly name: string;
  /** Placeholder of the value in usage text, e.g. `NAME`; absent for flags. */
  readonly value?: string;
  /** Allowed values, when the set is closed (e.g. text, json). */
  readonly choices?: readonly string[];
  readonly description: string;
}

/** Parsed arguments of one command: positionals in order, options by name. */
export interface ParsedArgs {
  readonly positionals: readonly string[];
  /** Flags are `true`; valued options are strings. Absent options are absent. */
  readonly options: Readonly<Record<string, string | true>>;
}

/** Replaceable collaborators (tests swap the importer; the CLI uses the registry). */
export interface CliContext {
  readonly io: CliIo;
  importStatement(bytes: Uint8Array, options: ImportOptions): ImportResult | UnreadableFile;
}

/**
 * A command of the `ebbline` command line. Add one by writing engine/cli/commands/<name>.ts
 * that exports a `CliCommand`, and listing it in engine/cli/commands/index.ts.
 */
export interface CliCommand {
  readonly name: string;
  /** One line for `ebbline --help`. */
  readonly summary: string;
  /** Synopsis, e.g. `ebbline import <statement files...> --check [--format text|json]`. */
  readonly usage: string;
  readonly options: readonly CliOptionSpec[];
  /** Least number of positionals (statement files); fewer is a usage error. */
  readonly minPositionals: number;
  /** What the positionals are, for the usage error (e.g. "statement file"). */
  readonly positionalName: string;
  run(args: ParsedArgs, context: CliContext): CliOutcome | Promise<CliOutcome>;
}
