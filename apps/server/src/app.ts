import fs from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { Router, type Express } from 'express';
import helmet from 'helmet';
import { paths } from './config/paths';
import type { AppContext } from './context';
import { trackRequestWrites } from './db/request-writes';
import { authenticate } from './middleware/authenticate';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { requestLogger } from './middleware/request-logger';
import { sameOrigin } from './middleware/same-origin';
import { auditRoutes } from './modules/audit/audit.routes';
import { authRoutes } from './modules/auth/auth.routes';
import { createAuthService } from './modules/auth/auth.service';
import { calculationsRoutes } from './modules/calculations/calculations.routes';
import { engineModelsRoutes } from './modules/engine-models/engine-models.routes';
import { coverageRoutes } from './modules/coverage/coverage.routes';
import { enginesRoutes } from './modules/engines/engines.routes';
import { findingsRoutes } from './modules/findings/findings.routes';
import { limitSetsRoutes } from './modules/limit-sets/limit-sets.routes';
import { imagesRoutes } from './modules/images/images.routes';
import { inspectionsRoutes } from './modules/inspections/inspections.routes';
import { reviewRoutes } from './modules/review/review.routes';
import { planningRoutes } from './modules/planning/planning.routes';
import { reportsRoutes } from './modules/reports/reports.routes';
import { exportsRoutes } from './modules/exports/exports.routes';
import { fleetFindingsRoutes } from './modules/fleet-findings/fleet-findings.routes';
import { healthRoutes } from './modules/health/health.routes';
import { installationRoutes } from './modules/installation/installation.routes';
import { openApiRoutes } from './modules/openapi/openapi.routes';
import { organisationsRoutes } from './modules/organisations/organisations.routes';
import { recordsRoutes } from './modules/records/records.routes';
import { outboxRoutes } from './modules/outbox/outbox.routes';
import { usersRoutes } from './modules/users/users.routes';
import { utilizationRoutes } from './modules/utilization/utilization.routes';

export interface AppOptions {
  /** Serve the built client from this folder (default: apps/web/dist when it exists). */
  webDist?: string | null;
}

/** Every API route, mounted at /api/v1. Exposed so the route-policy test can walk it. */
export function createApiRouter(ctx: AppContext): Router {
  const auth = createAuthService(ctx);
  const api = Router();
  api.use(authenticate(auth));
  api.use(healthRoutes());
  api.use(installationRoutes(ctx));
  api.use(authRoutes(ctx, auth));
  api.use(usersRoutes(ctx));
  api.use(organisationsRoutes(ctx));
  api.use(engineModelsRoutes(ctx));
  api.use(enginesRoutes(ctx));
  api.use(utilizationRoutes(ctx));
  api.use(inspectionsRoutes(ctx));
  api.use(imagesRoutes(ctx));
  // Before the findings routes: /findings/export is not a finding, nor is the search.
  api.use(exportsRoutes(ctx));
  api.use(fleetFindingsRoutes(ctx));
  api.use(findingsRoutes(ctx));
  api.use(coverageRoutes(ctx));
  api.use(limitSetsRoutes(ctx));
  api.use(outboxRoutes(ctx));
  api.use(auditRoutes(ctx));
  api.use(recordsRoutes(ctx));
  api.use(reviewRoutes(ctx));
  api.use(planningRoutes(ctx));
  api.use(reportsRoutes(ctx));
  api.use(calculationsRoutes(ctx));
  api.use(openApiRoutes());
  return api;
}

function contentSecurityPolicy() {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'media-src': ["'self'", 'blob:'],
        'font-src': ["'self'", 'data:'],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'base-uri': ["'none'"],
        'frame-ancestors': ["'none'"],
        'form-action': ["'self'"],
        // A hangar LAN often runs on plain HTTP: upgrading would break it.
        'upgrade-insecure-requests': null,
      },
    },
    crossOriginEmbedderPolicy: false,
    xFrameOptions: { action: 'deny' },
    strictTransportSecurity: false,
  });
}

export function createApp(ctx: AppContext, options: AppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', ctx.config.trustProxy);
  app.set('query parser', 'simple');
  // Read by each route's JSON parser (http/route.ts), after its access and rate-limit checks.
  app.set('json limit', ctx.config.jsonLimit);

  app.use((_req, _res, next) => trackRequestWrites(next));
  app.use(requestLogger(ctx.logger));
  app.use(contentSecurityPolicy());

  const api = createApiRouter(ctx);
  app.locals.apiRouter = api;
  app.use('/api/v1', cookieParser(), sameOrigin(ctx.config.publicOrigins), api, apiNotFound);
  app.use('/api', apiNotFound);

  const webDist = options.webDist === undefined ? paths.webDist : options.webDist;
  if (webDist && fs.existsSync(path.join(webDist, 'index.html'))) {
    app.use(
      '/assets',
      express.static(path.join(webDist, 'assets'), {
        immutable: true,
        maxAge: '1y',
        index: false,
        fallthrough: false,
      }),
    );
    app.use(express.static(webDist, { index: false, maxAge: '1h' }));
    // The client routes itself: every other GET gets the app shell.
    app.get('/{*path}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(webDist, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
