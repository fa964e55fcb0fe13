import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { polygonFile } from '../baseline/baseline-fixtures.js';
import { blocksGeoJson, csv, populationPoints, TOWN } from '../baseline/population-fixtures.js';
import { canvasColourShare, launchBrowser } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

// The data step's optional "population at risk" upload (issue 15) in headless Chromium against the real server:
// the field picker lists the numeric properties of the chosen GeoJSON polygons, and the stored dataset has the
// baseline with the chosen field. Needs npm run build (server and page).
describe('population at risk upload in Chromium', () => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-baseline-page-'));
  const file = (name: string, content: string): string => {
    const path = join(folder, name);
    writeFileSync(path, content);
    return path;
  };

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    page = await (await browser.newContext({ viewport: { width: 1280, height: 800 } })).newPage();
    page.on('pageerror', (error) => errors.push(error.message));
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('lists numeric properties and uploads polygons with the chosen field', async () => {
    await page.goto(`${server.origin}/`);
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', file('points.csv', csv(populationPoints(300, 9))));
    await page.setInputFiles('input[name=area]', file('area.geojson', polygonFile([TOWN])));
    await page.selectOption('select[name=crsChoice]', 'planar');
    await page.selectOption('select[name=baselineKind]', 'polygons');
    const blocks = JSON.parse(blocksGeoJson());
    for (const feature of blocks.features) feature.properties = { label: 'block', households: Math.ceil(feature.properties.residents / 2), residents: feature.properties.residents };
    await page.setInputFiles('input[name=baseline]', file('blocks.geojson', JSON.stringify(blocks)));
    await expect.poll(() => page.locator('select[name=baselineField] option').allInnerTexts()).toEqual(['households', 'residents']);
    await page.selectOption('select[name=baselineField]', 'residents');
    await page.fill('input[name=name]', 'Town with residents');
    await page.click('.upload-form button[type=submit]');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain('Town with residents');
    const datasets = await getJson<{ name: string; baseline?: { field: string; totalInside: number } }[]>(server, '/api/datasets');
    const uploaded = datasets.find((dataset) => dataset.name === 'Town with residents');
    expect(uploaded?.baseline).toMatchObject({ field: 'residents', totalInside: 3645 });
    // the map shows the population at risk as a choropleth under the points (no grid is chosen yet, so any strong
    // colour on the map is the choropleth: the study area, the points and the zones are grey or black)
    await expect.poll(() => canvasColourShare(page, '#map')).toBeGreaterThan(0.05);
    // it is a layer of the map's list and legend: switched off, the strong colour goes
    expect(await page.isChecked('#layer-toggle-baseline')).toBe(true);
    expect(await page.innerText('#map-legend')).toContain('population at risk per km²');
    await page.uncheck('#layer-toggle-baseline');
    await expect.poll(() => canvasColourShare(page, '#map')).toBeLessThan(0.01);
    expect(await page.innerText('#map-legend')).not.toContain('population at risk');
    await page.check('#layer-toggle-baseline');
    await expect.poll(() => canvasColourShare(page, '#map')).toBeGreaterThan(0.05);
    expect(errors).toEqual([]);
  }, 120_000);
});
