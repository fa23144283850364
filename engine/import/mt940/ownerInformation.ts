/**
 * Field 86, "Information to Account Owner" (6*65x), turned into a readable description,
 * counterparty and reference. Three layouts are recognised:
 *
 * 1. Sub-field layout of the German banking industry's data-format specification
 *    (DFÜ-Abkommen, Anlage 3, 8.2.4 "Strukturierte Belegung des Feldes 86"): a 3-digit
 *    transaction code, then `?NN` sub-fields: `?00` booking text, `?10` journal number,
 *    `?20`–`?29` and `?60`–`?63` purpose (27 characters each), `?30` bank code, `?31` account,
 *    `?32`–`?33` counterparty name, `?34` text-key extension. SEPA identifiers (`EREF+`,
 *    `SVWZ+`, …) start a new purpose sub-field; a longer value runs on into the next sub-field
 *    without repeating the identifier.
 * 2. Slash code words: `/CODE/value/CODE/value…`, e.g. `/EREF/…/ORDP//NAME/…/REMI/USTD//…`.
 *    `NAME` is the counterparty, `REMI` the remittance text (a leading `USTD//` is dropped),
 *    `EREF` the end-to-end reference. Only the code words in {@link SLASH_CODE_WORDS} split
 *    the text, so ordinary slashes (`Invoice 2025/17`) stay in the values.
 * 3. Anything else is free text.
 *
 * Lines are joined as banks wrap them: a line that fills all 65 characters was cut inside a
 * word and runs on without a space; a shorter line ended at a word and is joined with a
 * space. Whitespace runs are collapsed and the result trimmed.
 */

/** Characters in one line of field 86 (6*65x). */
export const FIELD_86_LINE_LENGTH = 65;
/** Characters in one `?20`–`?29` purpose sub-field of the DFÜ layout. */
const SUBFIELD_LENGTH = 27;

/** Code words that split a slash-structured field 86 (case-sensitive, upper case). */
export const SLASH_CODE_WORDS: readonly string[] = [
  'TRTP',
  'CNTP',
  'IBAN',
  'BIC',
  'NAME',
  'ADDR',
  'REMI',
  'EREF',
  'MARF',
  'CSID',
  'PREF',
  'ORDP',
  'BENM',
  'ULTB',
  'ULTC',
  'ULTD',
  'PURP',
  'RTRN',
  'ISDT',
  'CDTRREFTP',
  'CDTRREF',
  'SVCL',
];

const SLASH_CODE = new RegExp(`/(${SLASH_CODE_WORDS.join('|')})/`, 'g');
const STARTS_SLASH_STRUCTURED = new RegExp(`^/(${SLASH_CODE_WORDS.join('|')})/`);
const STARTS_SUBFIELD_LAYOUT = /^\d{3}\?\d\d/;
const SEPA_IDENTIFIER = /^(EREF|KREF|MREF|CRED|DEBT|COAM|OAMT|SVWZ|ABWA|ABWE|IBAN|BIC)\+/;
const NO_REFERENCE = new Set(['NOTPROVIDED', 'NONREF', '']);

/** What field 86 says about an entry. */
export interface OwnerInformation {
  readonly description: string;
  readonly counterparty?: string;
  /** End-to-end reference from `EREF`, when the field gives one. */
  readonly reference?: string;
}

/**
 * Collapses whitespace runs to one space and trims.
 * @example collapseSpaces('  a \t b ') // 'a b'
 */
export function collapseSpaces(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/**
 * Joins wrapped lines: no space after a line that fills `width` characters (cut inside a
 * word), one space after a shorter line.
 * @example joinWrappedLines(['Rent for', 'March'], 65) // 'Rent for March'
 */
export function joinWrappedLines(lines: readonly string[], width: number): string {
  let out = '';
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i] as string;
    if (i > 0) out += (lines[i - 1] as string).length >= width ? '' : ' ';
    out += line;
  }
  return out;
}

