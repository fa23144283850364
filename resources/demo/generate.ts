/**
 * Generates the invented demo workspace "Tessellate Ceramics" (DESIGN.md section 8): a
 * one-person pottery studio with a business current account, a tax reserve savings account
 * and a household account, three years of history ending 2026-10-31, each account in a
 * different statement format, plus a CSV export that overlaps the business statements (to
 * show duplicate removal).
 *
 *   business current account (EUR)  camt.053.001.08, one file per month   business-YYYY-MM.xml
 *   tax reserve savings (EUR)       MT940, one file per year, a statement per month   reserve-YYYY.sta
 *   household account (EUR)         OFX 2.2, one file per quarter          household-YYYY-Qn.ofx
 *   business, last quarter again    CSV export (';', decimal comma, D.M.Y, newest first,
 *                                   running balance)                      business-export-2026-08-10.csv
 *
 * Everything is invented: the studio, its clients and suppliers, the banks (bank codes
 * HRBL, QFSB, TLMC under the NL prefix, with valid IBAN check digits so importers accept
 * them) and the tax offices. Patterns: Saturday market takings (weekly, noisy, stronger in
 * summer and before Christmas, slow after mid-December and in January), studio rent on the
 * 1st (next business day), kiln electricity by direct debit around the 5th (higher in
 * winter), quarterly VAT, commissions invoiced on net-30 terms that pay late with a spread
 * (references INV-YYYY-NNN), the owner's draw on the last business day (business →
 * household), a monthly transfer to the tax reserve, and household rent, groceries and bills.
 *
 * Deterministic: a fixed seed, one random substream per pattern (engine/core/random.ts), no
 * clock; running it twice gives the same bytes. Run with `npm run demo`.
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createRng, type Rng } from '../../engine/core/random';
import {
  addDays,
  daysInMonth,
  formatYmd,
  fromDayNumber,
  isWeekend,
  isoWeekday,
  toDayNumber,
  type CalendarDate,
} from '../../engine/core/dates';
import type { ParsedStatement, StatementBalance, StatementEntry } from '../../engine/import/types';
import { writeCamt053 } from '../../engine/write/camt053';
import { writeMt940 } from '../../engine/write/mt940';
import { writeOfx } from '../../engine/write/ofx';
import { writeCsv } from '../../engine/write/csv';
import { encodeText } from '../../engine/write/encode';

const SEED = 20261031;
/** First and last day of the statements. */
const FIRST_DAY = '2023-11-01';
const LAST_DAY = '2026-10-31';
/** The business is simulated from here so that invoices, VAT and balances are under way on FIRST_DAY. */
const SIMULATION_START = '2023-07-01';
const OUT_DIR = join(new URL('.', import.meta.url).pathname, 'statements');

const BUSINESS_IBAN = 'NL21HRBL0412345670';
const RESERVE_IBAN = 'NL35QFSB0100200300';
const HOUSEHOLD_IBAN = 'NL77TLMC0203040506';

// ---------------------------------------------------------------- calendar helpers

function dayOf(date: CalendarDate): number {
  return toDayNumber(date);
}

/** The date itself or the next weekday (the demo's invented country has no public holidays). */
function nextBusinessDay(date: CalendarDate): CalendarDate {
  let d = dayOf(date);
  while (isWeekend(d)) d++;
  return fromDayNumber(d);
}

function lastBusinessDay(year: number, month: number): CalendarDate {
  let d = dayOf(formatYmd(year, month, daysInMonth(year, month)));
  while (isWeekend(d)) d--;
  return fromDayNumber(d);
}

function monthsBetween(first: CalendarDate, last: CalendarDate): { year: number; month: number }[] {
  const out: { year: number; month: number }[] = [];
  let year = Number(first.slice(0, 4));
  let month = Number(first.slice(5, 7));
  const endKey = Number(last.slice(0, 4)) * 12 + Number(last.slice(5, 7));
  while (year * 12 + month <= endKey) {
    out.push({ year, month });
    month++;
    if (month > 12) {
      month = 1;
      year++;
    }
  }
  return out;
}

