import type { Knex } from 'knex';

export interface MarketplaceCounts {
  riders: number;
  builders: number;
  admins: number;
  shops: number;
}

export async function marketplaceCounts(db: Knex): Promise<MarketplaceCounts> {
  const byRole = await db('users').select('role').count<{ role: string; count: string }[]>('* as count').groupBy('role');
  const [shops] = await db('shops').count<{ count: string }[]>('* as count');
  const n = (role: string) => Number(byRole.find((c) => c.role === role)?.count ?? 0);
  return { riders: n('rider'), builders: n('builder'), admins: n('admin'), shops: Number(shops?.count ?? 0) };
}
