import http from 'node:http';
import { pathToFileURL } from 'node:url';
import { STOPPING_MESSAGE } from '../../shared/constants/availability';
import { createApp } from './app';
import { closeSessionStore } from './auth/session';
import { getConfig } from './config/env';
import { DATABASE_RETRY_AFTER_SECONDS } from './db/connection-errors';
import { sequelize } from './db/sequelize';
import { startJobQueue } from './jobs/job-queue';
import { markStopping } from './lifecycle';
import { logger } from './logger';
import './models';

export interface RunningServer {
  url: string;
  /**
   * Stops: readiness answers 503 at once and new requests get a 503 "stopping" answer, the
   * requests in flight finish (up to graceMs), then the listener closes, the job queue stops
   * (a job in hand finishes, up to graceMs) and the pools close.
   */
  close(graceMs?: number): Promise<void>;
}

/** A request that arrives while the server stops: ask again in a moment (the next start). */
function refuseWhileStopping(req: http.IncomingMessage, res: http.ServerResponse): void {
  const api = req.url?.startsWith('/api/') ?? false;
  res.writeHead(503, {
    'content-type': api ? 'application/json; charset=utf-8' : 'text/plain; charset=utf-8',
    'retry-after': String(DATABASE_RETRY_AFTER_SECONDS),
    'cache-control': 'no-store',
    connection: 'close',
  });
  res.end(
    api
      ? JSON.stringify({ error: { code: 'stopping', message: STOPPING_MESSAGE } })
      : STOPPING_MESSAGE,
  );
}

/** Starts the API (and the built web app) on config.HOST:config.PORT. */
export async function startServer(): Promise<RunningServer> {
  const config = getConfig();
  const app = createApp();
  const inFlight = new Set<http.ServerResponse>();
  let draining = false;
  let drained: (() => void) | undefined;
  const server = http.createServer((req, res) => {
    if (draining) {
      // readiness still answers (503, from the health route); everything else is new work
      if (req.url === '/api/health' || req.url?.startsWith('/api/health?')) app(req, res);
      else refuseWhileStopping(req, res);
      return;
    }
    inFlight.add(res);
    res.once('close', () => {
      inFlight.delete(res);
      if (draining && inFlight.size === 0) drained?.();
    });
    app(req, res);
  });
  // the durable job queue (pg-boss): missed visits now, alerts and mail later
  const jobs = await startJobQueue();
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(config.PORT, config.HOST, resolve);
    });
  } catch (err) {
    await jobs.stop();
    throw err;
  }
  const url = config.APP_URL;
  logger.info({ url, port: config.PORT }, 'Ebbline is listening');

  let closing: Promise<void> | undefined;
  return {
    url,
    close(graceMs = 10_000) {
      closing ??= (async () => {
        draining = true;
        markStopping();
        if (inFlight.size > 0) {
          logger.info(
            { inFlight: inFlight.size, graceMs },
            'stopping: letting the requests in flight finish',
          );
          await new Promise<void>((resolve) => {
            drained = resolve;
            setTimeout(resolve, graceMs).unref();
          });
          if (inFlight.size > 0)
            logger.warn(
              { cut: inFlight.size },
              'requests still open after the grace period are cut',
            );
        }
        const closed = new Promise<void>((resolve) => server.close(() => resolve()));
        // what is left is idle keep-alive connections, or requests past the grace period
        server.closeAllConnections();
        await closed;
        // a job in hand finishes (or is handed back to the queue) before the pools close
        await jobs.stop(graceMs);
        await closeSessionStore();
        await sequelize.close();
        logger.info('Ebbline stopped');
      })();
      return closing;
    },
  };
}

/** Run directly (`tsx api/src/server.ts`, as `npm run dev` does): stop cleanly on SIGINT/SIGTERM. */
if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const running = await startServer();
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    // `on`, not `once`: a second signal (a group signal plus the one a parent passes on) must
    // not fall back to the default of ending the process mid-request; close() runs once
    process.on(signal, () => {
      void running.close().then(() => process.exit(0));
    });
  }
}