const mm = (m: number) => String(m).padStart(2, '0');

// ---------------------------------------------------------------- random helpers

/** Cents, rounded from euros. */
function cents(euros: number): number {
  return Math.round(euros * 100);
}

/** A log-normal factor with mean 1 and log-sd `sigma`. */
function noise(rng: Rng, sigma: number): number {
  return Math.exp(sigma * rng.normal() - (sigma * sigma) / 2);
}

function uniform(rng: Rng, lo: number, hi: number): number {
  return lo + (hi - lo) * rng.nextFloat();
}

function pick<T>(rng: Rng, items: readonly T[]): T {
  return items[rng.nextInt(items.length)] as T;
}

/** One random substream per pattern, so changing one pattern leaves the others as they were. */
function stream(name: string): Rng {
  let h = SEED;
  for (let i = 0; i < name.length; i++) h = (Math.imul(h ^ name.charCodeAt(i), 0x01000193) >>> 0) % 2 ** 31;
  return createRng(h);
}

// ---------------------------------------------------------------- the ledger being simulated

interface DemoEntry {
  readonly account: 'business' | 'reserve' | 'household';
  readonly date: CalendarDate;
  readonly amount: number;
  readonly description: string;
  readonly counterparty: string;
  readonly reference?: string;
  readonly typeCode: string;
}

const entries: DemoEntry[] = [];

function book(e: DemoEntry): void {
  if (e.amount === 0) return;
  entries.push(e);
}

/** Monthly winter weight: 1 in January, 0 in July. */
function winterness(month: number): number {
  return (Math.cos((2 * Math.PI * (month - 1)) / 12) + 1) / 2;
}

/** Market takings relative to an average Saturday. */
function marketSeason(month: number, day: number): number {
  const byMonth = [0.55, 0.7, 0.85, 1.0, 1.15, 1.4, 1.55, 1.5, 1.1, 0.95, 1.45, 1.9];
  if (month === 12 && day > 15) return 0.35; // the slow second half of December
  return byMonth[month - 1] as number;
}

const months = monthsBetween(SIMULATION_START, LAST_DAY);
const inRange = (date: CalendarDate) => date >= SIMULATION_START && date <= LAST_DAY;

/** Σ of the business account's credits and supplies in [from, to]. */
function businessTotals(from: CalendarDate, to: CalendarDate): { inflow: number; supplies: number } {
  let inflow = 0;
  let supplies = 0;
  for (const e of entries) {
    if (e.account !== 'business' || e.date < from || e.date > to) continue;
    if (e.amount > 0) inflow += e.amount;
    if (e.counterparty === 'Riverclay Supplies') supplies -= e.amount;
  }
  return { inflow, supplies };
}

/** Opening balance of the tax reserve at SIMULATION_START, in cents. */
const RESERVE_START = 420000;

/** Adds quarterly interest to the reserve, computed on the balance so far. */
function addReserveInterest(): void {
  let balance = RESERVE_START;
  const sorted = entries.filter((e) => e.account === 'reserve').sort((a, b) => (a.date < b.date ? -1 : 1));
  let i = 0;
  for (const { year, month } of months) {
    const end = formatYmd(year, month, daysInMonth(year, month));
    while (i < sorted.length && (sorted[i] as DemoEntry).date <= end) balance += (sorted[i++] as DemoEntry).amount;
    if (month % 3 !== 0) continue;
    const interest = Math.round((balance * 0.015) / 4);
    book({
      account: 'reserve',
      date: end,
      amount: interest,
      description: `Interest ${year} Q${month / 3}`,
      counterparty: 'Quillfield Savings Bank',
      typeCode: 'NINT',
    });
    balance += interest;
  }
}

// ---------------------------------------------------------------- statements and files

