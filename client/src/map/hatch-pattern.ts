/** Diagonal hatching as a canvas pattern, for no-data zones and left-out cells (readable without colour). */
export function hatchPattern(context: CanvasRenderingContext2D, colour: string, spacing: number, background: string | null): CanvasPattern | string {
  const tile = document.createElement('canvas');
  tile.width = spacing;
  tile.height = spacing;
  const tileContext = tile.getContext('2d');
  if (!tileContext) return colour;
  if (background) {
    tileContext.fillStyle = background;
    tileContext.fillRect(0, 0, spacing, spacing);
  }
  tileContext.strokeStyle = colour;
  tileContext.lineWidth = 1.2;
  tileContext.beginPath();
  tileContext.moveTo(0, spacing);
  tileContext.lineTo(spacing, 0);
  tileContext.moveTo(-spacing / 2, spacing / 2);
  tileContext.lineTo(spacing / 2, -spacing / 2);
  tileContext.moveTo(spacing / 2, spacing * 1.5);
  tileContext.lineTo(spacing * 1.5, spacing / 2);
  tileContext.stroke();
  return context.createPattern(tile, 'repeat') ?? colour;
}
