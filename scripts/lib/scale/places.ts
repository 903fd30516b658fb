// Real US ZIP centroids from the ZIP dataset the app itself looks codes up in, so every row's place is one
// the domain code would have written for that ZIP.
import zipcodes from 'zipcodes';
import type { Rng } from './random';

export interface Place {
  zip: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
}

const STATES = new Set(
  'AL AK AZ AR CA CO CT DE DC FL GA HI ID IL IN IA KS KY LA ME MD MA MI MN MS MO MT NE NV NH NJ NM NY NC ND OH OK OR PA RI SC SD TN TX UT VT VA WA WV WI WY'.split(' '),
);

let cached: Place[] | null = null;

/** Every US ZIP with a centroid, in code order (so a seeded pick is the same run to run). */
export function usPlaces(): Place[] {
  if (cached) return cached;
  const codes = (zipcodes as unknown as { codes: Record<string, { zip: string; city: string; state: string; latitude: number; longitude: number; country: string }> }).codes;
  cached = Object.values(codes)
    .filter((c) => c.country === 'US' && STATES.has(c.state) && Number.isFinite(c.latitude) && Number.isFinite(c.longitude) && /^\d{5}$/.test(c.zip))
    .sort((a, b) => a.zip.localeCompare(b.zip))
    .map((c) => ({ zip: c.zip, city: c.city, region: c.state, latitude: c.latitude, longitude: c.longitude }));
  return cached;
}

export function randomPlace(rng: Rng): Place {
  return rng.pick(usPlaces());
}
