/**
 * One camt.053 `Ntry` (ReportEntry2 … ReportEntry15) to a `StatementEntry`.
 *
 * Rules (element paths below Document/BkToCstmrStmt/Stmt/Ntry, ISO 20022 camt.053.001.NN):
 * - `Amt@Ccy` unsigned; `CdtDbtInd` CRDT → +, DBIT → −. The currency must be the statement's.
 * - `RvslInd` true marks a reversal. Its sign is still the one `CdtDbtInd` gives: the ISO
 *   definition says a reversal of a debit is reported as CRDT and of a credit as DBIT, so a
 *   reversed debit comes back as money in. The entry is kept as it is (no flag in the data model).
 * - `Sts`: plain code up to 001.07 (`<Sts>BOOK</Sts>`), `<Sts><Cd>BOOK</Cd></Sts>` from
 *   001.08; both forms are accepted in every version. BOOK → booked. PDNG, INFO and FUTR →
 *   status 'pending' plus a notice (not counted as booked). Other codes are refused.
 * - `BookgDt` (required for booked entries) and `ValDt`: `Dt` or `DtTm` (date as written).
 * - `AcctSvcrRef` → bankRef, else `NtryRef`, else the single transaction's `Refs/AcctSvcrRef`.
 * - `BkTxCd/Domn` → typeCode `DOMN/FMLY/SUBF` (e.g. `PMNT/ICDT/ESCT`), else `BkTxCd/Prtry/Cd`.
 * - One transaction (`NtryDtls/TxDtls`): `Refs/EndToEndId` → reference (except the
 *   placeholder NOTPROVIDED); `RmtInf/Ustrd` pieces joined, then `RmtInf/Strd/CdtrRefInf/Ref`
 *   → description; fallback `AddtlTxInf`, then `Ntry/AddtlNtryInf`. Counterparty: the other
 *   party, `RltdPties/Cdtr` for a debit, `RltdPties/Dbtr` for a credit (`Pty/Nm` from 001.08,
 *   `Nm` before; both accepted), falling back to the ultimate creditor / debtor.
 * - Ustrd pieces: a piece of exactly 140 characters (the Max140Text limit) continues in the
 *   next piece without a space (it was split for length); shorter pieces are joined by a space.
 * - Batch (`NtryDtls/Btch/NbOfTxs` > 1, or more than one `TxDtls`): kept as ONE entry with
 *   the booked `Ntry/Amt`, because that is what moved the balance. Description:
 *   `AddtlNtryInf (batch of N transactions)`, or `Batch of N transactions[ PmtInfId]`;
 *   reference `Btch/PmtInfId`; counterparty only when every transaction names the same one.
 */
import type { StatementEntry } from '../types';
import type { XmlElement } from '../xml';
import { type StatementContext, readAmount, readCreditDebit, readDateChoice } from './fields';
import { child, children, clip, descend, ownText, rawText, textOf } from './values';

/** Max140Text: a Ustrd piece this long was most likely split for length. */
const USTRD_MAX = 140;

/**
 * Reads one `Ntry`. Problems go to `ctx.problems` with element paths below `path`.
 * @returns the entry, or undefined when it has errors or is left out.
 * @example readEntry(ntryElement, 'Document/BkToCstmrStmt/Stmt[1]/Ntry[3]', ctx)
 */
