#!/usr/bin/env node
// Entry point of the command line: the compiled CLI lives in dist/ (built by `npm run build`).
// Whatever escapes the commands (an error thrown in a callback, a rejected promise nobody awaited) ends as one line
// "gridshake: ..." with exit code 1; GRIDSHAKE_DEBUG=1 adds the stack (server/cli/unexpected-error.ts).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const main = new URL('../dist/server/cli/main.js', import.meta.url);
if (!existsSync(fileURLToPath(main))) {
  process.stderr.write('gridshake: the compiled code is missing; run `npm run build` first\n');
  process.exit(2);
}
// a reader that went away (`gridshake count ... | head -1`) ends the output, not the program with a stack trace
process.stdout.on('error', (error) => {
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
});
let describe = (error) => `gridshake: unexpected error: ${error instanceof Error ? error.message.split('\n')[0] : String(error)}\n`;
const fail = (error) => {
  process.stderr.write(describe(error));
  process.exit(1);
};
process.on('uncaughtException', fail);
process.on('unhandledRejection', fail);
const { runCli, unexpectedErrorText } = await import(main.href);
describe = unexpectedErrorText;
process.exitCode = await runCli(process.argv.slice(2));
