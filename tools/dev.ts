/**
 * `npm run dev`: the same database and development fakes as `npm start`, then the API under
 * `tsx watch` (port 4280, restarted on change) and `ng serve` (port 4200) with /api and /auth
 * proxied to it (proxy.conf.json). Ctrl-C stops everything.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { prepareDatabase } from './database';
import { onStopRequest } from './lifecycle';
import { devPorts } from './ports';
import { clusterSecrets, ROOT, startPostgres } from './postgres';
import { startTeamStack } from './team-stack';

const pg = startPostgres();
const databaseUrl = await prepareDatabase(pg, process.env.NODEWRIGHT_DB ?? 'nodewright', { seed: true });
const ports = devPorts();
// The browser talks to ng serve (4200), which proxies /api and /auth: links and the provider's
// callback must name 4200.
const stack = await startTeamStack({
  databaseUrl,
  ...ports,
  apiInProcess: false,
  env: {
    NODEWRIGHT_PUBLIC_URL: 'http://127.0.0.1:4200',
    NODEWRIGHT_OIDC_CALLBACK_URL: 'http://127.0.0.1:4200/auth/callback',
    ...(process.env.NODEWRIGHT_SESSION_SECRET ? {} : { NODEWRIGHT_SESSION_SECRET: clusterSecrets()!.sessionSecret }),
  },
  callbackUrls: ['http://127.0.0.1:4200/auth/callback'],
});
const env = { ...process.env, ...stack.env };
const children: ChildProcess[] = [
  spawn(join(ROOT, 'node_modules', '.bin', 'tsx'), ['watch', 'api/main.ts'], { cwd: ROOT, stdio: 'inherit', env }),
  spawn(join(ROOT, 'node_modules', '.bin', 'ng'), ['serve'], { cwd: ROOT, stdio: 'inherit', env }),
];
console.log(`API on ${stack.url}, app with live reload on http://127.0.0.1:4200, mail inbox on ${stack.mail.inboxUrl}`);

let stopping = false;
function stop(): void {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => {
    void stack.close().finally(() => {
      pg.stop();
      process.exit(0);
    });
  }, 1500);
}
onStopRequest(stop);
for (const c of children) c.on('exit', stop);
