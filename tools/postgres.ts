/**
 * A project-local PostgreSQL cluster built from Debian's server binaries.
 *
 * - data under `.data/pg` (git-ignored), listening on 127.0.0.1 only, port NODEWRIGHT_PG_PORT
 *   (default 54329), Unix socket inside the data folder so it never collides with a system server;
 * - as root the server runs as the unprivileged `postgres` user (PostgreSQL refuses root);
 * - idempotent: a running cluster is reused (and then left running), a stale pid file is removed;
 * - missing binaries: installed with apt-get when root, else the exact command is printed.
 *
 * CLI: `tsx tools/postgres.ts start|stop|status`.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join, resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '..');
export const PG_PORT = Number(process.env.NODEWRIGHT_PG_PORT ?? 54329);
export const PG_USER = 'nodewright';
const isRoot = process.getuid?.() === 0;
const RUN_AS = 'postgres';

export interface PostgresHandle {
  /** Connection URL for a database of this cluster. */
  url(database: string): string;
  port: number;
  /** True when this process started the server (and so must stop it). */
  startedHere: boolean;
  /** Stops the server if this process started it. Safe to call twice. */
  stop(): void;
}

function findBinDir(): string | undefined {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return undefined;
  const versions = readdirSync(base).filter((v) => existsSync(join(base, v, 'bin', 'pg_ctl'))).sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], 'bin') : undefined;
}

