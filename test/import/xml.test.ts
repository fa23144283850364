import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  XML_NAMESPACE,
  XMLNS_NAMESPACE,
  XmlPullParser,
  attributeValue,
  childElement,
  childElements,
  elementText,
  escapeXmlAttribute,
  escapeXmlText,
  parseXml,
  type XmlElement,
  type XmlEvent,
  type XmlSyntaxError,
} from '../../engine/import/xml';

function root(text: string): XmlElement {
  const r = parseXml(text);
  if (!r.ok) throw new Error(`unexpected error: ${r.error.message}`);
  return r.root;
}

function error(text: string): XmlSyntaxError {
  const r = parseXml(text);
  if (r.ok) throw new Error('expected a well-formedness error');
  return r.error;
}

function events(text: string, options = {}): XmlEvent[] {
  const p = new XmlPullParser(text, options);
  const out: XmlEvent[] = [];
  for (;;) {
    const ev = p.next();
    out.push(ev);
    if (ev.type === 'eof' || ev.type === 'error') return out;
  }
}

describe('XML parser: entities and character references', () => {
  it('decodes the five predefined entities in text', () => {
    // Source: W3C XML 1.0 (Fifth Edition) §4.6 Predefined Entities.
    expect(elementText(root('<a>&lt;&gt;&amp;&quot;&apos;</a>'))).toBe('<>&"\'');
  });

  it('decodes decimal and hexadecimal character references, including beyond the BMP', () => {
    // Source: W3C XML 1.0 (Fifth Edition) §4.1 Character and Entity References, [66] CharRef.
    expect(elementText(root('<a>&#233;&#xE9;&#x1F600;&#38;</a>'))).toBe('éé😀&');
  });

  it('refuses an unknown entity, naming it', () => {
    // Source: W3C XML 1.0 §4.1 WFC: Entity Declared (no DTD here, so only the predefined five exist).
    const e = error('<a>\n  x &nbsp; y</a>');
    expect(e.message).toContain('&nbsp;');
    expect(e.line).toBe(2);
    expect(e.path).toBe('a');
  });

  it('refuses a bare ampersand and a reference to a non-character', () => {
    // Source: W3C XML 1.0 §2.4 ([14] CharData excludes '&') and §4.1 WFC: Legal Character.
    expect(error('<a>fish & chips</a>').message).toContain('&');
    expect(error('<a>&#0;</a>').message).toContain('not an allowed XML character');
    expect(error('<a>&#xD800;</a>').message).toContain('not an allowed XML character');
  });

  it('decodes entities in attribute values and normalises whitespace there', () => {
    // Source: W3C XML 1.0 §3.3.3 Attribute-Value Normalization (tab/LF/CR become a space, char refs kept).
    const a = root('<a v="x&amp;y\tz\r\nw&#10;q"/>');
    expect(attributeValue(a, 'v')).toBe('x&y z w\nq');
  });

  it('normalises CR LF and lone CR line ends in text to LF', () => {
    // Source: W3C XML 1.0 §2.11 End-of-Line Handling.
    expect(elementText(root('<a>1\r\n2\r3&#13;</a>'))).toBe('1\n2\n3\r');
  });
});

