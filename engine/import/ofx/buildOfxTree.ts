/**
 * A tolerant tag scanner and tree builder for OFX bodies, one code path for both
 * generations: OFX 1.x SGML, whose leaf elements have no end tags (`<TRNAMT>-5.00` runs
 * until the next tag), and OFX 2.x XML, where every element is closed. It never throws
 * and never backtracks: one left-to-right pass, O(n) in the length of the text.
 *
 * How an element without an end tag is closed:
 * - a known leaf (TRNAMT, NAME, …) ends at the next tag, with or without text;
 * - an unknown element that received text is a leaf and ends at the next tag;
 * - an unknown element that received no text but was followed by other elements and
 *   never closed was an empty SGML leaf: its would-be children are handed back to its
 *   parent when the parent's end tag (or the end of the file) arrives;
 * - a known aggregate (STMTTRN, BANKTRANLIST, …) must be closed: when it is not, the
 *   file is truncated or broken and an error names it and the line it opened on.
 */
import { decodeOfxText } from './ofxText';

/** One element of an OFX body. Aggregates have children; leaves have `text`. */
export interface OfxElement {
  /** Tag name, upper-cased (OFX names are upper case; readers tolerate lower case). */
  readonly name: string;
  /** 1-based line of the start tag. */
  readonly line: number;
  /** Decoded, trimmed value of a leaf; undefined for an aggregate. */
  readonly text: string | undefined;
  readonly children: readonly OfxElement[];
}

/** A problem found while scanning: always with a line, with an element path when known. */
export interface OfxTreeProblem {
  readonly line: number;
  readonly element?: string;
  readonly message: string;
  readonly severity: 'error' | 'notice';
}

/** The elements found at the top level of the body (normally one `OFX`) and the problems. */
export interface OfxTree {
  readonly roots: readonly OfxElement[];
  readonly problems: readonly OfxTreeProblem[];
}

/** Deepest nesting accepted; real OFX statements nest about ten levels deep. */
export const MAX_OFX_DEPTH = 64;

/** Problems listed by the scanner; beyond this they are only counted. */
export const MAX_TREE_PROBLEMS = 500;

const KNOWN_AGGREGATES = new Set(
  (
    'OFX SIGNONMSGSRSV1 SIGNONMSGSRQV1 SONRS SONRQ STATUS FI MFACHALLENGERS ' +
    'BANKMSGSRSV1 BANKMSGSRQV1 STMTTRNRS STMTTRNRQ STMTRS STMTRQ INCTRAN BANKACCTFROM BANKACCTTO ' +
    'CCACCTFROM CCACCTTO BANKTRANLIST BANKTRANLISTP STMTTRN STMTTRNP PAYEE CURRENCY ORIGCURRENCY ' +
    'LEDGERBAL AVAILBAL BALLIST BAL CREDITCARDMSGSRSV1 CREDITCARDMSGSRQV1 CCSTMTTRNRS CCSTMTTRNRQ ' +
    'CCSTMTRS CCSTMTRQ STMTENDTRNRS STMTENDRS CCSTMTENDTRNRS CCSTMTENDRS CLOSING REWARDINFO ' +
    'INVSTMTMSGSRSV1 INVSTMTTRNRS INVSTMTRS INVACCTFROM INVTRANLIST INVPOSLIST INVBAL SECLISTMSGSRSV1 SECLIST'
  ).split(' '),
);

const KNOWN_LEAVES = new Set(
  (
    'TRNTYPE DTPOSTED DTUSER DTAVAIL TRNAMT FITID CORRECTFITID CORRECTACTION SRVRTID CHECKNUM REFNUM ' +
    'SIC PAYEEID NAME EXTDNAME MEMO IMAGEDATA INV401KSOURCE CURRATE CURSYM CURDEF BANKID BRANCHID ACCTID ' +
    'ACCTTYPE ACCTKEY DTSTART DTEND BALAMT DTASOF CODE SEVERITY MESSAGE DTSERVER USERKEY TSKEYEXPIRE ' +
    'LANGUAGE DTPROFUP DTACCTUP ORG FID SESSCOOKIE ACCESSTOKEN TRNUID CLTCOOKIE ADDR1 ADDR2 ADDR3 CITY ' +
    'STATE POSTALCODE COUNTRY PHONE MKTGINFO DTTRAN DTEXPIRE DESC BALTYPE VALUE'
  ).split(' '),
);

