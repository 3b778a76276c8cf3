import { recurrenceText, type WindowOccurrence } from '../../../../shared/domain/shutdown-windows';
import type { ShutdownWindow as ShutdownWindowJson } from '../../../../shared/schemas/shutdown-window';
import type { ShutdownWindow } from '../../models/shutdown-window';

/** A shutdown window as the API returns it; the query includes its area and site. */
export function presentShutdownWindow(window: ShutdownWindow, occurrences?: WindowOccurrence[]): ShutdownWindowJson {
  return {
    id: window.id,
    areaId: window.areaId,
    areaName: window.area?.name ?? '',
    siteId: window.area?.siteId ?? '',
    siteName: window.area?.site?.name ?? '',
    timeZone: window.area?.site?.timeZone ?? 'UTC',
    title: window.title,
    startsAt: window.startsAt.toISOString(),
    endsAt: window.endsAt.toISOString(),
    recurrence: window.recurrence,
    recurrenceText: recurrenceText(window.recurrence),
    notes: window.notes,
    version: window.version,
    retiredAt: window.retiredAt ? window.retiredAt.toISOString() : null,
    createdAt: window.createdAt.toISOString(),
    updatedAt: window.updatedAt.toISOString(),
    ...(occurrences ? { occurrences } : {}),
  };
}
