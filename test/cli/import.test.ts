import { describe, expect, it } from 'vitest';
import { runCli } from '../../engine/cli/runCli';
import type { CliIo } from '../../engine/cli/types';
import type { ImportResult, ParsedStatement } from '../../engine/import/types';
import { balance, entry, statement } from '../ledger/make';

// The importer is swapped for one that reads hand-made results stored as JSON, so these
// tests pin the command's behaviour independently of the real parsers.
type Stored = { format: ImportResult['format']; statements: ParsedStatement[]; problems?: ImportResult['problems'] };

function ioOf(files: Record<string, Stored | string>): CliIo {
  return {
    readFile(path: string) {
      const f = files[path];
      if (f === undefined) throw Object.assign(new Error(`ENOENT: no such file, open '${path}'`), { code: 'ENOENT' });
      return new TextEncoder().encode(typeof f === 'string' ? f : JSON.stringify(f));
    },
  };
}

const fakeImporter = (bytes: Uint8Array, options: { fileName: string }) => {
  const stored = JSON.parse(new TextDecoder().decode(bytes)) as Stored;
  return {
    file: options.fileName,
    format: stored.format,
    statements: stored.statements,
    problems: (stored.problems ?? []).map((p) => ({ ...p, file: options.fileName })),
  };
};

const run = (argv: string[], files: Record<string, Stored | string>) =>
  runCli(argv, ioOf(files), { importStatement: fakeImporter });

const IBAN = 'NL94EBBL0123456789';
const jan: Stored = {
  format: 'camt.053',
  statements: [
    statement(
      IBAN,
      [
        entry('2026-01-05', -40000, 'Studio rent', { bankRef: 'A1' }),
        entry('2026-01-10', 12550, 'Market sales', { bankRef: 'A2' }),
      ],
      [balance('opening', '2026-01-01', 421055), balance('closing', '2026-01-31', 393605)],
      { from: '2026-01-01', to: '2026-01-31' },
    ),
  ],
};
const janCsv: Stored = {
  format: 'csv',
  statements: [
    statement(
      IBAN,
      [entry('2026-01-10', 12550, 'Market sales'), entry('2026-02-02', -1999, 'Glaze')],
      [balance('running', '2026-01-10', 393605), balance('running', '2026-02-02', 391606)],
    ),
  ],
};
const feb: Stored = {
  format: 'camt.053',
  statements: [
    statement(
      IBAN,
      [entry('2026-02-03', -5000, 'Kiln power')],
      [balance('opening', '2026-02-01', 393605), balance('closing', '2026-02-28', 388605)],
      {
        from: '2026-02-01',
        to: '2026-02-28',
      },
    ),
  ],
};