const STARTING = { business: 650000, reserve: RESERVE_START, household: 240000 } as const;

function toStatementEntries(
  account: DemoEntry['account'],
  from: CalendarDate,
  to: CalendarDate,
  refPrefix?: string,
): StatementEntry[] {
  const list = entries
    .filter((e) => e.account === account && e.date >= from && e.date <= to)
    .map((e, i) => ({ e, i }))
    .sort((a, b) => (a.e.date < b.e.date ? -1 : a.e.date > b.e.date ? 1 : a.i - b.i))
    .map((x) => x.e);
  const perDay = new Map<string, number>();
  return list.map((e) => {
    const n = (perDay.get(e.date) ?? 0) + 1;
    perDay.set(e.date, n);
    return {
      bookingDate: e.date,
      valueDate: e.date,
      amount: e.amount,
      description: e.description,
      counterparty: e.counterparty,
      ...(e.reference !== undefined ? { reference: e.reference } : {}),
      ...(refPrefix !== undefined
        ? { bankRef: `${refPrefix}${e.date.replace(/-/g, '')}${String(n).padStart(3, '0')}` }
        : {}),
      status: 'booked' as const,
      typeCode: e.typeCode,
      source: {},
    };
  });
}

/** Balance of an account at the end of `date` (from its starting balance at SIMULATION_START). */
function balanceAt(account: DemoEntry['account'], date: CalendarDate): number {
  let b: number = STARTING[account];
  for (const e of entries) if (e.account === account && e.date <= date) b += e.amount;
  return b;
}

function statementFor(
  account: DemoEntry['account'],
  identifier: string,
  name: string,
  kind: 'current' | 'savings',
  from: CalendarDate,
  to: CalendarDate,
  statementId: string,
  refPrefix?: string,
): ParsedStatement {
  const opening = balanceAt(account, addDays(from, -1));
  const closing = balanceAt(account, to);
  const balances: StatementBalance[] = [
    { kind: 'opening', date: from, at: 'start', amount: opening, source: {} },
    { kind: 'closing', date: to, at: 'end', amount: closing, source: {} },
  ];
  return {
    account: { identifier, name, kind },
    currency: 'EUR',
    statementId,
    from,
    to,
    entries: toStatementEntries(account, from, to, refPrefix),
    balances,
  };
}

