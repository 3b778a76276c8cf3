/**
 * Which time zone the calendar shows. Each visit keeps its own site's zone in its details; the
 * grid needs one.
 */

export interface SiteZone {
  id: string;
  name: string;
  timeZone: string;
}

export interface PlannerZone {
  timeZone: string;
  /** Why this zone: the filtered site's, the one zone of every site, or the zone most sites keep. */
  reason: 'filtered-site' | 'every-site' | 'most-sites' | 'browser';
  /** Sites (by name) whose zone differs from the one shown. */
  otherZoneSites: string[];
}

/**
 * The calendar's zone: the filtered site's; else the zone every site shares; else the zone most
 * sites keep (ties go to the zone of the first site by name); with no sites, the browser's.
 * @example plannerZone([{id:'a',name:'Bremen',timeZone:'Europe/Berlin'}], null, 'UTC').timeZone // 'Europe/Berlin'
 */
export function plannerZone(sites: readonly SiteZone[], siteId: string | null | undefined, browserZone: string): PlannerZone {
  const sorted = [...sites].sort((a, b) => a.name.localeCompare(b.name));
  const others = (zone: string) => sorted.filter((s) => s.timeZone !== zone).map((s) => s.name);
  const filtered = siteId ? sorted.find((s) => s.id === siteId) : undefined;
  if (filtered) return { timeZone: filtered.timeZone, reason: 'filtered-site', otherZoneSites: [] };
  if (sorted.length === 0) return { timeZone: browserZone, reason: 'browser', otherZoneSites: [] };
  const counts = new Map<string, number>();
  for (const site of sorted) counts.set(site.timeZone, (counts.get(site.timeZone) ?? 0) + 1);
  if (counts.size === 1) return { timeZone: sorted[0]!.timeZone, reason: 'every-site', otherZoneSites: [] };
  let best = sorted[0]!.timeZone;
  for (const [zone, count] of counts) if (count > counts.get(best)!) best = zone;
  return { timeZone: best, reason: 'most-sites', otherZoneSites: others(best) };
}

/** The sentence under the calendar that says which zone its times are in. */
export function describePlannerZone(zone: PlannerZone, siteName?: string): string {
  switch (zone.reason) {
    case 'filtered-site':
      return `Times in ${zone.timeZone}${siteName ? `, the time zone of ${siteName}` : ''}.`;
    case 'every-site':
      return `Times in ${zone.timeZone}, the time zone of every site.`;
    case 'most-sites':
      return `Times in ${zone.timeZone}, the time zone of most sites. ${zone.otherZoneSites.join(', ')} ${
        zone.otherZoneSites.length === 1 ? 'keeps' : 'keep'
      } another zone: choose a site to see its own clock. Each visit's details show its site's time.`;
    case 'browser':
      return `Times in ${zone.timeZone}.`;
  }
}
