/**
 * The last line of defence of the command line: an error that is not a GridshakeError (a bug, memory exhausted, a
 * failure inside a library) still ends as one line "gridshake: ..." with exit code 1, never a stack trace.
 * GRIDSHAKE_DEBUG=1 in the environment adds the stack after that line, for a bug report.
 */

/** Longest message kept on the line. */
const MAX_MESSAGE = 300;

function firstLine(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  const line = text.split('\n').find((part) => part.trim() !== '')?.trim() ?? '';
  const kind = error instanceof Error && error.name !== 'Error' ? `${error.name}: ` : '';
  const code = (error as { code?: unknown } | null)?.code;
  const coded = typeof code === 'string' && !line.includes(code) ? ` [${code}]` : '';
  const whole = `${kind}${line || 'no message'}${coded}`;
  return whole.length > MAX_MESSAGE ? `${whole.slice(0, MAX_MESSAGE)}...` : whole;
}

/** True when GRIDSHAKE_DEBUG asks for stack traces. */
export function debugRequested(env: Record<string, string | undefined> = process.env): boolean {
  const value = env.GRIDSHAKE_DEBUG;
  return value !== undefined && value !== '' && value !== '0';
}

/** What the CLI prints for an unexpected error: one line, plus the stack when GRIDSHAKE_DEBUG is set. */
export function unexpectedErrorText(error: unknown, env: Record<string, string | undefined> = process.env): string {
  const line = `gridshake: unexpected error: ${firstLine(error)} (GRIDSHAKE_DEBUG=1 shows where)\n`;
  if (!debugRequested(env)) return line;
  const stack = error instanceof Error && error.stack !== undefined ? error.stack : String(error);
  return `${line}${stack}\n`;
}
