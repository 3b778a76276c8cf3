/** Which shutdown window a visit falls in: the drive is de-energised only inside one. */
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';
import type { Visit } from '../../../../../shared/schemas/visit';

/** The window occurrence a visit falls in (`inside`), or only overlaps (`partly`). */
export interface VisitWindow {
  windowId: string;
  title: string;
  startsAt: string;
  endsAt: string;
  fit: 'inside' | 'partly';
}

/**
 * The occurrence of a shutdown window of the visit's area that holds the whole visit, else the
 * one it overlaps most, else null (planned outside every window: the planner overrode it).
 */
export function windowOfVisit(
  visit: Pick<Visit, 'areaId' | 'plannedStartAt' | 'plannedEndAt'>,
  windows: readonly ShutdownWindow[],
): VisitWindow | null {
  const start = Date.parse(visit.plannedStartAt);
  const end = Date.parse(visit.plannedEndAt);
  let best: (VisitWindow & { overlap: number }) | null = null;
  for (const window of windows) {
    if (window.areaId !== visit.areaId) continue;
    const occurrences = window.occurrences ?? [{ startsAt: window.startsAt, endsAt: window.endsAt }];
    for (const occurrence of occurrences) {
      const from = Date.parse(occurrence.startsAt);
      const to = Date.parse(occurrence.endsAt);
      const overlap = Math.min(end, to) - Math.max(start, from);
      if (overlap <= 0) continue;
      const fit = from <= start && end <= to ? 'inside' : 'partly';
      const better =
        !best || (fit === 'inside' && best.fit === 'partly') || (fit === best.fit && overlap > best.overlap);
      if (better) {
        best = { windowId: window.id, title: window.title, startsAt: occurrence.startsAt, endsAt: occurrence.endsAt, fit, overlap };
      }
    }
  }
  if (!best) return null;
  const { overlap: _overlap, ...found } = best;
  return found;
}
