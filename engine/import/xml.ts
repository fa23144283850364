/**
 * A small, fast, non-validating XML 1.0 parser with namespaces, written for statement
 * files (camt.053, OFX 2.x) that may be tens of megabytes large. Pure TypeScript: no DOM,
 * no Node, so it runs unchanged in the CLI, a Web Worker and tests.
 *
 * Two ways to use it:
 * - **Pull** (`XmlPullParser`): call `next()` for one event at a time (`start`, `end`,
 *   `text`, optionally `comment` / `pi`, then `eof`). Call `readElement()` right after a
 *   `start` event to get that element's whole subtree as plain objects, so a large file
 *   can be read one record at a time (one camt `<Ntry>`) without building the whole tree.
 * - **Tree** (`parseXml`): the whole document as one `XmlElement` tree, for small files.
 *
 * What it does (W3C XML 1.0 Fifth Edition and Namespaces in XML 1.0 Third Edition):
 * elements, attributes, namespace prefixes and default namespaces, text, CDATA sections,
 * comments, processing instructions, the XML declaration, the five predefined entities
 * (`&lt; &gt; &amp; &quot; &apos;`) and numeric character references (`&#233; &#xE9;`),
 * line-end normalisation (CR LF and lone CR become LF) and attribute-value normalisation.
 *
 * What it refuses, as a well-formedness error with line, column and element path:
 * mismatched or unclosed tags, a second root, text outside the root, duplicate
 * attributes, undeclared prefixes, bad or unknown entity references, `]]>` in text, `--`
 * inside comments, a misplaced XML declaration, and every `<!DOCTYPE`, `<!ENTITY`,
 * `<!ELEMENT` … declaration. Refusing DTDs outright means no external entities (XXE) and no
 * entity expansion ("billion laughs"): the output is never larger than the input.
 *
 * What it does not check (it is non-validating and built for speed): that every character
 * is an XML `Char` (control characters in text pass through), and the Unicode classes of
 * non-ASCII name characters (any code point from U+00B7 up is accepted in names, except
 * × and ÷). Lines are counted by LF, so a file using lone CR line ends reports line 1.
 *
 * Complexity: one pass over the text, O(n) time, using `indexOf` to jump between markup;
 * no regular expression runs per character and no step depends on earlier input in a way
 * that can go exponential. Memory: the pull parser holds only the open-element stack; the
 * strings it returns are slices of the input.
 */

import { EngineError } from '../core/errors';

/** Namespace URI bound to the `xml` prefix by definition. */
export const XML_NAMESPACE = 'http://www.w3.org/XML/1998/namespace';
/** Namespace URI of `xmlns` and `xmlns:*` attributes. */
export const XMLNS_NAMESPACE = 'http://www.w3.org/2000/xmlns/';

/** A well-formedness error: what was wrong, where (1-based line and column), and the element path. */
export interface XmlSyntaxError {
  readonly message: string;
  readonly line: number;
  readonly column: number;
  /**
   * Path of the open elements at the error, by qualified name, e.g.
   * `Document/BkToCstmrStmt/Stmt[2]/Ntry[14]`. A sibling position `[n]` is added when
   * n > 1, or always for local names listed in `XmlParserOptions.indexedNames`.
   * Empty when the error is outside the root element.
   */
  readonly path: string;
}

/** One attribute as written, with its prefix resolved. */
export interface XmlAttribute {
  /** Qualified name as written (`xsi:schemaLocation`). */
  readonly name: string;
  readonly prefix: string;
  readonly localName: string;
  /** Namespace URI; '' for unprefixed attributes (they are in no namespace). */
  readonly namespace: string;
  /** Value with entities decoded and whitespace normalised per XML 1.0 §3.3.3. */
  readonly value: string;
}

/** An element's start tag. A self-closing tag `<a/>` is reported as `start` then `end`. */
export interface XmlStartEvent {
  readonly type: 'start';
  readonly name: string;
  readonly prefix: string;
  readonly localName: string;
  /** Namespace URI the prefix (or the default namespace) is bound to; '' for none. */
  readonly namespace: string;
  readonly attributes: readonly XmlAttribute[];
  readonly selfClosing: boolean;
  /** 1-based line and column of the `<`. */
  readonly line: number;
  readonly column: number;
  /** Nesting depth: 1 for the root element. */
  readonly depth: number;
  /** 1-based position among the preceding siblings of the same qualified name. */
  readonly index: number;
}

/** An element's end tag (or the end of a self-closing tag). */
export interface XmlEndEvent {
  readonly type: 'end';
  readonly name: string;
  readonly prefix: string;
  readonly localName: string;
  readonly namespace: string;
  readonly line: number;
  readonly column: number;
  readonly depth: number;
}

/**
 * Character data. Adjacent text, CDATA sections and entity references are merged into
 * one event (comments and processing instructions that are not reported do not split it).
 */
export interface XmlTextEvent {
  readonly type: 'text';
  readonly text: string;
  /** True when any part came from a CDATA section. */
  readonly cdata: boolean;
  readonly line: number;
  readonly column: number;
}

/** A comment, reported only with `reportComments: true`. */
export interface XmlCommentEvent {
  readonly type: 'comment';
  readonly text: string;
  readonly line: number;
  readonly column: number;
}

/** A processing instruction, reported only with `reportProcessingInstructions: true`. */
export interface XmlProcessingInstructionEvent {
  readonly type: 'pi';
  readonly target: string;
  readonly data: string;
  readonly line: number;
  readonly column: number;
}

/** The document is not well-formed. Every later `next()` returns the same event. */
export interface XmlErrorEvent {
  readonly type: 'error';
  readonly error: XmlSyntaxError;
}

/** The root element closed and nothing but comments, PIs and whitespace followed. */
export interface XmlEofEvent {
  readonly type: 'eof';
}

export type XmlEvent =
  | XmlStartEvent
  | XmlEndEvent
  | XmlTextEvent
  | XmlCommentEvent
  | XmlProcessingInstructionEvent
  | XmlErrorEvent
  | XmlEofEvent;

/** The XML declaration `<?xml version="1.0" encoding="UTF-8"?>`, when the document has one. */
export interface XmlDeclaration {
  readonly version: string;
  readonly encoding?: string;
  readonly standalone?: boolean;
}

