/**
 * The header that precedes an OFX body.
 * - OFX 1.x (OFX 1.0.2 specification, section 2.2 "Open Financial Exchange Headers"; from
 *   memory): plain `KEY:VALUE` lines — `OFXHEADER:100`, `DATA:OFXSGML`, `VERSION:102`,
 *   `SECURITY`, `ENCODING`, `CHARSET`, `COMPRESSION`, `OLDFILEUID`, `NEWFILEUID` — then a
 *   blank line and the SGML body.
 * - OFX 2.x (OFX Banking Specification 2.3, section 2.2 "OFX Headers"; from memory): an
 *   XML declaration and a processing instruction
 *   `<?OFX OFXHEADER="200" VERSION="220" SECURITY="NONE" OLDFILEUID="NONE" NEWFILEUID="NONE"?>`.
 */

/** What the header says, and where the body starts. */
export interface OfxHeader {
  /** 1 for `OFXHEADER:100` files, 2 for `<?OFX OFXHEADER="200"?>` files, undefined when there is no header. */
  readonly generation: 1 | 2 | undefined;
  /** The `VERSION` value as written (`102`, `220`), when given. */
  readonly version?: string;
  /** Every header field as written, keys upper-cased. */
  readonly fields: Readonly<Record<string, string>>;
  /** Offset of the first character after the header. */
  readonly bodyStart: number;
  /** 1-based line of `bodyStart`. */
  readonly bodyLine: number;
}

/** A header problem, always with the line it is on. */
export interface OfxHeaderProblem {
  readonly line: number;
  readonly message: string;
  readonly severity: 'error' | 'notice';
}

const VERSIONS_1 = new Set(['100', '102', '103', '151', '160']);
const VERSIONS_2 = new Set(['200', '201', '202', '203', '210', '211', '220']);
const HEADER_FIELD = /^([A-Za-z]+):(.*)$/;
const PI_ATTRIBUTE = /([A-Za-z]+)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;

function countLines(text: string, from: number, to: number): number {
  let n = 0;
  for (let i = from; i < to; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) n++;
  }
  return n;
}

function clip(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}

/**
 * Reads the OFX header at the start of `text` (after an optional byte-order mark and
 * blank lines) and checks it: `OFXHEADER` 100 with `DATA:OFXSGML` and a 1xx `VERSION`,
 * or `OFXHEADER="200"` with a 2xx `VERSION`; `COMPRESSION` must be absent or `NONE`.
 * A body that starts directly with `<OFX>` is accepted with a notice.
 *
 * @returns the header and its problems (an `error` means the file is refused).
 * @throws Never.
 * @example parseOfxHeader('OFXHEADER:100\nDATA:OFXSGML\nVERSION:102\n\n<OFX>').header.generation // 1
 */
export function parseOfxHeader(text: string): { header: OfxHeader; problems: OfxHeaderProblem[] } {
  const problems: OfxHeaderProblem[] = [];
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const leading = /^\s*/.exec(text.slice(pos, pos + 4096))?.[0].length ?? 0;
  let line = 1 + countLines(text, pos, pos + leading);
  pos += leading;
  const fields: Record<string, string> = {};
  const fieldLines: Record<string, number> = {};

  if (/^OFXHEADER\s*:/i.test(text.slice(pos, pos + 16))) {
    // OFX 1.x: KEY:VALUE lines until a blank line or the first "<".
    const headerLine = line;
    while (pos < text.length && text.charAt(pos) !== '<') {
      let eol = pos;
      while (eol < text.length && text.charAt(eol) !== '\n' && text.charAt(eol) !== '\r') eol++;
      const raw = text.slice(pos, eol);
      const lt = raw.indexOf('<');
      const content = (lt >= 0 ? raw.slice(0, lt) : raw).trim();
      if (content === '') {
        // A blank line ends the header.
        if (lt < 0) {
          pos = eol;
          break;
        }
      } else {
        // Tolerate several fields on one line ("OFXHEADER:100 DATA:OFXSGML …").
        for (const token of content.split(/\s+/)) {
          const m = HEADER_FIELD.exec(token);
          if (!m) {
            problems.push({
              line,
              message: `header line "${clip(content)}" is not KEY:VALUE, expected OFX 1.x header lines such as VERSION:102`,
              severity: 'error',
            });
            break;
          }
          const key = (m[1] as string).toUpperCase();
          fields[key] = (m[2] as string).trim();
          fieldLines[key] = line;
        }
      }
      if (lt >= 0) {
        pos += lt;
        break;
      }
      pos = eol;
      if (text.charAt(pos) === '\r' && text.charAt(pos + 1) === '\n') pos += 2;
      else if (pos < text.length) pos += 1;
      line++;
      if (problems.length >= 5) break;
    }
    // Skip the blank lines between header and body.
    const gap = /^\s*/.exec(text.slice(pos, pos + 4096))?.[0].length ?? 0;
    line += countLines(text, pos, pos + gap);
    pos += gap;
    checkSgmlHeader(fields, (key) => fieldLines[key] ?? headerLine, problems);
    if (pos >= text.length) {
      problems.push({ line, message: 'the file ends after the header, expected the <OFX> body', severity: 'error' });
    }
    return { header: { generation: 1, version: fields.VERSION, fields, bodyStart: pos, bodyLine: line }, problems };
  }

  if (text.startsWith('<?', pos)) {
    // OFX 2.x: optional <?xml …?>, then <?OFX …?>, possibly with comments and blanks between.
    let sawOfxPi = false;
    let piLine = line;
    while (text.startsWith('<?', pos) || text.startsWith('<!--', pos)) {
      const isComment = text.startsWith('<!--', pos);
      const close = text.indexOf(isComment ? '-->' : '?>', pos + 2);
      if (close < 0) {
        problems.push({
          line,
          message: isComment ? 'comment <!-- is never closed, expected -->' : 'header <? is never closed, expected ?>',
          severity: 'error',
        });
        return { header: { generation: undefined, fields, bodyStart: text.length, bodyLine: line }, problems };
      }
      const stop = close + (isComment ? 3 : 2);
      const body = text.slice(pos + 2, close);
      if (!isComment && /^OFX\b/i.test(body)) {
        sawOfxPi = true;
        piLine = line;
        for (const m of body.slice(3).matchAll(PI_ATTRIBUTE)) {
          fields[(m[1] as string).toUpperCase()] = (m[2] ?? m[3] ?? '').trim();
        }
      }
      line += countLines(text, pos, stop);
      pos = stop;
      const gap = /^\s*/.exec(text.slice(pos, pos + 4096))?.[0].length ?? 0;
      line += countLines(text, pos, pos + gap);
      pos += gap;
    }
    if (!sawOfxPi) {
      problems.push({
        line: piLine,
        message: 'no <?OFX OFXHEADER="200" …?> header after the XML declaration; read as an OFX 2 body',
        severity: 'notice',
      });
      return { header: { generation: 2, fields, bodyStart: pos, bodyLine: line }, problems };
    }
    checkXmlHeader(fields, () => piLine, problems);
    if (pos >= text.length) {
      problems.push({ line, message: 'the file ends after the header, expected the <OFX> body', severity: 'error' });
    }
    return { header: { generation: 2, version: fields.VERSION, fields, bodyStart: pos, bodyLine: line }, problems };
  }

  if (/^<OFX[\s>]/i.test(text.slice(pos, pos + 5))) {
    problems.push({
      line,
      message: 'no OFX header (OFXHEADER:100 or <?OFX …?>); read the <OFX> body as it is',
      severity: 'notice',
    });
    return { header: { generation: undefined, fields, bodyStart: pos, bodyLine: line }, problems };
  }

  const first = text.slice(pos, pos + 200).split(/[\r\n]/)[0] ?? '';
  problems.push({
    line,
    message: `found "${clip(first)}", expected an OFX header (OFXHEADER:100 or <?OFX OFXHEADER="200" …?>)`,
    severity: 'error',
  });
  return { header: { generation: undefined, fields, bodyStart: text.length, bodyLine: line }, problems };
}

