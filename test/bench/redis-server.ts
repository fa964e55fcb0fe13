/**
 * A throw-away Debian redis-server for the queue tests: a free loopback port, persistence off
 * (`--save '' --appendonly no`), stopped by the test. A missing redis-server fails the test (it is installed by
 * .ci/run), it is never skipped.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, connect } from 'node:net';
import { setTimeout as sleep } from 'node:timers/promises';

export const REDIS_SERVER = process.env.GRIDSHAKE_REDIS_SERVER ?? '/usr/bin/redis-server';

export interface TestRedis {
  port: number;
  url: string;
  process: ChildProcess;
  stop(): Promise<void>;
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address !== null ? address.port : 0));
    });
  });
}

/** Sends one inline command and resolves with the first reply line (or rejects when nothing listens). */
export function redisCommand(port: number, command: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(port, '127.0.0.1');
    let reply = '';
    socket.setTimeout(2000, () => socket.destroy(new Error('timeout')));
    socket.on('connect', () => socket.write(`${command}\r\n`));
    socket.on('data', (data) => {
      reply += data.toString('utf8');
      if (reply.includes('\r\n')) {
        socket.end();
        resolve(reply);
      }
    });
    socket.on('error', reject);
  });
}

/** Starts redis-server on `port` (a free one by default) and waits until it answers PING. */
export async function startRedis(port?: number, extraArgs: string[] = []): Promise<TestRedis> {
  const chosen = port ?? (await freePort());
  const args = ['--port', String(chosen), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--loglevel', 'warning', ...extraArgs];
  const child = spawn(REDIS_SERVER, args, {
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  const failed = new Promise<never>((_, reject) => {
    child.once('error', (error) => reject(new Error(`cannot start ${REDIS_SERVER}: ${error.message} (install Debian's redis-server)`)));
    child.once('exit', (code) => reject(new Error(`${REDIS_SERVER} exited with code ${code}`)));
  });
  failed.catch(() => undefined);
  const deadline = Date.now() + 10_000;
  for (;;) {
    const answer = await Promise.race([redisCommand(chosen, 'PING').catch(() => ''), failed]);
    // with --requirepass an unauthenticated PING is answered -NOAUTH: the server is up
    if (answer.startsWith('+PONG') || answer.startsWith('-NOAUTH')) break;
    if (Date.now() > deadline) throw new Error(`redis-server on port ${chosen} did not answer within 10 s`);
    await sleep(50);
  }
  return {
    port: chosen,
    url: `redis://127.0.0.1:${chosen}`,
    process: child,
    stop: () => stopProcess(child),
  };
}

export async function stopProcess(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill(signal);
  await Promise.race([exited, sleep(5000).then(() => child.kill('SIGKILL'))]);
  await exited;
}

/** Keys in the Redis at `port` (KEYS *: fine for a test server). */
export async function redisKeys(port: number): Promise<string[]> {
  const reply = await new Promise<string>((resolve, reject) => {
    const socket = connect(port, '127.0.0.1');
    let text = '';
    socket.on('connect', () => socket.write('KEYS *\r\nQUIT\r\n'));
    socket.on('data', (data) => {
      text += data.toString('utf8');
    });
    socket.on('end', () => resolve(text));
    socket.on('error', reject);
  });
  return reply
    .split('\r\n')
    .filter((line, index, lines) => index > 0 && lines[index - 1].startsWith('$'));
}
