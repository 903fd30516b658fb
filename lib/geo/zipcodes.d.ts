declare module 'zipcodes' {
  interface ZipRecord {
    zip: string;
    latitude: number;
    longitude: number;
    city: string;
    state: string;
    country: string;
  }
  const zipcodes: { lookup(zip: string | number): ZipRecord | undefined; distance(a: string, b: string): number | null };
  export default zipcodes;
}
