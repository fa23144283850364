import { describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import { addDays } from '../../engine/core/dates';
import { createRng } from '../../engine/core/random';
import { runCli } from '../../engine/cli/runCli';
import type { CliIo } from '../../engine/cli/types';
import type { ImportResult, ParsedStatement } from '../../engine/import/types';
import { balance, entry, statement } from '../ledger/make';
import { nonFiniteNumbers } from '../forecast/histories';

// The importer is swapped for one that reads hand-made results stored as JSON (as in
// import.test.ts), so these tests pin the commands, not the parsers. Invented data.
type Stored = { format: ImportResult['format']; statements: ParsedStatement[] };

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
  return { file: options.fileName, format: stored.format, statements: stored.statements, problems: [] };
};

const run = (argv: string[], files: Record<string, Stored | string>) =>
  runCli(argv, ioOf(files), { importStatement: fakeImporter });

/** `days` days of an account from 2026-01-01: daily takings, rent on the 1st, some supplies. */
function account(identifier: string, currency: string, days: number, opening: number, seed = 1): Stored {
  const rng = createRng(seed);
  const entries = [];
  let net = 0;
  for (let d = 0; d < days; d++) {
    const date = addDays('2026-01-01', d);
    const takings = Math.round(8_000 + 3_000 * rng.normal());
    entries.push(entry(date, takings, 'Card takings'));
    net += takings;
    if (date.endsWith('-01')) {
      entries.push(entry(date, -90_000, 'Studio rent', { counterparty: 'Landlord Ltd' }));
      net -= 90_000;
    }
    if (rng.nextFloat() < 0.2) {
      const clay = -Math.round(2_000 + 8_000 * rng.nextFloat());
      entries.push(entry(date, clay, 'Clay order', { counterparty: 'Supplies' }));
      net += clay;
    }
  }
  const to = addDays('2026-01-01', days - 1);
  return {
    format: 'camt.053',
    statements: [
      statement(
        identifier,
        entries,
        [balance('opening', '2026-01-01', opening), balance('closing', to, opening + net)],
        {
          from: '2026-01-01',
          to,
          currency,
        },
      ),
    ],
  };
}

const EUR_IBAN = 'NL94EBBL0123456789';
const files = { 'studio.xml': account(EUR_IBAN, 'EUR', 120, 500_000) };

describe('ebbline forecast: option values', () => {
  it('refuses values outside the documented bounds, one line per problem, nothing on stdout', async () => {
    const out = await run(
      ['forecast', 'studio.xml', '--paths', '5', '--horizon', '731', '--seed', '-1', '--as-of', '2026-02-30'],
      files,
    );
    expect(out.exitCode).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr.trimEnd().split('\n')).toEqual([
      '--horizon: "731" is outside 1..730',
      '--paths: "5" is outside 100..100000',
      '--seed: "-1" is not a whole number, expected 0..4294967295',
      '--as-of: "2026-02-30" is not a calendar date, expected YYYY-MM-DD',
    ]);
  });

  it('reads whole numbers strictly', async () => {
    for (const [value, line] of [
      ['1e3', '--paths: "1e3" is not a whole number, expected 100..100000'],
      ['250.0', '--paths: "250.0" is not a whole number, expected 100..100000'],
      ['100001', '--paths: "100001" is outside 100..100000'],
    ] as const) {
      const out = await run(['forecast', 'studio.xml', '--paths', value], files);
      expect(out.exitCode).toBe(2);
      expect(out.stderr).toBe(`${line}\n`);
    }
    const zero = await run(['forecast', 'studio.xml', '--horizon', '0'], files);
    expect(zero.stderr).toBe('--horizon: "0" is outside 1..730\n');
  });

  it('reads --threshold as a decimal in the account currency, with at most its decimals', async () => {
    const tooFine = await run(['forecast', 'studio.xml', '--threshold', '12.345'], files);
    expect(tooFine.exitCode).toBe(2);
    expect(tooFine.stderr).toBe('--threshold: "12.345" has 3 decimals, EUR allows 2\n');
    const grouped = await run(['forecast', 'studio.xml', '--threshold', '1,000'], files);
    expect(grouped.stderr).toBe('--threshold: "1,000" is not a decimal number, expected an amount such as 2500.00\n');
    // Source: ISO 4217 minor units: JPY has none.
    const yen = { 'yen.xml': account('JP00YEN', 'JPY', 60, 5_000_000) };
    const yenOut = await run(['forecast', 'yen.xml', '--threshold', '100.5'], yen);
    expect(yenOut.stderr).toBe('--threshold: "100.5" has 1 decimals, JPY allows 0\n');
    const ok = await run(
      ['forecast', 'studio.xml', '--threshold', '250.50', '--paths', '200', '--horizon', '14', '--format', 'json'],
      files,
    );
    expect(ok.exitCode).toBe(0);
    expect(JSON.parse(ok.stdout).threshold).toBe(250.5);
  });
});

