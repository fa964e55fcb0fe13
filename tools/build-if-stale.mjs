#!/usr/bin/env node
// Builds only when a source is newer than the last build, so `npm ci && npm start` (or `npm test`) builds once:
// `prepare` builds during `npm ci`, and `start`/`test` then find dist up to date.
//   node tools/build-if-stale.mjs          build (npm run build) when stale, else say it is up to date
//   node tools/build-if-stale.mjs --stamp  record that a build just finished (the last step of npm run build)
import { execSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const stamp = join(root, 'dist', '.build-stamp');
const SOURCES = ['server', 'workers', 'shared', 'client', 'test/bench', 'bin', 'package.json', 'package-lock.json', 'tsconfig.json', 'tsconfig.test.json'];

function newestSource(path) {
  if (!existsSync(path)) return 0;
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  let newest = stats.mtimeMs;
  for (const entry of readdirSync(path)) {
    if (entry === 'node_modules' || entry === 'dist' || entry.startsWith('.')) continue;
    newest = Math.max(newest, newestSource(join(path, entry)));
  }
  return newest;
}

if (process.argv.includes('--stamp')) {
  mkdirSync(dirname(stamp), { recursive: true });
  writeFileSync(stamp, `${new Date().toISOString()}\n`);
} else {
  const built = existsSync(stamp) ? statSync(stamp).mtimeMs : 0;
  const newest = Math.max(...SOURCES.map((source) => newestSource(join(root, source))));
  // on stderr, build output included: `npm run -s bench -- --json` keeps stdout for the JSON object alone
  if (built > newest) {
    console.error('gridshake: the build in dist/ is up to date');
  } else {
    execSync('npm run build', { cwd: root, stdio: [0, 2, 2] });
  }
}
