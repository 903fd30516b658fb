/** Mean Earth radius used for great-circle distances (km). */
export const EARTH_RADIUS_KM = 6371;

/** International statute mile in kilometres (exact by definition). */
const KM_PER_MILE = 1.609344;

/** Side of the single zoom-0 tile in pixels: the unit the map's projected shapes are stored in. */
export const WORLD_PX = 256;

/** Web Mercator stops here so the world is a square (atan(sinh(π)) in degrees). */
export const MAX_MERCATOR_LAT = 85.0511287798066;

export interface LatLon {
  lat: number;
  lon: number;
}

const toRad = (deg: number) => (deg * Math.PI) / 180;

/** Central angle between two points in radians (haversine formula, atan2 form). */
export function centralAngleRad(a: LatLon, b: LatLon): number {
  const dLat = toRad(b.lat - a.lat);
  const dLon = toRad(b.lon - a.lon);
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(toRad(a.lat)) * Math.cos(toRad(b.lat)) * Math.sin(dLon / 2) ** 2;
  return 2 * Math.atan2(Math.sqrt(h), Math.sqrt(1 - h));
}

/** Great-circle distance in km on a sphere of radius EARTH_RADIUS_KM. */
export function haversineKm(a: LatLon, b: LatLon): number {
  return EARTH_RADIUS_KM * centralAngleRad(a, b);
}

export function kmToMiles(km: number): number {
  return km / KM_PER_MILE;
}

/**
 * Web Mercator (EPSG:3857) position as a fraction of the world square:
 * x from 0 at 180°W to 1 at 180°E, y from 0 at the top (≈85.05°N) to 1 at the bottom.
 * Latitudes are clamped to ±maxLat; a larger maxLat lets shapes run on past the world's edge.
 */
export function lonLatToWorldUnit(lon: number, lat: number, maxLat = MAX_MERCATOR_LAT): [number, number] {
  const clampedLat = Math.max(-maxLat, Math.min(maxLat, lat));
  const phi = toRad(clampedLat);
  const x = (lon + 180) / 360;
  const y = (1 - Math.log(Math.tan(phi) + 1 / Math.cos(phi)) / Math.PI) / 2;
  return [x, y];
}

/** XYZ tile (the scheme Leaflet uses by default) that contains a point at zoom z. */
export function lonLatToTile(lon: number, lat: number, z: number): { x: number; y: number } {
  const n = 2 ** z;
  const [ux, uy] = lonLatToWorldUnit(lon, lat);
  // 180°E and the bottom edge belong to the last tile, not to a tile past the edge.
  const clamp = (v: number) => Math.min(n - 1, Math.max(0, Math.floor(v * n)));
  return { x: clamp(ux), y: clamp(uy) };
}

/** Inverse of lonLatToWorldUnit. */
export function worldUnitToLonLat(x: number, y: number): { lon: number; lat: number } {
  const lon = x * 360 - 180;
  const lat = (Math.atan(Math.sinh(Math.PI * (1 - 2 * y))) * 180) / Math.PI;
  return { lon, lat };
}
