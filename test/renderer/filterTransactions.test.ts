import { describe, expect, it } from 'vitest';
import type { TransactionRecord } from '../../renderer/src/lib/db/records';
import { filterTransactions, prepareRows, queryWords } from '../../renderer/src/lib/transactions/filterTransactions';

function tx(
  id: string,
  bookingDate: string,
  amount: number,
  description: string,
  extra: Partial<Pick<TransactionRecord, 'accountId' | 'currency' | 'counterparty' | 'reference'>> = {},
): TransactionRecord {
  return {
    id,
    seq: Number(id),
    accountId: 'A',
    bookingDate,
    amount,
    currency: 'EUR',
    description,
    fingerprint: id,
    statementId: 's',
    ...extra,
  };
}

const records: readonly TransactionRecord[] = Object.freeze([
  tx('3', '2026-01-03', -121000, 'Studio rent January', { counterparty: 'Marram Lettings', reference: 'RENT-01' }),
  tx('1', '2026-01-01', 56965, 'Card takings Saturday market'),
  tx('2', '2026-01-02', -650, 'Account fee', { accountId: 'B', currency: 'USD' }),
  tx('4', '2026-02-01', -121000, 'Studio rent February', { counterparty: 'Marram Lettings' }),
]);

describe('prepareRows', () => {
  it('sorts by date, then ledger order, without touching its input, and prepares lower-cased search text', () => {
    const rows = prepareRows(records);
    expect(rows.map((r) => r.id)).toEqual(['1', '2', '3', '4']);
    const sameDay = prepareRows([tx('9', '2026-01-01', 1, 'b'), tx('8', '2026-01-01', 1, 'a')]);
    expect(sameDay.map((r) => r.id)).toEqual(['8', '9']);
    expect(records.map((r) => r.id)).toEqual(['3', '1', '2', '4']);
    expect(rows[2]!.searchText).toBe('studio rent january\nmarram lettings\nrent-01');
  });
});

describe('filterTransactions', () => {
  const rows = prepareRows(records);
  const ids = (f: Parameters<typeof filterTransactions>[1], order: 'asc' | 'desc' = 'asc') =>
    Array.from(filterTransactions(rows, f, order).indexes, (i) => rows[i]!.id);

  it('lists everything, newest first by default', () => {
    expect(Array.from(filterTransactions(rows, {}).indexes, (i) => rows[i]!.id)).toEqual(['4', '3', '2', '1']);
  });

  it('needs every search word, in description, counterparty or reference', () => {
    expect(ids({ query: 'RENT marram' })).toEqual(['3', '4']);
    expect(ids({ query: 'rent-01' })).toEqual(['3']);
    expect(ids({ query: '  ' })).toEqual(['1', '2', '3', '4']);
    expect(queryWords(' A  b ')).toEqual(['a', 'b']);
  });

  it('filters by account, inclusive date range, direction and magnitude', () => {
    expect(ids({ accountIds: ['B'] })).toEqual(['2']);
    expect(ids({ from: '2026-01-02', to: '2026-01-03' })).toEqual(['2', '3']);
    expect(ids({ direction: 'in' })).toEqual(['1']);
    expect(ids({ direction: 'out', minAmount: 1000 })).toEqual(['3', '4']);
    expect(ids({ maxAmount: 650 })).toEqual(['2']);
  });

  it('totals the filtered rows per currency', () => {
    const { totals } = filterTransactions(rows, {});
    expect(totals).toEqual([
      { currency: 'EUR', count: 3, inflow: 56965, outflow: -242000, net: -185035 },
      { currency: 'USD', count: 1, inflow: 0, outflow: -650, net: -650 },
    ]);
  });

  it('filters 100,000 rows into a typed index without copying them', () => {
    const many = prepareRows(
      Array.from({ length: 100_000 }, (_, i) =>
        tx(
          String(i).padStart(6, '0'),
          `2025-${String((i % 12) + 1).padStart(2, '0')}-01`,
          i % 2 ? -100 : 100,
          i % 10 ? 'coffee' : 'rent',
        ),
      ),
    );
    const r = filterTransactions(many, { query: 'rent', direction: 'in' });
    expect(r.indexes).toBeInstanceOf(Int32Array);
    expect(r.indexes.length).toBe(10_000);
    expect(r.totals[0]!.inflow).toBe(1_000_000);
  });
});
