/**
 * A small child process that starts and stops PostgreSQL for the load tool with the project's own
 * script (tools/postgres.ts). Those functions wait on pg_ctl synchronously and fork runuser and
 * pg_ctl: done in the load tool's process they would block the thread that must answer Ctrl-C at
 * once, and each fork would copy a process of some 400 MB with the server in it, stalling the
 * server meanwhile. It is started first, so a stop in phase 2 happens when asked.
 */
import { startPostgres, stopPostgres } from '../postgres';

export type ControlRequest = { verb: 'start'; database: string } | { verb: 'stop' };
export interface Started {
  port: number;
  startedHere: boolean;
  /** The app role's URL of the database, and the administrator's of `postgres` (they carry passwords). */
  url: string;
  adminUrl: string;
}
export type ControlAnswer = { ready: true } | { verb: 'start' | 'stop'; ok: boolean; message?: string; started?: Started };

const send = (answer: ControlAnswer) => process.send!(answer);

process.on('message', (r: ControlRequest) => {
  try {
    if (r.verb === 'stop') {
      stopPostgres();
      send({ verb: r.verb, ok: true });
    } else {
      const pg = startPostgres();
      send({ verb: r.verb, ok: true, started: { port: pg.port, startedHere: pg.startedHere, url: pg.url(r.database), adminUrl: pg.adminUrl('postgres') } });
    }
  } catch (err) {
    send({ verb: r.verb, ok: false, message: (err as Error).message });
  }
});
// Ctrl-C reaches this process too; the load tool decides what to stop, so the signal is not ours.
process.on('SIGINT', () => undefined);
// The load tool going away closes the channel: nothing more to do here.
process.on('disconnect', () => process.exit(0));
send({ ready: true });
