import http from 'node:http';
import { pathToFileURL } from 'node:url';
import { createApp } from './app';
import { closeSessionStore } from './auth/session';
import { getConfig } from './config/env';
import { sequelize } from './db/sequelize';
import { logger } from './logger';
import './models';

export interface RunningServer {
  url: string;
  /** Stops accepting, lets open requests finish (up to graceMs), then closes the pool. */
  close(graceMs?: number): Promise<void>;
}

/** Starts the API (and the built web app) on config.HOST:config.PORT. */
export async function startServer(): Promise<RunningServer> {
  const config = getConfig();
  const server = http.createServer(createApp());
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.PORT, config.HOST, resolve);
  });
  const url = config.APP_URL;
  logger.info({ url, port: config.PORT }, 'Ebbline is listening');

  let closing: Promise<void> | undefined;
  return {
    url,
    close(graceMs = 10_000) {
      closing ??= (async () => {
        const closed = new Promise<void>((resolve) => server.close(() => resolve()));
        server.closeIdleConnections();
        const timer = setTimeout(() => server.closeAllConnections(), graceMs);
        await closed;
        clearTimeout(timer);
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
    process.once(signal, () => {
      void running.close().then(() => process.exit(0));
    });
  }
}
