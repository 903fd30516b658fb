import { createHash } from 'node:crypto';
import { geoIdentity, geoPath } from 'd3-geo';
import type { GeometryCollection, LineString, Polygon } from 'geojson';
import sharp from 'sharp';
import { loadAtlas, type Atlas, type AtlasDetail, type Bounds, type Shape } from './atlas';
import { Invalid } from '@/lib/errors';
import { MAP_COLORS } from './colors';
import { WORLD_PX, worldUnitToLonLat } from './geo';
import { kmPerWorldPx, LAND_BORDER_REACH_KM } from './land-border';
import { LruCache } from './tile-cache';

export const TILE_SIZE_PX = 256;
/** Whole lower 48 on a laptop screen. */
export const MIN_ZOOM = 3;
/** A metro area; the packaged data has no street-level detail beyond this. */
export const MAX_ZOOM = 10;
/** Zoom from which the finer world data and county lines are drawn. */
export const DETAIL_ZOOM = 6;
export const TILE_CACHE_ENTRIES = 2000;

/** How browsers and proxies may keep a tile: the drawing for an address does not change within a release. */
export const TILE_CACHE_CONTROL = 'public, max-age=86400, immutable';

/** A tile address outside the XYZ grid or the zoom range the map serves (a 400 through lib/http). */
export class InvalidTileError extends Invalid {}

export interface TileCoords {
  z: number;
  x: number;
  y: number;
}

export interface RenderedTile {
  png: Buffer;
  /** Strong validator: a hash of the PNG bytes, quoted as HTTP wants it. */
  etag: string;
}

export function assertValidTile(z: number, x: number, y: number): void {
  if (!Number.isInteger(z) || z < MIN_ZOOM || z > MAX_ZOOM) {
    throw new InvalidTileError(`Zoom must be a whole number from ${MIN_ZOOM} to ${MAX_ZOOM}.`);
  }
  const n = 2 ** z;
  if (!Number.isInteger(x) || x < 0 || x >= n) throw new InvalidTileError(`Tile x must be a whole number from 0 to ${n - 1} at zoom ${z}.`);
  if (!Number.isInteger(y) || y < 0 || y >= n) throw new InvalidTileError(`Tile y must be a whole number from 0 to ${n - 1} at zoom ${z}.`);
}

const DIGITS = /^\d{1,4}$/;

/** Parses the URL segments of /api/tiles/{z}/{x}/{y}.png into validated numbers. */
export function parseTileCoords(z: string, x: string, y: string): TileCoords {
  const yDigits = y.endsWith('.png') ? y.slice(0, -'.png'.length) : y;
  if (![z, x, yDigits].every((s) => DIGITS.test(s))) throw new InvalidTileError('Tile addresses look like /{z}/{x}/{y}.png with whole numbers.');
  const coords = { z: Number(z), x: Number(x), y: Number(yDigits) };
  assertValidTile(coords.z, coords.x, coords.y);
  return coords;
}

// Drawn past the tile edge so clipped outlines and round line caps fall outside the image.
const CLIP_PAD_PX = 4;

interface Strokes {
  county: number;
  state: number;
  country: number;
}

function strokeWidths(z: number): Strokes {
  const t = (z - MIN_ZOOM) / (MAX_ZOOM - MIN_ZOOM); // 0 at country level, 1 at metro level
  return { county: 0.5 + 0.5 * t, state: 0.8 + 0.9 * t, country: 1.2 + 1.2 * t };
}

function intersecting<G extends Polygon | LineString>(shapes: Shape<G>[], box: Bounds): G[] {
  const [x0, y0, x1, y1] = box;
  const hits: G[] = [];
  for (const { bounds, geometry } of shapes) {
    if (bounds[2] >= x0 && bounds[0] <= x1 && bounds[3] >= y0 && bounds[1] <= y1) hits.push(geometry);
  }
  return hits;
}

