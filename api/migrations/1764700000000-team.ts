import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The team half: netlists with every save kept as a revision, invitations, share links and their
 * openings, the audit log, and the rate limiter's counters. Revisions and openings are
 * append-only, enforced by triggers so that even a direct UPDATE in SQL cannot rewrite history.
 */
export class Team1764700000000 implements MigrationInterface {
  name = 'Team1764700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE users ADD COLUMN last_sign_in_at timestamptz`);
    await q.query(`CREATE UNIQUE INDEX uq_users_email_lower ON users (lower(email))`);

    await q.query(`CREATE TABLE netlists (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      owner_id uuid NOT NULL REFERENCES users(id),
      name text NOT NULL CHECK (char_length(name) BETWEEN 1 AND 120),
      visibility text NOT NULL DEFAULT 'workspace' CHECK (visibility IN ('private', 'workspace')),
      version integer NOT NULL DEFAULT 1 CHECK (version >= 1),
      source text NOT NULL,
      size integer NOT NULL CHECK (size >= 0),
      updated_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      deleted_by uuid REFERENCES users(id))`);
    await q.query(`CREATE INDEX idx_netlists_workspace_updated ON netlists (workspace_id, updated_at DESC)`);
    await q.query(`CREATE INDEX idx_netlists_workspace_name ON netlists (workspace_id, lower(name))`);

    await q.query(`CREATE TABLE netlist_revisions (
      netlist_id uuid NOT NULL REFERENCES netlists(id) ON DELETE CASCADE,
      version integer NOT NULL CHECK (version >= 1),
      source text NOT NULL,
      size integer NOT NULL CHECK (size >= 0),
      author_id uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      restored_from integer,
      PRIMARY KEY (netlist_id, version))`);
    await q.query(`CREATE FUNCTION nodewright_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN RAISE EXCEPTION '% rows are never changed once written', TG_TABLE_NAME USING ERRCODE = 'integrity_constraint_violation'; END $$`);
    await q.query(`CREATE TRIGGER netlist_revisions_immutable BEFORE UPDATE ON netlist_revisions
      FOR EACH ROW EXECUTE FUNCTION nodewright_refuse_update()`);

    await q.query(`CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      email text NOT NULL CHECK (email = lower(email)),
      role text NOT NULL CHECK (role IN ('viewer', 'designer', 'reviewer', 'admin')),
      token_hash text NOT NULL UNIQUE,
      invited_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      accepted_by uuid REFERENCES users(id),
      revoked_at timestamptz)`);
    await q.query(`CREATE INDEX idx_invitations_workspace ON invitations (workspace_id, created_at DESC)`);

    await q.query(`CREATE TABLE share_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      netlist_id uuid NOT NULL,
      version integer NOT NULL,
      token_hash text NOT NULL UNIQUE,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz,
      revoked_at timestamptz,
      library_pins jsonb NOT NULL DEFAULT '[]'::jsonb,
      FOREIGN KEY (netlist_id, version) REFERENCES netlist_revisions (netlist_id, version) ON DELETE CASCADE)`);
    await q.query(`CREATE INDEX idx_share_links_netlist ON share_links (netlist_id, created_at DESC)`);
    await q.query(`CREATE TABLE share_openings (
      id bigserial PRIMARY KEY,
      share_id uuid NOT NULL REFERENCES share_links(id) ON DELETE CASCADE,
      opened_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX idx_share_openings_share ON share_openings (share_id, opened_at DESC)`);

    await q.query(`CREATE TABLE audit_log (
      id bigserial PRIMARY KEY,
      at timestamptz NOT NULL DEFAULT now(),
      workspace_id uuid REFERENCES workspaces(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action text NOT NULL CHECK (action ~ '^[a-z_]+\\.[a-z_]+$'),
      target_type text NOT NULL,
      target_id text,
      details jsonb)`);
    await q.query(`CREATE INDEX idx_audit_workspace_at ON audit_log (workspace_id, at DESC)`);
    await q.query(`CREATE TRIGGER audit_log_append_only BEFORE UPDATE ON audit_log
      FOR EACH ROW EXECUTE FUNCTION nodewright_refuse_update()`);

    // Counters of the rate limiter: shared by every API instance, not worth crash safety.
    await q.query(`CREATE UNLOGGED TABLE rate_limit_hits (
      key text PRIMARY KEY,
      hits integer NOT NULL,
      reset_at timestamptz NOT NULL)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE rate_limit_hits');
    await q.query('DROP TABLE audit_log');
    await q.query('DROP TABLE share_openings');
    await q.query('DROP TABLE share_links');
    await q.query('DROP TABLE invitations');
    await q.query('DROP TABLE netlist_revisions');
    await q.query('DROP FUNCTION nodewright_refuse_update');
    await q.query('DROP TABLE netlists');
    await q.query('DROP INDEX uq_users_email_lower');
    await q.query('ALTER TABLE users DROP COLUMN last_sign_in_at');
  }
}
