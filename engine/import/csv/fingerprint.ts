/**
 * A stable name for a bank's CSV layout, so the app can remember the mapping a user chose
 * for it. The header cells are normalised (Unicode NFKC, case folded, blanks collapsed,
 * trailing empty cells dropped) and hashed with 64-bit FNV-1a over their UTF-8 bytes
 * (Fowler, Noll and Vo; IETF draft-eastlake-fnv, offset basis 0xcbf29ce484222325, prime
 * 0x100000001b3).
 */
import { utf8Bytes } from '../../write/encode';

const OFFSET = 0xcbf29ce484222325n;
const PRIME = 0x100000001b3n;
const MASK = 0xffffffffffffffffn;

/**
 * Fingerprint of a header row: `csv1-` and 16 hex digits. The same header, written with
 * other case, spacing or trailing delimiters, gives the same fingerprint; another column
 * order gives another.
 *
 * @example csvLayoutFingerprint(['Date', 'Amount']) === csvLayoutFingerprint([' date ', 'AMOUNT', '']) // true
 */
export function csvLayoutFingerprint(headerCells: readonly string[]): string {
  const cells = headerCells.map((c) => c.normalize('NFKC').trim().replace(/\s+/g, ' ').toLowerCase());
  while (cells.length > 0 && cells[cells.length - 1] === '') cells.pop();
  const bytes = utf8Bytes(cells.join('\u001f'));
  let hash = OFFSET;
  for (const b of bytes) {
    hash ^= BigInt(b);
    hash = (hash * PRIME) & MASK;
  }
  return `csv1-${hash.toString(16).padStart(16, '0')}`;
}
