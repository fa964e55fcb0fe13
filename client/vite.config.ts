import { defineConfig, type Plugin } from 'vite';
import { rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const outDir = fileURLToPath(new URL('../dist/client', import.meta.url));

/**
 * tsc emits the chart modules shared with the server's report into dist/client/src/ (the server imports them), so
 * the page build must not empty dist/client: it removes only its own earlier output (assets/, index.html).
 */
function cleanOwnOutput(): Plugin {
  return {
    name: 'gridshake-clean-page-output',
    apply: 'build',
    buildStart() {
      rmSync(fileURLToPath(new URL('../dist/client/assets', import.meta.url)), { recursive: true, force: true });
      rmSync(fileURLToPath(new URL('../dist/client/index.html', import.meta.url)), { force: true });
    },
  };
}

// The analyst's page: built into dist/client and served by the local server. No CDN: chart.js and the map library
// (OpenLayers) are bundled, which puts the one chunk near 700 kB.
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  base: './',
  plugins: [cleanOwnOutput()],
  build: {
    outDir,
    emptyOutDir: false,
    sourcemap: true,
    chunkSizeWarningLimit: 760,
  },
});
