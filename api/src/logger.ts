import pino from 'pino';
import { getConfig } from './config/env';

/** Structured JSON logs (pino); one logger for the whole API. */
export const logger = pino({
  level: getConfig().LOG_LEVEL,
  base: { service: 'ebbline-api' },
  redact: ['req.headers.authorization', 'req.headers.cookie', 'req.headers["x-csrf-token"]'],
});
