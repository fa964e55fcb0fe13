#!/usr/bin/env node
// Entry point of the command line: the compiled CLI lives in dist/ (built by `npm run build`).
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const main = new URL('../dist/server/cli/main.js', import.meta.url);
if (!existsSync(fileURLToPath(main))) {
  process.stderr.write('gridshake: the compiled code is missing; run `npm run build` first\n');
  process.exit(2);
}
const { runCli } = await import(main.href);
process.exitCode = await runCli(process.argv.slice(2));
