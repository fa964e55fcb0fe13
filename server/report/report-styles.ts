/** Inline CSS of the report: calm screen layout and a clean A4 print (charts kept whole, no dark fills). */
export const REPORT_CSS = `
:root { --ink: #1f2328; --muted: #57606a; --line: #d0d7de; --accent: #0072B2; --soft: #f3f6f9; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff; font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; }
main { max-width: 980px; margin: 0 auto; padding: 24px 28px 48px; }
h1 { font-size: 26px; margin: 0 0 4px; }
h2 { font-size: 20px; margin: 32px 0 8px; padding-bottom: 4px; border-bottom: 2px solid var(--accent); }
h3 { font-size: 16px; margin: 18px 0 6px; }
.meta { color: var(--muted); margin: 0 0 16px; }
.cautions { border: 1px solid #E69F00; border-left: 6px solid #E69F00; background: #fffaf0; padding: 10px 16px; margin: 16px 0; }
.cautions h2 { border: 0; margin: 0 0 4px; font-size: 17px; }
.conclusion { background: var(--soft); border-left: 6px solid var(--accent); padding: 10px 16px; }
table { border-collapse: collapse; width: 100%; margin: 8px 0 16px; font-size: 13px; font-variant-numeric: tabular-nums; }
caption { text-align: left; font-weight: 600; padding: 4px 0; }
th, td { border: 1px solid var(--line); padding: 4px 8px; text-align: left; vertical-align: top; }
thead th { background: var(--soft); }
tbody th { white-space: nowrap; }
figure { margin: 12px 0 20px; break-inside: avoid; page-break-inside: avoid; }
figure canvas { width: 100% !important; max-width: 920px; height: auto !important; border: 1px solid var(--line); }
figcaption { color: var(--muted); font-size: 13px; }
details { margin: 4px 0 12px; }
ul.warnings code { background: var(--soft); padding: 0 4px; }
.numbers { margin: 4px 0 8px 18px; padding: 0; }
footer { margin-top: 32px; color: var(--muted); font-size: 13px; }
@media print {
  @page { size: A4; margin: 14mm; }
  body { font-size: 10.5pt; }
  table { font-size: 8.5pt; table-layout: fixed; }
  th, td { padding: 2px 4px; overflow-wrap: anywhere; }
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid; page-break-after: avoid; }
  details { display: none; }
  table, .cautions, .conclusion { break-inside: avoid; page-break-inside: avoid; }
  section.size { break-before: page; page-break-before: always; }
}
`;