describe('ebbline import --check: JSON', () => {
  it('prints ebbline.import/1 with exactly the contract fields, amounts in major units', async () => {
    const out = await run(['import', 'jan.xml', 'jan.csv', '--check', '--format', 'json'], {
      'jan.xml': jan,
      'jan.csv': janCsv,
    });
    expect(out.stderr).toBe('');
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(Object.keys(doc)).toEqual(['schema', 'files', 'accounts']);
    expect(doc.schema).toBe('ebbline.import/1');
    expect(doc.files).toHaveLength(2);
    for (const f of doc.files) {
      expect(Object.keys(f)).toEqual([
        'file',
        'format',
        'account',
        'currency',
        'from',
        'to',
        'entries',
        'duplicates',
        'opening',
        'closing',
        'net',
        'problems',
      ]);
    }
    expect(doc.files[0]).toEqual({
      file: 'jan.xml',
      format: 'camt.053',
      account: IBAN,
      currency: 'EUR',
      from: '2026-01-01',
      to: '2026-01-31',
      entries: 2,
      duplicates: 0,
      opening: 4210.55,
      closing: 3936.05,
      net: -274.5,
      problems: [],
    });
    expect(doc.files[1]).toMatchObject({
      file: 'jan.csv',
      format: 'csv',
      entries: 1,
      duplicates: 1,
      opening: 3810.55,
      closing: 3916.06,
      net: 105.51,
    });
    expect(doc.accounts).toEqual([
      {
        account: IBAN,
        currency: 'EUR',
        entries: 3,
        closing: 3916.06,
        closingDate: '2026-02-02',
        reconciled: true,
        firstMismatch: null,
      },
    ]);
  });

  it('rounds to the minor unit of JPY (0 digits) and KWD (3 digits)', async () => {
    // Source: ISO 4217 minor units: JPY 0, KWD 3.
    const files: Record<string, Stored> = {
      'yen.csv': {
        format: 'csv',
        statements: [
          statement('JP-1', [entry('2026-01-02', 1500, 'a')], [balance('closing', '2026-01-02', 98000)], {
            currency: 'JPY',
          }),
        ],
      },
      'dinar.csv': {
        format: 'csv',
        statements: [
          statement('KW-1', [entry('2026-01-02', -1234, 'b')], [balance('closing', '2026-01-02', 5000)], {
            currency: 'KWD',
          }),
        ],
      },
    };
    const doc = JSON.parse((await run(['import', 'yen.csv', 'dinar.csv', '--check', '--format=json'], files)).stdout);
    expect(doc.files.map((f: { net: number; closing: number }) => [f.net, f.closing])).toEqual([
      [1500, 98000],
      [-1.234, 5],
    ]);
  });

  it('reports a pending entry as a notice, not counted', async () => {
    const files: Record<string, Stored> = {
      'card.ofx': {
        format: 'ofx',
        statements: [
          statement(IBAN, [
            entry('2026-01-02', -500, 'a'),
            entry('2026-01-03', -700, 'b', { status: 'pending', source: { line: 30 } }),
          ]),
        ],
      },
    };
    const doc = JSON.parse((await run(['import', 'card.ofx', '--check', '--format', 'json'], files)).stdout);
    expect(doc.files[0].entries).toBe(1);
    expect(doc.files[0].problems).toEqual([
      {
        severity: 'notice',
        line: 30,
        element: null,
        message: 'pending entry of 2026-01-03 (-7.00 EUR) left out: only booked entries count',
      },
    ]);
    expect(doc.accounts[0]).toMatchObject({ closing: null, reconciled: null });
  });

  it('gives byte-identical output for the same input', async () => {
    const files = { 'jan.xml': jan, 'jan.csv': janCsv, 'feb.xml': feb };
    for (const format of ['json', 'text']) {
      const a = await run(['import', 'jan.xml', 'jan.csv', 'feb.xml', '--check', '--format', format], files);
      const b = await run(['import', 'jan.xml', 'jan.csv', 'feb.xml', '--check', '--format', format], files);
      expect(b).toEqual(a);
      expect(a.stdout.length).toBeGreaterThan(100);
    }
  });
});

describe('ebbline import --check: reconciliation', () => {
  it('exits 2 when a stated balance disagrees, prints the report and one line per disagreement', async () => {
    const broken = JSON.parse(JSON.stringify(feb)) as Stored;
    (broken.statements[0]!.balances[1] as { amount: number; source: { line: number } }).amount = 388805;
    (broken.statements[0]!.balances[1] as { source: { line?: number; element?: string } }).source = {
      element: 'Document/BkToCstmrStmt/Stmt/Bal[2]',
    };
    const out = await run(['import', 'jan.xml', 'feb.xml', '--check', '--format', 'json'], {
      'jan.xml': jan,
      'feb.xml': broken,
    });
    expect(out.exitCode).toBe(2);
    const doc = JSON.parse(out.stdout);
    expect(doc.accounts[0]).toMatchObject({
      reconciled: false,
      firstMismatch: {
        date: '2026-02-28',
        expected: 3888.05,
        computed: 3886.05,
        difference: 2,
        sourceFile: 'feb.xml',
        lastAgreement: '2026-01-31',
      },
    });
    expect(out.stderr.trimEnd().split('\n')).toEqual([
      'feb.xml: statement 1: opening 3936.05 + entries -50.00 = 3886.05, but the closing balance is 3888.05 EUR; expected opening + entries = closing',
      "feb.xml: element Document/BkToCstmrStmt/Stmt/Bal[2]: stated closing balance 3888.05 EUR at the end of 2026-02-28 for account NL94EBBL0123456789, rebuilt 3886.05 from the statements' entries (difference 2.00, last agreement 2026-01-31); expected them to agree",
    ]);
  });

  it('exits 0 when every account reconciles', async () => {
    const out = await run(['import', 'jan.xml', 'feb.xml', '--check'], { 'jan.xml': jan, 'feb.xml': feb });
    expect(out.stderr).toBe('');
    expect(out.exitCode).toBe(0);
  });
});

