/**
 * The page's only network access: the local server's /api (shared/design.md, HTTP API). Errors arrive as
 * { statusCode, code, message } and are thrown as ApiError with that code.
 */
import { UNCODED_RESPONSE, type ErrorCode } from '../../../shared/error-codes.js';
import type { DatasetGeometry, GridCollection, HealthInfo, Plan, PlacementRow, StoredDataset, SweepStarted, SweepView } from '../../../shared/contracts.js';

export class ApiError extends Error {
  constructor(readonly code: ErrorCode | typeof UNCODED_RESPONSE, readonly statusCode: number, message: string) {
    super(message);
    this.name = 'ApiError';
  }
}

export type { DatasetGeometry, GridCollection, GridFeature, HealthInfo, StoredDataset, SweepView as SweepRecord } from '../../../shared/contracts.js';

async function request<T>(path: string, init?: RequestInit): Promise<T> {
  const response = await fetch(path, { ...init, headers: { accept: 'application/json', ...(init?.headers ?? {}) } });
  if (!response.ok) {
    let body: { code?: ErrorCode; message?: string } = {};
    try {
      body = (await response.json()) as { code?: ErrorCode; message?: string };
    } catch {
      body = { message: response.statusText };
    }
    throw new ApiError(body.code ?? UNCODED_RESPONSE, response.status, body.message ?? `HTTP ${response.status} from ${path}`);
  }
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
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
  startSweep: (datasetId: string, plan: Plan) =>
    request<SweepStarted>('/api/sweeps', jsonBody({ datasetId, plan })),
  sweeps: (datasetId: string) => request<SweepView[]>(`/api/sweeps?datasetId=${datasetId}`),
  sweep: (id: string) => request<SweepView>(`/api/sweeps/${id}`),
  deleteDataset: (id: string) => request<void>(`/api/datasets/${id}`, { method: 'DELETE' }),
  deleteSweep: (id: string) => request<void>(`/api/sweeps/${id}`, { method: 'DELETE' }),
  cancelSweep: (id: string) => request<SweepView>(`/api/sweeps/${id}/cancel`, { method: 'POST' }),
  placements: (id: string) => request<PlacementRow[]>(`/api/sweeps/${id}/placements.json`),
  grid: (id: string, size: number, placement: number) =>
    request<GridCollection>(`/api/sweeps/${id}/grid.geojson?size=${size}&placement=${placement}&coordinates=planar`),
};

/** URLs for the downloads (same origin, so the browser saves them directly). */
export const downloads = {
  placementsCsv: (id: string) => `/api/sweeps/${id}/placements.csv`,
  report: (id: string) => `/api/sweeps/${id}/report.html?download=1`,
  /** longitude/latitude (RFC 7946) where the coordinate system is known, for a GIS */
  grid: (id: string, size: number, placement: number) => `/api/sweeps/${id}/grid.geojson?size=${size}&placement=${placement}`,
  gridGeoPackage: (id: string, size: number, placement: number) => `/api/sweeps/${id}/grid.gpkg?size=${size}&placement=${placement}`,
};