/** A text node in a tree built by `readElement` / `parseXml`. */
export interface XmlText {
  readonly kind: 'text';
  readonly text: string;
  readonly cdata: boolean;
  readonly line: number;
  readonly column: number;
}

/** A comment node (only with `reportComments`). */
export interface XmlComment {
  readonly kind: 'comment';
  readonly text: string;
  readonly line: number;
  readonly column: number;
}

/** A processing-instruction node (only with `reportProcessingInstructions`). */
export interface XmlProcessingInstruction {
  readonly kind: 'pi';
  readonly target: string;
  readonly data: string;
  readonly line: number;
  readonly column: number;
}

/** An element node: plain data, safe to pass across a worker boundary. */
export interface XmlElement {
  readonly kind: 'element';
  readonly name: string;
  readonly prefix: string;
  readonly localName: string;
  readonly namespace: string;
  readonly attributes: readonly XmlAttribute[];
  /** Child nodes in document order. */
  readonly children: readonly XmlNode[];
  readonly line: number;
  readonly column: number;
  /** 1-based position among same-named siblings (see `XmlStartEvent.index`). */
  readonly index: number;
}

export type XmlNode = XmlElement | XmlText | XmlComment | XmlProcessingInstruction;

/** Options of `XmlPullParser` and `parseXml`. */
export interface XmlParserOptions {
  /**
   * Keep whitespace-only text between tags (indentation). Default false: whitespace-only
   * text is dropped unless it is an element's entire content (`<a>  </a>` keeps `"  "`)
   * or comes from CDATA.
   */
  readonly keepWhitespaceText?: boolean;
  /** Report comments as `comment` events / nodes. Default false (they are skipped). */
  readonly reportComments?: boolean;
  /** Report processing instructions as `pi` events / nodes. Default false. */
  readonly reportProcessingInstructions?: boolean;
  /** Deepest element nesting accepted. Default 256. */
  readonly maxDepth?: number;
  /** Local names that always get a `[n]` position in error paths (e.g. `Stmt`, `Ntry`). */
  readonly indexedNames?: ReadonlySet<string>;
}

// ---------------------------------------------------------------------------------------

const LT = 0x3c; // <
const GT = 0x3e; // >
const SLASH = 0x2f;
const BANG = 0x21;
const QUESTION = 0x3f;
const EQUALS = 0x3d;
const QUOTE = 0x22;
const APOS = 0x27;

const NAME_START = new Uint8Array(128);
const NAME_CHAR = new Uint8Array(128);
for (let c = 0; c < 128; c++) {
  const letter = (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
  NAME_START[c] = letter || c === 95 || c === 58 ? 1 : 0;
  NAME_CHAR[c] = NAME_START[c] || (c >= 48 && c <= 57) || c === 45 || c === 46 ? 1 : 0;
}

function isNameStart(c: number): boolean {
  return c < 128 ? NAME_START[c] === 1 : c >= 0xc0 && c !== 0xd7 && c !== 0xf7;
}

function isNameChar(c: number): boolean {
  return c < 128 ? NAME_CHAR[c] === 1 : c >= 0xb7 && c !== 0xd7 && c !== 0xf7;
}

function isSpace(c: number): boolean {
  return c === 0x20 || c === 0x0a || c === 0x09 || c === 0x0d;
}

function isXmlChar(cp: number): boolean {
  return (
    cp === 0x9 ||
    cp === 0xa ||
    cp === 0xd ||
    (cp >= 0x20 && cp <= 0xd7ff) ||
    (cp >= 0xe000 && cp <= 0xfffd) ||
    (cp >= 0x10000 && cp <= 0x10ffff)
  );
}

function isAllSpace(s: string): boolean {
  for (let i = 0; i < s.length; i++) if (!isSpace(s.charCodeAt(i))) return false;
  return true;
}

/**
 * The engine's one shared copy of a name (in V8, the internalized string a property key
 * becomes). Names the parser returns are then the very strings the caller's literals are,
 * so `el.localName === 'Amt'` compares two pointers instead of two texts. Done once per
 * distinct name (the name cache keeps the result). XML names never look like array indices.
 */
function internalized(name: string): string {
  const holder: Record<string, true> = {};
  holder[name] = true;
  return Object.keys(holder)[0] as string;
}

/** Thrown inside the parser only; `next()` turns it into a sticky `error` event. */
class XmlAbort {
  constructor(readonly error: XmlSyntaxError) {}
}

const EMPTY_ATTRIBUTES: readonly XmlAttribute[] = Object.freeze([]);
const NO_INDEXED_NAMES: ReadonlySet<string> = new Set();
const DECLARATION =
  /^\s+version\s*=\s*(["'])(1\.[0-9]+)\1(?:\s+encoding\s*=\s*(["'])([A-Za-z][A-Za-z0-9._-]*)\3)?(?:\s+standalone\s*=\s*(["'])(yes|no)\5)?\s*$/;
const HEX_REF = /^[0-9a-fA-F]{1,8}$/;
const DEC_REF = /^[0-9]{1,10}$/;

function shorten(s: string): string {
  return s.length > 40 ? s.slice(0, 37) + '…' : s;
}

const TOK_START = 1;
const TOK_END = 2;
const TOK_TEXT = 3;
const TOK_COMMENT = 4;
const TOK_PI = 5;
const TOK_EOF = 6;
type Token = 1 | 2 | 3 | 4 | 5 | 6;

const NAME_CACHE_SIZE = 4096;

type MutableElement = XmlElement & { children: XmlNode[] };

/** Shared by every element without children; replaced (never pushed to) on the first child. */
const NO_CHILDREN: XmlNode[] = Object.freeze([]) as unknown as XmlNode[];

/** Appends a child; the first child gets an array of exactly one slot (most elements are leaves). */
function addChild(parent: MutableElement, node: XmlNode): void {
  if (parent.children === NO_CHILDREN) parent.children = [node];
  else parent.children.push(node);
}

/**
 * Pull parser over a whole document held in memory.
 *
 * @example
 * const p = new XmlPullParser('<a x="1">hi &amp; bye</a>');
 * p.next(); // { type: 'start', name: 'a', attributes: [{ name: 'x', value: '1', … }], … }
 * p.next(); // { type: 'text', text: 'hi & bye', … }
 * p.next(); // { type: 'end', name: 'a', … }
 * p.next(); // { type: 'eof' }
 *
 * @example
 * // Read one record at a time from a large file:
 * for (let ev = p.next(); ev.type !== 'eof' && ev.type !== 'error'; ev = p.next()) {
 *   if (ev.type === 'start' && ev.localName === 'Ntry') handle(p.readElement(ev));
 * }
 *
 * Never throws for bad input: a malformed document yields an `error` event (and then the
 * same event forever). Construction never throws.
 */
