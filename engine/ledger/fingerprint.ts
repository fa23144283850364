/**
 * The content fingerprint that recognises one entry printed by two statement files (say a
 * camt.053 file and a CSV export of the same account): booking date, signed amount and the
 * words of description and counterparty. The words are lower-cased, split on anything
 * that is not a letter or digit, deduplicated and sorted, so the formats' different
 * layouts (OFX NAME + MEMO vs camt counterparty + remittance text, line breaks in MT940
 * :86:) give the same fingerprint. References and bank ids are left out: one format has
 * them, another does not.
 *
 * Speed: the ledger fingerprints every entry and then uses the fingerprint as a map key.
 * For ASCII text (nearly all statement text) the words are found, sorted and deduplicated
 * as spans of the entry's own strings, compared char by char with ASCII lower-casing, and
 * the fingerprint is written as char codes and made into one flat string: no regular
 * expression, no Unicode normalisation, no string per word and no concatenated string
 * that must be flattened before it can be hashed. Other text takes the general path, which
 * gives the same result on ASCII text (NFC and Unicode lower-casing leave ASCII as ASCII
 * lower-case, and in ASCII \p{L}\p{N} are exactly A–Z, a–z and 0–9).
 */
import type { StatementEntry } from '../import/types';

// Reused between calls (the engine's JavaScript is single-threaded): the words found so far
// as spans (source string, start, end), kept sorted and distinct, and the char codes of the
// result being written.
const wordSource: string[] = [];
let wordStart = new Int32Array(32);
let wordEnd = new Int32Array(32);
let wordCount = 0;
// `codes[0, codeCount)` is the result; the array keeps its capacity between calls.
const codes: number[] = [];
let codeCount = 0;

// FNV-1a (Fowler, Noll, Vo) of the codes written, kept as they are written.
let codeHash = 0x811c9dc5;

function put(code: number): void {
  codes[codeCount++] = code;
  codeHash = Math.imul(codeHash ^ code, 0x01000193);
}

let lastHash = 0;

/**
 * The 32-bit FNV-1a hash of the fingerprint `entryFingerprint` returned last, over its
 * UTF-16 code units: the ledger keys its tables by it without hashing the string again.
 * @example entryFingerprint(entry); lastFingerprintHash() === fingerprintHash(entryFingerprint(entry)) // true
 */
export function lastFingerprintHash(): number {
  return lastHash;
}

/**
 * 32-bit FNV-1a hash of a string's UTF-16 code units (what `lastFingerprintHash` gives).
 * @example fingerprintHash('') // -2128831035 (0x811c9dc5 as a signed 32-bit integer)
 */
export function fingerprintHash(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return h;
}

/** Char code lower-cased in ASCII. */
function lower(c: number): number {
  return c >= 0x41 && c <= 0x5a ? c | 0x20 : c;
}

function isWordChar(c: number): boolean {
  return (c >= 0x61 && c <= 0x7a) || (c >= 0x41 && c <= 0x5a) || (c >= 0x30 && c <= 0x39);
}

/** Lower-cased comparison of the new word text[start, end) with word k: <0, 0 or >0. */
function compareWord(text: string, start: number, end: number, k: number): number {
  const other = wordSource[k] as string;
  const os = wordStart[k] as number;
  const oe = wordEnd[k] as number;
  const n = Math.min(end - start, oe - os);
  for (let i = 0; i < n; i++) {
    const d = lower(text.charCodeAt(start + i)) - lower(other.charCodeAt(os + i));
    if (d !== 0) return d;
  }
  return end - start - (oe - os);
}

/** Inserts text[start, end) into the sorted, distinct word list (entries have a handful of words). */
function insertWord(text: string, start: number, end: number): void {
  let k = wordCount;
  let c = 1;
  while (k > 0) {
    c = compareWord(text, start, end, k - 1);
    if (c >= 0) break;
    k--;
  }
  if (k > 0 && c === 0) return;
  if (wordCount === wordStart.length) {
    const starts = new Int32Array(wordCount * 2);
    const ends = new Int32Array(wordCount * 2);
    starts.set(wordStart);
    ends.set(wordEnd);
    wordStart = starts;
    wordEnd = ends;
  }
  for (let m = wordCount; m > k; m--) {
    wordSource[m] = wordSource[m - 1] as string;
    wordStart[m] = wordStart[m - 1] as number;
    wordEnd[m] = wordEnd[m - 1] as number;
  }
  wordSource[k] = text;
  wordStart[k] = start;
  wordEnd[k] = end;
  wordCount++;
}

