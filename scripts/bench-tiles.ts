/**
 * Tile renderer benchmark: atlas load time, cold renders across zooms, cache hits and
 * concurrent requests for one tile. Run with `npx tsx scripts/bench-tiles.ts`.
 */
import { performance } from 'node:perf_hooks';
import { loadAtlas } from '@/lib/map/atlas';
import { lonLatToTile } from '@/lib/map/geo';
import { getTile, MAX_ZOOM, MIN_ZOOM, tileCacheStats } from '@/lib/map/tiles';

// Lower 48 bounding box, where riders will look.
const US = { west: -124.7, east: -66.9, south: 24.5, north: 49.4 };

// Deterministic pseudo-random numbers so every run draws the same tiles.
function mulberry32(seed: number): () => number {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// Tiles drawn per zoom: the country-level zooms hold only a handful of US tiles.
const PER_ZOOM: Record<number, number> = { 3: 4, 4: 6, 5: 7, 6: 7, 7: 7, 8: 7, 9: 6, 10: 6 };

function sampleTiles(): { z: number; x: number; y: number }[] {
  const random = mulberry32(2024);
  const tiles: { z: number; x: number; y: number }[] = [];
  for (let z = MIN_ZOOM; z <= MAX_ZOOM; z++) {
    const seen = new Set<string>();
    for (let tries = 0; seen.size < (PER_ZOOM[z] ?? 0) && tries < 10_000; tries++) {
      const lon = US.west + random() * (US.east - US.west);
      const lat = US.south + random() * (US.north - US.south);
      const { x, y } = lonLatToTile(lon, lat, z);
      const key = `${x}/${y}`;
      if (seen.has(key)) continue;
      seen.add(key);
      tiles.push({ z, x, y });
    }
  }
  return tiles;
}

function summary(label: string, ms: number[]): void {
  const sorted = [...ms].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)];
  console.log(
    `${label.padEnd(22)} n=${String(sorted.length).padStart(3)}  p50 ${at(0.5).toFixed(2)} ms  p95 ${at(0.95).toFixed(2)} ms  max ${sorted[sorted.length - 1].toFixed(2)} ms`,
  );
}

async function time<T>(fn: () => Promise<T>): Promise<[number, T]> {
  const start = performance.now();
  const value = await fn();
  return [performance.now() - start, value];
}

async function main(): Promise<void> {
  const [lowMs] = await time(() => loadAtlas('low'));
  const [highMs] = await time(() => loadAtlas('high'));
  console.log(`atlas load (once per process): low detail ${lowMs.toFixed(0)} ms, high detail ${highMs.toFixed(0)} ms`);

  const tiles = sampleTiles();
  const cold: number[] = [];
  const byZoom = new Map<number, number[]>();
  let bytes = 0;
  for (const { z, x, y } of tiles) {
    const [ms, tile] = await time(() => getTile(z, x, y));
    cold.push(ms);
    bytes += tile.png.length;
    byZoom.set(z, [...(byZoom.get(z) ?? []), ms]);
  }
  summary('cold render', cold);
  for (const [z, ms] of [...byZoom].sort((a, b) => a[0] - b[0])) summary(`  zoom ${z}`, ms);
  console.log(`mean PNG size ${(bytes / tiles.length / 1024).toFixed(1)} KiB`);

  const warm: number[] = [];
  for (const { z, x, y } of tiles) warm.push((await time(() => getTile(z, x, y)))[0]);
  summary('cache hit', warm);

  // Ten simultaneous requests for one uncached tile share one render.
  const fresh = lonLatToTile(-104.99, 39.74, 9);
  const [concurrentMs] = await time(() => Promise.all(Array.from({ length: 10 }, () => getTile(9, fresh.x, fresh.y))));
  console.log(`10 concurrent requests for one new tile: ${concurrentMs.toFixed(1)} ms in all; cache now ${tileCacheStats().cached} tiles`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
