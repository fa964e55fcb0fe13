import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { multipartBody, smallDatasetParts } from '../reliability/http-helpers.js';
import { runServeToExit, startServe } from './serve-process.js';

// A data folder the server cannot use gives one clear line and a non-zero exit, never a stack trace: a file where
// the folder should be, a folder under a file, a read-only file system and a full disk (tmpfs mounts: the tests run
// as root, where chmod does not stop writes). A disk that fills up while the server runs refuses the upload with a
// coded error and keeps the server and the store as they were.
const root = mkdtempSync(join(tmpdir(), 'gridshake-folders-'));
const mounts: string[] = [];

/** Mount a tmpfs (options e.g. 'ro,size=1m'); false when this machine does not allow it. */
function mountTmpfs(path: string, options: string): boolean {
  mkdirSync(path, { recursive: true });
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', options, 'tmpfs', path], { stdio: 'ignore' });
    mounts.push(path);
    return true;
  } catch {
    return false;
  }
}

afterAll(() => {
  for (const path of mounts.reverse()) execFileSync('umount', ['-l', path], { stdio: 'ignore' });
  rmSync(root, { recursive: true, force: true });
});

const STACK_LINE = /^\s+at .+[(:]\d+/m;

async function expectClearFailure(data: string, pattern: RegExp, what: string): Promise<void> {
  const outcome = await runServeToExit(['--data', data, '--no-demo']);
  console.log(`data folder faults: ${what}: exit ${outcome.code}, "${outcome.stderr.trim()}"`);
  expect(outcome.code).toBe(1);
  expect(outcome.stderr).toMatch(pattern);
  expect(outcome.stderr).not.toMatch(STACK_LINE);
  expect(outcome.stderr.trim().split('\n')).toHaveLength(1);
}

describe('unusable data folders at start', () => {
  it('a file where the data folder should be, and a folder under a file', async () => {
    const file = join(root, 'not-a-folder');
    writeFileSync(file, 'x');
    await expectClearFailure(file, /^gridshake: cannot (create|write in) the data folder .*not-a-folder/, 'a file as the folder');
    await expectClearFailure(join(file, 'data'), /^gridshake: cannot create the data folder .*not-a-folder\/data: ENOTDIR/, 'a folder under a file');
  });

  it('a read-only file system and a full disk (tmpfs mounts)', async () => {
    const readOnly = join(root, 'read-only');
    const full = join(root, 'full');
    const mounted = mountTmpfs(readOnly, 'ro,size=1m') && mountTmpfs(full, 'size=64k');
    console.log(`data folder faults: tmpfs mounts ${mounted ? 'available' : 'not available on this machine: only the file cases ran'}`);
    if (!mounted) return;
    await expectClearFailure(readOnly, /^gridshake: cannot write in the data folder .*read-only: EROFS/, 'a read-only file system');
    await expectClearFailure(join(readOnly, 'data'), /^gridshake: cannot create the data folder .*read-only\/data/, 'a folder to create on a read-only file system');
    writeFileSync(join(full, 'filler'), Buffer.alloc(64 * 1024));
    await expectClearFailure(full, /^gridshake: cannot write in the data folder .*full: ENOSPC/, 'a full disk');
  });
});

describe('a disk that fills up while the server runs', () => {
  it('refuses the upload with a coded error, keeps serving and keeps the store unchanged', async () => {
    const small = join(root, 'small-disk');
    if (!mountTmpfs(small, 'size=1536k')) {
      console.log('data folder faults: tmpfs not available: the disk-full upload case did not run');
      return;
    }
    const server = await startServe(['--data', small, '--threads', '1', '--no-demo']);
    try {
      const first = await multipartBody(smallDatasetParts(5, 'first'));
      const created = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: first.payload, headers: { 'content-type': first.contentType } });
      expect(created.status).toBe(201);
      const before = await (await fetch(`${server.base}/api/datasets`)).text();
      // about 4 MB of records: more than the disk has left
      const rows = Array.from({ length: 150_000 }, (_, k) => `${k},${(k * 7.31) % 1000},${(k * 3.17) % 1000}`);
      const big = await multipartBody([
        { field: 'points', value: `id,x,y\n${rows.join('\n')}\n`, filename: 'big.csv' },
        { field: 'crs', value: 'planar' },
      ]);
      const refused = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: big.payload, headers: { 'content-type': big.contentType } });
      const body = (await refused.json()) as { code: string; message: string };
      console.log(`data folder faults: upload on a full disk: ${refused.status} ${body.code} "${body.message}"`);
      expect(refused.status).toBe(507);
      expect(body.code).toBe('GS_ERR_STORAGE');
      expect(body.message).toMatch(/full|space/i);
      expect(await (await fetch(`${server.base}/api/datasets`)).text()).toBe(before);
      const health = await fetch(`${server.base}/api/health`);
      expect(health.status).toBe(200);
    } finally {
      await server.kill('SIGKILL');
    }
  });
});
