import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** A private signing key as the provider takes it (RSA, RS256). */
export type SigningJwk = crypto.JsonWebKey & { kid: string; alg: 'RS256'; use: 'sig' };

/** A new RS256 signing key with a kid derived from its public part. */
export function generateSigningKey(): SigningJwk {
  const { privateKey } = crypto.generateKeyPairSync('rsa', { modulusLength: 2048 });
  const jwk = privateKey.export({ format: 'jwk' });
  const kid = crypto
    .createHash('sha256')
    .update(`${jwk.e}.${jwk.n}`)
    .digest('base64url')
    .slice(0, 16);
  return { ...jwk, kid, alg: 'RS256', use: 'sig' };
}

/**
 * The provider's signing keys, kept in `<dataDir>/signing-keys.json` (git-ignored): made on
 * the first start, reused after, so ID tokens stay verifiable across restarts.
 */
export function loadOrCreateSigningKeys(dataDir: string): { keys: SigningJwk[]; created: boolean } {
  const file = path.join(dataDir, 'signing-keys.json');
  if (fs.existsSync(file)) {
    const stored = JSON.parse(fs.readFileSync(file, 'utf8')) as { keys?: SigningJwk[] };
    if (Array.isArray(stored.keys) && stored.keys.length > 0)
      return { keys: stored.keys, created: false };
  }
  fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  const keys = [generateSigningKey()];
  fs.writeFileSync(file, `${JSON.stringify({ keys }, null, 2)}\n`, { mode: 0o600 });
  return { keys, created: true };
}
