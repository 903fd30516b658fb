import { describe, expect, inject, it } from 'vitest';
import { startCluster, stopCluster } from '../../scripts/lib/postgres';

const appUrl = inject('appUrl');

async function health() {
  const res = await fetch(`${appUrl}/api/health`);
  return { status: res.status, body: await res.json() };
}

describe('health', () => {
  it('answers ok after a real query, 503 with a reason while the database is down, and recovers without a restart', async () => {
    expect(await health()).toEqual({ status: 200, body: { status: 'ok', db: 'ok' } });
    const dir = inject('appClusterDir');
    stopCluster(dir, 'fast');
    try {
      const down = await health();
      expect(down.status).toBe(503);
      expect(down.body).toMatchObject({ status: 'error', db: 'down', reason: expect.any(String) });
    } finally {
      startCluster({ dir, port: inject('appClusterPort'), fast: true });
    }
    expect(await health()).toEqual({ status: 200, body: { status: 'ok', db: 'ok' } });
  });
});
