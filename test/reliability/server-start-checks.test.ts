/**
 * Issue 10, server items 8-11, each attack replayed:
 * 8. a dropped table, a missing column, or garbage written into the middle of the database file stops the start with
 *    GS_ERR_DATABASE and one line naming the data folder and what to do;
 * 9. a stale lock whose pid was reused (`echo 1 > DIR/server.lock`, or a live process with another start time) does
 *    not block the start; a live server's lock does;
 * 10. symbolic links in the client folder are not followed; the page carries a Content-Security-Policy;
 * 11. `--threads 100000` is refused with one line.
 */
import Database from 'better-sqlite3';
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, mkdirSync, mkdtempSync, openSync, rmSync, statSync, symlinkSync, writeFileSync, writeSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.js';
import { isGridshakeError } from '../../server/errors.js';
import { PAGE_POLICY, REPORT_POLICY } from '../../server/security/content-security-policy.js';
import { LOCK_FILE_NAME, lockDataFolder, processStartTime } from '../../server/store/data-folder-lock.js';
import { checkThreadCount } from '../../server/sweeps/thread-count.js';
import { multipartBody, rawGet, smallDatasetParts, startServer } from './http-helpers.js';

const BIN = join(import.meta.dirname, '..', '..', 'bin', 'gridshake.js');
const folders: string[] = [];
afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});
function tempFolder(prefix: string): string {
  const folder = mkdtempSync(join(tmpdir(), prefix));
  folders.push(folder);
  return folder;
}

/** A data folder holding one stored dataset, closed cleanly. */
async function populatedFolder(): Promise<string> {
  const server = await startServer();
  const body = await multipartBody(smallDatasetParts(3));
  const response = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: body.payload, headers: { 'content-type': body.contentType } });
  expect(response.status).toBe(201);
  await server.app.close();
  folders.push(server.dataDir);
  return server.dataDir;
}

async function startError(dataDir: string): Promise<{ code: string; message: string }> {
  try {
    const app = await buildApp({ dataDir, threads: 1 });
    await app.close();
  } catch (error) {
    if (isGridshakeError(error)) return { code: error.code, message: error.message };
    throw error;
  }
  return { code: 'started', message: '' };
}

function serveOnce(args: string[]): { status: number | null; stderr: string; ms: number } {
  const began = Date.now();
  const result = spawnSync(process.execPath, [BIN, 'serve', '--port', '0', '--no-demo', ...args], { encoding: 'utf8', timeout: 30_000 });
  return { status: result.status, stderr: result.stderr, ms: Date.now() - began };
}

