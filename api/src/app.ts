import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { getConfig } from './config/env';
import { logger } from './logger';
import { authenticate } from './middleware/authenticate';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { healthRouter } from './routes/health/router';

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
    }),
  );

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use('/health', healthRouter);
  api.use(authenticate);
  api.use(apiNotFound);
  app.use('/api', api);

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
  app.use(express.static(root, { index: false, maxAge: '1h' }));
  app.get(/^\/(?!api\/|auth\/).*/, (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
}
