/**
 * The project's own PostgreSQL script, on throw-away clusters of its own (their own data folders
 * and ports), so the cluster the other tests use is never touched.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { appendFileSync, chownSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../tools/net';
import { ROOT, secretsFile, type ClusterSecrets } from '../../tools/postgres';

const isRoot = process.getuid?.() === 0;
const folder = (name: string) => (isRoot ? `/var/tmp/nodewright-${name}-${process.pid}` : join(ROOT, '.tmp', `${name}-${process.pid}`));

interface Cluster {
  data: string;
  port: number;
}

const fresh: Cluster = { data: folder('pgtest'), port: 0 };
const legacy: Cluster = { data: folder('pgconv'), port: 0 };

function pgScript(c: Cluster, verb: string): { status: number; out: string } {
  const env = { ...process.env, NODEWRIGHT_PG_DATA: c.data, NODEWRIGHT_PG_PORT: String(c.port) };
  const r = spawnSync(join(ROOT, 'node_modules', '.bin', 'tsx'), ['tools/postgres.ts', verb], { cwd: ROOT, env, encoding: 'utf8' });
  return { status: r.status ?? 1, out: `${r.stdout}${r.stderr}` };
}

function secretsOf(c: Cluster): ClusterSecrets {
  return JSON.parse(readFileSync(secretsFile(c.data), 'utf8')) as ClusterSecrets;
}

/** Runs `sql` on `c` as `user` (TCP unless `socket`), returning the rows. */
async function query(c: Cluster, user: string, password: string | undefined, sql: string, options: { database?: string; socket?: boolean } = {}): Promise<Record<string, unknown>[]> {
  const client = new pg.Client({ host: options.socket ? c.data : '127.0.0.1', port: c.port, user, password, database: options.database ?? 'postgres', connectionTimeoutMillis: 5000 });
  await client.connect();
  try {
    return (await client.query(sql)).rows;
  } finally {
    await client.end();
  }
}

function serverPids(c: Cluster): string[] {
  const out = spawnSync('pgrep', ['-f', `postgres -D ${c.data}`], { encoding: 'utf8' }).stdout.trim();
  return out ? out.split('\n') : [];
}

/** Non-comment lines of the cluster's pg_hba.conf. */
function hbaRules(c: Cluster): string[] {
  return readFileSync(join(c.data, 'pg_hba.conf'), 'utf8').split('\n').map((l) => l.trim()).filter((l) => l && !l.startsWith('#'));
}

async function refusesWithoutPassword(c: Cluster, socket = false): Promise<void> {
  // pg refuses to answer a password request without one; a trust rule would never ask.
  await expect(query(c, 'nodewright', undefined, 'SELECT 1', { socket })).rejects.toThrow(/password/i);
  await expect(query(c, 'nodewright', 'wrong-password', 'SELECT 1', { socket })).rejects.toThrow(/password authentication failed/);
}

beforeAll(async () => {
  fresh.port = await freePort();
  legacy.port = await freePort();
});

afterAll(() => {
  for (const c of [fresh, legacy]) {
    pgScript(c, 'stop');
    rmSync(c.data, { recursive: true, force: true });
    rmSync(secretsFile(c.data), { force: true });
  }
});

describe('tools/postgres.ts', () => {
  it('creates a cluster on loopback, reuses it on a second start, and stops it', async () => {
    const first = pgScript(fresh, 'start');
    expect(first.status, first.out).toBe(0);
    const { appPassword } = secretsOf(fresh);
    expect(await query(fresh, 'nodewright', appPassword, 'SELECT 1 AS one')).toEqual([{ one: 1 }]);
    const conf = readFileSync(join(fresh.data, 'postgresql.auto.conf'), 'utf8');
    expect(conf).toContain("listen_addresses = '127.0.0.1'");
    if (isRoot) {
      // PostgreSQL refuses root: the server runs as an unprivileged user.
      const owner = execFileSync('ps', ['-o', 'user=', '-p', serverPids(fresh)[0]], { encoding: 'utf8' }).trim();
      expect(owner).not.toBe('root');
    }
    const second = pgScript(fresh, 'start');
    expect(second.out).toContain('already running');
    expect(pgScript(fresh, 'stop').status).toBe(0);
    expect(serverPids(fresh)).toEqual([]);
    expect(pgScript(fresh, 'status').out).toContain('not running');
  }, 60_000);

  it('starts again after the server was killed and left a stale pid file', async () => {
    expect(pgScript(fresh, 'start').status).toBe(0);
    const pid = readFileSync(join(fresh.data, 'postmaster.pid'), 'utf8').split('\n')[0];
    process.kill(Number(pid), 'SIGKILL');
    for (let i = 0; i < 50 && serverPids(fresh).length; i++) await new Promise((r) => setTimeout(r, 100));
    expect(existsSync(join(fresh.data, 'postmaster.pid'))).toBe(true);
    const restart = pgScript(fresh, 'start');
    expect(restart.status, restart.out).toBe(0);
    expect(await query(fresh, 'nodewright', secretsOf(fresh).appPassword, 'SELECT 1 AS one')).toEqual([{ one: 1 }]);
  }, 60_000);

  it('asks everyone for a password, over TCP and the Unix socket alike', async () => {
    expect(pgScript(fresh, 'start').status).toBe(0);
    await refusesWithoutPassword(fresh);
    await refusesWithoutPassword(fresh, true);
    const rules = hbaRules(fresh);
    expect(rules.length).toBeGreaterThan(0);
    for (const rule of rules) {
      expect(rule).not.toMatch(/\btrust\b/);
      expect(rule).toMatch(/\bscram-sha-256$/);
    }
  }, 60_000);

  it('keeps generated secrets beside the data folder, readable by their owner only', () => {
    const file = secretsFile(fresh.data);
    expect(file.startsWith(fresh.data + '/')).toBe(false);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    const secrets = secretsOf(fresh);
    expect(Object.keys(secrets).sort()).toEqual(['adminPassword', 'appPassword', 'sessionSecret']);
    for (const value of Object.values(secrets)) expect(value).toMatch(/^[0-9a-f]{48,}$/);
    expect(new Set(Object.values(secrets)).size).toBe(3);
  });

  it('gives the app a role that logs in with its password and is not a superuser', async () => {
    const rows = await query(fresh, 'nodewright', secretsOf(fresh).appPassword, `SELECT rolsuper, rolcreatedb, rolcreaterole FROM pg_roles WHERE rolname = current_user`);
    expect(rows).toEqual([{ rolsuper: false, rolcreatedb: false, rolcreaterole: false }]);
    const admin = await query(fresh, 'nodewright_admin', secretsOf(fresh).adminPassword, `SELECT rolsuper FROM pg_roles WHERE rolname = current_user`);
    expect(admin).toEqual([{ rolsuper: true }]);
  }, 30_000);
});

