/**
 * The page's map, on OpenLayers: the dataset's working coordinates in their own projection (map-projection.ts), no
 * tile source (nothing is fetched), pan and zoom by mouse, touch or keyboard (arrow keys, + and -), a scale bar, and a
 * list of layers the user can switch on and off. Fixed layers: study area, grid of the chosen placement, no-data
 * zones, points. Optional layers (a baseline, a stability surface, areas of excess) are added with setOptionalLayer
 * when their data exist and appear in the same list.
 */
import OlMap from 'ol/Map.js';
import View from 'ol/View.js';
import Feature from 'ol/Feature.js';
import Polygon from 'ol/geom/Polygon.js';
import VectorLayer from 'ol/layer/Vector.js';
import VectorSource from 'ol/source/Vector.js';
import type BaseLayer from 'ol/layer/Base.js';
import { Fill, Stroke, Style } from 'ol/style.js';
import { defaults as defaultControls } from 'ol/control/defaults.js';
import ScaleLine from 'ol/control/ScaleLine.js';
import Control from 'ol/control/Control.js';
import { defaults as defaultInteractions } from 'ol/interaction/defaults.js';
import DragPan from 'ol/interaction/DragPan.js';
import type { Extent } from 'ol/extent.js';
import type { DatasetGeometry, GridCollection, GridFeature, StoredDataset } from '../api/api-client.js';
import { NEUTRAL, OKABE_ITO } from '../../../shared/charts/palette.js';
import { packCells, type PackedCells } from './cell-index.js';
import { CellsLayer } from './cells-layer.js';
import { hatchPattern } from './hatch-pattern.js';
import { composeMapImage, type ExportText } from './map-export.js';
import type { LegendItem } from './map-legend.js';
import { metresPerPixel, workingProjection, type WorkingProjection } from './map-projection.js';
import { PointsLayer } from './points-layer.js';

export const STUDY_AREA_FILL = '#eef3f7';

export interface MapLayerEntry {
  id: string;
  label: string;
  layer: BaseLayer;
  /** legend entries shown while the layer is on */
  legend: () => LegendItem[];
  /** the heading of the switches' group when not the main list (the stability layers of the chosen cell size) */
  group?: string;
}

type Listener = () => void;

function polygonLayer(polygons: number[][][][], style: Style, zIndex: number, title: string): VectorLayer {
  const source = new VectorSource({ features: polygons.map((rings) => new Feature(new Polygon(rings))) });
  const layer = new VectorLayer({ source, style, zIndex, updateWhileAnimating: true, updateWhileInteracting: true });
  layer.set('title', title);
  return layer;
}

export class GridshakeMap {
  readonly map: OlMap;
  private readonly points = new PointsLayer();
  private readonly cells = new CellsLayer();
  private studyArea: VectorLayer | null = null;
  private noData: VectorLayer | null = null;
  private readonly fixed: MapLayerEntry[];
  private readonly optional: MapLayerEntry[] = [];
  private readonly listeners: Listener[] = [];
  private packed: PackedCells | null = null;
  private working: WorkingProjection | null = null;
  private dataExtent: Extent | null = null;
  /** milliseconds the last frame took to draw (all layers) */
  lastFrameMs = 0;

