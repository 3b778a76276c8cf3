import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { getConfig } from './config/env';
import { logger } from './logger';
import { requireCsrfToken } from './auth/csrf';
import { requireSameOrigin } from './auth/same-origin';
import { authRouter } from './auth/router';
import { sessionMiddleware } from './auth/session';
import { authenticate } from './middleware/authenticate';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { assertEveryRouteDeclaresAccess } from './middleware/route-access';
import { accessEventsRouter } from './routes/access-events/router';
import { apiTokensRouter } from './routes/api-tokens/router';
import { healthRouter } from './routes/health/router';
import { meRouter } from './routes/me/router';
import { peopleRouter } from './routes/people/router';
import { areasRouter } from './routes/areas/router';
import { bankDesignsRouter } from './routes/bank-designs/router';
import { banksRouter } from './routes/banks/router';
import { cabinetsRouter } from './routes/cabinets/router';
import { dueRouter } from './routes/due/router';
import { shutdownWindowsRouter } from './routes/shutdown-windows/router';
import { sitesRouter } from './routes/sites/router';
import { sparesRouter } from './routes/spares/router';
import { calendarFeedRouter } from './routes/calendar-feed/router';
import { calendarFeedPublicRouter } from './routes/calendar-feed/public-router';
import { withoutFeedSecret } from './routes/calendar-feed/hide-secret';
import { windowProposalRouter } from './routes/shutdown-windows/proposal';
import { technicianLoadRouter } from './routes/technician-load/router';
import { visitsRouter } from './routes/visits/router';
import { loggerFilesRouter } from './routes/logger-files/router';
import { photosRouter, visitPhotosRouter } from './routes/photos/router';
import { bankDecayRunsRouter, decayRunsRouter, visitDecayRunsRouter } from './routes/decay-runs/router';
import { decayRunReviewRouter, reviewQueueRouter } from './routes/decay-runs/review-router';

/** Builds the Express app: API under /api, the built web app everywhere else. */
export function createApp(): express.Express {
  const config = getConfig();
  const app = express();
  app.disable('x-powered-by');
  if (config.TRUST_PROXY) app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      logger,
      genReqId: (req) => (req.headers['x-request-id'] as string | undefined) ?? crypto.randomUUID(),
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      // a calendar feed's address is its credential: never in the log
      serializers: { req: withoutFeedSecret },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          formAction: ["'self'", config.OIDC_ISSUER],
          upgradeInsecureRequests: config.APP_URL.startsWith('https:') ? [] : null,
        },
      },
      // not helmet's no-referrer: under it a browser sends `Origin: null` even with Ebbline's
      // own changes, which the Origin check (auth/same-origin.ts) must refuse; nothing leaves
      // for other sites either way
      referrerPolicy: { policy: 'same-origin' },
    }),
  );

  // answers of the API and of sign-in carry personal data and the CSRF token: never cached
  app.use(['/api', '/auth'], (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  // beside the CSRF token: a change sent from another origin's page is refused
  app.use(requireSameOrigin(config));

  const session = sessionMiddleware(config);
  app.use('/auth', session, authRouter);

  const api = express.Router();
  // a decay run from a logger file may carry up to 20 000 readings (a few MB of JSON)
  api.use(['/visits/:visitId/decay-runs', '/decay-runs/:runId/corrections'], express.json({ limit: '4mb' }));
  api.use(express.json({ limit: '1mb' }));
  api.use('/health', healthRouter);
  api.use(session);
  api.use(authenticate);
  api.use(requireCsrfToken);
  api.use('/me/tokens', apiTokensRouter);
  api.use('/me/calendar-feed', calendarFeedRouter);
  api.use('/me', meRouter);
  api.use('/people', peopleRouter);
  api.use('/access-events', accessEventsRouter);
  // the register
  api.use('/sites', sitesRouter);
  api.use('/areas', areasRouter);
  api.use('/cabinets', cabinetsRouter);
  api.use('/banks/:bankId/decay-runs', bankDecayRunsRouter);
  api.use('/banks', banksRouter);
  api.use('/bank-designs', bankDesignsRouter);
  api.use('/spares', sparesRouter);
  api.use('/visits/:visitId/photos', visitPhotosRouter);
  api.use('/visits/:visitId/decay-runs', visitDecayRunsRouter);
  api.use('/decay-runs', decayRunsRouter);
  api.use('/decay-runs', decayRunReviewRouter);
  api.use('/review-queue', reviewQueueRouter);
  api.use('/photos', photosRouter);
  api.use('/visits', visitsRouter);
  api.use('/shutdown-windows', shutdownWindowsRouter);
  api.use('/due', dueRouter);
  api.use('/shutdown-windows', windowProposalRouter);
  api.use('/technician-load', technicianLoadRouter);
  api.use('/logger-files', loggerFilesRouter);
  api.use(apiNotFound);
  // deny by default: a route that declares no roles stops the app from starting
  app.locals.apiRoutes = assertEveryRouteDeclaresAccess(api, '/api');
  app.use('/api', api);

  // calendar apps fetch a person's visits here, with the secret address as the credential
  app.use('/feeds', calendarFeedPublicRouter);
  serveWebApp(app, config.WEB_DIST_DIR);
  app.use(errorHandler);
  return app;
}

/** Static files of the built app, and index.html for every client-side route. */
function serveWebApp(app: express.Express, distDir: string): void {
  if (!distDir) return;
  const root = path.resolve(distDir);
  const indexHtml = path.join(root, 'index.html');
  if (!fs.existsSync(indexHtml)) {
    logger.warn({ root }, 'web app not built: run `npm run build`');
    return;
  }
  app.use(
    express.static(root, {
      index: false,
      maxAge: '1h',
      // the service worker, the web manifest, index.html and the icons keep their names from
      // one version to the next: a browser asks each time, so an update is picked up at once
      // (the hashed files under assets/ never change under their name)
      setHeaders(res, filePath) {
        if (!path.relative(root, filePath).startsWith('assets' + path.sep)) res.setHeader('Cache-Control', 'no-cache');
      },
    }),
  );
  // a file that is not there (an old hashed asset, a typo) is a 404, never the HTML page,
  // which a browser would run as a broken script
  app.get(/^\/assets\/|\/[^/]*\.[A-Za-z0-9]+$/, (_req, res) => {
    res.status(404).type('text/plain').send('Not found');
  });
  app.get(/^\/(?!api\/|auth\/).*/, (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
}