describe('ebbline forecast: scope, as-of and plan', () => {
  const mixed = { ...files, 'usd.xml': account('US00USD', 'USD', 120, 200_000, 2) };

  it('refuses mixed currencies without --account, and forecasts the account --account names', async () => {
    const out = await run(['forecast', 'studio.xml', 'usd.xml'], mixed);
    expect(out.exitCode).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr).toBe(
      '--account: missing, and the statements hold accounts in several currencies: EUR (1), USD (1); ' +
        `expected --account NAME|ID to choose one of ${EUR_IBAN} (EUR), US00USD (USD)\n`,
    );
    const usd = await run(
      [
        'forecast',
        'studio.xml',
        'usd.xml',
        '--account',
        'us00usd',
        '--paths',
        '200',
        '--horizon',
        '7',
        '--format',
        'json',
      ],
      mixed,
    );
    expect(usd.stderr).toBe('');
    expect(JSON.parse(usd.stdout).currency).toBe('USD');
    const unknown = await run(['forecast', 'studio.xml', '--account', 'savings'], files);
    expect(unknown.exitCode).toBe(2);
    expect(unknown.stderr).toBe(
      `--account: "savings" matches no account in the statements, expected one of ${EUR_IBAN} (EUR)\n`,
    );
  });

  it('combines the accounts of one currency by default, noting an account whose statements end early', async () => {
    const two = { ...files, 'second.xml': account('NL00SECOND', 'EUR', 100, 100_000, 3) };
    const out = await run(
      ['forecast', 'studio.xml', 'second.xml', '--paths', '200', '--horizon', '7', '--format', 'json'],
      two,
    );
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout);
    const closing = (s: Stored) => s.statements[0]!.balances[1]!.amount as number;
    expect(doc.startBalance).toBeCloseTo((closing(two['studio.xml']) + closing(two['second.xml'])) / 100, 2);
    expect(doc.model.notes).toEqual([
      "The statements of account NL00SECOND end on 2026-04-10, before the others' (2026-04-30); its days after that count as days without entries.",
    ]);
  });

  it('defaults --as-of to the last statement date and refuses dates outside the statements', async () => {
    const out = await run(['forecast', 'studio.xml', '--paths', '200', '--horizon', '7', '--format', 'json'], files);
    const doc = JSON.parse(out.stdout);
    expect(doc.asOf).toBe('2026-04-30');
    expect(doc.daily[0].date).toBe('2026-05-01');
    expect(doc.startBalance).toBe((files['studio.xml'].statements[0]!.balances[1]!.amount as number) / 100);
    const late = await run(['forecast', 'studio.xml', '--as-of', '2026-05-10'], files);
    expect(late.exitCode).toBe(2);
    expect(late.stderr).toBe(
      '--as-of: "2026-05-10" is after the last statement date 2026-04-30, expected a date from 2026-01-01 to 2026-04-30\n',
    );
    const early = await run(['forecast', 'studio.xml', '--as-of', '2025-12-31'], files);
    expect(early.stderr).toMatch(/^--as-of: "2025-12-31" is before the first statement date 2026-01-01/);
    const short = await run(['forecast', 'studio.xml', '--as-of', '2026-01-20'], files);
    expect(short.exitCode).toBe(2);
    expect(short.stderr).toBe(
      'ebbline forecast: a forecast needs at least 28 days of history, the statements cover 20 (2026-01-01 to 2026-01-20), expected more statements\n',
    );
  });

  it('refuses a plan that fails validation with one line per problem, naming the file and the JSON path', async () => {
    const planText = JSON.stringify({
      schema: 'ebbline.plan/1',
      items: [
        { label: 'Kiln', amount: -1000, date: '2026-02-30' },
        { label: 'Invoice', amount: 100.123, date: '2026-05-03', probability: -0.2, delayDays: { min: 9, max: 2 } },
      ],
    });
    const out = await run(['forecast', 'studio.xml', '--plan', 'plan.json'], { ...files, 'plan.json': planText });
    expect(out.exitCode).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr.trimEnd().split('\n')).toEqual([
      'plan.json: $.items[0].date: found "2026-02-30", expected a calendar date YYYY-MM-DD',
      'plan.json: $.items[1].amount: 100.123 has more decimals than EUR allows (2)',
      'plan.json: $.items[1].probability: found -0.2, expected a number from 0 to 1',
      'plan.json: $.items[1].delayDays: found {"min":9,"max":2}, expected { "min": whole days ≥ 0, "max": whole days ≥ min, at most 365 }',
    ]);
    const broken = await run(['forecast', 'studio.xml', '--plan', 'plan.json'], {
      ...files,
      'plan.json': '{\n  "schema": ,\n}',
    });
    expect(broken.exitCode).toBe(2);
    expect(broken.stderr).toBe('plan.json:2: not valid JSON: "," at column 13, expected an ebbline.plan/1 document\n');
    const missing = await run(['forecast', 'studio.xml', '--plan', 'nowhere.json'], files);
    expect(missing.stderr).toBe('nowhere.json: file not found, expected a readable plan file (ebbline.plan/1)\n');
  });

  it('applies a valid plan: a certain one-off moves the balance by its amount from its date', async () => {
    const planText = JSON.stringify({
      schema: 'ebbline.plan/1',
      items: [
        {
          label: 'Kiln deposit',
          amount: -1000,
          date: '2026-05-10',
          probability: 1,
          delayDays: { min: 0, max: 0 },
          every: null,
        },
      ],
    });
    const args = ['forecast', 'studio.xml', '--paths', '300', '--horizon', '14', '--format', 'json', '--seed', '3'];
    const base = JSON.parse((await run(args, files)).stdout);
    const planned = JSON.parse(
      (await run([...args, '--plan', 'plan.json'], { ...files, 'plan.json': planText })).stdout,
    );
    planned.daily.forEach((row: Record<string, number>, i: number) => {
      const shift = base.daily[i].date >= '2026-05-10' ? -1000 : 0;
      expect(row.p50! - base.daily[i].p50).toBeCloseTo(shift, 2);
      expect(row.p05! - base.daily[i].p05).toBeCloseTo(shift, 2);
    });
  });
});