export class XmlPullParser {
  private readonly text: string;
  private readonly end: number;
  private pos: number;
  private readonly docStart: number;
  private readonly keepWhitespace: boolean;
  private readonly reportComments: boolean;
  private readonly reportPis: boolean;
  private readonly maxDepth: number;
  private readonly indexedNames: ReadonlySet<string>;

  // Incremental line counting: each LF is found once.
  private lineNo = 1;
  private lineStart = 0;
  private nextNewline: number;

  // Open elements as parallel arrays (index 1 = root); `depthNow` is the number open.
  private depthNow = 0;
  private readonly oName: string[] = [''];
  private readonly oPrefix: string[] = [''];
  private readonly oLocal: string[] = [''];
  private readonly oNs: string[] = [''];
  private readonly oLine: number[] = [0];
  private readonly oIndex: number[] = [0];
  private readonly oNsMark: number[] = [1];
  // Same-name sibling counters of the children of the element at each depth (0 = document).
  private readonly sibNames: string[][] = [[]];
  private readonly sibCounts: number[][] = [[]];
  private readonly sibSize: number[] = [0];
  private readonly sibMaps: (Map<string, number> | undefined)[] = [undefined];

  private readonly nsPrefixes: string[] = ['xml'];
  private readonly nsUris: string[] = [XML_NAMESPACE];
  private readonly nameCache: (string | undefined)[] = new Array<string | undefined>(NAME_CACHE_SIZE);
  private readonly qnameParts = new Map<string, [string, string]>();
  private readonly namePrefix: ([string, string] | undefined)[] = new Array<[string, string] | undefined>(
    NAME_CACHE_SIZE,
  );
  private lastNameSlot = 0;

  // Fields of the token just scanned.
  private tName = '';
  private tPrefix = '';
  private tLocal = '';
  private tNs = '';
  private tAttrs: readonly XmlAttribute[] = EMPTY_ATTRIBUTES;
  private tSelfClosing = false;
  private tLine = 0;
  private tColumn = 0;
  private tDepth = 0;
  private tIndex = 0;
  private tText = '';
  private tCdata = false;
  private tTarget = '';

  // Next "]]>", "&" and CR at or after the text being scanned (see scanCharData).
  private nextCdataClose = -1;
  private nextAmp = -1;
  private nextCr = -1;

  private pendingEnd = false;
  private lastStart: XmlStartEvent | undefined;
  private failure: XmlErrorEvent | undefined;
  private finished: XmlEofEvent | undefined;
  private rootSeen = false;
  private rootClosed = false;
  private lastWasStart = false;
  private declarationValue: XmlDeclaration | undefined;

  constructor(text: string, options: XmlParserOptions = {}) {
    this.text = text;
    this.end = text.length;
    this.docStart = text.charCodeAt(0) === 0xfeff ? 1 : 0;
    this.pos = this.docStart;
    this.keepWhitespace = options.keepWhitespaceText ?? false;
    this.reportComments = options.reportComments ?? false;
    this.reportPis = options.reportProcessingInstructions ?? false;
    this.maxDepth = options.maxDepth ?? 256;
    this.indexedNames = options.indexedNames ?? NO_INDEXED_NAMES;
    this.nextNewline = text.indexOf('\n');
  }

  /** The XML declaration, once the parser has read past it (after the first `next()`). */
  get declaration(): XmlDeclaration | undefined {
    return this.declarationValue;
  }

  /** Number of open elements. */
  get depth(): number {
    return this.depthNow;
  }

  /**
   * Path of the currently open elements, e.g. `Document/BkToCstmrStmt/Stmt[2]`.
   * @example
   * const p = new XmlPullParser('<a><b/><b>…');
   * p.next(); p.next(); p.next(); p.next(); p.path() // 'a/b[2]'
   */
  path(): string {
    let out = '';
    for (let d = 1; d <= this.depthNow; d++) {
      out +=
        (d === 1 ? '' : '/') +
        this.pathStep(this.oName[d] as string, this.oLocal[d] as string, this.oIndex[d] as number);
    }
    return out;
  }

  private pathStep(name: string, localName: string, index: number): string {
    return index > 1 || this.indexedNames.has(localName) ? `${name}[${index}]` : name;
  }

  /**
   * The next event. Never throws; see `XmlEvent`.
   * @example new XmlPullParser('<a/>').next() // { type: 'start', name: 'a', selfClosing: true, … }
   */
  next(): XmlEvent {
    if (this.failure) return this.failure;
    if (this.finished) return this.finished;
    let tok: Token;
    try {
      tok = this.scanToken();
    } catch (e) {
      return this.abort(e);
    }
    switch (tok) {
      case TOK_START: {
        const ev: XmlStartEvent = {
          type: 'start',
          name: this.tName,
          prefix: this.tPrefix,
          localName: this.tLocal,
          namespace: this.tNs,
          attributes: this.tAttrs,
          selfClosing: this.tSelfClosing,
          line: this.tLine,
          column: this.tColumn,
          depth: this.tDepth,
          index: this.tIndex,
        };
        this.lastStart = ev;
        return ev;
      }
      case TOK_END:
        return {
          type: 'end',
          name: this.tName,
          prefix: this.tPrefix,
          localName: this.tLocal,
          namespace: this.tNs,
          line: this.tLine,
          column: this.tColumn,
          depth: this.tDepth,
        };
      case TOK_TEXT:
        return { type: 'text', text: this.tText, cdata: this.tCdata, line: this.tLine, column: this.tColumn };
      case TOK_COMMENT:
        return { type: 'comment', text: this.tText, line: this.tLine, column: this.tColumn };
      case TOK_PI:
        return { type: 'pi', target: this.tTarget, data: this.tText, line: this.tLine, column: this.tColumn };
      default:
        this.finished = { type: 'eof' };
        return this.finished;
    }
  }