describe('ebbline import --check: bad input', () => {
  const bad: Stored = {
    format: 'csv',
    statements: [],
    problems: [
      { file: '', line: 7, message: 'amount "12,3,4" is not a number, expected e.g. -12,34', severity: 'error' },
      {
        file: '',
        element: 'Document/BkToCstmrStmt/Stmt/Ntry[3]/Amt',
        message: 'amount missing, expected a decimal',
        severity: 'error',
      },
      { file: '', line: 9, message: 'only a notice', severity: 'notice' },
    ],
  };

  it('refuses the whole run when one file has errors: exit 2, one line per error, nothing on stdout', async () => {
    const out = await run(['import', 'jan.xml', 'bad.csv', '--check', '--format', 'json'], {
      'jan.xml': jan,
      'bad.csv': bad,
    });
    expect(out.exitCode).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr).toBe(
      'bad.csv:7: amount "12,3,4" is not a number, expected e.g. -12,34\n' +
        'bad.csv: element Document/BkToCstmrStmt/Stmt/Ntry[3]/Amt: amount missing, expected a decimal\n',
    );
  });

  it('reports a missing file and a directory in the same format', async () => {
    const io: CliIo = {
      readFile(path) {
        throw Object.assign(new Error('x'), { code: path === 'dir' ? 'EISDIR' : 'ENOENT' });
      },
    };
    const out = await runCli(['import', 'missing.xml', 'dir', '--check'], io, { importStatement: fakeImporter });
    expect(out.exitCode).toBe(2);
    expect(out.stderr).toBe(
      'missing.xml: file not found, expected a readable statement file\ndir: is a directory, expected a statement file\n',
    );
  });

  it('asks for --currency when a statement states none', async () => {
    const files: Record<string, Stored> = {
      'x.csv': {
        format: 'csv',
        statements: [statement(undefined, [entry('2026-01-02', 1, 'a')], [], { currency: '' })],
      },
    };
    const out = await run(['import', 'x.csv', '--check'], files);
    expect(out.exitCode).toBe(2);
    expect(out.stderr).toBe('x.csv: states no currency, expected --currency CODE\n');
    const ok = await run(['import', 'x.csv', '--check', '--currency', 'eur', '--format', 'json'], files);
    expect(ok.exitCode).toBe(0);
    expect(JSON.parse(ok.stdout).files[0]).toMatchObject({ account: 'x.csv', currency: 'EUR' });
  });

  it('names an account without identifier after --account', async () => {
    const files: Record<string, Stored> = {
      'x.csv': { format: 'csv', statements: [statement(undefined, [entry('2026-01-02', 1, 'a')])] },
    };
    const doc = JSON.parse(
      (await run(['import', 'x.csv', '--check', '--account', 'Studio card', '--format', 'json'], files)).stdout,
    );
    expect(doc.accounts[0].account).toBe('Studio card');
  });

  it('answers usage mistakes with exit 2, the mistake and the usage line', async () => {
    const cases: [string[], string][] = [
      [
        ['import', 'a.xml'],
        'ebbline import: --check is missing: the command line checks statement files (import --check)',
      ],
      [['import', '--check'], 'ebbline import: no statement file given, expected at least 1'],
      [
        ['import', 'a.xml', '--check', '--format', 'xml'],
        'ebbline import: option --format is "xml", expected one of text, json',
      ],
      [['import', 'a.xml', '--check', '--format'], 'ebbline import: option --format needs a value (text|json)'],
      [['import', 'a.xml', '--check', '--check'], 'ebbline import: option --check is given twice'],
      [
        ['import', 'a.xml', '--check', '--currency', 'EURO'],
        'ebbline import: option --currency is "EURO", expected an ISO 4217 code such as EUR',
      ],
      [
        ['import', 'a.xml', '--check', '--horizon', '90'],
        'ebbline import: unknown option --horizon, expected one of --check, --account NAME, --currency CODE, --format text|json',
      ],
      [['import', 'a.xml', '--check=yes'], 'ebbline import: option --check takes no value, found "yes"'],
      [
        ['import', 'a.xml', '-c'],
        'ebbline import: unknown option -c, expected one of --check, --account NAME, --currency CODE, --format text|json',
      ],
    ];
    for (const [argv, first] of cases) {
      const out = await run(argv, { 'a.xml': jan });
      expect(out.exitCode, argv.join(' ')).toBe(2);
      expect(out.stdout, argv.join(' ')).toBe('');
      expect(out.stderr.split('\n'), argv.join(' ')).toEqual([
        first,
        'usage: ebbline import <statement files...> --check [--account NAME] [--currency CODE] [--format text|json]',
        '',
      ]);
    }
  });

  it('answers an unknown or missing command with exit 2 and the command list', async () => {
    const unknown = await run(['forecat', 'a.xml'], {});
    expect(unknown.exitCode).toBe(2);
    expect(unknown.stderr.split('\n')[0]).toBe(
      'ebbline: unknown command "forecat", expected one of import, forecast, decompose, report',
    );
    const none = await run([], {});
    expect(none.exitCode).toBe(2);
    expect(none.stderr).toContain('usage: ebbline <command> [arguments]');
  });

  it('prints help on stdout with exit 0', async () => {
    const top = await run(['--help'], {});
    expect(top.exitCode).toBe(0);
    expect(top.stdout).toMatch(/\n {2}import +check statement files/);
    const cmd = await run(['import', '--help'], {});
    expect(cmd.exitCode).toBe(0);
    expect(cmd.stdout.split('\n')[0]).toBe(
      'usage: ebbline import <statement files...> --check [--account NAME] [--currency CODE] [--format text|json]',
    );
    expect((await run(['help', 'import'], {})).stdout).toBe(cmd.stdout);
  });

  it('answers an internal failure with exit 1 and one short line, no stack trace', async () => {
    const out = await runCli(['import', 'a.xml', '--check'], ioOf({ 'a.xml': jan }), {
      importStatement: () => {
        throw new TypeError('cannot read properties of undefined\n    at parse (x.ts:1:1)');
      },
    });
    expect(out.exitCode).toBe(1);
    expect(out.stdout).toBe('');
    expect(out.stderr).toBe('ebbline: internal error: cannot read properties of undefined\n');
  });
});