describe('item 8: a damaged database does not start', () => {
  it('a dropped table: refused with GS_ERR_DATABASE naming the folder; the CLI prints one line and exits 1', async () => {
    const dataDir = await populatedFolder();
    const db = new Database(join(dataDir, 'gridshake.sqlite'));
    db.exec('DROP TABLE placement_chunks');
    db.close();
    const error = await startError(dataDir);
    expect(error.code).toBe('GS_ERR_DATABASE');
    expect(error.message).toContain(dataDir);
    expect(error.message).toMatch(/placement_chunks is missing/);
    expect(error.message).toMatch(/backup/);
    const cli = serveOnce(['--data', dataDir]);
    expect(cli.status).toBe(1);
    expect(cli.stderr.trim().split('\n')).toHaveLength(1);
    expect(cli.stderr).toMatch(/^gridshake: the database .* is damaged/);
    console.log(`start checks: dropped table refused: ${cli.stderr.trim().slice(0, 160)}...`);
  });

  it('a missing column is refused', async () => {
    const dataDir = await populatedFolder();
    const db = new Database(join(dataDir, 'gridshake.sqlite'));
    db.exec('ALTER TABLE sweeps DROP COLUMN rerun_of');
    db.close();
    const error = await startError(dataDir);
    expect(error.code).toBe('GS_ERR_DATABASE');
    expect(error.message).toMatch(/table sweeps has columns/);
  });

  it('garbage written into the middle of the file is refused, and the file is left as it was', async () => {
    const dataDir = await populatedFolder();
    const path = join(dataDir, 'gridshake.sqlite');
    const size = statSync(path).size;
    expect(size).toBeGreaterThan(8192);
    const fd = openSync(path, 'r+');
    const garbage = Buffer.alloc(4096);
    for (let k = 0; k < garbage.length; k += 1) garbage[k] = (k * 131 + 7) & 0xff;
    // the second page onwards: table pages of the stored dataset
    writeSync(fd, garbage, 0, garbage.length, 4096);
    closeSync(fd);
    const before = statSync(path).mtimeMs;
    const error = await startError(dataDir);
    expect(error.code).toBe('GS_ERR_DATABASE');
    expect(error.message).toContain(dataDir);
    expect(statSync(path).mtimeMs).toBe(before);
    const cli = serveOnce(['--data', dataDir]);
    expect(cli.status).toBe(1);
    expect(cli.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('a healthy folder still starts', async () => {
    const dataDir = await populatedFolder();
    expect((await startError(dataDir)).code).toBe('started');
  });
});

describe('item 9: the lock names its owner', () => {
  it('`echo 1 > server.lock` does not block the start (pid 1 runs, but it is not the owner)', () => {
    const dataDir = tempFolder('gridshake-lock-');
    writeFileSync(join(dataDir, LOCK_FILE_NAME), '1\n');
    const release = lockDataFolder(dataDir);
    release();
  });

  it('a lock whose pid now belongs to another process (other start time) is taken over; a live owner still blocks', async () => {
    const dataDir = tempFolder('gridshake-lock-');
    const other = spawn(process.execPath, ['-e', 'setTimeout(() => {}, 30000)'], { stdio: 'ignore' });
    try {
      await new Promise((resolve) => setTimeout(resolve, 100));
      const started = processStartTime(other.pid!);
      expect(started).not.toBeNull();
      // the same pid, another start time: the process that wrote the lock is gone and its pid reused
      writeFileSync(join(dataDir, LOCK_FILE_NAME), JSON.stringify({ pid: other.pid, started: String(Number(started) - 1), token: 'x' }));
      lockDataFolder(dataDir)();
      // the same pid and start time: the owner runs
      writeFileSync(join(dataDir, LOCK_FILE_NAME), JSON.stringify({ pid: other.pid, started, token: 'y' }));
      expect(() => lockDataFolder(dataDir)).toThrow(/another gridshake server \(process \d+\)/);
    } finally {
      other.kill('SIGKILL');
    }
  });

  it('gridshake serve starts over a reused-pid lock', async () => {
    const dataDir = tempFolder('gridshake-lock-');
    writeFileSync(join(dataDir, LOCK_FILE_NAME), '1');
    const child = spawn(process.execPath, [BIN, 'serve', '--port', '0', '--no-demo', '--threads', '1', '--data', dataDir], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
    const serving = await new Promise<boolean>((resolve) => {
      const timer = setTimeout(() => resolve(false), 20_000);
      child.stdout.on('data', () => {
        if (stdout.includes('serving at')) {
          clearTimeout(timer);
          resolve(true);
        }
      });
      child.on('exit', () => resolve(false));
    });
    child.kill('SIGKILL');
    expect(serving).toBe(true);
  });
});

describe('item 10: only real files under the client folder, with a CSP', () => {
  it('symbolic links to files and folders outside are answered 404; real files are served with the page policy', async () => {
    const clientDir = tempFolder('gridshake-client-');
    writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>page</title>');
    mkdirSync(join(clientDir, 'assets'));
    writeFileSync(join(clientDir, 'assets', 'app.js'), 'console.log(1)');
    const outside = tempFolder('gridshake-outside-');
    writeFileSync(join(outside, 'secret.txt'), 'SECRET-OUTSIDE');
    symlinkSync('/etc/passwd', join(clientDir, 'passwd.txt'));
    symlinkSync(join(outside, 'secret.txt'), join(clientDir, 'assets', 'secret.js'));
    symlinkSync(outside, join(clientDir, 'linked'));
    symlinkSync('/etc', join(clientDir, 'etc'));
    // a link to a file inside the folder is refused too: only real files
    symlinkSync(join(clientDir, 'assets', 'app.js'), join(clientDir, 'alias.js'));
    const server = await startServer({ clientDir });
    try {
      for (const path of ['/passwd.txt', '/assets/secret.js', '/linked/secret.txt', '/etc/passwd', '/etc/hostname', '/alias.js', '/linked/', '/etc/']) {
        const response = await rawGet(server.port, path);
        expect({ path, status: response.status }).toEqual({ path, status: 404 });
        expect(response.body).not.toContain('SECRET-OUTSIDE');
        expect(response.body).not.toContain('root:');
      }
      const page = await rawGet(server.port, '/');
      expect(page.status).toBe(200);
      expect(page.headers['content-security-policy']).toBe(PAGE_POLICY);
      const script = await rawGet(server.port, '/assets/app.js');
      expect(script.status).toBe(200);
      expect(script.headers['content-security-policy']).toBe(PAGE_POLICY);
    } finally {
      await server.close();
    }
  });

  it('the page policy allows no inline script and no other origin; the report policy shares its base', () => {
    expect(PAGE_POLICY).toMatch(/script-src 'self'(;|$)/);
    expect(PAGE_POLICY).toContain("default-src 'self'");
    for (const directive of ["base-uri 'none'", "form-action 'none'", "frame-ancestors 'none'", "object-src 'none'"]) {
      expect(PAGE_POLICY).toContain(directive);
      expect(REPORT_POLICY).toContain(directive);
    }
  });
});

describe('item 11: --threads is bounded', () => {
  it(`refuses more than 4 per core (${4 * availableParallelism()} here) with one line; buildApp refuses them too`, async () => {
    expect(() => checkThreadCount(100_000)).toThrow(/--threads must be a whole number from 1 to \d+/);
    expect(checkThreadCount(4 * availableParallelism())).toBe(4 * availableParallelism());
    const cli = serveOnce(['--threads', '100000', '--data', tempFolder('gridshake-threads-')]);
    expect(cli.status).toBe(1);
    expect(cli.stderr.trim().split('\n')).toHaveLength(1);
    expect(cli.stderr).toMatch(/--threads must be a whole number from 1 to/);
    await expect(buildApp({ dataDir: ':memory:', threads: 100_000 })).rejects.toThrow(/--threads/);
    console.log(`start checks: --threads 100000 refused in ${cli.ms} ms: ${cli.stderr.trim()}`);
  });
});
