/** Escaping for the single-file report: text into HTML, and JSON into an inline <script>. */

const HTML_ENTITIES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Text as HTML character data or a quoted attribute value: & < > " ' replaced by entities. */
export function escapeHtml(text: unknown): string {
  return String(text).replace(/[&<>"']/g, (character) => HTML_ENTITIES[character] ?? character);
}

/**
 * A value as JSON safe inside an inline <script>: '<', '>' and '&' become \u escapes (so no "</script>" or
 * "<!--" can end the script), and the line separators U+2028 / U+2029 are escaped too.
 */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value)
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
}
