/**
 * The brannock-heath demo scenario placed on the globe for the coordinate tests: its planar metres shifted into
 * WGS 84 / UTM zone 33N (EPSG:32633, easting 500,000 + x, northing 6,900,000 + y, about 62 deg N, 15 deg E), and the
 * same positions as longitude/latitude (inverse-projected with proj4). Invented data on an invented place.
 */
import proj4 from 'proj4';
import { sampleFile } from '../server/server-helpers.js';

export const UTM33N = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
export const EAST = 500_000;
export const NORTH = 6_900_000;

type Ring = [number, number][];
const toLonLat = proj4(UTM33N, '+proj=longlat +datum=WGS84 +no_defs');

function shiftCsv(text: string, convert: (x: number, y: number) => [number, number], header: string): string {
  const lines = text.trim().split('\n');
  return [header, ...lines.slice(1).map((line) => {
    const [id, x, y] = line.split(',');
    const [a, b] = convert(Number(x), Number(y));
    return `${id},${a},${b}`;
  })].join('\n');
}

function shiftGeoJson(text: string, convert: (x: number, y: number) => [number, number]): string {
  const collection = JSON.parse(text) as { features: { geometry: { coordinates: Ring[] } }[] };
  for (const feature of collection.features) {
    feature.geometry.coordinates = feature.geometry.coordinates.map((ring) => ring.map(([x, y]) => convert(x, y)));
  }
  return JSON.stringify(collection);
}

const utm = (x: number, y: number): [number, number] => [EAST + x, NORTH + y];
const lonLat = (x: number, y: number): [number, number] => toLonLat.forward([EAST + x, NORTH + y]) as [number, number];

export function utmScenario(): { points: string; area: string; noData: string } {
  return {
    points: shiftCsv(sampleFile('brannock-heath', 'points.csv'), utm, 'id,x,y'),
    area: shiftGeoJson(sampleFile('brannock-heath', 'area.geojson'), utm),
    noData: shiftGeoJson(sampleFile('brannock-heath', 'no-data.geojson'), utm),
  };
}

export function lonLatScenario(): { points: string; area: string; noData: string } {
  return {
    points: shiftCsv(sampleFile('brannock-heath', 'points.csv'), lonLat, 'id,lon,lat'),
    area: shiftGeoJson(sampleFile('brannock-heath', 'area.geojson'), lonLat),
    noData: shiftGeoJson(sampleFile('brannock-heath', 'no-data.geojson'), lonLat),
  };
}
