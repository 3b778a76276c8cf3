import { describe, expect, it } from 'vitest';
import { ConfigError, isLoopbackUrl, parseConfig } from '../../../api/src/config/env';

describe('the OpenID Connect settings', () => {
  it('when nothing is set, then Ebbline signs in through the local provider on loopback', () => {
    const config = parseConfig({});
    expect(config.OIDC_ISSUER).toBe('http://localhost:3001');
    expect(config.OIDC_POST_LOGOUT_REDIRECT_URL).toBe('http://localhost:3000/signed-out');
    expect(config.OIDC_SCOPES.split(' ')).toContain('roles');
    expect(config.SESSION_COOKIE_NAME).toBe('ebbline.sid');
  });

  it('when the issuer is plain http on another machine, then the configuration is refused', () => {
    expect(() => parseConfig({ OIDC_ISSUER: 'http://sso.brackenmoor.example' })).toThrow(
      ConfigError,
    );
    expect(() => parseConfig({ OIDC_ISSUER: 'http://sso.brackenmoor.example' })).toThrow(
      /OIDC_ISSUER/,
    );
  });

  it('when OIDC_ALLOW_HTTP is set for a closed test network, then plain http is accepted', () => {
    expect(
      parseConfig({ OIDC_ISSUER: 'http://sso.test', OIDC_ALLOW_HTTP: 'true' }).OIDC_ISSUER,
    ).toBe('http://sso.test');
  });

  it('when the issuer has a trailing slash, then it is dropped so it matches the provider exactly', () => {
    expect(
      parseConfig({ OIDC_ISSUER: 'https://sso.brackenmoor.example/realms/plant/' }).OIDC_ISSUER,
    ).toBe('https://sso.brackenmoor.example/realms/plant');
  });

  it.each([
    ['http://localhost:3001', true],
    ['http://127.0.0.1:3001', true],
    ['http://[::1]:3001', true],
    ['http://localhost.evil.example', false],
    ['https://sso.brackenmoor.example', false],
  ])('when the address is %s, then loopback is %s', (url, loopback) => {
    expect(isLoopbackUrl(url)).toBe(loopback);
  });
});
