import { describe, expect, it } from 'vitest';
import { buildOfxTree, MAX_OFX_DEPTH, MAX_TREE_PROBLEMS, type OfxElement } from '../../engine/import/ofx/buildOfxTree';

function tree(body: string) {
  return buildOfxTree(body, 0, 1);
}

function find(el: OfxElement | undefined, path: string): OfxElement | undefined {
  let node = el;
  for (const name of path.split('/')) node = node?.children.find((c) => c.name === name);
  return node;
}

describe('buildOfxTree', () => {
  it('closes SGML leaf elements at the next tag', () => {
    // Source: OFX 1.0.2 specification, chapter 2, SGML details (from memory): in SGML OFX, elements
    // that hold data have no end tags; aggregates always do.
    const t = tree('<OFX>\n<STATUS>\n<CODE>0\n<SEVERITY>INFO\n</STATUS>\n</OFX>\n');
    expect(t.problems).toEqual([]);
    const status = find(t.roots[0], 'STATUS');
    expect(status?.children.map((c) => [c.name, c.text, c.line])).toEqual([
      ['CODE', '0', 3],
      ['SEVERITY', 'INFO', 4],
    ]);
    expect(status?.text).toBeUndefined();
  });

  it('reads XML with end tags to the same tree', () => {
    const sgml = tree('<OFX><STATUS><CODE>0<SEVERITY>INFO</STATUS></OFX>');
    const xml = tree('<OFX><STATUS><CODE>0</CODE><SEVERITY>INFO</SEVERITY></STATUS></OFX>');
    const shape = (e: OfxElement): unknown => [e.name, e.text, e.children.map(shape)];
    expect(xml.problems).toEqual([]);
    expect(shape(xml.roots[0] as OfxElement)).toEqual(shape(sgml.roots[0] as OfxElement));
  });

  it('handles empty known leaves, self-closing tags, comments, CDATA and processing instructions', () => {
    const t = tree('<OFX><!-- note --><MEMO><NAME>A<?pi x?><EXT/><TAG><![CDATA[a<b&amp;]]></TAG></OFX>');
    expect(t.problems).toEqual([]);
    const root = t.roots[0] as OfxElement;
    expect(root.children.map((c) => [c.name, c.text])).toEqual([
      ['MEMO', ''],
      ['NAME', 'A'],
      ['EXT', ''],
      ['TAG', 'a<b&amp;'],
    ]);
  });

  it('numbers repeated siblings for element paths in problems, also among many different siblings', () => {
    const many = Array.from({ length: 20 }, (_, i) => `<X${i}>v`).join('');
    const t = tree(`<OFX><STMTTRN></STMTTRN><STMTTRN>${many}<STMTTRN>oops</STMTTRN></STMTTRN></OFX>`);
    expect(t.problems[0]).toMatchObject({
      element: 'OFX/STMTTRN[2]/STMTTRN',
      message: expect.stringMatching(/"oops"/),
    });
    const wide = tree(`<OFX>${many}<X3>w<BANKTRANLIST>text</BANKTRANLIST></OFX>`);
    expect(wide.problems[0]?.element).toBe('OFX/BANKTRANLIST');
    const again = tree(`<OFX>${many}<STATUS></STATUS>${many}<STATUS>text</STATUS></OFX>`);
    expect(again.problems[0]?.element).toBe('OFX/STATUS[2]');
  });

  it('hands the would-be children of an unknown empty SGML element back to its parent', () => {
    const t = tree('<OFX><STMTTRN><X.FLAG><FITID>1</STMTTRN></OFX>');
    expect(t.problems).toEqual([]);
    const trn = find(t.roots[0], 'STMTTRN');
    expect(trn?.children.map((c) => [c.name, c.text])).toEqual([
      ['X.FLAG', ''],
      ['FITID', '1'],
    ]);
  });

  it('keeps a literal "<" that does not start a tag, and decodes entities', () => {
    const t = tree('<OFX><NAME>A < B &amp; C</OFX>');
    expect(t.problems).toEqual([]);
    expect(find(t.roots[0], 'NAME')?.text).toBe('A < B & C');
  });

  it('counts lines across LF, CRLF and lone CR', () => {
    const t = tree('<OFX>\r\n<A>1\r<B>2\n\n<C>3</OFX>');
    expect((t.roots[0] as OfxElement).children.map((c) => c.line)).toEqual([2, 3, 5]);
  });

  it('reports an unclosed aggregate with the line it opened on', () => {
    const t = tree('<OFX>\n<STMTTRN>\n<TRNAMT>1\n</OFX>\n');
    expect(t.problems).toHaveLength(1);
    expect(t.problems[0]).toMatchObject({ line: 4, severity: 'error', element: 'OFX/STMTTRN' });
    expect(t.problems[0]?.message).toBe('<STMTTRN> opened on line 2 is not closed, expected </STMTTRN> before </OFX>');
  });

  it('reports a truncated file and a tag cut in half', () => {
    const cut = tree('<OFX>\n<BANKTRANLIST>\n<STMTTRN>\n<TRNAMT>1');
    expect(cut.problems.map((p) => p.message)).toEqual([
      'the file ends inside <STMTTRN> opened on line 3: it is truncated, expected </STMTTRN>',
    ]);
    const half = tree('<OFX>\n<STMTTRN>\n<TRNA');
    expect(half.problems.some((p) => /tag <TRNA is not closed by ">" \(the file is truncated\)/.test(p.message))).toBe(
      true,
    );
  });

  it('reports stray end tags, stray text and unterminated comments', () => {
    expect(tree('<OFX></STMTTRN></OFX>').problems[0]?.message).toBe('end tag </STMTTRN> has no matching start tag');
    expect(tree('<OFX><STMTTRN>oops</STMTTRN></OFX>').problems[0]?.message).toMatch(
      /unexpected text "oops" inside <STMTTRN>/,
    );
    expect(tree('<OFX><!-- never').problems[0]?.message).toMatch(/comment <!-- is never closed/);
    expect(tree('junk<OFX></OFX>').problems[0]?.message).toMatch(/unexpected text "junk"/);
    expect(tree('<OFX></OFX>tail').problems[0]).toMatchObject({ severity: 'notice' });
  });

  it('refuses nesting deeper than its limit instead of recursing without end', () => {
    const deep = '<A>'.repeat(MAX_OFX_DEPTH + 10);
    const t = tree(deep);
    expect(t.problems.some((p) => p.message.includes(`deeper than ${MAX_OFX_DEPTH}`))).toBe(true);
  });

  it('stays linear on a long run of "<" without ">"', () => {
    // Every "<A" looks ahead to the one ">" at the very end: a scan that searched for ">" anew
    // each time would be quadratic. The result: one problem per cut tag (19 999), one for the
    // unclosed <OFX>, of which the first MAX_TREE_PROBLEMS are listed and the rest counted.
    const t = tree('<OFX>' + '<A'.repeat(20_000) + '>');
    expect(t.problems).toHaveLength(MAX_TREE_PROBLEMS + 1);
    expect(t.problems.slice(0, MAX_TREE_PROBLEMS).every((p) => p.message.startsWith('tag <A is not closed'))).toBe(
      true,
    );
    expect(t.problems[MAX_TREE_PROBLEMS]?.message).toBe(
      `${20_000 - MAX_TREE_PROBLEMS} more problems in the body not listed`,
    );
  });
});
