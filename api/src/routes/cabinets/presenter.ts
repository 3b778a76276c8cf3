import type { Cabinet as CabinetJson } from '../../../../shared/schemas/cabinet';
import type { Cabinet } from '../../models/cabinet';

/** A cabinet as the API returns it; the query includes its area and site. */
export function presentCabinet(cabinet: Cabinet): CabinetJson {
  return {
    id: cabinet.id,
    areaId: cabinet.areaId,
    areaName: cabinet.area?.name ?? '',
    siteId: cabinet.area?.siteId ?? '',
    siteName: cabinet.area?.site?.name ?? '',
    siteCode: cabinet.area?.site?.code ?? '',
    tag: cabinet.tag,
    location: cabinet.location,
    driveMake: cabinet.driveMake,
    driveModel: cabinet.driveModel,
    supplyVolts: cabinet.supplyVolts,
    dcBusVolts: cabinet.dcBusVolts,
    ratedPowerKilowatts: cabinet.ratedPowerKilowatts,
    markedWaitMinutes: cabinet.markedWaitMinutes,
    criticality: cabinet.criticality,
    environmentNotes: cabinet.environmentNotes,
    commissionedOn: cabinet.commissionedOn,
    status: cabinet.status,
    bankCount: Number(cabinet.get('bankCount') ?? 0),
    version: cabinet.version,
    retiredAt: cabinet.retiredAt ? cabinet.retiredAt.toISOString() : null,
    createdAt: cabinet.createdAt.toISOString(),
    updatedAt: cabinet.updatedAt.toISOString(),
  };
}
