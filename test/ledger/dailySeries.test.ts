import { describe, expect, it } from 'vitest';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { dailySeries } from '../../engine/ledger/dailySeries';
import { balance, entry, result, statement } from './make';
import { errorCode } from '../core/errorCode';

const BUSINESS = 'NL94EBBL0123456789';
const RESERVE = 'NL46EBBL0987654321';

const ledger = buildLedger([
  result('business.xml', [
    statement(
      BUSINESS,
      [
        entry('2024-02-27', 5000, 'Market sales'),
        entry('2024-02-27', -1200, 'Clay'),
        entry('2024-02-29', -300, 'Leap day fee'),
        entry('2024-03-01', -90000, 'Studio rent'),
        entry('2024-03-01', 250000, 'Commission'),
      ],
      [balance('opening', '2024-02-26', 100000), balance('closing', '2024-03-01', 263500)],
    ),
  ]),
  result(
    'reserve.sta',
    [
      statement(
        RESERVE,
        [entry('2024-02-28', 20000, 'Tax reserve transfer')],
        [balance('opening', '2024-02-27', 50000, 'end'), balance('closing', '2024-02-28', 70000)],
      ),
    ],
    'mt940',
  ),
  result('usd.csv', [statement('Z-1', [entry('2024-02-28', 700, 'x')], [], { currency: 'USD' })], 'csv'),
]);

describe('dailySeries', () => {
  it('zero-fills every calendar day across a leap-year month end', () => {
    const s = dailySeries(ledger, { accountIds: [BUSINESS] });
    expect(s.start).toBe('2024-02-26');
    expect(s.days).toBe(5); // 26, 27, 28, 29 Feb, 1 Mar
    const a = s.accounts[0]!;
    expect(Array.from(a.inflow)).toEqual([0, 5000, 0, 0, 250000]);
    expect(Array.from(a.outflow)).toEqual([0, 1200, 0, 300, 90000]);
    expect(Array.from(a.net)).toEqual([0, 3800, 0, -300, 160000]);
    expect(Array.from(a.balance)).toEqual([100000, 103800, 103800, 103500, 263500]);
    expect(a.relative).toBe(false);
  });

  it('combines the accounts of one currency day by day', () => {
    const s = dailySeries(ledger, { currency: 'EUR' });
    expect(s.currency).toBe('EUR');
    expect(s.accounts.map((a) => a.accountId)).toEqual([BUSINESS, RESERVE]);
    expect(s.start).toBe('2024-02-26');
    expect(s.days).toBe(5);
    // The reserve holds 500.00 from its opening (end of 27 Feb) and also before it.
    expect(Array.from(s.accounts[1]!.balance)).toEqual([50000, 50000, 70000, 70000, 70000]);
    expect(Array.from(s.combined.balance)).toEqual([150000, 153800, 173800, 173500, 333500]);
    expect(Array.from(s.combined.inflow)).toEqual([0, 5000, 20000, 0, 250000]);
    expect(Array.from(s.combined.outflow)).toEqual([0, 1200, 0, 300, 90000]);
  });

  it('cuts to a range: earlier entries go into the balance, later ones are left out', () => {
    const s = dailySeries(ledger, { accountIds: [BUSINESS] }, { from: '2024-02-28', to: '2024-02-29' });
    expect(s.start).toBe('2024-02-28');
    expect(s.days).toBe(2);
    expect(Array.from(s.combined.balance)).toEqual([103800, 103500]);
    expect(Array.from(s.combined.inflow)).toEqual([0, 0]);
  });

  it('extends a range beyond the data with zero flows and a flat balance', () => {
    const s = dailySeries(ledger, { accountIds: [BUSINESS] }, { from: '2024-02-20', to: '2024-03-31' });
    expect(s.days).toBe(41);
    expect(s.combined.balance[0]).toBe(100000);
    expect(s.combined.balance[40]).toBe(263500);
    expect(s.combined.net.reduce((x, y) => x + y, 0)).toBe(163500);
  });

  it('refuses mixed currencies without an account or currency choice', () => {
    expect(errorCode(() => dailySeries(ledger))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => dailySeries(ledger, { accountIds: [BUSINESS, 'Z1'] }))).toBe('INVALID_ARGUMENT');
    expect(dailySeries(ledger, { currency: 'USD' }).accounts.map((a) => a.accountId)).toEqual(['Z1']);
  });

  it('marks a series without stated balances as relative', () => {
    const s = dailySeries(ledger, { currency: 'USD' });
    expect(s.combined.relative).toBe(true);
    expect(Array.from(s.combined.balance)).toEqual([700]);
  });

  it('refuses unknown accounts, empty scopes and reversed ranges', () => {
    expect(errorCode(() => dailySeries(ledger, { accountIds: ['nope'] }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => dailySeries(ledger, { currency: 'JPY' }))).toBe('INVALID_ARGUMENT');
    expect(errorCode(() => dailySeries(ledger, { currency: 'EUR' }, { from: '2024-03-02', to: '2024-03-01' }))).toBe(
      'INVALID_ARGUMENT',
    );
    expect(errorCode(() => dailySeries(ledger, { currency: 'EUR' }, { from: '2024-02-30' }))).toBe('INVALID_DATE');
  });

  it('covers a whole year of a month-end pattern with one entry per month end', () => {
    const entries = Array.from({ length: 12 }, (_, m) => {
      const last = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][m]!;
      return entry(`2025-${String(m + 1).padStart(2, '0')}-${last}`, -100, 'Owner draw');
    });
    const l = buildLedger([result('y.csv', [statement(undefined, entries)], 'csv')]);
    const s = dailySeries(l, {}, { from: '2025-01-01', to: '2025-12-31' });
    expect(s.days).toBe(365);
    const outflowDays = Array.from(s.combined.outflow).flatMap((v, i) => (v > 0 ? [i] : []));
    expect(outflowDays).toEqual([30, 58, 89, 119, 150, 180, 211, 242, 272, 303, 333, 364]);
  });
});
