import { describe, expect, it } from 'vitest';
import { centralAngleRad, EARTH_RADIUS_KM, haversineKm, kmToMiles, lonLatToTile } from '@/lib/map/geo';

const dms = (deg: number, min: number) => deg + min / 60;

describe('great-circle distance', () => {
  // Worked example: LAX (33°57′N 118°24′W) to JFK (40°38′N 73°47′W).
  const lax = { lat: dms(33, 57), lon: -dms(118, 24) };
  const jfk = { lat: dms(40, 38), lon: -dms(73, 47) };

  it('gives the published central angle for LAX to JFK', () => {
    // E. Williams, "Aviation Formulary": d = 0.623585 rad; tolerance half a unit in the last published digit.
    expect(Math.abs(centralAngleRad(lax, jfk) - 0.623585)).toBeLessThanOrEqual(5e-7);
  });

  it('gives about 2144 nautical miles for LAX to JFK', () => {
    // E. Williams, "Aviation Formulary": about 2144 nm (one nautical mile = one minute of arc); tolerance 0.5 nm.
    const nauticalMiles = (centralAngleRad(lax, jfk) * 180 * 60) / Math.PI;
    expect(Math.abs(nauticalMiles - 2144)).toBeLessThanOrEqual(0.5);
  });

  it('scales the angle by the 6371 km mean radius and is symmetric', () => {
    // 0.623585 rad × 6371 km = 3972.9 km (calc); tolerance 0.1 km.
    expect(haversineKm(lax, jfk)).toBeCloseTo(3972.86, 1);
    expect(haversineKm(jfk, lax)).toBeCloseTo(haversineKm(lax, jfk), 9);
    expect(haversineKm(lax, lax)).toBe(0);
    // Half the globe apart: π R (calc).
    expect(haversineKm({ lat: 0, lon: 0 }, { lat: 0, lon: 180 })).toBeCloseTo(Math.PI * EARTH_RADIUS_KM, 6);
  });

  it('converts kilometres to statute miles', () => {
    // International mile = 1.609344 km exactly (international yard and pound agreement, 1959).
    expect(kmToMiles(1.609344)).toBeCloseTo(1, 12);
    expect(kmToMiles(100)).toBeCloseTo(62.137, 3);
  });
});

describe('lonLatToTile', () => {
  // The slippy-map tile formula as usually written (OpenStreetMap wiki, "Slippy map tilenames"):
  // x = ⌊(lon + 180) / 360 · 2^z⌋, y = ⌊(1 − asinh(tan φ) / π) / 2 · 2^z⌋.
  function slippyTile(lon: number, lat: number, z: number) {
    const n = 2 ** z;
    const phi = (lat * Math.PI) / 180;
    return { x: Math.floor(((lon + 180) / 360) * n), y: Math.floor(((1 - Math.asinh(Math.tan(phi)) / Math.PI) / 2) * n) };
  }

  it('matches the standard formula across the US at zooms 0 to 18', () => {
    for (let z = 0; z <= 18; z++) {
      for (let lat = 19; lat <= 71; lat += 3.7) {
        for (let lon = -179; lon <= -65; lon += 6.3) {
          expect(lonLatToTile(lon, lat, z)).toEqual(slippyTile(lon, lat, z));
        }
      }
    }
  });

  it('puts New York City in tile 10/301/385', () => {
    // From memory: the z10 tile over lower Manhattan is 301/385.
    expect(lonLatToTile(-74.006, 40.7128, 10)).toEqual({ x: 301, y: 385 });
  });

  it('keeps the edges of the world inside the grid', () => {
    // Zoom 0 is one tile; zoom 1 splits at the Greenwich meridian and the equator (formula, calc).
    expect(lonLatToTile(-98, 39, 0)).toEqual({ x: 0, y: 0 });
    expect(lonLatToTile(0, 0, 1)).toEqual({ x: 1, y: 1 });
    expect(lonLatToTile(180, -90, 3)).toEqual({ x: 7, y: 7 });
    expect(lonLatToTile(-180, 90, 3)).toEqual({ x: 0, y: 0 });
  });
});
