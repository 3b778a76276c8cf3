import { describe, expect, it } from 'vitest';
import { calendarDateOf, dateOnOf, readPlannerParams, writePlannerParams } from '../../../../web/src/features/planner/utils/planner-params';

describe('planner params', () => {
  it('when the address names site, area, view, date and cancelled, then they are read back as written', () => {
    const params = { siteId: 's1', areaId: 'a1', view: 'month' as const, dateOn: '2027-01-09', showCancelled: true };
    expect(readPlannerParams(writePlannerParams(params))).toEqual(params);
  });

  it('when values are unknown or malformed, then they are ignored', () => {
    expect(readPlannerParams(new URLSearchParams('view=year&date=2027-13-45'))).toEqual({
      siteId: '',
      areaId: '',
      view: null,
      dateOn: null,
      showCancelled: false,
    });
  });

  it('when params are at their defaults, then the address stays empty', () => {
    expect(writePlannerParams({ siteId: '', areaId: '', view: null, dateOn: null, showCancelled: false }).toString()).toBe('');
  });

  it('when a date goes to the address and back, then the same calendar day', () => {
    expect(dateOnOf(calendarDateOf('2027-03-28'))).toBe('2027-03-28');
  });
});
