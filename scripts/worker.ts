// The background worker as its own process: a tick every WORKER_INTERVAL_MS until SIGINT or SIGTERM,
// finishing the tick in hand before it stops. Run with tsx --conditions=react-server (it uses server-only modules).
import { z } from 'zod';
import { db } from '@/lib/db';
import { runWorkerTick } from '@/lib/jobs/worker';

const intervalMs = z.coerce
  .number()
  .int()
  .min(100, 'WORKER_INTERVAL_MS must be at least 100')
  .default(5_000)
  .parse(process.env.WORKER_INTERVAL_MS || undefined);

let stopping = false;
let wake: (() => void) | null = null;

function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`worker: ${signal}, stopping after the current tick`);
  wake?.();
}
process.on('SIGINT', () => stop('SIGINT'));
process.on('SIGTERM', () => stop('SIGTERM'));

async function main() {
  console.log(`worker: a tick every ${intervalMs} ms`);
  while (!stopping) {
    try {
      const r = await runWorkerTick(db);
      if (r.bidsExpired || r.requestsExpired || r.requestsWarned || r.mail.sent || r.mail.failed) {
        console.log(
          `worker: ${r.bidsExpired} bids expired, ${r.requestsExpired} requests expired, ${r.requestsWarned} warned, ${r.mail.sent} mails sent, ${r.mail.failed} failed`,
        );
      }
    } catch (err) {
      // A bad tick (the database restarting, say) is logged and the next one tries again.
      console.error('worker: tick failed', err);
    }
    if (stopping) break;
    await new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, intervalMs);
      wake = () => {
        clearTimeout(timer);
        resolve();
      };
    });
    wake = null;
  }
  await db.destroy();
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error('worker: stopped on an error', err);
    process.exit(1);
  },
);
