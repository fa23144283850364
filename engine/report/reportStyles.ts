/**
 * The report's stylesheet, inlined into the document: system fonts (nothing to fetch),
 * calm colours with Okabe–Ito accents, tables that stay readable on paper, and a print
 * stylesheet (A4 margins, no page break inside a table row or the chart, colours kept).
 */
export const REPORT_CSS = `
:root { color-scheme: light; --ink: #1b1b1b; --muted: #555; --rule: #d6d6d6; --blue: #0072B2; --vermillion: #D55E00; --orange: #E69F00; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff; font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; }
main { max-width: 60rem; margin: 0 auto; padding: 2rem 1.5rem 3rem; }
header h1 { font-size: 1.6rem; margin: 0 0 0.25rem; }
header p { margin: 0.1rem 0; color: var(--muted); }
h2 { font-size: 1.15rem; margin: 2rem 0 0.5rem; padding-bottom: 0.2rem; border-bottom: 1px solid var(--rule); }
.caution { margin: 1.25rem 0; padding: 0.75rem 1rem; border: 2px solid var(--orange); border-left-width: 8px; background: #fff8e6; font-weight: 600; }
.answer { font-size: 1.2rem; margin: 0.75rem 0; }
.answer strong { color: var(--vermillion); }
.note { color: var(--muted); font-size: 0.92rem; }
figure { margin: 0.5rem 0; }
svg.fan { max-width: 100%; height: auto; font-family: inherit; }
svg.fan text { fill: var(--ink); }
.legend { display: flex; flex-wrap: wrap; gap: 1rem; font-size: 0.9rem; color: var(--muted); }
.legend svg { vertical-align: middle; margin-right: 0.3rem; }
table { border-collapse: collapse; width: 100%; margin: 0.5rem 0; font-size: 0.86rem; }
th, td { padding: 0.25rem 0.4rem; border-bottom: 1px solid var(--rule); text-align: left; vertical-align: top; }
th { font-weight: 600; background: #f4f6f8; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
td.num { white-space: nowrap; }
#weeks td:nth-child(2), #recurring td:nth-child(4) { white-space: nowrap; }
#scenarios th { white-space: normal; text-align: right; }
#scenarios th:first-child, #scenarios td:first-child { text-align: left; }
tr.risk td { color: var(--vermillion); }
ul.plain { padding-left: 1.2rem; }
footer { margin-top: 2.5rem; padding-top: 0.75rem; border-top: 1px solid var(--rule); color: var(--muted); font-size: 0.9rem; }
footer .caution { color: var(--ink); }
@media print {
  @page { size: A4; margin: 16mm 14mm; }
  body { font-size: 10.5pt; }
  table { font-size: 8.5pt; }
  th, td { padding: 0.15rem 0.25rem; }
  main { max-width: none; padding: 0; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  h2 { break-after: avoid; }
  figure, .caution, tr, .answer { break-inside: avoid; }
  thead { display: table-header-group; }
  section { break-inside: auto; }
}
`;
