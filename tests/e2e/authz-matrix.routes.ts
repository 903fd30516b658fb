// Every API route and the methods it exports, read from the route files themselves.
import fs from 'node:fs';
import path from 'node:path';
import type { Method } from './authz-matrix.table';

const METHODS: readonly Method[] = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'];

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return routeFiles(full);
    return /^route\.(ts|tsx|js)$/.test(entry.name) ? [full] : [];
  });
}

/** Methods a route file exports: `export const GET`, `export async function POST`, `export { handler as GET }`. */
export function exportedMethods(source: string): Method[] {
  const found = new Set<Method>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) found.add(m[1] as Method);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(',')) {
      const name = part.trim().split(/\s+as\s+/).pop()?.trim();
      if (name && (METHODS as readonly string[]).includes(name)) found.add(name as Method);
    }
  }
  return METHODS.filter((m) => found.has(m));
}

export interface DiscoveredRoute {
  route: string;
  method: Method;
  file: string;
}

export function discoverApiRoutes(root = process.cwd()): DiscoveredRoute[] {
  const apiDir = path.join(root, 'app/api');
  return routeFiles(apiDir)
    .flatMap((file) => {
      const segments = path
        .relative(path.join(root, 'app'), path.dirname(file))
        .split(path.sep)
        .filter((seg) => !/^\(.*\)$/.test(seg)); // route groups do not show in the URL
      const route = `/${segments.join('/')}`;
      return exportedMethods(fs.readFileSync(file, 'utf8')).map((method) => ({ route, method, file: path.relative(root, file) }));
    })
    .sort((a, b) => a.route.localeCompare(b.route) || a.method.localeCompare(b.method));
}
