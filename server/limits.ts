/** Input limits shared by the server's uploads and the command line's input files (one place for both). */

/** Largest request body and largest input file, bytes (64 MB). */
export const DEFAULT_BODY_LIMIT = 64 * 1024 * 1024;

/** Most points in one dataset. */
export const DEFAULT_MAX_POINTS = 2_000_000;

/** Largest JSON request body, bytes: a plan is a few hundred bytes (issue 10: a 60 MB plan blocked the server). */
export const JSON_BODY_LIMIT = 64 * 1024;

/** Most sweeps waiting in the queue (not counting the running one); more are refused with 429 GS_ERR_QUEUE_FULL. */
export const MAX_QUEUED_SWEEPS = 50;

/** Most event streams open on one server at once; more are refused with 429 GS_ERR_TOO_MANY_STREAMS. */
export const MAX_EVENT_STREAMS = 64;

/** Most uploads received at once; more are refused with 429 GS_ERR_TOO_MANY_UPLOADS before their body is read. */
export const MAX_CONCURRENT_UPLOADS = 8;

/** Default and largest page of GET /api/sweeps. */
export const SWEEP_PAGE_DEFAULT = 100;
export const SWEEP_PAGE_MAX = 500;

/** Time for a request's headers to arrive (ms); then Node closes the connection with 408. */
export const HEADERS_TIMEOUT_MS = 10_000;

/** Time for a request's body to arrive once its headers have (ms); then 408 GS_ERR_TIMEOUT and the connection closes. */
export const BODY_TIMEOUT_MS = 30_000;

/** Most worker threads per core (`--threads`): more only adds memory and contention. */
export const MAX_THREADS_PER_CORE = 4;
