/**
 * The shape `detectCsvLayout` returns: what the importer decided about a CSV file, for a
 * mapping preview. Plain data, safe to send from the worker to the screen.
 */
import type { ImportProblem } from '../types';
import type { CsvDelimiter } from './delimiter';
import type { CsvColumnRole } from './header';
import type { CsvMapping, CsvSignStyle } from './mapping';
import type { DecimalSeparator, ThousandsSeparator } from './numbers';
import type { CsvRowOrder } from './order';

/** One column of the table as detected. */
export interface CsvDetectedColumn {
  readonly index: number;
  /** Header name ('' without a header). */
  readonly name: string;
  /** What the importer reads from it; undefined for a column it ignores. */
  readonly role?: CsvColumnRole;
}

/** A data row as the file has it, for the preview. */
export interface CsvSampleRow {
  readonly line: number;
  readonly cells: readonly string[];
}

/** Everything detection decided, with the evidence a user needs to confirm or correct it. */
export interface CsvLayoutDetection {
  readonly delimiter: CsvDelimiter;
  /** 1-based header line, or null when no header was found or the mapping says there is none. */
  readonly headerLine: number | null;
  /** 1-based line of the first data row. */
  readonly dataLine?: number;
  readonly headerCells: readonly string[];
  /** `csvLayoutFingerprint(headerCells)`, when there is a header. */
  readonly fingerprint?: string;
  readonly columns: readonly CsvDetectedColumn[];
  /** Canonical name such as "DD.MM.YYYY"; undefined when ambiguous or not found. */
  readonly dateFormat?: string;
  /** True when day and month could not be told apart (the user must choose). */
  readonly dateFormatAmbiguous: boolean;
  /** True when years are written with two digits (00–69 → 20xx, 70–99 → 19xx). */
  readonly twoDigitYears: boolean;
  readonly decimalSeparator?: DecimalSeparator;
  /** Grouping character seen ('' when the amounts have none). */
  readonly thousandsSeparator?: ThousandsSeparator;
  readonly signStyle?: CsvSignStyle;
  readonly currency?: string;
  /** Account identifier (IBAN or number) stated by the file. */
  readonly account?: string;
  readonly order?: CsvRowOrder;
  /** Data rows (blank lines not counted). */
  readonly rowCount: number;
  /** 0–1: 1 for an explicit mapping that read cleanly, lower for guesses, ambiguity and problems. */
  readonly confidence: number;
  /** The first data rows. */
  readonly sampleRows: readonly CsvSampleRow[];
  /** The detection written as an explicit mapping, ready to edit and pass back as `csvMapping`. */
  readonly mapping?: CsvMapping;
  /** The problems an import of the file would report. */
  readonly problems: readonly ImportProblem[];
}