  private abort(e: unknown): XmlErrorEvent {
    if (e instanceof XmlAbort) {
      this.failure = { type: 'error', error: e.error };
      return this.failure;
    }
    throw e;
  }

  /**
   * Reads the whole content of the element whose `start` event was just returned by
   * `next()`, through its end tag, and returns it as a tree. Afterwards `next()` continues
   * with whatever follows the element. Faster than a loop over `next()`: no events are made.
   *
   * @returns the element, or the well-formedness error met inside it (then every later
   *   `next()` returns that error).
   * @throws EngineError INVALID_ARGUMENT when `start` is not the start event `next()` just
   *   returned (a usage mistake, not bad input).
   * @example
   * const p = new XmlPullParser('<r><a k="v">x<b/></a></r>');
   * p.next(); const a = p.next();
   * if (a.type === 'start') p.readElement(a); // { kind: 'element', name: 'a', children: [text 'x', element b] }
   */
  readElement(start: XmlStartEvent): XmlElement | XmlSyntaxError {
    if (this.failure) return this.failure.error;
    if (start !== this.lastStart || start.depth !== this.depthNow) {
      throw new EngineError('INVALID_ARGUMENT', 'readElement: call it right after next() returned this start event');
    }
    this.lastStart = undefined;
    const root = elementOf(start);
    const stack: MutableElement[] = [root];
    try {
      for (;;) {
        const tok = this.scanToken();
        const top = stack[stack.length - 1] as MutableElement;
        if (tok === TOK_START) {
          const child: MutableElement = {
            kind: 'element',
            name: this.tName,
            prefix: this.tPrefix,
            localName: this.tLocal,
            namespace: this.tNs,
            attributes: this.tAttrs,
            children: NO_CHILDREN,
            line: this.tLine,
            column: this.tColumn,
            index: this.tIndex,
          };
          addChild(top, child);
          stack.push(child);
        } else if (tok === TOK_END) {
          stack.pop();
          if (stack.length === 0) return root;
        } else if (tok === TOK_TEXT) {
          addChild(top, {
            kind: 'text',
            text: this.tText,
            cdata: this.tCdata,
            line: this.tLine,
            column: this.tColumn,
          });
        } else if (tok === TOK_COMMENT) {
          addChild(top, { kind: 'comment', text: this.tText, line: this.tLine, column: this.tColumn });
        } else if (tok === TOK_PI) {
          addChild(top, {
            kind: 'pi',
            target: this.tTarget,
            data: this.tText,
            line: this.tLine,
            column: this.tColumn,
          });
        } else {
          // Unreachable: the end of the document is only reached once every element has closed.
          this.fail(this.end, 'unexpected end of document');
        }
      }
    } catch (e) {
      return this.abort(e).error;
    }
  }

  /**
   * Skips the content of the element whose `start` event was just returned, through its end tag.
   * @returns undefined, or the well-formedness error met inside it.
   * @example if (ev.type === 'start' && ev.localName === 'SplmtryData') p.skipElement(ev);
   */
  skipElement(start: XmlStartEvent): XmlSyntaxError | undefined {
    if (this.failure) return this.failure.error;
    const depth = start.depth;
    try {
      for (;;) {
        const tok = this.scanToken();
        if (tok === TOK_EOF) return undefined;
        if (tok === TOK_END && this.tDepth === depth) return undefined;
      }
    } catch (e) {
      return this.abort(e).error;
    }
  }

  // ---- scanning ------------------------------------------------------------------------

  private scanToken(): Token {
    if (this.pendingEnd) {
      this.pendingEnd = false;
      this.endTokenFromTop(this.tLine, this.tColumn);
      this.closeElement();
      return TOK_END;
    }
    const text = this.text;
    for (;;) {
      const pos = this.pos;
      if (pos >= this.end) return this.finish();
      if (text.charCodeAt(pos) === LT) {
        const c1 = text.charCodeAt(pos + 1);
        if (c1 === SLASH) return this.scanEndTag();
        if (c1 === BANG) {
          if (text.startsWith('<!--', pos)) {
            if (this.reportComments) return this.scanComment();
          } else if (!text.startsWith('<![CDATA[', pos)) {
            this.refuseDeclaration(pos);
          }
        } else if (c1 === QUESTION) {
          if (pos === this.docStart && this.isXmlDeclarationAt(pos)) {
            this.scanDeclaration();
            continue;
          }
          if (this.reportPis) {
            this.scanPi(true);
            return TOK_PI;
          }
        } else {
          return this.scanStartTag();
        }
      } else if (this.skipIndentation()) {
        continue;
      }
      if (this.scanCharData()) return TOK_TEXT;
    }
  }

  /**
   * Fast path for indentation between tags: skips a whitespace-only run that will be
   * dropped anyway, without making a string. Returns false when the general path must run.
   */
  private skipIndentation(): boolean {
    if (this.keepWhitespace) return false;
    const text = this.text;
    let q = this.pos;
    while (q < this.end && isSpace(text.charCodeAt(q))) q++;
    if (q < this.end && text.charCodeAt(q) !== LT) return false;
    const c1 = text.charCodeAt(q + 1);
    if (c1 === BANG || c1 === QUESTION) return false;
    if (this.depthNow > 0 && this.lastWasStart && c1 === SLASH) return false;
    this.pos = q;
    return true;
  }

  private finish(): Token {
    if (this.depthNow > 0) {
      this.fail(
        this.end,
        `unexpected end of file: <${this.oName[this.depthNow]}> opened at line ${this.oLine[this.depthNow]} is not closed`,
      );
    }
    if (!this.rootSeen) this.fail(this.end, 'no root element: the document has no elements');
    return TOK_EOF;
  }

  /** Moves the line counter to `p` (positions are asked for in increasing order). */
  private lineAt(p: number): number {
    let nl = this.nextNewline;
    if (nl !== -1 && nl < p) {
      const text = this.text;
      do {
        this.lineNo++;
        this.lineStart = nl + 1;
        nl = text.indexOf('\n', nl + 1);
      } while (nl !== -1 && nl < p);
      this.nextNewline = nl;
    }
    return this.lineNo;
  }

