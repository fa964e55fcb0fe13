/** The chart.js UMD bundle, read once from node_modules, for inlining into the offline report. */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

let cached: string | null = null;

/** Source text of chart.js's minified UMD build (dist/chart.umd.min.js), with any "</script" defused. */
export function chartLibrarySource(): string {
  if (cached === null) {
    const require = createRequire(import.meta.url);
    const distFolder = dirname(require.resolve('chart.js'));
    const source = readFileSync(join(distFolder, 'chart.umd.min.js'), 'utf8');
    cached = source.replace(/<\/script/gi, '<\\/script').replace(/\/\/# sourceMappingURL=\S+/g, '');
  }
  return cached;
}
