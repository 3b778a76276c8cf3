import path from 'node:path';
import { z } from 'zod';

/** Reads a boolean the way people write it in an env file. */
const flag = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

const postgresUrl = z.string().regex(/^postgres(ql)?:\/\//, 'must be a postgres:// connection URL');

/**
 * A role's URL on the local cluster from the PG_* settings with the defaults of
 * infra/local-cluster.ts: what `npm run db:migrate` and `npm run db:seed` use with no URL set.
 */
function localClusterUrl(env: NodeJS.ProcessEnv, role: 'OWNER' | 'APP'): string {
  const user = env[`PG_${role}_USER`] || (role === 'OWNER' ? 'ebbline_owner' : 'ebbline_app');
  const password =
    env[`PG_${role}_PASSWORD`] || (role === 'OWNER' ? 'ebbline-owner-local' : 'ebbline-app-local');
  const where = `127.0.0.1:${env.PG_PORT || 5433}/${env.PG_DATABASE || 'ebbline'}`;
  return `postgres://${encodeURIComponent(user)}:${encodeURIComponent(password)}@${where}`;
}

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  HOST: z.string().min(1).default('127.0.0.1'),
  /** The address users open; decides cookie Secure and the OIDC redirect. Default: localhost:PORT. */
  APP_URL: z.url().optional(),
  /** The app's connection: a role that owns nothing, with only INSERT and SELECT on the audit tables. */
  DATABASE_URL: postgresUrl.optional(),
  /** The owner role's connection, for migrations only. Unset with DATABASE_URL unset: the local cluster's owner. */
  MIGRATION_DATABASE_URL: postgresUrl.optional(),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Folder of the built web app that the API serves; empty means API only. */
  WEB_DIST_DIR: z.string().default('dist/web'),
  SESSION_SECRET: z.string().min(16, 'must be at least 16 characters').default('ebbline-local-session-secret-change-me'),
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(60),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).default(12),
  /** Our own name: the browser shares cookies between ports of one host (app and provider). */
  SESSION_COOKIE_NAME: z.string().regex(/^[\w.-]+$/, 'letters, digits, dot, dash, underscore').default('ebbline.sid'),
  /** How long a started sign-in may take at the provider before its state is refused. */
  SIGN_IN_PENDING_MINUTES: z.coerce.number().int().min(1).max(60).default(10),
  OIDC_ISSUER: z.url().default('http://localhost:3001'),
  OIDC_CLIENT_ID: z.string().min(1).default('ebbline'),
  OIDC_CLIENT_SECRET: z.string().min(1).default('ebbline-local-client-secret'),
  /** Empty means APP_URL + /auth/callback. */
  OIDC_REDIRECT_URL: z.url().optional(),
  /** Where the provider sends people after signing out; empty means APP_URL + /signed-out. */
  OIDC_POST_LOGOUT_REDIRECT_URL: z.url().optional(),
  /** Scopes Ebbline asks for; `roles` carries the roles claim that a first sign-in takes. */
  OIDC_SCOPES: z.string().min(1).default('openid email profile roles'),
  /** Loopback providers speak plain http; a real provider must use https. */
  OIDC_ALLOW_HTTP: flag.default(false),
  TRUST_PROXY: flag.default(false),
  /** Hours after its planned end at which a visit still planned is marked missed (the job every 15 min). */
  MISSED_VISIT_AFTER_HOURS: z.coerce.number().min(0).max(720).default(12),
  /** Folder where the photos of visits are kept (generated names; never inside the web root). */
  PHOTO_DIR: z.string().min(1).default('.data/photos'),
});

export type Config = Omit<
  z.infer<typeof envSchema>,
  'APP_URL' | 'OIDC_REDIRECT_URL' | 'OIDC_POST_LOGOUT_REDIRECT_URL' | 'DATABASE_URL' | 'MIGRATION_DATABASE_URL'
> & {
  DATABASE_URL: string;
  /** Equal to DATABASE_URL when only that is set: one role, and the audit trail is not protected. */
  MIGRATION_DATABASE_URL: string;
  APP_URL: string;
  OIDC_REDIRECT_URL: string;
  OIDC_POST_LOGOUT_REDIRECT_URL: string;
};

/** localhost, 127.0.0.0/8 and ::1: a provider there may speak plain http. */
export function isLoopbackUrl(url: string): boolean {
  const host = new URL(url).hostname;
  return host === 'localhost' || host === '[::1]' || /^127(\.\d{1,3}){3}$/.test(host);
}

