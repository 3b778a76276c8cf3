import { describe, expect, it } from 'vitest';
import { safeReturnTo } from '../../../api/src/auth/return-to';

describe('safeReturnTo', () => {
  it.each([
    [undefined, '/'],
    ['', '/'],
    ['/planner', '/planner'],
    ['/register/cabinets?site=M#bank-2', '/register/cabinets?site=M#bank-2'],
    ['/auth/login', '/'],
  ])('when returnTo is %j, then %j', (value, expected) => {
    expect(safeReturnTo(value)).toBe(expected);
  });

  it.each([
    '//evil.example',
    '/\\evil.example',
    'https://evil.example',
    'planner',
    '/\u0000x',
    ['a'],
    '/%0d%0aSet-Cookie:x',
  ])('when returnTo is %j, then it is refused or harmless', (value) => {
    const result = safeReturnTo(value);
    expect(
      result === null ||
        (result.startsWith('/') && !result.startsWith('//') && !/[\r\n]/.test(result)),
    ).toBe(true);
  });

  it('when returnTo leads off-site, then it is refused', () => {
    expect(safeReturnTo('//evil.example')).toBeNull();
    expect(safeReturnTo('https://evil.example/')).toBeNull();
  });
});
