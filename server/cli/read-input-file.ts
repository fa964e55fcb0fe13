/**
 * Reading an input file from disk for the CLI, with the server's upload limits: regular files only (a device, a
 * named pipe or a socket is refused before anything is read), a size limit checked with fstat before reading, then
 * the bytes read in chunks with the limit enforced again as they come (a file that grows, or one whose size the
 * kernel does not report) and every physical line of a CSV file checked against MAX_CSV_LINE_BYTES, so that a file
 * of one enormous line is refused at that line. Failures are one-line GS_ERR_INPUT / GS_ERR_TOO_LARGE messages that
 * name the file.
 */
import { closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from 'node:fs';
import { DEFAULT_BODY_LIMIT } from '../limits.js';
import { inputError, isGridshakeError, tooLargeError } from '../errors.js';
import type { InputFile } from '../inputs/index.js';
import { looksLikeGeoJson, MAX_CSV_LINE_BYTES, megabytes, SQLITE_MAGIC } from '../inputs/input-file.js';

export interface InputLimits {
  /** largest file in bytes: the server's upload limit (--body-limit) */
  fileBytes: number;
  /** longest physical line of a CSV file in bytes */
  csvLineBytes: number;
}

export const DEFAULT_INPUT_LIMITS: InputLimits = Object.freeze({ fileBytes: DEFAULT_BODY_LIMIT, csvLineBytes: MAX_CSV_LINE_BYTES });

const CHUNK_BYTES = 1 << 20;

const REASONS: Record<string, string> = {
  ENOENT: 'no such file',
  EACCES: 'permission denied',
  EISDIR: 'it is a directory, not a file',
  ENOTDIR: 'a part of the path is not a folder',
  ELOOP: 'too many symbolic links',
  ENAMETOOLONG: 'the name is too long',
};

/** Why a file is not one we read, or null for a regular file. */
function notRegular(stats: Stats): string | null {
  if (stats.isFile()) return null;
  if (stats.isDirectory()) return REASONS.EISDIR;
  if (stats.isFIFO()) return 'a named pipe, not a regular file';
  if (stats.isCharacterDevice()) return 'a character device, not a regular file';
  if (stats.isBlockDevice()) return 'a block device, not a regular file';
  if (stats.isSocket()) return 'a socket, not a regular file';
  return 'not a regular file';
}

function cannotRead(path: string, reason: string): Error {
  return inputError(`${path}: cannot read the file (${reason})`);
}

function systemReason(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code ?? '';
  return REASONS[code] ?? (error instanceof Error ? error.message.split('\n')[0] : String(error));
}

function tooBig(path: string, limit: number, size?: number): Error {
  const what = size === undefined ? 'the file is larger' : `the file is ${megabytes(size)}, larger`;
  return tooLargeError(`${path}: ${what} than the limit of ${megabytes(limit)} (--body-limit)`);
}

/**
 * A check of physical line lengths over successive chunks of a file (line breaks \n, \r\n or \r, the header is
 * line 1, as in the CSV messages). Throws GS_ERR_TOO_LARGE naming the first line longer than `limit` bytes.
 */
export function csvLineCheck(path: string, limit: number): (bytes: Uint8Array) => void {
  let line = 1;
  let length = 0;
  let afterCarriageReturn = false;
  return (bytes) => {
    for (let k = 0; k < bytes.length; k += 1) {
      const byte = bytes[k];
      if (byte === 10) {
        if (!afterCarriageReturn) line += 1;
        length = 0;
        afterCarriageReturn = false;
      } else if (byte === 13) {
        line += 1;
        length = 0;
        afterCarriageReturn = true;
      } else {
        afterCarriageReturn = false;
        length += 1;
        if (length > limit) {
          throw tooLargeError(
            `${path}: line ${line}: longer than ${megabytes(limit)}, the limit for one line of a CSV file of points`,
          );
        }
      }
    }
  };
}

/** True when the first bytes of a file say CSV: neither a GeoPackage (SQLite) nor GeoJSON by name or content. */
function isCsv(path: string, start: Uint8Array): boolean {
  const head = Buffer.from(start.subarray(0, 4096)).toString('utf8').replace(/^\uFEFF/, '');
  if (head.startsWith(SQLITE_MAGIC) || /\.gpkg$/i.test(path)) return false;
  return !looksLikeGeoJson({ name: path, content: '' }, head) && !head.trimStart().startsWith('[');
}

/**
 * The file at `path` as an InputFile, read within `limits`.
 * @throws GridshakeError GS_ERR_INPUT (missing, unreadable or not a regular file) or GS_ERR_TOO_LARGE (size, line)
 */
export function readInputFile(path: string, limits: InputLimits = DEFAULT_INPUT_LIMITS): InputFile {
  let descriptor: number;
  try {
    // stat opens nothing: a named pipe is refused here, before an open that would wait for a writer
    const reason = notRegular(statSync(path));
    if (reason !== null) throw cannotRead(path, reason);
    // non-blocking open: should the path have become a pipe since, the open returns and fstat below refuses it
    descriptor = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    if (isGridshakeError(error)) throw error;
    throw cannotRead(path, systemReason(error));
  }
  try {
    const stats = fstatSync(descriptor);
    const reason = notRegular(stats);
    if (reason !== null) throw cannotRead(path, reason);
    if (stats.size > limits.fileBytes) throw tooBig(path, limits.fileBytes, stats.size);
    const chunks: Buffer[] = [];
    let total = 0;
    let checkLines: ((bytes: Uint8Array) => void) | null = null;
    for (;;) {
      const chunk = Buffer.allocUnsafe(CHUNK_BYTES);
      let got: number;
      try {
        got = readSync(descriptor, chunk, 0, CHUNK_BYTES, null);
      } catch (error) {
        throw cannotRead(path, systemReason(error));
      }
      if (got === 0) break;
      total += got;
      if (total > limits.fileBytes) throw tooBig(path, limits.fileBytes);
      const piece = chunk.subarray(0, got);
      if (chunks.length === 0 && isCsv(path, piece)) checkLines = csvLineCheck(path, limits.csvLineBytes);
      checkLines?.(piece);
      chunks.push(piece);
    }
    return { name: path, content: Buffer.concat(chunks, total) };
  } finally {
    closeSync(descriptor);
  }
}
