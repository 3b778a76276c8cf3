import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadOrCreateSigningKeys } from '../../../infra/identity/keys';

describe('loadOrCreateSigningKeys', () => {
  it('when started the first time, then a key is made and stored privately; later starts reuse it', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ebbline-idp-'));
    try {
      const first = loadOrCreateSigningKeys(path.join(dir, 'identity'));
      expect(first.created).toBe(true);
      expect(first.keys[0]).toMatchObject({
        kty: 'RSA',
        alg: 'RS256',
        use: 'sig',
        kid: expect.any(String),
        d: expect.any(String),
      });
      const file = path.join(dir, 'identity', 'signing-keys.json');
      expect(fs.statSync(file).mode & 0o777).toBe(0o600);
      const second = loadOrCreateSigningKeys(path.join(dir, 'identity'));
      expect(second.created).toBe(false);
      expect(second.keys[0]?.kid).toBe(first.keys[0]?.kid);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
