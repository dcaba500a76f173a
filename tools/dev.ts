/**
 * `npm run dev`: the API on its port (restarted by tsx watch on change) and `ng serve` on 4200
 * with a proxy of /api to it (proxy.conf.json). Ctrl-C stops both and PostgreSQL.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { prepareDatabase } from './database';
import { onStopRequest } from './lifecycle';
import { ROOT, startPostgres } from './postgres';

const pg = startPostgres();
const databaseUrl = await prepareDatabase(pg, process.env.NODEWRIGHT_DB ?? 'nodewright', { seed: true });
const env = { ...process.env, NODEWRIGHT_DATABASE_URL: databaseUrl };
const children: ChildProcess[] = [
  spawn(join(ROOT, 'node_modules', '.bin', 'tsx'), ['watch', 'api/main.ts'], { cwd: ROOT, stdio: 'inherit', env }),
  spawn(join(ROOT, 'node_modules', '.bin', 'ng'), ['serve'], { cwd: ROOT, stdio: 'inherit', env }),
];
console.log('API on http://127.0.0.1:4280, app with live reload on http://127.0.0.1:4200');

let stopping = false;
function stop(): void {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => {
    pg.stop();
    process.exit(0);
  }, 1500);
}
onStopRequest(stop);
for (const c of children) c.on('exit', stop);
