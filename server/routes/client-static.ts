/**
 * The analyst's page: static files from the client folder only (dist/client, built by vite), through
 * @fastify/static, which refuses paths that leave its root (.., encoded dots, absolute paths) and dotfiles.
 * When the page has not been built, `/` says how to build it instead of failing.
 */
import fastifyStatic from '@fastify/static';
import type { FastifyInstance } from 'fastify';
import { existsSync } from 'node:fs';
import { join } from 'node:path';

const NOT_BUILT_PAGE = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>gridshake</title></head>
<body><h1>gridshake</h1><p>The page has not been built yet. Run <code>npm run build</code>, then start the server
again. The API is available under <code>/api/</code>.</p></body></html>`;

export async function registerClientStatic(app: FastifyInstance, clientDir: string): Promise<void> {
  if (!existsSync(join(clientDir, 'index.html'))) {
    app.get('/', async (_request, reply) => reply.type('text/html; charset=utf-8').send(NOT_BUILT_PAGE));
    return;
  }
  await app.register(fastifyStatic, {
    root: clientDir,
    prefix: '/',
    index: ['index.html'],
    dotfiles: 'deny',
    serveDotFiles: false,
    cacheControl: true,
    maxAge: 0,
  });
}
