/**
 * The real product for the API tests: the API on the test database with the development identity
 * provider and mail fake, on ephemeral loopback ports, reached over real HTTP.
 */
import { inject } from 'vitest';
import type { DataSource } from 'typeorm';
import { DEMO_PASSWORD } from '../../api/services/seed';
import { startTeamStack, type RunningStack } from '../../tools/team-stack';
import { TeamClient } from './team-client';

export interface ApiHarness {
  url: string;
  stack: RunningStack;
  dataSource: DataSource;
  /** A fresh client (its own cookie jar), signed out. */
  client(): TeamClient;
  /** A fresh client signed in as `email` through the identity provider's form. */
  signedIn(email: string): Promise<TeamClient>;
  /** Messages the mail fake received for `to`, newest first (over its HTTP inbox API). */
  mailTo(to: string): Promise<{ subject: string; text: string; html: string | null; to: string[] }[]>;
  close(): Promise<void>;
}

/** Settings the tests need: generous rate limits (a dedicated test checks the limiter itself). */
export const TEST_ENV = { NODEWRIGHT_SESSION_SECRET: 'test-session-secret-of-at-least-32-chars', NODEWRIGHT_SIGNIN_RATE: '10000', NODEWRIGHT_SHARED_RATE: '10000' };

export async function startApi(env: Record<string, string> = {}): Promise<ApiHarness> {
  const stack = await startTeamStack({ databaseUrl: inject('databaseUrl'), appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, logLevel: 'silent', env: { ...TEST_ENV, ...env } });
  const url = stack.url;
  return {
    url,
    stack,
    dataSource: stack.api!.dataSource,
    client: () => new TeamClient(url),
    async signedIn(email) {
      const c = new TeamClient(url);
      await c.signIn(email, DEMO_PASSWORD);
      await c.get('/api/me'); // as the app does first: it also hands out the XSRF cookie
      return c;
    },
    async mailTo(to) {
      const res = await fetch(`${stack.mail.inboxUrl.replace(/\/$/, '')}/api/messages?to=${encodeURIComponent(to)}`);
      return ((await res.json()) as { items: { subject: string; text: string; html: string | null; to: string[] }[] }).items;
    },
    close: () => stack.close(),
  };
}
