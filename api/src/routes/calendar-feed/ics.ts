/**
 * A person's visits as an iCalendar feed (ical-generator): one event per visit, in its site's
 * time zone (DTSTART;TZID=… with the zone's VTIMEZONE), its summary naming the cabinet, and a
 * description with the cabinet, the banks, the shutdown window it falls in and the discharge
 * caution (shared/constants/safety.ts, as written there). A cancelled visit stays in the feed
 * marked cancelled (STATUS:CANCELLED), so calendars that showed it take it off.
 */
import { format } from 'date-fns';
import { TZDate, tz } from '@date-fns/tz';
import { ICalCalendar, ICalEventBusyStatus, ICalEventStatus } from 'ical-generator';
import { DISCHARGE_CAUTION } from '../../../../shared/constants/safety';
import { windowOccurrences } from '../../../../shared/domain/shutdown-windows';
import { VISIT_STATE_LABELS, type VisitState } from '../../../../shared/domain/visit-states';
import type { FeedVisit, FeedWindow } from '../../services/calendar-feeds';
import { vtimezoneComponent } from './vtimezone';

/** What a feed shows and for whom. */
export interface VisitsCalendarInput {
  ownerName: string;
  visits: readonly FeedVisit[];
  /** The shutdown windows of the visits' areas. */
  windows: readonly FeedWindow[];
  /** The range the feed covers (the VTIMEZONEs cover it). */
  fromAt: Date;
  toAt: Date;
  /** The address people open (APP_URL), for each event's link. */
  appUrl: string;
}

/** "Sat 9 Jan 2027, 06:00–08:00 Europe/Berlin" (the end's day named when it is another). */
export function timeRangeInZone(startAt: Date, endAt: Date, timeZone: string): string {
  const inZone = { in: tz(timeZone) };
  const day = (d: Date) => format(d, 'EEE d MMM yyyy', inZone);
  const time = (d: Date) => format(d, 'HH:mm', inZone);
  const end = day(startAt) === day(endAt) ? time(endAt) : `${day(endAt)}, ${time(endAt)}`;
  return `${day(startAt)}, ${time(startAt)}–${end} ${timeZone}`;
}

/**
 * The shutdown window occurrence a visit falls in: one that holds it whole, else one it
 * overlaps; null when none of its area's windows does.
 */
export function windowOfVisit(
  visit: FeedVisit,
  windows: readonly FeedWindow[],
): { title: string; startsAt: Date; endsAt: Date; holdsVisit: boolean } | null {
  const start = visit.plannedStartAt.getTime();
  const end = visit.plannedEndAt.getTime();
  let overlapping: { title: string; startsAt: Date; endsAt: Date; holdsVisit: boolean } | null =
    null;
  for (const window of windows) {
    if (window.areaId !== visit.areaId) continue;
    const occurrences = windowOccurrences(
      window,
      visit.timeZone,
      visit.plannedStartAt.toISOString(),
      visit.plannedEndAt.toISOString(),
      10,
    );
    for (const o of occurrences) {
      const startsAt = new Date(o.startsAt);
      const endsAt = new Date(o.endsAt);
      if (startsAt.getTime() <= start && endsAt.getTime() >= end) {
        return { title: window.title, startsAt, endsAt, holdsVisit: true };
      }
      overlapping ??= { title: window.title, startsAt, endsAt, holdsVisit: false };
    }
  }
  return overlapping;
}

/** The event's description: plain text, one fact a line, the caution last. */
export function visitDescription(
  visit: FeedVisit,
  windows: readonly FeedWindow[],
  appUrl: string,
): string {
  const state = VISIT_STATE_LABELS[visit.state as VisitState] ?? visit.state;
  const drive = [visit.driveMake, visit.driveModel].filter(Boolean).join(' ');
  const window = windowOfVisit(visit, windows);
  const lines = [
    `Cabinet: ${visit.cabinetTag}${drive ? ` (${drive})` : ''}${visit.cabinetLocation ? `, ${visit.cabinetLocation}` : ''}`,
    `Site and area: ${visit.siteName}, ${visit.areaName}`,
    `Banks: ${visit.banks.map((b) => `${b.position} (design ${b.bankDesignCode})`).join(', ') || 'none'}`,
    `Planned: ${timeRangeInZone(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}`,
    window
      ? `Shutdown window: ${window.title}, ${timeRangeInZone(window.startsAt, window.endsAt, visit.timeZone)}${window.holdsVisit ? '' : ' (the visit runs past it)'}`
      : 'Shutdown window: none of the area’s windows covers this visit; make sure with the planner that the drive is de-energised.',
    `Technicians: ${visit.technicians.join(', ')}`,
    `State: ${state}${visit.stateReason && (visit.state === 'cancelled' || visit.state === 'planned') ? ` (${visit.stateReason})` : ''}`,
  ];
  if (visit.markedWaitMinutes !== null) {
    lines.push(`Marked wait on the drive: ${visit.markedWaitMinutes} min`);
  }
  if (visit.notes) lines.push(`Notes: ${visit.notes}`);
  lines.push(
    '',
    `${DISCHARGE_CAUTION.title}:`,
    ...DISCHARGE_CAUTION.lines.map((line) => `- ${line}`),
  );
  lines.push('', `In Ebbline: ${appUrl}/my-visits/${visit.id}`);
  return lines.join('\n');
}

/** The feed: a VCALENDAR with one VEVENT per visit and a VTIMEZONE per zone used. */
export function visitsCalendar(input: VisitsCalendarInput): string {
  const calendar = new ICalCalendar({
    name: `Ebbline visits: ${input.ownerName}`,
    description: 'Your visits planned in Ebbline. Read-only: plan and change visits in Ebbline.',
    prodId: { company: 'Ebbline', product: 'Visits', language: 'EN' },
    // calendar apps that honour it ask again every 15 minutes
    ttl: 15 * 60,
  });
  calendar.timezone({
    name: '',
    generator: (zone) => vtimezoneComponent(zone, input.fromAt, input.toAt),
  });
  for (const visit of input.visits) {
    const cancelled = visit.state === 'cancelled';
    const prefix = cancelled ? 'Cancelled: ' : visit.state === 'missed' ? 'Missed: ' : '';
    calendar.createEvent({
      id: `visit-${visit.id}@ebbline`,
      // a replanned visit is a new revision of the same event
      sequence: visit.version,
      stamp: visit.updatedAt,
      start: new TZDate(visit.plannedStartAt.getTime(), visit.timeZone),
      end: new TZDate(visit.plannedEndAt.getTime(), visit.timeZone),
      timezone: visit.timeZone,
      summary: `${prefix}Decay run: ${visit.cabinetTag}`,
      location: [visit.siteName, visit.areaName, visit.cabinetLocation].filter(Boolean).join(', '),
      description: visitDescription(visit, input.windows, input.appUrl),
      url: `${input.appUrl}/my-visits/${visit.id}`,
      status: cancelled ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
      busystatus: cancelled ? ICalEventBusyStatus.FREE : ICalEventBusyStatus.BUSY,
    });
  }
  return calendar.toString();
}
