import zipcodes from 'zipcodes';

export interface ZipPlace {
  zip: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
}

/** US ZIP code to place and centroid, from the ZIP dataset the `zipcodes` package ships. */
export function lookupZip(zip: string): ZipPlace | null {
  const found = zipcodes.lookup(zip);
  if (!found || found.country !== 'US') return null;
  return { zip: found.zip, city: found.city, region: found.state, latitude: found.latitude, longitude: found.longitude };
}
