/**
 * Where uploads are streamed while they arrive: `<data>/uploads/<random>/` per request (the system's temporary
 * folder for an in-memory store). The request's folder is removed when its response is sent or the client goes
 * away; folders left by a killed process are removed at the next start, so no upload leaves files behind.
 */
import { randomBytes } from 'node:crypto';
import { createWriteStream, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

export const UPLOADS_FOLDER_NAME = 'uploads';

export class UploadFolder {
  readonly root: string;

  constructor(dataDir: string) {
    // an in-memory store has no folder of its own: a fresh one per app (several may run in one process)
    this.root =
      dataDir === ':memory:'
        ? join(tmpdir(), `gridshake-uploads-${process.pid}-${randomBytes(6).toString('hex')}`)
        : join(resolve(dataDir), UPLOADS_FOLDER_NAME);
  }

  /** Remove everything a previous process left (call once at start, under the data folder's lock). */
  clearLeftovers(): void {
    rmSync(this.root, { recursive: true, force: true });
  }

  /** A new empty folder for one request. */
  newRequestFolder(): string {
    const folder = join(this.root, randomBytes(12).toString('hex'));
    mkdirSync(folder, { recursive: true });
    return folder;
  }

  /** Stream one part to a file of the request's folder; resolves with its path. */
  async save(folder: string, index: number, stream: Readable): Promise<string> {
    const path = join(folder, `part-${index}`);
    await pipeline(stream, createWriteStream(path, { flags: 'wx' }));
    return path;
  }

  remove(folder: string): void {
    rmSync(folder, { recursive: true, force: true });
  }
}
