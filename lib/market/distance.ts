// Distances between riders and shops, in miles: in JavaScript for one pair, in SQL for the board.
import type { Knex } from 'knex';
import { EARTH_RADIUS_KM, haversineKm, kmToMiles } from '@/lib/map/geo';

export const EARTH_RADIUS_MILES = kmToMiles(EARTH_RADIUS_KM);
const MILES_PER_DEGREE_LAT = (Math.PI / 180) * EARTH_RADIUS_MILES;

export interface Point {
  latitude: number;
  longitude: number;
}

export function milesBetween(a: Point, b: Point): number {
  return kmToMiles(haversineKm({ lat: a.latitude, lon: a.longitude }, { lat: b.latitude, lon: b.longitude }));
}

/** Rounded to a tenth of a mile for display. */
export const roundMiles = (miles: number): number => Math.round(miles * 10) / 10;

/** Haversine distance in miles from a fixed point to a row's latitude/longitude columns (same formula as milesBetween). */
export function milesSql(db: Knex, from: Point, latColumn: string, lonColumn: string): Knex.Raw {
  return db.raw(
    `(2 * ?::float8 * asin(least(1, sqrt(power(sin(radians(?? - ?::float8) / 2), 2) + cos(radians(?::float8)) * cos(radians(??)) * power(sin(radians(?? - ?::float8) / 2), 2)))))`,
    [EARTH_RADIUS_MILES, latColumn, from.latitude, from.latitude, latColumn, lonColumn, from.longitude],
  );
}

/** A box that holds every point within `miles`: a cheap, indexable prefilter before the exact distance. */
export function boundingBox(center: Point, miles: number): { minLat: number; maxLat: number; minLon: number | null; maxLon: number | null } {
  const dLat = miles / MILES_PER_DEGREE_LAT;
  const minLat = center.latitude - dLat;
  const maxLat = center.latitude + dLat;
  const cosLat = Math.cos((Math.max(Math.abs(minLat), Math.abs(maxLat)) * Math.PI) / 180);
  const dLon = cosLat > 1e-6 ? miles / (MILES_PER_DEGREE_LAT * cosLat) : 360;
  // Near a pole or across the antimeridian the longitude bound is not a simple range: skip it.
  if (dLon >= 180 || center.longitude - dLon < -180 || center.longitude + dLon > 180) return { minLat, maxLat, minLon: null, maxLon: null };
  return { minLat, maxLat, minLon: center.longitude - dLon, maxLon: center.longitude + dLon };
}
