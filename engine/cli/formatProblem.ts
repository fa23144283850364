/**
 * The one line a problem gets on stderr: `FILE:LINE: message`, `FILE: element PATH: message`
 * or `FILE: message` (DESIGN.md section 5).
 */

/** What a problem line needs. */
export interface ProblemLike {
  readonly file: string;
  readonly line?: number;
  readonly element?: string;
  readonly message: string;
}

/**
 * Formats a problem as one line; line breaks inside the message become spaces.
 * @example formatProblem({ file: 'a.csv', line: 3, message: 'amount "1,2,3" is not a number' })
 * // 'a.csv:3: amount "1,2,3" is not a number'
 */
export function formatProblem(problem: ProblemLike): string {
  const message = problem.message.replace(/\s*[\r\n]+\s*/g, ' ');
  if (problem.line !== undefined) return `${problem.file}:${problem.line}: ${message}`;
  if (problem.element !== undefined) return `${problem.file}: element ${problem.element}: ${message}`;
  return `${problem.file}: ${message}`;
}
