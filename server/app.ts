import express, { Router } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { pinoHttp } from 'pino-http';
import { createLoginLimiter } from './auth/limiter';
import { authRouter } from './auth/router';
import { configurePassport, sessionMiddleware } from './auth/session';
import type { Deps } from './deps';
import { PROJECT_ROOT } from './paths';
import { healthRouter } from './health/router';
import { requireCsrfHeader } from './http/csrf';
import { bearerAuth, requirePasswordChange, unlessToken } from './http/bearer';
import { tokensRouter } from './tokens/router';
import { importsRouter } from './imports/router';
import { openApiRouter } from './openapi/router';
import { createMetrics } from './metrics/metrics';
import { metricsRouter } from './metrics/router';
import { apiNotFound, errorHandler } from './http/errors';
import { usersRouter } from './users/router';
import { customersRouter } from './customers/router';
import { ordersRouter } from './orders/router';
import { attachmentsRouter } from './attachments/router';
import { calculationsRouter } from './calculations/router';
import { jobsRouter } from './jobs/router';
import { notificationsRouter } from './notifications/router';
import { travelersRouter } from './travelers/router';
import { settingsRouter } from './settings/router';
import { buildSheetsRouter } from './build-sheets/router';
import { workOrdersRouter } from './work-orders/router';
import { stockRouter } from './stock/router';
import { floorRouter } from './floor/router';
import { testRecordsRouter } from './test-records/router';
import { portalRouter, shipmentsRouter } from './shipments/router';

/** The built client; CLIENT_DIR (relative to the project) lets parallel work trees' browser tests use their own build. */
const clientDir = path.resolve(PROJECT_ROOT, process.env.CLIENT_DIR ?? path.join('dist', 'client'));

/** The routers of every business component, mounted under /api. Add new features here. */
export function apiRouters(deps: Deps): Router[] {
  return [
    healthRouter(deps),
    usersRouter(deps.db),
    customersRouter(deps.db),
    ordersRouter(deps.db),
    attachmentsRouter(deps.db, deps.storage),
    calculationsRouter(deps.db),
    jobsRouter(deps),
    notificationsRouter(deps),
    buildSheetsRouter(deps),
    workOrdersRouter(deps.db),
    stockRouter(deps.db),
    travelersRouter(deps),
    settingsRouter(deps.db),
    floorRouter(deps),
    testRecordsRouter(deps.db),
    shipmentsRouter(deps),
    portalRouter(deps),
    tokensRouter(deps.db),
    importsRouter(deps.db),
    openApiRouter(deps.config),
  ];
}

/** Builds the Express app (tests import this; `index.ts` listens). */
export function createApp(deps: Deps, opts: { serveClient?: boolean } = {}) {
  const { config } = deps;
  const app = express();
  app.disable('x-powered-by');
  if (config.trustProxy) app.set('trust proxy', 1);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: { 'img-src': ["'self'", 'data:', 'blob:'], 'upgrade-insecure-requests': config.trustProxy ? [] : null },
      },
      strictTransportSecurity: config.trustProxy,
    }),
  );
  app.use(
    pinoHttp({
      level: config.logLevel,
      autoLogging: { ignore: (req) => req.url === '/api/health' || req.url === '/metrics' },
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );

  const metrics = createMetrics(deps);
  app.use(metrics.observe);
  app.use(metricsRouter(deps.db, metrics));

  const passport = configurePassport(deps.db);
  const api = Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(bearerAuth(deps.db));
  api.use(requireCsrfHeader);
  api.use(unlessToken(sessionMiddleware({ kind: config.sessionStore, pool: deps.pool, redis: deps.sessionRedis, secret: config.sessionSecret, secureCookies: config.trustProxy })));
  api.use(unlessToken(passport.session()));
  api.use(requirePasswordChange);
  api.use(authRouter(passport, createLoginLimiter(deps.redis), deps.db));
  for (const r of apiRouters(deps)) api.use(r);
  api.use(apiNotFound);
  app.use('/api', api);

  if (opts.serveClient && existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Deep links: every non-API path gets the client's index.html.
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html'), { maxAge: 0 }));
  }
  app.use(errorHandler);
  return app;
}
