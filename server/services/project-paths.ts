/**
 * Where the package's own files are, found from this module's location so that it works both from the TypeScript
 * sources (tests) and from dist/ (the installed command): the package root holds package.json.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

function findPackageRoot(start: string): string {
  let folder = start;
  for (;;) {
    const candidate = join(folder, 'package.json');
    if (existsSync(candidate)) {
      const name = (JSON.parse(readFileSync(candidate, 'utf8')) as { name?: string }).name;
      if (name === 'gridshake') return folder;
    }
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`gridshake: package.json not found above ${start}`);
    folder = parent;
  }
}

export const PACKAGE_ROOT = findPackageRoot(dirname(fileURLToPath(import.meta.url)));
export const PACKAGE_VERSION = (JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { version: string })
  .version;
/** The page built by vite (npm run build). */
export const DEFAULT_CLIENT_DIR = join(PACKAGE_ROOT, 'dist', 'client');
/** The demo scenarios loaded into an empty store. */
export const SAMPLES_DIR = join(PACKAGE_ROOT, 'samples');
