import Link from 'next/link';
import { BuilderMapLoader } from '@/components/map/BuilderMapLoader';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { db } from '@/lib/db';
import { MAP_ATTRIBUTION } from '@/lib/map/attribution';
import { directoryFilterSchema, listDirectoryShops } from '@/lib/shops/directory';

export const metadata = { title: 'Find a builder' };
export const dynamic = 'force-dynamic';

const FILTERS = [
  { name: 'width', label: 'Rim width', options: [3, 4, 5].map((w) => ({ value: String(w), label: `${w} inch` })) },
  { name: 'diameter', label: 'Wheel size', options: [20, 24, 26, 27.5, 29].map((d) => ({ value: String(d), label: `${d} inch` })) },
  { name: 'spokes', label: 'Spokes', options: [36, 72, 144].map((s) => ({ value: String(s), label: String(s) })) },
  { name: 'gauge', label: 'Gauge', options: [14, 12, 10, 8].map((g) => ({ value: String(g), label: `${g} gauge` })) },
] as const;

export default async function BuildersPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const raw = await searchParams;
  const parsed = directoryFilterSchema.safeParse(raw);
  const filter = parsed.success ? parsed.data : {};
  const shops = await listDirectoryShops(db, filter);
  return (
    <>
      <PageHeading title="Find a builder" lead="Independent wheel builders on Lacewright. Narrow the map to shops that build what you need." />
      <form className="mb-4 flex flex-wrap items-end gap-3" method="get" aria-label="Filter builders">
        {FILTERS.map((f) => (
          <label key={f.name} className="text-sm font-semibold text-ink-700">
            {f.label}
            <select name={f.name} defaultValue={raw[f.name] ?? ''} className="mt-1 block rounded border border-chalk-300 bg-white px-2 py-1.5 font-normal">
              <option value="">Any</option>
              {f.options.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          </label>
        ))}
        <label className="flex items-center gap-2 pb-2 text-sm font-semibold text-ink-700">
          <input type="checkbox" name="drilling" value="1" defaultChecked={raw.drilling === '1'} className="accent-petrol-600" />
          Drills hub flanges
        </label>
        <button type="submit" className="rounded bg-petrol-600 px-4 py-2 text-sm font-semibold text-white hover:bg-petrol-700">
          Show
        </button>
        {Object.keys(filter).length > 0 && <Link href="/builders">Clear</Link>}
      </form>
      <BuilderMapLoader shops={shops.map(({ slug, name, city, region, latitude, longitude, summary }) => ({ slug, name, city, region, latitude, longitude, summary }))} attribution={MAP_ATTRIBUTION} />
      <p className="mt-2 text-sm text-ink-500" data-testid="shop-count">
        {shops.length === 0 ? 'No shop matches these filters yet. Try fewer.' : `${shops.length} shop${shops.length === 1 ? '' : 's'}`}
      </p>
      <ul className="mt-4 grid gap-3 sm:grid-cols-2">
        {shops.map((s) => (
          <li key={s.slug}>
            <Card>
              <Link href={`/shops/${s.slug}`} className="font-display text-lg font-bold">
                {s.name}
              </Link>
              <p className="text-sm text-ink-500">
                {s.city}, {s.region}
              </p>
              <p className="mt-1 text-sm">{s.summary}</p>
            </Card>
          </li>
        ))}
      </ul>
    </>
  );
}
