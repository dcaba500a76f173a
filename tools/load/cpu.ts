/**
 * Where the machine's CPU went during a phase: this process (the server and the clients share
 * it, in two threads), the PostgreSQL cluster's processes, and everything else on the machine.
 * Two cores are shared by all of them, so requests/s mean little without this beside them.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { Worker } from 'node:worker_threads';

const TICKS = 100; // USER_HZ on Linux

/** Busy and total jiffies of all cores, from /proc/stat. */
function machine(): { busy: number; total: number } {
  const fields = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1).map(Number);
  const total = fields.reduce((a, b) => a + b, 0);
  const idle = fields[3] + (fields[4] ?? 0);
  return { busy: total - idle, total };
}

/** CPU jiffies of the postmaster whose pid file is in `dataDir` and of its children. */
function cluster(dataDir: string): number {
  const pidFile = join(dataDir, 'postmaster.pid');
  if (!existsSync(pidFile)) return 0;
  const postmaster = readFileSync(pidFile, 'utf8').split('\n')[0].trim();
  let jiffies = 0;
  for (const pid of readdirSync('/proc')) {
    if (!/^\d+$/.test(pid)) continue;
    try {
      // Fields after the command's closing parenthesis: state, ppid, … utime is 14th, stime 15th.
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      if (pid === postmaster || rest[1] === postmaster) jiffies += Number(rest[11]) + Number(rest[12]);
    } catch {
      // The process ended while we looked.
    }
  }
  return jiffies;
}

export interface CpuFigures {
  /** Core-seconds per second of the phase (2.0 = both cores all the time). */
  machineCores: number;
  nodeProcessCores: number;
  /** PostgreSQL's; null when the cluster restarted during the phase (its counters restarted too). */
  postgresCores: number | null;
  /** Event-loop busy fraction of the server's thread and of the clients' thread. */
  serverLoop: number;
  clientsLoop: number;
}

export function cpuMeter(dataDir: string, server: Worker, clients: Worker) {
  const t0 = performance.now();
  const m0 = machine();
  const p0 = process.cpuUsage();
  const pg0 = cluster(dataDir);
  const s0 = server.performance.eventLoopUtilization();
  const c0 = clients.performance.eventLoopUtilization();
  return (clusterRestarted: boolean): CpuFigures => {
    const seconds = (performance.now() - t0) / 1000;
    const m1 = machine();
    const p1 = process.cpuUsage(p0);
    const round = (v: number) => Math.round(v * 100) / 100;
    return {
      machineCores: round(((m1.busy - m0.busy) / (m1.total - m0.total)) * (readFileSync('/proc/stat', 'utf8').match(/^cpu\d+/gm)?.length ?? 1)),
      nodeProcessCores: round((p1.user + p1.system) / 1e6 / seconds),
      postgresCores: clusterRestarted ? null : round((cluster(dataDir) - pg0) / TICKS / seconds),
      serverLoop: round(server.performance.eventLoopUtilization(s0).utilization),
      clientsLoop: round(clients.performance.eventLoopUtilization(c0).utilization),
    };
  };
}
