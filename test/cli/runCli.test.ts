import { describe, expect, it } from 'vitest';
import { CliUsageError, parseArgs } from '../../engine/cli/parseArgs';
import { formatProblem } from '../../engine/cli/formatProblem';
import { runCli } from '../../engine/cli/runCli';
import { textTable } from '../../engine/cli/textTable';
import type { CliCommand } from '../../engine/cli/types';
import { EngineError } from '../../engine/core/errors';

const specs = [
  { name: 'horizon', value: 'DAYS', description: 'days' },
  { name: 'threshold', value: 'AMOUNT', description: 'amount' },
  { name: 'format', value: 'FORMAT', choices: ['text', 'json'], description: 'format' },
  { name: 'check', description: 'flag' },
];

describe('parseArgs', () => {
  it('reads positionals anywhere, --name value, --name=value, flags and --', () => {
    expect(
      parseArgs(['a.xml', '--horizon', '90', 'b.csv', '--format=json', '--check', '--', '--c.sta'], specs),
    ).toEqual({
      positionals: ['a.xml', 'b.csv', '--c.sta'],
      options: { horizon: '90', format: 'json', check: true },
    });
  });
  it('takes a negative number as a value', () => {
    expect(parseArgs(['--threshold', '-500.25'], specs).options).toEqual({ threshold: '-500.25' });
  });
  it('throws CliUsageError with one plain sentence per mistake', () => {
    const message = (argv: string[]) => {
      try {
        parseArgs(argv, specs);
      } catch (e) {
        return e instanceof CliUsageError ? e.message : 'other error';
      }
      return 'no error';
    };
    expect(message(['--horizon'])).toBe('option --horizon needs a value (DAYS)');
    expect(message(['--horizon', '--check'])).toBe('option --horizon needs a value (DAYS)');
    expect(message(['--nope'])).toBe(
      'unknown option --nope, expected one of --horizon DAYS, --threshold AMOUNT, --format text|json, --check',
    );
    expect(message(['--format', 'csv'])).toBe('option --format is "csv", expected one of text, json');
  });
});

describe('command registry', () => {
  it('runs a command added to the list, with parsed options and the usage on mistakes', async () => {
    const seen: unknown[] = [];
    const forecast: CliCommand = {
      name: 'forecast',
      summary: 'a stand-in forecast',
      usage: 'ebbline forecast <statement files...> [--horizon DAYS]',
      positionalName: 'statement file',
      minPositionals: 1,
      options: [{ name: 'horizon', value: 'DAYS', description: 'days' }],
      run(args) {
        seen.push(args);
        if (args.options.horizon === '0') throw new CliUsageError('option --horizon is "0", expected 1 to 730');
        if (args.options.horizon === '999999') throw new EngineError('INPUT_TOO_LARGE', 'horizon too long');
        return { exitCode: 0, stdout: 'ok\n', stderr: '', writes: [{ path: 'out.json', content: '{}' }] };
      },
    };
    const io = { readFile: () => new Uint8Array(0) };
    const ok = await runCli(['forecast', 'a.xml', '--horizon', '30'], io, {
      commands: [forecast],
      importStatement: () => {
        throw new Error('unused');
      },
    });
    expect(ok).toEqual({ exitCode: 0, stdout: 'ok\n', stderr: '', writes: [{ path: 'out.json', content: '{}' }] });
    expect(seen).toEqual([{ positionals: ['a.xml'], options: { horizon: '30' } }]);
    const bad = await runCli(['forecast', 'a.xml', '--horizon', '0'], io, {
      commands: [forecast],
      importStatement: () => {
        throw new Error('unused');
      },
    });
    expect(bad.exitCode).toBe(2);
    expect(bad.stderr).toBe(
      'ebbline forecast: option --horizon is "0", expected 1 to 730\nusage: ebbline forecast <statement files...> [--horizon DAYS]\n',
    );
    const large = await runCli(['forecast', 'a.xml', '--horizon', '999999'], io, {
      commands: [forecast],
      importStatement: () => {
        throw new Error('unused');
      },
    });
    expect(large).toMatchObject({ exitCode: 2, stderr: 'ebbline forecast: horizon too long\n' });
    const help = await runCli(['--help'], io, { commands: [forecast] });
    expect(help.stdout).toContain('  forecast  a stand-in forecast');
  });
});

describe('formatting helpers', () => {
  it('formats problems as FILE:LINE, FILE: element PATH, or FILE alone, on one line', () => {
    expect(formatProblem({ file: 'a.csv', line: 3, message: 'x' })).toBe('a.csv:3: x');
    expect(formatProblem({ file: 'a.xml', element: 'Document/Stmt/Bal[1]', message: 'y' })).toBe(
      'a.xml: element Document/Stmt/Bal[1]: y',
    );
    expect(formatProblem({ file: 'a.sta', message: 'two\nlines' })).toBe('a.sta: two lines');
  });
  it('pads table columns and right-aligns numbers', () => {
    expect(
      textTable(
        ['name', 'n'],
        [
          ['a', '10'],
          ['bbb', '2'],
        ],
        ['left', 'right'],
      ),
    ).toBe('name   n\na     10\nbbb    2');
  });
});
