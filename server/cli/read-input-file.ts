/** Reading an input file from disk for the CLI; failures become GS_ERR_INPUT messages naming the file. */
import { readFileSync } from 'node:fs';
import { inputError } from '../errors.js';
import type { InputFile } from '../inputs/index.js';

const REASONS: Record<string, string> = {
  ENOENT: 'no such file',
  EACCES: 'permission denied',
  EISDIR: 'it is a directory, not a file',
};

export function readInputFile(path: string): InputFile {
  try {
    return { name: path, content: readFileSync(path) };
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? '';
    const reason = REASONS[code] ?? (error instanceof Error ? error.message : String(error));
    throw inputError(`${path}: cannot read the file (${reason})`);
  }
}
