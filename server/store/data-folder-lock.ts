/**
 * One server per data folder: `gridshake serve` holds `<data>/server.lock` (the process id) while it runs, so that a
 * second server on the same folder does not mark the first one's running sweeps `interrupted`. A lock left by a
 * process that no longer exists (killed, crashed) is taken over.
 */
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { storageError } from './open-database.js';

export const LOCK_FILE_NAME = 'server.lock';

function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
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
  try {
    writeFileSync(path, String(process.pid), { flag: 'wx' });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') {
      throw storageError(`cannot write in the data folder ${folder}: ${(error as Error).message}`);
    }
    const holder = Number(readFileSync(path, 'utf8').trim());
    if (Number.isInteger(holder) && holder > 0 && holder !== process.pid && isRunning(holder)) {
      throw storageError(`another gridshake server (process ${holder}) is using the data folder ${folder}; stop it or use --data`);
    }
    writeFileSync(path, String(process.pid));
  }
  return () => {
    try {
      if (readFileSync(path, 'utf8').trim() === String(process.pid)) rmSync(path, { force: true });
    } catch {
      // already gone
    }
  };
}