describe('ebbline import --check: text', () => {
  it('prints a readable table of files and accounts', async () => {
    const out = await run(['import', 'jan.xml', 'jan.csv', '--check'], { 'jan.xml': jan, 'jan.csv': janCsv });
    expect(out.exitCode).toBe(0);
    const lines = out.stdout.split('\n');
    expect(lines[0]).toBe('Checked 2 files, 1 account.');
    expect(lines[2]).toMatch(/^file +format +account +currency +from +to +entries +duplicates +opening +closing +net$/);
    expect(lines[3]).toMatch(
      /^jan\.xml +camt\.053 +NL94EBBL0123456789 +EUR +2026-01-01 +2026-01-31 +2 +0 +4210\.55 +3936\.05 +-274\.50$/,
    );
    expect(lines[4]).toMatch(
      /^jan\.csv +csv +NL94EBBL0123456789 +EUR +2026-01-10 +2026-02-02 +1 +1 +3810\.55 +3916\.06 +105\.51$/,
    );
    expect(out.stdout).toMatch(/\nNL94EBBL0123456789 +EUR +3 +3916\.06 +2026-02-02 +yes\n$/);
  });

  it('ends with the caution when something needs attention', async () => {
    const files: Record<string, Stored> = {
      'x.csv': { format: 'csv', statements: [statement(undefined, [entry('2026-01-02', 1, 'a')])] },
    };
    const out = await run(['import', 'x.csv', '--check'], files);
    expect(out.stdout).toContain('no stated balance: balances are relative');
    expect(out.stdout.trimEnd().split('\n').pop()).toMatch(/^Estimates only, not financial, tax or legal advice\./);
  });
});
