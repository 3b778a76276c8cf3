import { describe, expect, it } from 'vitest';
import {
  calendarDateOf,
  dateOnOf,
  readPlannerParams,
  readPlanRequest,
  requestedVisitTimes,
  withoutPlanRequest,
  writePlannerParams,
} from '../../../../web/src/features/planner/utils/planner-params';

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

describe('a visit asked for by the Due list', () => {
  const cabinetId = '0b9f6c1e-1d2a-4c3b-9a8e-5f6d7c8b9a01';
  const bankA = '1b9f6c1e-1d2a-4c3b-9a8e-5f6d7c8b9a02';
  const bankB = '2b9f6c1e-1d2a-4c3b-9a8e-5f6d7c8b9a03';

  it('when the address names a cabinet and banks, then the request holds them once each', () => {
    const search = new URLSearchParams(`siteId=s1&cabinetId=${cabinetId}&bankIds=${bankA},${bankB},${bankA}`);
    expect(readPlanRequest(search)).toEqual({ cabinetId, bankIds: [bankA, bankB] });
  });

  it('when the cabinet id is mangled, then there is no request, and mangled bank ids are dropped', () => {
    expect(readPlanRequest(new URLSearchParams('cabinetId=DR-101'))).toBeNull();
    expect(readPlanRequest(new URLSearchParams(`cabinetId=${cabinetId}&bankIds=x,${bankB}`))).toEqual({ cabinetId, bankIds: [bankB] });
  });

  it('when the form is open, then the address keeps the view but not the request', () => {
    const search = new URLSearchParams(`siteId=s1&view=week&cabinetId=${cabinetId}&bankIds=${bankA}`);
    expect(withoutPlanRequest(search).toString()).toBe('siteId=s1&view=week');
  });

  const fallback = { plannedStartAt: '2027-01-10T07:00:00.000Z', plannedEndAt: '2027-01-10T09:00:00.000Z' };
  const now = Date.parse('2027-01-09T10:00:00Z');

  it('when a window of the area is ahead, then the visit starts at its start for two hours', () => {
    const times = requestedVisitTimes(
      [
        { startsAt: '2027-01-16T05:00:00Z', endsAt: '2027-01-16T13:00:00Z' },
        { startsAt: '2027-01-12T05:00:00Z', endsAt: '2027-01-12T06:30:00Z' },
      ],
      now,
      fallback,
    );
    // the earlier window is chosen; it closes after 1.5 h, so the visit ends with it
    expect(times).toEqual({ plannedStartAt: '2027-01-12T05:00:00.000Z', plannedEndAt: '2027-01-12T06:30:00.000Z' });
  });

  it('when a window is open now, then the visit starts now (to the next minute)', () => {
    const times = requestedVisitTimes([{ startsAt: '2027-01-09T06:00:00Z', endsAt: '2027-01-09T18:00:00Z' }], now + 20_000, fallback);
    expect(times).toEqual({ plannedStartAt: '2027-01-09T10:01:00.000Z', plannedEndAt: '2027-01-09T12:01:00.000Z' });
  });

  it('when every window has ended or there is none, then the fallback times', () => {
    expect(requestedVisitTimes([{ startsAt: '2027-01-01T06:00:00Z', endsAt: '2027-01-01T08:00:00Z' }], now, fallback)).toEqual(fallback);
    expect(requestedVisitTimes([], now, fallback)).toEqual(fallback);
  });
});
