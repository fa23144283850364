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

/** A kept transaction as the index remembers it. */
export interface KeptEntry {
  readonly id: string;
  /** The bank id known for this kept entry (its own, or one later linked to it). */
  ref: string | undefined;
}

/**
 * Mutable state carried from file to file while a ledger is built. Not plain data: internal.
 * Maps are nested by account so that keys are the bank ids and fingerprints themselves (no
 * concatenated key strings to build and hash per entry).
 */
export interface DuplicateIndex {
  /** accountId → bank id → the kept transaction it names. */
  readonly refs: Map<string, Map<string, KeptEntry>>;
  /** accountId → fingerprint → kept transactions with it, in order. */
  readonly pools: Map<string, Map<string, KeptEntry[]>>;
}

function inner<V>(outer: Map<string, Map<string, V>>, key: string): Map<string, V> {
  let map = outer.get(key);
  if (map === undefined) {
    map = new Map<string, V>();
    outer.set(key, map);
  }
  return map;
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

/** An empty index for a new ledger. */
export function createDuplicateIndex(): DuplicateIndex {
  return { refs: new Map(), pools: new Map() };
}

/**
 * Finds which entries of one file are already in the ledger from earlier files.
 *
 * @returns per candidate the earlier kept transaction it repeats, or null when it is new.
 * @example
 * const index = createDuplicateIndex();
 * findDuplicates(index, [{ accountId: 'A', fingerprint: 'f' }]); // [null]
 */
export function findDuplicates(index: DuplicateIndex, candidates: readonly DuplicateCandidate[]): (KeptEntry | null)[] {
  const duplicateOf: (KeptEntry | null)[] = new Array<KeptEntry | null>(candidates.length).fill(null);
  const claimed = new Set<KeptEntry>();
  // 1. Bank ids.
  candidates.forEach((c, i) => {
    const ref = usableBankRef(c.bankRef);
    if (ref === undefined) return;
    const earlier = index.refs.get(c.accountId)?.get(ref);
    if (earlier !== undefined) {
      duplicateOf[i] = earlier;
      claimed.add(earlier);
    }
  });
  // 2. Fingerprints, pool by pool, in file order.
  const groups = new Map<KeptEntry[], number[]>();
  candidates.forEach((c, i) => {
    if (duplicateOf[i] !== null) return;
    const pool = index.pools.get(c.accountId)?.get(c.fingerprint);
    if (pool === undefined) return;
    const members = groups.get(pool);
    if (members) members.push(i);
    else groups.set(pool, [i]);
  });
  for (const [earlierPool, members] of groups) {
    const pool = earlierPool.filter((item) => !claimed.has(item));
    const withRef = pool.filter((item) => item.ref !== undefined);
    const withoutRef = pool.filter((item) => item.ref === undefined);
    let r = 0;
    let n = 0;
    for (const i of members) {
      const hasRef = usableBankRef((candidates[i] as DuplicateCandidate).bankRef) !== undefined;
      let match: KeptEntry | undefined;
      if (!hasRef && r < withRef.length) match = withRef[r++];
      else if (n < withoutRef.length) match = withoutRef[n++];
      if (match) duplicateOf[i] = match;
    }
  }
  return duplicateOf;
}

/**
 * Records a processed file: kept entries join the pools under their new ids, bank ids are
 * remembered (a duplicate's bank id is linked to the transaction it repeats).
 *
 * @param keptIds per candidate: the id given to it when kept, or null for a duplicate.
 * @param duplicateOf what `findDuplicates` returned for the same candidates.
 */
export function recordFile(
  index: DuplicateIndex,
  candidates: readonly DuplicateCandidate[],
  keptIds: readonly (string | null)[],
  duplicateOf: readonly (KeptEntry | null)[],
): void {
  let accountId: string | undefined;
  let pools = new Map<string, KeptEntry[]>();
  let refs = new Map<string, KeptEntry>();
  candidates.forEach((c, i) => {
    if (c.accountId !== accountId) {
      accountId = c.accountId;
      pools = inner(index.pools, accountId);
      refs = inner(index.refs, accountId);
    }
    const ref = usableBankRef(c.bankRef);
    const id = keptIds[i];
    let item = duplicateOf[i] ?? null;
    if (item === null && id !== null && id !== undefined) {
      item = { id, ref };
      const pool = pools.get(c.fingerprint);
      if (pool) pool.push(item);
      else pools.set(c.fingerprint, [item]);
    } else if (item !== null && ref !== undefined && item.ref === undefined) {
      item.ref = ref;
    }
    if (item !== null && ref !== undefined && !refs.has(ref)) refs.set(ref, item);
  });
}