  private fail(p: number, message: string, extraStep?: string): never {
    // Errors are rare: count lines from the start so any position can be reported.
    const text = this.text;
    let line = 1;
    let lineStart = 0;
    let nl = text.indexOf('\n');
    while (nl !== -1 && nl < p) {
      line++;
      lineStart = nl + 1;
      nl = text.indexOf('\n', nl + 1);
    }
    let path = this.path();
    if (extraStep) path = path ? `${path}/${extraStep}` : extraStep;
    throw new XmlAbort({ message, line, column: p - lineStart + 1, path });
  }

  private refuseDeclaration(pos: number): never {
    const text = this.text;
    if (text.startsWith('<!DOCTYPE', pos)) {
      this.fail(
        pos,
        'DOCTYPE is refused: document type and entity declarations are not supported ' +
          '(this protects against external entities and entity expansion)',
      );
    }
    for (const kind of ['ENTITY', 'ELEMENT', 'ATTLIST', 'NOTATION']) {
      if (text.startsWith('<!' + kind, pos)) {
        this.fail(pos, `<!${kind} declarations are refused: DTDs are not supported`);
      }
    }
    this.fail(pos, `unexpected "${shorten(text.slice(pos, pos + 12))}", expected a comment or CDATA section`);
  }

  private isXmlDeclarationAt(pos: number): boolean {
    const text = this.text;
    if (!text.startsWith('<?xml', pos)) return false;
    const c = text.charCodeAt(pos + 5);
    return isSpace(c) || c === QUESTION;
  }

  private scanDeclaration(): void {
    const start = this.pos;
    const close = this.text.indexOf('?>', start + 5);
    if (close === -1) this.fail(start, 'XML declaration is not closed with "?>"');
    const m = DECLARATION.exec(this.text.slice(start + 5, close));
    if (!m) this.fail(start, 'malformed XML declaration, expected <?xml version="1.0" …?>');
    const declaration: { version: string; encoding?: string; standalone?: boolean } = { version: m[2] as string };
    if (m[4] !== undefined) declaration.encoding = m[4];
    if (m[6] !== undefined) declaration.standalone = m[6] === 'yes';
    this.declarationValue = declaration;
    this.pos = close + 2;
  }

  /** Scans `<?target data?>` at this.pos; when `report`, sets the token fields. */
  private scanPi(report: boolean): void {
    const text = this.text;
    const start = this.pos;
    let p = start + 2;
    if (!isNameStart(text.charCodeAt(p))) this.fail(start, 'processing instruction without a target name');
    while (p < this.end && isNameChar(text.charCodeAt(p))) p++;
    const target = text.slice(start + 2, p);
    if (target.toLowerCase() === 'xml') {
      this.fail(start, 'the XML declaration <?xml …?> is only allowed at the very start of the document');
    }
    const close = text.indexOf('?>', p);
    if (close === -1) this.fail(start, `processing instruction <?${target} is not closed with "?>"`);
    if (p < close && !isSpace(text.charCodeAt(p))) this.fail(p, `processing instruction <?${target} needs a space`);
    this.pos = close + 2;
    if (!report) return;
    this.tLine = this.lineAt(start);
    this.tColumn = start - this.lineStart + 1;
    this.tTarget = target;
    this.tText = normalizeLineEnds(text.slice(p, close).replace(/^[ \t\r\n]+/, ''));
    this.lastWasStart = false;
  }

  private skipComment(): string {
    const text = this.text;
    const start = this.pos;
    const dashes = text.indexOf('--', start + 4);
    if (dashes === -1) this.fail(start, 'comment is not closed with "-->"');
    if (text.charCodeAt(dashes + 2) !== GT) this.fail(dashes, '"--" is not allowed inside a comment');
    this.pos = dashes + 3;
    return text.slice(start + 4, dashes);
  }

  private scanComment(): Token {
    const start = this.pos;
    const body = this.skipComment();
    this.tLine = this.lineAt(start);
    this.tColumn = start - this.lineStart + 1;
    this.tText = normalizeLineEnds(body);
    this.lastWasStart = false;
    return TOK_COMMENT;
  }

  /**
   * Text, CDATA and (unreported) comments / PIs up to the next tag, merged into one token.
   * @returns true when a text token was produced, false when the run is dropped.
   */
  private scanCharData(): boolean {
    const text = this.text;
    const start = this.pos;
    let acc = '';
    let cdata = false;
    while (this.pos < this.end) {
      const pos = this.pos;
      if (text.charCodeAt(pos) === LT) {
        const c1 = text.charCodeAt(pos + 1);
        if (c1 !== BANG && c1 !== QUESTION) break;
        if (text.startsWith('<![CDATA[', pos)) {
          if (this.depthNow === 0) this.fail(pos, 'CDATA section outside the root element');
          const close = text.indexOf(']]>', pos + 9);
          if (close === -1) this.fail(pos, 'CDATA section is not closed with "]]>"');
          acc += normalizeLineEnds(text.slice(pos + 9, close));
          cdata = true;
          this.pos = close + 3;
          continue;
        }
        if (text.startsWith('<!--', pos) && !this.reportComments) {
          this.skipComment();
          continue;
        }
        if (c1 === QUESTION && !this.reportPis) {
          this.scanPi(false);
          continue;
        }
        break;
      }
      let lt = text.indexOf('<', pos);
      if (lt === -1) lt = this.end;
      // Where the next "]]>", "&" and CR of the document are, looked up again only once passed:
      // most text runs hold none of them and are taken as they are.
      if (this.nextCdataClose < pos) this.nextCdataClose = this.indexOrEnd(']]>', pos);
      if (this.nextCdataClose < lt) this.fail(this.nextCdataClose, '"]]>" is not allowed in text');
      if (this.nextAmp < pos) this.nextAmp = this.indexOrEnd('&', pos);
      if (this.nextCr < pos) this.nextCr = this.indexOrEnd('\r', pos);
      const raw = text.slice(pos, lt);
      acc += this.nextAmp < lt || this.nextCr < lt ? this.decode(raw, pos, false) : raw;
      this.pos = lt;
    }
    if (this.depthNow === 0) {
      if (!isAllSpace(acc)) {
        this.fail(
          start,
          this.rootClosed
            ? 'text after the root element, expected the end of the document'
            : `text "${shorten(acc.trim())}" before the root element, expected "<"`,
        );
      }
      return false;
    }
    if (acc.length === 0) return false;
    if (!cdata && !this.keepWhitespace && isAllSpace(acc)) {
      const wholeContent = this.lastWasStart && text.charCodeAt(this.pos + 1) === SLASH;
      if (!wholeContent) return false;
    }
    this.tLine = this.lineAt(start);
    this.tColumn = start - this.lineStart + 1;
    this.tText = acc;
    this.tCdata = cdata;
    this.lastWasStart = false;
    return true;
  }

