/**
 * An uploaded or read file as the inputs see it: a display name (used in every message) and its bytes or text.
 * Its own file so that the readers (input-file.ts) and the format check (file-signature.ts) share it without an
 * import cycle.
 */
export interface InputFile {
  name: string;
  content: string | Uint8Array;
}
