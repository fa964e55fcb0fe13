/**
 * `node bin/gridshake.js serve` as a child process on 127.0.0.1 with a free port, for the stress and fault tests:
 * waits for the "serving at" line, keeps stdout/stderr, and can be stopped with any signal.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';

export const PROJECT_ROOT = join(import.meta.dirname, '..', '..');
const SERVING = /gridshake serving at (http:\/\/127\.0\.0\.1:(\d+))\//;

export interface ServeProcess {
  child: ChildProcess;
  base: string;
  port: number;
  output: () => { stdout: string; stderr: string };
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  kill: (signal: NodeJS.Signals) => Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

export interface ServeOutcome {
  code: number | null;
  signal: NodeJS.Signals | null;
  stdout: string;
  stderr: string;
}

function launch(args: string[], env: NodeJS.ProcessEnv = {}): { child: ChildProcess; stdout: () => string; stderr: () => string; exited: ServeProcess['exited'] } {
  const child = spawn(process.execPath, [join(PROJECT_ROOT, 'bin', 'gridshake.js'), 'serve', '--host', '127.0.0.1', ...args], {
    cwd: PROJECT_ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stdout = '';
  let stderr = '';
  child.stdout?.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => {
    child.on('exit', (code, signal) => resolve({ code, signal }));
  });
  return { child, stdout: () => stdout, stderr: () => stderr, exited };
}

/** Start the server and wait until it listens (rejects with its output when it exits first or takes > timeoutMs). */
export async function startServe(args: string[], options: { env?: NodeJS.ProcessEnv; timeoutMs?: number } = {}): Promise<ServeProcess> {
  const { child, stdout, stderr, exited } = launch(['--port', '0', ...args], options.env);
  const timeoutMs = options.timeoutMs ?? 30_000;
  const started = Date.now();
  for (;;) {
    const match = SERVING.exec(stdout());
    if (match) {
      const base = match[1] as string;
      return {
        child,
        base,
        port: Number(match[2]),
        output: () => ({ stdout: stdout(), stderr: stderr() }),
        exited,
        kill: async (signal) => {
          child.kill(signal);
          return exited;
        },
      };
    }
    if (child.exitCode !== null || child.signalCode !== null) {
      throw new Error(`serve exited before listening (${child.exitCode ?? child.signalCode}): ${stderr()}`);
    }
    if (Date.now() - started > timeoutMs) {
      child.kill('SIGKILL');
      throw new Error(`serve did not listen within ${timeoutMs} ms: ${stderr()}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Run serve to its end (for start-up failures): exit code and output. */
export async function runServeToExit(args: string[], timeoutMs = 30_000): Promise<ServeOutcome> {
  const { child, stdout, stderr, exited } = launch(['--port', '0', ...args]);
  const timer = setTimeout(() => child.kill('SIGKILL'), timeoutMs);
  const result = await exited;
  clearTimeout(timer);
  return { ...result, stdout: stdout(), stderr: stderr() };
}
