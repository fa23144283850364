/**
 * Collects the problems of one CSV file. Every refusing problem names the file and, except
 * for a malformed `csvMapping`, the 1-based line it was found on. The list is capped so a
 * wrong mapping on a 100,000-row file yields a readable report, not 100,000 lines.
 */
import type { ImportProblem } from '../types';

/** Errors listed before the rest are summarised in one closing problem. */
export const MAX_LISTED_ERRORS = 100;

/** A growing problem list for one file. Plain data goes out through `problems`. */
export interface ProblemCollector {
  readonly file: string;
  readonly problems: ImportProblem[];
  /** Errors seen so far, including those not listed because of the cap. */
  readonly errorCount: number;
  /** Records a refusing problem on `line` (undefined only for mapping errors, which give `element`). */
  error(line: number | undefined, message: string, element?: string): void;
  /** Records a problem that is reported but does not refuse the file. */
  notice(line: number | undefined, message: string): void;
  /** Adds the "N more errors" summary when the cap was reached; call once at the end. */
  finish(): void;
}

/**
 * Creates an empty collector for `file`.
 *
 * @example
 * const p = createProblemCollector('march.csv');
 * p.error(14, 'date "31.04.2025" is not a calendar day, expected D.M.Y');
 * p.problems[0] // { file: 'march.csv', line: 14, message: '…', severity: 'error' }
 */
export function createProblemCollector(file: string): ProblemCollector {
  const problems: ImportProblem[] = [];
  let errors = 0;
  let firstHiddenLine: number | undefined;
  return {
    file,
    problems,
    get errorCount() {
      return errors;
    },
    error(line, message, element) {
      errors++;
      if (errors > MAX_LISTED_ERRORS) {
        firstHiddenLine ??= line;
        return;
      }
      const problem: ImportProblem =
        element === undefined
          ? { file, line, message, severity: 'error' }
          : { file, line, element, message, severity: 'error' };
      problems.push(problem);
    },
    notice(line, message) {
      problems.push({ file, line, message, severity: 'notice' });
    },
    finish() {
      if (errors > MAX_LISTED_ERRORS) {
        const hidden = errors - MAX_LISTED_ERRORS;
        problems.push({
          file,
          line: firstHiddenLine ?? 1,
          message: `${hidden} more error${hidden === 1 ? '' : 's'} from this line on are not listed, expected none`,
          severity: 'error',
        });
      }
    },
  };
}
