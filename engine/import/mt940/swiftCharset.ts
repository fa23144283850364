/**
 * The SWIFT "X" character set, the only characters an MT940 field may carry:
 * `a–z A–Z 0–9 / - ? : ( ) . , ' +`, space, and CrLf between lines.
 *
 * {@link toSwiftX} makes any text fit, in this order:
 * 1. compatibility forms are unfolded and diacritics removed (Unicode NFKD, combining marks
 *    dropped: é → e, ä → a, ñ → n, ﬁ → fi, ² → 2);
 * 2. letters that do not decompose are spelled out: ß → ss, æ → ae, œ → oe, ø → o, ł → l,
 *    đ/ð → d, þ → th, ı → i (and their capitals);
 * 3. look-alike punctuation becomes its X counterpart: curly quotes, backtick, « » → `'`;
 *    dashes, `_`, `~` → `-`; `& → +`; `;` → `,`; `!` → `.`; `[ { <` → `(`; `] } >` → `)`;
 *    `\ |` → `/`; `@` → `(at)`; `€` → `EUR`, `£` → `GBP`;
 * 4. tabs, line breaks and other spaces become a plain space; control characters are dropped;
 * 5. anything else becomes `.`.
 */

const X_CHAR = /^[A-Za-z0-9/\-?:().,'+ ]$/;

/**
 * True when every character of `text` is in the SWIFT X set (line breaks excluded).
 * @example isSwiftX('Rent 03/2025') // true
 * @example isSwiftX('Café') // false
 */
export function isSwiftX(text: string): boolean {
  return /^[A-Za-z0-9/\-?:().,'+ ]*$/.test(text);
}

const SPELLED: Readonly<Record<string, string>> = {
  ß: 'ss',
  ẞ: 'SS',
  æ: 'ae',
  Æ: 'AE',
  œ: 'oe',
  Œ: 'OE',
  ø: 'o',
  Ø: 'O',
  ł: 'l',
  Ł: 'L',
  đ: 'd',
  Đ: 'D',
  ð: 'd',
  Ð: 'D',
  þ: 'th',
  Þ: 'TH',
  ı: 'i',
  '‘': "'",
  '’': "'",
  '‚': "'",
  '‛': "'",
  '“': "'",
  '”': "'",
  '„': "'",
  '«': "'",
  '»': "'",
  '"': "'",
  '`': "'",
  '´': "'",
  '′': "'",
  '–': '-',
  '—': '-',
  '‐': '-',
  '‑': '-',
  '‒': '-',
  '−': '-',
  _: '-',
  '~': '-',
  '&': '+',
  ';': ',',
  '!': '.',
  '[': '(',
  '{': '(',
  '<': '(',
  ']': ')',
  '}': ')',
  '>': ')',
  '\\': '/',
  '|': '/',
  '@': '(at)',
  '€': 'EUR',
  '£': 'GBP',
};

/**
 * Transliterates text into the SWIFT X character set (rules in the module comment). Line
 * breaks become spaces, so the result is one line; runs of spaces are kept (callers that
 * want readable text collapse them).
 *
 * @example toSwiftX('Müller & Söhne – Café') // 'Muller + Sohne - Cafe'
 * @example toSwiftX('Straße 5; 20 €') // 'Strasse 5, 20 EUR'
 */
export function toSwiftX(text: string): string {
  let out = '';
  for (const ch of text.normalize('NFKD')) {
    if (X_CHAR.test(ch)) out += ch;
    else if (/^\p{M}$/u.test(ch)) continue;
    else if (SPELLED[ch] !== undefined) out += SPELLED[ch];
    else if (/^\s$/u.test(ch)) out += ' ';
    else if (/^\p{Cc}$/u.test(ch) || /^\p{Cf}$/u.test(ch)) continue;
    else out += '.';
  }
  return out;
}
