/**
 * The --out folder of `gridshake sweep`, checked before any work so that a sweep is never computed only to be lost:
 * kernel filesystems (/proc, /sys, devices) are refused, a missing folder must be creatable (it is made when the
 * results are ready), a path that is not a folder is refused, an output name taken by something other than a regular
 * file is refused, and writability is proved by creating and removing a temporary file. Every failure is one
 * GS_ERR_PARAMETER line naming the folder.
 */
import { accessSync, closeSync, constants, mkdirSync, openSync, realpathSync, statfsSync, statSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve, sep } from 'node:path';
import { parameterError } from '../errors.js';

/** The files a sweep writes into --out. */
export const SWEEP_OUTPUTS = ['placements.csv', 'summary.json', 'report.html'] as const;

/** Filesystems of the kernel, by their statfs magic number (Linux <linux/magic.h>): never a place for results. */
const KERNEL_FILESYSTEMS: ReadonlyMap<number, string> = new Map([
  [0x9fa0, 'proc'],
  [0x62656572, 'sysfs'],
  [0x1cd1, 'devpts'],
  [0x64626720, 'debugfs'],
  [0x74726163, 'tracefs'],
  [0x73636673, 'securityfs'],
  [0x27e0eb, 'cgroup'],
  [0x63677270, 'cgroup2'],
  [0xcafe4a11, 'bpf'],
  [0x6165676c, 'pstore'],
  [0x62656570, 'configfs'],
  [0x65735543, 'fusectl'],
  [0x42494e4d, 'binfmt_misc'],
]);

const REASONS: Record<string, string> = {
  EACCES: 'permission denied',
  EPERM: 'permission denied',
  EROFS: 'the file system is read-only',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'the disk quota is used up',
  ENOTDIR: 'a part of the path is a file, not a folder',
  ENAMETOOLONG: 'the name is too long',
  ELOOP: 'too many symbolic links',
};

function reasonOf(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code ?? '';
  return REASONS[code] ?? (error instanceof Error ? error.message.split('\n')[0] : String(error));
}

function refuse(path: string, reason: string): Error {
  return parameterError(`--out ${path}: ${reason}`);
}

/** The deepest existing folder on the way to `absolute` (the path itself when it exists). */
function existingAncestor(absolute: string): string {
  let current = absolute;
  for (;;) {
    try {
      statSync(current);
      return current;
    } catch {
      const parent = dirname(current);
      if (parent === current) return current;
      current = parent;
    }
  }
}

function refuseKernelFilesystem(path: string, absolute: string): void {
  const existing = existingAncestor(absolute);
  let real = existing;
  try {
    real = realpathSync(existing);
  } catch {
    // the walk above found it; keep the path as given
  }
  if (real === '/dev' || (real.startsWith(`/dev${sep}`) && !real.startsWith(`/dev${sep}shm`))) {
    throw refuse(path, 'under /dev, the folder of devices, not a place for results; choose a folder on disk');
  }
  let type: number;
  try {
    type = statfsSync(real).type;
  } catch {
    return;
  }
  const name = KERNEL_FILESYSTEMS.get(type);
  if (name !== undefined) throw refuse(path, `on the kernel's ${name} filesystem, not a place for results; choose a folder on disk`);
}

/** Proves that files can be created in an existing folder by creating and removing a temporary one. */
function probeWrite(folder: string): void {
  const probe = join(folder, `.gridshake-write-test-${process.pid}-${Date.now()}`);
  closeSync(openSync(probe, 'wx'));
  unlinkSync(probe);
}

/**
 * Checks, before any work, that `names` can be written into the folder `path`. A missing folder is not created yet
 * (a sweep refused later leaves nothing behind): its deepest existing ancestor must be a folder that can be written
 * to. Returns the function that creates the folder when the results are ready.
 * @throws GridshakeError GS_ERR_PARAMETER "--out PATH: <why>"
 */
export function checkOutputFolder(path: string, names: readonly string[]): () => void {
  const absolute = resolve(path);
  refuseKernelFilesystem(path, absolute);
  const create = (): void => {
    try {
      mkdirSync(absolute, { recursive: true });
    } catch (error) {
      throw refuse(path, `cannot create the folder (${reasonOf(error)})`);
    }
  };
  let isFolder: boolean;
  try {
    isFolder = statSync(absolute).isDirectory();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw refuse(path, reasonOf(error));
    try {
      probeWrite(existingAncestor(absolute));
    } catch (probed) {
      throw refuse(path, `cannot create the folder (${reasonOf(probed)})`);
    }
    return create;
  }
  if (!isFolder) throw refuse(path, 'it exists and is not a folder');
  for (const name of names) {
    let stats;
    try {
      stats = statSync(join(absolute, name));
    } catch {
      continue;
    }
    if (!stats.isFile()) throw refuse(path, `${name} exists there and is not a regular file`);
    try {
      accessSync(join(absolute, name), constants.W_OK);
    } catch (error) {
      throw refuse(path, `${name} exists there and cannot be replaced (${reasonOf(error)})`);
    }
  }
  try {
    probeWrite(absolute);
  } catch (error) {
    throw refuse(path, `cannot write there (${reasonOf(error)})`);
  }
  return create;
}

/**
 * Writes the output files into a folder checked by checkOutputFolder; a failure now (a disk that filled during
 * the sweep) is one line naming the file.
 */
export function writeOutputs(path: string, files: ReadonlyArray<readonly [name: string, content: string | Uint8Array]>): void {
  for (const [name, content] of files) {
    try {
      writeFileSync(join(path, name), content);
    } catch (error) {
      throw refuse(path, `cannot write ${name} (${reasonOf(error)})`);
    }
  }
}
