import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { MAP_COLORS } from '@/lib/map/colors';
import { lonLatToTile, lonLatToWorldUnit } from '@/lib/map/geo';
import { LruCache } from '@/lib/map/tile-cache';
import {
  etagMatches,
  getTile,
  InvalidTileError,
  parseTileCoords,
  renderTile,
  TILE_SIZE_PX,
  tileCacheStats,
} from '@/lib/map/tiles';

// The first tile at each detail level loads and projects the atlas.
const SLOW_MS = 30_000;

type Rgb = [number, number, number];
const hex = (color: string): Rgb => [1, 3, 5].map((i) => parseInt(color.slice(i, i + 2), 16)) as Rgb;
const near = (a: Rgb, b: Rgb, tolerance: number) => a.every((v, i) => Math.abs(v - b[i]) <= tolerance);

async function tileAt(lon: number, lat: number, z: number) {
  const { x, y } = lonLatToTile(lon, lat, z);
  return { x, y, png: await renderTile(z, x, y) };
}

async function pixels(png: Buffer): Promise<Rgb[]> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const out: Rgb[] = [];
  for (let i = 0; i < data.length; i += info.channels) out.push([data[i], data[i + 1], data[i + 2]]);
  return out;
}

/** Share of the tile's pixels within a small distance of a colour. */
async function shareOf(png: Buffer, color: string): Promise<number> {
  const all = await pixels(png);
  return all.filter((p) => near(p, hex(color), 3)).length / all.length;
}

/** Share of pixels that are neither of the given fills: lines and their anti-aliased edges. */
async function shareOfLines(png: Buffer, fills: string[]): Promise<number> {
  const all = await pixels(png);
  return all.filter((p) => fills.every((f) => !near(p, hex(f), 3))).length / all.length;
}

async function dominant(png: Buffer): Promise<Rgb> {
  const { r, g, b } = (await sharp(png).stats()).dominant;
  return [r, g, b];
}

