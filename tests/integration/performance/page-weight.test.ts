// Page weight from the production build the test command makes (NEXT_DIST_DIR, .next-test): each page
// route's first-load JavaScript, gzip-compressed, against a bare page of the same build: the not-found
// page, which loads the root layout and nothing of its own, so the difference is what a route adds.
// Leaflet loads only on the map page, and only when the map is shown; the ZIP dataset never reaches the browser.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { BuildOutput, kB, routePath, type RouteWeight } from './pageWeight';

const DIST_DIR = path.resolve(process.env.NEXT_DIST_DIR ?? '.next-test');
const BASELINE_ROUTE = '/_not-found/page';
const BUDGET_KB = 40;
/** How far under the budget a listed page may come before it must leave the list. */
const LIST_SLACK_KB = 2;
/** Pages that show a map and may load leaflet (on demand). */
const MAP_ROUTES = ['/(public)/builders/page'];
/** Not pages anyone navigates to. */
const NOT_MAIN = ['/_global-error/page', BASELINE_ROUTE];

/**
 * Pages over the budget when it was set (kB above the bare page then: the figure after each name), with
 * the most each may weigh until it is brought under: they may shrink, never grow past the ceiling, and a
 * page that comes in under the budget must leave this list. What they share: react-hook-form with the
 * zod resolver (about 16 kB), TanStack Query (8 to 27 kB), the engine's catalogue for the in-browser fit
 * check (about 5 kB); the rest is the page's own form or detail view.
 */
const OVER_BUDGET_CEILINGS_KB: Record<string, number> = {
  '/(builder)/board/[id]/page': 58, // 54.7: the request as a builder sees it, with the bid form
  '/(rider)/requests/[id]/page': 53, // 50.0: the request with bids, comparison, messages and photos
  '/(rider)/requests/[id]/edit/page': 46, // 42.9: the request form
  '/(rider)/requests/new/page': 46, // 42.9: the request form
  '/(builder)/shop/settings/page': 44, // 40.3: the shop settings form
};

const hasBuild = BuildOutput.exists(DIST_DIR);
if (!hasBuild && process.env.CI) throw new Error(`no production build in ${DIST_DIR}: the test command builds before the tests`);

describe.skipIf(!hasBuild)(`first-load JavaScript (${path.basename(DIST_DIR)})`, () => {
  const build = hasBuild ? new BuildOutput(DIST_DIR) : (null as unknown as BuildOutput);
  const routes: RouteWeight[] = hasBuild ? build.routes() : [];
  const baseline = routes.find((r) => r.route === BASELINE_ROUTE);
  const main = routes.filter((r) => !NOT_MAIN.includes(r.route) && !MAP_ROUTES.includes(r.route));

  it('prints the table', () => {
    expect(baseline, `no ${BASELINE_ROUTE} in the build`).toBeDefined();
    expect(main.length).toBeGreaterThan(5);
    const lines = routes.map((r) => {
      const over = kB(r.gzipBytes - baseline!.gzipBytes);
      const note = r.route === BASELINE_ROUTE ? 'bare page (baseline)' : MAP_ROUTES.includes(r.route) ? 'map page' : NOT_MAIN.includes(r.route) ? '' : over <= BUDGET_KB ? 'within budget' : `over budget by ${kB((over - BUDGET_KB) * 1024)} kB${OVER_BUDGET_CEILINGS_KB[r.route] ? ` (held at +${OVER_BUDGET_CEILINGS_KB[r.route]} kB)` : ''}`;
      return `${routePath(r.route).padEnd(34)} ${String(kB(r.gzipBytes)).padStart(7)} kB  ${(over >= 0 ? '+' : '') + over} kB`.padEnd(62) + ` ${String(r.scripts.length).padStart(3)} scripts  ${note}`;
    });
    console.log(`First-load JavaScript, gzip, budget +${BUDGET_KB} kB over the bare page:\n${lines.join('\n')}`);
  });

  it(`keeps every page without a map within ${BUDGET_KB} kB of the bare page`, () => {
    const over = main
      .map((r) => ({ route: r.route, aboveKb: kB(r.gzipBytes - baseline!.gzipBytes) }))
      .filter((r) => r.aboveKb > (OVER_BUDGET_CEILINGS_KB[r.route] ?? BUDGET_KB));
    expect(over).toEqual([]);
  });

  it('keeps the list of pages over budget honest: each page still there and not clearly within budget', () => {
    for (const route of Object.keys(OVER_BUDGET_CEILINGS_KB)) {
      const r = routes.find((x) => x.route === route);
      expect(r, `${route} is not in the build: remove it from the list`).toBeDefined();
      // A little slack, so a page hovering at the budget does not flip the check from one build to the next.
      expect(kB(r!.gzipBytes - baseline!.gzipBytes), `${route} is within budget now: remove it from the list`).toBeGreaterThan(BUDGET_KB - LIST_SLACK_KB);
    }
  });

  it('loads leaflet only on the map page, and there only on demand', () => {
    const leaflet = build.allClientScripts().filter((s) => build.text(s).includes('leaflet-container'));
    expect(leaflet.length, 'leaflet is not in the build at all: has the map changed?').toBeGreaterThan(0);
    for (const r of routes) {
      expect(r.scripts.filter((s) => leaflet.includes(s)), `${r.route} loads leaflet before anything asks for it`).toEqual([]);
      const referencing = r.scripts.filter((s) => leaflet.some((l) => build.text(s).includes(path.basename(l))));
      if (MAP_ROUTES.includes(r.route)) expect(referencing.length, `${r.route} cannot load its map`).toBeGreaterThan(0);
      else expect(referencing, `${r.route} can reach leaflet`).toEqual([]);
    }
  });

  it('never sends the ZIP dataset to the browser', () => {
    for (const s of build.allClientScripts()) {
      const text = build.text(s);
      // The dataset's first entry (New York 10001 and its centroid), in JSON or as an object literal.
      expect(/["']?zip["']?\s*:\s*["']10001["']/.test(text) || text.includes('40.7484'), `${s} holds ZIP data`).toBe(false);
      expect(Buffer.byteLength(text), `${s} is over 1 MiB`).toBeLessThan(1024 * 1024);
    }
  });
});