describe('ebbline forecast: output', () => {
  const args = ['forecast', 'studio.xml', '--paths', '300', '--horizon', '30', '--seed', '7'];

  it('prints byte-identical JSON for the same inputs and seed, with no NaN', async () => {
    const a = await run([...args, '--format', 'json'], files);
    const b = await run([...args, '--format', 'json'], files);
    expect(a.exitCode).toBe(0);
    expect(a.stderr).toBe('');
    expect(b.stdout).toBe(a.stdout);
    const doc = JSON.parse(a.stdout);
    expect(doc.schema).toBe('ebbline.forecast/1');
    expect(doc.seed).toBe(7);
    expect(doc.caution).toBe(CAUTION);
    expect(nonFiniteNumbers(doc)).toEqual([]);
  });

  it('writes to --out through the CLI writes and prints one confirmation line', async () => {
    const printed = await run([...args, '--format', 'json'], files);
    const out = await run([...args, '--format', 'json', '--out', 'forecast.json'], files);
    expect(out.exitCode).toBe(0);
    expect(out.stdout).toBe('Wrote the forecast (JSON) to forecast.json.\n');
    expect(out.writes).toEqual([{ path: 'forecast.json', content: printed.stdout }]);
  });

  it('prints a text report: weekly table, shortfall with its Monte Carlo error, recurring flows, models, caution', async () => {
    const out = await run([...args, '--threshold', '4000'], files);
    expect(out.exitCode).toBe(0);
    const text = out.stdout;
    expect(text).toContain('Forecast for account NL94EBBL0123456789 (EUR) as of 2026-04-30: 30 days to 2026-05-30');
    expect(text).toMatch(/week to\s+P10\s+P50\s+P90\s+gone below/);
    // Weeks end on days 7, 14, 21, 28 and the horizon's last day.
    for (const d of ['2026-05-07', '2026-05-14', '2026-05-21', '2026-05-28', '2026-05-30'])
      expect(text).toContain(`\n${d}  `);
    expect(text).toMatch(
      /Chance of going below 4000\.00 EUR at some point by 2026-05-30: [\d.<>]+% \(Monte Carlo standard error [\d.]+ percentage points with 300 paths\)/,
    );
    expect(text).toContain('Landlord Ltd');
    expect(text).toContain('Models. Other inflows: ');
    expect(text.trimEnd().endsWith(CAUTION)).toBe(true);
  });
});