describe('renderTile', { timeout: SLOW_MS }, () => {
  it(
    'draws a 256 × 256 PNG of the country over the Great Plains, mostly US land with state lines',
    async () => {
      const { png } = await tileAt(-98, 39, 4);
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const meta = await sharp(png).metadata();
      expect(meta).toMatchObject({ format: 'png', width: TILE_SIZE_PX, height: TILE_SIZE_PX });
      expect(await shareOf(png, MAP_COLORS.usLand)).toBeGreaterThan(0.5);
      expect(await shareOfLines(png, [MAP_COLORS.usLand, MAP_COLORS.foreignLand, MAP_COLORS.water])).toBeGreaterThan(0.005);
      // sharp's dominant colour is a 16-level histogram bin, hence the tolerance.
      expect(near(await dominant(png), hex(MAP_COLORS.usLand), 16)).toBe(true);
    },
  );

  it('draws open ocean as water only, and its dominant colour differs from a land tile', async () => {
    const ocean = await tileAt(-40, 30, 5);
    const land = await tileAt(-98, 39, 4);
    expect(await shareOf(ocean.png, MAP_COLORS.water)).toBe(1);
    const [oceanColor, landColor] = [await dominant(ocean.png), await dominant(land.png)];
    expect(near(oceanColor, hex(MAP_COLORS.water), 16)).toBe(true);
    expect(near(oceanColor, landColor, 16)).toBe(false);
  });

  it(
    'draws a coastal tile with both land and water (Chesapeake Bay, zoom 8)',
    async () => {
      const { png } = await tileAt(-76.3, 37.5, 8);
      expect(await shareOf(png, MAP_COLORS.usLand)).toBeGreaterThan(0.15);
      expect(await shareOf(png, MAP_COLORS.water)).toBeGreaterThan(0.15);
    },
  );

  it(
    'draws a metro tile at zoom 10 with the lake shore and county lines (Chicago)',
    async () => {
      // West of the Loop: Cook County's line with DuPage runs through this tile.
      const { png } = await tileAt(-88.0, 41.85, 10);
      expect((await sharp(png).metadata()).width).toBe(TILE_SIZE_PX);
      // Lake Michigan is water, not land: the US layer stops at the shore.
      const lake = await tileAt(-87.3, 41.95, 10);
      expect(await shareOf(lake.png, MAP_COLORS.water)).toBeGreaterThan(0.9);
      expect(await shareOf(png, MAP_COLORS.usLand)).toBeGreaterThan(0.5);
      expect(await shareOfLines(png, [MAP_COLORS.usLand, MAP_COLORS.water])).toBeGreaterThan(0.002);
    },
  );

  it(
    'puts the Four Corners where Web Mercator says (state lines meet at 37°N 109.045°W)',
    async () => {
      const z = 9;
      const lon = -109.045;
      const lat = 36.999;
      const { x, y, png } = await tileAt(lon, lat, z);
      const [ux, uy] = lonLatToWorldUnit(lon, lat);
      const px = Math.floor(ux * 2 ** z * TILE_SIZE_PX - x * TILE_SIZE_PX);
      const py = Math.floor(uy * 2 ** z * TILE_SIZE_PX - y * TILE_SIZE_PX);
      const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
      const at = (cx: number, cy: number): Rgb => {
        const i = (cy * info.width + cx) * info.channels;
        return [data[i], data[i + 1], data[i + 2]];
      };
      const land = hex(MAP_COLORS.usLand);
      // The state lines pass within 2 px of the computed point...
      let lineNearby = false;
      for (let dy = -2; dy <= 2; dy++) for (let dx = -2; dx <= 2; dx++) if (!near(at(px + dx, py + dy), land, 6)) lineNearby = true;
      expect(lineNearby).toBe(true);
      // ...and 12 px away in each quadrant there is plain land, not a line.
      for (const [dx, dy] of [[-12, -12], [12, -12], [-12, 12], [12, 12]]) expect(near(at(px + dx, py + dy), land, 3)).toBe(true);
    },
  );

  it('rejects addresses outside the grid or the zoom range', async () => {
    for (const [z, x, y] of [
      [2, 0, 0],
      [11, 0, 0],
      [5, -1, 0],
      [5, 32, 0],
      [5, 0, 32],
      [5.5, 1, 1],
      [Number.NaN, 1, 1],
    ]) {
      await expect(renderTile(z, x, y)).rejects.toBeInstanceOf(InvalidTileError);
    }
  });

  it('serves a second request from the cache and renders concurrent requests once', async () => {
    const { x, y } = lonLatToTile(-122.68, 45.52, 7);
    const first = getTile(7, x, y);
    const second = getTile(7, x, y);
    expect(tileCacheStats().rendering).toBe(1);
    const [a, b] = await Promise.all([first, second]);
    expect(a).toBe(b);
    expect(await getTile(7, x, y)).toBe(a);
    expect(a.etag).toMatch(/^"[\w-]+"$/);
  });
});

describe('parseTileCoords', () => {
  it('reads /{z}/{x}/{y}.png segments', () => {
    expect(parseTileCoords('5', '7', '12.png')).toEqual({ z: 5, x: 7, y: 12 });
    expect(parseTileCoords('10', '301', '385')).toEqual({ z: 10, x: 301, y: 385 });
  });

  it('rejects anything but whole numbers in range', () => {
    for (const [z, x, y] of [
      ['5', '7', 'abc'],
      ['5', '7', '12.jpg'],
      ['5', '-1', '12.png'],
      ['5', '1e1', '2.png'],
      ['5', '7.5', '2.png'],
      ['12', '7', '2.png'],
      ['5', '40', '2.png'],
    ]) {
      expect(() => parseTileCoords(z, x, y)).toThrow(InvalidTileError);
    }
  });
});

describe('etagMatches', () => {
  it('matches strong, weak, listed and wildcard validators', () => {
    expect(etagMatches('"abc"', '"abc"')).toBe(true);
    expect(etagMatches('W/"abc"', '"abc"')).toBe(true);
    expect(etagMatches('"x", "abc"', '"abc"')).toBe(true);
    expect(etagMatches('*', '"abc"')).toBe(true);
    expect(etagMatches('"x"', '"abc"')).toBe(false);
    expect(etagMatches(null, '"abc"')).toBe(false);
  });
});

describe('LruCache', () => {
  it('evicts the least recently used entry past its bound', () => {
    const cache = new LruCache<number>(2);
    cache.set('a', 1);
    cache.set('b', 2);
    expect(cache.get('a')).toBe(1); // a is now the most recent
    cache.set('c', 3);
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBe(1);
    expect(cache.get('c')).toBe(3);
    expect(cache.size).toBe(2);
  });
});