describe('XML parser: CDATA, comments, processing instructions', () => {
  it('keeps CDATA content literally and merges it with adjacent text', () => {
    // Source: W3C XML 1.0 §2.7 CDATA Sections.
    const a = root('<a>x <![CDATA[<b>&amp;</b>]]> y</a>');
    expect(a.children).toHaveLength(1);
    expect(elementText(a)).toBe('x <b>&amp;</b> y');
    expect(a.children[0]).toMatchObject({ kind: 'text', cdata: true });
  });

  it('skips comments by default and reports them on request', () => {
    // Source: W3C XML 1.0 §2.5 Comments.
    expect(elementText(root('<a>x<!-- note -->y</a>'))).toBe('xy');
    const ev = events('<a><!-- note --></a>', { reportComments: true });
    expect(ev[1]).toMatchObject({ type: 'comment', text: ' note ' });
  });

  it('refuses "--" inside a comment and an unclosed comment', () => {
    // Source: W3C XML 1.0 §2.5 [15] Comment: the string "--" must not occur within comments.
    expect(error('<a><!-- a -- b --></a>').message).toContain('"--"');
    expect(error('<a><!-- open </a>').message).toContain('not closed');
  });

  it('reads the XML declaration and reports processing instructions on request', () => {
    // Source: W3C XML 1.0 §2.8 [23] XMLDecl and §2.6 Processing Instructions.
    const r = parseXml('<?xml version="1.0" encoding="UTF-8" standalone="yes"?><a/>');
    expect(r.ok && r.declaration).toEqual({ version: '1.0', encoding: 'UTF-8', standalone: true });
    const ev = events('<a><?app do this?></a>', { reportProcessingInstructions: true });
    expect(ev[1]).toMatchObject({ type: 'pi', target: 'app', data: 'do this' });
  });

  it('refuses an XML declaration that is not at the very start', () => {
    // Source: W3C XML 1.0 §2.8 [22] prolog: XMLDecl? comes first; §2.6: target "xml" is reserved.
    expect(error(' <?xml version="1.0"?><a/>').message).toContain('very start');
    expect(error('<a><?xml version="1.0"?></a>').message).toContain('very start');
  });

  it('accepts a byte-order mark before the declaration', () => {
    // Source: W3C XML 1.0 Appendix F.1 (the BOM is not part of the document's characters).
    expect(root('\uFEFF<?xml version="1.0"?><a/>').name).toBe('a');
  });
});