function installServer(): string {
  const command = 'apt-get update && apt-get install -y postgresql-15';
  if (!isRoot) {
    throw new Error(`PostgreSQL server binaries not found. Install them with:\n  sudo sh -c '${command}'`);
  }
  console.log('PostgreSQL server not found; installing Debian\'s postgresql-15 with apt-get…');
  // Keep Debian from creating and starting its own cluster on port 5432.
  mkdirSync('/etc/postgresql-common', { recursive: true });
  const conf = '/etc/postgresql-common/createcluster.conf';
  if (!existsSync(conf) || !/^create_main_cluster\s*=\s*false/m.test(readFileSync(conf, 'utf8'))) {
    writeFileSync(conf, (existsSync(conf) ? readFileSync(conf, 'utf8') : '') + '\ncreate_main_cluster = false\n');
  }
  const r = spawnSync('sh', ['-c', command], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  const bin = findBinDir();
  if (r.status !== 0 || !bin) throw new Error(`Installing PostgreSQL failed; run it by hand:\n  ${command}`);
  return bin;
}

/** Whether `user` can reach `dir` (every folder above the data folder must be traversable). */
function userCanReach(dir: string, user: string): boolean {
  return spawnSync('runuser', ['-u', user, '--', 'test', '-x', dir]).status === 0;
}

/**
 * The data folder: `.data/pg` in the project; as root, when the server user cannot reach the
 * project folder (e.g. a clone inside a private directory), a folder under /var/tmp named after it.
 */
function dataDir(): string {
  if (process.env.NODEWRIGHT_PG_DATA) return resolve(process.env.NODEWRIGHT_PG_DATA);
  const local = join(ROOT, '.data', 'pg');
  mkdirSync(join(ROOT, '.data'), { recursive: true });
  if (!isRoot) return local;
  chmodSync(join(ROOT, '.data'), 0o755);
  if (userCanReach(join(ROOT, '.data'), RUN_AS)) return local;
  const tag = createHash('sha1').update(ROOT).digest('hex').slice(0, 10);
  return `/var/tmp/nodewright-pg-${tag}`;
}

function run(bin: string, tool: string, args: string[], opts: { allowFail?: boolean } = {}): { status: number; out: string } {
  const cmd = isRoot ? 'runuser' : join(bin, tool);
  const argv = isRoot ? ['-u', RUN_AS, '--', join(bin, tool), ...args] : args;
  const r = spawnSync(cmd, argv, { encoding: 'utf8', cwd: '/' });
  const out = `${r.stdout ?? ''}${r.stderr ?? ''}`;
  if (r.status !== 0 && !opts.allowFail) throw new Error(`${tool} ${args.join(' ')} failed:\n${out}`);
  return { status: r.status ?? 1, out };
}

function ensureCluster(bin: string, data: string): void {
  if (existsSync(join(data, 'PG_VERSION'))) return;
  mkdirSync(data, { recursive: true });
  if (isRoot) {
    const ids = execFileSync('id', ['-u', RUN_AS], { encoding: 'utf8' }).trim();
    const gid = execFileSync('id', ['-g', RUN_AS], { encoding: 'utf8' }).trim();
    chownSync(data, Number(ids), Number(gid));
  }
  chmodSync(data, 0o700);
  run(bin, 'initdb', ['-D', data, '-U', PG_USER, '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8', '--no-instructions']);
  const conf = [
    "listen_addresses = '127.0.0.1'",
    `unix_socket_directories = '${data}'`,
    'fsync = off', // a development and test cluster: speed over crash safety
    'synchronous_commit = off',
    'full_page_writes = off',
    "log_min_messages = warning",
  ].join('\n');
  const file = join(data, 'postgresql.auto.conf');
  if (isRoot) {
    spawnSync('runuser', ['-u', RUN_AS, '--', 'sh', '-c', `cat >> '${file}'`], { input: conf + '\n' });
  } else {
    writeFileSync(file, readFileSync(file, 'utf8') + conf + '\n');
  }
}

function isRunning(bin: string, data: string): boolean {
  if (run(bin, 'pg_ctl', ['status', '-D', data], { allowFail: true }).status !== 0) return false;
  // A killed server whose parent never reaps it stays a zombie that pg_ctl counts as alive.
  const pidFile = join(data, 'postmaster.pid');
  const pid = existsSync(pidFile) ? readFileSync(pidFile, 'utf8').split('\n')[0].trim() : '';
  const stat = pid && existsSync(`/proc/${pid}/stat`) ? readFileSync(`/proc/${pid}/stat`, 'utf8') : '';
  return !/^\d+ \(.*\) Z /.test(stat);
}

/** Starts (or reuses) the project's cluster and makes sure `databases` exist. */
export function startPostgres(): PostgresHandle {
  const bin = findBinDir() ?? installServer();
  const data = dataDir();
  ensureCluster(bin, data);
  let startedHere = false;
  if (!isRunning(bin, data)) {
    // pg_ctl status said no server: a leftover pid file (killed machine) would block the start.
    // The socket lock in the data folder names the same dead pid.
    rmSync(join(data, 'postmaster.pid'), { force: true });
    for (const f of readdirSync(data)) if (/^\.s\.PGSQL\.\d+(\.lock)?$/.test(f)) rmSync(join(data, f), { force: true });
    const log = join(data, 'server.log');
    run(bin, 'pg_ctl', ['start', '-w', '-t', '30', '-D', data, '-l', log, '-o', `-p ${PG_PORT}`]);
    startedHere = true;
  }
  let stopped = false;
  return {
    port: PG_PORT,
    startedHere,
    url: (database) => `postgres://${PG_USER}@127.0.0.1:${PG_PORT}/${database}`,
    stop() {
      if (!startedHere || stopped) return;
      stopped = true;
      run(bin, 'pg_ctl', ['stop', '-w', '-m', 'fast', '-D', data], { allowFail: true });
    },
  };
}

/** Stops the cluster whoever started it. */
export function stopPostgres(): void {
  const bin = findBinDir();
  if (!bin) return;
  const data = dataDir();
  if (existsSync(join(data, 'PG_VERSION')) && isRunning(bin, data)) run(bin, 'pg_ctl', ['stop', '-w', '-m', 'fast', '-D', data]);
}

if (import.meta.filename === resolve(process.argv[1] ?? '')) {
  const verb = process.argv[2];
  try {
    if (verb === 'start') {
      const pg = startPostgres();
      console.log(`PostgreSQL on ${pg.url('postgres')}${pg.startedHere ? '' : ' (already running)'}`);
    } else if (verb === 'stop') {
      stopPostgres();
      console.log('PostgreSQL stopped.');
    } else if (verb === 'status') {
      const bin = findBinDir();
      console.log(bin && isRunning(bin, dataDir()) ? `running on port ${PG_PORT}` : 'not running');
    } else {
      console.error('usage: tsx tools/postgres.ts start|stop|status');
      process.exit(2);
    }
  } catch (e) {
    console.error((e as Error).message);
    process.exit(1);
  }
}
