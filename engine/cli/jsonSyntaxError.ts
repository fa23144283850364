/**
 * Where a JSON text first breaks the grammar of RFC 8259, so a refused file can be reported
 * as `FILE:LINE: …` (JSON.parse's own messages differ between engines and often give no
 * position). A small recursive-descent recogniser; it builds nothing.
 */

/** The first syntax error: 1-based line and column, and what was found there. */
export interface JsonSyntaxError {
  readonly line: number;
  readonly column: number;
  /** e.g. `","` or `end of text`. */
  readonly found: string;
}

/**
 * The first syntax error of `text`, or null when it is valid JSON.
 * @example jsonSyntaxError('{\n  "a": ,\n}') // { line: 2, column: 8, found: '","' }
 * Complexity: O(n); recursion depth is the nesting depth of the text.
 */
export function jsonSyntaxError(text: string): JsonSyntaxError | null {
  let i = 0;
  const n = text.length;
  class Stop extends Error {}
  const fail = (): never => {
    throw new Stop();
  };
  const space = () => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const literal = (word: string) => {
    if (text.startsWith(word, i)) i += word.length;
    else fail();
  };
  const string = () => {
    if (text[i] !== '"') fail();
    i++;
    while (i < n && text[i] !== '"') {
      const c = text.charCodeAt(i);
      if (c < 0x20) fail();
      if (text[i] === '\\') {
        i++;
        if (text[i] === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 1, i + 5))) fail();
          i += 5;
        } else if (i < n && '"\\/bfnrt'.includes(text[i] as string)) i++;
        else fail();
      } else i++;
    }
    if (i >= n) fail();
    i++;
  };
  const number = () => {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (!m || m[0] === '' || m[0] === '-') fail();
    i += (m as RegExpExecArray)[0].length;
  };
  const value = (): void => {
    space();
    const c = text[i];
    if (c === '{') {
      i++;
      space();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        space();
        string();
        space();
        if (text[i] !== ':') fail();
        i++;
        value();
        space();
        if (text[i] === ',') i++;
        else if (text[i] === '}') {
          i++;
          return;
        } else fail();
      }
    } else if (c === '[') {
      i++;
      space();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value();
        space();
        if (text[i] === ',') i++;
        else if (text[i] === ']') {
          i++;
          return;
        } else fail();
      }
    } else if (c === '"') string();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else number();
  };
  try {
    if (text.charCodeAt(0) === 0xfeff) i = 1;
    value();
    space();
    if (i < n) fail();
    return null;
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    let line = 1;
    let lineStart = 0;
    for (let k = 0; k < i && k < n; k++) {
      if (text.charCodeAt(k) === 10) {
        line++;
        lineStart = k + 1;
      }
    }
    return { line, column: i - lineStart + 1, found: i >= n ? 'end of text' : JSON.stringify(text[i]) };
  }
}
