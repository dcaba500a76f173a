import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import { DEMO_USERS, seedDemoData } from '../../api/services/seed';

let api: ApiHarness;
beforeAll(async () => {
  api = await startApi();
});
afterAll(async () => {
  await api.close();
});

describe('GET /api/health', () => {
  it('answers ok with the applied migrations counted from PostgreSQL', async () => {
    const res = await api.client().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'ok' });
    expect(res.body.migrations).toBeGreaterThanOrEqual(2);
  });

  it('sends security headers (helmet), no x-powered-by, and no HSTS over plain http', async () => {
    const res = await api.client().get('/api/health');
    expect(res.headers.get('content-security-policy')).toContain("default-src 'self'");
    expect(res.headers.get('content-security-policy')).not.toContain('upgrade-insecure-requests');
    expect(res.headers.get('strict-transport-security')).toBeNull();
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(res.headers.get('x-powered-by')).toBeNull();
  });
});

describe('schema and demo data', () => {
  it('has the migrated tables with the role constraint enforced by PostgreSQL', async () => {
    const tables: { table_name: string }[] = await api.dataSource.query(
      `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`,
    );
    expect(tables.map((t) => t.table_name)).toEqual([
      'audit_log', 'block_versions', 'blocks', 'invitations', 'memberships', 'migrations', 'netlist_revisions', 'netlists', 'rate_limit_hits', 'reviews', 'session', 'share_links', 'share_openings', 'users', 'workspaces',
    ]);
    const [{ id: userId }] = await api.dataSource.query(`SELECT id FROM users LIMIT 1`);
    const [{ id: wsId }] = await api.dataSource.query(`SELECT id FROM workspaces WHERE slug = 'tidepool'`);
    await expect(
      api.dataSource.query(`INSERT INTO memberships (user_id, workspace_id, role) VALUES ($1, $2, 'owner')`, [userId, wsId]),
    ).rejects.toThrow(/check constraint/);
  });

  it('seeds the demo teams idempotently', async () => {
    await seedDemoData(api.dataSource);
    await seedDemoData(api.dataSource);
    const rows: { email: string; slug: string; role: string }[] = await api.dataSource.query(
      `SELECT u.email, w.slug, m.role FROM memberships m JOIN users u ON u.id = m.user_id JOIN workspaces w ON w.id = m.workspace_id
       WHERE u.email = ANY($1) ORDER BY u.email`,
      [DEMO_USERS.map((u) => u.email)],
    );
    expect(rows).toEqual(DEMO_USERS.map((u) => ({ email: u.email, slug: u.workspace, role: u.role })).sort((a, b) => a.email.localeCompare(b.email)));
  });

  it('connects as a role that is not a superuser and cannot create databases or roles', async () => {
    const [r] = await api.dataSource.query(`SELECT rolsuper, rolcreatedb, rolcreaterole FROM pg_roles WHERE rolname = current_user`);
    expect(r).toEqual({ rolsuper: false, rolcreatedb: false, rolcreaterole: false });
  });
});
