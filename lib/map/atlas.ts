/**
 * The geography the tiles draw, read from the packaged atlases once per process and
 * projected to Web Mercator world pixels.
 *
 * The US comes from the Census layer (us-atlas), which stops at the shore, so the Great
 * Lakes and bays are water. Everything else comes from the world layer (world-atlas,
 * Natural Earth), which has no lakes: its country shapes run out to the borders in the
 * lakes, so the Canadian halves of the border lakes are drawn as land. A lakes layer would
 * fix that; none ships in the installed packages.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { feature, mesh } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import type { Geometry, LineString, Polygon, Position } from 'geojson';
import { lonLatToWorldUnit, WORLD_PX } from './geo';
import { landBorderRuns } from './land-border';

/** [minX, minY, maxX, maxY] in zoom-0 world pixels. */
export type Bounds = [number, number, number, number];

export interface Shape<G extends Polygon | LineString = Polygon | LineString> {
  bounds: Bounds;
  geometry: G;
}

/** Everything one tile draws, already projected to Web Mercator world pixels. */
export interface Atlas {
  foreignLand: Shape<Polygon>[];
  usLand: Shape<Polygon>[];
  /** The world layer's own outline of the US, used only where the two layers meet on land. */
  usLandWorldLayer: Shape<Polygon>[];
  /** Stretches of the US border that run over land (see land-border.ts). */
  usLandBorders: Shape<LineString>[];
  countryBorders: Shape<LineString>[];
  stateBorders: Shape<LineString>[];
  /** Empty at the low detail level. */
  countyBorders: Shape<LineString>[];
}

export type AtlasDetail = 'low' | 'high';

const US_COUNTRY_ID = '840'; // ISO 3166-1 numeric, as world-atlas keys countries

// Long border and coast lines are cut into pieces of this many points so that
// bounds culling skips most of a line that only grazes a tile.
const LINE_CHUNK_POINTS = 48;

// Read at run time rather than imported: keeps the multi-megabyte JSON out of the server
// bundle and out of the type checker. Whole literal paths so build-time file tracing can
// find exactly these files.
const ATLAS_FILES = {
  worldLow: () => path.join(process.cwd(), 'node_modules', 'world-atlas', 'countries-50m.json'),
  worldHigh: () => path.join(process.cwd(), 'node_modules', 'world-atlas', 'countries-10m.json'),
  usLow: () => path.join(process.cwd(), 'node_modules', 'us-atlas', 'states-10m.json'),
  usHigh: () => path.join(process.cwd(), 'node_modules', 'us-atlas', 'counties-10m.json'),
};

async function readTopology(file: string): Promise<Topology> {
  return JSON.parse(await readFile(file, 'utf8')) as Topology;
}

// Shapes that reach the poles (Antarctica) must run on past the world's edge: clamped at
// the Mercator limit their edge would sit inside the padded clip box, and the clip would
// read a tile in the middle of the ice as outside it.
const SHAPE_MAX_LAT = 89.9;

function toWorldPx([lon, lat]: Position): Position {
  const [ux, uy] = lonLatToWorldUnit(lon, lat, SHAPE_MAX_LAT);
  return [ux * WORLD_PX, uy * WORLD_PX];
}

function boundsOf(rings: Position[][]): Bounds {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const ring of rings) {
    for (const [x, y] of ring) {
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
  }
  return [minX, minY, maxX, maxY];
}

/** Twice the signed area in y-down pixels; positive when the ring runs clockwise on screen. */
function signedArea2(ring: Position[]): number {
  let sum = 0;
  for (let i = 0; i < ring.length - 1; i++) sum += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
  return sum;
}

/**
 * Removes the ±360° jumps of a ring that crosses the antimeridian, so its longitudes run on
 * continuously (past 180° if need be). A ring that circles a pole (Antarctica) is closed
 * along the pole so that it becomes an ordinary planar polygon.
 */
function unwrapRing(ring: Position[]): Position[] {
  const out: Position[] = [[ring[0][0], ring[0][1]]];
  let shift = 0;
  for (let i = 1; i < ring.length; i++) {
    const step = ring[i][0] - ring[i - 1][0];
    if (step > 180) shift -= 360;
    else if (step < -180) shift += 360;
    out.push([ring[i][0] + shift, ring[i][1]]);
  }
  if (shift !== 0) {
    const first = out[0];
    const last = out[out.length - 1];
    const poleLat = out.reduce((sum, p) => sum + p[1], 0) < 0 ? -90 : 90;
    out.push([last[0], poleLat], [first[0], poleLat], [first[0], first[1]]);
  }
  return out;
}

const shiftLon = (ring: Position[], by: number): Position[] => ring.map(([lon, lat]) => [lon + by, lat]);

/**
 * Projects a polygon to world pixels as planar geometry: edges stay straight in
 * longitude/latitude, as in the source shapefiles and in Web Mercator tiles, and no
 * spherical winding rule is applied (some packaged rings are wound the other way,
 * which a spherical renderer reads as "the whole globe but this island").
 */