type Kind = 'aggregate' | 'leaf' | 'unknown';

/**
 * An element while it is being built. The same object is returned as the `OfxElement`
 * (one allocation per element): `text` is set when the element is closed.
 */
interface Building {
  name: string;
  line: number;
  kind: Kind;
  /** Text received so far. */
  raw: string;
  text: string | undefined;
  hasText: boolean;
  children: Building[];
  /** Ordinal among same-named siblings so far (1-based), for element paths in problems. */
  ordinal: number;
  /** Highest ordinal per child name, kept only for parents with many different children. */
  counts?: Map<string, number>;
}

function kindOf(name: string): Kind {
  if (KNOWN_LEAVES.has(name)) return 'leaf';
  if (KNOWN_AGGREGATES.has(name)) return 'aggregate';
  return 'unknown';
}

/** Fixes an element's final value: trimmed text for a leaf, undefined for an aggregate. */
function settle(node: Building): void {
  const isLeaf = node.kind === 'leaf' || (node.kind === 'unknown' && node.children.length === 0);
  node.text = isLeaf ? node.raw.trim() : undefined;
}

const NAME_START = /[A-Za-z_]/;
const NAME_RUN = /[A-Za-z0-9._:-]*/y;

function preview(text: string): string {
  const t = text.trim().replace(/\s+/g, ' ');
  return t.length > 24 ? `${t.slice(0, 24)}…` : t;
}

/**
 * Scans an OFX body (the part after the header) into a tree of elements.
 *
 * @param text the whole file text.
 * @param start offset where the body starts (after the header).
 * @param startLine 1-based line number at `start`.
 * @returns the top-level elements and the problems found (at most MAX_TREE_PROBLEMS listed).
 * @throws Never. O(n) in the length of the body.
 * @example buildOfxTree('<OFX><CODE>0</OFX>', 0, 1).roots[0]?.children[0]?.text // '0'
 */
