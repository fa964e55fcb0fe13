import { defineConfig } from 'vite';
import { fileURLToPath } from 'node:url';

// The analyst's page: built into dist/client and served by the local server. No CDN: chart.js is bundled.
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  base: './',
  build: {
    outDir: fileURLToPath(new URL('../dist/client', import.meta.url)),
    emptyOutDir: true,
    sourcemap: true,
  },
});
