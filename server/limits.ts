/** Input limits shared by the server's uploads and the command line's input files (one place for both). */

/** Largest request body and largest input file, bytes (64 MB). */
export const DEFAULT_BODY_LIMIT = 64 * 1024 * 1024;

/** Most points in one dataset. */
export const DEFAULT_MAX_POINTS = 2_000_000;
