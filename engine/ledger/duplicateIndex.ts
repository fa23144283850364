/**
 * Duplicate detection across overlapping statement files, one file at a time.
 *
 * Rules, in order:
 * 1. Bank ids: an entry whose bank id (OFX FITID, camt AcctSvcrRef/NtryRef, MT940 `//`
 *    reference) was seen on the same account in an earlier file is that earlier entry.
 * 2. Content fingerprints (engine/ledger/fingerprint.ts) for the rest. Genuinely repeated
 *    identical transactions are kept: within one file every occurrence counts, and a later
 *    file's k-th occurrence of a fingerprint is a duplicate only when earlier files already
 *    contributed at least k occurrences of it on that account. Two entries that both carry
 *    bank ids, and different ones, are never the same entry, so an entry with a new bank id
 *    only matches earlier entries without one; an entry without a bank id matches earlier
 *    entries with one first (they cannot be claimed by a bank id any more).
 *
 * Complexity: O(n) per file for n entries, plus the size of the few pools an entry touches.
 */

/** What the index needs of an entry. */
export interface DuplicateCandidate {
  readonly accountId: string;
  readonly fingerprint: string;
  readonly bankRef?: string;
}

interface PoolItem {
  readonly id: string;
  /** The bank id known for this kept entry (its own, or one later linked to it). */
  ref: string | undefined;
}

/** Mutable state carried from file to file while a ledger is built. Not plain data: internal. */
export interface DuplicateIndex {
  readonly refs: Map<string, string>;
  readonly pools: Map<string, PoolItem[]>;
  readonly items: Map<string, PoolItem>;
}

/** Placeholder bank ids that identify nothing (MT940 "NONREF" and the like). */
const PLACEHOLDER_REF = /^(NONREF|NOREF|NOTPROVIDED|NONE|N\/A|-+|0+)$/i;

/**
 * The usable bank id of an entry, trimmed, or undefined for empty and placeholder ids.
 * @example usableBankRef(' NONREF ') // undefined
 */
export function usableBankRef(bankRef: string | undefined): string | undefined {
  const ref = bankRef?.trim();
  return ref && !PLACEHOLDER_REF.test(ref) ? ref : undefined;
}

const SEP = '\u0000';

/** An empty index for a new ledger. */
export function createDuplicateIndex(): DuplicateIndex {
  return { refs: new Map(), pools: new Map(), items: new Map() };
}

/**
 * Finds which entries of one file are already in the ledger from earlier files.
 *
 * @returns per candidate the id of the earlier kept transaction it repeats, or null when new.
 * @example
 * const index = createDuplicateIndex();
 * findDuplicates(index, [{ accountId: 'A', fingerprint: 'f' }]); // [null]
 */
export function findDuplicates(index: DuplicateIndex, candidates: readonly DuplicateCandidate[]): (string | null)[] {
  const duplicateOf: (string | null)[] = new Array<string | null>(candidates.length).fill(null);
  const claimed = new Set<string>();
  // 1. Bank ids.
  candidates.forEach((c, i) => {
    const ref = usableBankRef(c.bankRef);
    if (ref === undefined) return;
    const earlier = index.refs.get(c.accountId + SEP + ref);
    if (earlier !== undefined) {
      duplicateOf[i] = earlier;
      claimed.add(earlier);
    }
  });
  // 2. Fingerprints, pool by pool, in file order.
  const groups = new Map<string, number[]>();
  candidates.forEach((c, i) => {
    if (duplicateOf[i] !== null) return;
    const key = c.accountId + SEP + c.fingerprint;
    const pool = index.pools.get(key);
    if (pool === undefined) return;
    const members = groups.get(key);
    if (members) members.push(i);
    else groups.set(key, [i]);
  });
  for (const [key, members] of groups) {
    const pool = (index.pools.get(key) as PoolItem[]).filter((item) => !claimed.has(item.id));
    const withRef = pool.filter((item) => item.ref !== undefined);
    const withoutRef = pool.filter((item) => item.ref === undefined);
    let r = 0;
    let n = 0;
    for (const i of members) {
      const hasRef = usableBankRef((candidates[i] as DuplicateCandidate).bankRef) !== undefined;
      let match: PoolItem | undefined;
      if (!hasRef && r < withRef.length) match = withRef[r++];
      else if (n < withoutRef.length) match = withoutRef[n++];
      if (match) duplicateOf[i] = match.id;
    }
  }
  return duplicateOf;
}

/**
 * Records a processed file: kept entries join the pools under their new ids, bank ids are
 * remembered (a duplicate's bank id is linked to the transaction it repeats).
 *
 * @param ids per candidate: the id of the kept transaction, or for a duplicate the id
 *   `findDuplicates` returned.
 * @param kept per candidate: true when it was kept.
 */
export function recordFile(
  index: DuplicateIndex,
  candidates: readonly DuplicateCandidate[],
  ids: readonly string[],
  kept: readonly boolean[],
): void {
  candidates.forEach((c, i) => {
    const id = ids[i] as string;
    const ref = usableBankRef(c.bankRef);
    if (kept[i]) {
      const item: PoolItem = { id, ref };
      index.items.set(id, item);
      const key = c.accountId + SEP + c.fingerprint;
      const pool = index.pools.get(key);
      if (pool) pool.push(item);
      else index.pools.set(key, [item]);
    } else if (ref !== undefined) {
      const item = index.items.get(id);
      if (item && item.ref === undefined) item.ref = ref;
    }
    if (ref !== undefined) {
      const refKey = c.accountId + SEP + ref;
      if (!index.refs.has(refKey)) index.refs.set(refKey, id);
    }
  });
}
