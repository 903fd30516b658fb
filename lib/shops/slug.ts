import type { Knex } from 'knex';

export function slugify(name: string): string {
  const base = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);
  return base || 'shop';
}

/** A slug not yet taken: the name's slug, then -2, -3, … */
export async function uniqueShopSlug(trx: Knex, name: string): Promise<string> {
  const base = slugify(name);
  const taken = new Set<string>(
    (await trx('shops').where('slug', base).orWhere('slug', 'like', `${base}-%`).pluck('slug')) as string[],
  );
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}