describe('a cluster made by the earlier script (trust authentication)', () => {
  const bin = (tool: string) => {
    const base = '/usr/lib/postgresql';
    const version = readdirSync(base).filter((v) => existsSync(join(base, v, 'bin', tool))).sort((a, b) => Number(b) - Number(a))[0];
    return join(base, version, 'bin', tool);
  };
  /** Runs a server tool as the server's OS user, as the script does. */
  const asServer = (tool: string, args: string[]) => {
    const [cmd, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', bin(tool), ...args]] : [bin(tool), args];
    const r = spawnSync(cmd, argv, { encoding: 'utf8', cwd: '/' });
    if (r.status !== 0) throw new Error(`${tool} failed: ${r.stdout}${r.stderr}`);
  };

  it('is converted in place by `start`: passwords demanded, the app role demoted, its data kept', async () => {
    // Made exactly as the script made clusters before passwords: initdb with trust, app role as
    // the bootstrap superuser, the same settings appended.
    mkdirSync(legacy.data, { recursive: true, mode: 0o700 });
    if (isRoot) chownSync(legacy.data, Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' })), Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' })));
    asServer('initdb', ['-D', legacy.data, '-U', 'nodewright', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8', '--no-instructions']);
    appendFileSync(join(legacy.data, 'postgresql.auto.conf'), [`listen_addresses = '127.0.0.1'`, `unix_socket_directories = '${legacy.data}'`, 'fsync = off', ''].join('\n'));
    asServer('pg_ctl', ['start', '-w', '-t', '30', '-D', legacy.data, '-l', join(legacy.data, 'server.log'), '-o', `-p ${legacy.port}`]);
    await query(legacy, 'nodewright', undefined, 'CREATE DATABASE legacy_work');
    await query(legacy, 'nodewright', undefined, `CREATE TABLE notes (body text); INSERT INTO notes VALUES ('kept across the conversion')`, { database: 'legacy_work' });
    asServer('pg_ctl', ['stop', '-w', '-m', 'fast', '-D', legacy.data]);
    expect(existsSync(secretsFile(legacy.data))).toBe(false);

    const start = pgScript(legacy, 'start');
    expect(start.status, start.out).toBe(0);
    expect(start.out).toMatch(/converted/);

    await refusesWithoutPassword(legacy);
    await refusesWithoutPassword(legacy, true);
    for (const rule of hbaRules(legacy)) expect(rule).not.toMatch(/\btrust\b/);
    expect(statSync(secretsFile(legacy.data)).mode & 0o777).toBe(0o600);
    const { appPassword, adminPassword } = secretsOf(legacy);
    expect(await query(legacy, 'nodewright', appPassword, 'SELECT body FROM notes', { database: 'legacy_work' })).toEqual([{ body: 'kept across the conversion' }]);
    expect(await query(legacy, 'nodewright', appPassword, `SELECT rolsuper, rolcreatedb, rolcreaterole FROM pg_roles WHERE rolname = current_user`)).toEqual([{ rolsuper: false, rolcreatedb: false, rolcreaterole: false }]);
    expect(await query(legacy, 'nodewright_admin', adminPassword, `SELECT rolsuper FROM pg_roles WHERE rolname = current_user`)).toEqual([{ rolsuper: true }]);

    // A second start finds it converted and changes nothing.
    const again = pgScript(legacy, 'start');
    expect(again.out).toContain('already running');
    expect(secretsOf(legacy).appPassword).toBe(appPassword);
  }, 120_000);
});
