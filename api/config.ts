/**
 * Server settings from the environment, with the documented defaults (see DEVELOPERS.md).
 */
export interface ApiConfig {
  /** PostgreSQL connection URL. */
  databaseUrl: string;
  /** Host and port the server listens on (loopback by default). */
  host: string;
  port: number;
  /** Secret for signing session cookies. */
  sessionSecret: string;
  /** Folder of the built Angular app to serve, if any. */
  staticDir?: string;
  logLevel: string;
}

export function configFromEnv(env: NodeJS.ProcessEnv = process.env): ApiConfig {
  const pgPort = env.NODEWRIGHT_PG_PORT ?? '54329';
  return {
    databaseUrl: env.NODEWRIGHT_DATABASE_URL ?? `postgres://nodewright@127.0.0.1:${pgPort}/nodewright`,
    host: env.NODEWRIGHT_HOST ?? '127.0.0.1',
    port: Number(env.NODEWRIGHT_PORT ?? 4280),
    sessionSecret: env.NODEWRIGHT_SESSION_SECRET ?? 'nodewright-development-only-secret',
    staticDir: env.NODEWRIGHT_STATIC_DIR,
    logLevel: env.NODEWRIGHT_LOG_LEVEL ?? 'info',
  };
}
