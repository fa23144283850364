/**
 * Character data of OFX files: decoding the entities a file may contain and escaping
 * text for writing. OFX 1.x (SGML) and 2.x (XML) share the same three reserved
 * characters `&`, `<` and `>`; 2.x adds whatever XML allows (`&quot;`, `&apos;`,
 * numeric character references), which 1.x readers in practice also accept.
 */

const NAMED: Readonly<Record<string, string>> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: '\u00a0' };

const ENTITY = /&(#[0-9]{1,7}|#[xX][0-9a-fA-F]{1,6}|[A-Za-z]{2,6});/g;

function codePointText(value: number): string | undefined {
  // Refuse what XML refuses: NUL, surrogates, and values beyond Unicode.
  if (value <= 0 || value > 0x10ffff || (value >= 0xd800 && value <= 0xdfff)) return undefined;
  return String.fromCodePoint(value);
}

/**
 * Decodes `&amp; &lt; &gt; &quot; &apos; &nbsp;` and numeric character references
 * (`&#233;`, `&#xE9;`). Anything else that starts with `&` is kept as written: SGML files
 * in the wild carry bare ampersands ("A&B Hardware"), and dropping them would lose text.
 * O(n).
 *
 * @throws Never.
 *
 * @example decodeOfxText('Fish &amp; Chips &#x263A;') // 'Fish & Chips ☺'
 * @example decodeOfxText('A&B') // 'A&B'
 */
export function decodeOfxText(raw: string): string {
  if (raw.indexOf('&') < 0) return raw;
  return raw.replace(ENTITY, (whole: string, body: string) => {
    if (body.charCodeAt(0) === 0x23 /* # */) {
      const hex = body[1] === 'x' || body[1] === 'X';
      const value = Number.parseInt(body.slice(hex ? 2 : 1), hex ? 16 : 10);
      return codePointText(value) ?? whole;
    }
    return NAMED[body] ?? whole;
  });
}

/**
 * Escapes text for an OFX element value: `&`, `<` and `>` become `&amp;`, `&lt;` and
 * `&gt;` (the three characters both OFX 1.x and 2.x reserve), and runs of white space,
 * line breaks included, collapse to one space, because an SGML leaf value ends at the
 * line and readers trim it.
 *
 * @example escapeOfxText('Fish & <Chips>') // 'Fish &amp; &lt;Chips&gt;'
 */
export function escapeOfxText(text: string): string {
  return normalizeOfxSpace(text).replace(/[&<>]/g, (c) => (c === '&' ? '&amp;' : c === '<' ? '&lt;' : '&gt;'));
}

/**
 * Trims and collapses every run of white space (spaces, tabs, line breaks) to one space.
 * Free text read from OFX goes through this, so the same words give the same
 * description whether the file was SGML or XML, indented or not.
 *
 * @example normalizeOfxSpace('  RENT\r\n  MARCH ') // 'RENT MARCH'
 */
export function normalizeOfxSpace(text: string): string {
  // Fast path: most values hold no white space but single spaces.
  if (!/[^\S ]| {2}/.test(text)) return text.trim();
  return text.replace(/\s+/g, ' ').trim();
}
