import { describe, expect, it } from 'vitest';
import { ConfigError, parseConfig } from '../../../api/src/config/env';

describe('parseConfig', () => {
  it('when nothing is set, then the laptop defaults apply', () => {
    const config = parseConfig({});
    expect(config.PORT).toBe(3000);
    expect(config.APP_URL).toBe('http://localhost:3000');
    expect(config.OIDC_REDIRECT_URL).toBe('http://localhost:3000/auth/callback');
  });

  it('when only PORT is set, then APP_URL follows it', () => {
    expect(parseConfig({ PORT: '3900' }).APP_URL).toBe('http://localhost:3900');
  });

  it('when a variable is bad, then the error names it', () => {
    expect(() => parseConfig({ PORT: 'three thousand' })).toThrow(ConfigError);
    expect(() => parseConfig({ PORT: 'three thousand' })).toThrow(/PORT/);
    expect(() => parseConfig({ DATABASE_URL: 'mysql://x' })).toThrow(/DATABASE_URL: must be a postgres/);
  });

  it('when a variable is empty, then its default applies', () => {
    expect(parseConfig({ PORT: '' }).PORT).toBe(3000);
  });
});
