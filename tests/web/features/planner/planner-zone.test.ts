import { describe, expect, it } from 'vitest';
import { describePlannerZone, plannerZone } from '../../../../web/src/features/planner/utils/planner-zone';

const bremen = { id: 'b', name: 'Bremen', timeZone: 'Europe/Berlin' };
const hamburg = { id: 'h', name: 'Hamburg', timeZone: 'Europe/Berlin' };
const ohio = { id: 'o', name: 'Ohio', timeZone: 'America/New_York' };
const arras = { id: 'a', name: 'Arras', timeZone: 'Europe/Paris' };

describe('plannerZone', () => {
  it('when a site is filtered, then its zone', () => {
    expect(plannerZone([bremen, ohio], 'o', 'UTC')).toEqual({ timeZone: 'America/New_York', reason: 'filtered-site', otherZoneSites: [] });
  });

  it('when every site keeps one zone, then that zone', () => {
    expect(plannerZone([bremen, hamburg], '', 'UTC')).toMatchObject({ timeZone: 'Europe/Berlin', reason: 'every-site' });
  });

  it('when sites keep several zones, then the zone most keep, naming the others', () => {
    expect(plannerZone([ohio, bremen, hamburg], null, 'UTC')).toEqual({
      timeZone: 'Europe/Berlin',
      reason: 'most-sites',
      otherZoneSites: ['Ohio'],
    });
  });

  it('when zones tie, then the zone of the first site by name', () => {
    expect(plannerZone([ohio, arras], null, 'UTC').timeZone).toBe('Europe/Paris');
  });

  it('when there are no sites, then the browser zone', () => {
    expect(plannerZone([], null, 'Asia/Tokyo')).toMatchObject({ timeZone: 'Asia/Tokyo', reason: 'browser' });
  });

  it('when the filtered site is unknown, then the default rule applies', () => {
    expect(plannerZone([bremen, hamburg], 'gone', 'UTC').reason).toBe('every-site');
  });
});

describe('describePlannerZone', () => {
  it('when the zone is the filtered site, then the sentence names zone and site', () => {
    expect(describePlannerZone(plannerZone([ohio], 'o', 'UTC'), 'Ohio')).toBe('Times in America/New_York, the time zone of Ohio.');
  });

  it('when other sites keep another zone, then the sentence names them and says how to see their clock', () => {
    const text = describePlannerZone(plannerZone([ohio, bremen, hamburg], null, 'UTC'));
    expect(text).toContain('Times in Europe/Berlin, the time zone of most sites.');
    expect(text).toContain('Ohio keeps another zone');
  });
});