/** Simulates every pattern into `entries` (cleared first). */
function simulate(): void {
  entries.length = 0;
  // Saturday market takings, settled by the (invented) card acquirer on the day.
  {
    const rng = stream('market');
    for (let d = dayOf(SIMULATION_START); d <= dayOf(LAST_DAY); d++) {
      if (isoWeekday(d) !== 6) continue;
      const date = fromDayNumber(d);
      const month = Number(date.slice(5, 7));
      const day = Number(date.slice(8, 10));
      if (rng.nextFloat() < 0.07) continue; // rained off
      const years = (d - dayOf(SIMULATION_START)) / 365.25;
      const amount = 520 * marketSeason(month, day) * (1 + 0.04 * years) * noise(rng, 0.3);
      book({
        account: 'business',
        date,
        amount: cents(amount),
        description: `Card takings Saturday makers market ${date}`,
        counterparty: 'Tillpoint Payments',
        typeCode: 'PMNT/CCRD/POSC',
      });
    }
  }

  // Monthly business outgoings and the owner's draw.
  {
    const power = stream('electricity');
    const supplies = stream('supplies');
    for (const { year, month } of months) {
      const first = formatYmd(year, month, 1);
      const rent = { 2023: 850, 2024: 875, 2025: 900, 2026: 925 }[year] ?? 925;
      book({
        account: 'business',
        date: nextBusinessDay(first),
        amount: -cents(rent),
        description: `Studio rent ${mm(month)}/${year} unit 4`,
        counterparty: 'Kilnyard Studios',
        typeCode: 'PMNT/ICDT/ESCT',
      });
      book({
        account: 'business',
        date: nextBusinessDay(formatYmd(year, month, 5)),
        amount: -cents((95 + 85 * winterness(month)) * noise(power, 0.12)),
        description: `Direct debit kiln and studio electricity ${mm(month)}/${year}`,
        counterparty: 'Brightwell Energy',
        typeCode: 'PMNT/IDDT/ESDD',
      });
      book({
        account: 'business',
        date: nextBusinessDay(formatYmd(year, month, 15)),
        amount: -6500,
        description: `Pitch fee Saturday market ${mm(month)}/${year}`,
        counterparty: 'Makers Market Association',
        typeCode: 'PMNT/IDDT/ESDD',
      });
      book({
        account: 'business',
        date: nextBusinessDay(formatYmd(year, month, 20)),
        amount: -3250,
        description: `Studio phone and broadband ${mm(month)}/${year}`,
        counterparty: 'Pebblewire Telecom',
        typeCode: 'PMNT/IDDT/ESDD',
      });
      const orders = 1 + supplies.nextInt(3);
      for (let k = 0; k < orders; k++) {
        const day = 1 + supplies.nextInt(daysInMonth(year, month));
        book({
          account: 'business',
          date: nextBusinessDay(formatYmd(year, month, day)),
          amount: -cents(uniform(supplies, 40, 300)),
          description: `Clay and glaze order RC-${year}${mm(month)}${k + 1}`,
          counterparty: 'Riverclay Supplies',
          typeCode: 'PMNT/ICDT/ESCT',
        });
      }
      if (month === 3) {
        book({
          account: 'business',
          date: nextBusinessDay(formatYmd(year, 3, 10)),
          amount: -34800,
          description: `Studio contents and kiln insurance ${year}`,
          counterparty: 'Stoutheart Insurance',
          typeCode: 'PMNT/IDDT/ESDD',
        });
      }
      const draw = { 2023: 1850, 2024: 1900, 2025: 2000, 2026: 2050 }[year] ?? 2050;
      const drawDate = lastBusinessDay(year, month);
      book({
        account: 'business',
        date: drawDate,
        amount: -cents(draw),
        description: `Owner's draw ${mm(month)}/${year}`,
        counterparty: 'Tessellate Ceramics owner household',
        typeCode: 'PMNT/ICDT/ESCT',
      });
      book({
        account: 'household',
        date: drawDate,
        amount: cents(draw),
        description: `Owner's draw ${mm(month)}/${year}`,
        counterparty: 'Tessellate Ceramics',
        typeCode: 'XFER',
      });
      book({
        account: 'business',
        date: formatYmd(year, month, daysInMonth(year, month)),
        amount: -650,
        description: 'Account fee',
        counterparty: 'Harbourline Mutual',
        typeCode: 'ACMT/MDOP/CHRG',
      });
    }
  }

  // Commissions: invoices on net-30 terms, paid late with a spread. Invoices issued after the
  // last statement day stay open; an invoice paid after it is simply not in the statements.
  {
    const rng = stream('commissions');
    const clients = [
      'Fennel & Rye Bistro',
      'Oakhollow Florists',
      'Pemberkin Interiors',
      'Saltmarrow Cafe',
      'Quillstone Gallery',
      'Thistledown Tea Rooms',
      'Brackenfold Hotel',
    ];
    const counter = new Map<number, number>();
    for (const { year, month } of months) {
      const invoices = rng.nextFloat() < 0.15 ? 0 : 1 + rng.nextInt(3);
      for (let k = 0; k < invoices; k++) {
        const issued = nextBusinessDay(formatYmd(year, month, 1 + rng.nextInt(daysInMonth(year, month))));
        const n = (counter.get(year) ?? 0) + 1;
        counter.set(year, n);
        const ref = `INV-${year}-${String(n).padStart(3, '0')}`;
        const amount = Math.min(3200, Math.max(350, 1250 * noise(rng, 0.45)));
        const u = rng.nextFloat();
        const delay = u < 0.25 ? -rng.nextInt(6) : u < 0.75 ? 1 + rng.nextInt(20) : 21 + rng.nextInt(35);
        const paid = nextBusinessDay(addDays(issued, 30 + delay));
        if (!inRange(paid)) continue;
        book({
          account: 'business',
          date: paid,
          amount: cents(amount),
          description: `Payment ${ref} commission tableware`,
          counterparty: pick(rng, clients),
          reference: ref,
          typeCode: 'PMNT/RCDT/ESCT',
        });
      }
    }
  }

  // Quarterly VAT on the 25th of the month after each quarter, and the monthly transfer to the
  // tax reserve on the 10th; both follow the business's own takings, so they come after them.
  {
    for (const { year, month } of months) {
      if (month % 3 === 1) {
        const qEndMonth = month === 1 ? 12 : month - 1;
        const qYear = month === 1 ? year - 1 : year;
        const qStart = formatYmd(qYear, qEndMonth - 2, 1);
        const qEnd = formatYmd(qYear, qEndMonth, daysInMonth(qYear, qEndMonth));
        if (qStart >= SIMULATION_START) {
          const t = businessTotals(qStart, qEnd);
          const vat = Math.round(t.inflow * 0.095 - t.supplies * 0.15);
          book({
            account: 'business',
            date: nextBusinessDay(formatYmd(year, month, 25)),
            amount: -vat,
            description: `VAT return ${qYear} Q${qEndMonth / 3} ref VAT-TC-${qYear}${qEndMonth / 3}`,
            counterparty: 'Office of Indirect Taxes',
            typeCode: 'PMNT/ICDT/ESCT',
          });
        }
      }
      const prevYear = month === 1 ? year - 1 : year;
      const prevMonth = month === 1 ? 12 : month - 1;
      const prevStart = formatYmd(prevYear, prevMonth, 1);
      if (prevStart < SIMULATION_START) continue;
      const t = businessTotals(prevStart, formatYmd(prevYear, prevMonth, daysInMonth(prevYear, prevMonth)));
      const transfer = Math.round((t.inflow * 0.12) / 1000) * 1000; // whole 10 euros
      const date = nextBusinessDay(formatYmd(year, month, 10));
      book({
        account: 'business',
        date,
        amount: -transfer,
        description: `Transfer to tax reserve ${mm(prevMonth)}/${prevYear}`,
        counterparty: 'Tessellate Ceramics tax reserve',
        typeCode: 'PMNT/ICDT/ESCT',
      });
      book({
        account: 'reserve',
        date,
        amount: transfer,
        description: `Transfer from business account ${mm(prevMonth)}/${prevYear}`,
        counterparty: 'Tessellate Ceramics',
        typeCode: 'NTRF',
      });
    }
  }

  // Tax reserve: quarterly income tax prepayments, a yearly settlement, quarterly interest.
  {
    const rng = stream('reserve');
    for (const { year, month } of months) {
      if (month % 3 === 2) {
        const prepayment = { 2023: 1200, 2024: 1300, 2025: 1400, 2026: 1500 }[year] ?? 1500;
        book({
          account: 'reserve',
          date: nextBusinessDay(formatYmd(year, month, 15)),
          amount: -cents(prepayment),
          description: `Income tax prepayment ${year} Q${Math.ceil(month / 3)}`,
          counterparty: 'Office of Direct Taxes',
          typeCode: 'NTRF',
        });
      }
      if (month === 7) {
        book({
          account: 'reserve',
          date: nextBusinessDay(formatYmd(year, 7, 22)),
          amount: cents(uniform(rng, -700, 250)),
          description: `Income tax settlement ${year - 1}`,
          counterparty: 'Office of Direct Taxes',
          typeCode: 'NTRF',
        });
      }
    }
  }

  addReserveInterest();

  // Household: rent, groceries, energy, phone, transport, and a December with presents.
  {
    const rng = stream('household');
    for (const { year, month } of months) {
      const rent = { 2023: 1150, 2024: 1150, 2025: 1180, 2026: 1210 }[year] ?? 1210;
      book({
        account: 'household',
        date: nextBusinessDay(formatYmd(year, month, 1)),
        amount: -cents(rent),
        description: `Flat rent ${mm(month)}/${year}`,
        counterparty: 'Marram Lettings',
        typeCode: 'XFER',
      });
      book({
        account: 'household',
        date: nextBusinessDay(formatYmd(year, month, 12)),
        amount: -cents((55 + 55 * winterness(month)) * noise(rng, 0.1)),
        description: `Home energy ${mm(month)}/${year}`,
        counterparty: 'Brightwell Energy',
        typeCode: 'DIRECTDEBIT',
      });
      book({
        account: 'household',
        date: nextBusinessDay(formatYmd(year, month, 18)),
        amount: -2200,
        description: `Mobile plan ${mm(month)}/${year}`,
        counterparty: 'Pebblewire Telecom',
        typeCode: 'DIRECTDEBIT',
      });
      for (let k = 0; k < 2; k++) {
        book({
          account: 'household',
          date: nextBusinessDay(formatYmd(year, month, 3 + k * 14 + rng.nextInt(5))),
          amount: -3000,
          description: 'Transit pass top-up',
          counterparty: 'Metro Fare Office',
          typeCode: 'POS',
        });
      }
      if (month === 12) {
        book({
          account: 'household',
          date: nextBusinessDay(formatYmd(year, 12, 10 + rng.nextInt(8))),
          amount: -cents(uniform(rng, 180, 320)),
          description: 'Presents and decorations',
          counterparty: 'Lanternway Department Store',
          typeCode: 'POS',
        });
      }
    }
    const shops = ['Greengage Grocers', 'Corner Pantry'];
    for (let d = dayOf(SIMULATION_START); d <= dayOf(LAST_DAY); d++) {
      const weekday = isoWeekday(d);
      if (weekday !== 2 && weekday !== 4 && weekday !== 6) continue;
      if (rng.nextFloat() > 0.75) continue;
      const weekly = weekday === 6 ? 75 : 38;
      book({
        account: 'household',
        date: fromDayNumber(d),
        amount: -cents(weekly * noise(rng, 0.35)),
        description: 'Groceries card payment',
        counterparty: pick(rng, shops),
        typeCode: 'POS',
      });
    }
  }
}