  constructor(private readonly target: HTMLElement) {
    const fitButton = document.createElement('button');
    fitButton.type = 'button';
    fitButton.textContent = '⤢';
    fitButton.title = 'Fit the data in the view';
    fitButton.setAttribute('aria-label', 'Fit the data in the view');
    fitButton.addEventListener('click', () => this.fit());
    const fitElement = document.createElement('div');
    fitElement.className = 'ol-zoom-extent ol-unselectable ol-control';
    fitElement.append(fitButton);
    this.map = new OlMap({
      target,
      layers: [this.cells.layer, this.points.layer],
      controls: defaultControls({ attribution: false, rotate: false }).extend([
        new ScaleLine({ units: 'metric', bar: true, steps: 4, text: false, minWidth: 90 }),
        new Control({ element: fitElement }),
      ]),
      // no kinetic glide after a drag: the view stops where the pointer let go
      interactions: defaultInteractions({ altShiftDragRotate: false, pinchRotate: false, dragPan: false }).extend([new DragPan()]),
      keyboardEventTarget: target,
    });
    const zoneFill = hatchPattern(document.createElement('canvas').getContext('2d')!, NEUTRAL.grey, 7, 'rgba(255,255,255,0.85)');
    this.fixed = [
      { id: 'points', label: 'Points', layer: this.points.layer, legend: () => [{ kind: 'point', colour: NEUTRAL.ink, label: 'point' }, { kind: 'point', colour: OKABE_ITO.reddishPurple, hollow: true, label: 'point outside (not counted)' }] },
      { id: 'study-area', label: 'Study area', layer: this.placeholderLayer('study-area'), legend: () => [{ kind: 'fill', colour: STUDY_AREA_FILL, outline: NEUTRAL.ink, label: 'study area' }] },
      { id: 'no-data', label: 'No-data zones', layer: this.placeholderLayer('no-data'), legend: () => [{ kind: 'hatch', colour: NEUTRAL.grey, label: 'no-data zone' }] },
      {
        id: 'grid',
        label: 'Grid of the chosen placement',
        layer: this.cells.layer,
        legend: () => this.packed
          ? [{ kind: 'ramp', low: '0', high: String(this.packed.maxKeptCount), label: 'count' }, { kind: 'hatch', colour: OKABE_ITO.vermillion, label: 'cell left out (coverage below minCoverage)' }]
          : [],
      },
    ];
    this.zoneStyle = new Style({ fill: new Fill({ color: zoneFill }), stroke: new Stroke({ color: NEUTRAL.grey, width: 1 }) });
    let started = 0;
    this.map.on('precompose', () => { started = performance.now(); });
    this.map.on('postcompose', () => { this.lastFrameMs = performance.now() - started; });
  }

  private readonly zoneStyle: Style;
  private readonly studyStyle = new Style({ fill: new Fill({ color: STUDY_AREA_FILL }), stroke: new Stroke({ color: NEUTRAL.ink, width: 1.5 }) });

  /** An empty layer standing in until a dataset gives the polygons (keeps the layer list stable). */
  private placeholderLayer(title: string): VectorLayer {
    const layer = new VectorLayer({ source: new VectorSource() });
    layer.set('title', title);
    return layer;
  }

  /** Every layer in the list: the fixed ones, then the optional ones with data. */
  layers(): readonly MapLayerEntry[] {
    return [...this.fixed, ...this.optional];
  }

  onLayersChange(listener: Listener): void {
    this.listeners.push(listener);
  }

  private notify(): void {
    for (const listener of this.listeners) listener();
  }

  setVisible(id: string, visible: boolean): void {
    const entry = this.layers().find((candidate) => candidate.id === id);
    if (!entry) return;
    entry.layer.setVisible(visible);
    if (id === 'grid') this.points.setOverGrid(this.packed !== null && visible);
    this.notify();
  }

  /** Adds or replaces an optional layer (baseline, stability surface, areas): it joins the list and the legend. */
  setOptionalLayer(entry: MapLayerEntry): void {
    this.removeOptionalLayer(entry.id);
    this.optional.push(entry);
    if (entry.layer.getZIndex() === undefined) entry.layer.setZIndex(25);
    this.map.addLayer(entry.layer);
    this.notify();
  }

  removeOptionalLayer(id: string): void {
    const index = this.optional.findIndex((candidate) => candidate.id === id);
    if (index < 0) return;
    this.map.removeLayer(this.optional[index].layer);
    this.optional.splice(index, 1);
    this.notify();
  }

  /** Legend entries of the layers that are on. */
  legend(): LegendItem[] {
    return this.layers().filter((entry) => entry.layer.getVisible()).flatMap((entry) => entry.legend());
  }

  /** The working projection of the dataset shown (null before one is shown). */
  projection(): WorkingProjection | null {
    return this.working;
  }

