/** JSON.parse with a message that names the file and, when the parser gives a position, its line and column. */
import { inputError } from '../errors.js';
import { jsonErrorOffset } from './json-error-offset.js';

function lineAndColumn(text: string, position: number): string {
  let line = 1;
  let lineStart = 0;
  for (let k = 0; k < position && k < text.length; k += 1) {
    if (text[k] === '\n') {
      line += 1;
      lineStart = k + 1;
    }
  }
  return `line ${line}, column ${position - lineStart + 1}`;
}

export function parseJsonText(fileName: string, text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    const offset = jsonErrorOffset(text);
    const place = offset === null ? 'unknown position' : offset >= text.length ? 'end of file' : lineAndColumn(text, offset);
    throw inputError(`${fileName}: invalid JSON at ${place}: ${reason}`);
  }
}
