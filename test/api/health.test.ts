import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import { DEMO_USERS } from '../../api/services/seed';
import { seedDemoData } from '../../api/services/seed';

let api: ApiHarness;
beforeAll(async () => {
  api = await startApi();
});
afterAll(async () => {
  await api.close();
});

describe('GET /api/health', () => {
  it('answers ok with the applied migrations counted from PostgreSQL', async () => {
    const res = await request(api.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'ok' });
    expect(res.body.migrations).toBeGreaterThanOrEqual(1);
  });

  it('sends security headers (helmet) and no x-powered-by', async () => {
    const res = await request(api.app).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('error handling', () => {
  it('answers an unknown API path with a JSON 404', async () => {
    const res = await request(api.app).get('/api/no-such-thing').expect(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'No API route for GET /api/no-such-thing.' });
  });

  it('answers malformed JSON with a 400 naming the problem, not a crash', async () => {
    const res = await request(api.app).post('/api/health').set('content-type', 'application/json').send('{"a": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('entity.parse.failed');
  });
});

describe('schema and demo data', () => {
  it('has the migrated tables with the role constraint enforced by PostgreSQL', async () => {
    const tables: { table_name: string }[] = await api.dataSource.query(
      `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`,
    );
    expect(tables.map((t) => t.table_name)).toEqual(['memberships', 'migrations', 'session', 'users', 'workspaces']);
    const [{ id: userId }] = await api.dataSource.query(`SELECT id FROM users LIMIT 1`);
    const [{ id: wsId }] = await api.dataSource.query(`SELECT id FROM workspaces LIMIT 1`);
    await expect(
      api.dataSource.query(`INSERT INTO memberships (user_id, workspace_id, role) VALUES ($1, $2, 'owner')`, [userId, wsId]),
    ).rejects.toThrow(/check constraint/);
  });

  it('seeds the demo team idempotently', async () => {
    await seedDemoData(api.dataSource);
    await seedDemoData(api.dataSource);
    const rows: { email: string; role: string }[] = await api.dataSource.query(
      `SELECT u.email, m.role FROM memberships m JOIN users u ON u.id = m.user_id ORDER BY u.email`,
    );
    expect(rows).toEqual(DEMO_USERS.map((u) => ({ email: u.email, role: u.role })).sort((a, b) => a.email.localeCompare(b.email)));
  });
});
