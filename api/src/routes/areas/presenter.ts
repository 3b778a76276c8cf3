import type { Area as AreaJson } from '../../../../shared/schemas/area';
import type { Area } from '../../models/area';

/** An area as the API returns it; the query includes its site. */
export function presentArea(area: Area): AreaJson {
  return {
    id: area.id,
    siteId: area.siteId,
    siteName: area.site?.name ?? '',
    siteCode: area.site?.code ?? '',
    name: area.name,
    description: area.description,
    cabinetCount: Number(area.get('cabinetCount') ?? 0),
    version: area.version,
    retiredAt: area.retiredAt ? area.retiredAt.toISOString() : null,
    createdAt: area.createdAt.toISOString(),
    updatedAt: area.updatedAt.toISOString(),
  };
}
