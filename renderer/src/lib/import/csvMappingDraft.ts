/**
 * The CSV mapping a person corrects in the import preview: one role per column plus the
 * date format, separators and sign style, turned into the importer's `CsvMapping`
 * (engine/import/csv/mapping.ts) to read the file again. Columns are named by 0-based index
 * (the layout fingerprint pins the header, so the order is the same in every file of the
 * layout); header and data lines are left to detection so a longer preamble next month
 * still reads.
 */
import type {
  CsvColumnMapping,
  CsvColumnRole,
  CsvLayoutDetection,
  CsvMapping,
  CsvSignStyle,
  DecimalSeparator,
  ThousandsSeparator,
} from '../../../../engine/import/csv';

export interface CsvMappingDraft {
  /** Role per column index; '' ignores the column. */
  roles: (CsvColumnRole | '')[];
  /** One of CSV_DATE_FORMAT_NAMES; '' leaves it to detection. */
  dateFormat: string;
  decimalSeparator: DecimalSeparator | '';
  thousandsSeparator: ThousandsSeparator | 'auto';
  signStyle: CsvSignStyle | '';
  negateAmounts: boolean;
}

/** Roles only one column may have (several description columns are joined). */
const MULTI_COLUMN_ROLES: ReadonlySet<CsvColumnRole> = new Set(['description']);

/** Plain names of the roles, for the column selects. */
export const ROLE_LABELS: Readonly<Record<CsvColumnRole, string>> = {
  date: 'Booking date',
  valueDate: 'Value date',
  amount: 'Amount',
  debit: 'Money out (debit)',
  credit: 'Money in (credit)',
  indicator: 'Debit/credit mark',
  description: 'Description',
  counterparty: 'Counterparty',
  balance: 'Running balance',
  currency: 'Currency',
  reference: 'Reference',
  status: 'Booked/pending',
  account: 'Own account',
  type: 'Transaction type',
  bankRef: 'Bank id',
};

export const SIGN_STYLE_LABELS: Readonly<Record<CsvSignStyle, string>> = {
  signed: 'Signed amount (−12.50)',
  debitCredit: 'Separate money-out and money-in columns',
  indicator: 'Amount with a debit/credit mark column',
  parentheses: 'Parentheses for money out ((12.50))',
  trailingMinus: 'Trailing minus (12.50−)',
};

export const THOUSANDS_LABELS: readonly { readonly value: ThousandsSeparator | 'auto'; readonly label: string }[] = [
  { value: 'auto', label: 'As detected' },
  { value: '', label: 'None' },
  { value: '.', label: 'Point (1.234)' },
  { value: ',', label: 'Comma (1,234)' },
  { value: ' ', label: 'Space (1 234)' },
  { value: "'", label: "Apostrophe (1'234)" },
];

/**
 * The draft of what detection decided (or of the explicit mapping it was read with).
 * @example draftFromDetection(detection).roles // ['date', 'description', '', 'amount']
 */
export function draftFromDetection(detection: CsvLayoutDetection): CsvMappingDraft {
  const width = Math.max(detection.headerCells.length, ...detection.sampleRows.map((r) => r.cells.length), 0);
  const roles: (CsvColumnRole | '')[] = new Array(width).fill('');
  for (const c of detection.columns) if (c.index < width) roles[c.index] = c.role ?? '';
  const mapping = detection.mapping;
  return {
    roles,
    dateFormat: mapping?.dateFormat ?? detection.dateFormat ?? '',
    decimalSeparator: mapping?.decimalSeparator ?? detection.decimalSeparator ?? '',
    thousandsSeparator: mapping?.thousandsSeparator ?? detection.thousandsSeparator ?? 'auto',
    signStyle: mapping?.signStyle ?? detection.signStyle ?? '',
    negateAmounts: mapping?.negateAmounts ?? false,
  };
}

/**
 * Gives column `index` a role; a single-column role moves from the column that had it.
 * Returns a new draft.
 * @example setColumnRole(draft, 3, 'amount').roles
 */
export function setColumnRole(draft: CsvMappingDraft, index: number, role: CsvColumnRole | ''): CsvMappingDraft {
  const roles = draft.roles.map((r, i) => {
    if (i === index) return role;
    if (role !== '' && r === role && !MULTI_COLUMN_ROLES.has(role)) return '';
    return r;
  });
  let signStyle = draft.signStyle;
  if (role === 'debit' || role === 'credit')
    signStyle = roles.includes('debit') && roles.includes('credit') ? 'debitCredit' : signStyle;
  if (role === 'indicator') signStyle = 'indicator';
  return { ...draft, roles, signStyle };
}

/**
 * Changes the decimal separator, swapping the thousands separator when it was the same
 * character (1.234,56 read wrongly as 1,234.56 is corrected by one choice).
 */
export function setDecimalSeparator(draft: CsvMappingDraft, decimal: DecimalSeparator | ''): CsvMappingDraft {
  let thousands = draft.thousandsSeparator;
  if (decimal !== '' && thousands === decimal) thousands = draft.decimalSeparator === '' ? '' : draft.decimalSeparator;
  return { ...draft, decimalSeparator: decimal, thousandsSeparator: thousands };
}

/**
 * The explicit mapping of a draft. Keeps the detected delimiter; a file without header
 * keeps `headerLine: null` and its data line.
 * @example mappingFromDraft(draft, detection).columns // { date: 0, amount: 3, description: 1 }
 */
export function mappingFromDraft(draft: CsvMappingDraft, detection: CsvLayoutDetection): CsvMapping {
  const columns: Record<string, number | number[]> = {};
  draft.roles.forEach((role, index) => {
    if (role === '') return;
    if (MULTI_COLUMN_ROLES.has(role)) {
      const list = (columns[role] as number[] | undefined) ?? [];
      list.push(index);
      columns[role] = list;
    } else {
      columns[role] = index;
    }
  });
  if (Array.isArray(columns.description) && columns.description.length === 1) {
    columns.description = columns.description[0] as number;
  }
  const mapping: { -readonly [K in keyof CsvMapping]: CsvMapping[K] } = {
    delimiter: detection.delimiter,
    columns: columns as unknown as CsvColumnMapping,
  };
  if (detection.headerLine === null) {
    mapping.headerLine = null;
    if (detection.dataLine !== undefined) mapping.dataLine = detection.dataLine;
  }
  if (draft.dateFormat !== '') mapping.dateFormat = draft.dateFormat;
  if (draft.decimalSeparator !== '') mapping.decimalSeparator = draft.decimalSeparator;
  if (draft.thousandsSeparator !== 'auto') mapping.thousandsSeparator = draft.thousandsSeparator;
  if (draft.signStyle !== '') mapping.signStyle = draft.signStyle;
  if (draft.negateAmounts) mapping.negateAmounts = true;
  return mapping;
}
