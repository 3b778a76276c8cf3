/** The occurrences the plan-a-window dialog offers, one per window occurrence, soonest first. */
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';

/** One occurrence to pick. */
export interface OccurrenceChoice {
  /** `windowId|startsAt`: the value of the picker. */
  key: string;
  windowId: string;
  title: string;
  areaName: string;
  siteName: string;
  timeZone: string;
  startsAt: string;
  endsAt: string;
}

/**
 * The occurrences of the windows, soonest first; those already over at `nowAt` are left out
 * (one under way stays: what is left of it may still be planned by hand, but it is shown).
 */
export function occurrenceChoices(
  windows: readonly ShutdownWindow[],
  nowAt: string,
  windowId?: string,
): OccurrenceChoice[] {
  const now = Date.parse(nowAt);
  return windows
    .filter((w) => !windowId || w.id === windowId)
    .flatMap((w) =>
      (w.occurrences ?? [])
        .filter((o) => Date.parse(o.endsAt) > now)
        .map((o) => ({
          key: `${w.id}|${o.startsAt}`,
          windowId: w.id,
          title: w.title,
          areaName: w.areaName,
          siteName: w.siteName,
          timeZone: w.timeZone,
          startsAt: o.startsAt,
          endsAt: o.endsAt,
        })),
    )
    .sort(
      (a, b) => Date.parse(a.startsAt) - Date.parse(b.startsAt) || a.title.localeCompare(b.title),
    );
}
