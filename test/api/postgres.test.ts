/**
 * The project's own PostgreSQL script, on a throw-away cluster of its own (its own data folder and
 * port), so the cluster the other tests use is never touched.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT } from '../../tools/postgres';

const port = 54300 + (process.pid % 90);
const data = process.getuid?.() === 0 ? `/var/tmp/nodewright-pgtest-${process.pid}` : join(ROOT, '.tmp', `pgtest-${process.pid}`);
const env = { ...process.env, NODEWRIGHT_PG_DATA: data, NODEWRIGHT_PG_PORT: String(port) };

function pgScript(verb: string): { status: number; out: string; ms: number } {
  const t0 = Date.now();
  const r = spawnSync(join(ROOT, 'node_modules', '.bin', 'tsx'), ['tools/postgres.ts', verb], { cwd: ROOT, env, encoding: 'utf8' });
  return { status: r.status ?? 1, out: `${r.stdout}${r.stderr}`, ms: Date.now() - t0 };
}

async function selectOne(): Promise<number> {
  const client = new pg.Client({ connectionString: `postgres://nodewright@127.0.0.1:${port}/postgres` });
  await client.connect();
  try {
    const { rows } = await client.query('SELECT 1 AS one');
    return rows[0].one;
  } finally {
    await client.end();
  }
}

function serverPids(): string[] {
  const out = spawnSync('pgrep', ['-f', `postgres -D ${data}`], { encoding: 'utf8' }).stdout.trim();
  return out ? out.split('\n') : [];
}

afterAll(() => {
  pgScript('stop');
  rmSync(data, { recursive: true, force: true });
});

describe('tools/postgres.ts', () => {
  it('creates a cluster on loopback, reuses it on a second start, and stops it', async () => {
    const first = pgScript('start');
    expect(first.status, first.out).toBe(0);
    expect(await selectOne()).toBe(1);
    const conf = readFileSync(join(data, 'postgresql.auto.conf'), 'utf8');
    expect(conf).toContain("listen_addresses = '127.0.0.1'");
    if (process.getuid?.() === 0) {
      // PostgreSQL refuses root: the server runs as an unprivileged user.
      const owner = execFileSync('ps', ['-o', 'user=', '-p', serverPids()[0]], { encoding: 'utf8' }).trim();
      expect(owner).not.toBe('root');
    }
    const second = pgScript('start');
    expect(second.out).toContain('already running');
    expect(pgScript('stop').status).toBe(0);
    expect(serverPids()).toEqual([]);
    expect(pgScript('status').out).toContain('not running');
  }, 60_000);

  it('starts again after the server was killed and left a stale pid file', async () => {
    expect(pgScript('start').status).toBe(0);
    const pid = readFileSync(join(data, 'postmaster.pid'), 'utf8').split('\n')[0];
    process.kill(Number(pid), 'SIGKILL');
    for (let i = 0; i < 50 && serverPids().length; i++) await new Promise((r) => setTimeout(r, 100));
    expect(existsSync(join(data, 'postmaster.pid'))).toBe(true);
    const restart = pgScript('start');
    expect(restart.status, restart.out).toBe(0);
    expect(await selectOne()).toBe(1);
  }, 60_000);
});
