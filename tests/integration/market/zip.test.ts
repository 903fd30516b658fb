import { afterAll, describe, expect, it } from 'vitest';
import { createRequest } from '@/lib/market/createRequest';
import { requestInputSchema } from '@/lib/market/schema';
import { Invalid } from '@/lib/errors';
import { makeRider, ownDatabase, requestValues } from './fixtures';

const dbPromise = ownDatabase('market_zip');
afterAll(async () => (await dbPromise).destroy());

describe('ZIP codes on requests', () => {
  it('lets a well-formed but unknown ZIP through the shared schema, and the domain refuses it with a field message', async () => {
    const db = await dbPromise;
    const rider = await makeRider(db);
    const input = requestInputSchema.parse(requestValues({ zip: '00000' }));
    const attempt = createRequest(db, rider, input);
    await expect(attempt).rejects.toBeInstanceOf(Invalid);
    await expect(attempt).rejects.toMatchObject({ fieldErrors: { zip: ['We could not find that ZIP code.'] } });
    expect(await db('wheel_requests').where({ rider_id: rider.id }).count<{ count: string }[]>('* as count')).toEqual([{ count: '0' }]);
  });
});
