import type { DataSource } from 'typeorm';
import type { Role } from '../entities';

/**
 * Demo data for `npm start`: the team of a fictional bridge-sensor product (our own scenario),
 * and a second, smaller team so that the walls between workspaces can be tried.
 * Idempotent: re-running updates names and roles but never duplicates rows.
 */
export const DEMO_WORKSPACES = [
  { slug: 'strainlab', name: 'Strainlab sensor front end' },
  { slug: 'tidepool', name: 'Tidepool hydrophone preamp' },
] as const;

/** The demo team's workspace (the first). */
export const DEMO_WORKSPACE = DEMO_WORKSPACES[0];

/** The password of every demo account at the development identity provider (README). */
export const DEMO_PASSWORD = 'strainlab-demo';

export interface DemoAccount {
  email: string;
  name: string;
  /** Membership seeded in the database; none for a newcomer who joins by invitation. */
  membership?: { workspace: string; role: Role };
}

/** Every account of the development identity provider: one per role, one in the second
 *  workspace, and a newcomer with no workspace yet (for trying invitations). */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'ada@strainlab.example', name: 'Ada Okafor', membership: { workspace: 'strainlab', role: 'admin' } },
  { email: 'ravi@strainlab.example', name: 'Ravi Lindqvist', membership: { workspace: 'strainlab', role: 'designer' } },
  { email: 'mei@strainlab.example', name: 'Mei Tanaka', membership: { workspace: 'strainlab', role: 'reviewer' } },
  { email: 'sam@strainlab.example', name: 'Sam Moreau', membership: { workspace: 'strainlab', role: 'viewer' } },
  { email: 'jon@tidepool.example', name: 'Jon Abernathy', membership: { workspace: 'tidepool', role: 'admin' } },
  { email: 'noor@strainlab.example', name: 'Noor Haddad' },
];

/** The seeded members (accounts with a membership), for tests and the README. */
export const DEMO_USERS = DEMO_ACCOUNTS.filter((a) => a.membership).map((a) => ({
  email: a.email,
  name: a.name,
  workspace: a.membership!.workspace,
  role: a.membership!.role,
}));

export async function seedDemoData(ds: DataSource): Promise<void> {
  await ds.transaction(async (m) => {
    const ids = new Map<string, string>();
    for (const w of DEMO_WORKSPACES) {
      const [ws] = await m.query(
        `INSERT INTO workspaces (slug, name) VALUES ($1, $2)
         ON CONFLICT (slug) DO UPDATE SET name = EXCLUDED.name RETURNING id`,
        [w.slug, w.name],
      );
      ids.set(w.slug, ws.id);
    }
    for (const u of DEMO_USERS) {
      const [user] = await m.query(
        `INSERT INTO users (email, display_name) VALUES ($1, $2)
         ON CONFLICT (email) DO UPDATE SET display_name = EXCLUDED.display_name RETURNING id`,
        [u.email, u.name],
      );
      await m.query(
        `INSERT INTO memberships (user_id, workspace_id, role) VALUES ($1, $2, $3)
         ON CONFLICT (user_id, workspace_id) DO UPDATE SET role = EXCLUDED.role`,
        [user.id, ids.get(u.workspace), u.role],
      );
    }
  });
}
