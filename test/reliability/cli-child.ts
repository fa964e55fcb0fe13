/**
 * The command line in a child process, for attacks that would block or exhaust the process running them (a named
 * pipe, /dev/zero, a 1.5 GB file): the child is killed at a time bound, and it reports how long runCli itself took
 * (module loading excluded, so that the bound holds on a busy machine). Needs `npm run build` (dist/).
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

export const PROJECT_ROOT = join(import.meta.dirname, '..', '..');
export const CLI_BIN = join(PROJECT_ROOT, 'bin', 'gridshake.js');
const MAIN_URL = pathToFileURL(join(PROJECT_ROOT, 'dist', 'server', 'cli', 'main.js')).href;

const ELAPSED = /\nelapsed-ms (\d+)\n$/;
// main.ts loads each command's module when it runs: load them all first, so the timing leaves module loading out
const COMMAND_URLS = ['count-command.js', 'sweep-command.js', 'serve-command.js'].map(
  (file) => pathToFileURL(join(PROJECT_ROOT, 'dist', 'server', 'cli', file)).href,
);
const HARNESS =
  `for (const url of ${JSON.stringify(COMMAND_URLS)}) await import(url);` +
  `const { runCli } = await import(${JSON.stringify(MAIN_URL)});` +
  `const began = performance.now(); const code = await runCli(process.argv.slice(1));` +
  `process.stderr.write('\\nelapsed-ms ' + Math.round(performance.now() - began) + '\\n'); process.exitCode = code;`;

export interface ChildRun {
  /** exit code, or null when killed at the time bound */
  code: number | null;
  stdout: string;
  stderr: string;
  /** milliseconds spent in runCli, or null when it did not return */
  cliMs: number | null;
}

export interface ChildOptions {
  /** kill the child after this many milliseconds (default 30 s) */
  timeoutMs?: number;
  /** run as this user id (the permission tests, when the suite runs as root) */
  uid?: number;
  env?: Record<string, string>;
  /** run bin/gridshake.js itself (the real entry point) instead of the timing harness */
  bin?: boolean;
  nodeOptions?: string[];
}

export function runCliChild(argv: string[], options: ChildOptions = {}): Promise<ChildRun> {
  const args = options.bin ? [...(options.nodeOptions ?? []), CLI_BIN, ...argv] : ['--input-type=module', '-e', HARNESS, '--', ...argv];
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, args, {
      cwd: PROJECT_ROOT,
      env: { ...process.env, ...options.env },
      stdio: ['ignore', 'pipe', 'pipe'],
      timeout: options.timeoutMs ?? 30_000,
      killSignal: 'SIGKILL',
      ...(options.uid === undefined ? {} : { uid: options.uid, gid: options.uid }),
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk: Buffer) => {
      if (stdout.length < 1 << 20) stdout += chunk.toString();
    });
    child.stderr.on('data', (chunk: Buffer) => {
      if (stderr.length < 1 << 20) stderr += chunk.toString();
    });
    child.on('error', reject);
    child.on('close', (code) => {
      const match = ELAPSED.exec(stderr);
      resolve({
        code,
        stdout,
        stderr: match ? stderr.slice(0, match.index) : stderr,
        cliMs: match ? Number(match[1]) : null,
      });
    });
  });
}
