/**
 * Headless Chromium for the browser tests: the Debian `chromium` driven by playwright-core. A missing browser is a
 * failure (CI installs it), never a skip.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';

export const ARTIFACTS = 'test-artifacts';

export function chromiumPath(): string {
  const candidates = [process.env.CHROMIUM_PATH, '/usr/bin/chromium', '/usr/bin/chromium-browser'].filter(
    (candidate): candidate is string => Boolean(candidate),
  );
  for (const candidate of candidates) if (existsSync(candidate)) return candidate;
  try {
    return execFileSync('sh', ['-c', 'command -v chromium'], { encoding: 'utf8' }).trim();
  } catch {
    throw new Error('chromium is not installed: the browser tests need the Debian chromium package (apt-get install chromium)');
  }
}

export async function launchBrowser(): Promise<Browser> {
  mkdirSync(ARTIFACTS, { recursive: true });
  return chromium.launch({
    executablePath: chromiumPath(),
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
}

/** Share of pixels of a canvas that are neither transparent nor white: > 0 means something was drawn. */
export async function canvasInk(page: Page, selector: string): Promise<number> {
  return page.$eval(selector, (element) => {
    const canvas = element as HTMLCanvasElement;
    const context = canvas.getContext('2d');
    if (!context || canvas.width === 0 || canvas.height === 0) return 0;
    const { data } = context.getImageData(0, 0, canvas.width, canvas.height);
    let inked = 0;
    for (let offset = 0; offset < data.length; offset += 4) {
      const white = data[offset] > 245 && data[offset + 1] > 245 && data[offset + 2] > 245;
      if (data[offset + 3] > 0 && !white) inked += 1;
    }
    return inked / (data.length / 4);
  });
}

/** Records every request a page makes that does not go to `allowedOrigin` (or is not a data:/blob: URL). */
export function watchForeignRequests(page: Page, allowedOrigin: string | null): string[] {
  const foreign: string[] = [];
  page.on('request', (request) => {
    const url = request.url();
    if (url.startsWith('data:') || url.startsWith('blob:') || url === 'about:blank') return;
    if (allowedOrigin !== null && url.startsWith(allowedOrigin)) return;
    foreign.push(url);
  });
  return foreign;
}

/** Share of a canvas's pixels with a strong colour (max - min channel > 60): grid shading, not grey or black ink. */
export async function canvasColourShare(page: Page, selector: string): Promise<number> {
  return page.$eval(selector, (element) => {
    const canvas = element as HTMLCanvasElement;
    const context = canvas.getContext('2d');
    if (!context || canvas.width === 0 || canvas.height === 0) return 0;
    const { data } = context.getImageData(0, 0, canvas.width, canvas.height);
    let coloured = 0;
    for (let offset = 0; offset < data.length; offset += 4) {
      const high = Math.max(data[offset], data[offset + 1], data[offset + 2]);
      const low = Math.min(data[offset], data[offset + 1], data[offset + 2]);
      if (data[offset + 3] > 0 && high - low > 60) coloured += 1;
    }
    return coloured / (data.length / 4);
  });
}
