// CPU time the server spends, read from /proc: the app's process group (next start and anything it forks)
// and the database sessions serving it. Divided by the requests of a run, it tells what one request costs
// however busy the rest of the machine is, which throughput and latency on a shared machine cannot.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import type pg from 'pg';

let ticksPerSecond: number | null = null;
function clockTicks(): number {
  if (ticksPerSecond === null) {
    try {
      ticksPerSecond = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
    } catch {
      ticksPerSecond = 100;
    }
  }
  return ticksPerSecond;
}

interface Stat {
  pgrp: number;
  cpuTicks: number;
}

function readStat(pid: number): Stat | null {
  try {
    const text = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // Fields after the command name (which is in parentheses and may hold spaces): state is field 3.
    const rest = text.slice(text.lastIndexOf(')') + 2).split(' ');
    return { pgrp: Number(rest[2]), cpuTicks: Number(rest[11]) + Number(rest[12]) };
  } catch {
    return null;
  }
}

/** CPU milliseconds used so far by every process in a process group. */
export function processGroupCpuMs(pgid: number): number {
  let ticks = 0;
  for (const name of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    const stat = readStat(Number(name));
    if (stat && stat.pgrp === pgid) ticks += stat.cpuTicks;
  }
  return (ticks * 1000) / clockTicks();
}

/** CPU milliseconds used so far by the other sessions on this database, by backend pid. */
export async function databaseSessionsCpuMs(db: pg.ClientBase, database: string): Promise<Map<number, number>> {
  const { rows } = await db.query<{ pid: number }>('select pid from pg_stat_activity where datname = $1 and pid <> pg_backend_pid()', [database]);
  const out = new Map<number, number>();
  for (const { pid } of rows) {
    const stat = readStat(pid);
    if (stat) out.set(pid, (stat.cpuTicks * 1000) / clockTicks());
  }
  return out;
}

/** Database CPU between two readings (sessions that opened in between count from zero). */
export function databaseCpuDelta(before: Map<number, number>, after: Map<number, number>): number {
  let sum = 0;
  for (const [pid, ms] of after) sum += ms - (before.get(pid) ?? 0);
  return sum;
}