/** Adds the words of `text` to the list; false (list left partly filled) when it is not all ASCII. */
function addAsciiWords(text: string): boolean {
  const n = text.length;
  let i = 0;
  while (i < n) {
    let c = text.charCodeAt(i);
    if (c >= 0x80) return false;
    if (!isWordChar(c)) {
      i++;
      continue;
    }
    const start = i;
    do {
      if (++i >= n) break;
      c = text.charCodeAt(i);
    } while (isWordChar(c));
    insertWord(text, start, i);
  }
  return true;
}

/** Appends the collected words, lower-cased and separated by spaces, to the codes; empties the list. */
function writeWords(): void {
  for (let k = 0; k < wordCount; k++) {
    if (k > 0) put(0x20);
    const text = wordSource[k] as string;
    const end = wordEnd[k] as number;
    for (let i = wordStart[k] as number; i < end; i++) put(lower(text.charCodeAt(i)));
  }
  clearWords();
}

/** Empties the word list, dropping its references to the entry's strings. */
function clearWords(): void {
  for (let k = 0; k < wordCount; k++) wordSource[k] = '';
  wordCount = 0;
}

/** The codes written so far as one flat string; empties them. */
function takeCodes(): string {
  const n = codeCount;
  codeCount = 0;
  if (n <= 4096) {
    codes.length = n;
    return String.fromCharCode.apply(null, codes);
  }
  // Chunks keep the argument count of fromCharCode small for long texts.
  let out = '';
  for (let i = 0; i < n; i += 4096) out += String.fromCharCode.apply(null, codes.slice(i, Math.min(n, i + 4096)));
  return out;
}

/** The general path: any script, Unicode lower-casing and NFC. */
function unicodeWords(text: string): string {
  const all = text
    .toLowerCase()
    .normalize('NFC')
    .split(/[^\p{L}\p{N}]+/u);
  const distinct = [...new Set(all.filter((w) => w !== ''))];
  distinct.sort();
  return distinct.join(' ');
}

/**
 * Sorted distinct lower-case words of a text (letters and digits of any script).
 * O(n) for ASCII text plus the insertion of its w words (O(w²), w is small).
 * @example fingerprintWords('Clay  SUPPLY, clay') // 'clay supply'
 */
export function fingerprintWords(text: string): string {
  if (addAsciiWords(text)) {
    writeWords();
    return takeCodes();
  }
  clearWords();
  return unicodeWords(text);
}

/** Appends the decimal digits of a safe integer to `codes` (as `${value}` writes them). */
function writeInteger(value: number): void {
  if (value < 0) put(0x2d);
  let v = Math.abs(value);
  const at = codeCount;
  do {
    put(0x30 + (v % 10));
    v = Math.floor(v / 10);
  } while (v > 0);
  // The digits came least significant first.
  for (let i = at, j = codeCount - 1; i < j; i++, j--) {
    const t = codes[i] as number;
    codes[i] = codes[j] as number;
    codes[j] = t;
  }
}

/**
 * Fingerprint of an entry: `bookingDate|amount|words`.
 * @example entryFingerprint({ bookingDate: '2026-01-02', amount: -1250, description: 'Clay supply', … })
 * // '2026-01-02|-1250|clay supply'
 */
export function entryFingerprint(
  entry: Pick<StatementEntry, 'bookingDate' | 'amount' | 'description' | 'counterparty'>,
): string {
  const counterparty = entry.counterparty ?? '';
  // Description and counterparty are split one after the other: the same words as splitting
  // `${description} ${counterparty}`, without building that string.
  if (Number.isSafeInteger(entry.amount) && addAsciiWords(entry.description) && addAsciiWords(counterparty)) {
    const date = entry.bookingDate;
    codeHash = 0x811c9dc5;
    for (let i = 0; i < date.length; i++) put(date.charCodeAt(i));
    put(0x7c);
    writeInteger(entry.amount);
    put(0x7c);
    writeWords();
    lastHash = codeHash;
    return takeCodes();
  }
  clearWords();
  const fingerprint = `${entry.bookingDate}|${entry.amount}|${unicodeWords(`${entry.description} ${counterparty}`)}`;
  lastHash = fingerprintHash(fingerprint);
  return fingerprint;
}
