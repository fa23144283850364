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
  if (bankRef === undefined) return undefined;
  const ref = bankRef.trim();
  if (ref === '') return undefined;
  // Every placeholder starts with N, n, - or 0: other ids need no regular expression.
  const first = ref.charCodeAt(0);
  if (first !== 0x4e && first !== 0x6e && first !== 0x2d && first !== 0x30) return ref;
  return PLACEHOLDER_REF.test(ref) ? undefined : ref;
}

/** An empty index for a new ledger. */
export function createDuplicateIndex(): DuplicateIndex {
  return { refs: new Map(), pools: new Map() };
}

/**
 * One file's candidates as parallel arrays, the form the ledger builds (no object per
 * entry): account ids, fingerprints and usable bank ids (`usableBankRef` already applied).
 */
export interface CandidateColumns {
  readonly accountIds: readonly string[];
  readonly fingerprints: readonly string[];
  readonly refs: readonly (string | undefined)[];
}

/**
 * The columns of candidate objects.
 * @example candidateColumns([{ accountId: 'A', fingerprint: 'f', bankRef: ' NONREF ' }]).refs // [undefined]
 */
export function candidateColumns(candidates: readonly DuplicateCandidate[]): CandidateColumns {
  return {
    accountIds: candidates.map((c) => c.accountId),
    fingerprints: candidates.map((c) => c.fingerprint),
    refs: candidates.map((c) => usableBankRef(c.bankRef)),
  };
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
  return findDuplicateColumns(index, candidateColumns(candidates));
}

/**
 * `findDuplicates` for candidates given as columns.
 * @example findDuplicateColumns(createDuplicateIndex(), { accountIds: ['A'], fingerprints: ['f'], refs: [undefined] }) // [null]
 */