type LineOf = (key: string) => number;

function checkSgmlHeader(fields: Record<string, string>, lineOf: LineOf, problems: OfxHeaderProblem[]): void {
  const add = (key: string, message: string, severity: 'error' | 'notice' = 'error'): void =>
    void problems.push({ line: lineOf(key), message, severity });
  if (fields.OFXHEADER !== '100')
    add('OFXHEADER', `OFXHEADER:${fields.OFXHEADER ?? ''} is not supported, expected OFXHEADER:100`);
  if (fields.DATA === undefined) add('DATA', 'header DATA is missing, expected DATA:OFXSGML');
  else if (fields.DATA.toUpperCase() !== 'OFXSGML')
    add('DATA', `DATA:${fields.DATA} is not supported, expected DATA:OFXSGML`);
  const version = fields.VERSION;
  if (version === undefined) add('VERSION', 'header VERSION is missing, expected VERSION:102 (or another 1.x version)');
  else if (!/^1\d\d$/.test(version))
    add('VERSION', `VERSION:${version} is not an OFX 1.x version, expected VERSION:102`);
  else if (!VERSIONS_1.has(version)) {
    add('VERSION', `VERSION:${version} is not a published OFX 1.x version; read as 1.0.2`, 'notice');
  }
  checkCommon(fields, lineOf, problems);
  const encoding = fields.ENCODING?.toUpperCase();
  if (encoding !== undefined && encoding !== 'USASCII' && encoding !== 'UTF-8' && encoding !== 'UTF8') {
    add('ENCODING', `ENCODING:${fields.ENCODING} is unusual, expected USASCII or UTF-8`, 'notice');
  }
}

function checkXmlHeader(fields: Record<string, string>, lineOf: LineOf, problems: OfxHeaderProblem[]): void {
  const add = (key: string, message: string, severity: 'error' | 'notice' = 'error'): void =>
    void problems.push({ line: lineOf(key), message, severity });
  if (fields.OFXHEADER !== '200') {
    add('OFXHEADER', `OFXHEADER="${fields.OFXHEADER ?? ''}" is not supported, expected OFXHEADER="200"`);
  }
  const version = fields.VERSION;
  if (version === undefined)
    add('VERSION', 'header VERSION is missing, expected VERSION="220" (or another 2.x version)');
  else if (!/^2\d\d$/.test(version))
    add('VERSION', `VERSION="${version}" is not an OFX 2.x version, expected VERSION="220"`);
  else if (!VERSIONS_2.has(version)) {
    add('VERSION', `VERSION="${version}" is not a published OFX 2.x version; read as 2.2`, 'notice');
  }
  checkCommon(fields, lineOf, problems);
}

function checkCommon(fields: Record<string, string>, lineOf: LineOf, problems: OfxHeaderProblem[]): void {
  const compression = fields.COMPRESSION?.toUpperCase();
  if (compression !== undefined && compression !== 'NONE') {
    problems.push({
      line: lineOf('COMPRESSION'),
      message: `COMPRESSION:${fields.COMPRESSION} cannot be read, expected NONE`,
      severity: 'error',
    });
  }
  const security = fields.SECURITY?.toUpperCase();
  if (security !== undefined && security !== 'NONE' && security !== 'TYPE1') {
    problems.push({
      line: lineOf('SECURITY'),
      message: `SECURITY:${fields.SECURITY} is unknown, expected NONE or TYPE1`,
      severity: 'notice',
    });
  }
}