function planarPolygons(rings: Position[][]): Shape<Polygon>[] {
  const unwrapped = rings.map(unwrapRing);
  let minLon = Infinity, maxLon = -Infinity;
  for (const ring of unwrapped) {
    for (const [lon] of ring) {
      minLon = Math.min(minLon, lon);
      maxLon = Math.max(maxLon, lon);
    }
  }
  // A polygon pushed past ±180° by unwrapping also gets a copy on the other side of the world.
  const shifts = [0, ...(maxLon > 180 ? [-360] : []), ...(minLon < -180 ? [360] : [])];
  return shifts.map((by) => {
    const projected = unwrapped.map((ring) => (by ? shiftLon(ring, by) : ring).map(toWorldPx));
    // d3's rectangle clip joins cut rings along the tile edge assuming outer rings run
    // clockwise on screen and holes the other way; make the data agree.
    projected.forEach((ring, i) => {
      if ((signedArea2(ring) < 0) === (i === 0)) ring.reverse();
    });
    return { bounds: boundsOf(projected), geometry: { type: 'Polygon', coordinates: projected } };
  });
}

function polygonsOf(geometry: Geometry | null): Shape<Polygon>[] {
  if (!geometry) return [];
  if (geometry.type === 'Polygon') return planarPolygons(geometry.coordinates);
  if (geometry.type === 'MultiPolygon') return geometry.coordinates.flatMap(planarPolygons);
  return [];
}

function linesOf(geometry: Geometry): Shape<LineString>[] {
  const lines =
    geometry.type === 'LineString' ? [geometry.coordinates] : geometry.type === 'MultiLineString' ? geometry.coordinates : [];
  const shapes: Shape<LineString>[] = [];
  for (const line of lines) {
    // Break a line where it jumps across the antimeridian instead of drawing it across the world.
    let start = 0;
    for (let i = 1; i <= line.length; i++) {
      if (i === line.length || Math.abs(line[i][0] - line[i - 1][0]) > 180) {
        if (i - start >= 2) shapes.push(...chunkLine(line.slice(start, i).map(toWorldPx)));
        start = i;
      }
    }
  }
  return shapes;
}

function chunkLine(line: Position[]): Shape<LineString>[] {
  const shapes: Shape<LineString>[] = [];
  for (let start = 0; start < line.length - 1; start += LINE_CHUNK_POINTS - 1) {
    // Chunks share their end points so the drawn line has no gaps.
    const piece = line.slice(start, start + LINE_CHUNK_POINTS);
    shapes.push({ bounds: boundsOf([piece]), geometry: { type: 'LineString', coordinates: piece } });
  }
  return shapes;
}

function collection(topology: Topology, name: string): GeometryCollection {
  const object = topology.objects[name];
  if (!object || object.type !== 'GeometryCollection') throw new Error(`atlas object ${name} missing`);
  return object as GeometryCollection;
}

async function buildAtlas(detail: AtlasDetail): Promise<Atlas> {
  const [world, us] = await Promise.all([
    readTopology(detail === 'high' ? ATLAS_FILES.worldHigh() : ATLAS_FILES.worldLow()),
    readTopology(detail === 'high' ? ATLAS_FILES.usHigh() : ATLAS_FILES.usLow()),
  ]);

  const countries = collection(world, 'countries');
  const pick = (keep: (id: string | number | undefined) => boolean): GeometryCollection => ({
    type: 'GeometryCollection',
    geometries: countries.geometries.filter((g) => keep(g.id)),
  });
  const states = collection(us, 'states');
  const usLand = feature(us, collection(us, 'nation')).features.flatMap((f) => polygonsOf(f.geometry));
  const usBorder = mesh(world, countries, (a, b) => a !== b && (a.id === US_COUNTRY_ID || b.id === US_COUNTRY_ID));

  return {
    // The world layer's US would cover the Great Lakes; the Census layer below draws the US instead.
    foreignLand: feature(world, pick((id) => id !== US_COUNTRY_ID)).features.flatMap((f) => polygonsOf(f.geometry)),
    usLand,
    usLandWorldLayer: feature(world, pick((id) => id === US_COUNTRY_ID)).features.flatMap((f) => polygonsOf(f.geometry)),
    usLandBorders: linesOf(landBorderRuns(usBorder, usLand)),
    // Borders between two different countries, including the US ones (they run through the Great Lakes).
    countryBorders: linesOf(mesh(world, countries, (a, b) => a !== b)),
    stateBorders: linesOf(mesh(us, states, (a, b) => a !== b)),
    countyBorders:
      detail === 'high'
        ? linesOf(
            // Only county lines inside one state; state lines are drawn by their own layer.
            mesh(us, collection(us, 'counties'), (a, b) => a !== b && String(a.id).slice(0, 2) === String(b.id).slice(0, 2)),
          )
        : [],
  };
}

const atlases = new Map<AtlasDetail, Promise<Atlas>>();

/** Loads and projects the atlas once per process; later calls share the same promise. */
export function loadAtlas(detail: AtlasDetail): Promise<Atlas> {
  let pending = atlases.get(detail);
  if (!pending) {
    pending = buildAtlas(detail);
    // A failed load is retried on the next call rather than cached forever.
    pending.catch(() => atlases.delete(detail));
    atlases.set(detail, pending);
  }
  return pending;
}