/** The SVG document for one tile (exported so a tile's drawing can be inspected). */
export function tileSvg(atlas: Atlas, z: number, x: number, y: number): string {
  const n = 2 ** z; // zoom z is the zoom-0 world scaled by 2^z
  const tileWorld = WORLD_PX / n;

  /** Path data for the shapes near this tile, clipped padPx beyond its edges. */
  const d = (shapes: Shape<Polygon>[] | Shape<LineString>[], padPx = CLIP_PAD_PX) => {
    const pad = padPx / n;
    const box: Bounds = [x * tileWorld - pad, y * tileWorld - pad, (x + 1) * tileWorld + pad, (y + 1) * tileWorld + pad];
    const geometries = intersecting<Polygon | LineString>(shapes, box);
    if (geometries.length === 0) return '';
    const projection = geoIdentity()
      .scale(n)
      .translate([-x * TILE_SIZE_PX, -y * TILE_SIZE_PX])
      .clipExtent([
        [-padPx, -padPx],
        [TILE_SIZE_PX + padPx, TILE_SIZE_PX + padPx],
      ]);
    const all: GeometryCollection = { type: 'GeometryCollection', geometries };
    return geoPath(projection).digits(1)(all) ?? '';
  };

  const w = strokeWidths(z);
  const layers: string[] = [];
  const fill = (data: string, color: string) => data && layers.push(`<path d="${data}" fill="${color}" fill-rule="evenodd"/>`);
  const line = (data: string, color: string, width: number, extra = 'stroke-linecap="round"') =>
    data &&
    layers.push(`<path d="${data}" fill="none" stroke="${color}" stroke-width="${width.toFixed(2)}" stroke-linejoin="round" ${extra}/>`);

  const foreignLand = d(atlas.foreignLand);
  fill(foreignLand, MAP_COLORS.foreignLand);
  fill(d(atlas.usLand), MAP_COLORS.usLand);

  // Where the US meets Canada or Mexico on land the two sources' lines disagree by up to a
  // couple of km, leaving slivers of water or overlaps. Near those stretches, repaint each
  // side up to the world layer's border line, so the colour change sits under the line drawn.
  const centre = worldUnitToLonLat((x + 0.5) / n, (y + 0.5) / n);
  const reachPx = (LAND_BORDER_REACH_KM / kmPerWorldPx(centre.lat)) * n;
  // A border just outside the tile still paints into it: select and clip with the reach added.
  const landBorders = d(atlas.usLandBorders, CLIP_PAD_PX + reachPx);
  if (landBorders) {
    const usWorld = d(atlas.usLandWorldLayer);
    layers.push(
      `<defs><clipPath id="us"><path d="${usWorld || 'M0,0'}" clip-rule="evenodd"/></clipPath>` +
        `<clipPath id="fx"><path d="${foreignLand || 'M0,0'}" clip-rule="evenodd"/></clipPath></defs>`,
    );
    line(landBorders, MAP_COLORS.usLand, 2 * reachPx, 'stroke-linecap="butt" clip-path="url(#us)"');
    line(landBorders, MAP_COLORS.foreignLand, 2 * reachPx, 'stroke-linecap="butt" clip-path="url(#fx)"');
  }
  line(d(atlas.countyBorders), MAP_COLORS.countyBorder, w.county);
  line(d(atlas.stateBorders), MAP_COLORS.stateBorder, w.state);
  line(d(atlas.countryBorders), MAP_COLORS.countryBorder, w.country);

  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${TILE_SIZE_PX}" height="${TILE_SIZE_PX}" viewBox="0 0 ${TILE_SIZE_PX} ${TILE_SIZE_PX}">` +
    `<rect width="${TILE_SIZE_PX}" height="${TILE_SIZE_PX}" fill="${MAP_COLORS.water}"/>` +
    layers.join('') +
    `</svg>`
  );
}

const detailFor = (z: number): AtlasDetail => (z >= DETAIL_ZOOM ? 'high' : 'low');

async function renderUncached(z: number, x: number, y: number): Promise<RenderedTile> {
  const atlas = await loadAtlas(detailFor(z));
  const svg = tileSvg(atlas, z, x, y);
  const png = await sharp(Buffer.from(svg)).png({ compressionLevel: 6 }).toBuffer();
  const etag = `"${createHash('sha1').update(png).digest('base64url')}"`;
  return { png, etag };
}

const cache = new LruCache<RenderedTile>(TILE_CACHE_ENTRIES);
const inFlight = new Map<string, Promise<RenderedTile>>();

/**
 * A tile with its ETag: from the cache, or rendered once even when several
 * requests for the same tile arrive while it is being drawn.
 */
export function getTile(z: number, x: number, y: number): Promise<RenderedTile> {
  try {
    assertValidTile(z, x, y);
  } catch (error) {
    return Promise.reject(error);
  }
  const key = `${z}/${x}/${y}`;
  const cached = cache.get(key);
  if (cached) return Promise.resolve(cached);
  let pending = inFlight.get(key);
  if (!pending) {
    pending = renderUncached(z, x, y)
      .then((tile) => {
        cache.set(key, tile);
        return tile;
      })
      .finally(() => inFlight.delete(key));
    inFlight.set(key, pending);
  }
  return pending;
}

/** A 256 × 256 PNG of XYZ tile z/x/y (Web Mercator, EPSG:3857). */
export async function renderTile(z: number, x: number, y: number): Promise<Buffer> {
  return (await getTile(z, x, y)).png;
}

/** Does an If-None-Match header name this ETag (weak or strong, or `*`)? */
export function etagMatches(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  return ifNoneMatch.split(',').some((tag) => {
    const t = tag.trim();
    return t === '*' || t.replace(/^W\//, '') === etag;
  });
}

/**
 * Loads both atlas detail levels ahead of the first tile request (about 1 to 2 s of
 * parsing on a cold process); optional, e.g. from the server's start-up hook.
 */
export async function warmTileRenderer(): Promise<void> {
  await Promise.all([loadAtlas('low'), loadAtlas('high')]);
}

/** Counts for tests and the benchmark. */
export function tileCacheStats(): { cached: number; rendering: number } {
  return { cached: cache.size, rendering: inFlight.size };
}

export function clearTileCache(): void {
  cache.clear();
}