export function buildOfxTree(text: string, start: number, startLine: number): OfxTree {
  const problems: OfxTreeProblem[] = [];
  const top: Building = {
    name: '',
    line: startLine,
    kind: 'aggregate',
    raw: '',
    text: undefined,
    hasText: false,
    children: [],
    ordinal: 1,
  };
  const stack: Building[] = [top];
  let rootClosed = false;

  // Line tracking: `line` is the line at offset `lineAt`; advance counts breaks (\n, \r\n, \r).
  let line = startLine;
  let lineAt = start;
  const lineOf = (pos: number): number => {
    for (let i = lineAt; i < pos; i++) {
      const c = text.charCodeAt(i);
      if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) line++;
    }
    if (pos > lineAt) lineAt = pos;
    return line;
  };

  const pathOf = (extra?: Building): string => {
    const parts: string[] = [];
    for (let i = 1; i < stack.length; i++) {
      const b = stack[i] as Building;
      parts.push(b.ordinal > 1 ? `${b.name}[${b.ordinal}]` : b.name);
    }
    if (extra) parts.push(extra.ordinal > 1 ? `${extra.name}[${extra.ordinal}]` : extra.name);
    return parts.join('/');
  };

  let omitted = 0;
  let omittedErrors = false;
  const problem = (atLine: number, message: string, severity: 'error' | 'notice' = 'error', element?: string): void => {
    if (problems.length >= MAX_TREE_PROBLEMS) {
      omitted++;
      omittedErrors ||= severity === 'error';
      return;
    }
    problems.push(element ? { line: atLine, element, message, severity } : { line: atLine, message, severity });
  };

  /** Pops the innermost element, handing an empty unknown element's children to its parent. */
  const popOne = (): void => {
    const node = stack.pop() as Building;
    const parent = stack[stack.length - 1] as Building;
    if (node.kind === 'unknown' && !node.hasText && node.children.length > 0) {
      const moved = node.children.splice(0);
      for (const child of moved) parent.children.push(child);
    }
    settle(node);
  };

  /** True when the innermost element may end without an end tag (a leaf or an empty unknown). */
  const closesImplicitly = (node: Building): boolean =>
    node.kind === 'leaf' || (node.kind === 'unknown' && (node.hasText || node.children.length === 0));

  const appendText = (piece: string, atLine: number): void => {
    const node = stack[stack.length - 1] as Building;
    if (node === top) {
      if (piece.trim() === '') return;
      if (rootClosed) {
        problem(atLine, `text "${preview(piece)}" after </OFX> ignored`, 'notice');
      } else {
        problem(atLine, `unexpected text "${preview(piece)}", expected an element such as <OFX>`);
      }
      return;
    }
    if (node.kind === 'leaf' || (node.kind === 'unknown' && node.children.length === 0)) {
      node.raw += piece;
      if (piece.trim() !== '') node.hasText = true;
      return;
    }
    if (piece.trim() !== '') {
      problem(
        atLine,
        `unexpected text "${preview(piece)}" inside <${node.name}>, expected an element`,
        'error',
        pathOf(),
      );
    }
  };

  const openElement = (name: string, atLine: number, selfClosing: boolean): boolean => {
    // A start tag ends an open leaf: that is how SGML leaves without end tags end.
    while (stack.length > 1) {
      const inner = stack[stack.length - 1] as Building;
      if (inner.kind === 'leaf' || (inner.kind === 'unknown' && inner.hasText)) popOne();
      else break;
    }
    const parent = stack[stack.length - 1] as Building;
    // Same-named siblings are adjacent in OFX (STMTTRN after STMTTRN): look back a few
    // children, and keep a per-parent count only for parents where that does not suffice.
    let ordinal = 0;
    const siblings = parent.children;
    for (let i = siblings.length - 1; i >= Math.max(0, siblings.length - 8); i--) {
      const sibling = siblings[i] as Building;
      if (sibling.name === name) {
        ordinal = sibling.ordinal;
        break;
      }
    }
    if (ordinal === 0 && siblings.length > 8) {
      if (!parent.counts) {
        parent.counts = new Map();
        for (const c of siblings) parent.counts.set(c.name, c.ordinal);
      }
      ordinal = parent.counts.get(name) ?? 0;
    }
    ordinal++;
    parent.counts?.set(name, ordinal);
    const node: Building = {
      name,
      line: atLine,
      kind: kindOf(name),
      raw: '',
      text: undefined,
      hasText: false,
      children: [],
      ordinal,
    };
    parent.children.push(node);
    if (selfClosing) {
      if (node.kind === 'unknown') node.kind = 'leaf';
      settle(node);
      return true;
    }
    if (stack.length > MAX_OFX_DEPTH) {
      problem(
        atLine,
        `elements nest deeper than ${MAX_OFX_DEPTH} levels, expected an OFX statement`,
        'error',
        pathOf(node),
      );
      settle(node);
      return false;
    }
    stack.push(node);
    return true;
  };

  const closeElement = (name: string, atLine: number): void => {
    let index = -1;
    for (let i = stack.length - 1; i >= 1; i--) {
      if ((stack[i] as Building).name === name) {
        index = i;
        break;
      }
    }
    if (index < 0) {
      problem(atLine, `end tag </${name}> has no matching start tag`, 'error', pathOf() || undefined);
      return;
    }
    let reported = false;
    while (stack.length - 1 > index) {
      const inner = stack[stack.length - 1] as Building;
      if (!closesImplicitly(inner) && !reported && inner.kind === 'aggregate') {
        problem(
          atLine,
          `<${inner.name}> opened on line ${inner.line} is not closed, expected </${inner.name}> before </${name}>`,
          'error',
          pathOf(),
        );
        reported = true;
      }
      popOne();
    }
    const closing = stack[stack.length - 1] as Building;
    if (closing.kind === 'unknown' && !closing.hasText) closing.kind = 'aggregate';
    popOne();
    if (stack.length === 1 && name === 'OFX') rootClosed = true;
  };

  let pos = start;
  const end = text.length;
  // The next ">" at or after a position, cached so that a run of "<" without ">" stays linear.
  let cachedGt = -2;
  const gtFrom = (from: number): number => {
    if (cachedGt === -1 || cachedGt >= from) return cachedGt;
    cachedGt = text.indexOf('>', from);
    return cachedGt;
  };
  while (pos < end) {
    const lt = text.indexOf('<', pos);
    if (lt < 0) {
      appendText(decodeOfxText(text.slice(pos)), lineOf(pos));
      break;
    }
    if (lt > pos) appendText(decodeOfxText(text.slice(pos, lt)), lineOf(pos));
    const atLine = lineOf(lt);
    const next = text.charAt(lt + 1);

    if (next === '!') {
      if (text.startsWith('<!--', lt)) {
        const close = text.indexOf('-->', lt + 4);
        if (close < 0) {
          problem(atLine, 'comment <!-- is never closed, expected -->');
          break;
        }
        pos = close + 3;
      } else if (text.startsWith('<![CDATA[', lt)) {
        const close = text.indexOf(']]>', lt + 9);
        if (close < 0) {
          problem(atLine, 'CDATA section is never closed, expected ]]>');
          break;
        }
        appendText(text.slice(lt + 9, close), atLine);
        pos = close + 3;
      } else {
        const close = text.indexOf('>', lt + 2);
        if (close < 0) {
          problem(atLine, 'declaration <! is never closed, expected >');
          break;
        }
        pos = close + 1;
      }
      continue;
    }
    if (next === '?') {
      const close = text.indexOf('?>', lt + 2);
      if (close < 0) {
        problem(atLine, 'processing instruction <? is never closed, expected ?>');
        break;
      }
      pos = close + 2;
      continue;
    }

    const isEnd = next === '/';
    const nameStart = isEnd ? lt + 2 : lt + 1;
    if (!NAME_START.test(text.charAt(nameStart))) {
      // Not a tag: a literal "<" in SGML text ("A < B"). Keep it as text.
      appendText('<', atLine);
      pos = lt + 1;
      continue;
    }
    NAME_RUN.lastIndex = nameStart + 1;
    NAME_RUN.exec(text);
    const nameEnd = NAME_RUN.lastIndex;
    const name = text.slice(nameStart, nameEnd).toUpperCase();
    const gt = gtFrom(nameEnd);
    const nextLt = text.indexOf('<', nameEnd);
    if (gt < 0 || (nextLt >= 0 && nextLt < gt)) {
      problem(
        atLine,
        `tag <${isEnd ? '/' : ''}${name} is not closed by ">"${gt < 0 ? ' (the file is truncated)' : ''}`,
        'error',
        pathOf() || undefined,
      );
      if (gt < 0) break;
      pos = nextLt;
      continue;
    }
    const inside = text.slice(nameEnd, gt);
    if (isEnd) {
      if (inside.trim() !== '') problem(atLine, `end tag </${name}> has extra text "${preview(inside)}"`);
      closeElement(name, atLine);
    } else {
      const selfClosing = inside.trimEnd().endsWith('/');
      if (!openElement(name, atLine, selfClosing)) break;
    }
    pos = gt + 1;
  }

  const lastLine = lineOf(end);
  let reported = false;
  while (stack.length > 1) {
    const inner = stack[stack.length - 1] as Building;
    if (!reported && inner.kind === 'aggregate') {
      problem(
        lastLine,
        `the file ends inside <${inner.name}> opened on line ${inner.line}: it is truncated, expected </${inner.name}>`,
        'error',
        pathOf(),
      );
      reported = true;
    }
    popOne();
  }

  if (omitted > 0) {
    problems.push({
      line: lastLine,
      message: `${omitted} more problems in the body not listed`,
      severity: omittedErrors ? 'error' : 'notice',
    });
  }
  return { roots: top.children, problems };
}