export function findDuplicateColumns(index: DuplicateIndex, candidates: CandidateColumns): (KeptEntry | null)[] {
  const { accountIds, fingerprints, refs: candidateRefs } = candidates;
  const n = accountIds.length;
  const duplicateOf: (KeptEntry | null)[] = new Array<KeptEntry | null>(n).fill(null);
  const claimed = new Set<KeptEntry>();
  // The account's maps are looked up once per run of candidates of one account; an account
  // seen in no earlier file has none, and then its candidates need no lookup at all.
  // 1. Bank ids.
  let accountId: string | undefined;
  let refs: Map<string, KeptEntry> | undefined;
  for (let i = 0; i < n; i++) {
    if (accountIds[i] !== accountId) {
      accountId = accountIds[i] as string;
      refs = index.refs.get(accountId);
    }
    const ref = candidateRefs[i];
    if (refs === undefined || ref === undefined) continue;
    const earlier = refs.get(ref);
    if (earlier !== undefined) {
      duplicateOf[i] = earlier;
      claimed.add(earlier);
    }
  }
  // 2. Fingerprints, pool by pool, in file order.
  const groups = new Map<KeptEntry[], number[]>();
  let pools: Map<string, KeptEntry[]> | undefined;
  accountId = undefined;
  for (let i = 0; i < n; i++) {
    if (accountIds[i] !== accountId) {
      accountId = accountIds[i] as string;
      pools = index.pools.get(accountId);
    }
    if (pools === undefined || duplicateOf[i] !== null) continue;
    const pool = pools.get(fingerprints[i] as string);
    if (pool === undefined) continue;
    const members = groups.get(pool);
    if (members) members.push(i);
    else groups.set(pool, [i]);
  }
  for (const [earlierPool, members] of groups) {
    const pool = earlierPool.filter((item) => !claimed.has(item));
    const withRef = pool.filter((item) => item.ref !== undefined);
    const withoutRef = pool.filter((item) => item.ref === undefined);
    let r = 0;
    let k = 0;
    for (const i of members) {
      const hasRef = candidateRefs[i] !== undefined;
      let match: KeptEntry | undefined;
      if (!hasRef && r < withRef.length) match = withRef[r++];
      else if (k < withoutRef.length) match = withoutRef[k++];
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
  keepFile(index, candidateColumns(candidates), duplicateOf, (i) => keptIds[i] ?? null);
}

/**
 * `recordFile` that names the kept entries as it goes: `idOf(i, occurrence)` gives the id of
 * kept candidate i, where `occurrence` is its 1-based count among the kept entries of its
 * account with its fingerprint (this file's earlier ones included). The pools hold exactly
 * those entries, so the count is the pool's length and needs no map of its own.
 *
 * @returns per candidate its occurrence, 0 for a duplicate (or when `idOf` gives null).
 * @example
 * const index = createDuplicateIndex();
 * const c = { accountIds: ['A', 'A'], fingerprints: ['f', 'f'], refs: [undefined, undefined] };
 * keepFile(index, c, findDuplicateColumns(index, c), (i, k) => `A|f|${k}`); // Int32Array [1, 2]
 */
export function keepFile(
  index: DuplicateIndex,
  candidates: CandidateColumns,
  duplicateOf: readonly (KeptEntry | null)[],
  idOf: (candidate: number, occurrence: number) => string | null,
): Int32Array {
  const { accountIds, fingerprints, refs: candidateRefs } = candidates;
  const n = accountIds.length;
  const occurrences = new Int32Array(n);
  let accountId: string | undefined;
  let pools = new Map<string, KeptEntry[]>();
  let refs = new Map<string, KeptEntry>();
  for (let i = 0; i < n; i++) {
    if (accountIds[i] !== accountId) {
      accountId = accountIds[i] as string;
      pools = inner(index.pools, accountId);
      refs = inner(index.refs, accountId);
    }
    const ref = candidateRefs[i];
    let item = duplicateOf[i] ?? null;
    if (item === null) {
      const fingerprint = fingerprints[i] as string;
      const pool = pools.get(fingerprint);
      const occurrence = (pool === undefined ? 0 : pool.length) + 1;
      const id = idOf(i, occurrence);
      if (id !== null) {
        item = { id, ref };
        if (pool) pool.push(item);
        else pools.set(fingerprint, [item]);
        occurrences[i] = occurrence;
      }
    } else if (ref !== undefined && item.ref === undefined) {
      item.ref = ref;
    }
    if (item !== null && ref !== undefined && !refs.has(ref)) refs.set(ref, item);
  }
  return occurrences;
}

/** 32-bit FNV-1a of `text`, continuing from `seed`. */
function fnv1a(text: string, seed: number): number {
  let h = seed;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return h;
}

/**
 * The occurrences `keepFile` gives, for the last file of a ledger, without recording
 * anything: no file follows that could repeat its entries, so it needs no pool entries,
 * bank-id links or kept-entry objects. A kept candidate's occurrence is the length of its
 * pool from earlier files plus its repeats so far in this file; the repeats are counted in
 * an open-addressing table keyed by a 32-bit FNV-1a hash of account id and fingerprint
 * (Fowler, Noll, Vo; each hit confirmed by comparing the strings), which is cheaper than a
 * map keyed by the fingerprint strings. O(n) expected.
 *
 * @param fingerprintHashes FNV-1a of each fingerprint when the caller has them (see
 *   `lastFingerprintHash`); otherwise they are computed here.
 *
 * @returns per candidate its occurrence, 0 for a duplicate.
 * @example
 * const c = { accountIds: ['A', 'A'], fingerprints: ['f', 'f'], refs: [undefined, undefined] };
 * lastFileOccurrences(createDuplicateIndex(), c, [null, null]); // Int32Array [1, 2]
 */
export function lastFileOccurrences(
  index: DuplicateIndex,
  candidates: CandidateColumns,
  duplicateOf: readonly (KeptEntry | null)[],
  fingerprintHashes?: Int32Array,
): Int32Array {
  const { accountIds, fingerprints } = candidates;
  const n = accountIds.length;
  const occurrences = new Int32Array(n);
  let size = 16;
  while (size < 2 * n) size *= 2;
  const mask = size - 1;
  // first[s]: 1 + the first candidate with the slot's key; hash[s]: the key's hash (compared
  // before the strings); count[s]: its occurrences so far.
  const first = new Int32Array(size);
  const hashes = new Int32Array(size);
  const count = new Int32Array(size);
  let accountId: string | undefined;
  let accountHash = 0;
  let pools: Map<string, KeptEntry[]> | undefined;
  for (let i = 0; i < n; i++) {
    if (duplicateOf[i] !== null) continue;
    const account = accountIds[i] as string;
    if (account !== accountId) {
      accountId = account;
      accountHash = fnv1a(account, 0x811c9dc5);
      pools = index.pools.get(account);
    }
    const fingerprint = fingerprints[i] as string;
    const hash = Math.imul(
      (fingerprintHashes ? (fingerprintHashes[i] as number) : fnv1a(fingerprint, 0x811c9dc5)) ^ accountHash,
      0x01000193,
    );
    let s = hash & mask;
    for (;;) {
      const j = first[s] as number;
      if (j === 0) {
        first[s] = i + 1;
        hashes[s] = hash;
        count[s] = (pools?.get(fingerprint)?.length ?? 0) + 1;
        break;
      }
      if (hashes[s] === hash && fingerprints[j - 1] === fingerprint && accountIds[j - 1] === account) {
        count[s] = (count[s] as number) + 1;
        break;
      }
      s = (s + 1) & mask;
    }
    occurrences[i] = count[s] as number;
  }
  return occurrences;
}
