import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { polygonFile } from '../baseline/baseline-fixtures.js';
import { blocks, blocksGeoJson, csv, populationPoints, TOWN } from '../baseline/population-fixtures.js';
import { writeGeoPackage } from '../inputs/geopackage-writer.js';
import type { BaselineInfo, SweepSummary } from '../../shared/contracts.js';
import { baselineComparisonTableData } from '../../shared/charts/size-tables.js';
import { nullStatement } from '../../shared/null-hypothesis.js';
import { canvasColourShare, launchBrowser } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

// The data step's optional "population at risk" upload (issue 15) in headless Chromium against the real server:
// the field picker lists the numeric properties of the chosen GeoJSON polygons, and the stored dataset has the
// baseline with the chosen field; the results name the null and show the area-only and baseline verdicts side by
// side (the report's shared table); control points are a map layer of their own. Needs npm run build.
interface StoredDataset { id: string; name: string; sample?: string | null; baseline?: BaselineInfo }
interface SweepRecord { id: string; status: string; summary?: SweepSummary | null }

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

  /** Runs a small sweep from the plan step and returns its finished record. */
  async function runSmallSweep(): Promise<SweepRecord> {
    await page.fill('#plan-placements', '8');
    await page.fill('#plan-sims', '19');
    await expect.poll(() => page.isDisabled('#start-sweep')).toBe(false);
    const previous = await page.getAttribute('.run-box', 'data-sweep').catch(() => null);
    await page.click('#start-sweep');
    await page.waitForFunction((old) => {
      const box = document.querySelector('.run-box[data-sweep]');
      return box !== null && box.getAttribute('data-sweep') !== old;
    }, previous);
    const sweepId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    await page.waitForSelector(`.run-box[data-sweep="${sweepId}"][data-status=done]`, { timeout: 90_000 });
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${sweepId}`);
    expect(record.status).toBe('done');
    await expect.poll(() => page.innerText('[data-testid=overall-conclusion]').catch(() => '')).toBe(record.summary!.conclusion);
    return record;
  }

  it('results name the null and show the area-only and baseline verdicts side by side', async () => {
    const record = await runSmallSweep();
    const summary = record.summary!;
    const named = await page.innerText('[data-testid=null-tested]');
    expect(named).toBe(nullStatement(summary.baseline));
    expect(named).toContain('clustering beyond the population at risk (baseline: blocks.geojson, field residents)');
    // the same rows as the report's table, built by the same shared code
    const table = baselineComparisonTableData(summary)!;
    const cells = await page.$$eval('[data-testid=baseline-comparison] tbody tr', (rows) => rows.map((row) => [...row.children].map((cell) => cell.textContent ?? '')));
    expect(cells).toEqual(table.rows);
    expect(cells).toHaveLength(summary.sizes.length);
    expect(await page.innerText('[data-testid=baseline-comparison] thead')).toContain('against area: verdict of placements');
    expect(await page.innerText('[data-testid=baseline-comparison-note]')).toBe(table.note);
    // the report shows the same sentence and table
    const report = await (await fetch(`${server.origin}/api/sweeps/${record.id}/report.html`)).text();
    expect(report).toContain(nullStatement(summary.baseline));
    expect(report).toContain('Against area and against the population at risk');
    expect(errors).toEqual([]);
  }, 150_000);

  it('without a baseline the results name complete spatial randomness and show no side-by-side table', async () => {
    const datasets = await getJson<StoredDataset[]>(server, '/api/datasets');
    const demo = datasets.find((dataset) => dataset.sample && dataset.baseline === undefined)!;
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain(demo.name);
    await runSmallSweep();
    const named = await page.innerText('[data-testid=null-tested]');
    expect(named).toBe(nullStatement(undefined));
    expect(named).toContain('clustering beyond complete spatial randomness');
    expect(await page.locator('[data-testid=baseline-comparison]').count()).toBe(0);
    expect(errors).toEqual([]);
  }, 150_000);

  it('draws control points as a layer of their own, with a legend entry, switched on and off', async () => {
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', file('cases.csv', csv(populationPoints(200, 21))));
    await page.setInputFiles('input[name=area]', file('area.geojson', polygonFile([TOWN])));
    await page.selectOption('select[name=crsChoice]', 'planar');
    await page.selectOption('select[name=baselineKind]', 'controls');
    await page.setInputFiles('input[name=baseline]', file('controls.csv', csv(populationPoints(400, 22))));
    await page.fill('input[name=name]', 'Town with controls');
    await page.click('.upload-form button[type=submit]');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain('Town with controls');
    // no choropleth with controls: the only strong colour on the map is the control marks (the cases are ink)
    await expect.poll(() => page.isChecked('#layer-toggle-controls').catch(() => false)).toBe(true);
    expect(await page.innerText('label[for=layer-toggle-controls]')).toContain('Control points (400)');
    expect(await page.locator('#layer-toggle-baseline').count()).toBe(0);
    expect(await page.innerText('#map-legend')).toContain('control point (population at risk)');
    await expect.poll(() => canvasColourShare(page, '#map')).toBeGreaterThan(0.003);
    await page.uncheck('#layer-toggle-controls');
    await expect.poll(() => canvasColourShare(page, '#map')).toBeLessThan(0.0005);
    expect(await page.innerText('#map-legend')).not.toContain('control point');
    // the cases stay drawn and listed on their own
    expect(await page.isChecked('#layer-toggle-points')).toBe(true);
    await page.check('#layer-toggle-controls');
    await expect.poll(() => canvasColourShare(page, '#map')).toBeGreaterThan(0.003);
    expect(errors).toEqual([]);
  }, 120_000);

  it('lists the numeric columns of a GeoPackage layer in the field picker (no typing) and uploads with the chosen one', async () => {
    const { rings, counts } = blocks();
    const gpkg = writeGeoPackage([{
      table: 'blocks',
      geometryType: 'POLYGON',
      geometries: rings.map((ring) => ({ type: 'Polygon', coordinates: [ring] })),
      properties: counts.map((residents, k) => ({ label: `block ${k + 1}`, households: Math.ceil(residents / 2), residents })),
    }]);
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', file('points-gpkg.csv', csv(populationPoints(300, 9))));
    await page.setInputFiles('input[name=area]', file('area.geojson', polygonFile([TOWN])));
    await page.selectOption('select[name=crsChoice]', 'planar');
    await page.selectOption('select[name=baselineKind]', 'polygons');
    const path = join(folder, 'blocks.gpkg');
    writeFileSync(path, gpkg);
    await page.setInputFiles('input[name=baseline]', path);
    await expect.poll(() => page.locator('select[name=baselineField] option').allInnerTexts()).toEqual(['households', 'residents']);
    expect(await page.isDisabled('select[name=baselineField]')).toBe(false);
    expect(await page.locator('input[name=baselineFieldName]').count()).toBe(0);
    await page.selectOption('select[name=baselineField]', 'households');
    await page.fill('input[name=name]', 'Town with households from a GeoPackage');
    await page.click('.upload-form button[type=submit]');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain('Town with households from a GeoPackage');
    const datasets = await getJson<StoredDataset[]>(server, '/api/datasets');
    const households = counts.reduce((sum, residents) => sum + Math.ceil(residents / 2), 0);
    expect(datasets.find((dataset) => dataset.name === 'Town with households from a GeoPackage')?.baseline)
      .toMatchObject({ file: 'blocks.gpkg', field: 'households', totalInside: households });
    // a file that is not a GeoPackage layer: the server's message is shown beside the picker
    await page.click('.upload summary').catch(() => undefined);
    await page.setInputFiles('input[name=baseline]', { name: 'broken.gpkg', mimeType: 'application/octet-stream', buffer: Buffer.from('SQLite format 3\u0000 broken') });
    await expect.poll(() => page.innerText('[data-testid=baseline-field-status]')).toContain('broken.gpkg');
    expect(await page.isDisabled('select[name=baselineField]')).toBe(true);
    expect(errors).toEqual([]);
  }, 120_000);
});