  showDataset(geometry: DatasetGeometry | null, dataset: StoredDataset | null): void {
    this.setGrid(null);
    for (const layer of [this.studyArea, this.noData]) if (layer) this.map.removeLayer(layer);
    this.studyArea = null;
    this.noData = null;
    if (!geometry) {
      this.points.setData(null);
      this.dataExtent = null;
      this.notify();
      return;
    }
    this.working = workingProjection(dataset?.projection);
    const visible = (id: string) => this.fixed.find((entry) => entry.id === id)!.layer.getVisible();
    this.studyArea = polygonLayer(geometry.studyArea, this.studyStyle, 10, 'study-area');
    this.noData = polygonLayer(geometry.noDataZones, this.zoneStyle, 30, 'no-data');
    this.studyArea.setVisible(visible('study-area'));
    this.noData.setVisible(visible('no-data'));
    this.fixed.find((entry) => entry.id === 'study-area')!.layer = this.studyArea;
    this.fixed.find((entry) => entry.id === 'no-data')!.layer = this.noData;
    this.map.addLayer(this.studyArea);
    this.map.addLayer(this.noData);
    this.points.setData({ xy: Float64Array.from(geometry.points), inside: Uint8Array.from(geometry.pointInside) });
    const { minX, minY, maxX, maxY } = geometry.bbox;
    const span = Math.max(maxX - minX, maxY - minY, 1);
    this.dataExtent = [minX, minY, Math.max(maxX, minX + 1), Math.max(maxY, minY + 1)];
    const view = new View({
      projection: this.working.projection,
      maxResolution: (span * 4) / 256,
      minResolution: span / 2e6,
      constrainResolution: false,
      extent: [minX - 2 * span, minY - 2 * span, maxX + 2 * span, maxY + 2 * span],
    });
    this.map.setView(view);
    this.fit();
    this.notify();
  }

  /** Fits the data (and the grid, when shown) in the view. */
  fit(): void {
    const extent = this.packed && this.dataExtent
      ? [Math.min(this.dataExtent[0], this.packed.extent[0]), Math.min(this.dataExtent[1], this.packed.extent[1]), Math.max(this.dataExtent[2], this.packed.extent[2]), Math.max(this.dataExtent[3], this.packed.extent[3])]
      : this.dataExtent;
    if (!extent || !this.map.getSize()) return;
    this.map.getView().fit(extent, { padding: [14, 14, 14, 14] });
  }

  setGrid(grid: GridCollection | null): void {
    this.packed = grid ? packCells(grid) : null;
    this.cells.setCells(this.packed);
    this.points.setOverGrid(grid !== null && this.cells.layer.getVisible());
    this.notify();
  }

  /** Largest count among the grid's kept cells. */
  maxCount(): number {
    return this.packed?.maxKeptCount ?? 0;
  }

  /** The cell under a map coordinate, or null; highlights it. */
  cellAt(coordinate: number[] | null): GridFeature | null {
    const index = this.packed && coordinate && this.cells.layer.getVisible() ? this.packed.pick(coordinate[0], coordinate[1]) : -1;
    this.cells.highlight(index);
    return index >= 0 ? this.packed!.features[index] : null;
  }

  /** Ground metres per CSS pixel at the view's centre. */
  metresPerPixel(): number {
    const view = this.map.getView();
    const centre = view.getCenter();
    const resolution = view.getResolution();
    if (!centre || resolution === undefined || !this.working) return Number.NaN;
    return metresPerPixel(this.working.projection, resolution, centre);
  }

  /** The current view as PNG bytes, drawn after the next complete render. */
  exportPng(text: ExportText): Promise<Blob> {
    return new Promise((resolve, reject) => {
      this.map.once('rendercomplete', () => {
        try {
          const canvas = composeMapImage(this.map, this.metresPerPixel(), this.legend(), text);
          canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('the browser could not encode the map as PNG'))), 'image/png');
        } catch (error) {
          reject(error instanceof Error ? error : new Error(String(error)));
        }
      });
      this.map.render();
    });
  }

  /** Cells and points drawn in the last frame (after culling and decimation). */
  drawnCounts(): { cells: number; points: number } {
    return { cells: this.cells.lastDrawn, points: this.points.lastDrawn };
  }

  get element(): HTMLElement {
    return this.target;
  }
}
