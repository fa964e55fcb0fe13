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

/**
 * Pixel shares of what `selector` shows: a canvas itself, or, for a container such as the map (a stack of layer
 * canvases), its canvases composited by their on-screen boxes in document order. `ink`: neither transparent nor
 * white; `colour`: a strong colour (max - min channel > 60), e.g. grid shading rather than grey or black ink;
 * `dark`: every channel below 80 (black ink such as points).
 */
export async function canvasShares(page: Page, selector: string): Promise<{ ink: number; colour: number; dark: number }> {
  return page.$eval(selector, (element) => {
    let pixels: Uint8ClampedArray | null = null;
    if (element instanceof HTMLCanvasElement) {
      const context = element.getContext('2d');
      if (context && element.width > 0 && element.height > 0) pixels = context.getImageData(0, 0, element.width, element.height).data;
    } else {
      const box = element.getBoundingClientRect();
      const ratio = window.devicePixelRatio || 1;
      const out = document.createElement('canvas');
      out.width = Math.max(1, Math.round(box.width * ratio));
      out.height = Math.max(1, Math.round(box.height * ratio));
      const context = out.getContext('2d')!;
      for (const canvas of Array.from(element.querySelectorAll('canvas'))) {
        const inner = canvas.getBoundingClientRect();
        if (canvas.width === 0 || canvas.height === 0 || inner.width === 0) continue;
        context.drawImage(canvas, (inner.left - box.left) * ratio, (inner.top - box.top) * ratio, inner.width * ratio, inner.height * ratio);
      }
      pixels = context.getImageData(0, 0, out.width, out.height).data;
    }
    if (!pixels) return { ink: 0, colour: 0, dark: 0 };
    let inked = 0;
    let coloured = 0;
    let dark = 0;
    for (let offset = 0; offset < pixels.length; offset += 4) {
      if (pixels[offset + 3] === 0) continue;
      if (pixels[offset] < 80 && pixels[offset + 1] < 80 && pixels[offset + 2] < 80) dark += 1;
      const high = Math.max(pixels[offset], pixels[offset + 1], pixels[offset + 2]);
      const low = Math.min(pixels[offset], pixels[offset + 1], pixels[offset + 2]);
      if (!(pixels[offset] > 245 && pixels[offset + 1] > 245 && pixels[offset + 2] > 245)) inked += 1;
      if (high - low > 60) coloured += 1;
    }
    const total = pixels.length / 4;
    return { ink: inked / total, colour: coloured / total, dark: dark / total };
  });
}

/** Share of pixels of a canvas (or of a container's canvases) that are neither transparent nor white: > 0 means something was drawn. */
export async function canvasInk(page: Page, selector: string): Promise<number> {
  return (await canvasShares(page, selector)).ink;
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

/** Share of a canvas's (or a container's canvases') pixels with a strong colour: grid shading, not grey or black ink. */
export async function canvasColourShare(page: Page, selector: string): Promise<number> {
  return (await canvasShares(page, selector)).colour;
}
