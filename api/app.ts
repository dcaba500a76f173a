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
import type { DataSource } from 'typeorm';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { healthRouter } from './routes/health';

export interface AppDeps {
  dataSource: DataSource;
  /** For the session store's own small pool. */
  databaseUrl: string;
  logger: Logger;
  sessionSecret: string;
  /** Built Angular app (browser folder) to serve with an SPA fallback. */
  staticDir?: string;
}

/** Name of our session cookie: cookies are per host, not per port, so it must be our own. */
export const SESSION_COOKIE = 'nodewright.sid';

export interface NodewrightApp {
  app: Express;
  /** Releases what the app holds besides the DataSource (the session store's pool). */
  close(): Promise<void>;
}

export function createApp(deps: AppDeps): NodewrightApp {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
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
        },
      },
    }),
  );
  app.use(pinoHttp({ logger: deps.logger, autoLogging: { ignore: (req) => req.url === '/api/health' } }));
  app.use(express.json({ limit: '1mb' }));

  const PgStore = connectPgSimple(session);
  const store = new PgStore({ conString: deps.databaseUrl, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 600 });
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: deps.sessionSecret,
      resave: false,
      saveUninitialized: false,
      store,
      cookie: { httpOnly: true, sameSite: 'lax', maxAge: 7 * 24 * 3600 * 1000 },
    }),
  );

  const api = express.Router();
  api.use(healthRouter(deps.dataSource));
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.staticDir && existsSync(deps.staticDir)) {
    const dir = deps.staticDir;
    app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: noCacheForShell }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(join(dir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return { app, close: async () => store.close() };
}

/** The shell and the service-worker files must revalidate, or a new build would never show. */
function noCacheForShell(res: express.Response, path: string): void {
  if (/(index\.html|ngsw\.json|ngsw-worker\.js|manifest\.webmanifest)$/.test(path)) res.setHeader('Cache-Control', 'no-cache');
}
