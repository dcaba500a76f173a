import type { DataSource } from 'typeorm';
import type { Role } from '../entities';

/**
 * Demo data for `npm start`: the team of a fictional bridge-sensor product (our own scenario).
 * Idempotent: re-running updates names and roles but never duplicates rows.
 */
export const DEMO_WORKSPACE = { slug: 'strainlab', name: 'Strainlab sensor front end' };

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'ada@strainlab.example', name: 'Ada Okafor', role: 'admin' },
  { email: 'ravi@strainlab.example', name: 'Ravi Lindqvist', role: 'designer' },
  { email: 'mei@strainlab.example', name: 'Mei Tanaka', role: 'reviewer' },
  { email: 'sam@strainlab.example', name: 'Sam Moreau', role: 'viewer' },
];

export async function seedDemoData(ds: DataSource): Promise<void> {
  await ds.transaction(async (m) => {
    const [ws] = await m.query(
      `INSERT INTO workspaces (slug, name) VALUES ($1, $2)
       ON CONFLICT (slug) DO UPDATE SET name = EXCLUDED.name RETURNING id`,
      [DEMO_WORKSPACE.slug, DEMO_WORKSPACE.name],
    );
    for (const u of DEMO_USERS) {
      const [user] = await m.query(
        `INSERT INTO users (email, display_name) VALUES ($1, $2)
         ON CONFLICT (email) DO UPDATE SET display_name = EXCLUDED.display_name RETURNING id`,
        [u.email, u.name],
      );
      await m.query(
        `INSERT INTO memberships (user_id, workspace_id, role) VALUES ($1, $2, $3)
         ON CONFLICT (user_id, workspace_id) DO UPDATE SET role = EXCLUDED.role`,
        [user.id, ws.id, u.role],
      );
    }
  });
}
