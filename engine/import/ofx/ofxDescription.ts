/**
 * How OFX's NAME (payee, at most 32 characters) and MEMO (free text) become one entry
 * description, and back. Banks fill the two fields differently: some repeat the payee in
 * the memo, some cut a long text across both, some leave one empty. The rule keeps every
 * word once and never invents separators when one field already contains the other.
 */

/**
 * Combines NAME and MEMO into one description:
 * - either empty: the other;
 * - one contains the other (case-insensitive): the longer one;
 * - otherwise `NAME - MEMO`.
 * Inputs are expected trimmed and white-space collapsed.
 *
 * @example combineNameAndMemo('GREENLEAF GROCERS', 'Card 1234') // 'GREENLEAF GROCERS - Card 1234'
 * @example combineNameAndMemo('RENT', 'RENT MARCH') // 'RENT MARCH'
 * @example combineNameAndMemo('', 'Interest') // 'Interest'
 */
export function combineNameAndMemo(name: string, memo: string): string {
  if (memo === '') return name;
  if (name === '') return memo;
  const n = name.toLowerCase();
  const m = memo.toLowerCase();
  if (m.includes(n)) return memo;
  if (n.includes(m)) return name;
  return `${name} - ${memo}`;
}

/** OFX NAME holds at most 32 characters (OFX Banking Specification 2.3, STMTTRN: NAME A-32). */
export const OFX_NAME_LENGTH = 32;
/** OFX MEMO holds at most 255 characters (OFX Banking Specification 2.3, STMTTRN: MEMO A-255). */
export const OFX_MEMO_LENGTH = 255;

function cut(text: string, length: number): string {
  const points = Array.from(text);
  return points.length > length ? points.slice(0, length).join('').trimEnd() : text;
}

/**
 * The NAME and MEMO to write for an entry so that reading them back with
 * `combineNameAndMemo` gives the same description and counterparty whenever the
 * description came from an OFX file (or follows the same rule). NAME is cut to 32
 * characters and MEMO to 255 as the specification requires; a description that neither
 * contains the counterparty nor can be split reads back as `NAME - MEMO`.
 *
 * @returns `name` (counterparty, possibly cut) and `memo`, each '' when not written.
 * @example splitDescription('GREENLEAF GROCERS - Card 1234', 'GREENLEAF GROCERS') // { name: 'GREENLEAF GROCERS', memo: 'Card 1234' }
 * @example splitDescription('Interest', undefined) // { name: '', memo: 'Interest' }
 */
export function splitDescription(
  description: string,
  counterparty: string | undefined,
): { name: string; memo: string } {
  const name = cut(counterparty ?? '', OFX_NAME_LENGTH);
  if (name === '') return { name: '', memo: cut(description, OFX_MEMO_LENGTH) };
  if (description === name) return { name, memo: '' };
  const prefix = `${name} - `;
  const candidates = description.startsWith(prefix) ? [description.slice(prefix.length), description] : [description];
  for (const memo of candidates) {
    const written = cut(memo, OFX_MEMO_LENGTH);
    if (combineNameAndMemo(name, written) === description) return { name, memo: written };
  }
  return { name, memo: cut(description, OFX_MEMO_LENGTH) };
}
