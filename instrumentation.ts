// Runs once when the server starts: load the map data now, so the first visitor to the map does not wait for it.
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { warmTileRenderer } = await import('./lib/map/tiles');
  void warmTileRenderer().catch((err: unknown) => console.error('map data could not be loaded ahead of time', err));
}
