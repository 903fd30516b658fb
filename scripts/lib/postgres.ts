// Manages a PostgreSQL cluster from Debian's server binaries on loopback.
// initdb and postgres refuse to run as root, so as root they run as the `postgres` system user.
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import net from 'node:net';
import os from 'node:os';
import crypto from 'node:crypto';

const PG_BIN_CANDIDATES = ['/usr/lib/postgresql/17/bin', '/usr/lib/postgresql/16/bin', '/usr/lib/postgresql/15/bin'];

export function pgBinDir(): string {
  const found = PG_BIN_CANDIDATES.find((d) => fs.existsSync(path.join(d, 'initdb')));
  if (!found) throw new Error('PostgreSQL server binaries not found; install the Debian package "postgresql".');
  return found;
}

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function runAsServerUser(cmd: string, args: string[]): string {
  const [file, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
  const res = spawnSync(file, argv, { encoding: 'utf8' });
  if (res.status !== 0) {
    throw new Error(`${path.basename(cmd)} failed (${res.status}): ${res.stderr || res.stdout}`);
  }
  return res.stdout;
}

/** Can the server user reach this folder (every parent must be traversable)? */
function serverUserCanReach(dir: string): boolean {
  if (!isRoot) return true;
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/**
 * The folder for a cluster. Prefers the requested one; when the server user can't traverse its parents
 * (a checkout under a private folder), falls back to a folder under /var/tmp named after the request.
 */
export function resolveClusterDir(requested: string): string {
  fs.mkdirSync(path.dirname(requested), { recursive: true });
  if (serverUserCanReach(path.dirname(requested))) return requested;
  const tag = crypto.createHash('sha1').update(path.resolve(requested)).digest('hex').slice(0, 12);
  const fallback = path.join('/var/tmp/lacewright-pg', tag);
  fs.mkdirSync(path.dirname(fallback), { recursive: true, mode: 0o755 });
  fs.chmodSync(path.dirname(fallback), 0o755);
  return fallback;
}

function prepareDir(dir: string): void {
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (isRoot) execFileSync('chown', ['-R', 'postgres:postgres', dir]);
}

export interface ClusterOptions {
  dir: string;
  port: number;
  user?: string;
  /** Trade durability for speed: only for throwaway test clusters. */
  fast?: boolean;
}

export function isClusterInitialised(dir: string): boolean {
  return fs.existsSync(path.join(dir, 'PG_VERSION'));
}

export function initCluster({ dir, user = 'app' }: ClusterOptions): void {
  if (isClusterInitialised(dir)) return;
  prepareDir(dir);
  runAsServerUser(path.join(pgBinDir(), 'initdb'), ['-D', dir, '-U', user, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
}

export function isClusterRunning(dir: string): boolean {
  const bin = path.join(pgBinDir(), 'pg_ctl');
  const [file, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', bin, 'status', '-D', dir]] : [bin, ['status', '-D', dir]];
  return spawnSync(file, argv).status === 0;
}

export function startCluster({ dir, port, fast }: ClusterOptions): void {
  if (isClusterRunning(dir)) return;
  const settings = [`-c listen_addresses=127.0.0.1`, `-p ${port}`, `-k ${dir}`, `-c max_connections=200`];
  if (fast) settings.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
  runAsServerUser(path.join(pgBinDir(), 'pg_ctl'), ['-D', dir, '-o', settings.join(' '), '-l', path.join(dir, 'server.log'), '-w', '-t', '60', 'start']);
}

export function stopCluster(dir: string, mode: 'fast' | 'immediate' = 'fast'): void {
  if (!isClusterInitialised(dir) || !isClusterRunning(dir)) return;
  runAsServerUser(path.join(pgBinDir(), 'pg_ctl'), ['-D', dir, 'stop', '-m', mode, '-w']);
}

export function ensureDatabase({ port, user = 'app' }: ClusterOptions, database: string): void {
  const psql = '/usr/bin/psql';
  const exists = spawnSync(psql, ['-h', '127.0.0.1', '-p', String(port), '-U', user, '-d', 'postgres', '-tAc', `select 1 from pg_database where datname = '${database.replace(/'/g, "''")}'`], { encoding: 'utf8' });
  if (exists.status !== 0) throw new Error(`psql failed: ${exists.stderr}`);
  if (exists.stdout.trim() === '1') return;
  const created = spawnSync(path.join(pgBinDir(), 'createdb'), ['-h', '127.0.0.1', '-p', String(port), '-U', user, database], { encoding: 'utf8' });
  if (created.status !== 0) throw new Error(`createdb failed: ${created.stderr}`);
}

export function databaseUrl(port: number, database: string, user = 'app'): string {
  return `postgres://${user}@127.0.0.1:${port}/${database}`;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/** A throwaway cluster in a temp folder, for tests. */
export async function startThrowawayCluster(): Promise<{ dir: string; port: number; url: (db: string) => string; stop: () => void }> {
  const base = fs.mkdtempSync(path.join(os.tmpdir(), 'lacewright-pg-'));
  fs.chmodSync(base, 0o755);
  const dir = path.join(base, 'data');
  const port = await freePort();
  initCluster({ dir, port });
  startCluster({ dir, port, fast: true });
  return {
    dir,
    port,
    url: (db: string) => {
      ensureDatabase({ dir, port }, db);
      return databaseUrl(port, db);
    },
    stop: () => {
      try {
        stopCluster(dir, 'immediate');
      } finally {
        fs.rmSync(base, { recursive: true, force: true });
      }
    },
  };
}
