/**
 * Look angles against H. D. Curtis, Orbital Mechanics for Engineering Students, Example 5.9 (p. 270 in
 * the edition cited by the code copy; edition not stated there).
 * Observer at geodetic latitude −40°, local sidereal time 110°, sea level; satellite at
 * r = (−2032.4, 4591.2, −4544.8) km (geocentric equatorial); the book finds azimuth 129.8° and
 * elevation 41.41°. Confirmed via code citing the book. With the sidereal angle taken as 0, longitude
 * 110° places the observer at that local sidereal time, so the inertial vector is used as earth-fixed.
 */
import { describe, expect, it } from 'vitest';
import { lookAngles, stationFrameFromGeodetic } from '../src/events/lookAngles.ts';
import { vec3 } from '../src/orbit/vec.ts';

describe('Curtis Example 5.9 (confirmed via code citing the book)', () => {
  it('azimuth 129.8°, elevation 41.41°', () => {
    const f = stationFrameFromGeodetic(-40, 110, 0);
    const la = lookAngles(f, vec3<'ECEF'>(-2032.4e3, 4591.2e3, -4544.8e3));
    // The book's rounded ellipsoid and printed rounding (0.1°, 0.01°) stay inside these; a geocentric
    // instead of geodetic horizon would give 41.28° here (0.13° off), so the check can tell them apart.
    expect(Math.abs(la.azimuthDeg - 129.8), `azimuth ${la.azimuthDeg}°`).toBeLessThan(0.1);
    expect(Math.abs(la.elevationDeg - 41.41), `elevation ${la.elevationDeg}°`).toBeLessThan(0.05);
  });
});