describe('XML parser: elements, attributes and namespaces', () => {
  it('reads attributes with single or double quotes and returns them in order', () => {
    // Source: W3C XML 1.0 §3.1 [41] Attribute, [10] AttValue.
    const a = root(`<a x="1" y='2 "q"'/>`);
    expect(a.attributes.map((t) => [t.name, t.value])).toEqual([
      ['x', '1'],
      ['y', '2 "q"'],
    ]);
  });

  it('refuses a duplicate attribute', () => {
    // Source: W3C XML 1.0 §3.1 WFC: Unique Att Spec.
    const e = error('<a>\n<b k="1" k="2"/></a>');
    expect(e.message).toContain('k');
    expect(e.line).toBe(2);
    expect(e.path).toBe('a/b');
  });

  it('refuses "<" in an attribute value and unquoted values', () => {
    // Source: W3C XML 1.0 §3.1 WFC: No < in Attribute Values; [10] AttValue is quoted.
    expect(error('<a k="x<y"/>').message).toContain('"<"');
    expect(error('<a k=1/>').message).toContain('quoted');
  });

  it('resolves default and prefixed namespaces, scoped to the declaring element', () => {
    // Source: W3C Namespaces in XML 1.0 (Third Edition) §6.1 Namespace Scoping and §6.2 Defaulting.
    const a = root('<a xmlns="urn:d" xmlns:p="urn:p"><p:b c="1" p:d="2"/><e xmlns=""/></a><!-- -->');
    expect(a.namespace).toBe('urn:d');
    const b = childElement(a, 'b') as XmlElement;
    expect([b.prefix, b.localName, b.namespace]).toEqual(['p', 'b', 'urn:p']);
    expect(b.attributes.map((t) => t.namespace)).toEqual(['', 'urn:p']);
    expect(childElement(a, 'e')?.namespace).toBe('');
    expect(a.attributes[0]?.namespace).toBe(XMLNS_NAMESPACE);
  });

  it('binds the xml prefix without a declaration and refuses undeclared prefixes', () => {
    // Source: W3C Namespaces in XML 1.0 §3 (xml prefix is bound by definition) and §5 NSC: Prefix Declared.
    const a = root('<a xml:lang="de"/>');
    expect(a.attributes[0]?.namespace).toBe(XML_NAMESPACE);
    expect(error('<q:a/>').message).toContain('"q"');
    expect(error('<a q:k="1"/>').message).toContain('"q"');
  });

  it('finds children by local name and namespace', () => {
    const a = root('<a xmlns:x="urn:x"><b>1</b><x:b>2</x:b><b>3</b></a>');
    expect(childElements(a, 'b').map(elementText)).toEqual(['1', '2', '3']);
    expect(childElements(a, 'b', '').map(elementText)).toEqual(['1', '3']);
    expect(elementText(childElement(a, 'b', 'urn:x') as XmlElement)).toBe('2');
  });

  it('drops indentation but keeps whitespace that is an element’s whole content', () => {
    const a = root('<a>\n  <b>  </b>\n  <c/>\n</a>');
    expect(a.children.map((c) => c.kind)).toEqual(['element', 'element']);
    expect(elementText(childElement(a, 'b') as XmlElement)).toBe('  ');
    const kept = parseXml('<a>\n <b/></a>', { keepWhitespaceText: true });
    expect(kept.ok && kept.root.children[0]).toMatchObject({ kind: 'text', text: '\n ' });
  });

  it('reports a self-closing element as start then end, with sibling positions', () => {
    const ev = events('<a><b/><c/><b/></a>');
    expect(ev.map((e) => e.type)).toEqual(['start', 'start', 'end', 'start', 'end', 'start', 'end', 'end', 'eof']);
    expect(ev.filter((e) => e.type === 'start').map((e) => (e.type === 'start' ? e.index : 0))).toEqual([1, 1, 1, 2]);
  });

  it('reads one element at a time with readElement and continues after it', () => {
    const p = new XmlPullParser('<r><n i="1"><v>x</v></n><n i="2"/><z/></r>');
    const seen: string[] = [];
    for (let ev = p.next(); ev.type !== 'eof'; ev = p.next()) {
      if (ev.type === 'error') throw new Error(ev.error.message);
      if (ev.type === 'start' && ev.localName === 'n') {
        const el = p.readElement(ev);
        if ('message' in el) throw new Error(el.message);
        seen.push(`${attributeValue(el, 'i')}:${el.children.length}`);
      } else if (ev.type === 'start') {
        seen.push(ev.name);
      }
    }
    expect(seen).toEqual(['r', '1:1', '2:0', 'z']);
  });

  it('refuses readElement for an element that is not the one just started', () => {
    const p = new XmlPullParser('<r><a/></r>');
    const r = p.next();
    p.next();
    if (r.type !== 'start') throw new Error('expected start');
    expect(() => p.readElement(r)).toThrow(/readElement/);
  });
});

