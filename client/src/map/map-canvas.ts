/**
 * The map: study area, no-data zones (hatched), points (decimated by the server for large sets) and, once a
 * placement is chosen, its grid: kept cells shaded by count, left-out cells hatched.
 */
import type { DatasetGeometry, GridCollection } from '../api/api-client.js';
import { NEUTRAL, OKABE_ITO, sequentialColour, withAlpha } from '../charts/palette.js';
import { hatchPattern } from './hatch-pattern.js';
import { fitTransform, ringsBox, unionBox, type MapTransform } from './map-transform.js';

const PADDING = 14;

export class MapCanvas {
  private geometry: DatasetGeometry | null = null;
  private grid: GridCollection | null = null;

  constructor(private readonly canvas: HTMLCanvasElement) {
    new ResizeObserver(() => this.draw()).observe(canvas);
  }

  showDataset(geometry: DatasetGeometry | null): void {
    this.geometry = geometry;
    this.grid = null;
    this.draw();
  }

  showGrid(grid: GridCollection | null): void {
    this.grid = grid;
    this.draw();
  }

  /** Largest count among the grid's kept cells (for the legend). */
  maxCount(): number {
    return Math.max(0, ...(this.grid?.features ?? []).filter((cell) => cell.properties.kept).map((cell) => cell.properties.count));
  }

  draw(): void {
    const ratio = window.devicePixelRatio || 1;
    const width = this.canvas.clientWidth;
    const height = this.canvas.clientHeight;
    if (width === 0 || height === 0) return;
    this.canvas.width = Math.round(width * ratio);
    this.canvas.height = Math.round(height * ratio);
    const context = this.canvas.getContext('2d');
    if (!context) return;
    context.setTransform(ratio, 0, 0, ratio, 0, 0);
    context.fillStyle = NEUTRAL.paper;
    context.fillRect(0, 0, width, height);
    const geometry = this.geometry;
    if (!geometry) return;
    const gridRings = (this.grid?.features ?? []).map((cell) => cell.geometry.coordinates[0]);
    const box = unionBox(
      { minX: geometry.bbox.minX, minY: geometry.bbox.minY, maxX: geometry.bbox.maxX, maxY: geometry.bbox.maxY },
      ringsBox(gridRings),
    )!;
    const transform = fitTransform(box, width, height, PADDING);
    this.drawPolygons(context, transform, geometry.studyArea, '#eef3f7', NEUTRAL.ink, 1.5);
    this.drawBaseline(context, transform, geometry);
    this.drawGrid(context, transform);
    const zoneHatch = hatchPattern(context, NEUTRAL.grey, 7, 'rgba(255,255,255,0.85)');
    this.drawPolygons(context, transform, geometry.noDataZones, zoneHatch, NEUTRAL.grey, 1);
    this.drawPoints(context, transform, geometry);
  }

  private tracePolygon(context: CanvasRenderingContext2D, transform: MapTransform, rings: number[][][]): void {
    for (const ring of rings) {
      ring.forEach(([x, y], k) => {
        const [px, py] = transform.toPixel(x, y);
        if (k === 0) context.moveTo(px, py);
        else context.lineTo(px, py);
      });
      context.closePath();
    }
  }

  private drawPolygons(context: CanvasRenderingContext2D, transform: MapTransform, polygons: number[][][][], fill: string | CanvasPattern, stroke: string, lineWidth: number): void {
    for (const polygon of polygons) {
      context.beginPath();
      this.tracePolygon(context, transform, polygon);
      context.fillStyle = fill;
      context.fill('evenodd');
      context.strokeStyle = stroke;
      context.lineWidth = lineWidth;
      context.stroke();
    }
  }

  /** The population at risk as a choropleth of density per km² (issue 15), under the grid and the points. */
  private drawBaseline(context: CanvasRenderingContext2D, transform: MapTransform, geometry: DatasetGeometry): void {
    const layer = geometry.baseline;
    if (!layer || !(layer.maxDensity > 0)) return;
    for (const polygon of layer.polygons) {
      context.beginPath();
      this.tracePolygon(context, transform, polygon.rings);
      context.fillStyle = withAlpha(sequentialColour(polygon.density / layer.maxDensity), 0.55);
      context.fill('evenodd');
      context.strokeStyle = 'rgba(255,255,255,0.7)';
      context.lineWidth = 0.6;
      context.stroke();
    }
  }

  private drawGrid(context: CanvasRenderingContext2D, transform: MapTransform): void {
    if (!this.grid) return;
    const maxCount = Math.max(1, this.maxCount());
    const leftOut = hatchPattern(context, OKABE_ITO.vermillion, 6, null);
    for (const cell of this.grid.features) {
      context.beginPath();
      this.tracePolygon(context, transform, cell.geometry.coordinates);
      if (cell.properties.kept) {
        context.fillStyle = withAlpha(sequentialColour(cell.properties.count / maxCount), 0.78);
        context.fill();
        context.strokeStyle = 'rgba(255,255,255,0.9)';
      } else {
        context.fillStyle = leftOut;
        context.fill();
        context.strokeStyle = withAlpha(OKABE_ITO.vermillion, 0.8);
      }
      context.lineWidth = 0.8;
      context.stroke();
    }
  }

  private drawPoints(context: CanvasRenderingContext2D, transform: MapTransform, geometry: DatasetGeometry): void {
    const radius = geometry.points.length / 2 > 3000 ? 1 : 1.7;
    for (let k = 0; k < geometry.points.length / 2; k += 1) {
      const [px, py] = transform.toPixel(geometry.points[2 * k], geometry.points[2 * k + 1]);
      const inside = geometry.pointInside[k] === 1;
      context.beginPath();
      context.arc(px, py, inside ? radius : radius + 1, 0, 2 * Math.PI);
      if (inside) {
        context.fillStyle = this.grid ? '#ffffff' : NEUTRAL.ink;
        context.fill();
        if (this.grid) {
          context.strokeStyle = NEUTRAL.ink;
          context.lineWidth = 0.6;
          context.stroke();
        }
      } else {
        context.strokeStyle = OKABE_ITO.reddishPurple;
        context.lineWidth = 1.2;
        context.stroke();
      }
    }
  }
}
