/**
 * The commands of `ebbline`, in the order `ebbline --help` lists them. To add one (forecast,
 * decompose, report …), write engine/cli/commands/<name>.ts exporting a `CliCommand` and add
 * it here; runCli finds it by name, parses its options and maps its errors to exit codes.
 */
import type { CliCommand } from '../types';
import { decomposeCommand } from './decompose';
import { reportCommand } from './report';
import { forecastCommand } from './forecast';
import { importCommand } from './import';

/** Every registered command. */
export const COMMANDS: readonly CliCommand[] = [importCommand, forecastCommand, decomposeCommand, reportCommand];
