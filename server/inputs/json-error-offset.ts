/**
 * Offset of the first syntax error in a JSON text (RFC 8259 grammar), for messages only: JSON.parse does the
 * parsing, but V8 does not always say where it stopped. A recursive-descent scan, cost O(length).
 */
const WHITESPACE = new Set([' ', '\t', '\n', '\r']);
const NUMBER = /-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/y;
const LITERALS = ['true', 'false', 'null'];
const ESCAPES = new Set(['"', '\\', '/', 'b', 'f', 'n', 'r', 't']);

class Fail {
  constructor(readonly offset: number) {}
}

export function jsonErrorOffset(text: string): number | null {
  let k = 0;
  const skip = (): void => {
    while (k < text.length && WHITESPACE.has(text[k])) k += 1;
  };
  const expect = (ch: string): void => {
    skip();
    if (text[k] !== ch) throw new Fail(k);
    k += 1;
  };
  const string = (): void => {
    if (text[k] !== '"') throw new Fail(k);
    k += 1;
    while (k < text.length && text[k] !== '"') {
      if (text.charCodeAt(k) < 0x20) throw new Fail(k);
      if (text[k] === '\\') {
        const escape = text[k + 1] ?? '';
        if (escape === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(k + 2, k + 6))) throw new Fail(k);
          k += 6;
        } else if (ESCAPES.has(escape)) k += 2;
        else throw new Fail(k);
      } else k += 1;
    }
    if (k >= text.length) throw new Fail(k);
    k += 1;
  };
  const value = (): void => {
    skip();
    const ch = text[k];
    if (ch === '{' || ch === '[') {
      const close = ch === '{' ? '}' : ']';
      k += 1;
      skip();
      if (text[k] === close) {
        k += 1;
        return;
      }
      for (;;) {
        if (close === '}') {
          skip();
          string();
          expect(':');
        }
        value();
        skip();
        if (text[k] === ',') k += 1;
        else if (text[k] === close) {
          k += 1;
          return;
        } else throw new Fail(k);
      }
    }
    if (ch === '"') return string();
    const literal = LITERALS.find((word) => text.startsWith(word, k));
    if (literal) {
      k += literal.length;
      return;
    }
    NUMBER.lastIndex = k;
    const match = NUMBER.exec(text);
    if (!match || match[0] === '') throw new Fail(k);
    k += match[0].length;
  };
  try {
    value();
    skip();
    return k < text.length ? k : null;
  } catch (error) {
    if (error instanceof Fail) return error.offset;
    throw error;
  }
}
