/**
 * The working system of the grid exports for an EPSG system in US survey feet (EPSG:2264, NAD83 / North Carolina,
 * ftUS): gridshake counts in metres (coordinates x 1200/3937), the GeoPackage stores the system's own feet so that
 * its srs row (EPSG:2264) is true, and longitude/latitude come from proj4 with the EPSG definition.
 */
import { describe, it, expect } from 'vitest';
import proj4 from 'proj4';
import { workingSystem } from '../../server/grid-export/working-system.js';
import { epsgDefinition } from '../../server/inputs/epsg-definition.js';

const definition = epsgDefinition(2264);
const US_FOOT = 1200 / 3937; // metres per US survey foot (US National Bureau of Standards 1959)

describe('workingSystem for a system in feet', () => {
  const system = workingSystem({ kind: 'epsg', code: 2264, proj4: definition.proj4 });
  const feet = proj4('+proj=longlat +datum=WGS84 +no_defs', definition.proj4);

  it('stores feet in the GeoPackage and names EPSG:2264', () => {
    const [x, y] = feet.forward([-79.0, 35.8]) as [number, number];
    const working: [number, number] = [x * US_FOOT, y * US_FOOT];
    const stored = system.toStored(...working);
    expect(stored[0]).toBeCloseTo(x, 6);
    expect(stored[1]).toBeCloseTo(y, 6);
    expect(system.srs).toMatchObject({ srsId: 2264, organization: 'EPSG', organizationId: 2264 });
    expect(system.srs.definition).toContain('PROJCS["NAD83 / North Carolina (ftUS)"');
  });

  it('inverts working metres to longitude/latitude through the EPSG definition', () => {
    const [x, y] = feet.forward([-79.0, 35.8]) as [number, number];
    const [lon, lat] = system.toLonLat!(x * US_FOOT, y * US_FOOT);
    expect(lon).toBeCloseTo(-79.0, 9);
    expect(lat).toBeCloseTo(35.8, 9);
    expect(system.description).toMatch(/^EPSG:2264 \(coordinates multiplied by 0\.3048006\d* to give metres\): \+proj=lcc/);
  });

  it('planar input has no longitude/latitude and the undefined Cartesian srs (-1)', () => {
    const planar = workingSystem({ kind: 'planar' });
    expect(planar.toLonLat).toBeNull();
    expect(planar.srs.srsId).toBe(-1);
  });
});