  /** Decodes entity and character references; normalises line ends (and, in attributes, whitespace). */
  private decode(raw: string, absStart: number, attribute: boolean): string {
    let amp = raw.indexOf('&');
    if (amp === -1) return normalizeLiteral(raw, attribute);
    let out = '';
    let last = 0;
    while (amp !== -1) {
      out += normalizeLiteral(raw.slice(last, amp), attribute);
      const semi = raw.indexOf(';', amp + 1);
      if (semi === -1 || semi - amp > 14) {
        this.fail(absStart + amp, '"&" must start a reference such as &amp; or &#38;');
      }
      const ref = raw.slice(amp + 1, semi);
      if (ref === 'lt') out += '<';
      else if (ref === 'gt') out += '>';
      else if (ref === 'amp') out += '&';
      else if (ref === 'quot') out += '"';
      else if (ref === 'apos') out += "'";
      else if (ref.charCodeAt(0) === 0x23 /* # */) {
        const hex = ref.charCodeAt(1) === 0x78; /* x */
        const digits = ref.slice(hex ? 2 : 1);
        const ok = hex ? HEX_REF.test(digits) : DEC_REF.test(digits);
        const cp = ok ? parseInt(digits, hex ? 16 : 10) : NaN;
        if (!ok || !isXmlChar(cp)) {
          this.fail(absStart + amp, `character reference &${ref}; is not an allowed XML character`);
        }
        out += String.fromCodePoint(cp);
      } else {
        this.fail(
          absStart + amp,
          `unknown entity &${shorten(ref)};, only &lt; &gt; &amp; &quot; &apos; and character references are supported`,
        );
      }
      last = semi + 1;
      amp = raw.indexOf('&', last);
    }
    return out + normalizeLiteral(raw.slice(last), attribute);
  }

  /** Position of the next `s` at or after `from`, or the end of the text. */
  private indexOrEnd(s: string, from: number): number {
    const k = this.text.indexOf(s, from);
    return k === -1 ? this.end : k;
  }

  /** True when `s` occurs in the text at `p`. */
  private matchesAt(s: string, p: number): boolean {
    return this.text.startsWith(s, p);
  }

  /** Scans a name starting at `p` (its first character already checked) and returns it interned. */
  private scanName(p: number): string {
    const text = this.text;
    const start = p;
    let h = 0;
    while (p < this.end) {
      const c = text.charCodeAt(p);
      if (!isNameChar(c)) break;
      h = (h * 31 + c) | 0;
      p++;
    }
    const slot = h & (NAME_CACHE_SIZE - 1);
    this.lastNameSlot = slot;
    const cached = this.nameCache[slot];
    if (cached !== undefined && cached.length === p - start && text.startsWith(cached, start)) return cached;
    const name = internalized(text.slice(start, p));
    this.nameCache[slot] = name;
    this.namePrefix[slot] = undefined;
    return name;
  }

  private qualifiedParts(name: string, slot: number, at: number, element: string): [string, string] {
    // Names come from scanName, so the parts are usually cached in the name's slot.
    const cachedParts = slot >= 0 && this.nameCache[slot] === name ? this.namePrefix[slot] : undefined;
    if (cachedParts !== undefined) return cachedParts;
    let parts = this.qnameParts.get(name);
    if (parts === undefined) {
      const colon = name.indexOf(':');
      if (colon !== -1 && (colon === 0 || colon === name.length - 1 || name.indexOf(':', colon + 1) !== -1)) {
        this.fail(at, `"${name}" is not a valid namespace-qualified name`, element);
      }
      parts = colon === -1 ? ['', name] : [internalized(name.slice(0, colon)), internalized(name.slice(colon + 1))];
      if (this.qnameParts.size < 10000) this.qnameParts.set(name, parts);
    }
    if (slot >= 0 && this.nameCache[slot] === name) this.namePrefix[slot] = parts;
    return parts;
  }

