import type { Visit } from '../../shared/schemas/visit';

let serial = 0;

/** A visit as the API answers it, at a Berlin site unless told otherwise. */
export function visitJson(overrides: Partial<Visit> = {}): Visit {
  serial += 1;
  return {
    id: `00000000-0000-4000-8000-${String(serial).padStart(12, '0')}`,
    cabinetId: '10000000-0000-4000-8000-000000000001',
    cabinetTag: 'BRK-M2-VFD-014',
    siteId: '20000000-0000-4000-8000-000000000001',
    siteName: 'Brackenmoor Mill',
    timeZone: 'Europe/Berlin',
    areaId: '30000000-0000-4000-8000-000000000001',
    areaName: 'Hall 2',
    plannedStartAt: '2026-12-12T05:00:00.000Z',
    plannedEndAt: '2026-12-12T07:00:00.000Z',
    state: 'planned',
    unplanned: false,
    notes: '',
    overrides: [],
    stateReason: '',
    startedAt: null,
    loggedAt: null,
    reviewedAt: null,
    missedAt: null,
    cancelledAt: null,
    banks: [{ id: '40000000-0000-4000-8000-000000000001', position: 'DC1', bankDesignCode: 'EL-4700', baselineTauSeconds: 42, lastTauSeconds: null, runCount: 0 }],
    technicians: [{ id: 'tech-1', name: 'Ines Falk' }],
    cabinetMarkedWaitMinutes: 5,
    estimatedMinutes: 35,
    version: 1,
    createdAt: '2026-12-01T00:00:00.000Z',
    updatedAt: '2026-12-01T00:00:00.000Z',
    ...overrides,
  };
}
