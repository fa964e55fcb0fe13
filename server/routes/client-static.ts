/**
 * The analyst's page: static files from the client folder only (dist/client, built by vite), through
 * @fastify/static, which refuses paths that leave its root (.., encoded dots, absolute paths) and dotfiles.
 * Only real files under the folder are served: a path whose real location (every symbolic link resolved) differs
 * from its spelled location — a symlink anywhere on the way, e.g. `assets/x -> /etc/passwd` — is answered 404, as if
 * it did not exist. Every response carries the page's Content-Security-Policy (server/security).
 * When the page has not been built, `/` says how to build it instead of failing.
 */
import fastifyStatic from '@fastify/static';
import type { FastifyInstance } from 'fastify';
import { existsSync, lstatSync, realpathSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PAGE_POLICY } from '../security/content-security-policy.js';

const NOT_BUILT_PAGE = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>gridshake</title></head>
<body><h1>gridshake</h1><p>The page has not been built yet. Run <code>npm run build</code>, then start the server
again. The API is available under <code>/api/</code>.</p></body></html>`;

/**
 * True when `pathName` (URL path, already normalized by @fastify/static) names a regular file or a folder inside
 * `realRoot` with no symbolic link on the way: its real path equals its spelled path.
 */
export function isRealEntryUnder(realRoot: string, pathName: string): boolean {
  const spelled = join(realRoot, pathName);
  if (spelled !== realRoot && !spelled.startsWith(`${realRoot}/`)) return false;
  try {
    if (realpathSync(spelled) !== spelled.replace(/\/+$/, '')) return false;
    const stat = lstatSync(spelled);
    return stat.isFile() || stat.isDirectory();
  } catch {
    return false;
  }
}

export async function registerClientStatic(app: FastifyInstance, clientDir: string, pagePolicy: string = PAGE_POLICY): Promise<void> {
  if (!existsSync(join(clientDir, 'index.html'))) {
    app.get('/', async (_request, reply) =>
      reply.type('text/html; charset=utf-8').header('content-security-policy', pagePolicy).send(NOT_BUILT_PAGE),
    );
    return;
  }
  const realRoot = realpathSync(resolve(clientDir));
  await app.register(fastifyStatic, {
    root: realRoot,
    prefix: '/',
    index: ['index.html'],
    dotfiles: 'deny',
    serveDotFiles: false,
    cacheControl: true,
    maxAge: 0,
    allowedPath: (pathName) => isRealEntryUnder(realRoot, pathName),
    setHeaders: (reply) => {
      reply.header('content-security-policy', pagePolicy);
    },
  });
}