  private scanStartTag(): Token {
    const text = this.text;
    const lt = this.pos;
    let p = lt + 1;
    if (!isNameStart(text.charCodeAt(p))) {
      this.fail(lt, p >= this.end ? 'unexpected end of file after "<"' : '"<" must be followed by an element name');
    }
    const name = this.scanName(p);
    const nameSlot = this.lastNameSlot;
    p += name.length;
    if (this.rootClosed) this.fail(lt, `second root element <${name}>, a document has exactly one root`);

    let list: { name: string; prefix: string; localName: string; namespace: string; value: string }[] | undefined;
    let selfClosing = false;
    for (;;) {
      const before = p;
      while (p < this.end && isSpace(text.charCodeAt(p))) p++;
      if (p >= this.end) this.fail(lt, `unexpected end of file inside the start tag <${name}>`, name);
      const c = text.charCodeAt(p);
      if (c === GT) {
        p++;
        break;
      }
      if (c === SLASH) {
        if (text.charCodeAt(p + 1) !== GT) this.fail(p, `expected "/>" to close <${name}>`, name);
        p += 2;
        selfClosing = true;
        break;
      }
      if (p === before) this.fail(p, `expected a space before the attribute in <${name}>`, name);
      if (!isNameStart(c)) this.fail(p, `unexpected "${text[p] ?? ''}" in the start tag <${name}>`, name);
      const attrName = this.scanName(p);
      p += attrName.length;
      while (p < this.end && isSpace(text.charCodeAt(p))) p++;
      if (text.charCodeAt(p) !== EQUALS) this.fail(p, `attribute ${attrName} of <${name}> has no "=" and value`, name);
      p++;
      while (p < this.end && isSpace(text.charCodeAt(p))) p++;
      const q = text.charCodeAt(p);
      if (q !== QUOTE && q !== APOS) this.fail(p, `value of attribute ${attrName} must be quoted`, name);
      const close = text.indexOf(q === QUOTE ? '"' : "'", p + 1);
      if (close === -1) this.fail(p, `value of attribute ${attrName} is not closed`, name);
      const raw = text.slice(p + 1, close);
      const ltInValue = raw.indexOf('<');
      if (ltInValue !== -1) this.fail(p + 1 + ltInValue, `"<" is not allowed in the value of ${attrName}`, name);
      const value = this.decode(raw, p + 1, true);
      p = close + 1;
      const attribute = { name: attrName, prefix: '', localName: attrName, namespace: '', value };
      if (list) list.push(attribute);
      else list = [attribute];
    }

    // Namespace declarations of this element apply to its own name and attributes.
    const mark = this.nsPrefixes.length;
    if (list) {
      for (const a of list) {
        if (a.name === 'xmlns') this.bind('', a.value, lt, name);
        else if (a.name.startsWith('xmlns:')) this.bind(a.name.slice(6), a.value, lt, name);
      }
    }
    const [prefix, localName] = this.qualifiedParts(name, nameSlot, lt, name);
    let namespace = this.lookup(prefix);
    if (namespace === undefined) {
      if (prefix !== '') this.fail(lt, `namespace prefix "${prefix}" of <${name}> is not declared`, name);
      namespace = '';
    }
    let attributes = EMPTY_ATTRIBUTES;
    if (list) {
      const seen = list.length > 8 ? new Set<string>() : undefined;
      for (let i = 0; i < list.length; i++) {
        const a = list[i] as (typeof list)[number];
        const an = a.name;
        let duplicate = false;
        if (seen) duplicate = seen.has(an);
        else for (let j = 0; j < i && !duplicate; j++) duplicate = (list[j] as (typeof list)[number]).name === an;
        if (duplicate) this.fail(lt, `attribute ${an} appears twice in <${name}>`, name);
        seen?.add(an);
        if (an.indexOf(':') === -1) {
          if (an === 'xmlns') a.namespace = XMLNS_NAMESPACE;
          continue;
        }
        const [ap, al] = this.qualifiedParts(an, -1, lt, name);
        a.prefix = ap;
        a.localName = al;
        if (ap === 'xmlns') a.namespace = XMLNS_NAMESPACE;
        else {
          const uri = this.lookup(ap);
          if (uri === undefined) this.fail(lt, `namespace prefix "${ap}" of attribute ${an} is not declared`, name);
          a.namespace = uri;
        }
      }
      attributes = list;
    }

    const parentDepth = this.depthNow;
    const depth = parentDepth + 1;
    if (depth > this.maxDepth) this.fail(lt, `elements are nested deeper than ${this.maxDepth} levels`, name);
    const index = this.countSibling(parentDepth, name);

    this.depthNow = depth;
    this.oName[depth] = name;
    this.oPrefix[depth] = prefix;
    this.oLocal[depth] = localName;
    this.oNs[depth] = namespace;
    this.oIndex[depth] = index;
    this.oNsMark[depth] = mark;
    this.sibSize[depth] = 0;
    this.sibMaps[depth] = undefined;
    if (this.sibNames.length <= depth) {
      this.sibNames.push([]);
      this.sibCounts.push([]);
    }
    const line = this.lineAt(lt);
    this.oLine[depth] = line;
    this.rootSeen = true;
    this.pos = p;

    this.tName = name;
    this.tPrefix = prefix;
    this.tLocal = localName;
    this.tNs = namespace;
    this.tAttrs = attributes;
    this.tSelfClosing = selfClosing;
    this.tLine = line;
    this.tColumn = lt - this.lineStart + 1;
    this.tDepth = depth;
    this.tIndex = index;
    this.pendingEnd = selfClosing;
    this.lastWasStart = !selfClosing;
    return TOK_START;
  }

  /**
   * 1-based position of a new child `name` among its same-named siblings. A linear search
   * over the distinct names seen so far (few in data XML); past 32 names a Map takes over,
   * so an element with very many distinct child names stays linear.
   */
  private countSibling(parentDepth: number, name: string): number {
    const map = this.sibMaps[parentDepth];
    if (map !== undefined) {
      const n = (map.get(name) ?? 0) + 1;
      map.set(name, n);
      return n;
    }
    const names = this.sibNames[parentDepth] as string[];
    const counts = this.sibCounts[parentDepth] as number[];
    const size = this.sibSize[parentDepth] as number;
    for (let i = size - 1; i >= 0; i--) {
      if (names[i] === name) {
        const n = (counts[i] as number) + 1;
        counts[i] = n;
        return n;
      }
    }
    if (size >= 32) {
      const m = new Map<string, number>();
      for (let i = 0; i < size; i++) m.set(names[i] as string, counts[i] as number);
      m.set(name, 1);
      this.sibMaps[parentDepth] = m;
      return 1;
    }
    names[size] = name;
    counts[size] = 1;
    this.sibSize[parentDepth] = size + 1;
    return 1;
  }

  private endTokenFromTop(line: number, column: number): void {
    const d = this.depthNow;
    this.tName = this.oName[d] as string;
    this.tPrefix = this.oPrefix[d] as string;
    this.tLocal = this.oLocal[d] as string;
    this.tNs = this.oNs[d] as string;
    this.tDepth = d;
    this.tLine = line;
    this.tColumn = column;
  }

  private scanEndTag(): Token {
    const text = this.text;
    const lt = this.pos;
    let p = lt + 2;
    if (!isNameStart(text.charCodeAt(p))) this.fail(lt, '"</" must be followed by an element name');
    const d = this.depthNow;
    const expected = d > 0 ? (this.oName[d] as string) : '';
    let name: string;
    if (d > 0 && this.matchesAt(expected, p) && !isNameChar(text.charCodeAt(p + expected.length))) {
      name = expected;
      p += expected.length;
    } else {
      name = this.scanName(p);
      p += name.length;
    }
    while (p < this.end && isSpace(text.charCodeAt(p))) p++;
    if (text.charCodeAt(p) !== GT) {
      this.fail(p, p >= this.end ? `unexpected end of file inside </${name}>` : `expected ">" to close </${name}>`);
    }
    if (d === 0) this.fail(lt, `end tag </${name}> without a matching start tag`);
    if (name !== expected) {
      this.fail(lt, `end tag </${name}> does not match <${expected}> opened at line ${this.oLine[d]}`);
    }
    const line = this.lineAt(lt);
    this.pos = p + 1;
    this.endTokenFromTop(line, lt - this.lineStart + 1);
    this.closeElement();
    return TOK_END;
  }