export function readEntry(ntry: XmlElement, path: string, ctx: StatementContext): StatementEntry | undefined {
  const ns = ctx.ns;
  const problems = ctx.problems;
  const errorsBefore = problems.errorCount;

  const amtEl = child(ntry, 'Amt', ns);
  let minor: number | undefined;
  if (amtEl) minor = readAmount(amtEl, `${path}/Amt`, ctx);
  else problems.error(`${path}/Amt`, ntry.line, 'missing, expected the entry amount <Amt Ccy="…">');
  const direction = readCreditDebit(ntry, path, ctx);

  const rvsl = child(ntry, 'RvslInd', ns);
  if (rvsl) {
    const v = textOf(rvsl);
    if (v !== 'true' && v !== 'false' && v !== '1' && v !== '0') {
      problems.error(`${path}/RvslInd`, rvsl.line, `"${clip(v)}", expected true or false`);
    }
  }

  const status = readStatus(ntry, path, ctx);

  const bookingEl = child(ntry, 'BookgDt', ns);
  const valueEl = child(ntry, 'ValDt', ns);
  const bookingDate = bookingEl ? readDateChoice(bookingEl, `${path}/BookgDt`, ctx) : undefined;
  const valueDate = valueEl ? readDateChoice(valueEl, `${path}/ValDt`, ctx) : undefined;
  if (!bookingEl && status !== 'pending') {
    problems.error(`${path}/BookgDt`, ntry.line, 'missing, expected Dt or DtTm');
  }

  if (problems.errorCount > errorsBefore || minor === undefined || direction === undefined || !status) {
    return undefined;
  }
  const date = bookingDate ?? valueDate;
  if (date === undefined) {
    problems.notice(path, ntry.line, 'pending entry without BookgDt or ValDt left out');
    return undefined;
  }
  if (status === 'pending') {
    problems.notice(path, ntry.line, `pending entry (Sts ${statusCode(ntry, ns)}) on ${date}, not counted as booked`);
  }

  const amount = direction === 'DBIT' ? (minor === 0 ? 0 : -minor) : minor;
  const details = readDetails(ntry, direction, ctx);
  const addtl = textOf(child(ntry, 'AddtlNtryInf', ns));
  const bankRef =
    nonEmpty(textOf(child(ntry, 'AcctSvcrRef', ns))) ?? nonEmpty(textOf(child(ntry, 'NtryRef', ns))) ?? details.bankRef;

  let description: string;
  if (details.batchSize > 1) {
    const n = details.batchSize;
    description = addtl
      ? `${addtl} (batch of ${n} transactions)`
      : `Batch of ${n} transactions${details.reference ? ' ' + details.reference : ''}`;
  } else {
    description = details.description || details.additional || addtl;
  }

  // What the entry keeps is copied out of the document (see ownText); strings that repeat
  // from entry to entry are shared through the statement's pool.
  const texts = ctx.texts;
  const share = (text: string): string => (texts ? texts.intern(text) : ownText(text));
  const day = share(date);
  const text = ownText(description.trim());
  const source = { line: ntry.line, element: path };
  const value = valueDate === undefined ? undefined : valueDate === date ? day : share(valueDate);
  const counterparty = details.counterparty ? share(details.counterparty) : undefined;
  const reference = details.reference ? ownText(details.reference) : undefined;
  const bank = bankRef ? ownText(bankRef) : undefined;
  const rawType = readTypeCode(ntry, ns);
  const typeCode = rawType ? share(rawType) : undefined;
  return entryOf(day, amount, text, status, source, value, counterparty, reference, bank, typeCode);
}

/**
 * The entry with only the fields that are present, keys in one order. The shapes camt
 * entries usually have are written as whole literals: adding the optional fields one by one
 * would give each entry a separate property store.
 */
function entryOf(
  bookingDate: string,
  amount: number,
  description: string,
  status: 'booked' | 'pending',
  source: { line: number; element: string },
  valueDate: string | undefined,
  counterparty: string | undefined,
  reference: string | undefined,
  bankRef: string | undefined,
  typeCode: string | undefined,
): StatementEntry {
  const shape =
    (valueDate !== undefined ? 1 : 0) |
    (counterparty !== undefined ? 2 : 0) |
    (reference !== undefined ? 4 : 0) |
    (bankRef !== undefined ? 8 : 0) |
    (typeCode !== undefined ? 16 : 0);
  // prettier-ignore
  switch (shape) {
    case 25:
      return { bookingDate, amount, description, status, source, valueDate, bankRef, typeCode };
    case 27:
      return { bookingDate, amount, description, status, source, valueDate, counterparty, bankRef, typeCode };
    case 31:
      return { bookingDate, amount, description, status, source, valueDate, counterparty, reference, bankRef, typeCode };
    default: {
      const entry: { -readonly [K in keyof StatementEntry]: StatementEntry[K] } = {
        bookingDate, amount, description, status, source,
      };
      if (valueDate !== undefined) entry.valueDate = valueDate;
      if (counterparty !== undefined) entry.counterparty = counterparty;
      if (reference !== undefined) entry.reference = reference;
      if (bankRef !== undefined) entry.bankRef = bankRef;
      if (typeCode !== undefined) entry.typeCode = typeCode;
      return entry;
    }
  }
}

function nonEmpty(s: string | undefined): string | undefined {
  return s === undefined || s === '' ? undefined : s;
}

function statusCode(ntry: XmlElement, ns: string): string {
  const sts = child(ntry, 'Sts', ns);
  if (!sts) return '';
  const coded = child(sts, 'Cd', ns) ?? child(sts, 'Prtry', ns);
  return textOf(coded ?? sts);
}

function readStatus(ntry: XmlElement, path: string, ctx: StatementContext): 'booked' | 'pending' | undefined {
  const sts = child(ntry, 'Sts', ctx.ns);
  if (!sts) {
    ctx.problems.error(`${path}/Sts`, ntry.line, 'missing, expected BOOK, PDNG or INFO');
    return undefined;
  }
  const code = statusCode(ntry, ctx.ns);
  if (code === 'BOOK') return 'booked';
  if (code === 'PDNG' || code === 'INFO' || code === 'FUTR') return 'pending';
  ctx.problems.error(`${path}/Sts`, sts.line, `status "${clip(code)}", expected BOOK, PDNG, INFO or FUTR`);
  return undefined;
}

