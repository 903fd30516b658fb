// First-load JavaScript per page route, read from a production build: the scripts the HTML of a route
// loads are the build's root scripts plus the entry chunks of every segment on the route (layouts, error
// and not-found boundaries, the page), as the route's client reference manifest lists them. Each is
// gzip-compressed (zlib's default level, as a server would send it) and summed. Scripts loaded later
// through next/dynamic are not counted; polyfills (nomodule, skipped by current browsers) are not either.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

export interface RouteWeight {
  route: string;
  scripts: string[];
  gzipBytes: number;
}

export class BuildOutput {
  private gzipCache = new Map<string, number>();
  private textCache = new Map<string, string>();
  readonly rootScripts: string[];

  constructor(readonly dir: string) {
    const manifest = JSON.parse(fs.readFileSync(path.join(dir, 'build-manifest.json'), 'utf8')) as { rootMainFiles: string[] };
    this.rootScripts = manifest.rootMainFiles;
  }

  static exists(dir: string): boolean {
    return fs.existsSync(path.join(dir, 'BUILD_ID')) && fs.existsSync(path.join(dir, 'build-manifest.json'));
  }

  text(script: string): string {
    let t = this.textCache.get(script);
    if (t === undefined) {
      t = fs.readFileSync(path.join(this.dir, script), 'utf8');
      this.textCache.set(script, t);
    }
    return t;
  }

  gzipBytes(script: string): number {
    let n = this.gzipCache.get(script);
    if (n === undefined) {
      n = zlib.gzipSync(fs.readFileSync(path.join(this.dir, script))).length;
      this.gzipCache.set(script, n);
    }
    return n;
  }

  /** Every page route with its first-load scripts, e.g. "/(builder)/board/page". */
  routes(): RouteWeight[] {
    const manifests: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(p);
        else if (entry.name === 'page_client-reference-manifest.js') manifests.push(p);
      }
    };
    walk(path.join(this.dir, 'server', 'app'));
    const out: RouteWeight[] = [];
    for (const file of manifests) {
      // The manifest is a script that fills globalThis.__RSC_MANIFEST; run it against a local object.
      const holder: { __RSC_MANIFEST: Record<string, { entryJSFiles?: Record<string, string[]> }> } = { __RSC_MANIFEST: {} };
      new Function('globalThis', fs.readFileSync(file, 'utf8'))(holder);
      for (const [route, m] of Object.entries(holder.__RSC_MANIFEST)) {
        const scripts = [...new Set([...this.rootScripts, ...Object.values(m.entryJSFiles ?? {}).flat()])].filter((s) => s.endsWith('.js'));
        out.push({ route, scripts, gzipBytes: scripts.reduce((sum, s) => sum + this.gzipBytes(s), 0) });
      }
    }
    return out.sort((a, b) => a.route.localeCompare(b.route));
  }

  /** Every client script the build can send, loaded first or later. */
  allClientScripts(): string[] {
    const chunks = path.join(this.dir, 'static', 'chunks');
    const out: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(p);
        else if (entry.name.endsWith('.js')) out.push(path.relative(this.dir, p));
      }
    };
    walk(chunks);
    return out;
  }
}

/** "/(builder)/board/page" → "/board". */
export function routePath(route: string): string {
  const p = route
    .replace(/\/page$/, '')
    .split('/')
    .filter((s) => s && !/^\(.*\)$/.test(s))
    .join('/');
  return `/${p}`;
}

export const kB = (bytes: number) => Math.round((bytes / 1024) * 10) / 10;
