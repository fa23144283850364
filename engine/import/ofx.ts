/**
 * The OFX importer: OFX 1.0.2/1.0.3 (SGML, `OFXHEADER:100` header lines, leaf elements
 * without end tags) and OFX 2.x (XML, `<?OFX OFXHEADER="200" VERSION="220"?>`), bank and
 * card statements. The pieces live in engine/import/ofx/: the header
 * (parseOfxHeader), a tolerant tag scanner shared by both generations (buildOfxTree),
 * dates (parseOfxDate), amounts (parseOfxAmount) and the statement reader
 * (readOfxStatements).
 */
import type { ImportOptions, ImportProblem, ImportResult, StatementImporter } from './types';
import { buildOfxTree } from './ofx/buildOfxTree';
import { parseOfxHeader } from './ofx/parseOfxHeader';
import { readOfxStatements } from './ofx/readOfxStatements';

/** At most this many problems are listed per file; a last one says how many more there were. */
export const MAX_OFX_PROBLEMS = 100;

/**
 * How sure the content is OFX: 1 for an OFX 1.x header (`OFXHEADER:` at the start) or
 * an OFX 2.x processing instruction (`<?OFX`), 0.9 for a bare `<OFX>` body, 0 otherwise.
 *
 * @throws Never.
 * @example sniffOfx('OFXHEADER:100\nDATA:OFXSGML') // 1
 * @example sniffOfx('Date;Amount') // 0
 */
export function sniffOfx(text: string): number {
  const head = text.slice(0, 4096).replace(/^\uFEFF/, '');
  if (/^\s*OFXHEADER\s*:/i.test(head)) return 1;
  if (/<\?OFX[\s?]/i.test(head)) return 1;
  if (/<OFX>/i.test(head)) return 0.9;
  return 0;
}

/**
 * Parses an OFX file. Never throws: every problem, including an unexpected internal
 * failure, comes back as an `ImportProblem` with the file, the line and (inside the
 * body) the element path such as
 * `OFX/BANKMSGSRSV1/STMTTRNRS/STMTRS/BANKTRANLIST/STMTTRN[3]/TRNAMT`. `message` says
 * what was found and what was expected, without the location, which the caller prints
 * (`FILE:LINE: message` or `FILE: element PATH: message`).
 *
 * @throws Never: every failure, even an internal one, is returned as a problem.
 * @example parseOfx(text, { fileName: 'march.ofx' }).statements[0]?.currency // 'EUR'
 */
export function parseOfx(text: string, options: ImportOptions): ImportResult {
  const file = options.fileName;
  const problems: ImportProblem[] = [];
  const statements: ImportResult['statements'][number][] = [];
  try {
    const { header, problems: headerProblems } = parseOfxHeader(text);
    for (const p of headerProblems) problems.push({ file, line: p.line, message: p.message, severity: p.severity });
    if (!headerProblems.some((p) => p.severity === 'error')) {
      const tree = buildOfxTree(text, header.bodyStart, header.bodyLine);
      for (const p of tree.problems) problems.push({ file, ...p });
      const read = readOfxStatements(tree.roots);
      for (const p of read.problems) problems.push({ file, ...p });
      statements.push(...read.statements);
    }
  } catch (error) {
    // A bug, not bad input: still a problem, never an exception out of an importer.
    problems.push({
      file,
      message: `internal error while reading OFX: ${error instanceof Error ? error.message : String(error)}`,
      severity: 'error',
    });
  }
  return { file, format: 'ofx', statements, problems: capProblems(problems, file) };
}

function capProblems(problems: readonly ImportProblem[], file: string): ImportProblem[] {
  if (problems.length <= MAX_OFX_PROBLEMS) return [...problems];
  // Errors first so that a long list of notices never hides why a file was refused.
  const sorted = [...problems.filter((p) => p.severity === 'error'), ...problems.filter((p) => p.severity !== 'error')];
  const kept = sorted.slice(0, MAX_OFX_PROBLEMS - 1);
  const rest = sorted.length - kept.length;
  const anyErrorLeft = sorted.slice(kept.length).some((p) => p.severity === 'error');
  kept.push({ file, message: `${rest} more problems not listed`, severity: anyErrorLeft ? 'error' : 'notice' });
  return kept;
}

/**
 * Ebbline's OFX importer (`id` 'ofx'): see `sniffOfx` and `parseOfx`.
 *
 * @example ofxImporter.sniff('<?xml version="1.0"?><?OFX OFXHEADER="200" VERSION="220"?>') // 1
 */
export const ofxImporter: StatementImporter = {
  id: 'ofx',
  sniff: sniffOfx,
  parse: parseOfx,
};
