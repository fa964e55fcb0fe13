/**
 * The page's only network access: the local server's /api (shared/design.md, HTTP API). Errors arrive as
 * { statusCode, code, message } and are thrown as ApiError with that code.
 */
import { UNCODED_RESPONSE, type ErrorCode } from '../../../shared/error-codes.js';
import { decodeTypedFrame, type TypedFrame } from '../../../shared/binary/typed-frame.js';
import type { GridFrameMeta, SurfaceFrameMeta } from '../../../shared/binary/page-frames.js';
import type { DatasetGeometry, ExecutorChoice, HealthInfo, Plan, PlacementRow, StoredDataset, SweepStarted, SweepView } from '../../../shared/contracts.js';

export class ApiError extends Error {
  constructor(readonly code: ErrorCode | typeof UNCODED_RESPONSE, readonly statusCode: number, message: string) {
    super(message);
    this.name = 'ApiError';
  }
}

export type { DatasetGeometry, HealthInfo, StoredDataset, SweepView as SweepRecord } from '../../../shared/contracts.js';

/** A cell as the page's map holds it, rebuilt from the compact grid frame (grid-from-frame.ts). */
export interface GridFeature {
  type: 'Feature';
  /** expected: NaN (the page's frame) or null (GeoJSON) for a left-out cell; stability: the kept cell's flag in this placement */
  properties: { i: number; j: number; count: number; coverage: number; expected: number; kept: boolean; stability?: 'excess' | 'deficit' | 'neither' };
  geometry: { type: 'Polygon'; coordinates: number[][][] };
}

export interface GridCollection {
  type: 'FeatureCollection';
  features: GridFeature[];
  gridshake?: { cellSize: number; u: number; v: number; angle: number; sizeIndex: number; placementIndex: number; alpha?: number };
}

async function failure(response: Response, path: string): Promise<ApiError> {
  let body: { code?: ErrorCode; message?: string } = {};
  try {
    body = (await response.json()) as { code?: ErrorCode; message?: string };
  } catch {
    body = { message: response.statusText };
  }
  return new ApiError(body.code ?? UNCODED_RESPONSE, response.status, body.message ?? `HTTP ${response.status} from ${path}`);
}

async function request<T>(path: string, init?: RequestInit): Promise<T> {
  const response = await fetch(path, { ...init, headers: { accept: 'application/json', ...(init?.headers ?? {}) } });
  if (!response.ok) throw await failure(response, path);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

/** A typed frame (shared/binary/typed-frame.ts) from the server. */
async function frame<Meta>(path: string): Promise<TypedFrame<Meta>> {
  const response = await fetch(path, { headers: { accept: 'application/octet-stream' } });
  if (!response.ok) throw await failure(response, path);
  return decodeTypedFrame<Meta>(await response.arrayBuffer());
}

function jsonBody(value: unknown): RequestInit {
  return { method: 'POST', body: JSON.stringify(value), headers: { 'content-type': 'application/json' } };
}

export const api = {
  health: () => request<HealthInfo>('/api/health'),
  datasets: () => request<StoredDataset[]>('/api/datasets'),
  dataset: (id: string) => request<StoredDataset>(`/api/datasets/${id}`),
  /** the points drawn on the map: up to the server's limit of 1e5 (the map layer decimates on screen) */
  geometry: (id: string) => request<DatasetGeometry>(`/api/datasets/${id}/geometry?maxPoints=100000`),
  upload: (form: FormData) => request<StoredDataset>('/api/datasets', { method: 'POST', body: form }),
  /** the numeric properties of a baseline polygon file read by the server (a GeoPackage layer), for the field picker */
  baselineFields: (file: File) => {
    const form = new FormData();
    form.append('baseline', file, file.name);
    return request<{ fields: string[] }>('/api/datasets/baseline-fields', { method: 'POST', body: form });
  },
  /** `executor` absent: the server's default */
  startSweep: (datasetId: string, plan: Plan, executor?: ExecutorChoice) =>
    request<SweepStarted>('/api/sweeps', jsonBody(executor === undefined ? { datasetId, plan } : { datasetId, plan, executor })),
  sweeps: (datasetId: string) => request<SweepView[]>(`/api/sweeps?datasetId=${datasetId}`),
  sweep: (id: string) => request<SweepView>(`/api/sweeps/${id}`),
  deleteDataset: (id: string) => request<void>(`/api/datasets/${id}`, { method: 'DELETE' }),
  deleteSweep: (id: string) => request<void>(`/api/sweeps/${id}`, { method: 'DELETE' }),
  cancelSweep: (id: string) => request<SweepView>(`/api/sweeps/${id}/cancel`, { method: 'POST' }),
  placements: (id: string) => request<PlacementRow[]>(`/api/sweeps/${id}/placements.json`),
  /** the placement's grid as typed arrays and lattice parameters (the page builds the polygons) */
  gridFrame: (id: string, size: number, placement: number) => frame<GridFrameMeta>(`/api/sweeps/${id}/grid-frame?size=${size}&placement=${placement}`),
  /** the stability surface of one cell size: the bands of stability-<side>m.tif as float32 */
  stabilitySurface: async (id: string, size: number) => {
    const { meta, arrays } = await frame<SurfaceFrameMeta>(`/api/sweeps/${id}/stability-surface?size=${size}`);
    return { meta, excess: arrays.excess as Float32Array, deficit: arrays.deficit as Float32Array };
  },
};

/** URLs for the downloads (same origin, so the browser saves them directly). */
export const downloads = {
  placementsCsv: (id: string) => `/api/sweeps/${id}/placements.csv`,
  report: (id: string) => `/api/sweeps/${id}/report.html?download=1`,
  /** longitude/latitude (RFC 7946) where the coordinate system is known, for a GIS */
  grid: (id: string, size: number, placement: number) => `/api/sweeps/${id}/grid.geojson?size=${size}&placement=${placement}`,
  gridGeoPackage: (id: string, size: number, placement: number) => `/api/sweeps/${id}/grid.gpkg?size=${size}&placement=${placement}`,
};