/**
 * Secrets that ship with Ebbline (.env.example and the built-in defaults): fine on a laptop,
 * where APP_URL is loopback, and refused anywhere else, since anyone can read them.
 */
export const EXAMPLE_SECRETS = {
  SESSION_SECRET: ['change-me-to-a-long-random-string', 'ebbline-local-session-secret-change-me'],
  OIDC_CLIENT_SECRET: ['ebbline-local-client-secret'],
  IDP_COOKIE_KEYS: ['change-me-to-a-long-random-string', 'ebbline-local-idp-cookie-key-1'],
} as const;

/** One line per secret that still has a shipped value (IDP_COOKIE_KEYS: any of its keys). */
function exampleSecretsIn(
  env: NodeJS.ProcessEnv,
  parsed: { SESSION_SECRET: string; OIDC_CLIENT_SECRET: string },
): string[] {
  const values: Record<keyof typeof EXAMPLE_SECRETS, string[]> = {
    SESSION_SECRET: [parsed.SESSION_SECRET],
    OIDC_CLIENT_SECRET: [parsed.OIDC_CLIENT_SECRET],
    IDP_COOKIE_KEYS: (env.IDP_COOKIE_KEYS ?? '').split(',').map((k) => k.trim()),
  };
  return (Object.keys(EXAMPLE_SECRETS) as Array<keyof typeof EXAMPLE_SECRETS>)
    .filter((name) => values[name].some((v) => (EXAMPLE_SECRETS[name] as readonly string[]).includes(v)))
    .map(
      (name) =>
        `  ${name}: still the example value, which anyone can read; set a long random one (e.g. openssl rand -base64 48)`,
    );
}

/** True when `folder` is `parent` or lies inside it (both resolved from the working folder). */
function isInsideFolder(folder: string, parent: string): boolean {
  const relative = path.relative(path.resolve(parent), path.resolve(folder));
  return relative === '' || (!relative.startsWith('..') && !path.isAbsolute(relative));
}

/** Thrown at boot with one line per missing or bad variable. */
export class ConfigError extends Error {
  override name = 'ConfigError';
}

/**
 * Parses and validates the environment.
 * @throws ConfigError naming each bad variable, e.g. "PORT: expected number, received NaN".
 */
export function parseConfig(env: NodeJS.ProcessEnv): Config {
  const cleaned = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== ''));
  const result = envSchema.safeParse(cleaned);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const parsed = result.data;
  const appUrl = (parsed.APP_URL ?? `http://localhost:${parsed.PORT}`).replace(/\/$/, '');
  if (
    !parsed.OIDC_ISSUER.startsWith('https:') &&
    !parsed.OIDC_ALLOW_HTTP &&
    !isLoopbackUrl(parsed.OIDC_ISSUER)
  ) {
    throw new ConfigError(
      'Invalid configuration:\n  OIDC_ISSUER: a provider on another machine must use https (OIDC_ALLOW_HTTP=true allows http on a closed test network)',
    );
  }
  if (parsed.WEB_DIST_DIR && isInsideFolder(parsed.PHOTO_DIR, parsed.WEB_DIST_DIR)) {
    throw new ConfigError(
      "Invalid configuration:\n  PHOTO_DIR: must be outside the web app's folder (WEB_DIST_DIR), whose files are served to anyone",
    );
  }
  if (!isLoopbackUrl(appUrl)) {
    const shipped = exampleSecretsIn(env, parsed);
    if (shipped.length) {
      throw new ConfigError(
        `Invalid configuration for APP_URL=${appUrl} (not this machine):\n${shipped.join('\n')}`,
      );
    }
  }
  return {
    ...parsed,
    DATABASE_URL: parsed.DATABASE_URL ?? localClusterUrl(cleaned, 'APP'),
    MIGRATION_DATABASE_URL:
      parsed.MIGRATION_DATABASE_URL ?? parsed.DATABASE_URL ?? localClusterUrl(cleaned, 'OWNER'),
    APP_URL: appUrl,
    // the issuer must equal the provider's own string exactly; a trailing slash would not
    OIDC_ISSUER: parsed.OIDC_ISSUER.replace(/\/+$/, ''),
    OIDC_REDIRECT_URL: parsed.OIDC_REDIRECT_URL ?? new URL('/auth/callback', appUrl).href,
    OIDC_POST_LOGOUT_REDIRECT_URL:
      parsed.OIDC_POST_LOGOUT_REDIRECT_URL ?? new URL('/signed-out', appUrl).href,
  };
}

let cached: Config | undefined;

/** The process's configuration, parsed once from process.env. */
export function getConfig(): Config {
  cached ??= parseConfig(process.env);
  return cached;
}
