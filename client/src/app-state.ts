/**
 * The page's state, shared by the panels: the chosen dataset and its geometry, the sweep, its summary and rows,
 * the cell size chosen for the detail charts and the placement shown on the map. Panels subscribe to changes.
 */
import type { PlacementRow, SweepSummary } from '../../shared/contracts.js';
import type { DatasetGeometry, GridCollection, HealthInfo, StoredDataset } from './api/api-client.js';

export interface AppState {
  health: HealthInfo | null;
  dataset: StoredDataset | null;
  geometry: DatasetGeometry | null;
  sweepId: string | null;
  summary: SweepSummary | null;
  rows: PlacementRow[];
  sizeIndex: number | null;
  placement: { sizeIndex: number; placementIndex: number; grid: GridCollection } | null;
}

export type StateKey = keyof AppState;
type Listener = (state: AppState, changed: ReadonlySet<StateKey>) => void;

export class Store {
  readonly state: AppState = {
    health: null,
    dataset: null,
    geometry: null,
    sweepId: null,
    summary: null,
    rows: [],
    sizeIndex: null,
    placement: null,
  };
  private readonly listeners: Listener[] = [];

  subscribe(listener: Listener): void {
    this.listeners.push(listener);
  }

  update(patch: Partial<AppState>): void {
    Object.assign(this.state, patch);
    const changed = new Set(Object.keys(patch) as StateKey[]);
    for (const listener of this.listeners) listener(this.state, changed);
  }
}
