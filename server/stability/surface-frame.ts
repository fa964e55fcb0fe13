/**
 * The stability surface of one cell size for the page (GET /api/sweeps/:id/stability-surface?size=K): the stored
 * GeoTIFF read back with the registry library geotiff (the reader the tests use) and sent as a typed frame
 * (shared/binary/typed-frame.ts): band 1 (excess share) and band 2 (deficit share) as float32, NaN outside the valid
 * region, with the georeferencing taken from the file's own ModelTiepoint / ModelPixelScale. So the page draws the
 * very numbers and placement of the file the analyst downloads, without carrying a TIFF decoder (the library's
 * browser build is about 550 kB and its module build pulls in Node's fs and http).
 */
import { fromArrayBuffer } from 'geotiff';
import type { StabilitySizeSummary } from '../../shared/contracts.js';
import { encodeTypedFrame } from '../../shared/binary/typed-frame.js';
import type { SurfaceFrameMeta } from '../../shared/binary/page-frames.js';

export async function stabilitySurfaceFrame(tif: Uint8Array, entry: StabilitySizeSummary): Promise<Uint8Array> {
  const buffer = tif.buffer.slice(tif.byteOffset, tif.byteOffset + tif.byteLength) as ArrayBuffer;
  const image = await (await fromArrayBuffer(buffer)).getImage();
  const [x0, y0] = image.getOrigin();
  const [side] = image.getResolution();
  const [excess, deficit] = (await image.readRasters()) as unknown as Float32Array[];
  const meta: SurfaceFrameMeta = {
    sizeIndex: entry.sizeIndex,
    shape: entry.shape,
    cellSize: entry.cellSize,
    placements: entry.placements,
    x0: x0!,
    y0: y0!,
    side: side!,
    width: image.getWidth(),
    height: image.getHeight(),
    excessThreshold: entry.excessThreshold,
    deficitThreshold: entry.deficitThreshold,
  };
  return encodeTypedFrame(meta, { excess: excess!, deficit: deficit! });
}