/**
 * Generates the demo statement files in memory: file name → bytes. Deterministic.
 * @example generateDemoFiles().get('business-2026-10.xml') // the October 2026 camt.053 file
 */
export function generateDemoFiles(): Map<string, Uint8Array> {
  simulate();
  const files = new Map<string, Uint8Array>();
  const statementMonths = monthsBetween(FIRST_DAY, LAST_DAY);

  for (const { year, month } of statementMonths) {
    const from = formatYmd(year, month, 1);
    const to = formatYmd(year, month, daysInMonth(year, month));
    const s = statementFor(
      'business',
      BUSINESS_IBAN,
      'Tessellate Ceramics business current account',
      'current',
      from,
      to,
      `HRBL-${year}-${mm(month)}`,
      'HRBL',
    );
    const xml = writeCamt053([s], { version: '001.08', messageId: `HRBL-STMT-${year}${mm(month)}` });
    files.set(`business-${year}-${mm(month)}.xml`, encodeText(xml, 'utf-8'));
  }

  for (const year of [...new Set(statementMonths.map((m) => m.year))]) {
    const statements = statementMonths
      .filter((m) => m.year === year)
      .map(({ month }) =>
        statementFor(
          'reserve',
          RESERVE_IBAN,
          'Tessellate Ceramics tax reserve',
          'savings',
          formatYmd(year, month, 1),
          formatYmd(year, month, daysInMonth(year, month)),
          `QFSB${year}${mm(month)}`,
          'QF',
        ),
      );
    files.set(`reserve-${year}.sta`, encodeText(writeMt940(statements), 'utf-8'));
  }

  const quarters = new Map<string, { year: number; quarter: number; months: number[] }>();
  for (const { year, month } of statementMonths) {
    const quarter = Math.ceil(month / 3);
    const key = `${year}-Q${quarter}`;
    const q = quarters.get(key) ?? { year, quarter, months: [] };
    q.months.push(month);
    quarters.set(key, q);
  }
  for (const { year, quarter, months: qMonths } of quarters.values()) {
    const firstMonth = qMonths[0] as number;
    const lastMonth = qMonths[qMonths.length - 1] as number;
    const s = statementFor(
      'household',
      HOUSEHOLD_IBAN,
      'Household account',
      'current',
      formatYmd(year, firstMonth, 1),
      formatYmd(year, lastMonth, daysInMonth(year, lastMonth)),
      `TLMC-${year}-Q${quarter}`,
    );
    // OFX states a ledger balance at the end only (no opening balance element).
    const ofxStatement: ParsedStatement = { ...s, balances: s.balances.filter((b) => b.kind === 'closing') };
    files.set(`household-${year}-Q${quarter}.ofx`, encodeText(writeOfx([ofxStatement], { version: 2 }), 'utf-8'));
  }

  {
    const from = '2026-08-01';
    const to = LAST_DAY;
    const s = statementFor('business', BUSINESS_IBAN, 'Tessellate Ceramics business', 'current', from, to, 'export');
    const csv = writeCsv(
      { ...s, entries: s.entries.map(({ valueDate: _v, typeCode: _t, ...rest }) => rest) },
      {
        delimiter: ';',
        decimalSeparator: ',',
        thousandsSeparator: '.',
        dateFormat: 'DD.MM.YYYY',
        signStyle: 'signed',
        runningBalance: true,
        newestFirst: true,
        preambleLines: [
          'Account;NL21 HRBL 0412 3456 70',
          'Account name;Tessellate Ceramics business',
          'Currency;EUR',
          '',
        ],
        includeCurrencyColumn: false,
        lineEnding: '\r\n',
        headerNames: { date: 'Booking date', description: 'Details', amount: 'Amount (EUR)', balance: 'Balance (EUR)' },
      },
    );
    files.set('business-export-2026-08-10.csv', encodeText(csv, 'utf-8-bom'));
  }
  return files;
}