  private closeElement(): void {
    const mark = this.oNsMark[this.depthNow] as number;
    if (this.nsPrefixes.length !== mark) {
      this.nsPrefixes.length = mark;
      this.nsUris.length = mark;
    }
    this.depthNow--;
    this.lastWasStart = false;
    if (this.depthNow === 0) this.rootClosed = true;
  }

  private bind(prefix: string, uri: string, at: number, element: string): void {
    if (prefix === 'xmlns') this.fail(at, 'the prefix xmlns cannot be declared', element);
    if (prefix === 'xml' && uri !== XML_NAMESPACE) this.fail(at, 'the prefix xml cannot be rebound', element);
    if (prefix !== '' && uri === '') this.fail(at, `namespace prefix "${prefix}" cannot be bound to ""`, element);
    this.nsPrefixes.push(prefix);
    this.nsUris.push(uri);
  }

  private lookup(prefix: string): string | undefined {
    for (let i = this.nsPrefixes.length - 1; i >= 0; i--) {
      if (this.nsPrefixes[i] === prefix) return this.nsUris[i];
    }
    return undefined;
  }
}

function normalizeLineEnds(s: string): string {
  return s.indexOf('\r') === -1 ? s : s.replace(/\r\n?/g, '\n');
}

const ATTRIBUTE_WHITESPACE = /\r\n|[\r\n\t]/g;

function normalizeLiteral(s: string, attribute: boolean): string {
  if (!attribute) return normalizeLineEnds(s);
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c === 0x0d || c === 0x0a || c === 0x09) return s.replace(ATTRIBUTE_WHITESPACE, ' ');
  }
  return s;
}

function elementOf(ev: XmlStartEvent): XmlElement & { children: XmlNode[] } {
  return {
    kind: 'element',
    name: ev.name,
    prefix: ev.prefix,
    localName: ev.localName,
    namespace: ev.namespace,
    attributes: ev.attributes,
    children: NO_CHILDREN,
    line: ev.line,
    column: ev.column,
    index: ev.index,
  };
}

/** Result of `parseXml`. */
export type XmlParseResult =
  | { readonly ok: true; readonly root: XmlElement; readonly declaration?: XmlDeclaration }
  | { readonly ok: false; readonly error: XmlSyntaxError };

/**
 * Parses a whole document into a tree. For large files prefer `XmlPullParser` with
 * `readElement` per record.
 *
 * @returns `{ ok: true, root }` or `{ ok: false, error }`; never throws for bad input.
 * @example
 * const r = parseXml('<a xmlns="urn:x"><b>1</b></a>');
 * if (r.ok) elementText(childElement(r.root, 'b')!) // '1'
 * @example parseXml('<!DOCTYPE a><a/>').ok // false (DTDs are refused)
 */
export function parseXml(text: string, options: XmlParserOptions = {}): XmlParseResult {
  const parser = new XmlPullParser(text, options);
  let root: XmlElement | undefined;
  for (;;) {
    const ev = parser.next();
    if (ev.type === 'error') return { ok: false, error: ev.error };
    if (ev.type === 'eof') break;
    if (ev.type === 'start') {
      const el = parser.readElement(ev);
      if ('message' in el) return { ok: false, error: el };
      root = el;
    }
  }
  if (!root) return { ok: false, error: { message: 'no root element', line: 1, column: 1, path: '' } };
  const declaration = parser.declaration;
  return declaration ? { ok: true, root, declaration } : { ok: true, root };
}

/**
 * First child element with this local name (and namespace, when given).
 * @example childElement(stmt, 'Acct')
 */
export function childElement(parent: XmlElement, localName: string, namespace?: string): XmlElement | undefined {
  for (const c of parent.children) {
    if (c.kind === 'element' && c.localName === localName && (namespace === undefined || c.namespace === namespace)) {
      return c;
    }
  }
  return undefined;
}

/**
 * Child elements, all of them or those with this local name (and namespace, when given).
 * @example childElements(stmt, 'Ntry').length
 */
export function childElements(parent: XmlElement, localName?: string, namespace?: string): XmlElement[] {
  const out: XmlElement[] = [];
  for (const c of parent.children) {
    if (
      c.kind === 'element' &&
      (localName === undefined || c.localName === localName) &&
      (namespace === undefined || c.namespace === namespace)
    ) {
      out.push(c);
    }
  }
  return out;
}

/**
 * The element's own character data (its text children joined, child elements skipped).
 * @example elementText((parseXml('<a>x<b>y</b>z</a>') as { root: XmlElement }).root) // 'xz'
 */
export function elementText(element: XmlElement): string {
  const children = element.children;
  if (children.length === 1) {
    const only = children[0] as XmlNode;
    return only.kind === 'text' ? only.text : '';
  }
  let out = '';
  for (const c of children) if (c.kind === 'text') out += c.text;
  return out;
}

/**
 * Value of an attribute by qualified name (or by local name and namespace when `namespace` is given).
 * @example attributeValue(amt, 'Ccy') // 'EUR'
 */
export function attributeValue(element: XmlElement, name: string, namespace?: string): string | undefined {
  for (const a of element.attributes) {
    if (namespace === undefined ? a.name === name : a.localName === name && a.namespace === namespace) return a.value;
  }
  return undefined;
}

/**
 * Escapes text for use as element content: `&`, `<`, `>` (so `]]>` cannot appear) and CR
 * (as `&#13;`, so it survives line-end normalisation).
 * @example escapeXmlText('a < b & c') // 'a &lt; b &amp; c'
 */
export function escapeXmlText(s: string): string {
  return /[&<>\r]/.test(s)
    ? s.replace(/[&<>\r]/g, (c) => (c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : '&#13;'))
    : s;
}

/**
 * Escapes text for a double-quoted attribute value (also tab, LF and CR, which attribute
 * normalisation would otherwise turn into spaces).
 * @example escapeXmlAttribute('say "hi"') // 'say &quot;hi&quot;'
 */
export function escapeXmlAttribute(s: string): string {
  return /[&<>"\t\n\r]/.test(s)
    ? s.replace(/[&<>"\t\n\r]/g, (c) => {
        switch (c) {
          case '&':
            return '&amp;';
          case '<':
            return '&lt;';
          case '>':
            return '&gt;';
          case '"':
            return '&quot;';
          default:
            return `&#${c.charCodeAt(0)};`;
        }
      })
    : s;
}