function readTypeCode(ntry: XmlElement, ns: string): string | undefined {
  const bk = child(ntry, 'BkTxCd', ns);
  if (!bk) return undefined;
  const domn = child(bk, 'Domn', ns);
  if (domn) {
    const d = textOf(child(domn, 'Cd', ns));
    const fmly = child(domn, 'Fmly', ns);
    const f = fmly ? textOf(child(fmly, 'Cd', ns)) : '';
    const s = fmly ? textOf(child(fmly, 'SubFmlyCd', ns)) : '';
    if (d && f && s) return `${d}/${f}/${s}`;
  }
  return nonEmpty(textOf(descend(bk, ns, 'Prtry', 'Cd')));
}

interface Details {
  description: string;
  additional: string;
  counterparty: string | undefined;
  reference: string | undefined;
  bankRef: string | undefined;
  batchSize: number;
}

function readDetails(ntry: XmlElement, direction: 'CRDT' | 'DBIT', ctx: StatementContext): Details {
  const ns = ctx.ns;
  const txs: XmlElement[] = [];
  let declared = 0;
  let pmtInfId: string | undefined;
  for (const dtls of children(ntry, 'NtryDtls', ns)) {
    for (const c of dtls.children) {
      if (c.kind !== 'element' || c.namespace !== ns) continue;
      if (c.localName === 'TxDtls') txs.push(c);
      else if (c.localName === 'Btch') {
        const n = Number(textOf(child(c, 'NbOfTxs', ns)));
        if (Number.isSafeInteger(n) && n > 0) declared += n;
        pmtInfId ??= nonEmpty(textOf(child(c, 'PmtInfId', ns)));
      }
    }
  }
  const batchSize = Math.max(declared, txs.length);
  const single = txs.length === 1 ? txs[0] : undefined;

  if (batchSize > 1) {
    const parties = new Set(txs.map((t) => counterpartyOf(t, direction, ns) ?? ''));
    const only = parties.size === 1 ? [...parties][0] : undefined;
    return {
      description: '',
      additional: '',
      counterparty: only ? only : undefined,
      reference: pmtInfId,
      bankRef: undefined,
      batchSize,
    };
  }
  if (!single) {
    return {
      description: '',
      additional: '',
      counterparty: undefined,
      reference: undefined,
      bankRef: undefined,
      batchSize,
    };
  }
  const refs = child(single, 'Refs', ns);
  const e2e = refs ? textOf(child(refs, 'EndToEndId', ns)) : '';
  return {
    description: remittanceOf(single, ns),
    additional: textOf(child(single, 'AddtlTxInf', ns)),
    counterparty: counterpartyOf(single, direction, ns),
    // Common practice, no source: "NOTPROVIDED" fills the mandatory EndToEndId when the payer gave none.
    reference: e2e && e2e !== 'NOTPROVIDED' ? e2e : undefined,
    bankRef: refs ? nonEmpty(textOf(child(refs, 'AcctSvcrRef', ns))) : undefined,
    batchSize,
  };
}

function remittanceOf(tx: XmlElement, ns: string): string {
  const rmt = child(tx, 'RmtInf', ns);
  if (!rmt) return '';
  let unstructured = '';
  let previousLength = -1;
  const refs: string[] = [];
  for (const c of rmt.children) {
    if (c.kind !== 'element' || c.namespace !== ns) continue;
    if (c.localName === 'Ustrd') {
      const piece = rawText(c);
      if (previousLength === -1) unstructured = piece;
      else unstructured += (previousLength >= USTRD_MAX ? '' : ' ') + piece;
      // Code points never outnumber UTF-16 units, so only long pieces need counting.
      previousLength = piece.length < USTRD_MAX ? piece.length : codePointLength(piece);
    } else if (c.localName === 'Strd') {
      const ref = textOf(descend(c, ns, 'CdtrRefInf', 'Ref'));
      if (ref) refs.push(ref);
    }
  }
  const parts = unstructured.trim() ? [unstructured.trim(), ...refs] : refs;
  return parts.join(' ');
}

function codePointLength(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0xd800 || c > 0xdbff) n++;
  }
  return n;
}

function partyName(party: XmlElement | undefined, ns: string): string | undefined {
  if (!party) return undefined;
  // From 001.08 the party is a choice Pty | Agt (Party40Choice); before, the name sits directly below.
  const pty = child(party, 'Pty', ns);
  const name = textOf(child(pty ?? party, 'Nm', ns));
  if (name) return name;
  const agt = child(party, 'Agt', ns);
  return agt ? nonEmpty(textOf(descend(agt, ns, 'FinInstnId', 'Nm'))) : undefined;
}

function counterpartyOf(tx: XmlElement, direction: 'CRDT' | 'DBIT', ns: string): string | undefined {
  const parties = child(tx, 'RltdPties', ns);
  if (!parties) return undefined;
  // The other party: who was paid for a debit, who paid for a credit.
  const [main, ultimate] = direction === 'DBIT' ? ['Cdtr', 'UltmtCdtr'] : ['Dbtr', 'UltmtDbtr'];
  return partyName(child(parties, main, ns), ns) ?? partyName(child(parties, ultimate, ns), ns);
}
