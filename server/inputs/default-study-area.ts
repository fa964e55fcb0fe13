/**
 * The default study area when none is given: the points' bounding box, widened on its upper sides by a hair
 * (1e-9 of its extent) so that the extreme points are inside (cells and the inside test are half-open).
 */
import type { InputWarning } from '../../shared/contracts.js';
import { inputError } from '../errors.js';
import { defaultAreaWarning } from './input-warnings.js';
import type { LabelledRings } from './valid-region.js';
import { fieldRef } from '../messages/field-names.js';

export function defaultStudyArea(xy: Float64Array, pointsName: string): { polygon: LabelledRings; warning: InputWarning } {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let k = 0; k < xy.length; k += 2) {
    minX = Math.min(minX, xy[k]);
    maxX = Math.max(maxX, xy[k]);
    minY = Math.min(minY, xy[k + 1]);
    maxY = Math.max(maxY, xy[k + 1]);
  }
  const width = maxX - minX;
  const height = maxY - minY;
  if (!(width > 0) || !(height > 0)) {
    throw inputError(
      `${pointsName}: the points' bounding box has zero ${width > 0 ? 'height' : 'width'}, so it cannot serve as the ` +
        `study area; give one with ${fieldRef('area')}`,
    );
  }
  const margin = 1e-9 * Math.max(width, height);
  const right = maxX + margin;
  const top = maxY + margin;
  const ring = [
    [minX, minY],
    [right, minY],
    [right, top],
    [minX, top],
    [minX, minY],
  ];
  return { polygon: { label: `${pointsName} bounding box`, rings: [ring] }, warning: defaultAreaWarning(width, height) };
}
