// Child processes for the start command and the browser tests: prefixed output, and all stopped together.
import { spawn, type ChildProcess } from 'node:child_process';

export interface Service {
  name: string;
  child: ChildProcess;
}

const running: Service[] = [];

export function startService(name: string, command: string, args: string[], env: NodeJS.ProcessEnv, opts: { quiet?: boolean } = {}): Service {
  const child = spawn(command, args, { env, stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  const prefix = (chunk: Buffer) =>
    chunk
      .toString()
      .split('\n')
      .filter(Boolean)
      .map((line) => `[${name}] ${line}\n`)
      .join('');
  if (!opts.quiet) {
    child.stdout?.on('data', (c: Buffer) => process.stdout.write(prefix(c)));
    child.stderr?.on('data', (c: Buffer) => process.stderr.write(prefix(c)));
  } else {
    child.stdout?.resume();
    child.stderr?.on('data', (c: Buffer) => {
      if (process.env.LACEWRIGHT_DEBUG) process.stderr.write(prefix(c));
    });
  }
  const service = { name, child };
  running.push(service);
  return service;
}

export async function stopService(service: Service, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  const { child } = service;
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  try {
    process.kill(-child.pid!, signal); // the whole group: tsx and next start grandchildren
  } catch {
    child.kill(signal);
  }
  const timer = setTimeout(() => {
    try {
      process.kill(-child.pid!, 'SIGKILL');
    } catch {
      /* already gone */
    }
  }, 5_000);
  await exited;
  clearTimeout(timer);
  const i = running.indexOf(service);
  if (i >= 0) running.splice(i, 1);
}

/** Signals every running service's process group at once, without waiting: for shutting down in a hurry. */
export function signalAll(signal: NodeJS.Signals): void {
  for (const { child } of running) {
    if (child.exitCode !== null || child.signalCode !== null) continue;
    try {
      process.kill(-child.pid!, signal);
    } catch {
      /* already gone */
    }
  }
}

export async function stopAll(): Promise<void> {
  await Promise.all([...running].reverse().map((s) => stopService(s)));
}

export async function waitForHttp(url: string, timeoutMs: number, isReady: (res: Response) => boolean = (r) => r.ok): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let lastError = '';
  while (Date.now() < deadline) {
    try {
      const res = await fetch(url, { signal: AbortSignal.timeout(2_000) });
      if (isReady(res)) return;
      lastError = `status ${res.status}`;
    } catch (err) {
      lastError = (err as Error).message;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} was not ready within ${timeoutMs} ms (${lastError})`);
}
