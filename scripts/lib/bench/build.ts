// The production build the benchmark serves, in its own folder so it never disturbs the start command's
// or the test command's build. Rebuilt only when the sources changed since the last one.
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export const BENCH_DIST_DIR = '.next-bench';

export function buildIfChanged(root: string, env: NodeJS.ProcessEnv): 'built' | 'current' {
  const dist = path.join(root, BENCH_DIST_DIR);
  const stampFile = path.join(dist, 'lacewright-build-stamp');
  const stamp = crypto
    .createHash('sha1')
    .update(execFileSync('git', ['rev-parse', 'HEAD'], { cwd: root, encoding: 'utf8' }))
    .update(execFileSync('git', ['status', '--porcelain'], { cwd: root, encoding: 'utf8' }))
    .digest('hex');
  if (fs.existsSync(path.join(dist, 'BUILD_ID')) && fs.existsSync(stampFile) && fs.readFileSync(stampFile, 'utf8') === stamp) return 'current';
  execFileSync(path.join(root, 'node_modules/.bin/next'), ['build'], { cwd: root, stdio: 'inherit', env: { ...env, NEXT_DIST_DIR: BENCH_DIST_DIR, NEXT_TELEMETRY_DISABLED: '1' } });
  fs.writeFileSync(stampFile, stamp);
  forgetDistTypes(root);
  return 'built';
}

/** next build adds its folder's generated types to tsconfig.json; this folder is the benchmark's alone, so take them out again. */
function forgetDistTypes(root: string): void {
  const file = path.join(root, 'tsconfig.json');
  const text = fs.readFileSync(file, 'utf8');
  const cleaned = text.replace(new RegExp(`,\\s*"${BENCH_DIST_DIR.replace('.', '\\.')}/(dev/)?types/\\*\\*/\\*\\.ts"`, 'g'), '');
  if (cleaned !== text) fs.writeFileSync(file, cleaned);
}
