import { escapeHtml } from './html-escape.js';

/** An HTML table with a caption, every cell escaped; the first column is a row header. */
export function htmlTable(caption: string, head: readonly string[], rows: readonly (readonly string[])[]): string {
  const headCells = head.map((cell) => `<th scope="col">${escapeHtml(cell)}</th>`).join('');
  const bodyRows = rows
    .map((row) => `<tr>${row.map((cell, k) => (k === 0 ? `<th scope="row">${escapeHtml(cell)}</th>` : `<td>${escapeHtml(cell)}</td>`)).join('')}</tr>`)
    .join('\n');
  return `<table><caption>${escapeHtml(caption)}</caption><thead><tr>${headCells}</tr></thead><tbody>\n${bodyRows}\n</tbody></table>`;
}

/** A two-column table of labelled values. */
export function definitionTable(caption: string, entries: readonly (readonly [string, string])[]): string {
  return htmlTable(caption, ['item', 'value'], entries.map(([label, value]) => [label, value]));
}
