import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Users, workspaces, memberships with their role, and the session table of connect-pg-simple. */
export class Initial1764600000000 implements MigrationInterface {
  name = 'Initial1764600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL UNIQUE,
      display_name text NOT NULL,
      oidc_subject text UNIQUE,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE workspaces (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      slug text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9][a-z0-9-]{0,62}$'),
      name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      role text NOT NULL CHECK (role IN ('viewer', 'designer', 'reviewer', 'admin')),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT uq_memberships_user_workspace UNIQUE (user_id, workspace_id))`);
    await q.query(`CREATE INDEX idx_memberships_workspace ON memberships (workspace_id)`);
    // The schema connect-pg-simple expects (its table.sql), owned by our migrations.
    await q.query(`CREATE TABLE session (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL)`);
    await q.query(`CREATE INDEX idx_session_expire ON session (expire)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE session');
    await q.query('DROP TABLE memberships');
    await q.query('DROP TABLE workspaces');
    await q.query('DROP TABLE users');
  }
}
