import { describe, expect, it } from 'vitest';
import { decodeOfxText, escapeOfxText, normalizeOfxSpace } from '../../engine/import/ofx/ofxText';
import { combineNameAndMemo, splitDescription } from '../../engine/import/ofx/ofxDescription';

describe('decodeOfxText', () => {
  it('decodes the reserved characters and numeric character references', () => {
    // Source: OFX Banking Specification 2.3, chapter 2, special characters (from memory): &lt; &gt; &amp; stand
    // for < > &; XML 1.0 section 4.1 for &#NNN; and &#xHHH;.
    expect(decodeOfxText('Fish &amp; Chips &lt;Ltd&gt;')).toBe('Fish & Chips <Ltd>');
    expect(decodeOfxText('&#8364;5 &#x263A; &quot;x&quot; &apos;y&apos;')).toBe('€5 ☺ "x" \'y\'');
  });

  it('keeps what is not an entity as written', () => {
    // Common practice, no source: SGML files carry bare ampersands in payee names.
    expect(decodeOfxText('A&B Hardware')).toBe('A&B Hardware');
    expect(decodeOfxText('&unknown; &#0; &#xD800; &#x110000; &')).toBe('&unknown; &#0; &#xD800; &#x110000; &');
  });

  it('decodes in one pass, so escaped entity text stays literal', () => {
    expect(decodeOfxText('&amp;lt;')).toBe('&lt;');
  });
});

describe('escapeOfxText and normalizeOfxSpace', () => {
  it('escapes & < > and collapses white space', () => {
    expect(escapeOfxText('  Fish & <Chips>\r\n  Ltd ')).toBe('Fish &amp; &lt;Chips&gt; Ltd');
    expect(decodeOfxText(escapeOfxText('&amp; is literal'))).toBe('&amp; is literal');
    expect(normalizeOfxSpace('\tA \n\n B ')).toBe('A B');
  });
});

describe('combineNameAndMemo / splitDescription', () => {
  it('combines without repeating a field the other contains', () => {
    expect(combineNameAndMemo('Harbour Lane Studios', 'Studio rent')).toBe('Harbour Lane Studios - Studio rent');
    expect(combineNameAndMemo('RENT', 'Rent March')).toBe('Rent March');
    expect(combineNameAndMemo('Saturday market takings', 'market')).toBe('Saturday market takings');
    expect(combineNameAndMemo('', 'Interest')).toBe('Interest');
    expect(combineNameAndMemo('Interest', '')).toBe('Interest');
    expect(combineNameAndMemo('', '')).toBe('');
  });

  it('splits a combined description back into the NAME and MEMO that give it', () => {
    const cases: [string, string][] = [
      ['Harbour Lane Studios', 'Studio rent'],
      ['RENT', 'Rent March'],
      ['Saturday market takings', 'market'],
      ['Acme - West', 'Acme - West - invoice 7'],
      ['', 'Interest'],
      ['Kiln & Clay', ''],
    ];
    for (const [name, memo] of cases) {
      const description = combineNameAndMemo(name, memo);
      const split = splitDescription(description, name === '' ? undefined : name);
      expect(combineNameAndMemo(split.name, split.memo), `${name} | ${memo}`).toBe(description);
      expect(split.name).toBe(name);
    }
  });

  it('cuts NAME to 32 characters and keeps the full text in MEMO', () => {
    // Source: OFX Banking Specification 2.3, STMTTRN element table: NAME is A-32.
    const long = 'The Very Long Name Of A Pottery Supplier Cooperative';
    const split = splitDescription(long, long);
    expect(Array.from(split.name).length).toBeLessThanOrEqual(32);
    expect(combineNameAndMemo(split.name, split.memo)).toBe(long);
  });
});
