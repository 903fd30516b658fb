// Debian packages the benchmark drives: installed with apt when missing, like the start and test commands do.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

export function ensureDebianPackage(pkg: string, probe: string): void {
  if (fs.existsSync(probe)) return;
  console.log(`  installing the Debian package ${pkg}`);
  const sudo = process.getuid?.() === 0 ? [] : ['sudo'];
  const run = (args: string[]) => spawnSync(sudo[0] ?? args[0], sudo.length ? args : args.slice(1), { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  if (run(['apt-get', 'install', '-y', '-qq', '--no-install-recommends', pkg]).status !== 0) {
    run(['apt-get', 'update', '-qq']);
    if (run(['apt-get', 'install', '-y', '-qq', '--no-install-recommends', pkg]).status !== 0) throw new Error(`could not install ${pkg}`);
  }
  if (!fs.existsSync(probe)) throw new Error(`${pkg} installed but ${probe} is missing`);
}
