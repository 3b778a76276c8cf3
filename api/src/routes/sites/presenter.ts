import type { Site as SiteJson } from '../../../../shared/schemas/site';
import type { Site } from '../../models/site';

/** A site as the API returns it (counts come from the list and detail queries). */
export function presentSite(site: Site): SiteJson {
  return {
    id: site.id,
    name: site.name,
    code: site.code,
    address: site.address,
    timeZone: site.timeZone,
    areaCount: Number(site.get('areaCount') ?? 0),
    cabinetCount: Number(site.get('cabinetCount') ?? 0),
    version: site.version,
    retiredAt: site.retiredAt ? site.retiredAt.toISOString() : null,
    createdAt: site.createdAt.toISOString(),
    updatedAt: site.updatedAt.toISOString(),
  };
}
