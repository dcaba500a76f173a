/**
 * The whole product in this process: the development mail fake (SMTP + inbox page), the
 * development identity provider, and the API serving the built app — wired to each other by the
 * same environment variables a real deployment sets (docs: DEVELOPERS.md). Used by `npm start`,
 * `npm run dev` (without the app), the API tests, the browser tests and the load tool.
 */
import type { Logger } from 'pino';
import { DEV_OIDC_CLIENT_SECRET, loadConfig, type ApiConfig } from '../api/config';
import { createLogger } from '../api/logger';
import { startApi, type RunningApi } from '../api/main';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../api/services/seed';
import { startIdentityFake, type RunningIdentityFake } from './identity-fake';
import { startMailFake, type RunningMailFake } from './mail-fake';
import { freePort } from './net';

export interface StackOptions {
  databaseUrl: string;
  host?: string;
  /** 0 picks free ports. */
  appPort: number;
  idpPort: number;
  smtpPort: number;
  inboxPort: number;
  staticDir?: string;
  logLevel?: string;
  /** Where the API logs instead of stdout (tests read it). */
  logDestination?: NodeJS.WritableStream;
  /** Further settings, as environment variables (rate limits, session secret…). */
  env?: Record<string, string>;
  /** More callback addresses the identity provider accepts (a dev server's proxy). */
  callbackUrls?: string[];
  /** Start only the fakes and return the API's environment (for `npm run dev`, which runs the API itself). */
  apiInProcess?: boolean;
}

export interface RunningStack {
  /** The product's address. */
  url: string;
  idp: RunningIdentityFake;
  mail: RunningMailFake;
  /** The API, when it runs in this process. */
  api?: RunningApi;
  config: ApiConfig;
  /** The environment that configures an API process for this stack. */
  env: Record<string, string>;
  logger: Logger;
  close(): Promise<void>;
}

export async function startTeamStack(o: StackOptions): Promise<RunningStack> {
  const host = o.host ?? '127.0.0.1';
  const appPort = o.appPort || (await freePort());
  const publicUrl = `http://${host}:${appPort}`;
  const mail = await startMailFake({ smtpPort: o.smtpPort, httpPort: o.inboxPort, host });
  let idp: RunningIdentityFake;
  try {
    idp = await startIdentityFake({
      port: o.idpPort,
      host,
      clients: [{ clientId: 'nodewright', clientSecret: DEV_OIDC_CLIENT_SECRET, redirectUris: [`${publicUrl}/auth/callback`, ...(o.callbackUrls ?? [])] }],
      accounts: DEMO_ACCOUNTS,
      password: DEMO_PASSWORD,
    });
  } catch (err) {
    await mail.close();
    throw err;
  }
  const env: Record<string, string> = {
    NODEWRIGHT_DATABASE_URL: o.databaseUrl,
    NODEWRIGHT_HOST: host,
    NODEWRIGHT_PORT: String(appPort),
    NODEWRIGHT_PUBLIC_URL: publicUrl,
    NODEWRIGHT_OIDC_ISSUER: idp.issuer,
    NODEWRIGHT_OIDC_CLIENT_ID: 'nodewright',
    NODEWRIGHT_OIDC_CLIENT_SECRET: DEV_OIDC_CLIENT_SECRET,
    NODEWRIGHT_SMTP_HOST: host,
    NODEWRIGHT_SMTP_PORT: String(mail.smtpPort),
    NODEWRIGHT_DEV_INBOX_URL: mail.inboxUrl,
    NODEWRIGHT_LOG_LEVEL: o.logLevel ?? 'info',
    ...(o.staticDir ? { NODEWRIGHT_STATIC_DIR: o.staticDir } : {}),
    ...o.env,
  };
  const config = loadConfig({ ...process.env, ...env, NODE_ENV: process.env.NODE_ENV ?? 'development' });
  const logger = createLogger(config.logLevel, o.logDestination);
  let api: RunningApi | undefined;
  if (o.apiInProcess !== false) {
    try {
      api = await startApi(config, logger);
    } catch (err) {
      await Promise.allSettled([idp.close(), mail.close()]);
      throw err;
    }
  }
  return {
    url: publicUrl,
    idp,
    mail,
    api,
    config,
    env,
    logger,
    async close() {
      await api?.close();
      await Promise.allSettled([idp.close(), mail.close()]);
    },
  };
}
