/**
 * The SWIFT MT940 ("Customer Statement Message") importer. Reads files with or without
 * SWIFT block wrappers `{1:…}{2:…}{4:` … `-}`, with or without `-` lines between messages,
 * several statements per file, CRLF or LF. Field rules follow the SWIFT User Handbook,
 * Category 9, MT940; the pieces live in `./mt940/` (one field per module):
 *
 * - `tokenizeMt940`: lines → fields; wrappers and separators.
 * - `parseMt940`: fields → statements, mandatory fields, balances and their currency.
 * - `statementLine`: field 61; `ownerInformation`: field 86; `balanceField`: 60a/62a/64/65;
 *   `accountIdentification`: field 25; `swiftDate`: YYMMDD with the two-digit-year pivot
 *   (80–99 → 19xx, 00–79 → 20xx); `swiftAmount`: 15d amounts with decimal comma.
 */
import { parseMt940 } from './mt940/parseMt940';
import type { ImportOptions, ImportResult, StatementImporter } from './types';

const TWENTY = /(?:^|[\r\n]|\{4:):20:/;
const BODY = /(?:^|[\r\n]|\{4:):(?:61|60F|60M|62F|62M):/;

/**
 * How sure the content is MT940: 1 when a `:20:` field and a `:60F:`/`:60M:`/`:61:`/`:62F:`
 * field start lines (also inside a `{4:` block), 0 otherwise.
 * @example sniffMt940(':20:REF\n:25:X\n:28C:1\n:60F:C250101EUR0,') // 1
 * @example sniffMt940('Date;Amount\n2025-01-01;12') // 0
 */
export function sniffMt940(text: string): number {
  // A text without ':20:' anywhere cannot match TWENTY; indexOf says so far faster than the
  // regular expression's scan of a large CSV or XML file.
  if (text.indexOf(':20:') === -1) return 0;
  return TWENTY.test(text) && BODY.test(text) ? 1 : 0;
}

/**
 * Reads an MT940 file. Never throws: a fault of the reader itself is reported as an error
 * problem on line 1 rather than escaping.
 * @example mt940Importer.parse(text, { fileName: 'march.sta' }).statements[0]?.entries.length
 */
function parseMt940File(text: string, options: ImportOptions): ImportResult {
  const file = options.fileName;
  try {
    const { statements, problems } = parseMt940(text);
    return {
      file,
      format: 'mt940',
      statements,
      problems: problems.map((p) => ({ file, line: p.line, message: p.message, severity: p.severity })),
    };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return {
      file,
      format: 'mt940',
      statements: [],
      problems: [{ file, line: 1, message: `internal error while reading MT940: ${message}`, severity: 'error' }],
    };
  }
}

/**
 * The MT940 importer for the registry: `{ id: 'mt940', sniff, parse }`.
 * @example mt940Importer.sniff(':20:REF\n:61:250102C1,NTRFNONREF') // 1
 * @example mt940Importer.parse('not a statement', { fileName: 'x.txt' }).problems[0]?.severity // 'error'
 */
export const mt940Importer: StatementImporter = {
  id: 'mt940',
  sniff: sniffMt940,
  parse: parseMt940File,
};
