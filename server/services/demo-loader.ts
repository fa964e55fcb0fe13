/**
 * Loads the invented demo scenarios of samples/ (listed in samples/scenarios.json) into an empty store and queues
 * one small demo sweep for each, so that a newcomer sees data and results at once.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Plan } from '../../shared/contracts.js';
import type { DatasetService } from './dataset-service.js';
import type { SweepService } from './sweep-service.js';

export interface ScenarioEntry {
  folder: string;
  name: string;
  crs: string;
  points: number;
  demoPlan: Partial<Plan>;
}

export interface LoadedScenario {
  folder: string;
  datasetId: string;
  sweepId: string | null;
}

function sampleFile(folder: string, name: string): { name: string; path: string } {
  return { name, path: join(folder, name) };
}

export function readScenarioIndex(samplesDir: string): ScenarioEntry[] {
  const indexFile = join(samplesDir, 'scenarios.json');
  if (!existsSync(indexFile)) return [];
  return JSON.parse(readFileSync(indexFile, 'utf8')) as ScenarioEntry[];
}

/** Load every scenario (parsed in the upload parser's worker thread); with `sweeps` false only the datasets are stored. */
export async function loadDemoScenarios(
  services: { datasets: DatasetService; sweeps: SweepService },
  samplesDir: string,
  options: { sweeps?: boolean } = {},
): Promise<LoadedScenario[]> {
  const loaded: LoadedScenario[] = [];
  for (const entry of readScenarioIndex(samplesDir)) {
    const folder = join(samplesDir, entry.folder);
    const summary = await services.datasets.createFromUpload(
      {
        points: sampleFile(folder, 'points.csv'),
        area: sampleFile(folder, 'area.geojson'),
        noData: existsSync(join(folder, 'no-data.geojson')) ? [sampleFile(folder, 'no-data.geojson')] : [],
      },
      { crs: entry.crs, name: entry.name },
      entry.folder,
    );
    const sweepId = options.sweeps === false ? null : services.sweeps.start(summary.id, entry.demoPlan).id;
    loaded.push({ folder: entry.folder, datasetId: summary.id, sweepId });
  }
  return loaded;
}
