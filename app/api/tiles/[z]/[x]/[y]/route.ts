import { route } from '@/lib/http/route';
import { etagMatches, getTile, parseTileCoords, TILE_CACHE_CONTROL } from '@/lib/map/tiles';

// sharp is a native module: Node runtime only.
export const runtime = 'nodejs';

type Params = { z: string; x: string; y: string };

// One map tile, /api/tiles/{z}/{x}/{y}.png, drawn here from the packaged atlases (no tile server).
export const GET = route<undefined, Params>({ access: 'public' }, async ({ req, params }) => {
  const { z, x, y } = parseTileCoords(params.z, params.x, params.y);
  const tile = await getTile(z, x, y);
  const headers = { 'Cache-Control': TILE_CACHE_CONTROL, ETag: tile.etag };
  if (etagMatches(req.headers.get('if-none-match'), tile.etag)) return new Response(null, { status: 304, headers });
  return new Response(new Uint8Array(tile.png), { headers: { ...headers, 'Content-Type': 'image/png' } });
});