describe('ebbline decompose', () => {
  it('prints ebbline.decompose/1 with components for every day, diagnostics and the recurring flows', async () => {
    const out = await run(['decompose', 'studio.xml', '--format', 'json'], files);
    expect(out.stderr).toBe('');
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(Object.keys(doc)).toEqual([
      'schema',
      'currency',
      'start',
      'asOf',
      'inflow',
      'outflow',
      'recurring',
      'notes',
      'caution',
    ]);
    expect(doc.notes).toEqual([]);
    expect(doc.schema).toBe('ebbline.decompose/1');
    for (const direction of [doc.inflow, doc.outflow]) {
      expect(direction.components.start).toBe('2026-01-01');
      for (const k of ['trend', 'weekly', 'remainder']) expect(direction.components[k]).toHaveLength(120);
      expect(direction.components.yearly).toBeNull(); // under two years
      expect(direction.notes.some((n: string) => n.includes('Yearly'))).toBe(true);
      expect(Object.keys(direction.weeklyProfile)).toEqual([
        'Monday',
        'Tuesday',
        'Wednesday',
        'Thursday',
        'Friday',
        'Saturday',
        'Sunday',
      ]);
      const d = direction.diagnostics.series;
      expect(d.acf.values.length).toBe(d.maxLag);
      expect(d.acf.whiteNoiseBand).toBeCloseTo(1.959964 / Math.sqrt(120), 5); // Source: REFERENCES.md, band ±1.959964/√n
      expect(typeof d.ljungBox.pValue).toBe('number');
      expect(typeof d.adf.statistic).toBe('number');
      expect(typeof d.kpss.pValue).toBe('number');
      expect(d.sentences.length).toBeGreaterThan(0);
    }
    // The components add up to the series: trend + weekly + monthly + remainder = the daily takings.
    const inflow = doc.inflow.components;
    const total = inflow.trend.map(
      (t: number, i: number) => t + inflow.weekly[i] + (inflow.monthly ? inflow.monthly[i] : 0) + inflow.remainder[i],
    );
    const takings = files['studio.xml'].statements[0]!.entries.filter((e) => e.amount > 0);
    takings.forEach((e, i) => expect(total[i]).toBeCloseTo(e.amount / 100, 1));
    expect(doc.recurring.map((f: { label: string }) => f.label)).toContain('Landlord Ltd');
    expect(nonFiniteNumbers(doc)).toEqual([]);
    expect(doc.caution).toBe(CAUTION);
  });

  it('prints a plain-words summary with the caution, and refuses mixed currencies the same way as forecast', async () => {
    const out = await run(['decompose', 'studio.xml'], files);
    expect(out.exitCode).toBe(0);
    expect(out.stdout).toContain('Recurring flows found');
    expect(out.stdout).toContain('Weekly rhythm: Mon ');
    expect(out.stdout.trimEnd().endsWith(CAUTION)).toBe(true);
    const mixed = await run(['decompose', 'studio.xml', 'usd.xml'], {
      ...files,
      'usd.xml': account('US00USD', 'USD', 60, 1, 2),
    });
    expect(mixed.exitCode).toBe(2);
    expect(mixed.stderr).toMatch(/^--account: missing, and the statements hold accounts in several currencies/);
  });

  it('is listed by --help next to import and forecast', async () => {
    const out = await run(['--help'], {});
    expect(out.stdout).toMatch(/import\s+check statement files/);
    expect(out.stdout).toMatch(/forecast\s+project balance bands/);
    expect(out.stdout).toMatch(/decompose\s+show the patterns/);
  });
});