function readSubfieldLayout(raw: string): OwnerInformation {
  const parts: { code: string; value: string }[] = [];
  const marker = /\?(\d\d)/g;
  let m = marker.exec(raw);
  while (m) {
    const start = m.index + m[0].length;
    const next = marker.exec(raw);
    parts.push({ code: m[1] as string, value: raw.slice(start, next ? next.index : raw.length) });
    m = next;
  }
  const purposeChunks: string[] = [];
  const nameChunks: string[] = [];
  let bookingText = '';
  for (const { code, value } of parts) {
    const n = Number(code);
    if (n === 0) bookingText = value;
    else if ((n >= 20 && n <= 29) || (n >= 60 && n <= 63)) purposeChunks.push(value);
    else if (n === 32 || n === 33) nameChunks.push(value);
  }
  const segments: { id: string; text: string; last: string }[] = [];
  for (const chunk of purposeChunks) {
    const id = SEPA_IDENTIFIER.exec(chunk);
    const current = segments[segments.length - 1];
    if (id || !current) {
      segments.push({ id: id ? (id[1] as string) : '', text: id ? chunk.slice(id[0].length) : chunk, last: chunk });
    } else {
      current.text += (current.last.length >= SUBFIELD_LENGTH ? '' : ' ') + chunk;
      current.last = chunk;
    }
  }
  const byId = (id: string): string | undefined => {
    const found = segments.filter((s) => s.id === id).map((s) => collapseSpaces(s.text));
    return found.length > 0 ? found.join(' ') : undefined;
  };
  const purpose = byId('SVWZ') ?? byId('') ?? '';
  const eref = byId('EREF');
  const name = collapseSpaces(joinWrappedLines(nameChunks, SUBFIELD_LENGTH));
  return {
    description: purpose !== '' ? purpose : collapseSpaces(bookingText),
    ...(name !== '' ? { counterparty: name } : {}),
    ...(eref !== undefined && !NO_REFERENCE.has(eref) ? { reference: eref } : {}),
  };
}

function readSlashCodeWords(joined: string): OwnerInformation {
  const text = joined.endsWith('/') ? joined.slice(0, -1) : joined;
  const values = new Map<string, string>();
  SLASH_CODE.lastIndex = 0;
  let m = SLASH_CODE.exec(text);
  while (m) {
    const start = m.index + m[0].length;
    // The slash that ends a value is the first slash of the next code word.
    const next = SLASH_CODE.exec(text);
    const value = text.slice(start, next ? next.index : text.length);
    const code = m[1] as string;
    if (!values.has(code)) values.set(code, value);
    m = next;
  }
  const remi = values.get('REMI');
  const description = collapseSpaces(remi !== undefined ? remi.replace(/^USTD\/\//, '') : (values.get('TRTP') ?? ''));
  const name = collapseSpaces(values.get('NAME') ?? '');
  const eref = collapseSpaces(values.get('EREF') ?? '');
  return {
    description,
    ...(name !== '' ? { counterparty: name } : {}),
    ...(!NO_REFERENCE.has(eref) ? { reference: eref } : {}),
  };
}

/**
 * Reads field 86 (its lines, tag removed, trailing spaces already trimmed).
 * @example interpretOwnerInformation(['/NAME/Studio Rent Ltd/REMI/Rent March']) // { description: 'Rent March', counterparty: 'Studio Rent Ltd' }
 * @example interpretOwnerInformation(['166?00GUTSCHRIFT?20SVWZ+Invoice 17?32Kiln Supply']) // { description: 'Invoice 17', counterparty: 'Kiln Supply' }
 */
export function interpretOwnerInformation(lines: readonly string[]): OwnerInformation {
  const raw = lines.join('');
  // The transaction code and the first `?` are on the first line in that layout.
  if (STARTS_SUBFIELD_LAYOUT.test(raw) && /^\d{3}\?/.test(lines[0] ?? '')) return readSubfieldLayout(raw);
  const joined = joinWrappedLines(lines, FIELD_86_LINE_LENGTH);
  if (STARTS_SLASH_STRUCTURED.test(joined)) return readSlashCodeWords(joined);
  return { description: collapseSpaces(joined) };
}

/**
 * True when free text would be read back as structured (it starts like a sub-field layout
 * or a slash code word). The writer wraps such text so it stays free text.
 * @example looksStructured('/NAME/x') // true
 * @example looksStructured('Rent') // false
 */
export function looksStructured(text: string): boolean {
  return /^\d{3}\?/.test(text) || STARTS_SLASH_STRUCTURED.test(text);
}
