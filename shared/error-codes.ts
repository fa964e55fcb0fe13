/**
 * The one registry of gridshake's error codes: every `GS_ERR_` code the server, the command line or the page uses,
 * with its one HTTP status (RFC 9110 section 15 for the 4xx/5xx meanings; 507 Insufficient Storage from RFC 4918
 * section 11.5; 421 Misdirected Request from RFC 9110 section 15.5.20). The server's error factories, its error handler
 * and its request guards take their status from here; the page compares codes against these names.
 * Codes met only on the command line (GS_ERR_DATABASE, GS_ERR_LISTEN) keep a status for the day they reach HTTP.
 */
export const ERROR_CODES = {
  /** bad input data: unreadable or malformed files, bad coordinates, bad polygons */
  GS_ERR_INPUT: 400,
  /**
   * a population-at-risk baseline (polygons with a count field, or control points) that cannot serve: a missing,
   * negative or non-numeric count, overlapping polygons, another coordinate system than the points, no weight in
   * the valid region
   */
  GS_ERR_BASELINE: 400,
  /** bad parameters of a count or a plan (also the engine's "too few kept cells") */
  GS_ERR_PARAMETER: 400,
  /** a plan whose Monte Carlo test could never reject: 1/(R+1) > alpha */
  GS_ERR_TOO_FEW_SIMS: 400,
  /** a plan whose estimated work is above the budget */
  GS_ERR_BUDGET: 400,
  /** CSV rows without usable coordinates */
  GS_ERR_BAD_ROWS: 400,
  /** a request that fails its JSON schema, or a body that is not JSON */
  GS_ERR_VALIDATION: 400,
  /** a multipart upload that broke off or is malformed */
  GS_ERR_UPLOAD: 400,
  /** any other request the web framework refuses (its own 4xx status is kept; 400 for most) */
  GS_ERR_REQUEST: 400,
  /** a state-changing request from another site */
  GS_ERR_ORIGIN: 403,
  /** an unknown dataset, sweep or route */
  GS_ERR_NOT_FOUND: 404,
  /** headers or body that did not arrive in time */
  GS_ERR_TIMEOUT: 408,
  /** a request in the wrong state, e.g. cancelling a finished sweep */
  GS_ERR_CONFLICT: 409,
  /** an upload without a Content-Length header */
  GS_ERR_LENGTH_REQUIRED: 411,
  /** a body, file, point count or polygon above its limit */
  GS_ERR_TOO_LARGE: 413,
  /** a body that is neither JSON nor multipart/form-data where one is needed */
  GS_ERR_CONTENT_TYPE: 415,
  /** a Host header that does not name this server (DNS rebinding) */
  GS_ERR_HOST: 421,
  /** a grid export with more cells than the format may hold */
  GS_ERR_GRID_TOO_LARGE: 422,
  /** a grid GeoPackage asked for while another is being written */
  GS_ERR_EXPORT_BUSY: 429,
  /** too many sweeps waiting */
  GS_ERR_QUEUE_FULL: 429,
  /** too many event streams open */
  GS_ERR_TOO_MANY_STREAMS: 429,
  /** too many uploads at once */
  GS_ERR_TOO_MANY_UPLOADS: 429,
  /** anything unexpected; the server log has the details */
  GS_ERR_INTERNAL: 500,
  /** a database that fails its schema or integrity check at start */
  GS_ERR_DATABASE: 500,
  /** the server cannot listen on its host and port */
  GS_ERR_LISTEN: 500,
  /** the data folder or its database cannot be created, opened or written (disk full, read-only, locked) */
  GS_ERR_STORAGE: 507,
  /** the Redis queue of `--queue` did not answer within its timeout (503 Service Unavailable, RFC 9110 15.6.4) */
  GS_ERR_QUEUE_UNREACHABLE: 503,
} as const satisfies Record<`GS_ERR_${string}`, number>;

export type ErrorCode = keyof typeof ERROR_CODES;

/** The HTTP status of a code. */
export function statusOf(code: ErrorCode): number {
  return ERROR_CODES[code];
}

/** True when `code` is a registered code (for codes that arrive as text, e.g. from a worker thread). */
export function isErrorCode(code: string): code is ErrorCode {
  return Object.prototype.hasOwnProperty.call(ERROR_CODES, code);
}

/**
 * The page's code for a response that carries no GS_ERR_ code (e.g. a proxy's HTML error page): not a server code,
 * so it has no status of its own; the page keeps the response's status.
 */
export const UNCODED_RESPONSE = 'GS_ERR_HTTP';
