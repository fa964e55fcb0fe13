/**
 * One server per data folder: `gridshake serve` holds `<data>/server.lock` while it runs, so that a second server on
 * the same folder does not mark the first one's running sweeps `interrupted`.
 * The lock names its owner reliably: `{ pid, started, token }`, where `started` is the process start time from
 * /proc/<pid>/stat (field 22, clock ticks since boot; proc(5)) and `token` a random value. A lock is live only when
 * a process with that pid runs now and started at that time, so a pid reused after a kill or a reboot (or a lock
 * file holding just a number, e.g. `1`) does not block the start; such a stale lock is taken over. Where /proc is
 * missing (not Linux), a running pid counts as the owner. Release removes the lock only while it still holds this
 * process's token.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { storageError } from './open-database.js';

export const LOCK_FILE_NAME = 'server.lock';

export interface LockOwner {
  pid: number;
  /** start time of the process (clock ticks after boot), or null where /proc is not available */
  started: string | null;
  token: string;
}

/** The start time of a process from /proc/<pid>/stat (field 22), null when it is not running or /proc is missing. */
export function processStartTime(pid: number): string | null {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // the command name (field 2) is in parentheses and may itself contain spaces or parentheses
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return fields[19] ?? null; // field 22 of the whole line is the 20th after the name
  } catch {
    return null;
  }
}

function hasProc(): boolean {
  return processStartTime(process.pid) !== null;
}

function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Read a lock file; null when it is unreadable or not a lock written by this version (an old or damaged lock). */
export function readLock(path: string): LockOwner | null {
  try {
    const value = JSON.parse(readFileSync(path, 'utf8')) as Partial<LockOwner>;
    if (!Number.isInteger(value.pid) || (value.pid as number) <= 0 || typeof value.token !== 'string') return null;
    return { pid: value.pid as number, started: typeof value.started === 'string' ? value.started : null, token: value.token };
  } catch {
    return null;
  }
}

/** True when the lock's owner is a process that runs now: same pid and, where /proc tells, same start time. */
export function isLive(owner: LockOwner): boolean {
  if (owner.pid === process.pid) return false;
  if (hasProc()) return owner.started !== null && processStartTime(owner.pid) === owner.started;
  return isRunning(owner.pid);
}

/** Take the folder's lock or throw GS_ERR_STORAGE naming the process that holds it; returns the release function. */
export function lockDataFolder(dataDir: string): () => void {
  const folder = resolve(dataDir);
  try {
    mkdirSync(folder, { recursive: true });
  } catch (error) {
    throw storageError(`cannot create the data folder ${folder}: ${(error as Error).message}`);
  }
  const path = join(folder, LOCK_FILE_NAME);
  const mine: LockOwner = { pid: process.pid, started: processStartTime(process.pid), token: randomBytes(16).toString('hex') };
  const text = JSON.stringify(mine);
  try {
    writeFileSync(path, text, { flag: 'wx' });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') {
      throw storageError(`cannot write in the data folder ${folder}: ${(error as Error).message}`);
    }
    const holder = readLock(path);
    if (holder !== null && isLive(holder)) {
      throw storageError(`another gridshake server (process ${holder.pid}) is using the data folder ${folder}; stop it or use --data`);
    }
    // a stale lock: replace it atomically
    const temporary = `${path}.${mine.token}`;
    writeFileSync(temporary, text);
    renameSync(temporary, path);
  }
  return () => {
    try {
      if (readLock(path)?.token === mine.token) rmSync(path, { force: true });
    } catch {
      // already gone
    }
  };
}