// ---------------------------------------------------------------- write

function main(): void {
  const files = generateDemoFiles();
  mkdirSync(OUT_DIR, { recursive: true });
  for (const old of readdirSync(OUT_DIR)) {
    if (/^(business|reserve|household)-.*\.(xml|sta|ofx|csv)$/.test(old)) rmSync(join(OUT_DIR, old));
  }
  let total = 0;
  for (const [name, bytes] of [...files].sort(([a], [b]) => (a < b ? -1 : 1))) {
    writeFileSync(join(OUT_DIR, name), bytes);
    total += bytes.length;
  }

  function minimumBalance(account: DemoEntry['account']): { amount: number; date: string } {
    let b: number = STARTING[account];
    let min = { amount: b, date: SIMULATION_START };
    const sorted = entries.filter((e) => e.account === account).sort((x, y) => (x.date < y.date ? -1 : 1));
    for (const e of sorted) {
      b += e.amount;
      if (b < min.amount) min = { amount: b, date: e.date };
    }
    return min;
  }
  const summary = (['business', 'reserve', 'household'] as const).map((a) => {
    const min = minimumBalance(a);
    return `${a}: closing ${(balanceAt(a, LAST_DAY) / 100).toFixed(2)}, lowest ${(min.amount / 100).toFixed(2)} on ${min.date}`;
  });
  console.log(`wrote ${files.size} files, ${total} bytes, to ${OUT_DIR}\n${summary.join('\n')}`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