describe('XML parser: well-formedness errors with line numbers and paths', () => {
  it('names the mismatched end tag, the open element and where it opened', () => {
    // Source: W3C XML 1.0 §3 WFC: Element Type Match.
    const e = error('<Document>\n <Stmt>\n  <Ntry>\n  </Stmt>\n</Document>');
    expect(e.message).toBe('end tag </Stmt> does not match <Ntry> opened at line 3');
    expect([e.line, e.column, e.path]).toEqual([4, 3, 'Document/Stmt/Ntry']);
  });

  it('reports truncation at the end of the file with the unclosed element', () => {
    const e = error('<Document>\n<Stmt>\n<Ntry><Amt>1');
    expect(e.message).toContain('<Amt> opened at line 3 is not closed');
    expect(e.path).toBe('Document/Stmt/Ntry/Amt');
  });

  it('uses [n] for repeated siblings and for names the caller asks to index', () => {
    const p = new XmlPullParser('<D><S/><S><N/><N>&bad;</N></S></D>', { indexedNames: new Set(['N']) });
    let ev = p.next();
    while (ev.type !== 'error' && ev.type !== 'eof') ev = p.next();
    expect(ev.type === 'error' && ev.error.path).toBe('D/S[2]/N[2]');
  });

  it('refuses text and a second root outside the root element', () => {
    // Source: W3C XML 1.0 §2.1 [1] document ::= prolog element Misc*.
    expect(error('x<a/>').message).toContain('before the root');
    expect(error('<a/>x').message).toContain('after the root');
    expect(error('<a/><b/>').message).toContain('second root');
    expect(error('').message).toContain('no root');
  });

  it('refuses "]]>" in text', () => {
    // Source: W3C XML 1.0 §2.4: CharData must not contain "]]>".
    expect(error('<a>x]]>y</a>').message).toContain(']]>');
  });

  it('refuses DOCTYPE and entity declarations (no XXE, no entity expansion)', () => {
    // Common practice, no source: refusing DTDs outright is the usual defence (OWASP XXE prevention).
    const laughs =
      '<?xml version="1.0"?>\n<!DOCTYPE lolz [\n <!ENTITY lol "lol">\n <!ENTITY lol2 "&lol;&lol;&lol;">\n]>\n<lolz>&lol2;</lolz>';
    const e = error(laughs);
    expect(e.message).toContain('DOCTYPE is refused');
    expect(e.line).toBe(2);
    const xxe = '<!DOCTYPE a [<!ENTITY x SYSTEM "file:///etc/passwd">]><a>&x;</a>';
    expect(error(xxe).message).toContain('DOCTYPE is refused');
    expect(error('<a><!ENTITY x "y"></a>').message).toContain('<!ENTITY');
  });

  it('stops at a depth limit instead of running out of stack', () => {
    const deep = '<a>'.repeat(300) + '</a>'.repeat(300);
    expect(error(deep).message).toContain('deeper than 256');
    expect(parseXml(deep, { maxDepth: 400 }).ok).toBe(true);
  });

  it('keeps returning the same error after the first one', () => {
    const p = new XmlPullParser('<a><b></a>');
    let ev = p.next();
    while (ev.type !== 'error') ev = p.next();
    expect(p.next()).toBe(ev);
  });
});

describe('XML escaping helpers', () => {
  it('escapes text so that the parser reads it back unchanged', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme' }), (s) => {
        const safe = s.replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '');
        const r = parseXml(`<a k="${escapeXmlAttribute(safe)}">${escapeXmlText(safe)}</a>`, {
          keepWhitespaceText: true,
        });
        expect(r.ok).toBe(true);
        if (r.ok) {
          expect(elementText(r.root)).toBe(safe);
          expect(attributeValue(r.root, 'k')).toBe(safe);
        }
      }),
      { seed: 20250401, numRuns: 300 },
    );
  });
});

describe('XML parser: robustness', () => {
  it('never throws and ends in eof or one error for mutated documents', () => {
    const base =
      '<?xml version="1.0"?>\n<a xmlns:p="urn:p" k="v">\n <p:b x="1">t&amp;<![CDATA[c]]></p:b>\n <!-- c -->\n</a>\n';
    const alphabet = ['<', '>', '/', '&', ';', '"', "'", '=', ':', '!', '?', '[', ']', '-', 'x', ' ', '\n'];
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(base.length), fc.nat(base.length), fc.constantFrom(...alphabet)), {
          minLength: 1,
          maxLength: 4,
        }),
        (edits) => {
          let s = base;
          for (const [at, len, ch] of edits)
            s = s.slice(0, at % (s.length + 1)) + ch + s.slice((at % (s.length + 1)) + (len % 3));
          const ev = events(s);
          const last = ev[ev.length - 1] as XmlEvent;
          expect(['eof', 'error']).toContain(last.type);
          if (last.type === 'error') expect(last.error.line).toBeGreaterThanOrEqual(1);
        },
      ),
      { seed: 7, numRuns: 2000 },
    );
  });
});
