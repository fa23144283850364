/**
 * The report document (engine/report/renderReportHtml.ts) in the two places the Report
 * screen puts it:
 * - on screen, whole, in a sandboxed iframe (`srcdoc`, `sandbox=""`): exactly the file a
 *   client would get, isolated from the app;
 * - for printing and "Save as PDF", its body inside a shadow root in the page itself, since
 *   the desktop's printToPDF and the browser's print both print the window, and an iframe
 *   does not break across pages. The report's stylesheet is scoped to that shadow root:
 *   `:root` becomes `:host`, `body` and `main` become the two wrappers around the body.
 *
 * The report has no script and every text in it is escaped by the engine; the app's CSP
 * (`script-src 'self'`) would not run an inline script anyway.
 */
import type { ReconciliationStatus, ReconciliationSummary } from '../../../../engine/report/renderReportHtml';
import type { AccountRecord } from '../../lib/db/records';

export interface ReportParts {
  /** The inline stylesheet. */
  readonly css: string;
  /** What is inside <main>. */
  readonly body: string;
}

/**
 * The stylesheet and body of a report document.
 * @throws Error when the text is not a report document (no <style> or <main>).
 */
export function splitReportHtml(html: string): ReportParts {
  const style = /<style>([\s\S]*?)<\/style>/.exec(html);
  const main = /<main>([\s\S]*)<\/main>/.exec(html);
  if (!style || !main) throw new Error('not a report document');
  return { css: style[1] as string, body: main[1] as string };
}

/**
 * The report's stylesheet for a shadow root whose content is
 * `<div class="report-body"><div class="report-main">…</div></div>`.
 * @example shadowCss(':root { --ink: #111; } body { margin: 0; }') // ':host { --ink: #111; } .report-body { margin: 0; }'
 */
export function shadowCss(css: string): string {
  return css
    .replace(/:root\b/g, ':host')
    .replace(/(^|[\s},])(body|main)(?=\s*[{,])/g, (_m, before: string, tag: string) => `${before}.report-${tag}`)
    .replace(/@page\s*\{[^}]*\}/g, ''); // only the document's own stylesheet may set the page
}

/** The shadow root's content for a report document. */
export function shadowContent(html: string): string {
  const { css, body } = splitReportHtml(html);
  return `<style>${shadowCss(css)}</style><div class="report-body"><div class="report-main">${body}</div></div>`;
}

/** A file-system-safe stem from a workspace name. */
export function fileStem(name: string): string {
  return (
    [...name]
      .map((ch) => (ch.charCodeAt(0) < 32 || '\\/:*?"<>|'.includes(ch) ? '-' : ch))
      .join('')
      .replace(/\s+/g, ' ')
      .trim()
      .slice(0, 80) || 'workspace'
  );
}

function status(reconciled: boolean | null): ReconciliationStatus {
  return reconciled === true ? 'reconciled' : reconciled === false ? 'mismatch' : 'not checked';
}

/** The reconciliation of the accounts in the report's scope, as the report states it. */
export function reconciliationOf(accounts: readonly AccountRecord[]): ReconciliationSummary {
  const list = accounts.map((a) => ({
    name: a.name,
    status: status(a.reconciled),
    firstMismatch: a.firstMismatch?.date ?? null,
    note: a.note,
  }));
  const overall: ReconciliationStatus = list.some((a) => a.status === 'mismatch')
    ? 'mismatch'
    : list.length > 0 && list.every((a) => a.status === 'reconciled')
      ? 'reconciled'
      : 'not checked';
  return { status: overall, accounts: list };
}
