/**
 * The Content-Security-Policy headers of the server, in one place. Both documents share the same base: nothing is
 * loaded from another origin, no plugins, no <base> tag, no form posts, no framing. They differ in one point:
 * - the page (client/, built by vite) loads its scripts and styles as files from this server, so no inline script
 *   runs in it (a stored name or message that slipped through escaping still could not execute);
 * - the report is one self-contained HTML file (it must open offline from a download), so its scripts and styles
 *   are inline and nothing else may load; its data are escaped (server/report/html-escape.ts).
 * Directives: W3C Content Security Policy Level 3.
 */
const SHARED_DIRECTIVES = ["base-uri 'none'", "form-action 'none'", "frame-ancestors 'none'", "object-src 'none'"];

function policy(directives: string[]): string {
  return [...directives, ...SHARED_DIRECTIVES].join('; ');
}

/**
 * The analyst's page and every static file served with it. With a basemap configured (serve --basemap,
 * basemap-url.ts), images may also come from that one origin (the tiles); nothing else changes.
 */
export function pagePolicy(basemapOrigin?: string): string {
  return policy([
    "default-src 'self'",
    "script-src 'self'",
    "style-src 'self' 'unsafe-inline'",
    `img-src 'self' data: blob:${basemapOrigin === undefined ? '' : ` ${basemapOrigin}`}`,
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self' blob:",
  ]);
}

/** The page's policy without a basemap (the default: nothing is loaded from another origin). */
export const PAGE_POLICY = pagePolicy();

/** The downloadable sweep report (self-contained: inline scripts and styles, nothing fetched). */
export const REPORT_POLICY = policy([
  "default-src 'none'",
  "script-src 'unsafe-inline'",
  "style-src 'unsafe-inline'",
  'img-src data: blob:',
]);
