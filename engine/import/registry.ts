/**
 * The one place that picks an importer by content. Each importer sniffs the decoded text;
 * the most confident one parses it. File names and extensions are never consulted.
 */
import { csvImporter } from './csv';
import { ofxImporter } from './ofx';
import { camt053Importer } from './camt053';
import { mt940Importer } from './mt940';
import { MAX_STATEMENT_BYTES, declaredEncoding, decodeStatementBytes, looksBinary } from './decode';
import type { ImportOptions, ImportResult, StatementImporter } from './types';

/** All importers, most specific first (ties in `sniff` go to the earlier one). */
export const IMPORTERS: readonly StatementImporter[] = [camt053Importer, ofxImporter, mt940Importer, csvImporter];

/** Result of reading one file whose format could not even be determined. */
export interface UnreadableFile {
  readonly file: string;
  readonly format: undefined;
  readonly statements: readonly [];
  readonly problems: readonly [{ file: string; message: string; severity: 'error' }];
}

function unreadable(file: string, message: string): UnreadableFile {
  return { file, format: undefined, statements: [], problems: [{ file, message, severity: 'error' }] };
}

/**
 * Detects the format of a statement file from its content and parses it.
 *
 * @returns the importer's result, or an `UnreadableFile` (one error problem) for empty,
 *   binary, oversized or unrecognised files.
 * @example importStatement(bytes, { fileName: 'march.xml' }).format // 'camt.053'
 */
export function importStatement(bytes: Uint8Array, options: ImportOptions): ImportResult | UnreadableFile {
  const file = options.fileName;
  if (bytes.length > MAX_STATEMENT_BYTES) {
    return unreadable(file, `file is ${bytes.length} bytes, the limit is ${MAX_STATEMENT_BYTES} bytes (256 MiB)`);
  }
  if (bytes.length === 0) return unreadable(file, 'file is empty, expected a bank statement');
  if (looksBinary(bytes)) {
    return unreadable(file, 'file is binary, expected a text statement (CSV, OFX, camt.053 XML or MT940)');
  }
  const { text } = decodeStatementBytes(bytes, declaredEncoding(bytes));
  if (text.trim() === '') return unreadable(file, 'file has no text, expected a bank statement');
  let best: StatementImporter | undefined;
  let bestScore = 0;
  for (const importer of IMPORTERS) {
    const score = importer.sniff(text);
    if (score > bestScore) {
      best = importer;
      bestScore = score;
    }
  }
  if (!best) {
    return unreadable(file, 'format not recognised, expected CSV, OFX 1.x/2.x, ISO 20022 camt.053 or SWIFT MT940');
  }
  return best.parse(text, options);
}
