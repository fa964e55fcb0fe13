/**
 * The optional basemap (`serve --basemap URL`): the analyst's own XYZ tile server, as a URL template with {z}, {x}
 * and {y} (tiles in the web-mercator tile scheme, EPSG:3857). Off unless given: without it the page fetches nothing
 * outside the local server. When given, the page's Content-Security-Policy allows images from that one origin only
 * (content-security-policy.ts) and the page offers the basemap as a layer, off until the user switches it on.
 * Refused (GS_ERR_PARAMETER, one line): not http(s), no {z}/{x}/{y}, a user name or password in the URL.
 */
import { parameterError } from '../errors.js';

export interface Basemap {
  /** the template as given, e.g. http://127.0.0.1:8080/tiles/{z}/{x}/{y}.png */
  template: string;
  /** its origin (scheme, host, port), the one the page may load images from */
  origin: string;
}

export function parseBasemapUrl(text: string): Basemap {
  const template = text.trim();
  for (const placeholder of ['{z}', '{x}', '{y}']) {
    if (!template.includes(placeholder)) {
      throw parameterError(`--basemap ${JSON.stringify(template)} has no ${placeholder}: give an XYZ tile URL such as http://127.0.0.1:8080/{z}/{x}/{y}.png`);
    }
  }
  let url: URL;
  try {
    url = new URL(template.replaceAll('{z}', '0').replaceAll('{x}', '0').replaceAll('{y}', '0'));
  } catch {
    throw parameterError(`--basemap ${JSON.stringify(template)} is not a URL: give an XYZ tile URL such as http://127.0.0.1:8080/{z}/{x}/{y}.png`);
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    throw parameterError(`--basemap must be an http or https URL, not ${url.protocol}`);
  }
  if (url.username !== '' || url.password !== '') {
    throw parameterError('--basemap must not carry a user name or password (the page would show it)');
  }
  return { template, origin: url.origin };
}
