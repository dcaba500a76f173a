import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The team block library: blocks (a path like `mirrors/wilson_npn` per workspace), their numbered
 * versions and the review thread. A version's source is frozen from its first submission, and its
 * state moves only along draft → in_review → vetted → retired (and in_review → draft when sent
 * back); both rules are enforced here, by a trigger, as well as in the service.
 */
export class Library1764800000000 implements MigrationInterface {
  name = 'Library1764800000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE blocks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      path text NOT NULL CHECK (path ~ '^[a-z][a-z0-9_]{0,39}/[a-z][a-z0-9_]{0,59}$'),
      category text GENERATED ALWAYS AS (split_part(path, '/', 1)) STORED,
      title text NOT NULL CHECK (char_length(title) BETWEEN 1 AND 120),
      summary text NOT NULL DEFAULT '' CHECK (char_length(summary) <= 2000),
      tags text[] NOT NULL DEFAULT '{}',
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT uq_blocks_workspace_path UNIQUE (workspace_id, path))`);

    await q.query(`CREATE TABLE block_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      block_id uuid NOT NULL REFERENCES blocks(id) ON DELETE CASCADE,
      version integer NOT NULL CHECK (version >= 1),
      state text NOT NULL DEFAULT 'draft' CHECK (state IN ('draft', 'in_review', 'vetted', 'retired')),
      source text NOT NULL,
      pins jsonb NOT NULL DEFAULT '[]'::jsonb,
      params jsonb NOT NULL DEFAULT '[]'::jsonb,
      checks jsonb,
      author_id uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      submitted_at timestamptz,
      decided_at timestamptz,
      decided_by uuid REFERENCES users(id),
      retired_at timestamptz,
      retired_by uuid REFERENCES users(id),
      CONSTRAINT uq_block_versions UNIQUE (block_id, version))`);
    await q.query(`CREATE INDEX idx_block_versions_state ON block_versions (state)`);

    await q.query(`CREATE FUNCTION nodewright_block_version_rules() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.submitted_at IS NOT NULL AND (
             NEW.source IS DISTINCT FROM OLD.source OR NEW.pins IS DISTINCT FROM OLD.pins
          OR NEW.params IS DISTINCT FROM OLD.params OR NEW.checks IS DISTINCT FROM OLD.checks
          OR NEW.block_id IS DISTINCT FROM OLD.block_id OR NEW.version IS DISTINCT FROM OLD.version
          OR NEW.author_id IS DISTINCT FROM OLD.author_id OR NEW.submitted_at IS DISTINCT FROM OLD.submitted_at) THEN
          RAISE EXCEPTION 'block version % was submitted: its source and checks never change', OLD.id
            USING ERRCODE = 'integrity_constraint_violation';
        END IF;
        IF NEW.state IS DISTINCT FROM OLD.state AND NOT (
             (OLD.state = 'draft' AND NEW.state = 'in_review')
          OR (OLD.state = 'in_review' AND NEW.state IN ('draft', 'vetted'))
          OR (OLD.state = 'vetted' AND NEW.state = 'retired')) THEN
          RAISE EXCEPTION 'a block version cannot go from % to %', OLD.state, NEW.state
            USING ERRCODE = 'integrity_constraint_violation';
        END IF;
        RETURN NEW;
      END $$`);
    await q.query(`CREATE TRIGGER block_versions_rules BEFORE UPDATE ON block_versions
      FOR EACH ROW EXECUTE FUNCTION nodewright_block_version_rules()`);

    await q.query(`CREATE TABLE reviews (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      block_version_id uuid NOT NULL REFERENCES block_versions(id) ON DELETE CASCADE,
      author_id uuid NOT NULL REFERENCES users(id),
      kind text NOT NULL CHECK (kind IN ('comment', 'approve', 'send_back', 'submit')),
      comment text NOT NULL DEFAULT '' CHECK (char_length(comment) <= 4000),
      line integer CHECK (line >= 1),
      -- The wall clock, not the transaction's start: a decision and its line comments are
      -- written in one transaction and must keep their order.
      created_at timestamptz NOT NULL DEFAULT clock_timestamp())`);
    await q.query(`CREATE INDEX idx_reviews_version ON reviews (block_version_id, created_at)`);
    await q.query(`CREATE TRIGGER reviews_append_only BEFORE UPDATE ON reviews
      FOR EACH ROW EXECUTE FUNCTION nodewright_refuse_update()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE reviews');
    await q.query('DROP TABLE block_versions');
    await q.query('DROP FUNCTION nodewright_block_version_rules');
    await q.query('DROP TABLE blocks');
  }
}
