import { describe, expect, it } from 'vitest';
import { mayOpen, navFor, screenFor, startScreenFor } from '../../web/src/app/access';

describe('startScreenFor', () => {
  it.each([
    [['technician'], '/my-visits'],
    [['planner'], '/planner'],
    [['reliability'], '/fleet'],
    [['admin'], '/people'],
  ] as const)('when the roles are %j, then the start screen is %s', (roles, path) => {
    expect(startScreenFor(roles)).toBe(path);
  });

  it('when someone holds several roles, then the daily work comes before administration', () => {
    expect(startScreenFor(['admin', 'planner'])).toBe('/planner');
    expect(startScreenFor(['reliability', 'technician'])).toBe('/my-visits');
  });
});

describe('navFor', () => {
  it('when a technician looks, then People and Planner are not offered', () => {
    const labels = navFor(['technician']).map((i) => i.label);
    expect(labels).toContain('My visits');
    expect(labels).not.toContain('People');
    expect(labels).not.toContain('Planner');
  });

  it('when nobody holds a role, then nothing is offered', () => {
    expect(navFor([])).toEqual([]);
  });
});

describe('mayOpen', () => {
  it('when the path is deep inside a screen, then that screen’s roles decide', () => {
    expect(screenFor('/register/sites/1')?.label).toBe('Register');
    expect(mayOpen('/people', ['planner'])).toBe(false);
    expect(mayOpen('/people', ['admin'])).toBe(true);
    expect(mayOpen('/peoplex', ['planner'])).toBe(true);
  });

  it('when the path is outside the navigation (profile, unknown), then any role may open it', () => {
    expect(mayOpen('/profile', ['technician'])).toBe(true);
    expect(mayOpen('/no-such-page', ['technician'])).toBe(true);
  });
});
