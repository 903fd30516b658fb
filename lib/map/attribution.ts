/**
 * Where the map's geography comes from. Both sources are public domain; the packages
 * that convert them to TopoJSON (us-atlas 3.x, world-atlas 2.x) are ISC-licensed.
 */
export const MAP_DATA_SOURCES = [
  {
    name: 'US Census Bureau cartographic boundary files',
    edition: '2017',
    covers: 'US states and counties',
    licence: 'public domain (US Government work)',
    via: 'us-atlas',
  },
  {
    name: 'Natural Earth',
    edition: 'vector data 4.1.0',
    covers: 'countries and coastlines outside the US',
    licence: 'public domain',
    via: 'world-atlas',
  },
] as const;

/** The credit line shown on the map (plain text; Leaflet's attribution control accepts it as is). */
export const MAP_ATTRIBUTION =
  'Map data: US Census Bureau cartographic boundaries (2017) and Natural Earth (public domain), via us-atlas and world-atlas';
