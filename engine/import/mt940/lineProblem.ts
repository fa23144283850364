/**
 * The problem shape the MT940 internals report. The importer adds the file name to turn
 * it into an {@link ImportProblem}.
 */
import type { ImportProblem } from '../types';

/** A problem found on a 1-based line of an MT940 file; `message` starts with the field, e.g. `field 61: …`. */
export interface LineProblem {
  readonly line: number;
  readonly message: string;
  readonly severity: ImportProblem['severity'];
}

/**
 * Builds an error problem.
 * @example lineError(37, 'field 61: amount "12.5" uses a point') // { line: 37, severity: 'error', … }
 */
export function lineError(line: number, message: string): LineProblem {
  return { line, message, severity: 'error' };
}

/**
 * Builds a notice problem (reported, the file is still accepted).
 * @example lineNotice(3, 'field 20: longer than 16 characters') // { line: 3, severity: 'notice', … }
 */
export function lineNotice(line: number, message: string): LineProblem {
  return { line, message, severity: 'notice' };
}
