/**
 * The Express application factory: middleware, routers, static app, error handling.
 * Kept apart from `main.ts` so tests build the same app on their own database and port.
 */
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { existsSync } from 'node:fs';
import type { ApiConfig } from './config';
import { methodGate, routerOf } from './http/route';
import { openApiDocument } from './http/openapi';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { perMinuteLimit } from './middleware/rate-limit';
import { xsrfProtection } from './middleware/xsrf';
import { authRouter } from './routes/auth';
import { apiRoutes } from './routes';
import { createMailer, type Mailer } from './services/mailer';

export interface AppDeps {
  dataSource: DataSource;
  config: ApiConfig;
  logger: Logger;
  /** Defaults to SMTP as configured. */
  mailer?: Mailer;
}

/** Name of our session cookie: cookies are per host, not per port, so it must be our own. */
export const SESSION_COOKIE = 'nodewright.sid';

export interface NodewrightApp {
  app: Express;
  /** Releases what the app holds besides the DataSource (the session store's pool, the mailer). */
  close(): Promise<void>;
}

/** Secrets in URLs (share and invitation tokens, the provider's code) are masked in logs. */
export function maskUrl(url: string): string {
  return url
    .replace(/\/(shared|s|join|invitations)\/[A-Za-z0-9_-]{16,}/g, '/$1/[token]')
    .replace(/([?&](?:code|state|invite|session_state)=)[^&]*/g, '$1[redacted]');
}

export function createApp(deps: AppDeps): NodewrightApp {
  const { config, logger, dataSource: ds } = deps;
  const https = config.publicUrl.startsWith('https:');
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          // Angular Material sets inline styles on elements.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'worker-src': ["'self'", 'blob:'],
          'connect-src': ["'self'"],
          'form-action': ["'self'", new URL(config.oidc.issuer).origin],
          'upgrade-insecure-requests': https ? [] : null,
        },
      },
      // Over plain http (development on loopback) HSTS would only break other local servers.
      strictTransportSecurity: https ? { maxAge: 15552000, includeSubDomains: true } : false,
    }),
  );
  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      redact: { paths: ['req.headers.cookie', 'req.headers.authorization', 'req.headers["x-xsrf-token"]', 'res.headers["set-cookie"]'], censor: '[redacted]' },
      serializers: {
        // The query and params would repeat the URL's tokens unmasked: the masked URL says it all.
        req: ({ query: _q, params: _p, ...req }: { url?: string; query?: unknown; params?: unknown }) => ({ ...req, url: req.url ? maskUrl(req.url) : req.url }),
        // A redirect to the provider carries the OAuth state in its Location.
        res: (res: { headers?: Record<string, unknown> }) => (typeof res.headers?.location === 'string' ? { ...res, headers: { ...res.headers, location: maskUrl(res.headers.location) } } : res),
      },
    }),
  );

  const mailer = deps.mailer ?? createMailer(config.smtp, logger);
  // The session store's own small pool, with timeouts, so an outage fails fast (503).
  const sessionPool = new pg.Pool({ connectionString: config.databaseUrl, max: 10, connectionTimeoutMillis: 5000, statement_timeout: 10000, idleTimeoutMillis: 30000 });
  sessionPool.on('error', (err) => logger.warn({ reason: err.message }, 'session pool: connection lost'));
  const PgStore = connectPgSimple(session);
  // No touch: the cookie is not rolling, so a session ends 7 days after sign-in whatever its row
  // says; touching would only cost an UPDATE per request (and a late error after each answer
  // while the database is down).
  const store = new PgStore({ pool: sessionPool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 600, disableTouch: true, errorLog: (...args: unknown[]) => logger.warn({ reason: String(args.at(-1)) }, 'session store') });
  const sessions = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    store,
    cookie: { httpOnly: true, sameSite: 'lax', secure: config.cookieSecure, maxAge: 7 * 24 * 3600 * 1000, path: '/' },
  });
  const xsrf = xsrfProtection(config.sessionSecret, config.cookieSecure);
  const signInLimiter = perMinuteLimit(ds, 'sign-in', config.rateLimits.signInPerMinute, 'sign-in attempts');
  const lookupLimiter = perMinuteLimit(ds, 'lookup', config.rateLimits.sharedPerMinute, 'link lookups');

  app.use('/auth', sessions, xsrf, authRouter({ ds, oidc: config.oidc, logger, sessionCookie: SESSION_COOKIE, xsrfSecret: config.sessionSecret, cookieSecure: config.cookieSecure, limiter: signInLimiter }));

  let openApi: Record<string, unknown> | undefined;
  const routes = apiRoutes({ ds, mailer, publicUrl: config.publicUrl, devInboxUrl: config.devInboxUrl, lookupLimiter, openApi: () => (openApi ??= openApiDocument(routes, process.env.npm_package_version ?? '0.1.0')) });
  const api = express.Router();
  // Unknown paths and wrong methods are answered before a session is read or a body parsed.
  api.use(methodGate(routes));
  api.use(sessions, xsrf);
  api.use(express.json({ limit: '1mb' }));
  api.use(routerOf(ds, routes));
  api.use(apiNotFound);
  app.use('/api', api);

  if (config.staticDir && existsSync(config.staticDir)) {
    const dir = config.staticDir;
    app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: noCacheForShell }));
    app.get('/{*splat}', (req, res, next) => {
      // A path with a file extension is an asset that does not exist: 404, not the app page.
      if (/\.[A-Za-z0-9]{1,8}$/.test(req.path) || req.path.startsWith('/api/')) return next();
      res.setHeader('Cache-Control', 'no-cache');
      // With a root, only the part below it is checked for dot-folders (the project may live in one).
      res.sendFile('index.html', { root: dir });
    });
    app.use((req, res) => {
      res.status(404).type('text/plain').send(`Not found: ${req.path}`);
    });
  }

  app.use(errorHandler);
  return {
    app,
    close: async () => {
      mailer.close();
      await sessionPool.end().catch(() => undefined);
    },
  };
}

/** The shell and the service-worker files must revalidate, or a new build would never show. */
function noCacheForShell(res: express.Response, path: string): void {
  if (/(index\.html|ngsw\.json|ngsw-worker\.js|manifest\.webmanifest)$/.test(path)) res.setHeader('Cache-Control', 'no-cache');
}
